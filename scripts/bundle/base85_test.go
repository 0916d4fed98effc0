package main

import (
	"bytes"
	"math/rand/v2"
	"os/exec"
	"strings"
	"testing"
)

// decode85 is the Go twin of the worker's decoder (dec85 in unpack.wat), for the round trip.
func decode85(s string) []byte {
	var out []byte
	for i := 0; i < len(s); i += 5 {
		var v uint64
		m := 0
		for j := 0; j < 5; j++ {
			c := uint64(84)
			if i+j < len(s) {
				c = uint64(strings.IndexByte(alphabet85, s[i+j]))
				m++
			}
			v = v*85 + c
		}
		b := []byte{byte(v >> 24), byte(v >> 16), byte(v >> 8), byte(v)}
		out = append(out, b[:m-1]...)
	}
	return out
}

func TestBase85RoundTrip(t *testing.T) {
	if len(alphabet85) != 85 {
		t.Fatalf("alphabet has %d characters", len(alphabet85))
	}
	for _, c := range `"&'<>\` + "`-/" {
		if strings.ContainsRune(alphabet85, c) {
			t.Errorf("alphabet holds %q", c)
		}
	}
	rng := rand.New(rand.NewPCG(7, 8))
	for n := 0; n < 40; n++ {
		data := make([]byte, n)
		for i := range data {
			data[i] = byte(rng.UintN(256))
		}
		if n == 8 {
			data = bytes.Repeat([]byte{0xff}, 8) // the largest groups
		}
		enc := encode85(data)
		if want := n / 4 * 5; len(enc) < want {
			t.Errorf("%d bytes encoded in %d characters", n, len(enc))
		}
		if got := decode85(enc); !bytes.Equal(got, data) {
			t.Errorf("round trip of %x gave %x", data, got)
		}
	}
}

// asciiJS keeps the meaning of a script: strings, templates, regular
// expressions and JSON read the same (run by Node).
func TestASCIIJSKeepsMeaning(t *testing.T) {
	node, err := exec.LookPath("node")
	if err != nil {
		t.Skip("node is not installed")
	}
	src := "// a comment with ° and …\n" +
		"const a = [\"20 °C\", '±0.5 µm', `${1} × 10⁻³`, \"😀 \u2028 end\", /[°µ]+/.exec(\"x°µy\")[0], /😀/u.test(\"a😀\"), JSON.parse('{\"u\": \"W/m²\"}').u];\n" +
		"console.log(JSON.stringify(a));"
	run := func(js string) string {
		out, err := exec.Command(node, "-e", js).Output()
		if err != nil {
			t.Fatalf("node: %v on %q", err, js)
		}
		return string(out)
	}
	esc := asciiJS(src)
	for i := 0; i < len(esc); i++ {
		if esc[i] >= 0x80 {
			t.Fatalf("asciiJS left a byte outside ASCII: %q", esc)
		}
	}
	if a, b := run(src), run(esc); a != b || !strings.Contains(a, "°C") {
		t.Errorf("the script says %s escaped, %s as written", b, a)
	}
}
