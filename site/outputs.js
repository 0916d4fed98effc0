// edgewise outputs: downloads, share link, embed mode and autosave.
// (Filled in by the outputs work; the page runs without it.)
"use strict";
