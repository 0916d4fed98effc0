package colour

import (
	"math"
	"testing"
)

func TestChoose(t *testing.T) {
	tests := []struct {
		name     string
		lo, hi   float64
		want     *Map
		from, to float64
	}{
		{"one-signed, positive", 20, 90, Sequential, 20, 90},
		{"one-signed, negative", -90, -20, Sequential, -90, -20},
		{"touches zero", 0, 5, Sequential, 0, 5},
		{"signed, symmetric", -3, 3, Diverging, -3, 3},
		{"signed, the low side larger", -10, 1, Diverging, -10, 10},
		{"signed, exactly a tenth", -1, 10, Diverging, -10, 10},
		{"signed, under a tenth", -0.99, 10, Sequential, -0.99, 10},
		{"flat", 7, 7, Sequential, 7, 7},
	}
	for _, tc := range tests {
		s := Choose(tc.lo, tc.hi)
		if s.Map != tc.want || s.From != tc.from || s.To != tc.to {
			t.Errorf("%s: Choose(%g, %g) = %s over %g .. %g, want %s over %g .. %g",
				tc.name, tc.lo, tc.hi, s.Map.Name(), s.From, s.To, tc.want.Name(), tc.from, tc.to)
		}
	}
}

func TestScaleT(t *testing.T) {
	s := Scale{Map: Diverging, From: -4, To: 4}
	for _, c := range []struct{ v, t float64 }{{-4, 0}, {0, 0.5}, {4, 1}, {2, 0.75}, {-9, 0}, {9, 1}} {
		if got := s.T(c.v); got != c.t {
			t.Errorf("T(%g) = %g, want %g", c.v, got, c.t)
		}
	}
	if !math.IsNaN(s.T(math.NaN())) {
		t.Errorf("T(NaN) is not NaN")
	}
	if got := (Scale{From: 3, To: 3}).T(3); got != 0.5 {
		t.Errorf("a scale of no width gives %g, want 0.5", got)
	}
	if got := s.Index(0, 256); got != 128 {
		t.Errorf("Index(0, 256) = %d, want 128 (127.5 rounds up)", got)
	}
	if s.Index(-4, 256) != 0 || s.Index(4, 256) != 255 {
		t.Errorf("the ends do not get the first and last colours")
	}
}

func TestByName(t *testing.T) {
	for _, m := range Maps {
		if got, ok := ByName(m.Name()); !ok || got != m {
			t.Errorf("ByName(%q) = %v, %v", m.Name(), got, ok)
		}
	}
	if _, ok := ByName("rainbow"); ok {
		t.Errorf("an unknown name was found")
	}
}
