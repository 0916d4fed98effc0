package e2e

import (
	"math"
	"strconv"
	"strings"
	"testing"
)

// pictureBoxes returns the page's isoline label boxes and probe boxes.
func pictureBoxes(t *testing.T, tb *tab) (labels, probes [][4]float64) {
	t.Helper()
	got := eval[map[string][][4]float64](t, tb, `(() => { const b = window.edgewiseParts.pictureBoxes();
	  const q = (r) => [r.x, r.y, r.w, r.h]; return {labels: b.labels.map(q), probes: b.probes.map(q)}; })()`)
	return got["labels"], got["probes"]
}

// The picture's own look: the engine's maps are "fen" and "watershed";
// isoline labels are upright tags, a paper-coloured box around the number
// (the pixels just inside each box's edge are paper, whatever the field's
// colour there), and the colour bar's ends sit in the same tags.
func TestOwnLook(t *testing.T) {
	tb := newTab(t)
	tb.open(t, siteURL)
	tb.loadPlate(t)
	names := eval[map[string]string](t, tb, `window.edgewiseParts.colours.names`)
	if names["sequential"] != "fen" || names["diverging"] != "watershed" {
		t.Errorf("map names %v, want fen and watershed", names)
	}
	if m := eval[string](t, tb, `window.edgewiseInternal.last().result.colour.map`); m != "fen" {
		t.Errorf("the plate's colours are %q, want fen", m)
	}
	labels, _ := pictureBoxes(t, tb)
	if len(labels) < 3 {
		t.Fatalf("%d isoline labels, want at least 3", len(labels))
	}
	// inside each tag, 2 px in from its left edge at mid height: paper
	paper := eval[[][3]int](t, tb, `(() => { const c = document.getElementById("field");
	  const k = c.width / c.getBoundingClientRect().width;
	  return window.edgewiseParts.pictureBoxes().labels.map(r => {
	    const d = c.getContext("2d").getImageData(Math.round((r.x + 3 + 3) * k), Math.round((r.y + r.h / 2) * k), 1, 1).data;
	    return [d[0], d[1], d[2]]; }); })()`)
	for i, p := range paper {
		if p[0] < 228 || p[1] < 228 || p[2] < 225 { // paper at 0.93 over the darkest field colour
			t.Errorf("label %d: pixel inside its tag is %v, want the paper colour of the tag", i, p)
		}
	}
	tb.noErrors(t)
}

// TestLookScreens saves screenshots for people to look at: every physics
// with its example, both maps, and a thin plate stretched.
func TestLookScreens(t *testing.T) {
	tb := newTab(t)
	tb.open(t, siteURL)
	tb.loadPlate(t)
	tb.shot(t, "look-plate")
	n := tb.solved(t)
	eval[map[string]any](t, tb, `window.edgewise.load(`+strings.Replace(plate, `expr: "90"`, `expr: "-60"`, 1)+`)`)
	tb.waitSolved(t, n+1)
	tb.shot(t, "look-signed")
	tb.noErrors(t)
}

// switchPhysics picks a physics as a user does and waits for the solve.
func (tb *tab) switchPhysics(t *testing.T, id string) {
	t.Helper()
	n := tb.solved(t)
	eval[bool](t, tb, `(() => { const s = document.getElementById("in-physics"); s.value = `+strconv.Quote(id)+`;
	  s.dispatchEvent(new Event("change", {bubbles: true})); return true; })()`)
	tb.waitSolved(t, n+1)
}

// Switching physics keeps every number, warns about the ones far from the
// new physics' usual span, and offers that physics' example; opening the
// example keeps the user's project, and "Back to my project" restores it.
func TestSwitchPhysicsOffersExample(t *testing.T) {
	tb := newTab(t)
	tb.open(t, siteURL)
	n := tb.solved(t)
	eval[map[string]any](t, tb, `window.edgewiseInternal.demo().then(p => window.edgewise.load(p))`)
	tb.waitSolved(t, n+1)
	if !eval[bool](t, tb, `document.getElementById("physics-offer").hidden && document.getElementById("plausible").children.length === 0`) {
		t.Errorf("the steel demo in heat shows an offer or a warning")
	}
	tb.switchPhysics(t, "electrostatic")
	if k := eval[string](t, tb, `document.getElementById("in-k").value`); k != "15" {
		t.Errorf("the permittivity field reads %q after the switch, want the user's 15", k)
	}
	warn := eval[string](t, tb, `document.getElementById("plausible").textContent`)
	if !strings.Contains(warn, "Permittivity 15 F/m is far above the usual") {
		t.Errorf("plausibility warning %q, want one about permittivity 15 F/m", warn)
	}
	offer := eval[string](t, tb, `document.getElementById("physics-offer").hidden ? "" : document.getElementById("physics-offer").textContent`)
	if !strings.Contains(offer, "Your numbers are kept") || !strings.Contains(offer, "Open the example") {
		t.Fatalf("offer %q", offer)
	}
	tb.shot(t, "look-switch-offer")
	n = tb.solved(t)
	eval[bool](t, tb, `(document.getElementById("offer-example").click(), true)`)
	tb.waitSolved(t, n+1)
	p := eval[map[string]any](t, tb, `window.edgewise.project()`)
	if p["physics"] != "electrostatic" || !strings.Contains(p["title"].(string), "example") || p["conductivity"] != 8.854e-12 {
		t.Errorf("after opening the example the project is %v", p)
	}
	if w := eval[int](t, tb, `document.getElementById("plausible").children.length`); w != 0 {
		t.Errorf("the example trips %d plausibility warnings", w)
	}
	tb.shot(t, "look-electrostatic-example")
	n = tb.solved(t)
	eval[bool](t, tb, `(document.getElementById("offer-back").click(), true)`)
	tb.waitSolved(t, n+1)
	p = eval[map[string]any](t, tb, `window.edgewise.project()`)
	if p["physics"] != "heat" || p["conductivity"] != 15.0 || !strings.Contains(p["title"].(string), "Steel") {
		t.Errorf("back to my project gives %v", p)
	}
	if !eval[bool](t, tb, `document.getElementById("physics-offer").hidden`) {
		t.Errorf("the offer stays after going back")
	}
	// seepage has its own example too
	tb.switchPhysics(t, "seepage")
	n = tb.solved(t)
	eval[bool](t, tb, `(document.getElementById("offer-example").click(), true)`)
	tb.waitSolved(t, n+1)
	if ph := eval[string](t, tb, `window.edgewise.project().physics`); ph != "seepage" {
		t.Errorf("the seepage example has physics %q", ph)
	}
	tb.shot(t, "look-seepage-example")
	tb.noErrors(t)
}

// Edge previews follow the newest formula however fast the edits come:
// the width changes and the right edge's formula becomes 100 + k (a pass
// that redraws all four previews), then the formula becomes k, with 13
// different gaps between the two edits, longer than the page's 120 ms
// preview delay and shorter than a solve on the finest grid, so that the
// first pass is still waiting behind the solve when the second starts;
// each time the preview must end on k. Before the passes carried a
// sequence number the two passes took turns through the edges and, in
// about half of these runs, the older one drew 100 + k after the newer one
// had drawn k.
func TestPreviewsFollowFastEdits(t *testing.T) {
	tb := newTab(t)
	tb.open(t, siteURL)
	tb.loadPlate(t)
	n := tb.solved(t)
	eval[bool](t, tb, `(() => { const s = document.getElementById("opt-detail"); s.value = "800";
	  s.dispatchEvent(new Event("change", {bubbles: true})); return true; })()`)
	tb.waitSolved(t, n+1)
	set := `((v, w) => { const i = document.getElementById("in-right-expr"); i.value = v;
	  if (w) document.getElementById("in-width").value = w;
	  i.dispatchEvent(new Event("input", {bubbles: true})); return true; })`
	label := `document.getElementById("pv-right").getAttribute("aria-label")`
	for run, gap := range []int{130, 140, 150, 160, 170, 180, 190, 200, 210, 220, 230, 240, 250} {
		want := ": from " + strconv.Itoa(run) + " to " + strconv.Itoa(run) + " (constant)"
		eval[bool](t, tb, set+`("`+strconv.Itoa(100+run)+`", "`+[]string{"0.4", "0.5"}[run%2]+`")`)
		eval[bool](t, tb, `new Promise(r => setTimeout(() => r(true), `+strconv.Itoa(gap)+`))`)
		eval[bool](t, tb, set+`("`+strconv.Itoa(run)+`")`)
		// the preview must come to k (within 15 s: the previews wait behind
		// the solves) and stay there when every pass is done
		ok := eval[bool](t, tb, `new Promise(r => { const t0 = performance.now(); const poll = () => {
		  if ((`+label+` || "").endsWith(`+strconv.Quote(want)+`)) r(true); else if (performance.now() - t0 > 15000) r(false); else setTimeout(poll, 20); }; poll(); })`)
		eval[bool](t, tb, `new Promise(r => setTimeout(() => r(true), 500))`)
		if got := eval[string](t, tb, label); !ok || !strings.HasSuffix(got, want) {
			t.Errorf("run %d (gap %d ms): the right edge's formula is %d, its preview says %q", run, gap, run, got)
		}
	}
	tb.noErrors(t)
}

// Errors on the page name what is on screen, in the physics' own words,
// and mark the field: a bad formula on the demo's insulated left edge is
// "Left edge, heat flux in: col 5: ..." beside the field and in the status
// line; a number that is not one is "Width: ..."; a probe outside the
// rectangle names the probe and marks its row. The interface keeps the
// JSON path.
func TestErrorsNameWhatIsOnScreen(t *testing.T) {
	tb := newTab(t)
	tb.open(t, siteURL)
	n := tb.solved(t)
	eval[map[string]any](t, tb, `window.edgewiseInternal.demo().then(p => window.edgewise.load(p))`)
	tb.waitSolved(t, n+1)
	tb.pasteInto(t, "#in-left-expr", "0 + sinn(s)")
	tb.waitFor(t, `!!document.querySelector("#err-left .err-msg")`, "the error under the left edge")
	msg := eval[string](t, tb, `document.querySelector("#err-left .err-msg").textContent`)
	if !strings.HasPrefix(msg, "Left edge, heat flux in: col 5: unknown name") {
		t.Errorf("error beside the field %q, want it to start with the on-screen name", msg)
	}
	status := eval[string](t, tb, `document.getElementById("status").textContent`)
	if !strings.Contains(status, "Left edge, heat flux in: col 5") || strings.Contains(status, "edges.") {
		t.Errorf("status %q, want the on-screen name and no JSON path", status)
	}
	if eval[string](t, tb, `document.getElementById("in-left-expr").getAttribute("aria-invalid") || ""`) != "true" {
		t.Errorf("the bad formula is not marked")
	}
	tb.shot(t, "look-error-names")
	tb.pasteInto(t, "#in-left-expr", "0")
	tb.waitFor(t, `!document.querySelector("#err-left .err-msg")`, "the error to clear")
	tb.typeInto(t, "#in-width", "0.2x")
	tb.waitFor(t, `!!document.querySelector("#err-width .err-msg")`, "the width error")
	if msg := eval[string](t, tb, `document.querySelector("#err-width .err-msg").textContent`); !strings.HasPrefix(msg, "Width: ") {
		t.Errorf("width error %q, want it to start with Width:", msg)
	}
	tb.typeInto(t, "#in-width", "0.2")
	// the probe T1 at y = 0.05: a height of 0.03 leaves it outside; the
	// page keeps solving, names the probe as on screen and marks its row
	tb.typeInto(t, "#in-height", "0.03")
	tb.waitFor(t, `document.getElementById("status").textContent.includes("Probe ")`, "the probe notice")
	status = eval[string](t, tb, `document.getElementById("status").textContent`)
	if !strings.Contains(status, "Probe T1") || strings.Contains(status, "probes[") {
		t.Errorf("status %q, want the probe named as on screen", status)
	}
	if !eval[bool](t, tb, `!!document.querySelector("#probes tbody tr.outside[data-label='T1']")`) {
		t.Errorf("the probe's row is not marked")
	}
	// the interface keeps the path
	tb.typeInto(t, "#in-height", "0.05")
	e := eval[string](t, tb, `(() => { const p = window.edgewise.project(); p.edges.left.expr = "sinn(s)";
	  return window.edgewise.load(p).then(() => "resolved", e => e.message); })()`)
	if !strings.HasPrefix(e, "edges.left.expr: col 1: ") {
		t.Errorf("load rejected with %q, want the JSON path", e)
	}
	tb.noErrors(t)
}

// loadExample loads one physics' example project from the table.
func (tb *tab) loadExample(t *testing.T, id string) {
	t.Helper()
	n := tb.solved(t)
	eval[map[string]any](t, tb, `window.edgewise.load(window.edgewiseParts.physicsOf(`+strconv.Quote(id)+`).example)`)
	tb.waitSolved(t, n+1)
}

// Numbers below the accuracy of the solve show as 0: the electrode gap's
// lowest potential (about -8e-5 V from the series, error estimate about
// 2e-3 V) and the levee's impermeable bottom (a flow of about 1e-21 m²/s
// against flows of 1e-4) and balance. Values keep only the digits the
// accuracy supports. A colour bar over a tiny range writes its power of
// ten once, beside the unit, so that no label is cut off.
func TestRoundingNoiseShowsAsZero(t *testing.T) {
	tb := newTab(t)
	tb.open(t, siteURL)
	tb.loadExample(t, "electrostatic")
	if m := eval[float64](t, tb, `window.edgewiseInternal.last().result.min.value`); m == 0 || m < -1e-3 {
		t.Fatalf("the example's lowest potential is %g: the test needs a small noisy one", m)
	}
	if low := eval[string](t, tb, `document.getElementById("res-min").firstChild.textContent`); low != "0 V" {
		t.Errorf("lowest potential shows %q, want 0 V", low)
	}
	tb.loadExample(t, "seepage")
	if f := eval[float64](t, tb, `window.edgewiseInternal.last().result.edges.bottom.flow`); f == 0 {
		t.Fatalf("the levee's bottom flow is exactly 0: the test needs a noisy one")
	}
	flows := eval[map[string]string](t, tb, `Object.fromEntries([...document.querySelectorAll("#res-flows tr")].map(tr => [tr.cells[0].textContent, tr.cells[1].textContent]))`)
	if flows["Bottom"] != "0" || !strings.HasPrefix(flows["Balance"], "0") {
		t.Errorf("flows %v, want Bottom and Balance 0", flows)
	}
	n := tb.solved(t)
	eval[map[string]any](t, tb, `window.edgewise.load({schema: "edgewise/1", physics: "electrostatic", width: 0.01, height: 0.01,
	  conductivity: 8.854e-12, edges: {bottom: {kind: "value", expr: "0"}, top: {kind: "value", expr: "5.8776e-11"},
	  left: {kind: "flux", expr: "0"}, right: {kind: "flux", expr: "0"}}})`)
	tb.waitSolved(t, n+1)
	if p := eval[string](t, tb, `document.getElementById("legend").dataset.power`); p != "-11" {
		t.Errorf("the colour bar factors out 10^%s, want 10^-11", p)
	}
	tb.shot(t, "look-tiny-range")
	tb.noErrors(t)
}

// The probes table says what it shows: the gradient column is headed as a
// magnitude, the flux shows its components qx, qy, and a probe on an edge
// shows the normal flux into the region there (the demo's T1 on the top
// edge: -qy).
func TestProbesShowComponentsAndNormal(t *testing.T) {
	tb := newTab(t)
	tb.open(t, siteURL)
	tb.loadExample(t, "heat")
	head := eval[string](t, tb, `document.getElementById("probe-head-g").textContent + "|" + document.getElementById("probe-head-q").textContent`)
	if !strings.Contains(head, "magnitude") || !strings.Contains(head, "flux x, y") {
		t.Errorf("probe headings %q, want the gradient as a magnitude and the flux as its x, y components", head)
	}
	q := eval[[]float64](t, tb, `window.edgewiseInternal.last().result.probes[0].flux`)
	cell := eval[string](t, tb, `document.querySelector("#probes tbody tr td.flux").firstChild.textContent`)
	parts := strings.Split(cell, ", ")
	if len(parts) != 2 {
		t.Fatalf("flux cell %q, want two components", cell)
	}
	for i, s := range parts {
		v, err := readNumber(s)
		if err != nil || math.Abs(v-q[i]) > 1e-3*math.Abs(q[i]) {
			t.Errorf("component %d shows %q, the engine has %g", i, s, q[i])
		}
	}
	normal := eval[string](t, tb, `(document.querySelector("#probes tbody tr td.flux .normal[data-side=top]") || {}).textContent || ""`)
	v, err := readNumber(strings.TrimPrefix(normal, "in through top: "))
	if !strings.HasPrefix(normal, "in through top: ") || err != nil || math.Abs(v+q[1]) > 1e-3*math.Abs(q[1]) {
		t.Errorf("normal flux %q, want in through top: %g", normal, -q[1])
	}
	tb.shot(t, "look-probes")
	tb.noErrors(t)
}

// Each physics labels its edges in its own trade's words, from the table:
// a flux edge in electrostatics gives the surface charge density, the far
// side of a Robin edge is the fluid temperature, the electrode potential
// or the head beyond the leaky layer, never an "ambient" potential or
// head; the generic physics writes its field as u, never U.
func TestEdgeLabelsInTradeWords(t *testing.T) {
	tb := newTab(t)
	tb.open(t, siteURL)
	tb.loadPlate(t)
	// the top edge as a flux edge, the bottom as a Robin edge
	eval[bool](t, tb, `(() => { for (const [side, kind] of [["top", "flux"], ["bottom", "convection"]]) {
	  const s = document.getElementById("in-" + side + "-kind"); s.value = kind; s.dispatchEvent(new Event("change", {bubbles: true})); } return true; })()`)
	want := map[string][2]string{
		"heat":          {"Heat flux in [W/m²]", "Fluid temperature [°C]"},
		"electrostatic": {"Surface charge density σ [C/m²]", "Electrode potential beyond the layer [V]"},
		"seepage":       {"Inflow (Darcy flux in) [m/s]", "Head beyond the leaky layer [m]"},
		"generic":       {"Flux in", "Outside value u_amb"},
	}
	for _, id := range []string{"heat", "electrostatic", "seepage", "generic"} {
		tb.switchPhysics(t, id)
		got := eval[[]string](t, tb, `[document.getElementById("in-top-expr-label").textContent.trim(),
		  document.querySelector("fieldset.edge[data-side=bottom] .lbl-amb").textContent.trim(),
		  document.getElementById("inputs").textContent]`)
		if got[0] != want[id][0] || got[1] != want[id][1] {
			t.Errorf("%s: flux edge %q and Robin far side %q, want %q", id, got[0], got[1], want[id])
		}
		if id != "heat" && strings.Contains(strings.ToLower(got[1]), "ambient") {
			t.Errorf("%s: heat wording %q", id, got[1])
		}
		if id == "generic" && strings.Contains(got[2], "Value U") {
			t.Errorf("generic: the form writes U")
		}
	}
	tb.noErrors(t)
}

// Pictures that read well: a 20:1 plate is offered a stretched view, which
// is drawn much taller and marked as not to scale on the picture and in
// its text; isoline labels keep clear of probes and their names; the
// profile curve keeps clear of its frame.
func TestPicturesReadWell(t *testing.T) {
	tb := newTab(t)
	tb.open(t, siteURL)
	thin := strings.NewReplacer(`width: 0.4, height: 0.2`, `width: 1, height: 0.05`, `expr: "40"}, right`, `expr: "40 + 20*s/H"}, right`).Replace(plate)
	n := tb.solved(t)
	eval[map[string]any](t, tb, `window.edgewise.load(`+thin+`)`)
	tb.waitSolved(t, n+1)
	if eval[bool](t, tb, `document.getElementById("opt-stretch-box").hidden`) {
		t.Fatalf("no offer of a stretched view for a 20:1 plate")
	}
	h0 := eval[float64](t, tb, `window.edgewiseParts.pictureBoxes().plot.h`)
	tb.shot(t, "look-thin-to-scale")
	drawn := eval[int](t, tb, `Number(document.documentElement.dataset.drawn)`)
	eval[bool](t, tb, `(document.getElementById("opt-stretch").click(), true)`)
	tb.waitFor(t, `Number(document.documentElement.dataset.drawn) > `+strconv.Itoa(drawn), "the stretched redraw")
	h1 := eval[float64](t, tb, `window.edgewiseParts.pictureBoxes().plot.h`)
	if h1 < 2*h0 || h1 < 110 {
		t.Errorf("stretched picture %g px high (to scale %g px), want at least twice and 110 px", h1, h0)
	}
	if s := eval[string](t, tb, `document.getElementById("field").dataset.scale`); !strings.HasPrefix(s, "stretched") {
		t.Errorf("picture scale %q, want stretched", s)
	}
	if sum := eval[string](t, tb, `document.getElementById("field-summary").textContent`); !strings.Contains(sum, "Not to scale") {
		t.Errorf("summary %q does not say the picture is not to scale", sum)
	}
	tb.shot(t, "look-thin-stretched")
	// probes where the plate's isoline labels would sit (the middle column)
	n = tb.solved(t)
	eval[map[string]any](t, tb, `window.edgewise.load(Object.assign(`+plate+`, {probes: [{x: 0.2, y: 0.1, label: "Mid"}, {x: 0.2, y: 0.05, label: "Low"}, {x: 0.195, y: 0.15, label: "High"}]}))`)
	tb.waitSolved(t, n+1)
	labels, probes := pictureBoxes(t, tb)
	if len(labels) < 3 || len(probes) != 3 {
		t.Fatalf("%d labels and %d probes on the picture", len(labels), len(probes))
	}
	for _, l := range labels {
		for _, p := range probes {
			if l[0] < p[0]+p[2] && p[0] < l[0]+l[2] && l[1] < p[1]+p[3] && p[1] < l[1]+l[3] {
				t.Errorf("isoline label %v covers probe %v", l, p)
			}
		}
	}
	tb.shot(t, "look-labels-and-probes")
	eval[bool](t, tb, `(document.getElementById("profile-box").open = true, true)`)
	tb.waitFor(t, `!!document.getElementById("profile").dataset.curve`, "the profile")
	fr := eval[[]float64](t, tb, `document.getElementById("profile").dataset.frame.split(",").map(Number)`)
	cv := eval[[]float64](t, tb, `document.getElementById("profile").dataset.curve.split(",").map(Number)`)
	if cv[0] < fr[0]+3 || cv[1] < fr[1]+3 || cv[2] > fr[2]-3 || cv[3] > fr[3]-3 {
		t.Errorf("profile curve %v touches its frame %v", cv, fr)
	}
	tb.noErrors(t)
}
