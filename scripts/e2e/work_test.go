package e2e

import (
	"bytes"
	"context"
	"fmt"
	"os"
	"path/filepath"
	"strings"
	"testing"

	"github.com/chromedp/cdproto/cdp"
	"github.com/chromedp/cdproto/emulation"
	"github.com/chromedp/cdproto/page"
	"github.com/chromedp/chromedp"
	"github.com/chromedp/chromedp/kb"
)

// loadDemo loads the demo project (the autosave of another test may have
// opened something else) and waits for its solve.
func (tb *tab) loadDemo(t *testing.T) {
	t.Helper()
	n := tb.solved(t)
	eval[bool](t, tb, `window.edgewiseInternal.demo().then(d => window.edgewise.load(d)).then(() => true)`)
	tb.waitSolved(t, n+1)
}

// allPreviews holds when every edge preview shows a profile.
const allPreviews = `["top", "bottom", "left", "right"].every(s =>
  (document.getElementById("pv-" + s).getAttribute("aria-label") || "").startsWith("Profile along"))`

// A probe outside the rectangle does not stop the solves: the engine gets
// the probes inside, the project keeps the outside one, its row is marked
// and offers to move it inside or drop it, and no edge preview sticks.
func TestProbeOutsideKeepsSolving(t *testing.T) {
	tb := newTab(t)
	tb.open(t, siteURL)
	tb.loadDemo(t)
	tb.waitFor(t, allPreviews, "the edge previews of the demo")
	// the demo's probe T1 sits at y = 0.05, on the top edge
	tb.pasteInto(t, "#in-height", "0.006")
	tb.waitFor(t, `window.edgewiseInternal.last().project.height === 0.006`, "a solve of the thinner plate")
	status := eval[string](t, tb, `document.getElementById("status").textContent`)
	if strings.Contains(status, "Not solved") || !strings.Contains(status, "T1") || !strings.Contains(status, "outside") {
		t.Errorf("status %q, want a solve that says probe T1 is left out", status)
	}
	if y := eval[float64](t, tb, `window.edgewise.project().probes[0].y`); y != 0.05 {
		t.Errorf("the project's probe moved to y = %g; it must keep 0.05 until the user moves it", y)
	}
	if n := eval[int](t, tb, `window.edgewiseInternal.last().result.probes.length`); n != 0 {
		t.Errorf("the result has %d probes; the one outside must be left out", n)
	}
	if !eval[bool](t, tb, `!!document.querySelector('#probes tr.outside[data-label="T1"] button.probe-move') &&
	  !!document.querySelector('#probes tr.outside[data-label="T1"] button.probe-drop')`) {
		t.Errorf("the probe row is not marked outside with Move inside and Drop")
	}
	tb.waitFor(t, allPreviews, "edge previews while a probe is outside")
	tb.shot(t, "probe-outside")
	// the report and the downloads leave the outside probe out too
	if err := chromedp.Do(tb.ctx, chromedp.Click(chromedp.CSS("#ew-report-btn"))); err != nil {
		t.Fatal(err)
	}
	tb.waitFor(t, `!!document.querySelector("#ew-report img") && document.querySelector("#ew-report img").naturalWidth > 0`, "the report with a probe outside")
	eval[bool](t, tb, `(window.edgewiseOutputs.closeReport(), true)`)
	// Move inside: onto the nearest point of the rectangle, solved with it
	if err := chromedp.Do(tb.ctx, chromedp.Click(chromedp.CSS(`#probes tr.outside button.probe-move`))); err != nil {
		t.Fatal(err)
	}
	tb.waitFor(t, `window.edgewiseInternal.last().result.probes.length === 1 && window.edgewise.project().probes[0].y === 0.006`, "the probe moved onto the top edge and solved")
	if eval[bool](t, tb, `!!document.querySelector("#probes tr.outside")`) {
		t.Errorf("the moved probe is still marked outside")
	}
	// a narrower plate leaves the probe (x = 0.07) outside again: Drop
	tb.pasteInto(t, "#in-width", "0.05")
	tb.waitFor(t, `window.edgewiseInternal.last().project.width === 0.05 && !!document.querySelector("#probes tr.outside button.probe-drop")`, "the narrow plate solved with the probe marked")
	if err := chromedp.Do(tb.ctx, chromedp.Click(chromedp.CSS(`#probes tr.outside button.probe-drop`))); err != nil {
		t.Fatal(err)
	}
	tb.waitFor(t, `window.edgewise.project().probes.length === 0 && window.edgewiseInternal.last().project.probes.length === 0`, "the probe dropped")
	tb.waitFor(t, allPreviews, "edge previews after the probe is dropped")
	// the project with a probe outside also loads (the project keeps it)
	eval[bool](t, tb, `window.edgewiseInternal.demo().then(d => { d.height = 0.006; return window.edgewise.load(JSON.stringify(d)); }).then(() => true)`)
	if y := eval[float64](t, tb, `window.edgewise.project().probes[0].y`); y != 0.05 {
		t.Errorf("loaded probe y = %g, want 0.05 kept", y)
	}
	tb.noErrors(t)
}

// The live picture follows the typing, but the good project (what the
// page falls back to, autosaves and shares) is the last one the user
// meant: confirmed with Enter, paused on, or left.
func TestHalfTypedIsNotGood(t *testing.T) {
	tb := newTab(t)
	tb.open(t, siteURL)
	tb.loadDemo(t)
	eval[map[string]any](t, tb, `window.edgewiseInternal.tune({pauseMs: 600000})`)
	good := func() string { return eval[string](t, tb, `window.edgewiseInternal.good().edges.right.expr`) }
	saved := func() string {
		return eval[string](t, tb, `JSON.parse(localStorage.getItem(window.edgewiseOutputs.autosaveKey)).solved.edges.right.expr`)
	}
	if g := good(); g != "30" {
		t.Fatalf("the demo's good right edge is %q, want 30", g)
	}
	link := eval[string](t, tb, `window.edgewise.linkReady()`)
	// half-typed: drawn, but not good
	tb.pasteInto(t, "#in-right-expr", "s")
	tb.waitFor(t, `window.edgewiseInternal.last().project.edges.right.expr === "s"`, "the live picture of s")
	if g := good(); g != "30" {
		t.Errorf("after typing s the good project's right edge is %q, want 30 still", g)
	}
	if s := saved(); s != "30" {
		t.Errorf("the autosave's last good right edge is %q, want 30", s)
	}
	if l := eval[string](t, tb, `window.edgewise.linkReady()`); l != link {
		t.Errorf("the share link changed on a half-typed edit")
	}
	// a typo: the page falls back to the good project's picture
	tb.pasteInto(t, "#in-right-expr", "s+")
	tb.waitFor(t, `/^Not solved/.test(document.getElementById("status").textContent)`, "the typo refused")
	if e := eval[string](t, tb, `window.edgewiseInternal.last().project.edges.right.expr`); e != "30" {
		t.Errorf("after a typo the picture shows right edge %q, want the good 30", e)
	}
	// Enter confirms
	tb.pasteInto(t, "#in-right-expr", "30 + sqrt(s)")
	tb.waitFor(t, `window.edgewiseInternal.last().project.edges.right.expr === "30 + sqrt(s)"`, "the live picture of sqrt")
	if g := good(); g != "30" {
		t.Errorf("before Enter the good right edge is %q, want 30", g)
	}
	if err := chromedp.Do(tb.ctx, chromedp.KeyEvent(kb.Enter)); err != nil {
		t.Fatal(err)
	}
	tb.waitFor(t, `window.edgewiseInternal.good().edges.right.expr === "30 + sqrt(s)"`, "Enter to make it good")
	if s := saved(); s != "30 + sqrt(s)" {
		t.Errorf("after Enter the autosave's good right edge is %q", s)
	}
	if l := eval[string](t, tb, `window.edgewise.linkReady()`); l == link {
		t.Errorf("the share link did not follow the confirmed edit")
	}
	// a pause makes it good
	eval[map[string]any](t, tb, `window.edgewiseInternal.tune({pauseMs: 300})`)
	tb.pasteInto(t, "#in-right-expr", "2*s")
	tb.waitFor(t, `window.edgewiseInternal.good().edges.right.expr === "2*s"`, "a pause to make it good")
	// leaving the field makes it good
	eval[map[string]any](t, tb, `window.edgewiseInternal.tune({pauseMs: 600000})`)
	tb.pasteInto(t, "#in-right-expr", "3*s")
	tb.waitFor(t, `window.edgewiseInternal.last().project.edges.right.expr === "3*s"`, "the live picture of 3*s")
	if g := good(); g != "2*s" {
		t.Errorf("before leaving the field the good right edge is %q, want 2*s", g)
	}
	if err := chromedp.Do(tb.ctx, chromedp.Focus(chromedp.ID("in-title"))); err != nil {
		t.Fatal(err)
	}
	tb.waitFor(t, `window.edgewiseInternal.good().edges.right.expr === "3*s"`, "leaving the field to make it good")
	tb.noErrors(t)
}

// Undo and redo step through the projects the user meant, by keys and by
// the buttons, also with a solve in flight.
func TestUndoRedo(t *testing.T) {
	tb := newTab(t)
	tb.open(t, siteURL)
	tb.loadDemo(t)
	eval[map[string]any](t, tb, `window.edgewiseInternal.tune({pauseMs: 600000})`)
	right := func() string { return eval[string](t, tb, `document.getElementById("in-right-expr").value`) }
	meant := func(v string) {
		t.Helper()
		tb.pasteInto(t, "#in-right-expr", v)
		if err := chromedp.Do(tb.ctx, chromedp.KeyEvent(kb.Enter)); err != nil {
			t.Fatal(err)
		}
		tb.waitFor(t, `window.edgewiseInternal.good().edges.right.expr === "`+v+`"`, "the edit "+v+" meant")
	}
	shown := func(v, what string) {
		t.Helper()
		tb.waitFor(t, `document.getElementById("in-right-expr").value === "`+v+`" && window.edgewiseInternal.last().project.edges.right.expr === "`+v+`" && window.edgewiseInternal.good().edges.right.expr === "`+v+`"`, what)
	}
	key := func(k string, mods kb.Modifier) {
		t.Helper()
		if err := chromedp.Do(tb.ctx, chromedp.KeyEvent(k, chromedp.KeyModifiers(mods))); err != nil {
			t.Fatal(err)
		}
	}
	meant("40")
	meant("50")
	// keystrokes between are not steps: "5" on the way to "50" was never meant
	key("z", kb.ModifierCtrl)
	shown("40", "Ctrl+Z back to 40")
	key("z", kb.ModifierCtrl)
	shown("30", "Ctrl+Z back to the demo's 30")
	key("z", kb.ModifierCtrl|kb.ModifierShift)
	shown("40", "Ctrl+Shift+Z forward to 40")
	key("y", kb.ModifierCtrl)
	shown("50", "Ctrl+Y forward to 50")
	if !eval[bool](t, tb, `document.getElementById("btn-redo").disabled`) {
		t.Errorf("Redo is enabled with nothing to redo")
	}
	if err := chromedp.Do(tb.ctx, chromedp.Click(chromedp.ID("btn-undo"))); err != nil {
		t.Fatal(err)
	}
	shown("40", "the Undo button")
	if err := chromedp.Do(tb.ctx, chromedp.Click(chromedp.ID("btn-redo"))); err != nil {
		t.Fatal(err)
	}
	shown("50", "the Redo button")
	// a half-typed edit is dropped by the first undo, back to the last meant
	tb.pasteInto(t, "#in-right-expr", "5")
	tb.waitFor(t, `window.edgewiseInternal.last().project.edges.right.expr === "5"`, "the live picture of 5")
	key("z", kb.ModifierCtrl)
	shown("50", "Ctrl+Z drops the half-typed 5")
	// undo while a solve is in flight: the held solve's answer is not shown
	holdNextSolve(t, tb)
	meantNoWait := "60"
	tb.pasteInto(t, "#in-right-expr", meantNoWait)
	if err := chromedp.Do(tb.ctx, chromedp.KeyEvent(kb.Enter)); err != nil {
		t.Fatal(err)
	}
	tb.waitFor(t, `window.edgewiseInternal.engineState().held === 1`, "the solve of 60 held")
	key("z", kb.ModifierCtrl)
	if v := right(); v != "50" {
		t.Errorf("undo with a solve in flight left %q in the field, want 50", v)
	}
	eval[bool](t, tb, `window.edgewiseInternal.release()`)
	shown("50", "undo with a solve in flight")
	tb.shot(t, "undo-redo")
	tb.noErrors(t)
}

// holdEngineStart makes every page the tab opens keep its engine from
// starting until window.startEngine() (the worker's "init" message waits).
const holdEngineStart = `(() => {
  try { localStorage.removeItem("edgewise.autosave.1"); } catch (e) {}
  const W = window.Worker; let go; const wait = new Promise(r => { go = r; });
  window.startEngine = () => { go(); return true; };
  window.Worker = class extends W {
    postMessage(m, t) { if (m && m.type === "init") wait.then(() => super.postMessage(m, t)); else super.postMessage(m, t); }
  };
})()`

// The first screen shows the first project's inputs before the engine is
// up, and the picture once it is: on the served page and the offline file.
func TestFirstScreen(t *testing.T) {
	bothPages(t, func(t *testing.T, url string) {
		tb := newTab(t)
		tb.beforeScripts(t, holdEngineStart)
		if err := chromedp.Do(tb.ctx, chromedp.Navigate(url)); err != nil {
			t.Fatal(err)
		}
		tb.waitFor(t, `document.getElementById("in-width").value !== ""`, "the form filled before the engine is up")
		got := eval[[]string](t, tb, `[document.getElementById("in-width").value, document.getElementById("in-height").value,
		  document.getElementById("in-bottom-expr").value, document.getElementById("status").textContent,
		  document.querySelector('[data-unit="length"]').textContent]`)
		demo := eval[map[string]any](t, tb, `window.edgewiseInternal.demo()`)
		if got[0] != fmt.Sprint(demo["width"]) || got[1] != fmt.Sprint(demo["height"]) || got[2] == "" {
			t.Errorf("before the engine: width %q, height %q, bottom %q; want the demo's", got[0], got[1], got[2])
		}
		if !strings.Contains(got[3], "Starting the engine") {
			t.Errorf("status %q before the engine is up", got[3])
		}
		if got[4] == "" {
			t.Errorf("the inputs show no units before the engine is up")
		}
		if tb.solved(t) != 0 {
			t.Errorf("solved before the engine started")
		}
		tb.shot(t, "first-screen-"+pageName(url))
		eval[bool](t, tb, `window.startEngine()`)
		tb.waitSolved(t, 1)
		tb.noErrors(t)
	})
}

// The embed snippet's frame takes its size from the project's aspect: the
// embedded page fills it without scrolling and leaves no empty half.
func TestEmbedSizeFollowsAspect(t *testing.T) {
	for _, c := range []struct {
		name string
		w, h float64
	}{{"wide", 0.4, 0.05}, {"demo", 0.2, 0.05}, {"square", 0.2, 0.2}} {
		t.Run(c.name, func(t *testing.T) {
			tb := newTab(t)
			tb.open(t, siteURL)
			eval[bool](t, tb, fmt.Sprintf(`window.edgewiseInternal.demo().then(d => { d.width = %g; d.height = %g; d.probes = []; return window.edgewise.load(d); }).then(() => true)`, c.w, c.h))
			eval[string](t, tb, `window.edgewise.linkReady()`)
			snip := eval[[]string](t, tb, `(() => { const d = new DOMParser().parseFromString(document.getElementById("ew-embed").value, "text/html").querySelector("iframe");
			  return [d.getAttribute("src"), d.getAttribute("width"), d.getAttribute("height")]; })()`)
			var fw, fh int64
			fmt.Sscan(snip[1], &fw)
			fmt.Sscan(snip[2], &fh)
			if fw < 300 || fh < 150 || fw > 760 || fh > 760 {
				t.Fatalf("snippet frame %s x %s", snip[1], snip[2])
			}
			fr := newTab(t)
			fr.setWidth(t, fw, fh)
			fr.open(t, snip[0])
			got := eval[[]float64](t, fr, `[document.documentElement.scrollHeight, innerHeight,
			  Math.max(...[...document.querySelectorAll("#field, .ew-compact")].map(e => e.getBoundingClientRect().bottom))]`)
			if got[0] > got[1]+2 {
				t.Errorf("%s plate in a %d x %d frame scrolls: content %g px high", c.name, fw, fh, got[0])
			}
			if got[2] < 0.7*got[1] {
				t.Errorf("%s plate in a %d x %d frame: content ends at %g px, the rest is empty", c.name, fw, fh, got[2])
			}
			fr.shot(t, "embed-"+c.name)
		})
	}
}

// From the offline file a link to the file opens only on this computer:
// the page says so and makes links for the hosted copy's address once it
// is given, kept across reloads.
func TestOfflineShareHostedAddress(t *testing.T) {
	file := "file://" + filepath.Join(root, "dist", "edgewise.html")
	tb := newTab(t)
	tb.open(t, file)
	eval[bool](t, tb, `(localStorage.removeItem("edgewise.hosted.1"), true)`)
	tb.reload(t)
	note := eval[string](t, tb, `(() => { const n = document.getElementById("ew-hosted-note"); return n && !n.hidden ? n.textContent : ""; })()`)
	if !strings.Contains(note, "opens only here") {
		t.Fatalf("the offline page says %q about its links, want that they open only here", note)
	}
	if l := eval[string](t, tb, `window.edgewise.linkReady()`); !strings.HasPrefix(l, file+"#z=") {
		t.Errorf("link before the hosted address is set: %q", l)
	}
	// a bad address is refused in the notice line
	tb.pasteInto(t, "#ew-hosted", "wiki/edgewise")
	if err := chromedp.Do(tb.ctx, chromedp.Click(chromedp.ID("ew-hosted-save"))); err != nil {
		t.Fatal(err)
	}
	tb.waitFor(t, `/not a web address/.test(document.getElementById("ew-notice").textContent)`, "the bad address refused")
	host := "https://wiki.example.org/tools/edgewise/"
	tb.pasteInto(t, "#ew-hosted", host)
	if err := chromedp.Do(tb.ctx, chromedp.Click(chromedp.ID("ew-hosted-save"))); err != nil {
		t.Fatal(err)
	}
	tb.waitFor(t, `window.edgewise.link().startsWith("`+host+`#")`, "links for the hosted copy")
	tb.reload(t)
	l := eval[string](t, tb, `window.edgewise.linkReady()`)
	if !strings.HasPrefix(l, host+"#z=") {
		t.Errorf("after a reload the link is %q, want the hosted copy's", l)
	}
	if src := eval[string](t, tb, `document.getElementById("ew-embed").value`); !strings.Contains(src, `src="`+host+`?embed#z=`) {
		t.Errorf("embed snippet %q, want the hosted copy's address", src)
	}
	eval[bool](t, tb, `(document.getElementById("ew-hosted-note").scrollIntoView({block: "center"}), true)`)
	tb.shot(t, "offline-share-hosted")
	// the served page makes links for itself and shows no such note
	sv := newTab(t)
	sv.open(t, siteURL)
	if eval[bool](t, sv, `!document.getElementById("ew-hosted-note").hidden`) {
		t.Errorf("the served page shows the offline note")
	}
	eval[bool](t, tb, `(localStorage.removeItem("edgewise.hosted.1"), true)`)
	tb.noErrors(t)
}

// The report is a calculation sheet: a title block the user fills in the
// report panel, kept in the project (saved, shared, reloaded), page
// numbers in print and no heading left alone at the foot of a page.
func TestCalculationSheet(t *testing.T) {
	tb := newTab(t)
	tb.open(t, siteURL)
	tb.loadDemo(t)
	if err := chromedp.Do(tb.ctx, chromedp.Click(chromedp.CSS("#ew-report-btn"))); err != nil {
		t.Fatal(err)
	}
	tb.waitFor(t, `!!document.querySelector("#ew-report #ew-sheet-form") && !!document.querySelector("#ew-report #ew-sheet-block")`, "the report with its title block form")
	fill := map[string]string{"project": "Line 4 bracket", "number": "C-0042", "prepared_by": "A. N. Engineer",
		"checked_by": "B. Checker", "date": "2026-12-02", "revision": "B"}
	for _, k := range []string{"project", "number", "prepared_by", "checked_by", "date", "revision"} {
		tb.pasteInto(t, "#ew-sheet-"+k, fill[k])
		if err := chromedp.Do(tb.ctx, chromedp.KeyEvent(kb.Tab)); err != nil {
			t.Fatal(err)
		}
	}
	tb.waitFor(t, `(window.edgewise.project().sheet || {}).revision === "B" && (window.edgewiseInternal.good().sheet || {}).revision === "B"`, "the title block in the project")
	got := eval[map[string]any](t, tb, `window.edgewise.project().sheet`)
	for k, v := range fill {
		if got[k] != v {
			t.Errorf("project sheet.%s = %v, want %q", k, got[k], v)
		}
	}
	block := eval[string](t, tb, `document.getElementById("ew-sheet-block").textContent`)
	for _, v := range fill {
		if !strings.Contains(block, v) {
			t.Errorf("the printed title block %q lacks %q", block, v)
		}
	}
	// print rules: page numbers, headings kept with what follows
	css := eval[string](t, tb, `[...document.styleSheets].flatMap(s => [...s.cssRules]).map(r => r.cssText).join("\n")`)
	if !strings.Contains(css, "counter(page)") || !strings.Contains(css, "counter(pages)") {
		t.Errorf("no page numbers in the print rules")
	}
	if !strings.Contains(css, "break-after: avoid") {
		t.Errorf("no rule keeps a heading with what follows")
	}
	eval[bool](t, tb, `(document.getElementById("ew-report").scrollTop = 0, document.activeElement.blur(), true)`)
	tb.shot(t, "calculation-sheet")
	if err := chromedp.Do(tb.ctx, chromedp.Func(func(ctx context.Context, tg *chromedp.Target) error {
		_, err := cdp.Call(ctx, tg, emulation.SetEmulatedMedia, emulation.SetEmulatedMediaParams{Media: "print"})
		return err
	})); err != nil {
		t.Fatal(err)
	}
	eval[bool](t, tb, `(window.scrollTo(0, 0), true)`)
	tb.shot(t, "calculation-sheet-print")
	var pdf []byte
	if err := chromedp.Do(tb.ctx, chromedp.Func(func(ctx context.Context, tg *chromedp.Target) error {
		r, err := cdp.Call(ctx, tg, page.PrintToPDF, page.PrintToPDFParams{})
		pdf = r.Data
		return err
	})); err != nil {
		t.Fatal(err)
	}
	if !bytes.HasPrefix(pdf, []byte("%PDF-")) {
		t.Fatalf("print to PDF gave %.8q", pdf)
	}
	_ = os.WriteFile(filepath.Join(root, "scripts", "e2e", "screens", "calculation-sheet.pdf"), pdf, 0o644)
	// kept: a reload brings the title block back with the project
	eval[bool](t, tb, `(window.edgewiseOutputs.closeReport(), true)`)
	tb.reload(t)
	if r := eval[string](t, tb, `(window.edgewise.project().sheet || {}).number || ""`); r != "C-0042" {
		t.Errorf("after reload the calculation number is %q", r)
	}
	tb.noErrors(t)
}

// The published checks show how far they are and let edits solve between
// cases: with a case held in flight, an edit is solved and drawn.
func TestChecksProgressAndEdits(t *testing.T) {
	tb := newTab(t)
	tb.open(t, siteURL)
	tb.loadDemo(t)
	eval[bool](t, tb, `window.edgewiseInternal.hold({fn: "check", calls: 1})`)
	eval[bool](t, tb, `(document.getElementById("ew-checks-panel").open = true, true)`)
	if err := chromedp.Do(tb.ctx, chromedp.Click(chromedp.CSS("#ew-checks-run"))); err != nil {
		t.Fatal(err)
	}
	tb.waitFor(t, `window.edgewiseInternal.engineState().held === 1 && !!document.getElementById("ew-checks-progress")`, "the first case held, with a progress bar")
	bar := eval[[]float64](t, tb, `(() => { const p = document.getElementById("ew-checks-progress"); return [p.value, p.max]; })()`)
	if bar[0] != 0 || bar[1] < 10 {
		t.Errorf("progress %v of %v before the first case is done", bar[0], bar[1])
	}
	tb.pasteInto(t, "#in-right-expr", "35")
	tb.waitFor(t, `window.edgewiseInternal.last().project.edges.right.expr === "35"`, "an edit solved while a check is in flight")
	eval[bool](t, tb, `window.edgewiseInternal.release()`)
	tb.waitFor(t, `document.getElementById("ew-checks-panel").dataset.state === "done"`, "the checks")
	bar = eval[[]float64](t, tb, `(() => { const p = document.getElementById("ew-checks-progress"); return [p.value, p.max]; })()`)
	if bar[0] != bar[1] {
		t.Errorf("progress %v of %v after the run", bar[0], bar[1])
	}
	tb.noErrors(t)
}
