// edgewise page: undo and redo of edits. The steps are the projects the
// user meant (store.js: paused on, confirmed, left, chosen or loaded), not
// every keystroke; undoing while a half-typed edit is on screen first goes
// back to the last project meant. Ctrl+Z (Cmd+Z) undoes, Ctrl+Shift+Z and
// Ctrl+Y redo, and two buttons in the header do the same.
//
//   EW.history = {undo(), redo(), state() -> {undo, redo}}
"use strict";
(function () {
  const EW = (window.edgewiseParts = window.edgewiseParts || {});
  const { el } = EW.dom;
  const store = EW.store;
  const LIMIT = 100; // steps kept

  const past = []; // projects meant before the current one, oldest first
  const future = []; // projects undone, the next redo last
  let current = null; // the project meant now
  let expect = null; // JSON text of a project put back by undo or redo
  let restoring = false; // inside put()

  const text = (p) => JSON.stringify(p);
  const copy = (p) => JSON.parse(JSON.stringify(p));

  store.on("meant", (d) => {
    const t = text(d.project);
    if (restoring || (expect !== null && t === expect)) {
      expect = null;
      current = copy(d.project);
      update();
      return;
    }
    expect = null;
    if (current && text(current) === t) return;
    if (current) past.push(current);
    if (past.length > LIMIT) past.shift();
    future.length = 0;
    current = copy(d.project);
    update();
  });
  store.on("edited", () => update());

  // unmeant tells whether the inputs hold an edit not yet meant
  const unmeant = () => current && store.project() && text(store.project()) !== text(current);

  // put fills the inputs with a project and solves it; it becomes the
  // current step once it has solved.
  function put(p) {
    restoring = true;
    try {
      EW.solving.edit(copy(p));
    } finally {
      restoring = false;
    }
    expect = text(store.project());
  }

  function undo() {
    if (unmeant()) {
      future.push(copy(store.project()));
      put(current);
    } else if (past.length) {
      future.push(current);
      current = past.pop();
      put(current);
    }
    update();
  }

  function redo() {
    if (!future.length) return;
    const p = future.pop();
    if (!unmeant()) past.push(current);
    current = p;
    put(p);
    update();
  }

  const undoButton = el("button", { type: "button", id: "btn-undo", title: "Undo the last edit (Ctrl+Z)", text: "Undo", onclick: undo });
  const redoButton = el("button", { type: "button", id: "btn-redo", title: "Redo (Ctrl+Shift+Z or Ctrl+Y)", text: "Redo", onclick: redo });
  function update() {
    undoButton.disabled = !(past.length || unmeant());
    redoButton.disabled = !future.length;
  }
  update();
  const bar = document.querySelector("header.bar");
  if (bar) bar.append(el("span", { class: "history", role: "group", "aria-label": "Undo and redo" }, undoButton, redoButton));

  document.addEventListener("keydown", (e) => {
    if (!(e.ctrlKey || e.metaKey) || e.altKey) return;
    const k = e.key.toLowerCase();
    if (k === "z" && !e.shiftKey) {
      e.preventDefault();
      undo();
    } else if ((k === "z" && e.shiftKey) || (k === "y" && !e.shiftKey)) {
      e.preventDefault();
      redo();
    }
  });

  EW.history = { undo, redo, state: () => ({ undo: past.length + (unmeant() ? 1 : 0), redo: future.length }) };
})();
