package problem

import (
	"math"
	"testing"
)

func TestParseSideRoundTrip(t *testing.T) {
	for _, s := range Sides {
		got, ok := ParseSide(s.String())
		if !ok || got != s {
			t.Errorf("ParseSide(%q) = %v, %v; want %v", s.String(), got, ok, s)
		}
	}
	for _, bad := range []string{"", "Bottom", "north", "Side(4)"} {
		if _, ok := ParseSide(bad); ok {
			t.Errorf("ParseSide(%q) accepted", bad)
		}
	}
}

func TestParseKindRoundTrip(t *testing.T) {
	for _, k := range Kinds {
		got, ok := ParseKind(k.String())
		if !ok || got != k {
			t.Errorf("ParseKind(%q) = %v, %v; want %v", k.String(), got, ok, k)
		}
	}
	for _, bad := range []string{"", "Value", "robin", "Kind(3)"} {
		if _, ok := ParseKind(bad); ok {
			t.Errorf("ParseKind(%q) accepted", bad)
		}
	}
}

func TestSidesCounterClockwise(t *testing.T) {
	p := &Problem{W: 2, H: 1}
	// the end of each side is the start of the next one counter-clockwise
	for _, s := range Sides {
		x1, y1 := p.Point(s, p.Length(s))
		if s == Top || s == Left { // s runs from the left or bottom end
			x1, y1 = p.Point(s, 0)
		}
		n := Sides[(int(s)+1)%4]
		x0, y0 := p.Point(n, 0)
		if n == Top || n == Left {
			x0, y0 = p.Point(n, p.Length(n))
		}
		if x0 != x1 || y0 != y1 {
			t.Errorf("%v ends at (%g, %g), %v starts at (%g, %g)", s, x1, y1, n, x0, y0)
		}
	}
}

// Proportional: the longer side gets n intervals, the shorter round(n * aspect)
// but at least 2, for aspects from 1e-3 to 1e3.
func TestProportional(t *testing.T) {
	tests := []struct {
		w, h   float64
		n      int
		nx, ny int
	}{
		{1, 1, 32, 32, 32},
		{2, 1, 32, 32, 16},
		{1, 2, 32, 16, 32},
		{0.4, 0.15, 40, 40, 15},
		{1, 1e-3, 32, 32, 2},
		{1e-3, 1, 32, 2, 32},
		{1e3, 1, 48, 48, 2},
		{1, 1, 1, 2, 2}, // n below 2 is raised to 2
		// errors: bad sides give n x n and leave the report to Solve
		{math.NaN(), 1, 16, 16, 16},
		{1, -2, 16, 16, 16},
		{math.Inf(1), 1, 8, 8, 8},
		{0, 0, 8, 8, 8},
	}
	for _, tt := range tests {
		if nx, ny := Proportional(tt.w, tt.h, tt.n); nx != tt.nx || ny != tt.ny {
			t.Errorf("Proportional(%g, %g, %d) = %d, %d, want %d, %d", tt.w, tt.h, tt.n, nx, ny, tt.nx, tt.ny)
		}
	}
}
