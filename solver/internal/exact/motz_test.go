package exact

import (
	"math"
	"testing"

	"edgewise/solver/gauss"
	"edgewise/solver/problem"
)

// The classical singularity benchmark: the rectangle -1 < x < 1, 0 < y < 1
// with u = 0 on y = 0, x < 0; du/dy = 0 on y = 0, x > 0; u = 500 on x = 1;
// du/dx = 0 on x = -1 and du/dy = 0 on y = 1. Near the origin
//
//	u = sum_k d_k r^(k+1/2) cos((k+1/2) theta)
//
// Coefficients: Motz, Quart. Appl. Math. 1946; computed to many digits by
// Rosser & Papamichael 1975 and by Li, Mathon & Sermer, SIAM J. Numer.
// Anal. 1987 (values recalled from memory, as listed in the project's
// check list).
var motzCoefficients = []struct {
	d   float64
	tol float64 // relative: the digits given
}{
	{401.162453745, 2e-12},
	{87.6559201951, 2e-12},
	{17.2379150, 1e-8}, // the map gives 17.23791507945: the listed digits are cut, not rounded
}

// motz returns the benchmark as a two-part problem on 0 < x < 2,
// 0 < y < 1: u = 0 on the left half of the bottom, 500 on the right side.
func motz(t *testing.T) *TwoParts {
	return mustNew(t, 2, 1, 1, 1, Part{problem.Bottom, 0, 1}, Part{problem.Right, 0, 1}, 0, 500)
}

// The exact field reproduces the published coefficients (projected on
// two circles).
func TestMotzCoefficients(t *testing.T) {
	tp := motz(t)
	for _, rho := range []float64{0.25, 0.5} {
		for k, c := range motzCoefficients {
			d := projection(tp, k, rho)
			if rel := math.Abs(d/c.d - 1); rel > c.tol {
				t.Errorf("rho %g: d%d = %.13g, published %.13g (relative %.2g)", rho, k, d, c.d, rel)
			} else {
				t.Logf("rho %g: d%d = %.13g, published %.13g (relative %.2g)", rho, k, d, c.d, rel)
			}
		}
	}
}

// projection returns d_k from the exact field: on a circle of radius rho
// about the origin (the series converges for rho < 1, the distance to the
// next edges), d_k rho^(k+1/2) = (2/pi) int_0^pi u cos((k+1/2) theta)
// d theta, by 64-point Gauss-Legendre (the integrand is smooth; 64 points
// leave far below 1e-13).
func projection(tp *TwoParts, k int, rho float64) float64 {
	th, wt := make([]float64, 64), make([]float64, 64)
	gauss.Legendre(th, wt, 0, math.Pi)
	nu := float64(k) + 0.5
	sum := 0.0
	for i := range th {
		sum += wt[i] * tp.Value(1+rho*math.Cos(th[i]), rho*math.Sin(th[i])) * math.Cos(nu*th[i])
	}
	return 2 / math.Pi * sum / math.Pow(rho, nu)
}

// Near the origin the field is the three published terms plus
// d3 r^3.5 cos(3.5 theta), d3 from the exact field itself, up to the next
// term, bounded here by 20 r^4.5 (|d4| is of order d2/10; a bound with
// room, not a value). And along the value part the flux density entering
// through y = 0 at x = -r is -u_y = -sum_k (k+1/2) d_k (-1)^k r^(k-1/2).
func TestMotzExpansion(t *testing.T) {
	tp := motz(t)
	d3 := projection(tp, 3, 0.5)
	t.Logf("d3 = %.12g (from the map)", d3)
	for _, r := range []float64{1e-4, 1e-3, 1e-2, 0.05} {
		for _, theta := range []float64{0.01, 0.7, math.Pi / 2, 2.5, math.Pi - 0.01} {
			u := tp.Value(1+r*math.Cos(theta), r*math.Sin(theta))
			sum := d3 * math.Pow(r, 3.5) * math.Cos(3.5*theta)
			for k, c := range motzCoefficients {
				nu := float64(k) + 0.5
				sum += c.d * math.Pow(r, nu) * math.Cos(nu*theta)
			}
			if d := math.Abs(u - sum); d > 20*math.Pow(r, 4.5)+1e-12*500 {
				t.Errorf("r %g theta %g: exact %.15g, four terms %.15g", r, theta, u, sum)
			}
		}
	}
	for _, r := range []float64{1e-6, 1e-4, 1e-2} {
		got := tp.Inflow(problem.Bottom, 1-r)
		want, sign := 0.0, 1.0
		for k, c := range motzCoefficients {
			nu := float64(k) + 0.5
			want -= sign * nu * c.d * math.Pow(r, nu-1)
			sign = -sign
		}
		want -= sign * 3.5 * d3 * math.Pow(r, 2.5)
		if math.Abs(got-want) > 1e-8*math.Abs(want)+50*math.Pow(r, 3.5) {
			t.Errorf("inflow at r %g: %.12g, from the expansion %.12g", r, got, want)
		}
	}
}
