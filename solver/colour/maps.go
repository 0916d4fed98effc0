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
var Sequential = &Map{name: "fen", lch: fenLCh}

// Diverging is the map for signed fields, neutral and lightest at t = 0.5
// (see the package comment).
var Diverging = &Map{name: "watershed", lch: watershedLCh}

func deg(d float64) float64 { return d * math.Pi / 180 }

// The rule of the sequential map, "fen" (peat, moss, pale pool water).
const (
	fenL0, fenL1 = 0.22, 0.97  // lightness at t = 0 and t = 1, linear between
	fenH0, fenH1 = 45.0, 200.0 // hue in degrees, turning with t
	fenC0        = 0.05        // chroma at the dark end
	fenCMid      = 0.11        // chroma at fenTMid, where the moss green is
	fenC1        = 0.035       // chroma at the pale end
	fenTMid      = 0.5
)

// fenLCh: L linear in t; the hue turns linearly from 45 deg (a dark peat
// brown) through 120 (moss) to 200 (a pale cold water colour); chroma
// rises from 0.05 to 0.11 at the middle and falls to 0.035 at the pale end.
func fenLCh(t float64) (L, C, h float64) {
	L = fenL0 + (fenL1-fenL0)*t
	h = deg(fenH0 + (fenH1-fenH0)*t)
	if t < fenTMid {
		C = fenC0 + (fenCMid-fenC0)*t/fenTMid
	} else {
		C = fenCMid + (fenC1-fenCMid)*(t-fenTMid)/(1-fenTMid)
	}
	return L, C, h
}

// The rule of the diverging map, "watershed".
const (
	wsLMid, wsLEnd = 0.97, 0.42 // lightness at the centre and at both ends
	wsCEnd         = 0.13       // chroma at both ends
	wsCPow         = 0.75       // chroma grows like the distance to this power
	// each arm's hue turns as it darkens: (near the centre, at the end)
	wsLowH0, wsLowH1   = 200.0, 300.0 // pale aqua to violet
	wsHighH0, wsHighH1 = 95.0, -5.0   // pale straw through orange to crimson
)

// watershedLCh: d = |2t - 1| is the distance from the neutral centre. L
// falls linearly with d, the same on both arms; chroma grows like d^0.75;
// the low arm's hue turns from 200 to 300 deg and the high arm's from 95
// down to -5 (355) deg as d goes from 0 to 1, so that each arm changes colour, not only
// depth, as it darkens.
func watershedLCh(t float64) (L, C, h float64) {
	d := math.Abs(2*t - 1)
	L = wsLMid - (wsLMid-wsLEnd)*d
	C = wsCEnd * math.Pow(d, wsCPow)
	if t < 0.5 {
		h = deg(wsLowH0 + (wsLowH1-wsLowH0)*d)
	} else {
		h = deg(wsHighH0 + (wsHighH1-wsHighH0)*d)
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
