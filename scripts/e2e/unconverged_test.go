package e2e

import (
	"strings"
	"testing"
)

// A result the engine cannot stand behind (accuracy.converged false) is
// not headlined: the page says "Not converged", shows no extremes, no
// derived answers and no physics cautions. The project is a strongly exchanging top edge
// (h = 1e9) between value edges in the burn range, which the engine flags;
// a converged result there would headline 90 °C and caution burns.
func TestUnconvergedNotHeadlined(t *testing.T) {
	tb := newTab(t)
	tb.open(t, siteURL)
	got := eval[map[string]any](t, tb, `(async () => {
	  const p = {schema: "edgewise/1", physics: "heat", width: 0.2, height: 0.05, conductivity: 15, source: 0,
	    edges: {bottom: {kind: "value", expr: "90"}, right: {kind: "value", expr: "90"},
	            top: {kind: "convection", h: 1e9, ambient: "82"}, left: {kind: "flux", expr: "0"}}};
	  const r = await window.edgewise.load(p);
	  const text = (id) => (document.getElementById(id) || {}).textContent || "";
	  return {converged: r.accuracy.converged, banner: text("res-unconverged"), max: text("res-max"),
	          min: text("res-min"), cautions: text("cautions"), answers: !!document.getElementById("answers")};
	})()`)
	if got["converged"] != false {
		t.Fatalf("the engine says converged (%v); the case was chosen because it does not", got["converged"])
	}
	if !strings.Contains(got["banner"].(string), "Not converged") {
		t.Errorf("no not-converged banner: %q", got["banner"])
	}
	for _, k := range []string{"max", "min"} {
		if s := got[k].(string); !strings.Contains(s, "not reliable") || strings.ContainsAny(s, "0123456789") {
			t.Errorf("%s row %q: want 'not reliable' and no number", k, s)
		}
	}
	if c := got["cautions"].(string); strings.Contains(c, "burn") || !strings.Contains(c, "No cautions") {
		t.Errorf("cautions %q: want the withheld note, not a burn caution", c)
	}
	if got["answers"] != false {
		t.Errorf("the derived answers are shown for an unconverged result")
	}
	tb.noErrors(t)
}
