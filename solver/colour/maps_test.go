package colour

import (
	"fmt"
	"math"
	"testing"
)

// emittedLab returns OKLab recomputed from the 8-bit colour the map emits.
func emittedLab(m *Map, t float64) (L, A, B float64) {
	r, g, b := m.At(t)
	return SRGBToOKLab(float64(r)/255, float64(g)/255, float64(b)/255)
}

// samples is the number of levels the shape tests look at: 64 steps of the
// sequential map are 0.0117 apart in L, well above the 8-bit rounding of L
// (below 0.004 for these colours).
const samples = 64

func TestSequentialLightnessIncreasing(t *testing.T) {
	prev := -1.0
	for k := range samples {
		L, _, _ := emittedLab(Sequential, float64(k)/(samples-1))
		if !(L > prev) {
			t.Errorf("sample %d: L = %.4f not above previous %.4f", k, L, prev)
		}
		prev = L
	}
}

// Greyscale: CIE luminance Y with the Rec. 709 / sRGB primaries
// (Y = 0.2126 R + 0.7152 G + 0.0722 B on linear channels, ITU-R BT.709,
// recalled from memory) and the same weights on the encoded channels (luma
// Y', what a greyscale printer or photocopier roughly does) must both rise
// strictly along the sequential map.
func TestSequentialGreyscaleMonotonic(t *testing.T) {
	prevY, prevLuma := -1.0, -1.0
	for k := range samples {
		r, g, b := Sequential.At(float64(k) / (samples - 1))
		R, G, B := float64(r)/255, float64(g)/255, float64(b)/255
		luma := 0.2126*R + 0.7152*G + 0.0722*B
		Y := 0.2126*Decode(R) + 0.7152*Decode(G) + 0.0722*Decode(B)
		if !(Y > prevY) || !(luma > prevLuma) {
			t.Errorf("sample %d: Y %.4f (prev %.4f), luma %.4f (prev %.4f)", k, Y, prevY, luma, prevLuma)
		}
		prevY, prevLuma = Y, luma
	}
}

// Diverging: V-shaped lightness, lightest at the centre, symmetric. The
// symmetry tolerance 0.006 covers the 8-bit rounding of both colours.
func TestDivergingLightnessShape(t *testing.T) {
	const n = samples + 1 // odd, so t = 0.5 is a sample
	Ls := make([]float64, n)
	for k := range n {
		Ls[k], _, _ = emittedLab(Diverging, float64(k)/(n-1))
	}
	mid := n / 2
	for k := 1; k <= mid; k++ {
		if !(Ls[k] > Ls[k-1]) {
			t.Errorf("left arm: L[%d] = %.4f not above L[%d] = %.4f", k, Ls[k], k-1, Ls[k-1])
		}
	}
	for k := mid + 1; k < n; k++ {
		if !(Ls[k] < Ls[k-1]) {
			t.Errorf("right arm: L[%d] = %.4f not below L[%d] = %.4f", k, Ls[k], k-1, Ls[k-1])
		}
	}
	for k := range mid {
		if d := math.Abs(Ls[k] - Ls[n-1-k]); d > 0.006 {
			t.Errorf("L[%d] = %.4f vs L[%d] = %.4f: asymmetric by %.4f", k, Ls[k], n-1-k, Ls[n-1-k], d)
		}
	}
	// Centre neutral: chroma of the emitted colour below 0.005 (8-bit
	// rounding of a grey); ends clearly coloured (chroma above 0.08).
	_, a, b := emittedLab(Diverging, 0.5)
	if c := math.Hypot(a, b); c > 0.005 {
		t.Errorf("centre chroma %.4f, want neutral", c)
	}
	for _, e := range []float64{0, 1} {
		_, a, b := emittedLab(Diverging, e)
		if c := math.Hypot(a, b); c < 0.08 {
			t.Errorf("end %g chroma %.4f, want a clear hue", e, c)
		}
	}
}

// The emitted colours keep the designed lightness and hue: the gamut fit
// only lowers chroma. Tolerances: L within 0.005 and hue within 3 degrees
// wherever chroma is above 0.03 (8-bit rounding).
func TestGamutFitKeepsLightnessAndHue(t *testing.T) {
	for _, m := range []*Map{Sequential, Diverging} {
		for k := range samples {
			tt := float64(k) / (samples - 1)
			wantL, wantC, wantH := m.lch(tt)
			L, a, b := emittedLab(m, tt)
			if math.Abs(L-wantL) > 0.005 {
				t.Errorf("%s t=%.3f: L %.4f, designed %.4f", m.Name(), tt, L, wantL)
			}
			c := math.Hypot(a, b)
			if c > wantC+0.005 {
				t.Errorf("%s t=%.3f: chroma %.4f above designed %.4f", m.Name(), tt, c, wantC)
			}
			if c > 0.03 {
				dh := math.Remainder(math.Atan2(b, a)-wantH, 2*math.Pi) * 180 / math.Pi
				if math.Abs(dh) > 3 {
					t.Errorf("%s t=%.3f: hue off by %.1f deg", m.Name(), tt, dh)
				}
			}
			fL, fA, fB := m.OKLab(tt)
			if !inGamut(fL, fA, fB) {
				t.Errorf("%s t=%.3f: fitted colour outside sRGB", m.Name(), tt)
			}
		}
	}
}

// The hue turns the way the rule says: on the sequential map from 45 to
// 200 deg, on each arm of the diverging map from the arm's centre hue to
// its end hue, linearly in t (sequential) or in the distance from the
// centre (diverging). Measured on the emitted colours where chroma is above
// 0.03 (below that, 8-bit rounding makes the hue meaningless), within 4 deg.
func TestHuePath(t *testing.T) {
	check := func(name string, m *Map, from, to float64, ts, ds []float64) {
		seen := 0
		for i, tt := range ts {
			_, a, b := emittedLab(m, tt)
			if math.Hypot(a, b) < 0.03 {
				continue
			}
			seen++
			want := from + (to-from)*ds[i]
			got := math.Atan2(b, a) * 180 / math.Pi
			if d := math.Remainder(got-want, 360); math.Abs(d) > 4 {
				t.Errorf("%s t=%.3f: hue %.1f deg, the rule says %.1f", name, tt, got, want)
			}
		}
		if seen < samples/2 {
			t.Errorf("%s: only %d of %d samples have a clear hue", name, seen, len(ts))
		}
	}
	var seq, low, high, d []float64
	for k := range samples {
		tt := float64(k) / (samples - 1)
		seq = append(seq, tt)
		low = append(low, 0.5-0.5*tt)
		high = append(high, 0.5+0.5*tt)
		d = append(d, tt)
	}
	check("fen", Sequential, fenH0, fenH1, seq, d)
	check("watershed low arm", Diverging, wsLowH0, wsLowH1, low, d)
	check("watershed high arm", Diverging, wsHighH0, wsHighH1, high, d)
}

// Greyscale of the diverging map: luminance and luma V-shaped like its
// lightness, so a greyscale copy still shows where zero is.
func TestDivergingGreyscaleShape(t *testing.T) {
	const n = samples + 1
	mid := n / 2
	prevY, prevLuma := -1.0, -1.0
	for k := range n {
		r, g, b := Diverging.At(float64(k) / (n - 1))
		R, G, B := float64(r)/255, float64(g)/255, float64(b)/255
		luma := 0.2126*R + 0.7152*G + 0.0722*B
		Y := 0.2126*Decode(R) + 0.7152*Decode(G) + 0.0722*Decode(B)
		if k > 0 {
			up := k <= mid
			if up != (Y > prevY) || up != (luma > prevLuma) {
				t.Errorf("sample %d: Y %.4f (prev %.4f), luma %.4f (prev %.4f), want %s", k, Y, prevY, luma, prevLuma, map[bool]string{true: "rising", false: "falling"}[up])
			}
		}
		prevY, prevLuma = Y, luma
	}
}

func TestClampAndNaN(t *testing.T) {
	for _, m := range []*Map{Sequential, Diverging} {
		r0, g0, b0 := m.At(0)
		if r, g, b := m.At(-3); r != r0 || g != g0 || b != b0 {
			t.Errorf("%s: At(-3) != At(0)", m.Name())
		}
		r1, g1, b1 := m.At(1)
		if r, g, b := m.At(math.Inf(1)); r != r1 || g != g1 || b != b1 {
			t.Errorf("%s: At(+Inf) != At(1)", m.Name())
		}
		if r, g, b := m.At(math.NaN()); r != g || g != b {
			t.Errorf("%s: At(NaN) = %d,%d,%d, want a grey", m.Name(), r, g, b)
		}
	}
}

func TestTable(t *testing.T) {
	tab := Sequential.Table(5)
	if len(tab) != 15 {
		t.Fatalf("len(Table(5)) = %d, want 15", len(tab))
	}
	for k := range 5 {
		r, g, b := Sequential.At(float64(k) / 4)
		if tab[3*k] != r || tab[3*k+1] != g || tab[3*k+2] != b {
			t.Errorf("Table(5)[%d] differs from At(%g)", k, float64(k)/4)
		}
	}
	defer func() {
		if recover() == nil {
			t.Error("Table(0) did not panic")
		}
	}()
	Sequential.Table(0)
}

func ExampleMap_At() {
	for _, t := range []float64{0, 0.5, 1} {
		r, g, b := Sequential.At(t)
		fmt.Printf("%s %.1f #%02x%02x%02x\n", Sequential.Name(), t, r, g, b)
	}
	r, g, b := Diverging.At(0.5)
	fmt.Printf("%s centre #%02x%02x%02x\n", Diverging.Name(), r, g, b)
	// Output:
	// fen 0.0 #2d1205
	// fen 0.5 #738938
	// fen 1.0 #dbfdfe
	// watershed centre #f5f5f5
}
