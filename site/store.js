// edgewise page: the one home of the page's state, with change
// notifications. It holds
//
//   typed   the project as the inputs stand now (may have errors)
//   good    the last project the user meant (paused on, confirmed with
//           Enter, left the field, chose, loaded) that solved: what the
//           page falls back to, autosaves and shares
//   solve   the last successful solve, as drawn: {project, result, units,
//           nx, ny, w, h, u, ux, uy, levels, segs, ends, labels, kx, ky};
//           the live picture follows the typing, so it may be newer than
//           good
//
// and tells its listeners (EW.store.on(name, fn)) and the document
// ("edgewise:<name>" events, for scripts outside the page) when
//
//   edited   {project}          the inputs changed
//   solved   {project, result, nx, ny, u, ux, uy}
//   failed   {project, error}   a project that passed the form did not solve
//   meant    {project}          a new good project (solved and meant)
//
// Nothing else keeps a copy of these.
"use strict";
(function () {
  const EW = (window.edgewiseParts = window.edgewiseParts || {});
  const state = { typed: null, good: null, goodSolve: null, solve: null };
  const listeners = { edited: [], solved: [], failed: [], meant: [] };

  function emit(name, detail) {
    for (const fn of listeners[name]) {
      try {
        fn(detail);
      } catch (e) {
        console.error("edgewise: a " + name + " listener failed:", e);
      }
    }
    document.dispatchEvent(new CustomEvent("edgewise:" + name, { detail }));
  }

  EW.store = {
    // the project as typed, else the last that solved
    project: () => state.typed || state.good,
    good: () => state.good,
    last: () => state.solve,
    // grid is the output grid of the picture on screen when it shows this
    // project ({nx, ny}), else null
    grid(project) {
      const S = state.solve;
      if (!S || !S.project || !(S.nx > 0 && S.ny > 0) || JSON.stringify(S.project) !== JSON.stringify(project)) return null;
      return { nx: S.nx, ny: S.ny };
    },
    on(name, fn) {
      if (!listeners[name]) throw new Error("store: no event " + name);
      listeners[name].push(fn);
    },
    edited(project) {
      state.typed = project;
      emit("edited", { project });
    },
    solved(solve) {
      state.solve = solve;
      if (!state.typed) state.typed = solve.project;
      emit("solved", { project: solve.project, result: solve.result, nx: solve.nx, ny: solve.ny, u: solve.u, ux: solve.ux, uy: solve.uy });
    },
    // meant makes solve (a solve as given to solved()) the good project
    meant(solve) {
      const same = state.good && JSON.stringify(state.good) === JSON.stringify(solve.project);
      state.goodSolve = solve;
      state.good = JSON.parse(JSON.stringify(solve.project));
      if (!same) emit("meant", { project: state.good });
    },
    // fallback draws the good project's solve again when the picture shows
    // a half-typed one (the inputs now fail); true when it did
    fallback() {
      const g = state.goodSolve;
      if (!g || state.solve === g) return false;
      this.solved(g);
      return true;
    },
    failed(project, error) {
      emit("failed", { project, error });
    },
  };
})();
