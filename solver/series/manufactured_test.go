package series

import (
	"math"
	"sort"
	"testing"

	"edgewise/solver/gauss"
	"edgewise/solver/problem"
)

// manufacturedEdges gives p's four edges the kinds of combination kc of
// the 81 (its base-3 digits, bottom first), each carrying the data of the
// exact field: its value, its entering flux Kx ux nx + Ky uy ny, or for
// convection with coefficient hcs[side] the ambient that makes it exact.
func manufacturedEdges(p *problem.Problem, kc int, hcs [4]float64, exact func(x, y float64) (u, ux, uy float64)) (kinds [4]problem.Kind) {
	for _, e := range problem.Sides {
		kind := problem.Kind(kc % 3)
		kinds[e] = kind
		kc /= 3
		hc := hcs[e]
		p.Edges[e] = problem.Edge{Kind: kind, Hc: hc, F: func(s float64) float64 {
			u, ux, uy := exact(p.Point(e, s))
			n := normal[e]
			fl := p.Kx*ux*real(n) + p.Ky*uy*imag(n) // entering flux
			switch kind {
			case problem.Value:
				return u
			case problem.Flux:
				return fl
			}
			return u + fl/hc // the ambient
		}}
	}
	return kinds
}

// eachManufactured solves the exact field x^2 - y^2 + 3xy + 2 + e^x sin y
// on a 1.3 x 0.7 plate for all 81 combinations of edge kinds, with
// convection coefficients of about 0.001 and 1 (Biot numbers 5e-4 to 2),
// and hands each solution to check with the exact field.
func eachManufactured(t *testing.T, step int, check func(kinds [4]problem.Kind, p *problem.Problem, f Field, exact func(x, y float64) (u, ux, uy float64))) {
	t.Helper()
	exact := func(x, y float64) (u, ux, uy float64) {
		ex := math.Exp(x)
		return x*x - y*y + 3*x*y + 2 + ex*math.Sin(y), 2*x + 3*y + ex*math.Sin(y), -2*y + 3*x + ex*math.Cos(y)
	}
	for _, hcv := range []float64{0.001, 1} {
		hcs := [4]float64{hcv, hcv * 3, hcv, hcv * 2}
		for kc := 0; kc < 81; kc += step {
			p := &problem.Problem{W: 1.3, H: 0.7, Kx: 2, Ky: 2}
			kinds := manufacturedEdges(p, kc, hcs, exact)
			f := solveForTest(t, p)
			check(kinds, p, f, exact)
		}
	}
}

// The mean over the rectangle is within the error estimate, and each
// edge's flow within the flow the estimate allows, K est L / min(W, H)
// (the error of values, of size est, spread over the plate's shorter
// side, across the edge's length L): on the 162 cases of eachManufactured,
// against the exact mean and flows by 40-point Gauss-Legendre rules.
func TestMeansAndFlowsWithinEstimate(t *testing.T) {
	step := 1
	if raceOn {
		step = 5
	}
	gx, wx := make([]float64, 40), make([]float64, 40)
	gy, wy := make([]float64, 40), make([]float64, 40)
	worstMean, worstFlow := 0.0, 0.0
	var pess []float64
	eachManufactured(t, step, func(kinds [4]problem.Kind, p *problem.Problem, f Field, exact func(x, y float64) (u, ux, uy float64)) {
		gauss.Legendre(gx, wx, 0, p.W)
		gauss.Legendre(gy, wy, 0, p.H)
		mean := 0.0
		for i := range gx {
			for j := range gy {
				u, _, _ := exact(gx[i], gy[j])
				mean += wx[i] * wy[j] * u
			}
		}
		mean /= p.W * p.H
		est := f.ErrorEstimate()
		allFlux := kinds == [4]problem.Kind{problem.Flux, problem.Flux, problem.Flux, problem.Flux}
		if !allFlux { // an all-flux field is set to mean 0
			d := math.Abs(f.Mean() - mean)
			worstMean = max(worstMean, d/est)
			if d > est {
				t.Errorf("kinds %v: mean %.15g, exact %.15g: error %.3g above the estimate %.3g", kinds, f.Mean(), mean, d, est)
			}
		}
		for _, e := range problem.Sides {
			L := p.Length(e)
			s, w := gx, wx
			if e == problem.Left || e == problem.Right {
				s, w = gy, wy
			}
			want := 0.0
			for i := range s {
				x, y := p.Point(e, s[i])
				_, ux, uy := exact(x, y)
				n := normal[e]
				want += w[i] * p.Kx * (ux*real(n) + uy*imag(n))
			}
			got, finite := f.Flow(e)
			allowed := p.Kx * est * L / min(p.W, p.H)
			d := math.Abs(got - want)
			worstFlow = max(worstFlow, d/allowed)
			pess = append(pess, allowed/max(d, 1e-300))
			if !finite || d > allowed {
				t.Errorf("kinds %v %s: flow %.15g, exact %.15g: error %.3g above %.3g", kinds, e, got, want, d, allowed)
			}
		}
	})
	sort.Float64s(pess)
	t.Logf("worst error/estimate: mean %.3g, flows %.3g (of K est L/min(W,H)); flows' median pessimism %.3g", worstMean, worstFlow, pess[len(pess)/2])
}
