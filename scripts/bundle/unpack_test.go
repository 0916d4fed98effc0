package main

import (
	"bytes"
	"compress/flate"
	"compress/gzip"
	"crypto/sha256"
	"encoding/base64"
	"encoding/hex"
	"encoding/json"
	"fmt"
	"math/rand/v2"
	"os"
	"os/exec"
	"strings"
	"testing"
)

// unpackData is what the tests pack and unpack: the shapes of data that
// exercise each part of a deflate decoder (stored, fixed and dynamic
// blocks; literals only; matches at distances 1, 2, 3 (copied byte by
// byte), 4 and more (4 at a time), up to 32 KiB back; codes longer than
// the 10-bit table).
func unpackData() map[string][]byte {
	rng := rand.New(rand.NewPCG(11, 12))
	random := func(n int) []byte {
		b := make([]byte, n)
		for i := range b {
			b[i] = byte(rng.UintN(256))
		}
		return b
	}
	words := strings.Fields("heat flux edge plate corner series term the of a and field potential steady head seepage " +
		"temperature boundary held convection coefficient conductivity rectangle isoline grid 0 1 2 3 4 5 6 7 8 9 . , ; :")
	var text bytes.Buffer
	for text.Len() < 300000 {
		// a skewed choice: some words very rare, so that their codes are long
		k := int(float64(len(words)) * rng.Float64() * rng.Float64() * rng.Float64())
		text.WriteString(words[k])
		text.WriteByte(" \n"[rng.UintN(2)*rng.UintN(2)])
	}
	periodic := func(period, n int) []byte {
		unit := random(period)
		return bytes.Repeat(unit, n/period+1)[:n]
	}
	var far []byte
	for len(far) < 400000 {
		// pieces copied from up to 32 KiB back, with noise between
		if len(far) > 40000 && rng.UintN(2) == 0 {
			from := len(far) - 1 - int(rng.UintN(32000))
			far = append(far, far[from:from+int(3+rng.UintN(300))]...)
		} else {
			far = append(far, random(int(1+rng.UintN(40)))...)
		}
	}
	data := map[string][]byte{
		"empty":      {},
		"one byte":   {42},
		"short text": []byte("steady heat flows from the held edge to the cooled one"),
		"random":     random(100000),
		"text":       text.Bytes(),
		"period 1":   periodic(1, 70000),
		"period 2":   periodic(2, 70000),
		"period 3":   periodic(3, 70000),
		"period 4":   periodic(4, 70000),
		"period 7":   periodic(7, 70001),
		"far":        far,
	}
	if engine, err := os.ReadFile("../../site/app.wasm"); err == nil {
		data["the engine"] = engine // when built (make build)
	}
	return data
}

func gzipLevel(t *testing.T, data []byte, level int) []byte {
	t.Helper()
	var b bytes.Buffer
	w, err := gzip.NewWriterLevel(&b, level)
	if err != nil {
		t.Fatal(err)
	}
	w.Write(data)
	if err := w.Close(); err != nil {
		t.Fatal(err)
	}
	return b.Bytes()
}

// runUnpack runs unpackJS in Node on each text, and on what Node's own
// zlib makes of each data (other encoders choose other blocks: the fixed
// codes, runs only, Huffman only). It returns, for each, the SHA-256 of
// what came out in hex, or "error: " and the message.
func runUnpack(t *testing.T, texts []string, data [][]byte) (fromTexts, fromZlib [][]string) {
	t.Helper()
	node, err := exec.LookPath("node")
	if err != nil {
		t.Skip("node is not installed (make test installs nothing for it; the browser tests unpack the engine too)")
	}
	js, err := unpackJS()
	if err != nil {
		t.Fatal(err)
	}
	raw := []string{}
	for _, d := range data {
		raw = append(raw, base64.StdEncoding.EncodeToString(d))
	}
	in, _ := json.Marshal(map[string]any{"texts": texts, "raw": raw})
	script := "globalThis.self = globalThis;\n" + js + `
const zlib = require("zlib"), crypto = require("crypto");
const A = "` + alphabet85 + `";
function encode85(b) {
  let s = "";
  for (let i = 0; i < b.length; i += 4) {
    const k = Math.min(4, b.length - i);
    let v = 0;
    for (let j = 0; j < 4; j++) v = v * 256 + (j < k ? b[i + j] : 0);
    const d = [];
    for (let j = 0; j < 5; j++) { d.unshift(A[v % 85]); v = Math.floor(v / 85); }
    s += d.slice(0, k + 1).join("");
  }
  return s;
}
function run(text) {
  try {
    return crypto.createHash("sha256").update(self.edgewiseEngineBytes(text)).digest("hex");
  } catch (e) {
    return "error: " + e.message;
  }
}
const input = JSON.parse(require("fs").readFileSync(0, "utf8"));
const C = zlib.constants;
const ways = [[1, C.Z_DEFAULT_STRATEGY], [9, C.Z_DEFAULT_STRATEGY], [6, C.Z_FIXED], [6, C.Z_RLE], [6, C.Z_HUFFMAN_ONLY], [9, C.Z_FILTERED]];
console.log(JSON.stringify({
  texts: input.texts.map((s) => [run(s)]),
  zlib: input.raw.map((r) => ways.map(([level, strategy]) => run(encode85(zlib.gzipSync(Buffer.from(r, "base64"), { level, strategy }))))),
}));`
	cmd := exec.Command(node, "-e", script)
	cmd.Stdin = bytes.NewReader(in)
	var stderr bytes.Buffer
	cmd.Stderr = &stderr
	out, err := cmd.Output()
	if err != nil {
		t.Fatalf("node: %v\n%s", err, stderr.String())
	}
	var got struct{ Texts, Zlib [][]string }
	if err := json.Unmarshal(out, &got); err != nil || len(got.Texts) != len(texts) || len(got.Zlib) != len(data) {
		t.Fatalf("node said %.300q (%v)", out, err)
	}
	return got.Texts, got.Zlib
}

func sha(b []byte) string {
	h := sha256.Sum256(b)
	return hex.EncodeToString(h[:])
}

// The worker's unpacker gives back exactly what was packed, from the
// streams of Go's compress/gzip at every level (one with every optional
// header field) and of Node's zlib with each of its strategies, with white
// space around the text and every length of the last base-85 group.
func TestUnpackJS(t *testing.T) {
	data := unpackData()
	var names, texts []string
	var want []string
	var raws [][]byte
	for name, d := range data {
		raws = append(raws, d)
		names = append(names, name)
		for _, level := range []int{flate.NoCompression, flate.BestSpeed, flate.DefaultCompression, flate.BestCompression, flate.HuffmanOnly} {
			texts = append(texts, " "+encode85(gzipLevel(t, d, level))+"\n")
			want = append(want, fmt.Sprintf("%s, gzip level %d", name, level))
		}
	}
	// a gzip header with the optional fields (RFC 1952 2.3.1: FEXTRA,
	// FNAME, FCOMMENT), which the script skips
	var named bytes.Buffer
	zw, _ := gzip.NewWriterLevel(&named, flate.BestCompression)
	zw.Name, zw.Comment, zw.Extra = "app.wasm", "the engine", []byte("ew\x04\x00abcd")
	zw.Write(data["text"])
	if err := zw.Close(); err != nil {
		t.Fatal(err)
	}
	texts = append(texts, encode85(named.Bytes()))
	// the premise: every length of the last base-85 group comes up (a
	// whole group, or 2, 3 or 4 digits for 1, 2 or 3 bytes)
	lasts := map[int]bool{}
	for _, s := range texts {
		lasts[len(strings.TrimSpace(s))%5] = true
	}
	for _, r := range []int{0, 2, 3, 4} {
		if !lasts[r] {
			t.Fatalf("no text ends in a group of %d digits (the data must be changed)", r)
		}
	}
	fromTexts, fromZlib := runUnpack(t, texts, raws)
	if got := fromTexts[len(texts)-1][0]; got != sha(data["text"]) {
		t.Errorf("a gzip header with a name, a comment and extra data: %s, want the data back", got)
	}
	k := 0
	for i, name := range names {
		for range 5 {
			if fromTexts[k][0] != sha(data[name]) {
				t.Errorf("%s: %s, want the data back", want[k], fromTexts[k][0])
			}
			k++
		}
		for j, h := range fromZlib[i] {
			if h != sha(data[name]) {
				t.Errorf("%s, zlib way %d: %s, want the data back", name, j, h)
			}
		}
	}
}

// A damaged text is refused, never unpacked into something else: a byte
// of the stream, its CRC or its size changed, the text cut short, a
// character outside the alphabet, a group past 32 bits.
func TestUnpackRefusesDamage(t *testing.T) {
	data := unpackData()["text"]
	gz := gzipLevel(t, data, flate.BestCompression)
	flip := func(at int, mask byte) string {
		b := bytes.Clone(gz)
		b[at] ^= mask
		return encode85(b)
	}
	good := encode85(gz)
	cases := map[string]string{
		"a bit early in the stream":  flip(40, 0x10),
		"a byte in the middle":       flip(len(gz)/2, 0xff),
		"a bit near the end":         flip(len(gz)-12, 0x01),
		"the CRC":                    flip(len(gz)-7, 0x04),
		"the size":                   flip(len(gz)-3, 0x01),
		"the magic number":           flip(0, 0x01),
		"cut short":                  good[:len(good)-40],
		"a group short of its end":   good[:len(good)-len(good)%5-4],
		"a character outside":        good[:100] + "<" + good[101:],
		"a character outside ASCII":  good[:100] + "\u00e9" + good[101:],
		"a group past 32 bits":       good[:100] + "~~~~~" + good[105:],
		"nothing":                    "",
		"a gzip member of no stream": encode85(gz[:18]),
	}
	var names, texts []string
	for name, s := range cases {
		names = append(names, name)
		texts = append(texts, s)
	}
	texts = append(texts, good)
	got, _ := runUnpack(t, texts, nil)
	for i, name := range names {
		if got[i][0] != "error: the embedded engine is damaged" {
			t.Errorf("%s: %.70s, want it refused", name, got[i][0])
		}
	}
	if got[len(names)][0] != sha(data) {
		t.Errorf("the undamaged text: %s, want the data back (the test's premise)", got[len(names)][0])
	}
}
