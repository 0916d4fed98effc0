// edgewise page: the engine in its Web Worker. Entry points,
//
//   EW.engine.call(fn, ...args) -> Promise<{value, ms}>
//   EW.engine.ready() -> Promise, settled when the engine is up
//
// call runs the Go function edgewise_<fn> in the worker. restart(reason) stops
// the worker (the only real cancel of a running solve) and starts a fresh
// one. Every call settles: with the engine's reply, or rejected with
// {message, cancelled: true} when the worker it waits on (running or still
// starting) is restarted, or with the reason the engine failed to start.
//
// The single file starts its first worker itself, before the page is read
// (scripts/bundle); this file takes it over. The first worker sends back
// the compiled engine, from which every restarted worker starts (no second
// decoding or compiling).
//
// Test hook: hold({fn, calls}) makes the next calls of fn wait in the
// worker, unanswered, until release() (see worker.js), so that a test can
// have "a solve in flight" however fast the engine is.
"use strict";
(function () {
  const EW = (window.edgewiseParts = window.edgewiseParts || {});

  let starting = null; // Promise<Worker> of the current worker
  let current = null; // the current Worker, for terminate and release
  let engineModule = null; // the compiled engine from the first worker: later ones start from it
  let nextId = 1;
  let restarts = 0;
  const pending = new Map(); // id -> {resolve, reject}
  const holdNext = { fn: "solve", calls: 0 };
  const heldIds = new Set();

  // spawn makes a worker and sends it the engine. The single file has
  // started its first worker already, while the page was read (startJS in
  // scripts/bundle): that one is taken over with what it said meanwhile.
  // Later workers get the compiled engine when the first one sent it, else
  // the single file's engine text, else they fetch it (served page).
  function spawn() {
    const early = window.edgewiseEarlyWorker;
    if (early && !early.taken) {
      early.taken = true;
      return { w: early.worker, heard: early.heard };
    }
    // the single file: the engine's text, written in parts (scripts/bundle)
    const parts = document.getElementsByClassName("ew-wasm");
    const text = parts.length ? Array.from(parts, (e) => e.textContent).join("") : "";
    let w;
    if (text) {
      const src = document.getElementById("ew-worker").textContent;
      w = new Worker(URL.createObjectURL(new Blob([src], { type: "text/javascript" })));
    } else {
      w = new Worker("worker.js");
    }
    if (engineModule) w.postMessage({ type: "init", module: engineModule });
    else w.postMessage(text ? { type: "init", text } : { type: "init" });
    return { w, heard: [] };
  }

  // start makes a worker current and resolves with it once its engine is
  // ready.
  function start() {
    performance.mark("ew:engine-start");
    const ready = new Promise((resolve, reject) => {
      let w, heard;
      try {
        ({ w, heard } = spawn());
      } catch (e) {
        reject(new Error("the engine failed to start: " + ((e && e.message) || e)));
        return;
      }
      current = w;
      const onmessage = (ev) => {
        const m = ev.data;
        if (m.type === "ready") {
          marks(m.at);
          performance.mark("ew:engine-ready");
          resolve(w);
        } else if (m.type === "module") engineModule = m.module;
        else if (m.type === "fatal") reject(new Error("the engine failed to start: " + m.error));
        else if (m.type === "reply") settle(m);
        else if (m.type === "progress" && EW.engine.onProgress) EW.engine.onProgress(m); // a seek's steps (study.js)
      };
      const onerror = (e) => {
        const err = new Error("the engine stopped: " + ((e && e.message) || "unknown error"));
        reject(err);
        if (w === current) failAll(err); // a crash after the start: nothing will answer
      };
      w.onmessage = onmessage;
      w.onerror = onerror;
      for (const ev of heard) (ev.type === "error" ? onerror : onmessage)(ev);
    });
    ready.catch(() => {
      if (starting === ready) starting = null; // the next call tries again
    });
    starting = ready;
    return ready;
  }

  // marks puts the worker's own times (ms since the epoch) on the page's
  // timeline as performance marks "ew:worker-<name>" (the benchmark reads them).
  function marks(at) {
    for (const [name, t] of Object.entries(at || {})) {
      const startTime = t - performance.timeOrigin;
      if (startTime >= 0) performance.mark("ew:worker-" + name, { startTime });
    }
  }

  function settle(m) {
    heldIds.delete(m.id);
    const p = pending.get(m.id);
    if (!p) return;
    pending.delete(m.id);
    p.resolve(m);
  }

  // failAll rejects every call waiting on the current worker and forgets
  // that worker.
  function failAll(err) {
    if (current) current.terminate();
    current = null;
    starting = null;
    heldIds.clear();
    const waiting = [...pending.values()];
    pending.clear();
    for (const p of waiting) p.reject(err);
  }

  // call sends the call to the current worker at once, even while its
  // engine is still starting: the worker runs it as soon as the engine is
  // up, with no round trip through the page. A start that fails rejects
  // the call with its reason.
  function call(fn, ...args) {
    const id = nextId++;
    return new Promise((resolve, reject) => {
      pending.set(id, { resolve, reject });
      const ready = starting || start();
      ready.catch((e) => {
        if (pending.delete(id)) reject(e);
      });
      if (!current || !pending.has(id)) return; // no worker: the start failed
      const hold = holdNext.calls > 0 && holdNext.fn === fn;
      if (hold) {
        holdNext.calls--;
        heldIds.add(id);
      }
      current.postMessage({ type: "call", id, fn, args, hold });
    });
  }

  // restart stops the worker, rejects every call waiting on it (running or
  // still starting) with reason, and starts a fresh one.
  function restart(reason) {
    restarts++;
    failAll(Object.assign(new Error(reason), { cancelled: true }));
    start().catch(() => {});
  }

  EW.engine = {
    call,
    restart,
    // ready resolves when the current worker's engine is up (it starts
    // one when there is none) and rejects when it failed to start
    ready: () => (starting || start()).then(() => true),
    state: () => ({ restarts, held: heldIds.size }),
    hold(o) {
      holdNext.fn = (o && o.fn) || "solve";
      holdNext.calls = o && o.calls >= 0 ? o.calls : 1;
      return true;
    },
    release() {
      holdNext.calls = 0;
      if (current) current.postMessage({ type: "release" });
      return true;
    },
  };
})();
