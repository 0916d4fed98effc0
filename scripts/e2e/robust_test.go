package e2e

import (
	"bytes"
	"compress/flate"
	"encoding/base64"
	"reflect"
	"strings"
	"testing"

	"github.com/chromedp/chromedp"
)

// balanced is an all-flux plate whose inflow and outflow cancel: it
// solves. Typing 0 into its top edge unbalances it: it then passes every
// check of the inputs but has no steady state, so it does not solve.
const balanced = `{schema: "edgewise/1", title: "balanced flux plate", physics: "heat",
  width: 0.4, height: 0.2, conductivity: 50, source: 0,
  edges: {bottom: {kind: "flux", expr: "10"}, top: {kind: "flux", expr: "-10"},
          left: {kind: "flux", expr: "0"}, right: {kind: "flux", expr: "0"}},
  probes: []}`

// unbalancedJSON is the same plate unbalanced, as JSON text.
const unbalancedJSON = `{"schema":"edgewise/1","title":"unbalanced link","physics":"heat","width":0.4,"height":0.2,
 "conductivity":50,"source":0,"edges":{"bottom":{"kind":"flux","expr":"10"},"top":{"kind":"flux","expr":"0"},
 "left":{"kind":"flux","expr":"0"},"right":{"kind":"flux","expr":"0"}},"probes":[]}`

// zLink is the share-link fragment of a text.
func zLink(text string) string {
	var b bytes.Buffer
	w, _ := flate.NewWriter(&b, flate.BestCompression)
	_, _ = w.Write([]byte(text))
	_ = w.Close()
	return "#z=" + base64.RawURLEncoding.EncodeToString(b.Bytes())
}

func (tb *tab) reload(t *testing.T) {
	t.Helper()
	if err := chromedp.Do(tb.ctx, chromedp.Reload()); err != nil {
		t.Fatal(err)
	}
	tb.waitSolved(t, 1)
}

func (tb *tab) notice(t *testing.T) string {
	t.Helper()
	return eval[string](t, tb, `document.getElementById("ew-notice").textContent`)
}

// A project that passes the checks of the inputs but does not solve is
// autosaved as an edit, never in place of the last project that solved: a
// reload comes back with that one, says what became of the newer edit and
// can restore it; one more edit after the reload keeps it so.
func TestAutosaveKeepsLastSolved(t *testing.T) {
	tb := newTab(t)
	tb.open(t, siteURL)
	want := tb.loadProject(t, balanced)
	tb.pasteInto(t, "#in-top-expr", "0")
	tb.waitFor(t, `/^Not solved/.test(document.getElementById("status").textContent)`, "the failed solve")
	tb.reload(t)
	if got := eval[map[string]any](t, tb, `window.edgewise.project()`); !reflect.DeepEqual(got, want) {
		t.Errorf("after reload the page shows %v, want the last project that solved", got["title"])
	}
	if n := eval[int](t, tb, canvasColours); n < 20 {
		t.Errorf("after reload the picture has %d colours", n)
	}
	if msg := tb.notice(t); !strings.Contains(msg, "did not solve") || !strings.Contains(msg, "steady state") {
		t.Errorf("notice %q, want one saying the newest edit did not solve and why", msg)
	}
	// one more edit, and reload again: the last good project is still there
	n := tb.solved(t)
	tb.pasteInto(t, "#in-title", "balanced, renamed")
	tb.waitSolved(t, n+1)
	tb.reload(t)
	if got := eval[string](t, tb, `window.edgewise.project().title`); got != "balanced, renamed" {
		t.Errorf("after an edit and a reload the page shows %q", got)
	}
	// the unsolved edit can be restored into the inputs
	tb.pasteInto(t, "#in-top-expr", "0")
	tb.waitFor(t, `/^Not solved/.test(document.getElementById("status").textContent)`, "the failed solve")
	tb.reload(t)
	if err := chromedp.Do(tb.ctx, chromedp.Click(chromedp.ID("ew-restore-unsolved"))); err != nil {
		t.Fatal(err)
	}
	tb.waitFor(t, `document.getElementById("in-top-expr").value === "0"`, "the restored edit in the inputs")
	tb.waitFor(t, `/^Not solved/.test(document.getElementById("status").textContent)`, "the restored edit's error")
	tb.noErrors(t)
}

// Autosaved text that cannot be read falls back to the demo with a notice;
// the text is kept under a key of its own and offered as a download.
func TestAutosaveUnreadable(t *testing.T) {
	tb := newTab(t)
	tb.open(t, siteURL)
	demo := eval[string](t, tb, `window.edgewiseInternal.demo().then(d => d.title)`)
	for _, c := range []struct{ name, js string }{
		{"not JSON", `"{\"project\": {\"schema\": "`},
		{"a list", `"[1, 2, 3]"`},
		{"null", `"null"`},
		{"deeply nested", `"{\"project\": " + "[".repeat(5000) + "]".repeat(5000) + "}"`},
		{"a deep project", `"{\"solved\": {\"schema\": \"edgewise/1\", \"title\": " + "[".repeat(500) + "]".repeat(500) + "}}"`},
	} {
		t.Run(c.name, func(t *testing.T) {
			eval[bool](t, tb, `(localStorage.setItem(window.edgewiseOutputs.autosaveKey, window.__bad = `+c.js+`),
			  localStorage.removeItem(window.edgewiseOutputs.unreadableKey), sessionStorage.setItem("bad", window.__bad), true)`)
			tb.reload(t)
			if got := eval[string](t, tb, `window.edgewise.project().title`); got != demo {
				t.Errorf("the page shows %q, want the demo", got)
			}
			if msg := tb.notice(t); !strings.Contains(msg, "could not be restored") || !strings.Contains(msg, "kept") {
				t.Errorf("notice %q, want one saying the autosave could not be restored and is kept", msg)
			}
			if !eval[bool](t, tb, `localStorage.getItem(window.edgewiseOutputs.unreadableKey) === sessionStorage.getItem("bad")`) {
				t.Errorf("the unreadable text was not kept")
			}
			if !eval[bool](t, tb, `!!document.getElementById("ew-autosave-download")`) {
				t.Errorf("no download of the unreadable text")
			}
		})
	}
	tb.noErrors(t)
}

// Every load() settles, also when the worker it waits on is restarted
// while it starts, and when Stop is pressed while a restarted worker
// starts; the reasons differ.
func TestLoadSettles(t *testing.T) {
	tb := newTab(t)
	tb.open(t, siteURL)
	tb.loadPlate(t)
	eval[map[string]any](t, tb, `window.edgewiseInternal.tune({busyMs: 0, cancelMs: 0})`)
	holdNextSolve(t, tb)
	eval[bool](t, tb, `(() => {
	  const p = (top) => { const q = `+plate+`; q.edges.top.expr = top; return q; };
	  const settle = (pr) => Promise.race([pr.then(() => "resolved", e => e.message),
	    new Promise(r => setTimeout(() => r("still pending"), 30000))]);
	  window.a = settle(window.edgewise.load(p("21")));
	  return true; })()`)
	tb.waitFor(t, `window.edgewiseInternal.engineState().held === 1`, "the held solve")
	// b cancels a and waits for a fresh worker; c, a moment later, cancels
	// b while that worker starts; Stop then stops c while its worker starts
	got := eval[map[string]string](t, tb, `(async () => {
	  const p = (top) => { const q = `+plate+`; q.edges.top.expr = top; return q; };
	  const settle = (pr) => Promise.race([pr.then(() => "resolved", e => e.message),
	    new Promise(r => setTimeout(() => r("still pending"), 30000))]);
	  const b = settle(window.edgewise.load(p("22")));
	  await new Promise(r => setTimeout(r, 5));
	  const c = settle(window.edgewise.load(p("23")));
	  await new Promise(r => setTimeout(r, 5));
	  document.getElementById("btn-stop").click();
	  return {a: await window.a, b: await b, c: await c};
	})()`)
	want := map[string]string{"a": "cancelled by a newer edit", "b": "cancelled by a newer edit", "c": "stopped by the user"}
	if !reflect.DeepEqual(got, want) {
		t.Errorf("loads settled as %v, want %v", got, want)
	}
	n := tb.solved(t)
	eval[map[string]any](t, tb, `window.edgewiseInternal.tune({cancelMs: 600})`)
	eval[map[string]any](t, tb, `window.edgewise.load(`+plate+`)`)
	tb.waitSolved(t, n+1)
	tb.noErrors(t)
}

// A link whose project passes the checks but does not solve says so and
// why, and the page keeps a good picture: at start, and pasted into an
// open tab.
func TestLinkThatDoesNotSolve(t *testing.T) {
	tb := newTab(t)
	tb.open(t, siteURL+zLink(unbalancedJSON))
	if msg := tb.notice(t); !strings.Contains(msg, "did not solve") || !strings.Contains(msg, "steady state") || strings.Contains(msg, "Opened") {
		t.Errorf("notice %q, want one saying the link's project did not solve and why", msg)
	}
	if got := eval[string](t, tb, `window.edgewise.project().title`); got == "unbalanced link" {
		t.Errorf("the page shows the link's project that did not solve")
	}
	if n := eval[int](t, tb, canvasColours); n < 20 {
		t.Errorf("the picture has %d colours after a link that did not solve", n)
	}
	before := eval[map[string]any](t, tb, `window.edgewise.project()`)
	eval[bool](t, tb, `(location.hash = `+jsString(zLink(strings.Replace(unbalancedJSON, "unbalanced link", "pasted", 1)))+`, true)`)
	tb.waitFor(t, `document.getElementById("ew-notice").textContent.includes("pasted") || document.getElementById("ew-notice").textContent.includes("did not solve")`, "the message about the pasted link")
	if msg := tb.notice(t); !strings.Contains(msg, "did not solve") || strings.Contains(msg, "Opened") {
		t.Errorf("notice %q after pasting a link that does not solve", msg)
	}
	if got := eval[map[string]any](t, tb, `window.edgewise.project()`); !reflect.DeepEqual(got, before) {
		t.Errorf("a pasted link that did not solve changed the project to %v", got["title"])
	}
	tb.noErrors(t)
}

func jsString(s string) string {
	var b strings.Builder
	b.WriteByte('"')
	for _, r := range s {
		switch r {
		case '"', '\\':
			b.WriteByte('\\')
		}
		b.WriteRune(r)
	}
	b.WriteByte('"')
	return b.String()
}

// A share link that inflates to far more than the size limit is refused
// once the limit is passed: the page stops feeding the inflater then,
// instead of inflating all of it.
func TestHugeLinkRefused(t *testing.T) {
	var b bytes.Buffer
	w, _ := flate.NewWriter(&b, flate.BestCompression)
	_, _ = w.Write([]byte(`{"schema":"edgewise/1","title":"`))
	chunk := bytes.Repeat([]byte("a"), 1<<20)
	for i := 0; i < 200; i++ { // 200 MiB of title
		_, _ = w.Write(chunk)
	}
	_, _ = w.Write([]byte(`"}`))
	_ = w.Close()
	frag := "#z=" + base64.RawURLEncoding.EncodeToString(b.Bytes())

	tb := newTab(t)
	// count the compressed bytes the page feeds to any inflater
	count := `(() => {
	  const Real = window.DecompressionStream;
	  window.__fed = 0;
	  window.DecompressionStream = class {
	    constructor(format) {
	      const real = new Real(format);
	      const meter = new TransformStream({transform(c, ctl) { window.__fed += c.byteLength; ctl.enqueue(c); }});
	      meter.readable.pipeTo(real.writable).catch(() => {});
	      this.writable = meter.writable;
	      this.readable = real.readable;
	    }
	  };
	})()`
	tb.beforeScripts(t, count)
	tb.open(t, siteURL+frag)
	if msg := tb.notice(t); !strings.Contains(msg, "larger than") {
		t.Errorf("notice %q, want the link refused as too large", msg)
	}
	// 1 MiB of output needs about 1 kB of this input (deflate inflates
	// at most about 1032 times); a few chunks more are in flight
	if fed := eval[int](t, tb, `window.__fed`); fed > 32<<10 || fed == 0 {
		t.Errorf("the page fed %d of %d compressed bytes to the inflater, want it to stop soon after the limit", fed, b.Len())
	}
	tb.noErrors(t)
}

// load() refuses odd JavaScript values with one clear line, and a project
// given as text goes through the engine's strict decoder (a repeated key
// is refused, as by the runner, file open and links).
func TestLoadOddValues(t *testing.T) {
	tb := newTab(t)
	tb.open(t, siteURL)
	for _, c := range []struct{ name, js, want string }{
		{"BigInt", `(() => { const p = ` + plate + `; p.width = 4n; return p; })()`, "width: a BigInt"},
		{"circular", `(() => { const p = ` + plate + `; p.edges.top.self = p; return p; })()`, "circular"},
		{"throwing getter", `(() => { const p = ` + plate + `; Object.defineProperty(p, "title", {enumerable: true, get() { throw new Error("no\nway"); }}); return p; })()`, "reading it failed (no)"},
		{"throwing Proxy", `new Proxy({}, {ownKeys() { throw new TypeError("trap\nline 2"); }})`, "reading it failed (trap)"},
		{"toJSON undefined", `(() => { const p = ` + plate + `; p.edges.top = {toJSON() { return undefined; }}; return p; })()`, "edges.top: its toJSON gave no value"},
		{"NaN", `(() => { const p = ` + plate + `; p.height = NaN; return p; })()`, "height: NaN"},
		{"Infinity", `(() => { const p = ` + plate + `; p.conductivity = -Infinity; return p; })()`, "conductivity: -Infinity"},
		{"repeated key in text", `'{"schema":"edgewise/1","physics":"heat","width":0.4,"width":0.3,"height":0.2,"conductivity":1,"edges":{}}'`, `"width" appears twice`},
		{"a list", `[1, 2]`, "expected a JSON object"},
	} {
		t.Run(c.name, func(t *testing.T) {
			msg := eval[string](t, tb, `Promise.resolve().then(() => window.edgewise.load(`+c.js+`)).then(() => "resolved", e => e instanceof Error ? e.message : "not an Error: " + String(e))`)
			if !strings.Contains(msg, c.want) || strings.Contains(msg, "\n") || len(msg) > 200 {
				t.Errorf("load rejected with %q, want one line with %q", msg, c.want)
			}
		})
	}
	if n := eval[int](t, tb, canvasColours); n < 20 {
		t.Errorf("the picture has %d colours after the refused loads", n)
	}
	tb.noErrors(t)
}
