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
// bytes). It defines edgewiseEngineStream(text), a stream of the decoded
// bytes that decodes a slice of the text each time its reader asks for
// more, so that gunzip and compiling run on each slice while the next is
// decoded (site/worker.js).
const decode85JS = `"use strict";
self.edgewiseEngineStream = function (text) {
  const A = "` + alphabet85 + `";
  const val = new Int8Array(128).fill(-1);
  for (let i = 0; i < 85; i++) val[A.charCodeAt(i)] = i;
  const s = text.trim();
  const n = s.length, full = Math.floor(n / 5), rest = n % 5;
  const damaged = () => new Error("the embedded engine is damaged");
  const group = (i, m) => { // the value of the 5 digits at i, of which m are there
    let v = 0;
    for (let j = 0; j < 5; j++) {
      const c = j < m ? val[s.charCodeAt(i + j)] : 84;
      if (!(c >= 0)) throw damaged();
      v = v * 85 + c;
    }
    return v;
  };
  const SLICE = 16384; // groups of 5 digits decoded at a time (64 KiB)
  let g = 0; // the next group
  return new ReadableStream({
    pull(ctl) {
      if (rest === 1) throw damaged();
      const end = Math.min(full, g + SLICE);
      const tail = end === full && rest ? rest - 1 : 0;
      const out = new Uint8Array((end - g) * 4 + tail);
      let o = 0;
      for (; g < end; g++) {
        const v = group(5 * g, 5);
        out[o++] = v >>> 24;
        out[o++] = (v >>> 16) & 255;
        out[o++] = (v >>> 8) & 255;
        out[o++] = v & 255;
      }
      if (tail) {
        const v = group(5 * full, rest);
        for (let j = 0; j < tail; j++) out[o++] = (v >>> (24 - 8 * j)) & 255;
      }
      if (out.length) ctl.enqueue(out);
      if (g === full) ctl.close();
    },
  });
};
`
