// edgewise page: the public interface and the first project. Exposes
//
//   window.edgewise = {load(project) -> Promise<result>, project(), link()}
//   window.edgewiseInternal = {call(fn, ...args) -> Promise<{value, ms}>, demo(), last(), ...}
//
// (link() is made by share.js) and, once the engine's tables are in,
// loads the first project: EW.boot, when a later script sets it (share
// link, autosave, ...), else the demo. The store (store.js) dispatches
// "edgewise:solved", "edgewise:edited" and "edgewise:failed" on document.
"use strict";
(function () {
  const EW = (window.edgewiseParts = window.edgewiseParts || {});
  const { store, engine, solving } = EW;
  const root = document.documentElement;

  async function demo() {
    const inline = document.getElementById("ew-demo");
    if (inline) return JSON.parse(inline.textContent);
    const resp = await fetch("demo.json");
    return resp.json();
  }

  const copy = (p) => (p ? JSON.parse(JSON.stringify(p)) : null);
  window.edgewise = {
    load: solving.load,
    project: () => copy(store.project()),
  };
  window.edgewiseInternal = {
    call: engine.call,
    demo,
    last: store.last, // {project, result, units, nx, ny, w, h, u, ux, uy, levels, segs, ends, labels, kx, ky}
    good: () => copy(store.good()), // the last project the user meant that solved
    canvases: () => EW.canvases(), // {field, legend, profile}
    // the solve in flight: how long it has run (ms, or null), how many
    // times the worker was restarted, and how many calls it holds
    engineState: () => Object.assign({ running: solving.running() }, engine.state()),
    // test hooks: hold({fn = "solve", calls = 1}) makes the next calls of
    // fn wait in the worker until release() or a restart
    hold: engine.hold,
    release: engine.release,
    // tune({busyMs, cancelMs, pauseMs}) changes when the page shows that
    // it works, when a stale solve is cancelled and how long a pause in
    // typing makes the inputs meant
    tune: solving.tune,
    units: (physics) => (EW.unitsets || {})[physics || (store.project() || {}).physics],
  };

  // firstForm fills the inputs with the first project as soon as the
  // physics table is in, before the engine has started: the project is
  // known without it (EW.firstGuess: the link's or the autosave's, else the
  // demo). The engine then solves it as the boot below decides.
  async function firstForm() {
    try {
      await EW.loadPhysics();
      const p = (EW.firstGuess && (await EW.firstGuess())) || (await demo());
      if (p && !store.project()) {
        EW.fill(p);
        performance.mark("ew:form");
        root.dataset.formAt = performance.now().toFixed(1);
        // the boot's load need not fill the inputs again with the same
        // project (solving.js)
        EW.firstFilled = JSON.stringify(JSON.parse(EW.jsonText(p)));
        // and the engine may solve it as soon as it is up (solving.js)
        solving.askEarly(JSON.parse(EW.firstFilled));
      }
    } catch (e) { /* the boot below says what went wrong */ }
  }

  // warmFonts has the canvas find the picture's fonts while the engine
  // starts: in a new browser process the first text drawn waits for them,
  // and so would the first picture.
  function warmFonts() {
    const ctx = document.createElement("canvas").getContext("2d");
    if (!ctx) return;
    for (const font of ["600 11px system-ui, sans-serif", "11px system-ui, sans-serif"]) {
      ctx.font = font;
      ctx.fillText("0123456789.,−×⁰¹²³ T1 W/m²", 0, 12);
    }
  }

  // Boot after the other scripts have run: the engine starts at once, the
  // form is filled meanwhile.
  setTimeout(async () => {
    performance.mark("ew:boot");
    const up = engine.ready(); // the engine starts at once
    up.catch(() => {});
    await firstForm();
    warmFonts();
    try {
      await Promise.all([EW.loadPhysics(), EW.loadColours(), up]);
      root.dataset.engineAt = performance.now().toFixed(1); // the engine up (benchmark)
    } catch (e) {
      solving.setStatus(e.message, "error");
      return;
    }
    let first = null;
    try {
      if (EW.boot) {
        await EW.boot(demo);
        return;
      }
      first = await demo();
      await solving.load(first);
    } catch (e) {
      if (e.cancelled) return; // the user edited before the first solve came back
      solving.setStatus(e.message, "error");
      // show the project that did not solve, so it can be fixed
      if (first && !store.last() && !store.project()) solving.edit(first);
    }
  }, 0);
})();
