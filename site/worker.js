// The edgewise worker: loads the Go engine (WebAssembly) and runs its
// functions for the page, so the page never freezes.
//
// Messages in:
//   {type: "init", wasm: ArrayBuffer | null}   (null: fetch app.wasm next to this file)
//   {type: "call", id, fn, args, hold}         runs the engine function edgewise_<fn>(...args);
//                                              with hold set, not before a "release" (a test hook
//                                              that makes "a solve in flight" last as long as a test needs)
//   {type: "release"}                          lets every held call run
// Messages out:
//   {type: "ready"} | {type: "fatal", error}
//   {type: "reply", id, value, ms}             value as the engine returned it
// Typed arrays at the top level of a returned object are transferred to the
// page, not copied.
"use strict";
/* global Go */
if (typeof Go === "undefined") {
  importScripts("wasm_exec.js");
}

let ready = null;
let held = []; // resolvers of the calls waiting for a release

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
  go.run(module.instance); // registers the edgewise_* functions, then waits forever
  if (typeof self.edgewise_solve !== "function") throw new Error("the engine did not start");
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
    ready = start(msg.wasm);
    try {
      await ready;
      self.postMessage({ type: "ready" });
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
