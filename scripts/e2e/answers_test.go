package e2e

import (
	"bytes"
	"encoding/csv"
	"math"
	"strconv"
	"strings"
	"testing"
)

// The answers each trade asks for, read on the page for one example per
// physics. The engine's numbers are checked in package solver; these tests
// check that the page shows them, in the trade's terms, and that the
// inputs they need reach the engine.

// text returns the text of an element (or "" when absent).
func text(t *testing.T, tb *tab, sel string) string {
	t.Helper()
	return eval[string](t, tb, `(document.querySelector(`+strconv.Quote(sel)+`) || {}).textContent || ""`)
}

// Heat: a slab between two full-side terminals, 40 W/(m·K), 0.5 m long,
// 0.1 m thick: thermal conductance k H / W = 8 W/(m·K) and resistance
// 0.125 m·K/W exactly; the flow net has 8 channels and 40 drops; with a
// convection edge the conductance is not defined and the heat lost and
// the Biot number show.
func TestAnswersHeat(t *testing.T) {
	tb := newTab(t)
	tb.open(t, siteURL)
	tb.loadProject(t, `{"schema":"edgewise/1","title":"slab","physics":"heat","width":0.5,"height":0.1,"conductivity":40,
	  "edges":{"bottom":{"kind":"flux","expr":"0"},"top":{"kind":"flux","expr":"0"},
	  "left":{"kind":"value","expr":"100"},"right":{"kind":"value","expr":"20"}}}`)
	for sel, want := range map[string]string{
		"#ans-conductance": "8 W/(m·K)",
		"#ans-resistance":  "0.125 m·K/W",
		"#ans-net":         "8 channels, 40 drops",
		"#ans-edges [data-key=Left] td:nth-of-type(1)": "100",
		"#ans-edges [data-key=Top] td:nth-of-type(1)":  "60",
	} {
		if got := text(t, tb, sel); !strings.Contains(got, want) {
			t.Errorf("%s shows %q, want %q", sel, got, want)
		}
	}
	// the flow net on the picture: ticking it draws the net's lines
	before := eval[string](t, tb, `document.getElementById("field").toDataURL()`)
	eval[bool](t, tb, `(() => { const c = document.getElementById("opt-flownet"); c.click(); return c.checked; })()`)
	if after := eval[string](t, tb, `document.getElementById("field").toDataURL()`); after == before {
		t.Error("ticking Flow net changed nothing on the picture")
	}
	// the number of channels travels in the project
	n := tb.solved(t)
	tb.pasteInto(t, "#ans-channels", "4")
	tb.waitSolved(t, n+1)
	if got := text(t, tb, "#ans-net"); !strings.Contains(got, "4 channels, 20 drops") {
		t.Errorf("after 4 channels the net shows %q", got)
	}
	if ch := eval[float64](t, tb, `window.edgewise.project().answers.channels`); ch != 4 {
		t.Errorf("project answers.channels = %g, want 4", ch)
	}
	tb.loadProject(t, `{"schema":"edgewise/1","physics":"heat","width":0.4,"height":0.1,"conductivity":{"x":40,"y":10},
	  "edges":{"bottom":{"kind":"value","expr":"100"},"top":{"kind":"convection","h":1000,"ambient":"20"},
	  "left":{"kind":"flux","expr":"0"},"right":{"kind":"flux","expr":"0"}}}`)
	if got := text(t, tb, "#ans-conductance"); !strings.Contains(got, "convection is present (the top edge)") {
		t.Errorf("conductance shows %q", got)
	}
	// one-dimensional wall: q = 80/(0.1/10 + 1/1000) * 0.4 = 2909.09 W/m; Bi = 1000*0.1/10 = 10
	row := text(t, tb, "#ans-heat-loss [data-key='top[0]']")
	if !strings.Contains(row, "2909.1") || !strings.Contains(row, "10 (L = 0.1 m)") {
		t.Errorf("heat loss row %q, want 2909.1 W/m and Bi = 10 over L = 0.1 m", row)
	}
	tb.noErrors(t)
}

// Electrostatics: a gap 2 mm wide, 10 mm deep between full-side electrodes
// in FR-4 (εr 4.4): capacitance ε H / W; the page shows εr with ε0, the
// breakdown check names FR-4, and a new εr changes the capacitance in
// proportion.
func TestAnswersElectrostatic(t *testing.T) {
	tb := newTab(t)
	tb.open(t, siteURL)
	eps := 4.4 * 8.8541878128e-12
	tb.loadProject(t, `{"schema":"edgewise/1","physics":"electrostatic","width":0.002,"height":0.01,"conductivity":`+strconv.FormatFloat(eps, 'g', 17, 64)+`,
	  "edges":{"bottom":{"kind":"flux","expr":"0"},"top":{"kind":"flux","expr":"0"},
	  "left":{"kind":"value","expr":"1000"},"right":{"kind":"value","expr":"0"}},
	  "answers":{"dielectric":"FR-4 laminate","breakdown_strength":2e7}}`)
	if got := eval[string](t, tb, `document.getElementById("in-epsr").value`); got != "4.4" {
		t.Errorf("εr shows %q, want 4.4", got)
	}
	if got := text(t, tb, "#hint-epsr"); !strings.Contains(got, "8.8541878128") || !strings.Contains(got, "CODATA 2018") {
		t.Errorf("ε0 statement %q", got)
	}
	c := eval[float64](t, tb, `window.edgewiseInternal.last().result.conductance.per_difference`)
	if want := eps * 5; math.Abs(c-want) > 1e-9*want {
		t.Errorf("capacitance %g, want %g", c, want)
	}
	if got := text(t, tb, "#ans-conductance"); !strings.Contains(got, "F/m") {
		t.Errorf("capacitance shows %q", got)
	}
	// 1000 V over 2 mm: 0.5 kV/mm, a fortieth of FR-4's 20 kV/mm
	if got := text(t, tb, "#ans-breakdown-ratio"); !strings.Contains(got, "0.025 of 20 kV/mm") || !strings.Contains(got, "FR-4") {
		t.Errorf("breakdown shows %q", got)
	}
	if got := text(t, tb, "#ans-charge [data-key='left[0]']"); !strings.Contains(got, "1000") {
		t.Errorf("electrode row %q", got)
	}
	if got := eval[string](t, tb, `document.querySelector("figure.sigma canvas").getAttribute("aria-label")`); !strings.Contains(got, "Surface charge density along") {
		t.Errorf("surface charge plot %q", got)
	}
	cautions := text(t, tb, "#cautions")
	if !strings.Contains(cautions, "FR-4") || strings.Contains(cautions, "air") {
		t.Errorf("cautions %q should name FR-4 and not air", cautions)
	}
	n := tb.solved(t)
	tb.pasteInto(t, "#in-epsr", "2.2")
	tb.waitSolved(t, n+1)
	if c2 := eval[float64](t, tb, `window.edgewiseInternal.last().result.conductance.per_difference`); math.Abs(c2-c/2) > 1e-6*c {
		t.Errorf("εr 2.2 gives capacitance %g, want half of %g", c2, c)
	}
	tb.noErrors(t)
}

// Seepage: 40 m of ground, 10 m deep, k = 1e-5 m/s, 8 m of head across:
// discharge 2e-5 m³/s = 1.728 m³/day per metre; exit gradient 0.2; with
// γsat = 19.62 kN/m³ the critical gradient is 1 and the factor of safety 5.
func TestAnswersSeepage(t *testing.T) {
	tb := newTab(t)
	tb.open(t, siteURL)
	d := tb.catchDownloads(t)
	tb.loadProject(t, `{"schema":"edgewise/1","title":"dam","physics":"seepage","width":40,"height":10,"conductivity":1e-5,
	  "edges":{"bottom":{"kind":"flux","expr":"0"},"top":{"kind":"flux","expr":"0"},
	  "left":{"kind":"value","expr":"18"},"right":{"kind":"value","expr":"10"}}}`)
	if got := text(t, tb, "#ans-discharge"); !strings.Contains(got, "2×10⁻⁵ m³/s") || !strings.Contains(got, "1.728 m³/day") {
		t.Errorf("discharge shows %q", got)
	}
	if got := text(t, tb, "#ans-critical"); !strings.Contains(got, "common practice") {
		t.Errorf("critical gradient shows %q", got)
	}
	if got := text(t, tb, "#hint-recharge"); !strings.Contains(got, "m³ of water per m³ of ground per second") {
		t.Errorf("recharge hint %q", got)
	}
	n := tb.solved(t)
	tb.pasteInto(t, "#ans-gsat", "19.62")
	tb.waitSolved(t, n+1)
	if got := text(t, tb, "#ans-exit [data-key='right[0]']"); !strings.Contains(got, "0.2") || !strings.HasSuffix(got, "5") {
		t.Errorf("exit row %q, want gradient 0.2 and factor of safety 5", got)
	}
	// the line profile: its CSV, from the series
	eval[bool](t, tb, `(() => { document.getElementById("profile-box").open = true;
	  const v = {"pf-x0": "0", "pf-y0": "5", "pf-x1": "40", "pf-y1": "5"};
	  for (const [id, x] of Object.entries(v)) { const e = document.getElementById(id); e.value = x; e.dispatchEvent(new Event("change", {bubbles: true})); }
	  return true; })()`)
	name, data := d.click(t, tb, "#ew-dl-profile")
	rows, err := csv.NewReader(bytes.NewReader(data)).ReadAll()
	if err != nil {
		t.Fatal(err)
	}
	if name != "dam-profile.csv" || len(rows) != 102 || rows[0][3] != "hydraulic head [m]" {
		t.Fatalf("%s: %d rows, header %v", name, len(rows), rows[0])
	}
	if v, _ := strconv.ParseFloat(rows[51][3], 64); math.Abs(v-14) > 1e-6 {
		t.Errorf("head half way %v, want 14", rows[51])
	}
	tb.noErrors(t)
}

// Seepage with segments: two pools (heads 9 and 2 m from the ground
// surface, the datum typed on the page at y = 12 m) over an impervious
// floor midway between them. By symmetry the uplift is exactly
// γw ((9 + 2)/2 − 0) × 10 m = 539.55 kN/m, acting upstream of the floor's
// centre; the pressure plot is drawn; the edges CSV lists the parts.
func TestAnswersUplift(t *testing.T) {
	tb := newTab(t)
	tb.open(t, siteURL)
	d := tb.catchDownloads(t)
	tb.loadProject(t, `{"schema":"edgewise/1","title":"weir","physics":"seepage","width":40,"height":12,"conductivity":2e-5,
	  "edges":{"bottom":{"kind":"flux","expr":"0"},"left":{"kind":"flux","expr":"0"},"right":{"kind":"flux","expr":"0"},
	  "top":{"segments":[{"to":15,"kind":"value","expr":"9"},{"to":25,"kind":"flux","expr":"0"},{"kind":"value","expr":"2"}]}}}`)
	n := tb.solved(t)
	tb.pasteInto(t, "#ans-datum", "12")
	tb.waitSolved(t, n+1)
	got := text(t, tb, "#ans-uplift-top1")
	// shown to 4 digits: 539.55 may round either way
	force, err := readNumber(strings.Fields(strings.TrimPrefix(got, "Uplift under top[1]"))[0])
	if err != nil || math.Abs(force-539.55) > 0.051 || !strings.Contains(got, "kN/m") || !strings.Contains(got, "upward") {
		t.Errorf("uplift shows %q, want 539.55 kN/m upward (to the 4 digits shown)", got)
	}
	// the discharge enters at one pool and leaves at the other, both on the
	// top edge: 8.1e-5 m³/s per metre, not the edge's net flow (0)
	if got := text(t, tb, "#ans-discharge"); !strings.Contains(got, "8.101×10⁻⁵ m³/s") {
		t.Errorf("discharge shows %q, want 8.101×10⁻⁵ m³/s", got)
	}
	if got := eval[string](t, tb, `document.querySelector("#ans-edges tbody tr").lastChild.textContent`); got != "0" {
		t.Errorf("the top edge's mean flux shows %q, want 0 (its net flow is rounding noise)", got)
	}
	x := eval[float64](t, tb, `window.edgewiseInternal.last().result.answers.seepage.uplift[0].line`)
	if !(x > 15 && x < 20) {
		t.Errorf("line of action x = %g, want upstream of the centre 20", x)
	}
	if label := eval[string](t, tb, `document.getElementById("ans-pressure-top1").getAttribute("aria-label")`); !strings.Contains(label, "Pore pressure under top[1]") {
		t.Errorf("pressure plot label %q", label)
	}
	name, data := d.click(t, tb, "#ew-dl-edges")
	rows, err := csv.NewReader(bytes.NewReader(data)).ReadAll()
	if err != nil {
		t.Fatal(err)
	}
	if name != "weir-edges.csv" || len(rows) != 1+1+1+3+1 || rows[0][0] != "edge" {
		t.Fatalf("%s: %q", name, rows)
	}
	tb.noErrors(t)
}
