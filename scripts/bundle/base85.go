package main

// The engine is embedded as text. Base64 takes 4 characters for 3 bytes;
// this base-85 form takes 5 for 4, which keeps the offline file about 6%
// smaller. Its alphabet is printable ASCII without the characters that mean
// something in HTML or in a script (" & ' < > \ `) and without - and /, so
// the text can never form "</script" or "<!--".
const alphabet85 = "!#$%()*+,.0123456789:;=?@ABCDEFGHIJKLMNOPQRSTUVWXYZ[]^_abcdefghijklmnopqrstuvwxyz{|}~"

// encode85 writes each group of 4 bytes (big-endian) as 5 base-85 digits,
// most significant first; a final group of k < 4 bytes is padded with zero
// bytes and written as its first k+1 digits.
func encode85(data []byte) string {
	out := make([]byte, 0, (len(data)+3)/4*5)
	for i := 0; i < len(data); i += 4 {
		var g [4]byte
		k := copy(g[:], data[i:])
		v := uint32(g[0])<<24 | uint32(g[1])<<16 | uint32(g[2])<<8 | uint32(g[3])
		var d [5]byte
		for j := 4; j >= 0; j-- {
			d[j] = alphabet85[v%85]
			v /= 85
		}
		out = append(out, d[:k+1]...)
	}
	return string(out)
}

// decode85JS is the worker's decoder for encode85 (the inverse: a final
// group of m < 5 digits is padded with the largest digit and gives m-1
// bytes). It defines edgewiseEngineBytes(text), the decoded bytes, which
// site/worker.js gunzips and compiles as a stream. The decoding is one
// plain loop over the whole text, with the 5 digits of a group written
// out: the loop starts cold (interpreted) and this form leaves it soonest
// (measured in a fresh browser process: 35-50 ms for the engine, against
// 55-120 ms decoding slice by slice as a stream's reader asks).
const decode85JS = `"use strict";
self.edgewiseEngineBytes = function (text) {
  const A = "` + alphabet85 + `";
  // a character outside the alphabet counts so much that its group's
  // value leaves 32 bits; past the table's end it reads as NaN: either way
  // the group is refused
  const val = new Float64Array(128).fill(1e10);
  for (let i = 0; i < 85; i++) val[A.charCodeAt(i)] = i;
  const s = text.trim();
  const n = s.length, full = Math.floor(n / 5), rest = n % 5;
  const damaged = () => new Error("the embedded engine is damaged");
  if (rest === 1) throw damaged();
  const out = new Uint8Array(full * 4 + (rest ? rest - 1 : 0));
  for (let i = 0, o = 0, stop = 5 * full; i < stop; i += 5, o += 4) {
    const v = (((val[s.charCodeAt(i)] * 85 + val[s.charCodeAt(i + 1)]) * 85 + val[s.charCodeAt(i + 2)]) * 85 +
      val[s.charCodeAt(i + 3)]) * 85 + val[s.charCodeAt(i + 4)];
    if (!(v <= 4294967295)) throw damaged();
    out[o] = v / 16777216;
    out[o + 1] = (v >>> 16) & 255;
    out[o + 2] = (v >>> 8) & 255;
    out[o + 3] = v & 255;
  }
  if (rest) {
    // the last group: its missing digits are the largest digit
    let v = 0;
    for (let j = 0; j < 5; j++) v = v * 85 + (j < rest ? val[s.charCodeAt(5 * full + j)] : 84);
    if (!(v <= 4294967295)) throw damaged();
    for (let j = 0; j < rest - 1; j++) out[4 * full + j] = (v >>> (24 - 8 * j)) & 255;
  }
  return out;
};
`
