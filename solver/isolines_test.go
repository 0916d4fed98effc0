package solver

import (
	"math"
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
