package solver

import (
	"math"
	"slices"
	"testing"
)

// Isoline levels are round in the unit the values are shown in: in °F
// (shown = 1.8 T + 32) a plate from 20 to 90 °C (68 to 194 °F) gets
// levels that are whole multiples of a round step in °F, not converted
// round Celsius values; in SI the levels are round in °C.
func TestIsolineLevelsRoundInShownUnit(t *testing.T) {
	_, out := mustSolve(t, `{"schema": "edgewise/1", "physics": "heat", "width": 0.4, "height": 0.2, "conductivity": 50,
		"edges": {"bottom": {"kind": "value", "expr": "20"}, "top": {"kind": "value", "expr": "90"},
		"left": {"kind": "flux", "expr": "0"}, "right": {"kind": "flux", "expr": "0"}}}`, Options{NoCrossCheck: true})
	for _, c := range []struct {
		name          string
		scale, offset float64
	}{{"SI", 1, 0}, {"degF", 1.8, 32}} {
		iso := out.Isolines(10, c.scale, c.offset)
		if len(iso.Levels) < 5 {
			t.Fatalf("%s: %d levels", c.name, len(iso.Levels))
		}
		shown := func(k int) float64 { return iso.Levels[k]*c.scale + c.offset }
		step := shown(1) - shown(0)
		// a round step: 1, 2, 2.5 or 5 times a power of ten
		mant := step / math.Pow(10, math.Floor(math.Log10(step)))
		if !(near(mant, 1) || near(mant, 2) || near(mant, 2.5) || near(mant, 5)) {
			t.Errorf("%s: step %g in the shown unit is not round", c.name, step)
		}
		for k := range iso.Levels {
			if q := shown(k) / step; !near(q, math.Round(q)) {
				t.Errorf("%s: level %g (shown) is not a multiple of the step %g", c.name, shown(k), step)
			}
			if lo, hi := out.Result.Min.Value, out.Result.Max.Value; iso.Levels[k] < lo || iso.Levels[k] > hi {
				t.Errorf("%s: level %g °C outside the field's range %g to %g", c.name, iso.Levels[k], lo, hi)
			}
		}
	}
}

func near(a, b float64) bool { return math.Abs(a-b) <= 1e-9*max(1, math.Abs(b)) }

// The extremes are those of the field, not of the grid: with a source
// between two edges held at 0 and the others insulated the field is
// S x (W - x) / (2 K), largest at mid-width, which falls between the
// nodes of an odd grid; the largest value found is within the estimate
// of S W^2 / (8 K), at x = W/2 within a thousandth of a grid cell.
func TestExtremesBetweenNodes(t *testing.T) {
	_, out := mustSolve(t, `{"schema": "edgewise/1", "physics": "heat", "width": 0.3, "height": 0.1, "conductivity": 20, "source": 4e5,
		"edges": {"bottom": {"kind": "flux", "expr": "0"}, "top": {"kind": "flux", "expr": "0"},
		"left": {"kind": "value", "expr": "0"}, "right": {"kind": "value", "expr": "0"}}}`, Options{Nx: 7, Ny: 3, NoCrossCheck: true})
	r := out.Result
	want := 4e5 * 0.3 * 0.3 / (8 * 20)
	if d := math.Abs(r.Max.Value - want); d > r.Accuracy.Estimate+1e-12*want {
		t.Errorf("largest value %.15g at x = %.6g, want %.15g (error %.3g, estimate %.3g)", r.Max.Value, r.Max.X, want, d, r.Accuracy.Estimate)
	}
	if d := math.Abs(r.Max.X - 0.15); d > 1e-3*0.3/7 {
		t.Errorf("largest value at x = %.9g, want 0.15", r.Max.X)
	}
	// the best grid node is a seventh of the width off: 1/49 of the peak below it
	if grid := slices.Max(out.U); !(want-grid > 0.01*want) {
		t.Fatalf("the grid's largest node %g is not below the peak %g: the test no longer tests the search", grid, want)
	}
}
