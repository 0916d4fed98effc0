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

// decode85JS is the page's decoder for encode85 (the inverse: a final
// group of m < 5 digits is padded with the largest digit and gives m-1
// bytes). It defines edgewiseEngineBytes(), which the page calls to get the
// engine: the decoded text is gzip, undone with DecompressionStream.
const decode85JS = `"use strict";
window.edgewiseEngineBytes = async function () {
  const A = "` + alphabet85 + `";
  const val = new Int8Array(128).fill(-1);
  for (let i = 0; i < 85; i++) val[A.charCodeAt(i)] = i;
  const s = document.getElementById("ew-wasm").textContent.trim();
  const n = s.length, full = Math.floor(n / 5), rest = n % 5;
  if (rest === 1) throw new Error("the embedded engine is damaged");
  const out = new Uint8Array(full * 4 + (rest ? rest - 1 : 0));
  let o = 0;
  for (let i = 0; i < n; i += 5) {
    let v = 0;
    for (let j = 0; j < 5; j++) {
      const c = i + j < n ? val[s.charCodeAt(i + j)] : 84;
      if (c < 0) throw new Error("the embedded engine is damaged");
      v = v * 85 + c;
    }
    for (let j = 0; j < 4 && o < out.length; j++) out[o++] = (v >>> (24 - 8 * j)) & 255;
  }
  const stream = new Blob([out]).stream().pipeThrough(new DecompressionStream("gzip"));
  return new Response(stream).arrayBuffer();
};
`
