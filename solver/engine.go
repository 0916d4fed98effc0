package solver

import (
	"fmt"
	"math"

	"edgewise/solver/problem"
)

// solveSeries runs the series engine. (Temporary: constant values on four
// value edges, by the sine series of each sub-problem, until the full
// engine lands.)
func solveSeries(p *problem.Problem) (field, error) {
	f := &simpleSeries{p: p, terms: 199}
	for _, side := range problem.Sides {
		e := p.Edges[side]
		if e.Kind != problem.Value {
			return nil, errorf("edges."+side.String()+".kind", "only value edges are solved for now")
		}
		v, err := p.Eval(side, 0)
		if err != nil {
			return nil, err
		}
		f.v[side] = v
	}
	if p.Kx != p.Ky || p.Source != 0 {
		return nil, fmt.Errorf("only isotropic problems without a source are solved for now")
	}
	return f, nil
}

type simpleSeries struct {
	p     *problem.Problem
	v     [4]float64
	terms int
}

// At sums, for each edge, 4v/pi sum over odd n of sin(n pi s/L) sinh(n pi d'/L)/sinh(n pi D/L) / n,
// with d' the distance from the opposite edge.
func (f *simpleSeries) At(x, y float64) (u, ux, uy float64) {
	W, H := f.p.W, f.p.H
	type sub struct {
		v, s, d, L, D float64
		ds, dd        [2]float64 // d s/d(x,y), d d/d(x,y)
	}
	subs := []sub{
		{f.v[problem.Bottom], x, H - y, W, H, [2]float64{1, 0}, [2]float64{0, -1}},
		{f.v[problem.Top], x, y, W, H, [2]float64{1, 0}, [2]float64{0, 1}},
		{f.v[problem.Left], y, W - x, H, W, [2]float64{0, 1}, [2]float64{-1, 0}},
		{f.v[problem.Right], y, x, H, W, [2]float64{0, 1}, [2]float64{1, 0}},
	}
	for _, b := range subs {
		if b.v == 0 {
			continue
		}
		for n := 1; n <= f.terms; n += 2 {
			k := float64(n) * math.Pi / b.L
			sh := math.Exp(k*(b.d-b.D)) * (1 - math.Exp(-2*k*b.d)) / (1 - math.Exp(-2*k*b.D))
			ch := math.Exp(k*(b.d-b.D)) * (1 + math.Exp(-2*k*b.d)) / (1 - math.Exp(-2*k*b.D))
			c := 4 * b.v / (math.Pi * float64(n))
			sn, cs := math.Sincos(k * b.s)
			u += c * sn * sh
			gs, gd := c*k*cs*sh, c*k*sn*ch
			ux += gs*b.ds[0] + gd*b.dd[0]
			uy += gs*b.ds[1] + gd*b.dd[1]
		}
	}
	return u, ux, uy
}

func (f *simpleSeries) Grid(nx, ny int, u, ux, uy []float64) {
	for j := 0; j <= ny; j++ {
		for i := 0; i <= nx; i++ {
			k := j*(nx+1) + i
			u[k], ux[k], uy[k] = f.At(float64(i)*f.p.W/float64(nx), float64(j)*f.p.H/float64(ny))
		}
	}
}

func (f *simpleSeries) Flow(problem.Side) (float64, bool) { return 0, false }
func (f *simpleSeries) Mean() float64                     { return 0 }
func (f *simpleSeries) Terms() int                        { return f.terms }
func (f *simpleSeries) ErrorEstimate() float64            { return 0 }
func (f *simpleSeries) Warnings() []string                { return nil }
