package solver

import (
	"math"
	"strings"
	"testing"

	"edgewise/solver/colour"
)

// A solve names the colour scale of its field in the result: one-signed
// fields the sequential map over their range, signed ones the diverging
// map about zero; the JSON carries it as {"map", "from", "to"}.
func TestResultColour(t *testing.T) {
	for _, tc := range []struct {
		name, bottom, top string
		want              *colour.Map
		symmetric         bool
	}{
		{"one-signed", "20", "90", colour.Sequential, false},
		{"signed", "-40", "100", colour.Diverging, true},
	} {
		_, out := mustSolve(t, `{"schema":"edgewise/1","physics":"generic","width":2,"height":1,"conductivity":1,
		 "edges":{"bottom":{"kind":"value","expr":"`+tc.bottom+`"},"top":{"kind":"value","expr":"`+tc.top+`"},
		 "left":{"kind":"flux","expr":"0"},"right":{"kind":"flux","expr":"0"}}, "grid":{"nx":8,"ny":4}}`, Options{NoCrossCheck: true})
		r := &out.Result
		c := r.Colour
		if c.Map != tc.want.Name() {
			t.Errorf("%s: map %q, want %q", tc.name, c.Map, tc.want.Name())
		}
		if tc.symmetric {
			if c.From != -c.To || c.To != math.Max(-r.Min.Value, r.Max.Value) {
				t.Errorf("%s: range %g .. %g, want symmetric about 0 to %g", tc.name, c.From, c.To, r.Max.Value)
			}
		} else if c.From != r.Min.Value || c.To != r.Max.Value {
			t.Errorf("%s: range %g .. %g, want %g .. %g", tc.name, c.From, c.To, r.Min.Value, r.Max.Value)
		}
		if s := c.Scale(); s.Map != tc.want || s.From != c.From || s.To != c.To {
			t.Errorf("%s: Scale() = %+v", tc.name, s)
		}
		if j := string(r.JSON()); !strings.Contains(j, `"colour":{"map":"`+tc.want.Name()+`","from":`) {
			t.Errorf("%s: no colour in %s", tc.name, j)
		}
	}
}
