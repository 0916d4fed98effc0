// The edgewise worker: loads the Go engine (WebAssembly) and runs its
// functions for the page, so the page never freezes.
//
// Messages in:
//   {type: "init", module?, text?}             the engine: a compiled WebAssembly.Module, or the
//                                              single file's engine text (scripts/bundle), or
//                                              neither: fetch app.wasm next to this file
//   {type: "call", id, fn, args, hold}         runs the engine function edgewise_<fn>(...args);
//                                              with hold set, not before a "release" (a test hook
//                                              that makes "a solve in flight" last as long as a test needs)
//   {type: "release"}                          lets every held call run
// Messages out:
//   {type: "ready", at} | {type: "fatal", error}
//                                              at: when the start's steps ended (ms since the epoch)
//   {type: "module", module}                   after "ready": the compiled engine, for the next worker
//   {type: "reply", id, value, ms}             value as the engine returned it
// Typed arrays at the top level of a returned object are transferred to the
// page, not copied.
"use strict";
/* global Go */
if (typeof Go === "undefined") {
  importScripts("wasm_exec.js");
}

// ready settles with the engine's start; a call that comes before "init"
// waits for it too
let began;
const ready = new Promise((resolve) => { began = resolve; });
ready.catch(() => {}); // the calls and "init" each say what failed
const at = {}; // when the start's steps ended, in ms since the epoch (the page marks them)
const now = () => performance.timeOrigin + performance.now();
at.loaded = now();
let held = []; // resolvers of the calls waiting for a release

// compile returns the engine as a WebAssembly.Module, from what "init"
// brought: the module itself (a restart), the single file's text (base 85
// of gzip, unpacked by edgewiseEngineBytes, which the bundler puts before
// this file: scripts/bundle/unpack.go), or else app.wasm next to this
// file.
async function compile(msg) {
  if (msg.module) return msg.module;
  if (typeof msg.text === "string") {
    const wasm = self.edgewiseEngineBytes(msg.text);
    at.decoded = now();
    return WebAssembly.compile(wasm);
  }
  const url = new URL("app.wasm", self.location.href);
  try {
    return await WebAssembly.compileStreaming(fetch(url));
  } catch (e) {
    // a server that does not send application/wasm: fall back to bytes
    const resp = await fetch(url);
    if (!resp.ok) throw new Error("could not load the engine (" + resp.status + ")");
    return WebAssembly.compile(await resp.arrayBuffer());
  }
}

// start compiles and starts the engine; it resolves with the module.
async function start(msg) {
  at.init = now();
  const go = new Go();
  const module = await compile(msg);
  at.compiled = now();
  const instance = await WebAssembly.instantiate(module, go.importObject);
  go.run(instance); // registers the edgewise_* functions, then waits forever
  if (typeof self.edgewise_solve !== "function") throw new Error("the engine did not start");
  at.started = now();
  return module;
}

function transferables(value) {
  const list = [];
  if (value && typeof value === "object") {
    for (const k of Object.keys(value)) {
      const v = value[k];
      if (ArrayBuffer.isView(v) && !list.includes(v.buffer)) list.push(v.buffer);
    }
  }
  return list;
}

self.onmessage = async (ev) => {
  const msg = ev.data;
  if (msg.type === "init") {
    const starting = start(msg);
    began(starting);
    try {
      const module = await starting;
      self.postMessage({ type: "ready", at });
      // the page keeps the compiled engine for the next worker (a restart);
      // in a message of its own, so that a browser that cannot pass it on
      // loses only that
      try {
        self.postMessage({ type: "module", module });
      } catch (e) { /* the next worker compiles again */ }
    } catch (e) {
      self.postMessage({ type: "fatal", error: String((e && e.message) || e) });
    }
    return;
  }
  if (msg.type === "release") {
    const list = held;
    held = [];
    for (const go of list) go();
    return;
  }
  if (msg.type === "call") {
    if (msg.hold) await new Promise((go) => held.push(go));
    try {
      await ready;
    } catch (e) {
      self.postMessage({ type: "reply", id: msg.id, value: { ok: false, error: "the engine did not start: " + String((e && e.message) || e) } });
      return;
    }
    const fn = self["edgewise_" + msg.fn];
    if (typeof fn !== "function") {
      self.postMessage({ type: "reply", id: msg.id, value: { ok: false, error: "no engine function " + msg.fn } });
      return;
    }
    const t0 = performance.now();
    let value;
    try {
      value = fn(...(msg.args || []));
    } catch (e) {
      value = { ok: false, error: "engine failure: " + String((e && e.message) || e) };
    }
    self.postMessage({ type: "reply", id: msg.id, value, ms: performance.now() - t0 }, transferables(value));
  }
};
