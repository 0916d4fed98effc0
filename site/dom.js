// edgewise page: the DOM helpers the page's scripts share. Every element is
// built with createElement and textContent: no user text ever becomes
// markup.
//
//   EW.dom = {byId, el, kvRow, save, slug}
"use strict";
performance.mark("ew:scripts"); // the page's first script runs (the benchmark reads the marks)
(function () {
  const EW = (window.edgewiseParts = window.edgewiseParts || {});

  const byId = (id) => document.getElementById(id);

  // el builds an element: props sets text (textContent), class, on<event>
  // listeners and attributes (true: present and empty; false, null,
  // undefined: absent); children are appended.
  function el(tag, props, ...children) {
    const e = document.createElement(tag);
    for (const [k, v] of Object.entries(props || {})) {
      if (v === undefined || v === null || v === false) continue;
      if (k === "text") e.textContent = v;
      else if (k === "class") e.className = v;
      else if (k.startsWith("on")) e.addEventListener(k.slice(2), v);
      else e.setAttribute(k, v === true ? "" : String(v));
    }
    for (const c of children) if (c !== null && c !== undefined) e.append(c);
    return e;
  }

  // kvRow appends a term and its value (with an optional note) to a
  // description list and returns the value's element.
  function kvRow(dl, k, v, note) {
    const dd = el("dd", { text: v });
    if (note) dd.append(el("span", { class: "note", text: " " + note }));
    dl.append(el("dt", { text: k }), dd);
    return dd;
  }

  // save hands a file to the browser's download mechanism.
  function save(name, mime, data) {
    const blob = data instanceof Blob ? data : new Blob([data], { type: mime });
    const url = URL.createObjectURL(blob);
    const a = el("a", { href: url, download: name, class: "ew-hidden" });
    document.body.append(a);
    a.click();
    a.remove();
    setTimeout(() => URL.revokeObjectURL(url), 60000);
  }

  // slug makes a file name from a project title.
  function slug(title) {
    const s = String(title || "").toLowerCase().replace(/[^\p{L}\p{N}]+/gu, "-").replace(/^-+|-+$/g, "").slice(0, 40);
    return s || "edgewise";
  }

  EW.dom = { byId, el, kvRow, save, slug };
})();
