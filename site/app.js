// edgewise page: starts the engine in a Web Worker, sends it the project,
// draws the field it returns and shows the numbers. Exposes
// window.edgewise = {load(project) -> Promise<result>, project(), link()}.
"use strict";
(function () {
  const $ = (id) => document.getElementById(id);
  const canvas = $("field");
  const statusEl = $("status");

  let current = null; // the last project that solved
  let lastGood = null; // {result, nx, ny, u}
  let nextId = 1;
  const pending = new Map();
  let worker = null;
  let wasmBytes = null; // bundled mode: the engine bytes, decoded once

  function setStatus(text, isError) {
    statusEl.textContent = text;
    statusEl.classList.toggle("error", !!isError);
  }

  // bundled (single-file) mode keeps the worker source and the engine inside the page
  function bundled() {
    return document.getElementById("ew-wasm") !== null;
  }

  async function engineBytes() {
    if (wasmBytes) return wasmBytes.slice(0);
    const b64 = document.getElementById("ew-wasm").textContent.trim();
    const bin = Uint8Array.from(atob(b64), (c) => c.charCodeAt(0));
    const stream = new Blob([bin]).stream().pipeThrough(new DecompressionStream("gzip"));
    wasmBytes = await new Response(stream).arrayBuffer();
    return wasmBytes.slice(0);
  }

  function startWorker() {
    return new Promise(async (resolve, reject) => {
      let w;
      let bytes = null;
      if (bundled()) {
        const src = document.getElementById("ew-worker").textContent;
        w = new Worker(URL.createObjectURL(new Blob([src], { type: "text/javascript" })));
        bytes = await engineBytes();
      } else {
        w = new Worker("worker.js");
      }
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

  async function solve(text) {
    const m = await call("solve", text, 0, 0);
    const r = m.value;
    if (!r.ok) {
      const e = new Error(r.error);
      e.path = r.path; e.col = r.col;
      throw e;
    }
    r.ms = m.ms;
    return r;
  }

  async function load(project) {
    const text = typeof project === "string" ? project : JSON.stringify(project);
    let obj;
    try {
      obj = JSON.parse(text);
    } catch (e) {
      const err = new Error("not a project file: " + e.message);
      setStatus(err.message, true);
      throw err;
    }
    setStatus("Solving…");
    let m;
    try {
      m = await solve(text);
    } catch (e) {
      setStatus(e.message, true);
      throw e;
    }
    const result = JSON.parse(m.result);
    current = obj;
    lastGood = { result, nx: m.nx, ny: m.ny, u: m.u };
    draw(lastGood);
    show(result);
    setStatus("Solved in " + m.ms.toFixed(0) + " ms.");
    document.documentElement.dataset.solved = String(Number(document.documentElement.dataset.solved || 0) + 1);
    document.dispatchEvent(new CustomEvent("edgewise:solved", {
      detail: { project: obj, result, nx: m.nx, ny: m.ny, u: m.u, ux: m.ux, uy: m.uy },
    }));
    return result;
  }

  // a plain lightness ramp until the designed colour maps are wired in
  function colour(t) {
    const v = Math.round(30 + 210 * t);
    return [Math.round(v * 0.55), Math.round(v * 0.8), v];
  }

  function draw(g) {
    const { nx, ny, u } = g;
    let lo = Infinity, hi = -Infinity;
    for (const v of u) { if (v < lo) lo = v; if (v > hi) hi = v; }
    const span = hi > lo ? hi - lo : 1;
    canvas.width = nx + 1;
    canvas.height = ny + 1;
    const ctx = canvas.getContext("2d");
    const img = ctx.createImageData(nx + 1, ny + 1);
    for (let j = 0; j <= ny; j++) {
      for (let i = 0; i <= nx; i++) {
        const c = colour((u[j * (nx + 1) + i] - lo) / span);
        const k = 4 * ((ny - j) * (nx + 1) + i); // y up
        img.data[k] = c[0]; img.data[k + 1] = c[1]; img.data[k + 2] = c[2]; img.data[k + 3] = 255;
      }
    }
    ctx.putImageData(img, 0, 0);
    canvas.setAttribute("aria-label", "Field from " + lo.toPrecision(4) + " to " + hi.toPrecision(4));
  }

  function show(r) {
    const dl = $("results");
    dl.replaceChildren();
    const row = (k, v) => {
      const dt = document.createElement("dt"); dt.textContent = k;
      const dd = document.createElement("dd"); dd.textContent = v;
      dl.append(dt, dd);
    };
    row("max", r.max.value.toPrecision(5) + " at (" + r.max.x.toPrecision(3) + ", " + r.max.y.toPrecision(3) + ")");
    row("min", r.min.value.toPrecision(5) + " at (" + r.min.x.toPrecision(3) + ", " + r.min.y.toPrecision(3) + ")");
    for (const p of r.probes) row(p.label, p.value.toPrecision(6));
  }

  async function demo() {
    const inline = document.getElementById("ew-demo");
    if (inline) return JSON.parse(inline.textContent);
    const resp = await fetch("demo.json");
    return resp.json();
  }

  window.edgewise = {
    load,
    project: () => (current ? JSON.parse(JSON.stringify(current)) : null),
    link: () => location.href.split("#")[0] + "#p=" + encodeURIComponent(JSON.stringify(current)),
  };
  // For the page's other scripts (outputs.js): the engine and the demo.
  window.edgewiseInternal = { call, demo };

  // Boot after the other scripts have run: window.edgewiseBoot, when one
  // of them sets it, chooses the first project (share link, autosave, ...).
  setTimeout(async () => {
    try {
      const first = (window.edgewiseBoot && (await window.edgewiseBoot())) || (await demo());
      await load(first);
    } catch (e) {
      setStatus(e.message, true);
    }
  }, 0);
})();
