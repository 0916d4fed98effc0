package e2e

import (
	"context"
	"fmt"
	"math"
	"os"
	"path/filepath"
	"strconv"
	"strings"
	"testing"
	"time"

	"github.com/chromedp/cdproto/cdp"
	"github.com/chromedp/cdproto/emulation"
	"github.com/chromedp/cdproto/input"
	"github.com/chromedp/chromedp"
	"github.com/chromedp/chromedp/kb"
)

// plate is a value-edge project (all the engine in use solves today) with
// round numbers: a 0.4 m x 0.2 m plate, hot bottom, cool top.
const plate = `{schema: "edgewise/1", title: "test plate", physics: "heat",
  width: 0.4, height: 0.2, conductivity: 50, source: 0,
  edges: {bottom: {kind: "value", expr: "90"}, top: {kind: "value", expr: "20"},
          left: {kind: "value", expr: "40"}, right: {kind: "value", expr: "40"}},
  probes: []}`

// setWidth emulates a screen of the given CSS size.
func (tb *tab) setWidth(t *testing.T, w, h int64) {
	t.Helper()
	if err := chromedp.Do(tb.ctx, chromedp.Func(func(ctx context.Context, tg *chromedp.Target) error {
		_, err := cdp.Call(ctx, tg, emulation.SetDeviceMetricsOverride, emulation.SetDeviceMetricsOverrideParams{Width: w, Height: h, DeviceScaleFactor: 1, Mobile: w < 600})
		return err
	})); err != nil {
		t.Fatal(err)
	}
}

// fullShot saves a screenshot of the whole page, not only the screen.
func (tb *tab) fullShot(t *testing.T, name string) {
	t.Helper()
	png, err := chromedp.Run(tb.ctx, chromedp.FullScreenshot(100))
	if err != nil {
		t.Fatalf("screenshot: %v", err)
	}
	dir := filepath.Join(root, "scripts", "e2e", "screens")
	_ = os.MkdirAll(dir, 0o755)
	if err := os.WriteFile(filepath.Join(dir, name+".png"), png, 0o644); err != nil {
		t.Fatal(err)
	}
}

// solved is the page's count of successful solves.
func (tb *tab) solved(t *testing.T) int {
	t.Helper()
	return eval[int](t, tb, `Number(document.documentElement.dataset.solved || 0)`)
}

// waitFor polls a JavaScript condition until it holds.
func (tb *tab) waitFor(t *testing.T, cond, what string) {
	t.Helper()
	if _, err := chromedp.Run(tb.ctx, chromedp.Poll[bool](cond, chromedp.WithPollingTimeout(60*time.Second))); err != nil {
		status, _ := chromedp.Run(tb.ctx, chromedp.Evaluate[string](`document.getElementById("status").textContent`))
		t.Fatalf("waiting for %s: %v; status: %q", what, err, status)
	}
}

// typeInto replaces the text of an input the way a user does: focus it,
// select all, type.
func (tb *tab) typeInto(t *testing.T, sel, text string) {
	t.Helper()
	if err := chromedp.Do(tb.ctx, chromedp.Focus(chromedp.CSS(sel))); err != nil {
		t.Fatalf("focus %s: %v", sel, err)
	}
	eval[bool](t, tb, `(document.activeElement.select(), true)`)
	if err := chromedp.Do(tb.ctx, chromedp.SendKeys(chromedp.CSS(sel), text)); err != nil {
		t.Fatalf("typing into %s: %v", sel, err)
	}
}

// pasteInto replaces the text of an input in one go, as pasting does (one
// input event, no intermediate states).
func (tb *tab) pasteInto(t *testing.T, sel, text string) {
	t.Helper()
	if err := chromedp.Do(tb.ctx, chromedp.Focus(chromedp.CSS(sel))); err != nil {
		t.Fatalf("focus %s: %v", sel, err)
	}
	eval[bool](t, tb, `(document.activeElement.select(), true)`)
	if err := chromedp.Do(tb.ctx, chromedp.Func(func(ctx context.Context, tg *chromedp.Target) error {
		_, err := cdp.Call(ctx, tg, input.InsertText, input.InsertTextParams{Text: text})
		return err
	})); err != nil {
		t.Fatalf("pasting into %s: %v", sel, err)
	}
}

// loadPlate loads the test plate through the page's interface.
func (tb *tab) loadPlate(t *testing.T) {
	t.Helper()
	n := tb.solved(t)
	eval[map[string]any](t, tb, `window.edgewise.load(`+plate+`)`)
	tb.waitSolved(t, n+1)
}

// readNumber reads a number as the page writes it: U+2212 for minus and
// "×10" with superscript digits for powers of ten; a leading "≈ " is
// dropped.
func readNumber(s string) (float64, error) {
	s = strings.TrimSpace(strings.TrimPrefix(strings.TrimSpace(s), "≈"))
	s = strings.ReplaceAll(s, "−", "-")
	if i := strings.Index(s, "×10"); i >= 0 {
		exp := strings.NewReplacer("⁻", "-", "⁰", "0", "¹", "1", "²", "2", "³", "3", "⁴", "4", "⁵", "5", "⁶", "6", "⁷", "7", "⁸", "8", "⁹", "9").Replace(s[i+len("×10"):])
		s = s[:i] + "e" + exp
	}
	return strconv.ParseFloat(s, 64)
}

func TestReadNumber(t *testing.T) {
	for _, c := range []struct {
		in   string
		want float64
	}{{"63.25", 63.25}, {"−1.5", -1.5}, {"2.5×10⁻⁴", 2.5e-4}, {"≈ 1×10⁵", 1e5}} {
		if got, err := readNumber(c.in); err != nil || got != c.want {
			t.Errorf("readNumber(%q) = %v, %v; want %v", c.in, got, err, c.want)
		}
	}
}

// Typing a formula into an edge field re-solves and redraws the picture.
func TestTypeFormulaRedraws(t *testing.T) {
	tb := newTab(t)
	tb.open(t, siteURL)
	tb.loadPlate(t)
	before := eval[string](t, tb, `document.getElementById("field").toDataURL()`)
	n := tb.solved(t)
	formula := "55 + 20*s/W"
	tb.typeInto(t, "#in-top-expr", formula)
	tb.waitSolved(t, n+1)
	// the typed text is the solved project's top edge
	tb.waitFor(t, `window.edgewiseInternal.last().project.edges.top.expr === "`+formula+`"`, "the typed formula to be solved")
	after := eval[string](t, tb, `document.getElementById("field").toDataURL()`)
	if after == before {
		t.Errorf("the picture did not change after the top edge went from 20 to %q", formula)
	}
	// the top edge got warmer: its middle node reads 65 by the formula,
	// 20 before. The bound only has to tell the two apart (engine accuracy
	// at an edge node is tested natively).
	top := eval[float64](t, tb, `(() => { const s = window.edgewiseInternal.last();
	  return s.u[s.ny * (s.nx + 1) + (s.nx >> 1)]; })()`)
	if top < 50 {
		t.Errorf("top-middle value %g after typing %q, want well above the old 20", top, formula)
	}
	if p := eval[string](t, tb, `window.edgewise.project().edges.top.expr`); p != formula {
		t.Errorf("project() has top expr %q, want %q", p, formula)
	}
	tb.shot(t, "typed-formula")
	tb.noErrors(t)
}

// A bad formula shows the engine's message with a caret under the column,
// and the last good picture stays.
func TestBadFormulaShowsCaret(t *testing.T) {
	tb := newTab(t)
	tb.open(t, siteURL)
	tb.loadPlate(t)
	before := eval[string](t, tb, `document.getElementById("field").toDataURL()`)
	n := tb.solved(t)
	tb.pasteInto(t, "#in-left-expr", "40 + sinn(s)")
	tb.waitFor(t, `!!document.querySelector("#err-left .caret")`, "the caret error under the left edge")
	msg := eval[string](t, tb, `document.querySelector("#err-left .err-msg").textContent`)
	if !strings.Contains(msg, `unknown name "sinn"`) || !strings.HasPrefix(msg, "Left edge, temperature: col 6: ") {
		t.Errorf("error message %q, want the field as the screen names it and the unknown name", msg)
	}
	caret := eval[string](t, tb, `document.querySelector("#err-left .caret").textContent`)
	lines := strings.Split(caret, "\n")
	// "40 + sinn(s)": sinn starts at byte column 6
	if len(lines) != 2 || lines[0] != "40 + sinn(s)" || lines[1] != "     ^" {
		t.Errorf("caret block %q, want the formula and a caret under column 6", caret)
	}
	if eval[bool](t, tb, `document.getElementById("stale").hidden`) {
		t.Errorf("the old numbers are not marked as belonging to the last project that solved")
	}
	if inv := eval[string](t, tb, `document.getElementById("in-left-expr").getAttribute("aria-invalid") || ""`); inv != "true" {
		t.Errorf("the bad input is not marked aria-invalid")
	}
	if got := tb.solved(t); got != n {
		t.Errorf("solves went from %d to %d on a bad formula", n, got)
	}
	if after := eval[string](t, tb, `document.getElementById("field").toDataURL()`); after != before {
		t.Errorf("the picture changed after a bad formula; the last good one must stay")
	}
	tb.shot(t, "bad-formula")
	// the same through the interface: the one-line error with its path and
	// column on the Error
	e := eval[[]any](t, tb, `(() => { const p = `+plate+`; p.edges.top.expr = "1 + 2*sinn(s)";
	  return window.edgewise.load(p).then(() => ["resolved"], e => [e.message, e.path, e.col]); })()`)
	if len(e) != 3 || e[1] != "edges.top.expr" || e[2] != float64(7) || !strings.HasPrefix(e[0].(string), "edges.top.expr: col 7: ") {
		t.Errorf("load rejected with %v, want the one-line error at edges.top.expr col 7", e)
	}
	// fixing it clears the error and solves again
	tb.pasteInto(t, "#in-left-expr", "40 + sinh(0)")
	tb.waitSolved(t, n+1)
	if eval[bool](t, tb, `!!document.querySelector("#err-left .caret")`) {
		t.Errorf("the caret error stayed after the formula was fixed")
	}
	if !eval[bool](t, tb, `document.getElementById("stale").hidden`) {
		t.Errorf("the stale mark stayed after a solve")
	}
	tb.noErrors(t)
}

// Clicking the picture pins a probe whose value, as the results table
// shows it, is the engine's value at that point.
func TestPinProbe(t *testing.T) {
	tb := newTab(t)
	tb.open(t, siteURL)
	tb.loadPlate(t)
	n := tb.solved(t)
	// a point at about 30 % across and 40 % up the rectangle, in page pixels
	pt := eval[[]float64](t, tb, `(() => {
	  const c = document.getElementById("field"), r = c.getBoundingClientRect();
	  const s = window.edgewiseInternal.last();
	  // the plot area: find it from the canvas mapping the page uses
	  return window.edgewiseParts.screenOf(0.3 * s.w, 0.4 * s.h).map((v, i) => v + (i ? r.top : r.left));
	})()`)
	// pointing shows the readout, clicking pins
	if err := chromedp.Do(tb.ctx, chromedp.Func(func(ctx context.Context, tg *chromedp.Target) error {
		_, err := cdp.Call(ctx, tg, input.DispatchMouseEvent, input.DispatchMouseEventParams{Type: input.DispatchMouseEventTypeMouseMoved, X: pt[0], Y: pt[1]})
		return err
	})); err != nil {
		t.Fatal(err)
	}
	if r := eval[string](t, tb, `document.getElementById("readout").textContent`); !strings.Contains(r, "temperature") || !strings.Contains(r, "heat flux") {
		t.Errorf("readout under the pointer %q, want temperature and heat flux", r)
	}
	if err := chromedp.Do(tb.ctx, chromedp.MouseClickXY(pt[0], pt[1])); err != nil {
		t.Fatal(err)
	}
	tb.waitSolved(t, n+1)
	tb.waitFor(t, `(() => { const c = document.querySelector("#probes tbody tr .probe-value"); return !!c && !c.textContent.startsWith("≈"); })()`, "the probe's engine value")
	shown := eval[string](t, tb, `document.querySelector("#probes tbody tr .probe-value").textContent`)
	got, err := readNumber(shown)
	if err != nil {
		t.Fatalf("probe value %q: %v", shown, err)
	}
	probe := eval[map[string]any](t, tb, `window.edgewise.project().probes[0]`)
	x, y := probe["x"].(float64), probe["y"].(float64)
	if x < 0.25*0.4 || x > 0.35*0.4 || y < 0.35*0.2 || y > 0.45*0.2 {
		t.Errorf("probe pinned at (%g, %g), want near (0.12, 0.08)", x, y)
	}
	// the engine's value at the same point, by a direct call
	want := eval[float64](t, tb, fmt.Sprintf(`(async () => {
	  const p = Object.assign(%s, {probes: [{x: %v, y: %v, label: "Q"}]});
	  const m = await window.edgewiseInternal.call("solve", JSON.stringify(p), 0, 0, 0);
	  return JSON.parse(m.value.result).probes[0].value; })()`, plate, x, y))
	// the table shows 6 significant digits: 1e-5 relative is the rounding
	if math.Abs(got-want) > 1e-5*math.Abs(want) {
		t.Errorf("pinned probe shows %q = %g, engine gives %g", shown, got, want)
	}
	// keyboard: focus the picture, move the cursor with the arrows (the
	// readout follows), press Enter to pin a second probe
	if err := chromedp.Do(tb.ctx, chromedp.Focus(chromedp.ID("field")), chromedp.KeyEvent(kb.ArrowRight)); err != nil {
		t.Fatal(err)
	}
	r1 := eval[string](t, tb, `document.getElementById("readout").textContent`)
	if err := chromedp.Do(tb.ctx, chromedp.KeyEvent(kb.ArrowUp), chromedp.KeyEvent(kb.ArrowUp)); err != nil {
		t.Fatal(err)
	}
	r2 := eval[string](t, tb, `document.getElementById("readout").textContent`)
	if r1 == r2 || !strings.Contains(r2, "temperature") {
		t.Errorf("the readout did not follow the keyboard cursor: %q then %q", r1, r2)
	}
	if err := chromedp.Do(tb.ctx, chromedp.KeyEvent(kb.Enter)); err != nil {
		t.Fatal(err)
	}
	tb.waitFor(t, `document.querySelectorAll("#probes tbody tr").length === 2`, "a second probe from the keyboard")
	tb.shot(t, "probes")
	// removing the first leaves the second, in the table and the project
	eval[bool](t, tb, `(document.querySelector('#probes button[aria-label="Remove probe P1"]').click(), true)`)
	tb.waitFor(t, `document.querySelectorAll("#probes tbody tr").length === 1`, "the probe to go")
	if l := eval[[]string](t, tb, `window.edgewise.project().probes.map(p => p.label)`); len(l) != 1 || l[0] != "P2" {
		t.Errorf("probes after removing P1: %v, want [P2]", l)
	}
	tb.noErrors(t)
}

// Switching the physics changes the labels, the units and the cautions.
func TestSwitchPhysics(t *testing.T) {
	tb := newTab(t)
	tb.open(t, siteURL)
	tb.loadPlate(t)
	label := func() string { return eval[string](t, tb, `document.getElementById("in-top-expr-label").textContent`) }
	cautions := func() []string {
		return eval[[]string](t, tb, `[...document.querySelectorAll("#cautions li")].map(li => li.textContent)`)
	}
	if l := label(); !strings.Contains(l, "Temperature") || !strings.Contains(l, "°C") {
		t.Errorf("heat label %q, want temperature in °C", l)
	}
	heat := cautions()
	// the plate reaches 90 °C: the burn caution (rule of thumb, about 60 °C)
	if len(heat) < 2 || !strings.Contains(strings.Join(heat, " "), "burn") {
		t.Errorf("heat cautions %q, want a burn caution and the deferral", heat)
	}
	n := tb.solved(t)
	// pick the option as a user's choice does: value, then a change event
	eval[bool](t, tb, `(() => { const s = document.getElementById("in-physics"); s.focus(); s.value = "electrostatic";
	  s.dispatchEvent(new Event("change", {bubbles: true})); return true; })()`)
	tb.waitSolved(t, n+1)
	if l := label(); !strings.Contains(l, "Potential") || !strings.Contains(l, "[V]") {
		t.Errorf("electrostatic label %q, want potential in V", l)
	}
	if k := eval[string](t, tb, `document.querySelector("[data-q=conductivity]").textContent`); k != "Permittivity" {
		t.Errorf("material label %q, want Permittivity", k)
	}
	elec := cautions()
	if len(elec) < 2 || !strings.Contains(elec[0], "kV/mm") {
		t.Errorf("electrostatic cautions %q, want the peak field against 3 kV/mm first", elec)
	}
	if heat[len(heat)-1] == "" || elec[len(elec)-1] != heat[len(heat)-1] || !strings.Contains(elec[len(elec)-1], "licensed") {
		t.Errorf("the last caution must be the same deferral to codes and licensed practice: %q / %q", heat[len(heat)-1], elec[len(elec)-1])
	}
	if strings.Join(heat, "|") == strings.Join(elec, "|") {
		t.Errorf("cautions did not change with the physics")
	}
	tb.shot(t, "electrostatic")
	tb.noErrors(t)
}

// The page at a laptop size and at a phone's width, for people to look at;
// at the narrow width nothing sticks out sideways.
func TestScreens(t *testing.T) {
	tb := newTab(t)
	tb.open(t, siteURL)
	// the demo, whatever an earlier tab autosaved
	n := tb.solved(t)
	eval[map[string]any](t, tb, `window.edgewiseInternal.demo().then(p => window.edgewise.load(p))`)
	tb.waitSolved(t, n+1)
	tb.shot(t, "page-1280")
	tb.fullShot(t, "page-1280-full")
	// the print view: the inputs as text, the picture, the numbers; no buttons
	if err := chromedp.Do(tb.ctx, chromedp.Func(func(ctx context.Context, tg *chromedp.Target) error {
		_, err := cdp.Call(ctx, tg, emulation.SetEmulatedMedia, emulation.SetEmulatedMediaParams{Media: "print"})
		return err
	})); err != nil {
		t.Fatal(err)
	}
	if v := eval[string](t, tb, `getComputedStyle(document.querySelector(".toolbar")).display`); v != "none" {
		t.Errorf("the picture's toolbar prints (display %q)", v)
	}
	tb.fullShot(t, "print")
	if err := chromedp.Do(tb.ctx, chromedp.Func(func(ctx context.Context, tg *chromedp.Target) error {
		_, err := cdp.Call(ctx, tg, emulation.SetEmulatedMedia, emulation.SetEmulatedMediaParams{Media: ""})
		return err
	})); err != nil {
		t.Fatal(err)
	}
	drawn := eval[int](t, tb, `Number(document.documentElement.dataset.drawn)`)
	tb.setWidth(t, 420, 900)
	tb.waitFor(t, fmt.Sprintf(`Number(document.documentElement.dataset.drawn) > %d`, drawn), "the redraw at 420 px")
	tb.shot(t, "page-420")
	tb.fullShot(t, "page-420-full")
	if w := eval[int](t, tb, `document.documentElement.scrollWidth`); w > 420 {
		t.Errorf("the page is %d px wide at a 420 px screen: something sticks out", w)
	}
	tb.noErrors(t)
}

// An edit while a long solve runs cancels it: the page shows that it is
// working, restarts the engine, and draws the newest edit, not the stale
// one.
func TestEditCancelsLongSolve(t *testing.T) {
	tb := newTab(t)
	tb.open(t, siteURL)
	tb.loadPlate(t)
	n := tb.solved(t)
	// the worker holds the next solve unanswered (a test hook), so it is
	// "a long solve in flight" however fast the engine is; short page
	// timings keep the test quick
	eval[map[string]any](t, tb, `window.edgewiseInternal.tune({busyMs: 50, cancelMs: 100})`)
	holdNextSolve(t, tb)
	eval[bool](t, tb, `(() => { const p = `+plate+`; p.edges.top.expr = "60";
	  window.slow = window.edgewise.load(p).then(() => "solved", e => e.message);
	  return true; })()`)
	tb.waitFor(t, `window.edgewiseInternal.engineState().held === 1`, "the held solve")
	tb.waitFor(t, `document.documentElement.classList.contains("busy") && /Solving/.test(document.getElementById("status").textContent)`, "the working sign")
	tb.waitFor(t, `(window.edgewiseInternal.engineState().running || 0) > 100`, "the solve to run longer than the cancel time")
	tb.pasteInto(t, "#in-top-expr", "33")
	tb.waitSolved(t, n+1)
	st := eval[map[string]any](t, tb, `window.edgewiseInternal.engineState()`)
	if r, _ := st["restarts"].(float64); r < 1 {
		t.Errorf("engine state %v: the long stale solve was not cancelled", st)
	}
	if e := eval[string](t, tb, `window.edgewiseInternal.last().project.edges.top.expr`); e != "33" {
		t.Errorf("the picture shows top edge %q, want the newest edit 33", e)
	}
	if msg := eval[string](t, tb, `window.slow`); !strings.Contains(msg, "newer edit") {
		t.Errorf("the stale load settled with %q, want a rejection naming the newer edit", msg)
	}
	if eval[bool](t, tb, `document.documentElement.classList.contains("busy")`) {
		t.Errorf("the working sign stayed after the solve")
	}
	tb.noErrors(t)
}

// holdNextSolve makes the worker hold the page's next solve unanswered
// until the worker is restarted or released (edgewiseInternal.hold).
func holdNextSolve(t *testing.T, tb *tab) {
	t.Helper()
	if !eval[bool](t, tb, `window.edgewiseInternal.hold({fn: "solve", calls: 1})`) {
		t.Fatal("the page has no hold hook")
	}
}

// A decimal comma is refused clearly, next to the field, and nothing is
// solved from a misread number.
func TestDecimalComma(t *testing.T) {
	tb := newTab(t)
	tb.open(t, siteURL)
	tb.loadPlate(t)
	n := tb.solved(t)
	tb.pasteInto(t, "#in-width", "0,3")
	tb.waitFor(t, `document.getElementById("err-width").textContent.length > 0`, "the width error")
	msg := eval[string](t, tb, `document.getElementById("err-width").textContent`)
	if !strings.Contains(msg, "0.3") || !strings.Contains(msg, "point") {
		t.Errorf("width error %q, want advice to write 0.3", msg)
	}
	if got := tb.solved(t); got != n {
		t.Errorf("a solve ran on a width of 0,3")
	}
	if w := eval[float64](t, tb, `window.edgewiseInternal.last().project.width`); w != 0.4 {
		t.Errorf("the picture's width is %g, want the last good 0.4", w)
	}
	tb.noErrors(t)
}

// The line profile samples the field between two points the user types;
// its text alternative gives the values at the ends, which match the
// engine's probes there.
func TestLineProfile(t *testing.T) {
	tb := newTab(t)
	tb.open(t, siteURL)
	tb.loadPlate(t)
	eval[bool](t, tb, `(document.getElementById("profile-box").open = true, true)`)
	for id, v := range map[string]string{"#pf-x0": "0.2", "#pf-y0": "0.02", "#pf-x1": "0.2", "#pf-y1": "0.18"} {
		tb.pasteInto(t, id, v)
		eval[bool](t, tb, `(document.activeElement.dispatchEvent(new Event("change", {bubbles: true})), true)`)
	}
	label := eval[string](t, tb, `document.getElementById("profile").getAttribute("aria-label")`)
	// "... from A (0.2, 0.02) to B (0.2, 0.18): temperature from V0 to V1, ..."
	var v0, v1 string
	if i := strings.Index(label, ": "); i >= 0 {
		f := strings.Fields(label[i+2:])
		for k := 0; k+3 < len(f); k++ {
			if f[k] == "from" {
				v0, v1 = f[k+1], strings.TrimSuffix(f[k+3], ",")
				break
			}
		}
	}
	a, err0 := readNumber(v0)
	b, err1 := readNumber(v1)
	if err0 != nil || err1 != nil {
		t.Fatalf("profile text %q: no end values", label)
	}
	want := eval[[]float64](t, tb, `(async () => {
	  const p = Object.assign(`+plate+`, {probes: [{x: 0.2, y: 0.02, label: "A"}, {x: 0.2, y: 0.18, label: "B"}]});
	  const m = await window.edgewiseInternal.call("solve", JSON.stringify(p), 0, 0, 0);
	  return JSON.parse(m.value.result).probes.map(q => q.value); })()`)
	// the profile reads the output grid by bilinear interpolation, shown to
	// 4 digits: 1e-3 relative covers both
	if math.Abs(a-want[0]) > 1e-3*math.Abs(want[0]) || math.Abs(b-want[1]) > 1e-3*math.Abs(want[1]) {
		t.Errorf("profile ends %g, %g; engine %g, %g", a, b, want[0], want[1])
	}
	// drawing the line with the mouse: press at A, drag, release at B
	eval[bool](t, tb, `(document.getElementById("btn-profile").click(), true)`)
	// the picture in view, as a user would have it (typing the ends may have scrolled it away)
	eval[bool](t, tb, `(document.getElementById("field").scrollIntoView({block: "nearest"}), true)`)
	ends := eval[[]float64](t, tb, `(() => { const r = document.getElementById("field").getBoundingClientRect();
	  const E = window.edgewiseParts, a = E.screenOf(0.1, 0.05), b = E.screenOf(0.3, 0.15);
	  return [a[0] + r.left, a[1] + r.top, b[0] + r.left, b[1] + r.top]; })()`)
	mouse := func(typ input.DispatchMouseEventType, x, y float64) {
		t.Helper()
		if err := chromedp.Do(tb.ctx, chromedp.Func(func(ctx context.Context, tg *chromedp.Target) error {
			_, err := cdp.Call(ctx, tg, input.DispatchMouseEvent, input.DispatchMouseEventParams{Type: typ, X: x, Y: y, Button: input.MouseButtonLeft, Buttons: 1, ClickCount: 1})
			return err
		})); err != nil {
			t.Fatal(err)
		}
	}
	mouse(input.DispatchMouseEventTypeMousePressed, ends[0], ends[1])
	mouse(input.DispatchMouseEventTypeMouseMoved, (ends[0]+ends[2])/2, (ends[1]+ends[3])/2)
	mouse(input.DispatchMouseEventTypeMouseMoved, ends[2], ends[3])
	mouse(input.DispatchMouseEventTypeMouseReleased, ends[2], ends[3])
	got := eval[[]float64](t, tb, `["pf-x0", "pf-y0", "pf-x1", "pf-y1"].map(id => Number(document.getElementById(id).value))`)
	// a pixel of the 0.4 m wide picture is under 1 mm: 2 mm covers rounding
	for i, want := range []float64{0.1, 0.05, 0.3, 0.15} {
		if math.Abs(got[i]-want) > 0.002 {
			t.Errorf("dragged line ends %v, want near (0.1, 0.05) to (0.3, 0.15)", got)
			break
		}
	}
	if p := eval[string](t, tb, `document.getElementById("btn-profile").getAttribute("aria-pressed")`); p != "false" {
		t.Errorf("the profile button stays pressed after the line is drawn")
	}
	if n := eval[int](t, tb, `document.querySelectorAll("#probes tbody tr").length`); n != 0 {
		t.Errorf("drawing the profile pinned %d probes", n)
	}
	eval[bool](t, tb, `(document.getElementById("opt-arrows").click(), true)`)
	tb.shot(t, "profile-arrows")
	tb.noErrors(t)
}

// The flow table shows an infinite flow as such, with the engine's reason,
// and a finite case with its balance.
func TestFlowsAndBalance(t *testing.T) {
	tb := newTab(t)
	tb.open(t, siteURL)
	tb.loadPlate(t)
	rows := func() map[string]string {
		return eval[map[string]string](t, tb, `Object.fromEntries([...document.querySelectorAll("#res-flows tr")].map(tr =>
		  [tr.querySelector("th").textContent, tr.querySelector("td").textContent]))`)
	}
	// the plate's corners join 90 to 40 and 20 to 40: every edge has a jump
	for side, text := range rows() {
		if side == "Balance" {
			if !strings.Contains(text, "not defined") {
				t.Errorf("balance %q with infinite flows, want not defined", text)
			}
			continue
		}
		if !strings.Contains(text, "infinite") || !strings.Contains(text, "jumps at a corner") {
			t.Errorf("%s edge shows %q, want infinite with the reason", side, text)
		}
	}
	// Exact identity (one-dimensional conduction, CHECKS.md): bottom at
	// 90, top at 20, both sides insulated: the flow in through the bottom
	// is k (T1 - T2) W / H = 50 * 70 * 0.4 / 0.2 = 7000 W/m, and out through
	// the top the same.
	n := tb.solved(t)
	eval[map[string]any](t, tb, `(() => { const p = `+plate+`;
	  p.edges.left = {kind: "flux", expr: "0"}; p.edges.right = {kind: "flux", expr: "0"};
	  return window.edgewise.load(p); })()`)
	tb.waitSolved(t, n+1)
	got := rows()
	for side, want := range map[string]float64{"Bottom": 7000, "Top": -7000, "Left": 0, "Right": 0} {
		v, err := readNumber(got[side])
		// shown to 5 digits; 1e-3 relative (absolute 1e-3 of 7000 for the
		// insulated edges) is the browser-test bound on engine accuracy
		if err != nil || math.Abs(v-want) > 1e-3*7000 {
			t.Errorf("%s flow shows %q, want %g", side, got[side], want)
		}
	}
	if b := got["Balance"]; strings.Contains(b, "not defined") || !strings.Contains(b, "% of the largest flow") {
		t.Errorf("balance %q, want a number against the largest flow", b)
	}
	tb.noErrors(t)
}

// The material and edge-kind controls build the project the contract
// describes: x/y conductivities, and a convection edge with h and ambient.
func TestMaterialAndEdgeKinds(t *testing.T) {
	tb := newTab(t)
	tb.open(t, siteURL)
	tb.loadPlate(t)
	n := tb.solved(t)
	eval[bool](t, tb, `(document.getElementById("in-ortho").click(), true)`)
	tb.waitSolved(t, n+1)
	tb.pasteInto(t, "#in-ky", "12.5")
	tb.waitFor(t, `JSON.stringify(window.edgewiseInternal.last().project.conductivity) === '{"x":50,"y":12.5}'`, "the x/y conductivity to solve")
	n = tb.solved(t)
	eval[bool](t, tb, `(() => { const s = document.getElementById("in-top-kind"); s.value = "convection";
	  s.dispatchEvent(new Event("change", {bubbles: true})); return true; })()`)
	if eval[bool](t, tb, `document.getElementById("in-top-h").closest(".f-conv").hidden`) {
		t.Fatalf("the convection fields stay hidden after choosing convection")
	}
	tb.pasteInto(t, "#in-top-h", "15")
	tb.pasteInto(t, "#in-top-ambient", "20 + 5*s/W")
	tb.waitFor(t, `(() => { const e = window.edgewiseInternal.last().project.edges.top;
	  return e.kind === "convection" && e.h === 15 && e.ambient === "20 + 5*s/W" && e.expr === undefined; })()`, "the convection edge to solve")
	if l := eval[string](t, tb, `document.querySelector("#edges [data-side=top] .lbl-h").textContent`); !strings.Contains(l, "W/(m²·K)") {
		t.Errorf("convection coefficient label %q, want its unit W/(m²·K)", l)
	}
	if got := tb.solved(t); got <= n {
		t.Errorf("no solve after the edge kind changed")
	}
	tb.noErrors(t)
}

// The detail choice sets the output grid: 400 intervals along the longer
// side of the 0.4 m x 0.2 m plate, 200 along the other.
func TestDetailSetsGrid(t *testing.T) {
	tb := newTab(t)
	tb.open(t, siteURL)
	tb.loadPlate(t)
	n := tb.solved(t)
	eval[bool](t, tb, `(() => { const s = document.getElementById("opt-detail"); s.value = "400";
	  s.dispatchEvent(new Event("change", {bubbles: true})); return true; })()`)
	tb.waitSolved(t, n+1)
	g := eval[[]int](t, tb, `(() => { const s = window.edgewiseInternal.last(); return [s.nx, s.ny, s.result.grid.nx, s.result.grid.ny]; })()`)
	if g[0] != 400 || g[1] != 200 || g[2] != 400 || g[3] != 200 {
		t.Errorf("grid %v after choosing fine detail, want 400 x 200", g)
	}
	tb.noErrors(t)
}

// Numbers are written for people: significant digits without trailing
// zeros, a true minus sign, powers of ten written out; round ticks.
func TestNumberFormat(t *testing.T) {
	tb := newTab(t)
	tb.open(t, siteURL)
	got := eval[[]string](t, tb, `(() => { const E = window.edgewiseParts;
	  return [E.num(1234.5678), E.num(-0.5), E.num(0.000123456, 3), E.num(2.5e7), E.num(0), E.num(Infinity), E.num(12.5, 4), E.num(17734.2, 4),
	          E.niceTicks(0, 0.3, 6).map(v => E.num(v)).join(" ")]; })()`)
	want := []string{"1235", "−0.5", "1.23×10⁻⁴", "2.5×10⁷", "0", "∞", "12.5", "17730", "0 0.05 0.1 0.15 0.2 0.25 0.3"}
	for i := range want {
		if i >= len(got) || got[i] != want[i] {
			t.Errorf("case %d: got %q, want %q", i, got, want)
			break
		}
	}
	tb.noErrors(t)
}

// Every control of the inputs, the picture and the results has a name a
// screen reader can read, and the picture has a text alternative.
func TestControlsLabelled(t *testing.T) {
	tb := newTab(t)
	tb.open(t, siteURL)
	tb.loadPlate(t)
	eval[bool](t, tb, `(window.edgewiseParts.pin(0.05, 0.02), true)`)
	tb.waitFor(t, `document.querySelectorAll("#probes tbody tr").length >= 1`, "a probe row")
	bad := eval[[]string](t, tb, `[...document.querySelectorAll("header input, #inputs input, #inputs select, .view input, .view select, .view button, .numbers button")]
	  .filter(el => !(el.labels && el.labels.length && el.labels[0].textContent.trim()) && !el.getAttribute("aria-label") && !el.textContent.trim())
	  .map(el => el.id || el.outerHTML.slice(0, 60))`)
	if len(bad) > 0 {
		t.Errorf("controls without a name: %v", bad)
	}
	if n := eval[int](t, tb, `document.querySelectorAll("#inputs input, #inputs select").length`); n < 20 {
		t.Errorf("found %d input controls; the check looks at the wrong place", n)
	}
	alt := eval[string](t, tb, `document.getElementById("field").getAttribute("aria-label")`)
	if !strings.Contains(alt, "Temperature") || !strings.Contains(alt, "°C") {
		t.Errorf("the picture's text alternative %q does not summarise the field", alt)
	}
	tb.noErrors(t)
}

// A long solve can be stopped with the button the page shows while it
// works; the last good picture stays and the next edit solves as usual.
func TestStopButton(t *testing.T) {
	// the single file restarts its engine from the bytes it carries
	bothPages(t, stopButton)
}

func stopButton(t *testing.T, url string) {
	tb := newTab(t)
	tb.open(t, url)
	tb.loadPlate(t)
	before := eval[string](t, tb, `document.getElementById("field").toDataURL()`)
	n := tb.solved(t)
	eval[map[string]any](t, tb, `window.edgewiseInternal.tune({busyMs: 50})`)
	holdNextSolve(t, tb)
	eval[bool](t, tb, `(() => { const p = `+plate+`; p.edges.top.expr = "60";
	  window.slow = window.edgewise.load(p).then(() => "solved", e => e.message);
	  return true; })()`)
	tb.waitFor(t, `window.edgewiseInternal.engineState().held === 1`, "the held solve")
	tb.waitFor(t, `!document.getElementById("btn-stop").hidden`, "the stop button")
	if err := chromedp.Do(tb.ctx, chromedp.Click(chromedp.ID("btn-stop"))); err != nil {
		t.Fatal(err)
	}
	// (evaluating the promise waits for it to settle)
	if msg := eval[string](t, tb, `window.slow`); !strings.Contains(msg, "stopped") {
		t.Errorf("the stopped load settled with %q, want a rejection saying it was stopped", msg)
	}
	if s := eval[string](t, tb, `document.getElementById("status").textContent`); !strings.HasPrefix(s, "Stopped") {
		t.Errorf("status %q after stopping", s)
	}
	if !eval[bool](t, tb, `document.getElementById("btn-stop").hidden`) {
		t.Errorf("the stop button stays after stopping")
	}
	if after := eval[string](t, tb, `document.getElementById("field").toDataURL()`); after != before {
		t.Errorf("the picture changed after stopping; the last good one must stay")
	}
	tb.pasteInto(t, "#in-top-expr", "25")
	tb.waitSolved(t, n+1)
	if e := eval[string](t, tb, `window.edgewiseInternal.last().project.edges.top.expr`); e != "25" {
		t.Errorf("after stopping, the next edit drew top edge %q, want 25", e)
	}
	tb.noErrors(t)
}
