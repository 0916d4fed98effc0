package e2e

import (
	"strings"
	"testing"
)

// smoothPlate is a plate whose field is smooth up to its corners (the
// linear field 20 + 100 x, with the flux edges carrying its flows), so
// that the independent solution resolves it to rounding and can confirm
// the series' estimate.
const smoothPlate = `{schema: "edgewise/1", title: "smooth plate", physics: "heat", width: 0.4, height: 0.2,
  conductivity: 50, source: 0,
  edges: {bottom: {kind: "flux", expr: "0"}, top: {kind: "flux", expr: "0"},
          left: {kind: "value", expr: "20"}, right: {kind: "value", expr: "60"}},
  grid: {nx: 40, ny: 20}}`

// The page shows one accuracy statement: what the numbers are good to,
// the figure to rely on, and what the independent check shows, with the
// numbers in the page's units. A smooth field is confirmed; a step of
// value inside an edge limits the check, and the page says by what.
func TestAccuracyStatement(t *testing.T) {
	tb := newTab(t)
	tb.open(t, siteURL)
	tb.loadProject(t, smoothPlate)
	acc := eval[map[string]any](t, tb, `window.edgewiseInternal.last().result.accuracy`)
	text := eval[string](t, tb, `document.getElementById("res-accuracy").textContent`)
	cls := eval[string](t, tb, `document.getElementById("res-accuracy").className`)
	if acc["crosscheck_verdict"] != "confirms" || !strings.Contains(cls, "confirms") ||
		!strings.Contains(text, "good to") || !strings.Contains(text, "the figure to rely on") || !strings.Contains(text, "confirms it") {
		t.Errorf("smooth plate: verdict %v, class %q, statement %q", acc["crosscheck_verdict"], cls, text)
	}
	if strings.ContainsAny(text, "{}") {
		t.Errorf("statement left a marker unfilled: %q", text)
	}
	if !strings.Contains(text, "°C") {
		t.Errorf("statement %q: numbers without the page's unit", text)
	}

	// a step of value in the middle of the bottom edge
	tb.loadProject(t, strings.Replace(smoothPlate, `bottom: {kind: "flux", expr: "0"}`, `bottom: {kind: "value", expr: "20 + 40*rise(s, 0.2)"}`, 1))
	acc = eval[map[string]any](t, tb, `window.edgewiseInternal.last().result.accuracy`)
	text = eval[string](t, tb, `document.getElementById("res-accuracy").textContent`)
	if acc["crosscheck_verdict"] != "limited" || !strings.Contains(text, "limited by") || !strings.Contains(text, "cannot confirm") {
		t.Errorf("step of value: verdict %v, statement %q", acc["crosscheck_verdict"], text)
	}
	tb.noErrors(t)
}
