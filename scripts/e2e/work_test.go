package e2e

import (
	"strings"
	"testing"

	"github.com/chromedp/chromedp"
	"github.com/chromedp/chromedp/kb"
)

// allPreviews holds when every edge preview shows a profile.
const allPreviews = `["top", "bottom", "left", "right"].every(s =>
  (document.getElementById("pv-" + s).getAttribute("aria-label") || "").startsWith("Profile along"))`

// A probe outside the rectangle does not stop the solves: the engine gets
// the probes inside, the project keeps the outside one, its row is marked
// and offers to move it inside or drop it, and no edge preview sticks.
func TestProbeOutsideKeepsSolving(t *testing.T) {
	tb := newTab(t)
	tb.open(t, siteURL)
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
