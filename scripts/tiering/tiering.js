// tiering: which of the engine's functions the JavaScript engine's
// optimizing compiler takes up during the demo's first solve, and how
// large they are. `make tiering` runs it.
//
//   node scripts/tiering/tiering.js ENGINE.wasm PROJECT.json [-max BYTES]
//
// ENGINE.wasm must keep its function names (built without -s). The script
// runs itself again in a child Node with the browser's tiering budget and
// V8's compilation trace, solves the project once as the page's first
// solve does (no cross-check), and lists the functions optimized by the
// end of that solve and in the 1.5 s after it (the work it started on
// background threads), with their body sizes. With -max, it exits with
// status 1 when a function of the engine's own packages larger than BYTES
// is among them.
//
// Why it matters: the package doc of edgewise/solver, "Loops in functions
// of their own". Node's V8 is older than the browser's; the browser's
// budget (--wasm-tiering-budget) is passed so that the same functions get
// hot; the browser's own figures come from the first-picture benchmark.
"use strict";
const fs = require("fs");
const path = require("path");
const { spawnSync } = require("child_process");

// the browser's budget for dynamic tiering (V8's default in the Chromium
// the browser tests run, `--js-flags=--help`)
const BUDGET = 13000000;

function child(wasmFile, projectFile) {
  globalThis.require = require;
  globalThis.fs = fs;
  globalThis.performance ??= require("perf_hooks").performance;
  require(path.join(process.env.GOROOT_WASM, "wasm_exec.js"));
  (async () => {
    const go = new Go();
    const inst = await WebAssembly.instantiate(await WebAssembly.compile(fs.readFileSync(wasmFile)), go.importObject);
    go.run(inst);
    const t = performance.now();
    const r = globalThis.edgewise_solve(fs.readFileSync(projectFile, "utf8"), 0, 0, 12, true);
    const ms = performance.now() - t;
    fs.writeSync(1, "TIERING solved " + ms.toFixed(1) + " " + (r.ok ? "ok" : r.error) + "\n");
    setTimeout(() => {
      fs.writeSync(1, "TIERING settled\n");
      process.exit(0);
    }, 1500);
  })();
}

// names reads the function names of the wasm name section (index -> name).
function names(bytes) {
  const out = new Map();
  let i = 8;
  const leb = () => {
    let r = 0, s = 0, b;
    do {
      b = bytes[i++];
      r += (b & 0x7f) * 2 ** s;
      s += 7;
    } while (b & 0x80);
    return r;
  };
  while (i < bytes.length) {
    const id = bytes[i++];
    const n = leb();
    const end = i + n;
    if (id === 0) {
      const len = leb();
      const name = Buffer.from(bytes.subarray(i, i + len)).toString();
      i += len;
      if (name === "name") {
        while (i < end) {
          const sub = bytes[i++];
          const size = leb();
          const subEnd = i + size;
          if (sub === 1) {
            for (let k = leb(); k > 0; k--) {
              const idx = leb();
              const l = leb();
              out.set(idx, Buffer.from(bytes.subarray(i, i + l)).toString());
              i += l;
            }
          }
          i = subEnd;
        }
      }
    }
    i = end;
  }
  return out;
}

function parent(wasmFile, projectFile, max) {
  const fnNames = names(fs.readFileSync(wasmFile));
  if (fnNames.size === 0) {
    console.error("tiering: " + wasmFile + " has no function names (build it without -s)");
    process.exit(2);
  }
  const run = spawnSync(process.execPath,
    ["--wasm-tiering-budget=" + BUDGET, "--trace-wasm-compilation-times", __filename, "--child", wasmFile, projectFile],
    { encoding: "utf8", env: process.env, maxBuffer: 64 << 20 });
  if (run.status !== 0) {
    console.error("tiering: the solve failed:\n" + run.stderr);
    process.exit(2);
  }
  let phase = "during";
  let solved = "";
  const rows = [];
  for (const line of run.stdout.split("\n")) {
    if (line.startsWith("TIERING solved")) {
      phase = "after";
      solved = line.slice("TIERING solved ".length);
      continue;
    }
    if (line.startsWith("TIERING settled")) break;
    const m = /#(\d+) using TurboFan.*bodysize (\d+)/.exec(line);
    if (m) rows.push({ name: fnNames.get(Number(m[1])) || "#" + m[1], bytes: Number(m[2]), phase });
  }
  rows.sort((a, b) => b.bytes - a.bytes);
  const kb = (list) => (list.reduce((s, r) => s + r.bytes, 0) / 1024).toFixed(0);
  const own = rows.filter((r) => r.name.startsWith("edgewise_") || r.name.startsWith("main."));
  console.log("first solve " + solved.split(" ")[0] + " ms in Node; optimized: " + rows.length + " functions, " + kb(rows) +
    " KB of body (the engine's own " + own.length + ", " + kb(own) + " KB)");
  for (const r of rows.slice(0, 40)) console.log(String(r.bytes).padStart(7) + "  " + r.phase.padEnd(6) + " " + r.name);
  if (max > 0) {
    const over = own.filter((r) => r.bytes > max);
    if (over.length) {
      console.error("tiering: " + over.length + " of the engine's functions over " + max + " bytes are optimized: " + over.map((r) => r.name + " (" + r.bytes + ")").join(", "));
      process.exit(1);
    }
  }
}

const args = process.argv.slice(2);
if (args[0] === "--child") {
  child(args[1], args[2]);
} else {
  if (args.length < 2) {
    console.error("usage: node tiering.js ENGINE.wasm PROJECT.json [-max BYTES]");
    process.exit(2);
  }
  const k = args.indexOf("-max");
  parent(args[0], args[1], k >= 0 ? Number(args[k + 1]) : 0);
}
