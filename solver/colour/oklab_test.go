package colour

import (
	"math"
	"math/rand/v2"
	"testing"
)

// The published inverse matrices of OKLab (Ottosson 2020, recalled from
// memory). We compute our own inverses from the forward matrices; they must
// agree with the published ones (tolerance 1e-7: the forward matrices are
// rounded to 1e-10 and inverting them amplifies that by the condition
// number of M2, a few hundred; the published first column is exactly 1).
var (
	publishedM2inv = [3][3]float64{
		{1, 0.3963377774, 0.2158037573},
		{1, -0.1055613458, -0.0638541728},
		{1, -0.0894841775, -1.2914855480},
	}
	publishedM1inv = [3][3]float64{
		{4.0767416621, -3.3077115913, 0.2309699292},
		{-1.2684380046, 2.6097574011, -0.3413193965},
		{-0.0041960863, -0.7034186147, 1.7076147010},
	}
)

func TestInverseMatchesPublished(t *testing.T) {
	const tol = 1e-7 // see above
	for _, c := range []struct {
		name      string
		got, want [3][3]float64
	}{
		{"M1^-1", m1inv, publishedM1inv},
		{"M2^-1", m2inv, publishedM2inv},
	} {
		for i := range 3 {
			for j := range 3 {
				if d := math.Abs(c.got[i][j] - c.want[i][j]); d > tol {
					t.Errorf("%s[%d][%d] = %.12f, published %.10f (diff %.2g)", c.name, i, j, c.got[i][j], c.want[i][j], d)
				}
			}
		}
	}
}

// Reference colours from Ottosson's post (recalled from memory): white is
// L = 1, a = b = 0 to the precision of the matrices; pure sRGB red is about
// (0.628, 0.225, 0.126). Tolerances: 1e-6 for white (matrix rounding),
// 1e-3 for red (three printed decimals).
func TestKnownColours(t *testing.T) {
	L, a, b := SRGBToOKLab(1, 1, 1)
	if math.Abs(L-1) > 1e-6 || math.Abs(a) > 1e-6 || math.Abs(b) > 1e-6 {
		t.Errorf("white = (%g, %g, %g), want (1, 0, 0)", L, a, b)
	}
	L, a, b = SRGBToOKLab(1, 0, 0)
	if math.Abs(L-0.628) > 1e-3 || math.Abs(a-0.225) > 1e-3 || math.Abs(b-0.126) > 1e-3 {
		t.Errorf("red = (%.4f, %.4f, %.4f), want about (0.628, 0.225, 0.126)", L, a, b)
	}
}

// Round trip sRGB -> OKLab -> sRGB: exact identity, 1e-12 (float64 rounding
// through two matrix products, cube roots and the transfer function).
func TestRoundTrip(t *testing.T) {
	rng := rand.New(rand.NewPCG(1, 2))
	worst := 0.0
	check := func(r, g, b float64) {
		L, A, B := SRGBToOKLab(r, g, b)
		r2, g2, b2 := OKLabToSRGB(L, A, B)
		d := math.Max(math.Abs(r2-r), math.Max(math.Abs(g2-g), math.Abs(b2-b)))
		worst = math.Max(worst, d)
		if d > 1e-12 {
			t.Errorf("round trip (%g, %g, %g) -> (%g, %g, %g)", r, g, b, r2, g2, b2)
		}
	}
	for _, c := range [][3]float64{{0, 0, 0}, {1, 1, 1}, {1, 0, 0}, {0, 1, 0}, {0, 0, 1}, {0.04045, 0.5, 0.0031308}} {
		check(c[0], c[1], c[2])
	}
	for range 10000 {
		check(rng.Float64(), rng.Float64(), rng.Float64())
	}
	t.Logf("largest round-trip error %.3g", worst)
}

// The transfer function and its inverse meet at the breakpoint
// (IEC 61966-2-1; continuity to 1e-7 because the standard's constants are
// rounded).
func TestTransferContinuity(t *testing.T) {
	a, b := 0.04045/12.92, math.Pow((0.04045+0.055)/1.055, 2.4)
	if math.Abs(a-b) > 1e-7 {
		t.Errorf("decode not continuous at 0.04045: %g vs %g", a, b)
	}
	for _, c := range []float64{0, 0.001, 0.03, 0.2, 0.5, 0.9, 1} {
		if d := math.Abs(Encode(Decode(c)) - c); d > 1e-15 {
			t.Errorf("Encode(Decode(%g)) off by %g", c, d)
		}
	}
}
