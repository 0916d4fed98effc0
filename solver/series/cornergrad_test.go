package series

import (
	"math"
	"testing"

	"edgewise/solver/problem"
)

// At a corner whose two edges' data agree (the exact harmonic field
// e^4x cos 4y + 3x gives every edge its data, in the orthotropic map), the
// gradient at the corner point itself is finite and within 1e-4 of the
// exact one, for all 81 combinations of edge kinds: null (NaN) is kept for
// corners where it is truly unbounded (a jump of value, or value and flux
// data that disagree).
func TestCornerGradientsFinite(t *testing.T) {
	exact := func(x, y float64) (u, ux, uy float64) {
		ex := math.Exp(4 * x)
		return 3*x + ex*math.Cos(4*y), 3 + 4*ex*math.Cos(4*y), -4 * ex * math.Sin(4*y)
	}
	step := 1
	if raceOn {
		step = 7
	}
	for _, kx := range []float64{6} {
		for kc := 0; kc < 81; kc += step {
			p := &problem.Problem{W: 1.3, H: 0.7, Kx: kx, Ky: 2}
			a := math.Sqrt(kx / 2)
			kk := kc
			var kinds [4]problem.Kind
			for _, e := range problem.Sides {
				kind := problem.Kind(kk % 3)
				kinds[e] = kind
				kk /= 3
				e, hc := e, 1.5
				p.Edges[e] = problem.Edge{Kind: kind, Hc: hc, F: func(s float64) float64 {
					x, y := p.Point(e, s)
					u, ux, uy := exact(x, a*y)
					uy *= a
					var in float64
					switch e {
					case problem.Bottom:
						in = -p.Ky * uy
					case problem.Top:
						in = p.Ky * uy
					case problem.Left:
						in = -p.Kx * ux
					default:
						in = p.Kx * ux
					}
					switch kind {
					case problem.Value:
						return u
					case problem.Flux:
						return in
					}
					return u + in/hc
				}}
			}
			bs, err := FindBreaks(p)
			if err != nil {
				t.Fatal(err)
			}
			f, err := SolveBreaks(p, bs, Options{})
			if err != nil {
				t.Fatal(err)
			}
			for _, c := range [][2]float64{{0, 0}, {1.3, 0}, {1.3, 0.7}, {0, 0.7}} {
				_, ux, uy := f.At(c[0], c[1])
				_, ex, ey := exact(c[0], a*c[1])
				ey *= a
				if math.IsNaN(ux) || math.IsNaN(uy) || math.Hypot(ux-ex, uy-ey) > 1e-4*math.Hypot(ex, ey) {
					t.Errorf("kx %g kinds %v corner %v: grad %g %g want %g %g", kx, kinds, c, ux, uy, ex, ey)
				}
			}
		}
	}
}
