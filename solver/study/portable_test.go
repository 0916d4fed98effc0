package study

import (
	"math"
	"math/rand/v2"
	"testing"
)

// pow agrees with math.Pow to within two ulps (each is within an ulp of the true value) (exactly where math.Pow
// runs the same Go code, as in WebAssembly), and exp and log with math's.
func TestPortablePow(t *testing.T) {
	rng := rand.New(rand.NewPCG(1, 2))
	ulps := func(a, b float64) float64 {
		return math.Abs(a-b) / (math.Nextafter(math.Abs(b), math.Inf(1)) - math.Abs(b))
	}
	for range 20000 {
		x := math.Exp(rng.Float64()*60 - 30)
		y := rng.Float64()
		if d := ulps(pow(x, y), math.Pow(x, y)); d > 2 {
			t.Fatalf("pow(%g, %g) = %.17g, math.Pow %.17g (%g ulp)", x, y, pow(x, y), math.Pow(x, y), d)
		}
		if d := ulps(exp(y*20-10), math.Exp(y*20-10)); d > 2 {
			t.Fatalf("exp(%g) is %g ulp from math.Exp", y*20-10, d)
		}
		if d := ulps(log(x), math.Log(x)); d > 2 && math.Abs(log(x)) > 1e-3 {
			t.Fatalf("log(%g) is %g ulp from math.Log", x, d)
		}
	}
	for _, c := range []struct{ x, y, want float64 }{{100, 0.5, 10}, {7, 0, 1}, {7, 1, 7}, {1, 0.3, 1}} {
		if got := pow(c.x, c.y); got != c.want {
			t.Errorf("pow(%g, %g) = %.17g, want %g", c.x, c.y, got, c.want)
		}
	}
}
