// edgewise page, part 4 of 4: the engine and the flow of a solve. Starts
// the engine in a Web Worker, sends it the project on every edit (debounced;
// the newest edit wins, and a long stale solve is cancelled by restarting
// the worker), draws what comes back and shows the numbers. Exposes
//
//   window.edgewise = {load(project) -> Promise<result>, project(), link()}
//   window.edgewiseInternal = {call(fn, ...args) -> Promise<{value, ms}>, demo(), ...}
//
// and dispatches "edgewise:solved" and "edgewise:edited" on document.
"use strict";
(function () {
  const EW = (window.edgewiseParts = window.edgewiseParts || {});
  const $ = (id) => document.getElementById(id);
  const statusEl = $("status");
  const root = document.documentElement;

  const DEBOUNCE_MS = 40; // keys faster than QUIET_MS apart: wait this long for the next
  const QUIET_MS = 60; // an edit this long after the last one solves at once
  let BUSY_MS = 250; // show that the engine is working after this long
  let CANCEL_MS = 600; // a stale solve running longer is cancelled
  const LEVELS = 12; // isoline levels asked for

  let current = null; // the last project that solved
  let typed = null; // the project as currently typed
  let lastGood = null; // the last successful solve, as drawn
  let nextId = 1;
  const pending = new Map();
  let worker = null; // Promise<Worker>
  let workerNow = null; // the Worker itself, for terminate
  let wasmBytes = null; // bundled mode: the engine bytes, decoded once

  function setStatus(text, kind) {
    statusEl.textContent = text;
    statusEl.classList.toggle("error", kind === "error");
  }

  // ---- the worker ----

  // bundled (single-file) mode keeps the worker source and the engine inside the page
  function bundled() {
    return document.getElementById("ew-wasm") !== null;
  }

  // the single file's engine, decoded once by the decoder the bundler puts
  // beside it (scripts/bundle: base-85 text of the gzip-compressed engine)
  async function engineBytes() {
    if (!wasmBytes) wasmBytes = await window.edgewiseEngineBytes();
    return wasmBytes.slice(0);
  }

  function startWorker() {
    return new Promise(async (resolve, reject) => {
      let w;
      let bytes = null;
      try {
        if (bundled()) {
          const src = document.getElementById("ew-worker").textContent;
          w = new Worker(URL.createObjectURL(new Blob([src], { type: "text/javascript" })));
          bytes = await engineBytes();
        } else {
          w = new Worker("worker.js");
        }
      } catch (e) {
        reject(new Error("the engine failed to start: " + e.message));
        return;
      }
      workerNow = w;
      w.onmessage = (ev) => {
        const m = ev.data;
        if (m.type === "ready") resolve(w);
        else if (m.type === "fatal") reject(new Error(m.error));
        else if (m.type === "reply") settle(m);
      };
      w.onerror = (e) => reject(new Error("the engine failed to start: " + (e.message || "unknown error")));
      w.postMessage({ type: "init", wasm: bytes }, bytes ? [bytes] : []);
    });
  }

  function settle(m) {
    const p = pending.get(m.id);
    if (!p) return;
    pending.delete(m.id);
    p.resolve(m);
  }

  // restart stops the worker (the only real cancel of a running solve),
  // rejects everything waiting on it, and starts a fresh one.
  let restarts = 0;
  function restart() {
    restarts++;
    if (workerNow) workerNow.terminate();
    workerNow = null;
    worker = null;
    const waiting = [...pending.values()];
    pending.clear();
    for (const p of waiting) p.reject(Object.assign(new Error("cancelled by a newer edit"), { cancelled: true }));
    worker = startWorker();
    worker.catch(() => {});
  }

  // call runs the engine function edgewise_<fn> in the worker and resolves
  // with {value, ms}.
  async function call(fn, ...args) {
    if (!worker) worker = startWorker();
    const w = await worker;
    const id = nextId++;
    return new Promise((resolve, reject) => {
      pending.set(id, { resolve, reject });
      w.postMessage({ type: "call", id, fn, args });
    });
  }

  // ---- solving: the newest request wins ----

  let gen = 0; // generation of the newest request
  let running = null; // {job, started}
  let queued = null;
  let busyTimer = 0;

  // request solves a project. It resolves with the engine's reply and
  // whether it is still the newest request; it rejects when cancelled.
  function request(project) {
    const text = JSON.stringify(project);
    return new Promise((resolve, reject) => {
      const job = { gen: ++gen, text, project, resolve, reject, t0: performance.now() };
      if (queued) queued.reject(Object.assign(new Error("superseded by a newer edit"), { cancelled: true }));
      queued = null;
      if (running && performance.now() - running.started > CANCEL_MS) {
        running = null;
        restart();
      }
      if (running) queued = job;
      else run(job);
    });
  }

  function run(job) {
    running = { job, started: performance.now() };
    clearTimeout(busyTimer);
    busyTimer = setTimeout(() => {
      root.classList.add("busy");
      setStatus("Solving…", "busy");
      $("btn-stop").hidden = false;
    }, BUSY_MS);
    const [nx, ny] = detailGrid(job.project);
    call("solve", job.text, nx, ny, LEVELS).then(
      (m) => job.resolve({ reply: m.value, ms: m.ms, newest: job.gen === gen, job }),
      (e) => job.reject(e)
    ).finally(() => {
      if (running && running.job === job) running = null;
      if (!running) {
        clearTimeout(busyTimer);
        root.classList.remove("busy");
        $("btn-stop").hidden = true;
      }
      if (!running && queued) {
        const q = queued;
        queued = null;
        run(q);
      }
    });
  }

  // stop cancels the solve in flight and any waiting one; the last good
  // picture stays.
  function stop() {
    if (queued) queued.reject(Object.assign(new Error("stopped"), { cancelled: true }));
    queued = null;
    if (!running) return;
    running = null;
    restart();
    clearTimeout(busyTimer);
    root.classList.remove("busy");
    $("btn-stop").hidden = true;
    setStatus("Stopped; the picture shows the last project that solved.", "error");
  }
  $("btn-stop").addEventListener("click", stop);

  // detailGrid returns the output grid the detail choice asks for: n
  // intervals along the longer side, the other in proportion (at least 2);
  // 0, 0 leaves it to the project or the engine's default.
  function detailGrid(p) {
    const n = Number($("opt-detail").value);
    const w = Number(p.width), h = Number(p.height);
    if (!(n > 0) || !(w > 0) || !(h > 0)) return [0, 0];
    return w >= h ? [n, Math.max(2, Math.round((n * h) / w))] : [Math.max(2, Math.round((n * w) / h)), n];
  }
  $("opt-detail").addEventListener("change", () => {
    const p = typed || current;
    if (p) solveEdit(p, performance.now());
  });

  function engineError(r) {
    const e = new Error(r.error);
    e.path = r.path || "";
    e.col = r.col || 0;
    return e;
  }

  // apply draws a successful reply and tells the other scripts.
  function apply(project, r, ms, t0) {
    const result = JSON.parse(r.result);
    const k = project.conductivity;
    const solve = {
      project, result, units: (EW.unitsets || {})[project.physics] || {},
      nx: r.nx, ny: r.ny, w: r.w, h: r.h, u: r.u, ux: r.ux, uy: r.uy,
      levels: r.levels, segs: r.segs, ends: r.ends, labels: r.labels,
      kx: typeof k === "object" ? k.x : k, ky: typeof k === "object" ? k.y : k,
    };
    current = project;
    lastGood = solve;
    markStale(false);
    EW.clearErrors();
    EW.show(solve);
    renderResults(solve);
    renderProbes(solve);
    renderCautions(result);
    const total = performance.now() - t0;
    setStatus("Solved: " + r.nx + " × " + r.ny + " grid, engine " + ms.toFixed(0) + " ms, on screen after " + total.toFixed(0) + " ms.");
    root.dataset.solved = String(Number(root.dataset.solved || 0) + 1);
    document.dispatchEvent(new CustomEvent("edgewise:solved", {
      detail: { project, result, nx: r.nx, ny: r.ny, u: r.u, ux: r.ux, uy: r.uy },
    }));
    return result;
  }

  // markStale says whether the numbers on show belong to other inputs
  // than those typed (a bad field, a project that does not solve).
  function markStale(on) {
    $("stale").hidden = !on;
    document.querySelector(".numbers").classList.toggle("stale", on);
  }

  // ---- edits ----

  let editTimer = 0;
  let previewTimer = 0;
  let lastEditAt = -Infinity;

  EW.edited = function () {
    const { project, errors } = EW.read();
    typed = project;
    document.dispatchEvent(new CustomEvent("edgewise:edited", { detail: { project } }));
    clearTimeout(previewTimer);
    previewTimer = setTimeout(() => previews(project), 120);
    clearTimeout(editTimer);
    if (errors.length) {
      EW.clearErrors();
      for (const e of errors) EW.showError(e.path, 0, e.path + ": " + e.msg);
      setStatus("Fix the marked field; the picture shows the last project that solved.", "error");
      if (lastGood) markStale(true);
      return;
    }
    // debounce only while keys come very fast (key repeat, a burst of
    // events); otherwise solve at once. While a solve runs, request()
    // keeps only the newest edit waiting, so slow solves coalesce edits too.
    const t0 = performance.now();
    const burst = t0 - lastEditAt < QUIET_MS;
    lastEditAt = t0;
    editTimer = setTimeout(() => solveEdit(project, t0), burst ? DEBOUNCE_MS : 0);
  };

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
      setStatus((placed ? "Not solved (see the marked field): " : "Not solved: ") + EW.onScreenMessage(e.path, e.message), "error");
      if (lastGood) markStale(true);
      return;
    }
    apply(project, out.reply, out.ms, t0);
  }

  const previewed = {}; // side -> what its preview was drawn from
  let previewSeq = 0; // sequence number of the newest pass of previews

  // previews redraws the edge previews whose edge or rectangle changed.
  // Each pass has a sequence number: a pass stops as soon as a newer one
  // has started, so an older pass can never draw over a newer one, and a
  // side counts as drawn only once its preview is on screen.
  async function previews(project) {
    const seq = ++previewSeq;
    const text = JSON.stringify(project);
    for (const side of EW.SIDES) {
      const key = JSON.stringify([project.width, project.height, project.edges[side]]);
      if (previewed[side] === key) continue;
      let m;
      try {
        m = await call("preview", text, side, 96);
      } catch (e) {
        // the worker was restarted: this pass starts again unless a newer one took over
        if (seq === previewSeq) setTimeout(() => seq === previewSeq && previews(project), 0);
        return;
      }
      if (seq !== previewSeq) return;
      const r = m.value;
      previewed[side] = key;
      EW.drawPreview(side, r.s, r.v, !r.ok);
    }
  }

  let previewResize = 0;
  window.addEventListener("resize", () => {
    clearTimeout(previewResize);
    previewResize = setTimeout(() => {
      for (const k of Object.keys(previewed)) delete previewed[k];
      if (typed) previews(typed);
    }, 150);
  });

  // ---- probes ----

  EW.pin = function (x, y) {
    const list = EW.probes();
    const used = new Set(list.map((p) => p.label));
    let n = 1;
    while (used.has("P" + n)) n++;
    const S = lastGood;
    const round = (v, span) => {
      const q = Math.pow(10, Math.floor(Math.log10(span)) - 4);
      return Number((Math.round(v / q) * q).toPrecision(12));
    };
    list.push({ x: round(x, S.w), y: round(y, S.h), label: "P" + n });
    EW.setProbes(list);
    EW.showProbes(list);
    renderProbes(lastGood);
    EW.edited();
  };

  function removeProbe(label) {
    const list = EW.probes().filter((p) => p.label !== label);
    EW.setProbes(list);
    EW.showProbes(list);
    renderProbes(lastGood);
    EW.edited();
  }

  function renderProbes(S) {
    const body = $("probes").tBodies[0];
    body.replaceChildren();
    const list = EW.probes();
    $("probes-hint").textContent = list.length
      ? "Values from the series at each point; ≈ marks a value read from the picture until the next solve."
      : "Click the picture (or focus it and press Enter) to pin a probe.";
    if (!S) return;
    for (const p of list) {
      const hit = (S.result.probes || []).find((q) => q.label === p.label && q.x === p.x && q.y === p.y);
      let v, gx, gy, qx, qy, approx = false;
      if (hit) {
        v = hit.value; gx = hit.gradient[0]; gy = hit.gradient[1]; qx = hit.flux[0]; qy = hit.flux[1];
      } else {
        const g = EW.sample(p.x, p.y);
        v = g.u; gx = g.ux; gy = g.uy; qx = -S.kx * g.ux; qy = -S.ky * g.uy; approx = true;
      }
      const tr = document.createElement("tr");
      tr.dataset.label = p.label;
      const td = (text, cls) => {
        const c = document.createElement("td");
        c.textContent = text;
        if (cls) c.className = cls;
        tr.append(c);
        return c;
      };
      const th = document.createElement("th");
      th.scope = "row";
      th.textContent = p.label;
      tr.append(th);
      td(EW.num(p.x, 4) + ", " + EW.num(p.y, 4));
      const vc = td((approx ? "≈ " : "") + EW.num(v, 6), "num probe-value");
      vc.dataset.value = String(v);
      tr.append(...EW.probeCells(p, S, gx, gy, qx, qy));
      const cell = document.createElement("td");
      const b = document.createElement("button");
      b.type = "button";
      b.className = "remove";
      b.textContent = "×";
      b.setAttribute("aria-label", "Remove probe " + p.label);
      b.addEventListener("click", () => removeProbe(p.label));
      cell.append(b);
      tr.append(cell);
      body.append(tr);
    }

  }

  // ---- results ----

  // kvRow appends a term and its value (with an optional note) to a
  // description list and returns the value's element.
  function kvRow(dl, k, v, note) {
    const dt = document.createElement("dt");
    dt.textContent = k;
    const dd = document.createElement("dd");
    dd.textContent = v;
    if (note) {
      const s = document.createElement("span");
      s.className = "note";
      s.textContent = " " + note;
      dd.append(s);
    }
    dl.append(dt, dd);
    return dd;
  }

  function renderResults(S) {
    const r = S.result, u = S.units || {}, p = S.project;
    const box = $("results");
    box.replaceChildren();
    const vu = u.value_unit || "", fu = u.flow_unit || "", L = u.length_unit || "m";
    const at = (e) => "at x = " + EW.num(e.x, 4) + ", y = " + EW.num(e.y, 4) + " " + L;
    const dl = document.createElement("dl");
    dl.className = "kv";
    const row = (k, v, note) => kvRow(dl, k, v, note);
    row("Highest " + (u.value || "value"), EW.withUnit(EW.value(r.max.value, 5), vu), at(r.max)).id = "res-max";
    row("Lowest " + (u.value || "value"), EW.withUnit(EW.value(r.min.value, 5), vu), at(r.min)).id = "res-min";
    row("Mean " + (u.value || "value"), EW.withUnit(EW.value(r.mean, 5), vu), "over the rectangle").id = "res-mean";
    box.append(dl);


    // flows
    const h = document.createElement("h3");
    h.textContent = "Flow through the edges" + (fu ? " [" + fu + "]" : "");
    const note = document.createElement("p");
    note.className = "hint";
    note.textContent = "Positive into the rectangle, per metre of depth.";
    const t = document.createElement("table");
    t.className = "flows";
    t.id = "res-flows";
    const add = (name, text, cls) => {
      const tr = document.createElement("tr");
      const th = document.createElement("th");
      th.scope = "row";
      th.textContent = name;
      const td = document.createElement("td");
      td.className = "num" + (cls ? " " + cls : "");
      td.textContent = text;
      tr.append(th, td);
      t.append(tr);
      return tr;
    };
    const infinite = [];
    const flowNotes = new Set();
    let largest = Math.abs(r.source_total || 0);
    for (const side of ["top", "bottom", "left", "right"]) {
      const e = r.edges[side];
      if (e.finite && e.flow !== null) {
        largest = Math.max(largest, Math.abs(e.flow));
        add(EW.capital(side), EW.flow(e.flow, 5));
        continue;
      }
      infinite.push(side);
      const tr = add(EW.capital(side), "∞ infinite", "inf");
      // the engine's reason for this edge, e.g. "the value jumps from 90
      // to 40 at the bottom-left corner"
      const head = "flow through the " + side + " edge is infinite: ";
      for (const w of r.warnings || []) {
        if (!w.startsWith(head)) continue;
        flowNotes.add(w);
        const note = document.createElement("span");
        note.className = "reason";
        note.textContent = w.slice(head.length);
        tr.lastChild.append(note);
      }
    }
    if (r.source_total) add("Source", EW.flow(r.source_total, 5));
    let balanceText;
    if (r.balance === null || infinite.length) {
      balanceText = "not defined (an edge flow is infinite)";
    } else {
      // against the largest flow or, when every flow is near zero (which
      // would give a meaningless 100 %), the flow a unit-aspect block with
      // the field's range across it would carry
      const kdu = Math.sqrt(S.kx * S.ky) * (r.max.value - r.min.value);
      const scale = largest > 1e-6 * kdu ? largest : kdu;
      balanceText = EW.flow(r.balance, 3) + (scale > 0 ? "  (" + EW.num((100 * Math.abs(r.balance)) / scale, 2) + (scale === largest ? " % of the largest flow)" : " % of conductivity × range)") : "");
    }
    add("Balance", balanceText, "balance").id = "res-balance";
    box.append(h, note, t);
    if (infinite.length) {
      const why = document.createElement("p");
      why.className = "why";
      why.textContent = "Why infinite: where the prescribed " + (u.value || "value") + " jumps at a corner, the gradient grows like 1/r " +
        "towards it and the flow through the edges meeting there has no finite total. Real parts have a small gap or a rounded " +
        "transition; formulas that meet at the corner give finite flows. Values away from the corner are not affected.";
      box.append(why);
    }
    const others = (r.warnings || []).filter((w) => !flowNotes.has(w));

    // accuracy
    const ha = document.createElement("h3");
    ha.textContent = "Accuracy";
    const da = document.createElement("dl");
    da.className = "kv";
    box.append(ha, da);
    const acc = r.accuracy || {};
    const row2 = (k, v, note) => kvRow(da, k, v, note);
    row2("Series terms", String(acc.terms));
    row2("Error estimate", EW.withUnit(EW.num(acc.estimate, 2), vu), "largest, away from singular corners");
    if (acc.crosscheck !== null && acc.crosscheck !== undefined) {
      row2("Cross-check", EW.withUnit(EW.num(acc.crosscheck, 2), vu), "largest difference from finite differences" + (acc.crosscheck_grid ? " (" + acc.crosscheck_grid + ")" : ""));
    } else {
      row2("Cross-check", "skipped", acc.crosscheck_skipped || "");
    }
    row2("Output grid", r.grid.nx + " × " + r.grid.ny + " intervals");
    if (others.length) {
      const hw = document.createElement("h3");
      hw.textContent = "Notes from the engine";
      const ul = document.createElement("ul");
      ul.className = "warnings";
      box.append(hw);
      for (const w of others) {
        const li = document.createElement("li");
        li.textContent = w;
        ul.append(li);
      }
      box.append(ul);
    }

  }

  function renderCautions(r) {
    const ul = $("cautions");
    ul.replaceChildren();
    const list = r.cautions || [];
    list.forEach((c, i) => {
      const li = document.createElement("li");
      li.textContent = c;
      if (i === list.length - 1) li.className = "deferral";
      ul.append(li);
    });
  }

  // ---- the public interface ----

  async function load(project) {
    let obj = project;
    if (typeof project === "string") {
      try {
        obj = JSON.parse(project);
      } catch (e) {
        const err = Object.assign(new Error("not a project file: " + e.message), { path: "", col: 0 });
        setStatus(err.message, "error");
        throw err;
      }
    }
    if (obj === null || typeof obj !== "object" || Array.isArray(obj)) {
      const err = Object.assign(new Error("not a project file: expected a JSON object"), { path: "", col: 0 });
      setStatus(err.message, "error");
      throw err;
    }
    obj = JSON.parse(JSON.stringify(obj));
    clearTimeout(editTimer);
    const t0 = performance.now();
    const out = await request(obj);
    if (!out.reply.ok) {
      const e = engineError(out.reply);
      if (out.newest) setStatus("Not loaded: " + e.message, "error");
      throw e;
    }
    if (!out.newest) return JSON.parse(out.reply.result);
    EW.fill(obj);
    typed = obj;
    previews(obj);
    return apply(obj, out.reply, out.ms, t0);
  }

  async function demo() {
    const inline = document.getElementById("ew-demo");
    if (inline) return JSON.parse(inline.textContent);
    const resp = await fetch("demo.json");
    return resp.json();
  }

  const copy = (p) => (p ? JSON.parse(JSON.stringify(p)) : null);
  window.edgewise = {
    load,
    project: () => copy(typed || current),
    link: () => location.href.split("#")[0] + "#p=" + encodeURIComponent(JSON.stringify(typed || current)),
  };
  // For the page's other scripts (outputs.js): the engine, the demo and
  // what is on screen.
  window.edgewiseInternal = {
    call,
    demo,
    last: () => lastGood, // {project, result, units, nx, ny, w, h, u, ux, uy, levels, segs, ends, labels, kx, ky}
    colourMap: () => EW.colourMap(), // {mode, lo, hi, table: Uint8Array rgb}
    canvases: () => EW.canvases(), // {field, legend, profile}
    // the solve in flight: how long it has run (ms, or null) and how many
    // times a stale solve was cancelled by restarting the worker
    engineState: () => ({ running: running ? performance.now() - running.started : null, restarts }),
    // tune changes when the page shows that it works and when a stale
    // solve is cancelled (tests use short times so that they do not depend
    // on how fast the engine is)
    tune: (t) => {
      if (t.busyMs >= 0) BUSY_MS = t.busyMs;
      if (t.cancelMs >= 0) CANCEL_MS = t.cancelMs;
      return { busyMs: BUSY_MS, cancelMs: CANCEL_MS };
    },
    units: (physics) => (EW.unitsets || {})[physics || (typed || current || {}).physics],
  };

  // Boot after the other scripts have run: window.edgewiseBoot, when one
  // of them sets it, chooses the first project (share link, autosave, ...).
  setTimeout(async () => {
    let first = null;
    try {
      const [, colours] = await Promise.all([EW.loadPhysics(), call("colours", 256)]);
      EW.colours = colours.value;
      first = (window.edgewiseBoot && (await window.edgewiseBoot())) || (await demo());
      await load(first);
    } catch (e) {
      if (e.cancelled) return; // the user edited before the first solve came back
      setStatus(e.message, "error");
      if (first && typeof first === "object" && !lastGood && !typed) {
        // show the project that did not solve, so it can be fixed
        try {
          EW.fill(first);
          typed = first;
          previews(first);
          if (e.path !== undefined) EW.showError(e.path, e.col, e.message);
        } catch (_) { /* the form keeps its defaults */ }
      }
    }
  }, 0);
})();
