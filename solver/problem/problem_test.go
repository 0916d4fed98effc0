package problem

import "testing"

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
