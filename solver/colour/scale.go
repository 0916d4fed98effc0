package colour

import "math"

// Scale is a colour map laid over a range of field values: From gets the
// map's colour at t = 0 and To its colour at t = 1.
type Scale struct {
	Map      *Map
	From, To float64
}

// signedShare is how large the smaller side of a field that changes sign
// must be, as a share of the larger, for Choose to draw it about zero.
const signedShare = 0.1

// Choose is the one rule for the colours of a field whose values run from
// lo to hi, used by the page, the SVG and PNG pictures and the report alike.
// A field that really changes sign (the smaller side reaches at least a
// tenth of the larger) is drawn with the Diverging map over -m .. m, m the
// larger of -lo and hi, so that zero is the neutral middle; any other field
// with the Sequential map from lo to hi.
func Choose(lo, hi float64) Scale {
	if lo < 0 && hi > 0 && math.Min(-lo, hi) >= signedShare*math.Max(-lo, hi) {
		m := math.Max(-lo, hi)
		return Scale{Map: Diverging, From: -m, To: m}
	}
	return Scale{Map: Sequential, From: lo, To: hi}
}

// T returns where v lies on the scale, clamped to [0, 1]; a scale of no
// width gives 0.5 and NaN stays NaN (the map's grey).
func (s Scale) T(v float64) float64 {
	if math.IsNaN(v) {
		return v
	}
	if !(s.To > s.From) {
		return 0.5
	}
	return math.Max(0, math.Min(1, (v-s.From)/(s.To-s.From)))
}

// Index returns the entry of an n-colour table (Map.Table(n)) that v gets:
// T(v) rounded to the nearest of the n colours. The page's canvas uses the
// same arithmetic on the same table.
func (s Scale) Index(v float64, n int) int {
	return int(math.Round(s.T(v) * float64(n-1)))
}

// Maps lists every map, so that a map can be found by its name.
var Maps = []*Map{Sequential, Diverging}

// ByName returns the map with this name (Map.Name).
func ByName(name string) (*Map, bool) {
	for _, m := range Maps {
		if m.name == name {
			return m, true
		}
	}
	return nil, false
}
