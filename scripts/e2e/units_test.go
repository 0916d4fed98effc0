package e2e

import (
	"encoding/json"
	"math"
	"strconv"
	"strings"
	"testing"

	"edgewise/solver/project"
	"edgewise/solver/report"

	"github.com/chromedp/chromedp"
)

// a heat project with a probe, for the display units
const unitsPlate = `{schema: "edgewise/1", title: "units plate", physics: "heat", width: 0.4, height: 0.2,
  conductivity: 50, source: 0,
  edges: {bottom: {kind: "value", expr: "90"}, top: {kind: "convection", h: 15, ambient: "20"},
          left: {kind: "flux", expr: "0"}, right: {kind: "value", expr: "40"}},
  probes: [{x: 0.1, y: 0.1, label: "P1"}], grid: {nx: 40, ny: 20}}`

// chooseUnit picks a display unit in the panel as a user does (the
// select's input event) and waits for the solve it brings.
func (tb *tab) chooseUnit(t *testing.T, kind, unit string) {
	t.Helper()
	n := tb.solved(t)
	eval[bool](t, tb, `(() => { const s = document.getElementById("du-`+kind+`"); s.value = `+strconv.Quote(unit)+`;
	  s.dispatchEvent(new Event("input", {bubbles: true})); s.dispatchEvent(new Event("change", {bubbles: true})); return s.value === `+strconv.Quote(unit)+`; })()`)
	tb.waitSolved(t, n+1)
}

func shownNumber(t *testing.T, tb *tab, js string) float64 {
	t.Helper()
	s := eval[string](t, tb, js)
	f, err := readNumber(strings.Fields(s)[0])
	if err != nil {
		t.Fatalf("%s: %q is not a number: %v", js, s, err)
	}
	return f
}

func near(a, b, rel float64) bool { return math.Abs(a-b) <= rel*math.Max(math.Abs(a), math.Abs(b)) }

// Number fields read a number with a unit and say what they understood;
// the project stays SI and keeps the choice of display units.
func TestUnitsTypedIntoFields(t *testing.T) {
	tb := newTab(t)
	tb.open(t, siteURL)
	tb.loadProject(t, unitsPlate)
	eval[bool](t, tb, `(window.edgewiseInternal.tune({pauseMs: 200}), true)`)

	// lengths in mm: the field shows 400 for the file's 0.4
	tb.chooseUnit(t, "length", "mm")
	if v := eval[string](t, tb, `document.getElementById("in-width").value`); v != "400" {
		t.Errorf("width field %q in mm, want 400", v)
	}
	if u := eval[string](t, tb, `document.querySelector('[data-unit="length"]').textContent`); u != "[mm]" {
		t.Errorf("width unit %q, want [mm]", u)
	}

	n := tb.solved(t)
	tb.typeInto(t, "#in-width", "200 mm")
	tb.waitSolved(t, n+1)
	tb.until(t, `window.edgewiseInternal.good().width === 0.2`, "the meant project to have width 0.2")
	if got := eval[string](t, tb, `document.getElementById("in-width").value`); got != "200 mm" {
		t.Errorf("the field holds %q, want the text as typed", got)
	}
	if note := eval[string](t, tb, `document.querySelector("#in-width").nextElementSibling.textContent`); note != "= 0.2 m" {
		t.Errorf("understood %q, want \"= 0.2 m\"", note)
	}
	tb.shot(t, "units-typed")
	// inches (exact: 0.0254 m) and an expression of constants
	n = tb.solved(t)
	tb.typeInto(t, "#in-width", "10 in")
	tb.waitSolved(t, n+1)
	tb.until(t, `Math.abs(window.edgewiseInternal.good().width - 0.254) < 1e-12`, "width 10 in = 0.254 m")
	n = tb.solved(t)
	tb.typeInto(t, "#in-k", "2*25")
	tb.waitSolved(t, n+1)
	tb.until(t, `window.edgewiseInternal.good().conductivity === "2*25"`, "an SI expression kept as written")
	// a temperature with its unit in a formula field becomes the SI number
	n = tb.solved(t)
	tb.typeInto(t, "#in-bottom-expr", "194 °F")
	tb.waitSolved(t, n+1)
	tb.until(t, `window.edgewiseInternal.good().edges.bottom.expr === "90"`, "194 °F read as 90 °C")

	// a unit the field cannot have: one line naming the field, the text kept
	tb.pasteInto(t, "#in-height", "200 kg")
	tb.until(t, `[...document.querySelectorAll(".err-msg")].some(e => /unknown unit/.test(e.textContent))`, "the unit error")
	msg := eval[string](t, tb, `[...document.querySelectorAll(".err-msg")].map(e => e.textContent).join(" | ")`)
	if !strings.Contains(msg, "Height") || !strings.Contains(msg, `unknown unit "kg"`) {
		t.Errorf("error %q, want it to name Height and the unit", msg)
	}
	if got := eval[string](t, tb, `document.getElementById("in-height").value`); got != "200 kg" {
		t.Errorf("the field holds %q after an error, want the text as typed", got)
	}
	n = tb.solved(t)
	tb.typeInto(t, "#in-height", "100")
	tb.waitSolved(t, n+1)
	tb.until(t, `window.edgewiseInternal.good().height === 0.1`, "100 (mm) read as 0.1 m")
	if d := eval[map[string]any](t, tb, `window.edgewiseInternal.good().display`); d["length"] != "mm" {
		t.Errorf("display %v, want length mm kept in the project", d)
	}
	tb.noErrors(t)
}

// In °F a temperature is 9/5 T + 32 of the engine's SI result and a
// difference 9/5 of it; the choice survives a reload and the share link.
func TestUnitsFahrenheitPersist(t *testing.T) {
	tb := newTab(t)
	tb.open(t, siteURL)
	tb.loadProject(t, unitsPlate)
	eval[bool](t, tb, `(window.edgewiseInternal.tune({pauseMs: 200}), true)`)
	tb.chooseUnit(t, "temperature", "degF")
	r := eval[map[string]any](t, tb, `window.edgewiseInternal.last().result`)
	maxC := r["max"].(map[string]any)["value"].(float64)
	est := r["accuracy"].(map[string]any)["estimate"].(float64)
	probeC := r["probes"].([]any)[0].(map[string]any)["value"].(float64)

	shownMax := shownNumber(t, tb, `document.getElementById("res-max").firstChild.textContent`)
	if !strings.Contains(eval[string](t, tb, `document.getElementById("res-max").firstChild.textContent`), "°F") {
		t.Errorf("highest temperature not in °F")
	}
	if !near(shownMax, 1.8*maxC+32, 1e-4) {
		t.Errorf("highest %g °F, want 9/5 × %g + 32 = %g", shownMax, maxC, 1.8*maxC+32)
	}
	shownProbe := shownNumber(t, tb, `document.querySelector("#probes .probe-value").textContent`)
	if !near(shownProbe, 1.8*probeC+32, 1e-5) {
		t.Errorf("probe %g °F, want %g", shownProbe, 1.8*probeC+32)
	}
	// the error estimate is a difference: 9/5 of the SI one, no offset
	estText := eval[string](t, tb, `[...document.querySelectorAll("#results dt")].find(d => d.textContent === "Error estimate").nextElementSibling.textContent`)
	shownEst, err := readNumber(strings.Fields(estText)[0])
	if err != nil || !strings.Contains(estText, "°F") || !near(shownEst, 1.8*est, 0.05) {
		t.Errorf("error estimate %q, want 9/5 × %g = %g °F", estText, est, 1.8*est)
	}
	// so is every number of the accuracy statement
	if st := eval[string](t, tb, `document.getElementById("res-accuracy").textContent`); !strings.Contains(st, "good to "+strings.Fields(estText)[0]+" °F") {
		t.Errorf("accuracy statement %q, want the estimate %q °F in it", st, strings.Fields(estText)[0])
	}
	if h := eval[string](t, tb, `document.getElementById("probe-head-v").textContent`); !strings.Contains(h, "°F") {
		t.Errorf("probe heading %q, want °F", h)
	}

	// the report's tables follow the choice and agree with the page
	if err := chromedp.Do(tb.ctx, chromedp.Click(chromedp.CSS("#ew-report-btn"))); err != nil {
		t.Fatal(err)
	}
	tb.until(t, `!!document.querySelector("#ew-report table")`, "the report")
	repMax := shownNumber(t, tb, `[...document.querySelectorAll("#ew-report tr")].find(r => r.firstChild.textContent === "maximum").children[1].textContent`)
	if !near(repMax, 1.8*maxC+32, 1e-5) {
		t.Errorf("report maximum %g °F, want %g", repMax, 1.8*maxC+32)
	}
	if !eval[bool](t, tb, `[...document.querySelectorAll("#ew-report th")].some(h => h.textContent === "temperature [°F]")`) {
		t.Errorf("the report's extremes are not headed in °F")
	}
	eval[bool](t, tb, `(document.getElementById("ew-report-close").click(), true)`)

	// the choice is saved with the project: autosave (reload) and link
	tb.until(t, `(window.edgewiseInternal.good().display || {}).temperature === "degF"`, "the choice in the meant project")
	want := eval[map[string]any](t, tb, `window.edgewiseInternal.good()`)
	if err := chromedp.Do(tb.ctx, chromedp.Reload()); err != nil {
		t.Fatal(err)
	}
	tb.waitSolved(t, 1)
	if got := eval[string](t, tb, `document.getElementById("du-temperature").value`); got != "degF" {
		t.Errorf("after reload the temperature unit is %q, want degF", got)
	}
	if !strings.Contains(eval[string](t, tb, `document.getElementById("res-max").firstChild.textContent`), "°F") {
		t.Errorf("after reload the results are not in °F")
	}
	link := tb.shareLink(t)
	fresh := newTab(t)
	fresh.open(t, link)
	got := eval[map[string]any](t, fresh, `window.edgewise.project()`)
	if d, _ := got["display"].(map[string]any); d["temperature"] != "degF" || got["width"] != want["width"] {
		t.Errorf("project from the link %v, want display degF and width %v (the page's notice: %q, link error %q)", got, want["width"],
			eval[string](t, fresh, `(document.getElementById("ew-notice") || {}).textContent || ""`), eval[string](t, fresh, `document.documentElement.dataset.linkError || ""`))
	}
	if !strings.Contains(eval[string](t, fresh, `document.getElementById("res-max").firstChild.textContent`), "°F") {
		t.Errorf("from the link the results are not in °F")
	}
	tb.noErrors(t)
	fresh.noErrors(t)
}

// The conversion factors and the reading of typed units, against values
// printed in NIST SP 811 (2008), Appendix B.9 (from memory), and exact
// identities (212 °F = 100 °C, 1 in = 25.4 mm).
func TestUnitFactors(t *testing.T) {
	tb := newTab(t)
	tb.open(t, siteURL)
	tb.loadProject(t, strings.Replace(unitsPlate, `grid:`, `display: {length: "in", temperature: "degF", heat: "BTU/h"}, grid:`, 1))
	got := eval[map[string]float64](t, tb, `(() => { const EW = window.edgewiseParts, u = EW.unitsets.heat;
	  const per = (role) => 1 / EW.conv(u, role).scale; // SI per shown unit
	  return {k: per("conductivity"), h: per("coefficient"), q: per("flux"), flow: per("flow"), grad: per("gradient"),
	    t212: EW.dv(u, "value", 100), d: EW.dd(u, "value", 1), len: per("length")}; })()`)
	for _, c := range []struct {
		name      string
		got, want float64
		rel       float64 // NIST prints 7 digits
	}{
		{"Btu_IT/(h·ft·°F) in W/(m·K)", got["k"], 1.730735, 1e-6},
		{"Btu_IT/(h·ft²·°F) in W/(m²·K)", got["h"], 5.678263, 1e-6},
		{"Btu_IT/(h·ft²) in W/m²", got["q"], 3.154591, 1e-6},
		{"Btu_IT/(h·ft) in W/m (0.2930711 W / 0.3048 m)", got["flow"], 0.2930711 / 0.3048, 1e-6},
		{"°F/in in K/m (exact)", got["grad"], 1 / (1.8 * 0.0254), 1e-12},
		{"100 °C in °F (exact)", got["t212"], 212, 1e-12},
		{"a difference of 1 K in °F (exact)", got["d"], 1.8, 1e-12},
		{"1 in in m (exact)", got["len"], 0.0254, 1e-12},
	} {
		if !near(c.got, c.want, c.rel) {
			t.Errorf("%s: %.9g, want %.9g", c.name, c.got, c.want)
		}
	}
	// what number fields understand, for each physics
	read := eval[[]any](t, tb, `(() => { const EW = window.edgewiseParts, U = EW.unitsets;
	  const r = (text, phys, role, formula) => { const x = EW.understand(text, U[phys], role, formula); return x.err ? "error: " + x.err : x.v; };
	  return [r("200 mm", "heat", "length"), r("1.5 in", "heat", "length"), r("2", "heat", "length"),
	    r("68 °F", "heat", "value", true), r("293.15 K", "heat", "value", true), r("20 + 5*s", "heat", "value", true),
	    r("10 W/(m*K)", "heat", "conductivity"), r("4.4*8.854e-12", "electrostatic", "conductivity"),
	    r("3 m/day", "seepage", "conductivity"), r("0,3", "heat", "length"), r("2 kg", "heat", "length"), r("2*", "heat", "length"),
	    r("exp(1)", "heat", "length").slice(0, 60), r("0,3 mm", "heat", "length"), r("sqrt(2)*100 mm", "heat", "length")]; })()`)
	// an expression in an SI field is kept as written (the engine works it out)
	want := []any{0.2, 0.0381, 0.0508, "20", "20", "20 + 5*s", 10.0, "4.4*8.854e-12", 3 / 86400.0,
		"error: use a point for decimals: 0.3, not 0,3", `error: unknown unit "kg" here (use m, mm, cm, in, ft)`, `error: not a number: "2*"`,
		// a function the page does not read would be the engine's, in SI: refused while lengths are in inches
		"error: shown in in, this field reads numbers, units, + - * /", "error: use a point for decimals: 0.3 mm, not 0,3 mm", math.Sqrt(2) * 0.1}
	for i, w := range want {
		if i >= len(read) {
			t.Fatalf("read %v", read)
		}
		g := read[i]
		if wf, ok := w.(float64); ok {
			if gf, ok := g.(float64); !ok || !near(gf, wf, 1e-12) {
				t.Errorf("reading %d: %v, want %v", i, g, w)
			}
		} else if g != w {
			t.Errorf("reading %d: %v, want %v", i, g, w)
		}
	}
	// the fields show 15.7480314961 in and 28.8894658271 Btu/(h·ft·°F), and read back as the file's exact numbers
	if back := eval[map[string]any](t, tb, `window.edgewiseParts.read().project`); back["width"] != 0.4 || back["height"] != 0.2 || back["conductivity"] != 50.0 {
		t.Errorf("read back %v %v %v, want the loaded 0.4, 0.2 and 50 exactly", back["width"], back["height"], back["conductivity"])
	}
	tb.shot(t, "units-panel")
	tb.noErrors(t)
}

// A switch of physics shows the number fields' text under the new
// physics' units: the project then holds what the fields show, not the
// numbers filled in for the old physics; lengths stay exact.
func TestUnitsAcrossPhysicsSwitch(t *testing.T) {
	tb := newTab(t)
	tb.open(t, siteURL)
	tb.loadProject(t, strings.Replace(unitsPlate, `grid:`, `display: {length: "in", heat: "BTU/h"}, grid:`, 1))
	k := eval[string](t, tb, `document.getElementById("in-k").value`)
	eval[bool](t, tb, `(() => { const s = document.getElementById("in-physics"); s.value = "electrostatic";
	  s.dispatchEvent(new Event("change", {bubbles: true})); return true; })()`)
	p := eval[map[string]any](t, tb, `window.edgewiseParts.read().project`)
	kf, _ := strconv.ParseFloat(k, 64)
	if p["width"] != 0.4 || p["conductivity"] != kf {
		t.Errorf("after the switch: width %v (want 0.4), permittivity %v (want the field's %v F/m)", p["width"], p["conductivity"], kf)
	}
	if u := eval[string](t, tb, `document.querySelector('[data-unit="cond"]').textContent`); u != "[F/m]" {
		t.Errorf("permittivity unit %q", u)
	}
	if h := eval[bool](t, tb, `document.getElementById("du-heat").closest("label").hidden && !document.getElementById("du-field").closest("label").hidden`); !h {
		t.Errorf("the panel offers heat's kinds for electrostatics")
	}
	tb.noErrors(t)
}

// The page's table of display units (site/measure.js) and the report's
// (solver/report/shown.go) agree for every physics, kind, unit and role.
func TestUnitTablesAgree(t *testing.T) {
	tb := newTab(t)
	tb.open(t, siteURL)
	roles := []string{"value", "gradient", "conductivity", "flux", "flow", "source", "coefficient", "length"}
	n := 0
	for _, phys := range []string{"heat", "electrostatic", "seepage", "generic"} {
		for _, k := range project.DisplayKinds {
			for _, name := range k.Units {
				d := project.Display{k.Kind: name}
				if k.Kind == "temperature" {
					d["heat"] = "BTU/h" // the Btu units with each temperature choice
				}
				dj, _ := json.Marshal(d)
				for _, role := range roles {
					got := eval[map[string]any](t, tb, `window.edgewiseParts.convWith(window.edgewiseParts.unitsets[`+strconv.Quote(phys)+`], `+
						strconv.Quote(role)+`, `+string(dj)+`)`)
					unit, scale, offset := report.Shown(phys, d, role)
					if got["unit"] != unit || !near(got["scale"].(float64), scale, 1e-15) || got["offset"].(float64) != offset {
						t.Errorf("%s %s %v: page %v, report %q %g %g", phys, role, d, got, unit, scale, offset)
					}
					n++
				}
			}
		}
	}
	t.Logf("%d conversions compared", n)
	tb.noErrors(t)
}
