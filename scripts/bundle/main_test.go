package main

import (
	"bytes"
	"compress/gzip"
	"crypto/sha256"
	"encoding/base64"
	"io"
	"os"
	"path/filepath"
	"regexp"
	"strings"
	"testing"
)

func writeSite(t *testing.T, files map[string]string) string {
	t.Helper()
	dir := t.TempDir()
	for name, body := range files {
		if err := os.WriteFile(filepath.Join(dir, name), []byte(body), 0o644); err != nil {
			t.Fatal(err)
		}
	}
	return dir
}

var site = map[string]string{
	"index.html": `<!doctype html><html><head>
<meta http-equiv="Content-Security-Policy" content="default-src 'self'">
<link rel="stylesheet" href="style.css">
</head><body><p>hi, Größe</p>
<script src="app.js"></script>
</body></html>`,
	"style.css":    `p { color: red } p::after { content: "…" }`,
	"app.js":       `const s = "</script><!-- tricky", t = "20 °C";`,
	"worker.js":    "self.onmessage = () => {};",
	"wasm_exec.js": "class Go {}",
	"app.wasm":     "\x00asm\x01\x00\x00\x00 some engine bytes",
	"demo.json":    `{"title": "</script> W/m²"}`,
	"checks.json":  `{"cases": []}`,
	"physics.json": `{"physics": [{"id": "</script>"}]}`,
	"colours.json": `{"n": 2, "names": {"sequential": "</script>"}}`,
}

func TestBundle(t *testing.T) {
	page, err := Bundle(writeSite(t, site))
	if err != nil {
		t.Fatal(err)
	}
	html := string(page)
	if strings.Contains(html, `src="`) || strings.Contains(html, `href="style.css"`) {
		t.Errorf("an outside script or stylesheet is left")
	}
	// the only </script> sequences are the real closing tags: 9 blocks
	if n := strings.Count(html, "</script"); n != 9 {
		t.Errorf("%d </script sequences, want 9 (app, worker, demo, checks, physics, colours, engine, and the scripts that start the worker and send it the engine)", n)
	}
	// the worker starts before anything but the policy: the worker's
	// source, the script that starts it, the engine, the script that sends
	// it, then the page's own head and body
	order := []string{`http-equiv="Content-Security-Policy"`, `id="ew-worker">`, "new Worker(", `class="ew-wasm">`, `type: "init"`, "<style>", "<body>", `id="ew-demo"`, "const s = "}
	at := 0
	for i, s := range order {
		j := strings.Index(html[at:], s)
		if j < 0 {
			t.Errorf("%q is not after %q in the page", s, order[max(i-1, 0)])
			break
		}
		at += j + len(s)
	}
	if !strings.Contains(html, "self.edgewiseEngineBytes = function") {
		t.Errorf("the worker's source has no base-85 decoder")
	}
	// every executable inline script and style is allowed by its hash in
	// the policy (CSP Level 3, hash-source), and nothing else is
	csp := regexp.MustCompile(`content="(default-src 'none'[^"]*)"`).FindStringSubmatch(html)
	if csp == nil {
		t.Fatalf("no strict policy in %s", html[:200])
	}
	for _, m := range regexp.MustCompile(`(?s)<(script|style)>(.*?)</(?:script|style)>`).FindAllStringSubmatch(html, -1) {
		h := sha256.Sum256([]byte(m[2]))
		if !strings.Contains(csp[1], "'sha256-"+base64.StdEncoding.EncodeToString(h[:])+"'") {
			t.Errorf("inline %s %.30q is not in the policy", m[1], m[2])
		}
	}
	if strings.Contains(csp[1], "unsafe-inline") || strings.Contains(csp[1], "http") {
		t.Errorf("policy too loose: %s", csp[1])
	}
	// the engine round-trips through base 85 and gzip
	// (in parts, each no longer than enginePart, read in order)
	var text strings.Builder
	for _, w := range regexp.MustCompile(`<script type="application/octet-stream" class="ew-wasm">([^<]*)</script>`).FindAllStringSubmatch(html, -1) {
		if len(w[1]) > enginePart {
			t.Errorf("an engine part of %d characters (at most %d)", len(w[1]), enginePart)
		}
		text.WriteString(w[1])
	}
	if text.Len() == 0 {
		t.Fatal("no engine block")
	}
	zr, err := gzip.NewReader(bytes.NewReader(decode85(text.String())))
	if err != nil {
		t.Fatal(err)
	}
	raw, _ := io.ReadAll(zr)
	if string(raw) != site["app.wasm"] {
		t.Errorf("engine bytes changed in the bundle")
	}
	if !strings.Contains(html, `<script type="application/json" id="ew-physics">{"physics": [{"id": "<\/script>"}]}</script>`) {
		t.Errorf("the physics table is not inlined as data")
	}
	if !strings.Contains(html, `<script type="application/json" id="ew-colours">{"n": 2, "names": {"sequential": "<\/script>"}}</script>`) {
		t.Errorf("the colour tables are not inlined as data")
	}
	// ASCII only, every other character escaped in its own language
	for i := 0; i < len(html); i++ {
		if html[i] >= 0x80 {
			t.Fatalf("a byte outside ASCII at %d: %.40q", i, html[i:])
		}
	}
	for _, want := range []string{`hi, Gr&#xF6;&#xDF;e`, `content: "\002026"`, `t = "20 \u00b0C"`, `W/m\u00b2"}`} {
		if !strings.Contains(html, want) {
			t.Errorf("the page has no %s", want)
		}
	}
	if !strings.Contains(html, `id="ew-worker">class Go {}`) {
		t.Errorf("worker source does not start with wasm_exec.js")
	}
}

func TestBundleRefusesUnknownTags(t *testing.T) {
	s := map[string]string{}
	for k, v := range site {
		s[k] = v
	}
	s["index.html"] = strings.Replace(site["index.html"], `<script src="app.js"></script>`, `<script defer src="app.js"></script>`, 1)
	if _, err := Bundle(writeSite(t, s)); err == nil {
		t.Errorf("a script tag the bundler cannot inline was accepted")
	}
	delete(s, "app.wasm")
	s["index.html"] = site["index.html"]
	if _, err := Bundle(writeSite(t, s)); err == nil || !strings.Contains(err.Error(), "make build") {
		t.Errorf("missing engine: error %v", err)
	}
}
