// edgewise page: the last script. The body is hidden until the browser has
// read the whole page (index.html: <body class="reading">, and style.css
// hides body.reading only when scripts run), so that it lays out and
// paints the page once, complete, instead of again and again while it
// reads: in the offline file that work held up the engine's worker, which
// needs the main thread for a moment to start (first picture 0.99-1.07 s
// against 1.07-1.10 s, medians of 5 opens in two rounds). A separate
// script, so that an error in another cannot leave the page hidden.
"use strict";
document.body.classList.remove("reading");
