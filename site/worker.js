// The edgewise worker: loads the Go engine (WebAssembly) and solves the
// projects the page sends, so the page never freezes. Messages in:
//   {type: "init", wasm: ArrayBuffer | null}   (null: fetch app.wasm next to this file)
//   {type: "solve", id, project: string, nx, ny}
// Messages out:
//   {type: "ready"} | {type: "fatal", error}
//   {type: "solved", id, ok, result?, error?, path?, col?, nx, ny, u, ux, uy}
// The field arrays are transferred, not copied.
"use strict";
/* global Go, edgewiseSolve */
if (typeof Go === "undefined") {
  importScripts("wasm_exec.js");
}

let ready = null;

async function start(bytes) {
  const go = new Go();
  let module;
  if (bytes) {
    module = await WebAssembly.instantiate(bytes, go.importObject);
  } else {
    const url = new URL("app.wasm", self.location.href);
    try {
      module = await WebAssembly.instantiateStreaming(fetch(url), go.importObject);
    } catch (e) {
      // a server that does not send application/wasm: fall back to bytes
      const resp = await fetch(url);
      if (!resp.ok) throw new Error("could not load the engine (" + resp.status + ")");
      module = await WebAssembly.instantiate(await resp.arrayBuffer(), go.importObject);
    }
  }
  go.run(module.instance); // registers edgewiseSolve, then waits forever
  if (typeof edgewiseSolve !== "function") throw new Error("the engine did not start");
}

self.onmessage = async (ev) => {
  const msg = ev.data;
  if (msg.type === "init") {
    ready = start(msg.wasm);
    try {
      await ready;
      self.postMessage({ type: "ready" });
    } catch (e) {
      self.postMessage({ type: "fatal", error: String(e && e.message || e) });
    }
    return;
  }
  if (msg.type === "solve") {
    await ready;
    const t0 = performance.now();
    const r = edgewiseSolve(msg.project, msg.nx || 0, msg.ny || 0);
    const out = { type: "solved", id: msg.id, ok: r.ok, ms: performance.now() - t0 };
    if (!r.ok) {
      out.error = r.error; out.path = r.path; out.col = r.col;
      self.postMessage(out);
      return;
    }
    out.result = r.result; out.nx = r.nx; out.ny = r.ny;
    out.u = r.u; out.ux = r.ux; out.uy = r.uy;
    self.postMessage(out, [r.u.buffer, r.ux.buffer, r.uy.buffer]);
  }
};
