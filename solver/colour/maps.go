package colour

import "math"

// Map is a colour map from [0, 1] to sRGB, designed in OKLab polar
// coordinates. A Map is immutable and safe for concurrent use.
type Map struct {
	name string
	lch  func(t float64) (L, C, h float64) // h in radians
}

// Name returns the map's short name.
func (m *Map) Name() string { return m.name }

// NaN values are drawn in this neutral grey (OKLab L 0.6, C 0).
const nanL = 0.6

// gamutTol is how far outside [0, 1] a linear channel may be and still
// count as inside the gamut: the rounding left by the matrices.
const gamutTol = 1e-9

// Sequential is the map for fields: lightness strictly increasing from dark
// to light (see the package comment).
var Sequential = &Map{name: "dusk", lch: duskLCh}

// Diverging is the map for signed fields, neutral and lightest at t = 0.5
// (see the package comment).
var Diverging = &Map{name: "ember-tide", lch: emberTideLCh}

func deg(d float64) float64 { return d * math.Pi / 180 }

// duskLCh: L linear in t; hue from 290 deg (blue-violet) down through
// 195 (teal) to 75 (warm sand); chroma rises from 0.09 to 0.10 in the
// middle and falls to 0.045 at the pale end.
func duskLCh(t float64) (L, C, h float64) {
	L = 0.22 + 0.74*t
	h = deg(290 - 215*t)
	switch {
	case t < 0.45:
		C = 0.09 + 0.01*t/0.45
	default:
		C = 0.10 - 0.055*(t-0.45)/0.55
	}
	return L, C, h
}

// emberTideLCh: the blue arm (h 245 deg) for t < 0.5 and the copper arm
// (h 50 deg) for t > 0.5; L falls linearly with the distance from the
// centre, chroma grows from 0 like that distance to the power 0.8.
func emberTideLCh(t float64) (L, C, h float64) {
	d := math.Abs(2*t - 1)
	L = 0.965 - (0.965-0.48)*d
	C = 0.12 * math.Pow(d, 0.8)
	if t < 0.5 {
		h = deg(245)
	} else {
		h = deg(50)
	}
	return L, C, h
}

// inGamut reports whether the OKLab colour lies inside sRGB.
func inGamut(L, A, B float64) bool {
	r, g, b := OKLabToLinear(L, A, B)
	lo, hi := -gamutTol, 1+gamutTol
	return r >= lo && r <= hi && g >= lo && g <= hi && b >= lo && b <= hi
}

// fitChroma returns the largest chroma c <= C for which (L, c, h) is inside
// sRGB, by bisection (the grey axis is inside for 0 <= L <= 1).
func fitChroma(L, C, h float64) float64 {
	ca, sa := math.Cos(h), math.Sin(h)
	if inGamut(L, C*ca, C*sa) {
		return C
	}
	lo, hi := 0.0, C
	for range 60 {
		mid := 0.5 * (lo + hi)
		if inGamut(L, mid*ca, mid*sa) {
			lo = mid
		} else {
			hi = mid
		}
	}
	return lo
}

// OKLab returns the map's colour at t as OKLab after the gamut fit. t is
// clamped to [0, 1]; NaN gives the neutral grey.
func (m *Map) OKLab(t float64) (L, A, B float64) {
	if math.IsNaN(t) {
		return nanL, 0, 0
	}
	t = math.Max(0, math.Min(1, t))
	L, C, h := m.lch(t)
	C = fitChroma(L, C, h)
	return L, C * math.Cos(h), C * math.Sin(h)
}

// At returns the 8-bit sRGB colour at t, clamped to [0, 1]; NaN gives a
// neutral grey.
func (m *Map) At(t float64) (r, g, b uint8) {
	lr, lg, lb := OKLabToLinear(m.OKLab(t))
	return to8(lr), to8(lg), to8(lb)
}

// to8 encodes a linear channel and rounds it to 8 bits. The clamp only
// removes the rounding left by the gamut fit (at most gamutTol).
func to8(c float64) uint8 {
	c = math.Max(0, math.Min(1, c))
	return uint8(math.Round(Encode(c) * 255))
}

// Table returns n colours sampled at t = k/(n-1), k = 0..n-1, as 3n bytes
// r, g, b, r, g, b, ... (n = 1 gives the colour at t = 0.5). Table panics if
// n < 1.
func (m *Map) Table(n int) []uint8 {
	if n < 1 {
		panic("colour: Table needs n >= 1")
	}
	tab := make([]uint8, 0, 3*n)
	for k := 0; k < n; k++ {
		t := 0.5
		if n > 1 {
			t = float64(k) / float64(n-1)
		}
		r, g, b := m.At(t)
		tab = append(tab, r, g, b)
	}
	return tab
}
