// edgewise page: the flow of a solve. Sends the project to the engine on
// every edit (debounced only while keys come very fast; the newest edit
// wins, and a long stale solve is cancelled by restarting the worker),
// puts what comes back into the store, and loads projects strictly.
//
// The live picture follows the typing, but the store's good project is
// the last one the user meant: typed and then paused on (PAUSE_MS without
// an edit), confirmed with Enter, or left (the field loses focus), or
// chosen (a list, a check box, a probe pinned or dropped), or loaded, or
// the page is left.
//
// A probe outside the rectangle stays in the project (the table marks it
// and offers to move it inside or drop it); the engine is sent only the
// probes inside, so the page keeps solving.
//
//   EW.solving = {edited(), load(value), check(text), edit(project), commit(), stop(), tune(t), running()}
//   EW.outsideProbe(probe, project) -> true when the probe lies outside
//
// EW.edited is the form's hook (form.js calls it on every input).
"use strict";
(function () {
  const EW = (window.edgewiseParts = window.edgewiseParts || {});
  const { byId } = EW.dom;
  const store = EW.store;
  const engine = EW.engine;
  const root = document.documentElement;

  const DEBOUNCE_MS = 40; // keys faster than QUIET_MS apart: wait this long for the next
  const QUIET_MS = 60; // an edit this long after the last one solves at once
  let BUSY_MS = 250; // show that the engine is working after this long
  let PAUSE_MS = 1500; // typing paused this long: the inputs are meant
  let CANCEL_MS = 600; // a stale solve running longer is cancelled
  const LEVELS = 12; // isoline levels asked for
  const MAX_TEXT = 1 << 20; // bytes of a project text
  const CANCELLED_BY_EDIT = "cancelled by a newer edit";
  const STOPPED = "stopped by the user";

  function setStatus(text, kind) {
    const s = byId("status");
    s.textContent = text;
    s.classList.toggle("error", kind === "error");
  }

  const cancelled = (reason) => Object.assign(new Error(reason), { cancelled: true });

  // ---- probes outside the rectangle ----

  const finite = (v) => typeof v === "number" && Number.isFinite(v);
  // outsideProbe tells whether a probe lies outside the project's
  // rectangle (a probe or rectangle that is not numbers is left to the
  // engine's strict reader).
  function outsideProbe(q, project) {
    const p = project || store.project() || {};
    if (!q || !finite(q.x) || !finite(q.y) || !finite(p.width) || !finite(p.height) || !(p.width > 0 && p.height > 0)) return false;
    return q.x < 0 || q.x > p.width || q.y < 0 || q.y > p.height;
  }
  EW.outsideProbe = outsideProbe;

  // forEngine is the project as the engine gets it: without the probes
  // outside the rectangle.
  function forEngine(project) {
    if (!Array.isArray(project.probes) || !project.probes.some((q) => outsideProbe(q, project))) return project;
    return Object.assign({}, project, { probes: project.probes.filter((q) => !outsideProbe(q, project)) });
  }
  const outsideNote = (project) => {
    const out = (Array.isArray(project.probes) ? project.probes : []).filter((q) => outsideProbe(q, project));
    if (!out.length) return "";
    const names = out.map((q) => q.label || "?").join(", ");
    return " Probe" + (out.length > 1 ? "s " : " ") + names + (out.length > 1 ? " lie" : " lies") + " outside the rectangle and " + (out.length > 1 ? "are" : "is") + " left out (see Probes).";
  };

  // ---- the newest request wins ----

  let gen = 0; // generation of the newest request
  let running = null; // {job, started}
  let queued = null;
  let busyTimer = 0;

  // request solves a project. It resolves with the engine's reply and
  // whether it is still the newest request; it rejects when cancelled.
  function request(project) {
    const text = JSON.stringify(forEngine(project));
    return new Promise((resolve, reject) => {
      const job = { gen: ++gen, text, project, resolve, reject };
      if (queued) queued.reject(cancelled(CANCELLED_BY_EDIT));
      queued = null;
      if (running && performance.now() - running.started > CANCEL_MS) {
        running = null;
        engine.restart(CANCELLED_BY_EDIT);
      }
      if (running) queued = job;
      else run(job);
    });
  }

  function showBusy(on) {
    clearTimeout(busyTimer);
    if (on) {
      busyTimer = setTimeout(() => {
        root.classList.add("busy");
        setStatus("Solving…", "busy");
        byId("btn-stop").hidden = false;
      }, BUSY_MS);
      return;
    }
    root.classList.remove("busy");
    byId("btn-stop").hidden = true;
  }

  // The first solve of the page runs in an engine that has just started,
  // whose code the browser is still compiling, and is several times slower
  // than the next: it asks for the picture without the cross-check, which
  // follows in a second call (checkLater). Every later solve carries its
  // cross-check.
  let pictureFirst = true;

  // askEarly sends that first solve as soon as the page knows its first
  // project (app.js, before the engine is up): the worker then solves it
  // the moment its engine has started, instead of after a round trip
  // through the page. run() takes the reply when its first request is the
  // same text at the same detail; otherwise it is left unused.
  let early = null; // {text, n, reply}
  function askEarly(project) {
    if (!pictureFirst || early) return;
    const text = JSON.stringify(forEngine(project));
    const n = Number(byId("opt-detail").value) || 0;
    performance.mark("ew:solve-asked");
    early = { text, n, reply: engine.call("solve", text, n, 0, LEVELS, true) };
    early.reply.catch(() => {}); // run() says what failed, if it takes it
  }

  function run(job) {
    running = { job, started: performance.now() };
    showBusy(true);
    // the engine chooses the grid: the detail choice gives the intervals
    // along the longer side (0: the project's grid or the engine's default)
    const n = Number(byId("opt-detail").value) || 0;
    const quick = pictureFirst;
    pictureFirst = false;
    let reply;
    if (quick && early && early.text === job.text && early.n === n) {
      reply = early.reply;
    } else {
      if (quick) performance.mark("ew:solve-asked");
      reply = engine.call("solve", job.text, n, 0, LEVELS, quick);
    }
    early = null;
    reply.then(
      (m) => {
        if (quick) performance.mark("ew:solve-answered", { detail: m.ms });
        job.resolve({ reply: m.value, ms: m.ms, gen: job.gen, newest: job.gen === gen, check: quick ? { text: job.text, n } : null });
      },
      (e) => job.reject(e)
    ).finally(() => {
      if (running && running.job === job) running = null;
      if (!running) showBusy(false);
      if (!running && queued) {
        const q = queued;
        queued = null;
        run(q);
      }
    });
  }

  // checkLater runs the cross-check of a solve whose picture came without
  // it ({text, n} of its request: the same project and grid) and puts its
  // outcome into the solve. Until then the solve is marked checkPending,
  // and the results say the cross-check is pending; when it cannot run,
  // they say that and why. The full solve's result replaces the first
  // one: when only its accuracy differs (the cross-check's figures), the
  // results are written again; when more differs (a check that finds the
  // numbers unreliable withholds answers and cautions), the full solve is
  // shown in its place, if it is still on screen. The solve's checked
  // promise resolves with the result as it then stands.
  function checkLater(solve, req, project) {
    solve.checkPending = true;
    const done = (reason) => {
      solve.checkPending = false;
      if (reason) solve.checkFailed = reason;
      if (!root.dataset.firstCheckAt) {
        performance.mark("ew:first-check");
        root.dataset.firstCheckAt = performance.now().toFixed(1);
      }
      return solve.result;
    };
    const but = (r) => JSON.stringify(Object.assign({}, r, { accuracy: null }));
    return engine.call("solve", req.text, req.n, 0, LEVELS, false).then((m) => {
      const r = m.value;
      if (!r || !r.ok) {
        done("the cross-check did not run: " + ((r && r.error) || "no answer"));
        if (store.last() === solve && EW.results) EW.results.render(solve);
        return solve.result;
      }
      const full = JSON.parse(r.result);
      if (but(full) === but(solve.result)) {
        solve.result.accuracy = full.accuracy;
        done("");
        if (store.last() === solve && EW.results) EW.results.render(solve); // else it is not on screen
        return solve.result;
      }
      solve.result = full;
      done("");
      if (store.last() === solve) return apply(project, r, m.ms, performance.now(), null);
      return solve.result;
    }, (e) => {
      done("the cross-check did not run: " + e.message);
      if (store.last() === solve && EW.results) EW.results.render(solve);
      return solve.result;
    });
  }

  // stop cancels the solve in flight and any waiting one; the last good
  // picture stays.
  function stop() {
    if (queued) queued.reject(cancelled(STOPPED));
    queued = null;
    if (!running) return;
    running = null;
    engine.restart(STOPPED);
    showBusy(false);
    setStatus("Stopped; the picture shows the last project that solved.", "error");
  }
  byId("btn-stop").addEventListener("click", stop);
  byId("opt-detail").addEventListener("change", () => {
    const p = store.project();
    if (p) solveEdit(p, performance.now());
  });

  function engineError(r) {
    return Object.assign(new Error(r.error), { path: r.path || "", col: r.col || 0 });
  }

  // solveOf reads a successful reply into a solve as the store keeps it.
  function solveOf(project, r) {
    const k = project.conductivity;
    return {
      project, result: JSON.parse(r.result), units: (EW.unitsets || {})[project.physics] || {},
      nx: r.nx, ny: r.ny, w: r.w, h: r.h, u: r.u, ux: r.ux, uy: r.uy,
      levels: r.levels, segs: r.segs, ends: r.ends, labels: r.labels,
      flowsegs: r.flowsegs || null, equisegs: r.equisegs || null,
      kx: typeof k === "object" ? k.x : k, ky: typeof k === "object" ? k.y : k,
    };
  }

  // apply puts a successful reply into the store, which draws it; a solve
  // drawn ahead (drawn: the first picture, see load) goes in as it is,
  // without drawing it again. With check ({text, n} of the request), the
  // reply came without its cross-check, which follows (checkLater); the
  // solve's checked promise tells when.
  function apply(project, r, ms, t0, check, drawn) {
    const solve = drawn || solveOf(project, r);
    const result = solve.result;
    markStale(false);
    EW.clearErrors();
    const text = JSON.stringify(project);
    let later = null;
    if (check) {
      // the cross-check is asked for once the picture is drawn: in the
      // engine's first seconds the browser is still compiling the engine's
      // code, and the check's work would take the processor from the
      // picture's drawing
      solve.checkPending = true;
      solve.checked = new Promise((resolve) => { later = resolve; });
    } else {
      solve.checked = Promise.resolve(result);
    }
    lastSolve = { text, solve };
    store.solved(solve);
    if (later) later(checkLater(solve, check, project));
    if (text === meantText) store.meant(solve);
    const total = performance.now() - t0;
    setStatus("Solved: " + r.nx + " × " + r.ny + " grid, engine " + ms.toFixed(0) + " ms, on screen after " + total.toFixed(0) + " ms." + outsideNote(project));
    root.dataset.solved = String(Number(root.dataset.solved || 0) + 1);
    if (!root.dataset.firstPictureAt && !firstFrame) {
      firstFrame = frameDrawn().then(() => markFirstPicture(check));
    }
    return result;
  }

  // frameDrawn resolves once the browser has drawn the next frame: what
  // was drawn before is on screen (a task posted from a frame's callback
  // runs after that frame's layout and paint). A page the browser does not
  // draw (a hidden tab) has no frames: FRAME_WAIT_MS is as long as the
  // page's first load waits for one.
  const frameDrawn = () => new Promise((resolve) => requestAnimationFrame(() => setTimeout(resolve, 0)));
  const FRAME_WAIT_MS = 250;
  let firstFrame = null; // the first picture's frame, marked once it is drawn
  // markFirstPicture notes when the page's first picture was on screen,
  // in ms from the page's start (the browser benchmark reads it), and
  // its cross-check with it when it came with the picture (no check to
  // follow)
  function markFirstPicture(check) {
    if (root.dataset.firstPictureAt) return;
    performance.mark("ew:first-picture");
    root.dataset.firstPictureAt = performance.now().toFixed(1);
    if (!check && !root.dataset.firstCheckAt) root.dataset.firstCheckAt = root.dataset.firstPictureAt;
  }

  // markStale says whether the numbers on show belong to other inputs
  // than those typed (a bad field, a project that does not solve).
  function markStale(on) {
    byId("stale").hidden = !on;
    document.querySelector(".numbers").classList.toggle("stale", on);
  }

  // ---- what the user meant ----

  let meantText = null; // the project last meant, as JSON text
  let lastSolve = null; // {text, solve} of the newest solve drawn
  let pauseTimer = 0;

  // commit makes the inputs as they stand the project the user meant; it
  // becomes the good project as soon as it has solved.
  function commit() {
    clearTimeout(pauseTimer);
    const p = store.project();
    if (!p) return;
    meantText = JSON.stringify(p);
    if (lastSolve && lastSolve.text === meantText) store.meant(lastSolve.solve);
  }

  // typing is text typed into a field (meant after a pause, Enter or
  // leaving the field); anything else is meant at once
  const typing = (target) => !!target && target.tagName === "INPUT" && target.type === "text";

  // failedHere shows the good project's picture again when the one on
  // screen is half-typed, and marks the numbers as not those of the inputs.
  function failedHere() {
    store.fallback();
    if (store.last()) markStale(true);
  }

  document.addEventListener("keydown", (e) => {
    if (e.key === "Enter" && e.target && e.target.dataset && e.target.dataset.path !== undefined) commit();
  });
  // leaving the page is leaving the field: a solved edit is kept as meant
  window.addEventListener("pagehide", () => commit());
  document.addEventListener("visibilitychange", () => { if (document.visibilityState === "hidden") commit(); });
  document.addEventListener("focusout", (e) => {
    if (e.target && e.target.dataset && e.target.dataset.path !== undefined && typing(e.target)) commit();
  });

  // ---- edits ----

  let editTimer = 0;
  let previewTimer = 0;
  let lastEditAt = -Infinity;

  function edited(target) {
    const { project, errors } = EW.read();
    store.edited(project);
    clearTimeout(pauseTimer);
    if (typing(target)) pauseTimer = setTimeout(commit, PAUSE_MS);
    else commit();
    clearTimeout(previewTimer);
    previewTimer = setTimeout(() => previews(project), 120);
    clearTimeout(editTimer);
    if (errors.length) {
      gen++; // a solve still running for an older edit must not clear these errors when it ends
      EW.clearErrors();
      for (const e of errors) EW.showError(e.path, 0, e.path + ": " + e.msg);
      failedHere();
      setStatus("Fix the marked field; the picture shows the last project you meant that solved.", "error");
      return;
    }
    // debounce only while keys come very fast (key repeat, a burst of
    // events); otherwise solve at once, in this task: the worker then
    // solves while the browser draws the typed character (a timer would
    // wait for that frame, 10-15 ms). While a solve runs, request() keeps
    // only the newest edit waiting, so slow solves coalesce edits too.
    const t0 = performance.now();
    const burst = t0 - lastEditAt < QUIET_MS;
    lastEditAt = t0;
    if (burst) editTimer = setTimeout(() => solveEdit(project, t0), DEBOUNCE_MS);
    else solveEdit(project, t0);
  }
  EW.edited = edited;

  async function solveEdit(project, t0) {
    let out;
    try {
      out = await request(project);
    } catch (e) {
      if (!e.cancelled) setStatus(e.message, "error");
      return;
    }
    if (!out.newest) return;
    if (!out.reply.ok) {
      const e = engineError(out.reply);
      EW.clearErrors();
      const placed = EW.showError(e.path, e.col, e.message);
      failedHere();
      setStatus((placed ? "Not solved (see the marked field): " : "Not solved: ") + EW.onScreenMessage(e.path, e.message), "error");
      store.failed(project, e);
      return;
    }
    apply(project, out.reply, out.ms, t0, out.check);
  }

  // edit puts a project into the inputs and solves it as an edit: a
  // project that does not solve stays in the form with its error marked.
  function edit(project) {
    EW.fill(project);
    edited();
  }

  const previewed = {}; // side -> what its preview was drawn from
  let previewSeq = 0; // sequence number of the newest pass of previews

  // previews redraws the edge previews whose edge or rectangle changed.
  // Each pass has a sequence number: a pass stops as soon as a newer one
  // has started, so an older pass can never draw over a newer one, and a
  // side counts as drawn only once its preview is on screen. The probes
  // are not sent (a preview does not depend on them), and a preview that
  // could not be drawn is tried again on the next edit, so none sticks.
  async function previews(project) {
    const seq = ++previewSeq;
    const text = JSON.stringify(Object.assign({}, project, { probes: [] }));
    for (const side of EW.SIDES) {
      const key = JSON.stringify([project.width, project.height, (project.edges || {})[side]]);
      if (previewed[side] === key) continue;
      let m;
      // an edge in parts: each part's data on its own stretch (segments.js)
      const parts = Array.isArray(((project.edges || {})[side] || {}).segments);
      try {
        m = parts ? await EW.parts.sample(project, side, 240) : await engine.call("preview", text, side, 96);
      } catch (e) {
        // the worker was restarted: this pass starts again unless a newer one took over
        if (seq === previewSeq) setTimeout(() => seq === previewSeq && previews(project), 0);
        return;
      }
      if (seq !== previewSeq) return;
      const r = m.value;
      if (parts) EW.parts.draw(side, r);
      else EW.drawPreview(side, r.s, r.v, !r.ok);
      if (r.ok) previewed[side] = key;
      else delete previewed[side];
    }
  }

  let previewResize = 0;
  window.addEventListener("resize", () => {
    clearTimeout(previewResize);
    previewResize = setTimeout(() => {
      for (const k of Object.keys(previewed)) delete previewed[k];
      const p = store.project();
      if (p) previews(p);
    }, 150);
  });

  // ---- loading ----

  const notProject = (msg) => Object.assign(new Error("not a project file: " + msg), { path: "", col: 0 });

  // check reads a project text as the runner, file open and share links
  // do: JSON with one object of schema edgewise/1, then the engine's own
  // strict decoder (duplicate keys, unknown keys, bad values refused). It
  // returns the object or throws a one-line error.
  async function check(text) {
    if (typeof text !== "string") throw notProject("expected JSON text");
    if (text.length > MAX_TEXT) throw notProject("larger than " + MAX_TEXT + " bytes; a project is a few kB");
    let obj;
    try {
      obj = JSON.parse(text);
    } catch (e) {
      throw notProject("not JSON (" + String(e.message).split("\n")[0] + ")");
    }
    if (!obj || typeof obj !== "object" || Array.isArray(obj)) throw notProject("expected a JSON object");
    if (obj.schema !== "edgewise/1") {
      const schema = typeof obj.schema === "string" ? JSON.stringify(obj.schema.slice(0, 40)) : "missing";
      throw Object.assign(new Error("not an edgewise project (its schema is " + schema + ", expected \"edgewise/1\")"), { path: "", col: 0 });
    }
    let m = await engine.call("validate", text);
    // a probe outside the rectangle is kept and left out of the solves
    // (the strict reader has read the whole text by then)
    if (m.value && !m.value.ok && /^probes\[\d+\]\.[xy]$/.test(m.value.path || "") && forEngine(obj) !== obj) {
      m = await engine.call("validate", JSON.stringify(forEngine(obj)));
    }
    if (!m.value || !m.value.ok) throw engineError(m.value || { error: "the engine gave no answer" });
    return obj;
  }

  // load solves a project given as an object or as JSON text and shows it;
  // it resolves with the result or rejects with a one-line error, the last
  // good picture staying.
  async function load(value) {
    let obj;
    try {
      if (typeof value === "string") {
        obj = await check(value);
      } else {
        if (value === null || typeof value !== "object" || Array.isArray(value)) throw notProject("expected a JSON object");
        obj = JSON.parse(EW.jsonText(value));
      }
    } catch (e) {
      if (!e.cancelled) setStatus(e.message, "error");
      throw Object.assign(new Error(e.message), { path: e.path || "", col: e.col || 0, cancelled: e.cancelled });
    }
    clearTimeout(editTimer);
    const t0 = performance.now();
    const out = await request(obj);
    if (!out.reply.ok) {
      const e = engineError(out.reply);
      if (out.newest) setStatus("Not loaded: " + e.message, "error");
      throw e;
    }
    if (!out.newest) return JSON.parse(out.reply.result);
    // The page's first picture goes on screen before the rest of the page
    // takes the reply: the results, the probes and the notes are laid out
    // in a frame of their own, after the picture's (in a new browser
    // process that layout took 0.15-0.35 s). An edit made meanwhile wins.
    let drawn = null;
    if (!root.dataset.firstPictureAt && !firstFrame) {
      drawn = solveOf(obj, out.reply);
      EW.show(drawn);
      drawn.drawn = true; // results.js does not draw it again
      performance.mark("ew:picture-drawn");
      firstFrame = frameDrawn().then(() => markFirstPicture(out.check));
      await Promise.race([firstFrame, new Promise((resolve) => setTimeout(resolve, FRAME_WAIT_MS))]);
      if (out.gen !== gen) return drawn.result;
    }
    // the inputs already show this project when the page filled them
    // before the engine started (app.js) and nothing was typed since:
    // filling them again cost the first picture 25-50 ms
    const shown = EW.firstFilled === JSON.stringify(obj) && !store.project();
    EW.firstFilled = null;
    if (!shown) EW.fill(obj);
    store.edited(obj);
    previews(obj);
    meantText = JSON.stringify(obj);
    apply(obj, out.reply, out.ms, t0, out.check, drawn);
    // the caller gets the result with its cross-check
    return store.last().checked;
  }

  EW.solving = {
    edited,
    load,
    check,
    edit,
    commit,
    askEarly,
    forEngine, // the project without its probes outside the rectangle (for every engine call)
    stop,
    setStatus,
    running: () => (running ? performance.now() - running.started : null),
    // tune changes when the page shows that it works and when a stale
    // solve is cancelled (tests use short times)
    tune(t) {
      if (t.busyMs >= 0) BUSY_MS = t.busyMs;
      if (t.cancelMs >= 0) CANCEL_MS = t.cancelMs;
      if (t.pauseMs >= 0) PAUSE_MS = t.pauseMs;
      return { busyMs: BUSY_MS, cancelMs: CANCEL_MS, pauseMs: PAUSE_MS };
    },
  };
})();
