package main

import (
	_ "embed"
	"encoding/base64"
	"strings"
)

// unpack.wat turns the engine's text back into the engine in the worker
// (base 85, gunzip, CRC-32); the bundler assembles it (wat.go) and puts it,
// in base 64, into the worker's source with the script around it.
//
//go:embed unpack.wat
var unpackWAT string

// unpackJS is the worker's script that defines
// self.edgewiseEngineBytes(text): the engine's WebAssembly bytes from the
// text encode85 wrote of its gzip form, or an Error "the embedded engine
// is damaged". site/worker.js compiles what it returns.
func unpackJS() (string, error) {
	module, err := assembleWAT(unpackWAT)
	if err != nil {
		return "", err
	}
	return strings.Replace(unpackTemplate, "UNPACK_MODULE", base64.StdEncoding.EncodeToString(module), 1), nil
}

// The script runs the module's long loops a slice at a time, so that the
// browser optimizes them after their first calls (it optimizes a
// WebAssembly function only for its next call). A last group of m < 5
// digits is padded with the largest digit and gives m-1 bytes (encode85).
const unpackTemplate = `"use strict";
self.edgewiseEngineBytes = function (text) {
  const damaged = () => new Error("the embedded engine is damaged");
  const s = text.trim();
  const rest = s.length % 5;
  if (rest === 1) throw damaged();
  const pad = rest ? 5 - rest : 0, n = s.length + pad;
  const IN = 16384, SLICE = 81920, page = 65536;
  try {
    const bin = atob("UNPACK_MODULE");
    const code = new Uint8Array(bin.length);
    for (let i = 0; i < bin.length; i++) code[i] = bin.charCodeAt(i);
    const x = new WebAssembly.Instance(new WebAssembly.Module(code), {}).exports;
    const grow = (bytes) => {
      const have = x.mem.buffer.byteLength;
      if (bytes > have) x.mem.grow(Math.ceil((bytes - have) / page));
    };
    grow(IN + n);
    // a character outside ASCII takes more than one byte: not all of the text fits
    const wrote = new TextEncoder().encodeInto(s, new Uint8Array(x.mem.buffer, IN, s.length));
    if (wrote.read !== s.length) throw damaged();
    new Uint8Array(x.mem.buffer, IN + s.length, pad).fill(126); // "~", the largest digit
    x.init();
    let o = IN;
    for (let p = IN, end = IN + n; p < end; p += SLICE) {
      o = x.dec85(p, Math.min(p + SLICE, end), o);
      if (o < 0) throw damaged();
    }
    const gzEnd = o - pad;
    // the gzip member (RFC 1952): header, deflate stream, CRC-32 and size
    const b = new Uint8Array(x.mem.buffer);
    if (gzEnd - IN < 18 || b[IN] !== 0x1f || b[IN + 1] !== 0x8b || b[IN + 2] !== 8) throw damaged();
    const flags = b[IN + 3];
    let at = IN + 10;
    if (flags & 4) at += 2 + (b[at] | (b[at + 1] << 8));
    for (const bit of [8, 16]) {
      if (flags & bit) {
        while (at < gzEnd && b[at] !== 0) at++;
        at++;
      }
    }
    if (flags & 2) at += 2;
    const tail = new DataView(x.mem.buffer, gzEnd - 8, 8);
    const crcWant = tail.getUint32(0, true), size = tail.getUint32(4, true);
    if (at >= gzEnd - 8 || size > (1 << 28)) throw damaged();
    const OUT = (gzEnd + 4095) & -4096;
    grow(OUT + size + 8); // a match is copied 4 bytes at a time: up to 3 past the end
    if (x.inflate(at, OUT) !== OUT + size || x.consumed() !== gzEnd - 8) throw damaged();
    let c = -1;
    for (let p = OUT; p < OUT + size; p += SLICE) c = x.crc(c, p, Math.min(p + SLICE, OUT + size));
    if ((~c >>> 0) !== crcWant) throw damaged();
    return new Uint8Array(x.mem.buffer, OUT, size);
  } catch (e) {
    // a trap (a broken stream that reads or writes past the memory) or a
    // refused memory: all the same to the page
    throw damaged();
  }
};
`
