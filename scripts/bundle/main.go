// Command bundle builds the single-file edgewise: one HTML file that works
// opened straight from disk (file://) with no network and nothing installed.
//
// Usage:
//
//	go run ./scripts/bundle [-site site] [-o dist/edgewise.html]
//
// It reads the built site folder (index.html with its stylesheets and
// scripts, worker.js, wasm_exec.js, app.wasm, demo.json) and writes one file
// in which
//
//   - every <link rel="stylesheet" href="X"> becomes an inline <style>, and
//     every <script src="X"></script> an inline <script>;
//   - right after the policy, before anything else: the worker's source
//     (wasm_exec.js, the engine's unpacker (unpack.go), worker.js) in
//     <script type="text/plain" id="ew-worker">; a script (startJS) that
//     starts the worker from a Blob URL made from that source; the engine,
//     gzip-compressed and base-85-encoded (base85.go), in consecutive
//     <script type="application/octet-stream" class="ew-wasm"> elements
//     of at most enginePart characters; and a script
//     (sendJS) that sends the engine's text to the worker, which unpacks
//     and compiles it while the browser reads the rest of the page
//     (site/engine.js takes the worker over);
//   - the demo project sits in <script type="application/json" id="ew-demo">,
//     the published check cases (checks.json) in one with id="ew-checks",
//     the physics table (physics.json) in one with id="ew-physics", and the
//     colour tables (colours.json) in one with id="ew-colours";
//   - the Content-Security-Policy meta tag is replaced by csp.Offline: the
//     inline scripts and styles by their SHA-256 hashes, the worker from
//     blob:, WebAssembly, and nothing from any address.
//
// index.html must write its stylesheet links and script tags in exactly the
// forms above (one per line is fine); the bundler fails loudly otherwise.
package main

import (
	"bytes"
	"compress/gzip"
	"crypto/sha256"
	"encoding/base64"
	"flag"
	"fmt"
	"os"
	"path/filepath"
	"regexp"
	"strings"
	"unicode/utf16"

	"edgewise/solver/csp"
)

func main() {
	site := flag.String("site", "site", "built site folder")
	out := flag.String("o", "dist/edgewise.html", "output file")
	flag.Parse()
	page, err := Bundle(*site)
	if err != nil {
		fmt.Fprintln(os.Stderr, "bundle:", err)
		os.Exit(1)
	}
	if err := os.MkdirAll(filepath.Dir(*out), 0o755); err != nil {
		fmt.Fprintln(os.Stderr, "bundle:", err)
		os.Exit(1)
	}
	if err := os.WriteFile(*out, page, 0o644); err != nil {
		fmt.Fprintln(os.Stderr, "bundle:", err)
		os.Exit(1)
	}
	fmt.Printf("bundle: %s (%.2f MiB)\n", *out, float64(len(page))/(1<<20))
}

var (
	linkRE   = regexp.MustCompile(`<link rel="stylesheet" href="([^"]+)">`)
	scriptRE = regexp.MustCompile(`<script src="([^"]+)"></script>`)
	cspRE    = regexp.MustCompile(`<meta http-equiv="Content-Security-Policy" content="[^"]*">`)
	// any other form of an outside script or stylesheet
	leftRE = regexp.MustCompile(`(?i)<script[^>]*\ssrc\s*=|<link[^>]*stylesheet`)
)

// Bundle returns the single-file page for the built site in dir.
func Bundle(dir string) ([]byte, error) {
	read := func(name string) (string, error) {
		b, err := os.ReadFile(filepath.Join(dir, name))
		return string(b), err
	}
	html, err := read("index.html")
	if err != nil {
		return nil, err
	}
	html = asciiHTML(html)
	if !cspRE.MatchString(html) {
		return nil, fmt.Errorf("index.html has no Content-Security-Policy meta tag to replace")
	}
	var scriptHashes, styleHashes []string
	var ferr error
	html = linkRE.ReplaceAllStringFunc(html, func(tag string) string {
		css, err := read(linkRE.FindStringSubmatch(tag)[1])
		if err != nil {
			ferr = err
			return tag
		}
		css = strings.ReplaceAll(asciiCSS(css), "</style", `<\/style`)
		styleHashes = append(styleHashes, hash(css))
		return "<style>" + css + "</style>"
	})
	html = scriptRE.ReplaceAllStringFunc(html, func(tag string) string {
		js, err := read(scriptRE.FindStringSubmatch(tag)[1])
		if err != nil {
			ferr = err
			return tag
		}
		js = escapeScript(asciiJS(js))
		scriptHashes = append(scriptHashes, hash(js))
		return "<script>" + js + "</script>"
	})
	if ferr != nil {
		return nil, ferr
	}
	if leftRE.MatchString(html) {
		return nil, fmt.Errorf("index.html has a script or stylesheet tag the bundler does not recognise")
	}

	execJS, err := read("wasm_exec.js")
	if err != nil {
		return nil, fmt.Errorf("%w (run make build first)", err)
	}
	workerJS, err := read("worker.js")
	if err != nil {
		return nil, err
	}
	wasm, err := os.ReadFile(filepath.Join(dir, "app.wasm"))
	if err != nil {
		return nil, fmt.Errorf("%w (run make build first)", err)
	}
	demo, err := read("demo.json")
	if err != nil {
		return nil, err
	}
	checks, err := read("checks.json")
	if err != nil {
		return nil, fmt.Errorf("%w (run make build first)", err)
	}
	physicsTable, err := read("physics.json")
	if err != nil {
		return nil, fmt.Errorf("%w (run make build first)", err)
	}
	colourTables, err := read("colours.json")
	if err != nil {
		return nil, fmt.Errorf("%w (run make build first)", err)
	}
	var gz bytes.Buffer
	zw, _ := gzip.NewWriterLevel(&gz, gzip.BestCompression)
	if _, err := zw.Write(wasm); err != nil {
		return nil, err
	}
	if err := zw.Close(); err != nil {
		return nil, err
	}

	// the engine first, right after the policy, which must come before any
	// script: the worker starts before the browser reads the engine's
	// text, and gets the text as soon as it is read
	unpack, err := unpackJS()
	if err != nil {
		return nil, fmt.Errorf("unpack.wat: %w", err)
	}
	var early strings.Builder
	early.WriteString("\n" + `<script type="text/plain" id="ew-worker">` + escapeScript(asciiJS(execJS+"\n"+unpack+"\n"+workerJS)) + "</script>\n")
	early.WriteString("<script>" + startJS + "</script>\n")
	text85 := encode85(gz.Bytes())
	for i := 0; i < len(text85); i += enginePart {
		early.WriteString(`<script type="application/octet-stream" class="ew-wasm">` + text85[i:min(i+enginePart, len(text85))] + "</script>\n")
	}
	early.WriteString("<script>" + sendJS + "</script>")
	scriptHashes = append(scriptHashes, hash(startJS), hash(sendJS))
	loc := cspRE.FindStringIndex(html)
	html = html[:loc[1]] + early.String() + html[loc[1]:]

	var extra strings.Builder
	extra.WriteString(`<script type="application/json" id="ew-demo">` + escapeScript(asciiJS(demo)) + "</script>\n")
	extra.WriteString(`<script type="application/json" id="ew-checks">` + escapeScript(asciiJS(checks)) + "</script>\n")
	extra.WriteString(`<script type="application/json" id="ew-physics">` + escapeScript(asciiJS(physicsTable)) + "</script>\n")
	extra.WriteString(`<script type="application/json" id="ew-colours">` + escapeScript(asciiJS(colourTables)) + "</script>\n")
	i := strings.LastIndex(html, "</body>")
	if i < 0 {
		return nil, fmt.Errorf("index.html has no </body>")
	}
	// the data blocks come before the page's own scripts, which read them
	j := strings.Index(html[loc[1]+early.Len():], "<script>")
	if j < 0 {
		j = i
	} else {
		j += loc[1] + early.Len()
	}
	if j > i {
		j = i
	}
	html = html[:j] + extra.String() + html[j:]

	html = cspRE.ReplaceAllLiteralString(html, csp.Meta(csp.Offline(scriptHashes, styleHashes)))
	return []byte(html), nil
}

// The page is written in ASCII only: every other character becomes an
// escape of the language it stands in (asciiHTML, asciiCSS, asciiJS; JSON
// takes the JavaScript form). The browser decodes a page as UTF-8 in one
// pass when it has read all of it, and a page with a few hundred other
// characters among its 2 MB took 110-165 ms of the main thread for that,
// against 33-38 ms in ASCII (measured in a fresh browser process at load
// 5); the engine's worker cannot start before the main thread is free.

// asciiHTML writes every character outside ASCII in markup as a numeric
// character reference (index.html has no inline script or style).
func asciiHTML(s string) string {
	return ascii(s, func(b *strings.Builder, r rune) { fmt.Fprintf(b, "&#x%X;", r) })
}

// asciiCSS writes every character outside ASCII as a CSS escape of six
// hex digits (which needs no space after it).
func asciiCSS(s string) string {
	return ascii(s, func(b *strings.Builder, r rune) { fmt.Fprintf(b, "\\%06X", r) })
}

// asciiJS writes every character outside ASCII as a \u escape (two, a
// surrogate pair, beyond U+FFFF): the same string in a string, template
// or regular expression literal, and harmless in a comment. JSON reads it
// too.
func asciiJS(s string) string {
	return ascii(s, func(b *strings.Builder, r rune) {
		if r > 0xFFFF {
			r1, r2 := utf16.EncodeRune(r)
			fmt.Fprintf(b, "\\u%04x\\u%04x", r1, r2)
			return
		}
		fmt.Fprintf(b, "\\u%04x", r)
	})
}

func ascii(s string, esc func(*strings.Builder, rune)) string {
	var b strings.Builder
	for _, r := range s {
		if r < 0x80 {
			b.WriteRune(r)
		} else {
			esc(&b, r)
		}
	}
	return b.String()
}

// enginePart is the length of each of the elements the engine's text is
// written in. While the browser reads one long element its main thread
// does nothing else, and the engine's worker, started just before, needs
// the main thread for a moment to get going; between elements it gets
// that moment. Measured in a fresh browser process (5 opens, two rounds
// each, load 2-4): the worker started its engine at 772 ms (median)
// against 830-840 ms in one element.
const enginePart = 65536

// escapeScript keeps inline text from closing its <script> element early.
// startJS is the page's first script: it starts the engine's worker from
// the worker's source before the browser reads the engine's text (a new
// worker takes a while to start), and sendJS, right after that text, sends
// it to the worker. site/engine.js takes the worker over, with the
// messages it sent meanwhile (edgewiseEarlyWorker).
const startJS = `"use strict";
(function () {
  try {
    const src = document.getElementById("ew-worker").textContent;
    const worker = new Worker(URL.createObjectURL(new Blob([src], { type: "text/javascript" })));
    const early = { worker, heard: [] };
    worker.onmessage = worker.onerror = (ev) => { early.heard.push(ev); };
    window.edgewiseEarlyWorker = early;
    performance.mark("ew:worker-spawned");
  } catch (e) {
    // site/engine.js starts a worker of its own and says what fails
  }
})();
`

const sendJS = `"use strict";
if (window.edgewiseEarlyWorker) {
  window.edgewiseEarlyWorker.worker.postMessage({ type: "init", text: Array.from(document.getElementsByClassName("ew-wasm"), (e) => e.textContent).join("") });
  performance.mark("ew:engine-sent");
}
`

func escapeScript(s string) string {
	s = strings.ReplaceAll(s, "</script", `<\/script`)
	return strings.ReplaceAll(s, "<!--", `<\!--`)
}

func hash(s string) string {
	h := sha256.Sum256([]byte(s))
	return "'sha256-" + base64.StdEncoding.EncodeToString(h[:]) + "'"
}
