package gauss

import (
	"fmt"
	"math"
	"math/rand"
	"testing"

	"gonum.org/v1/gonum/integrate/quad"
)

// The rule agrees with gonum's quad.Legendre to 1e-15: nodes absolutely on
// [-1, 1], weights relative to the largest weight of the rule (about pi/n),
// both near the rounding of either. Up to 100 points quad is an independent
// method (tabulated nodes and weights); above, both use the same formulas,
// so TestNewtonAgainstAsymptotic checks those.
func TestAgainstQuad(t *testing.T) {
	for _, n := range []int{1, 2, 3, 4, 5, 8, 16, 17, 32, 64, 99, 100, 101, 128, 255, 256, 512, 1000} {
		x, w := make([]float64, n), make([]float64, n)
		xq, wq := make([]float64, n), make([]float64, n)
		Legendre(x, w, -1, 1)
		quad.Legendre{}.FixedLocations(xq, wq, -1, 1)
		wmax := 0.0
		for _, v := range wq {
			wmax = math.Max(wmax, v)
		}
		var ex, ew float64
		for i := range x {
			ex = math.Max(ex, math.Abs(x[i]-xq[i]))
			ew = math.Max(ew, math.Abs(w[i]-wq[i])/wmax)
		}
		if ex > 1e-15 || ew > 1e-15 {
			t.Errorf("n = %d: nodes differ by %.2g, weights by %.2g of the largest; want both <= 1e-15", n, ex, ew)
		}
	}
}

// Above 100 points the asymptotic formulas agree with Newton's method (run
// here beyond its usual range) to 1e-15, in the same measures.
func TestNewtonAgainstAsymptotic(t *testing.T) {
	for _, n := range []int{101, 150, 333, 600} {
		r := newRule(n)
		x, w := make([]float64, n), make([]float64, n)
		Legendre(x, w, -1, 1)
		wmax := 0.0
		for _, v := range r.w {
			wmax = math.Max(wmax, v)
		}
		var ex, ew float64
		for i := range x {
			ex = math.Max(ex, math.Abs(x[i]-r.x[i]))
			ew = math.Max(ew, math.Abs(w[i]-r.w[i])/wmax)
		}
		if ex > 1e-15 || ew > 1e-15 {
			t.Errorf("n = %d: nodes differ by %.2g, weights by %.2g of the largest; want both <= 1e-15", n, ex, ew)
		}
	}
}

// Exact identity: an n-point rule integrates x^k exactly for k <= 2n-1
// (tolerance: rounding of the sum, a few ulps of the terms).
func TestPolynomialsExact(t *testing.T) {
	for _, n := range []int{1, 2, 3, 6, 11, 20} {
		x, w := make([]float64, n), make([]float64, n)
		lo, hi := 0.25, 2.0
		Legendre(x, w, lo, hi)
		for k := 0; k <= 2*n-1; k++ {
			got := 0.0
			for i := range x {
				got += w[i] * math.Pow(x[i], float64(k))
			}
			want := (math.Pow(hi, float64(k+1)) - math.Pow(lo, float64(k+1))) / float64(k+1)
			if math.Abs(got-want) > 1e-14*math.Abs(want) {
				t.Errorf("n = %d: int x^%d = %.17g, want %.17g", n, k, got, want)
			}
		}
	}
}

// The nodes come descending, symmetric about the middle, inside the
// interval, the weights positive.
func TestOrderAndSymmetry(t *testing.T) {
	for _, n := range []int{1, 7, 8, 101, 300} {
		x, w := make([]float64, n), make([]float64, n)
		Legendre(x, w, 3, 5)
		for i := range x {
			if x[i] <= 3 || x[i] >= 5 || !(w[i] > 0) {
				t.Fatalf("n = %d: node %d at %v weight %v", n, i, x[i], w[i])
			}
			if i > 0 && !(x[i] < x[i-1]) {
				t.Fatalf("n = %d: node %d at %v not below %v", n, i, x[i], x[i-1])
			}
			if math.Abs((x[i]-4)+(x[n-1-i]-4)) > 2e-15 || w[i] != w[n-1-i] {
				t.Fatalf("n = %d: nodes %d and %d not symmetric", n, i, n-1-i)
			}
		}
	}
}

func TestPanics(t *testing.T) {
	for _, c := range []struct {
		name   string
		x, w   []float64
		lo, hi float64
	}{
		{"length", make([]float64, 2), make([]float64, 3), 0, 1},
		{"empty interval", make([]float64, 2), make([]float64, 2), 1, 1},
		{"infinite", make([]float64, 2), make([]float64, 2), 0, math.Inf(1)},
		{"NaN", make([]float64, 2), make([]float64, 2), math.NaN(), 1},
	} {
		func() {
			defer func() {
				if r := recover(); r == nil {
					t.Errorf("%s: no panic", c.name)
				}
			}()
			Legendre(c.x, c.w, c.lo, c.hi)
		}()
	}
}

// BenchmarkLegendre: up to 100 points a kept rule mapped onto an interval
// (the cost at every call after the first), above the asymptotic formulas.
func BenchmarkLegendre(b *testing.B) {
	for _, n := range []int{8, 64, 100, 512, 4128} {
		x, w := make([]float64, n), make([]float64, n)
		b.Run(fmt.Sprint(n), func(b *testing.B) {
			for b.Loop() {
				Legendre(x, w, 0.1, 0.7)
			}
		})
	}
}

// Dekker's product gives the exact error of a rounded product, as a fused
// multiply-add does: the two agree bit for bit on factors across the
// magnitudes the rules meet (an exact identity; Dekker 1971, Ogita, Rump
// and Oishi 2005 for the form used). It fails if the split or the order of
// the partial products is wrong.
func TestTwoProdMatchesFMA(t *testing.T) {
	rng := rand.New(rand.NewSource(3))
	for i := 0; i < 200000; i++ {
		a := (rng.Float64()*2 - 1) * math.Pow(10, float64(rng.Intn(41)-30))
		b := (rng.Float64()*2 - 1) * math.Pow(10, float64(rng.Intn(11)-3))
		if rng.Intn(4) == 0 {
			b = float64(rng.Intn(600) + 1) // the recurrence's integer factors
		}
		p, e := twoProd(a, b)
		if p != a*b || e != math.FMA(a, b, -p) {
			t.Fatalf("twoProd(%v, %v) = %v, %v; want %v, %v", a, b, p, e, a*b, math.FMA(a, b, -p))
		}
	}
}
