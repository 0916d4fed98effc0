package exact

import (
	"math"

	"edgewise/solver/gauss"
	"edgewise/solver/problem"
)

// Smooth is a manufactured field, smooth up to the edges and corners of
// any rectangle,
//
//	u = -S x^2 / (2 Kx) + exp(A x) cos(B y) + 0.3 x y + 1.5,  Kx A^2 = Ky B^2
//
// so that Kx u_xx + Ky u_yy = -S. Problem gives a rectangle edges of any
// kinds carrying its data: any independent solution should reproduce it
// to its own accuracy.
type Smooth struct{ Kx, Ky, Src, A float64 }

func (e Smooth) b() float64 { return e.A * math.Sqrt(e.Kx/e.Ky) }

// U returns the field at (x, y).
func (e Smooth) U(x, y float64) float64 {
	return -e.Src/(2*e.Kx)*x*x + math.Exp(e.A*x)*math.Cos(e.b()*y) + 0.3*x*y + 1.5
}

// Grad returns its gradient at (x, y).
func (e Smooth) Grad(x, y float64) (ux, uy float64) {
	ex := math.Exp(e.A * x)
	return -e.Src/e.Kx*x + e.A*ex*math.Cos(e.b()*y) + 0.3*y, -e.b()*ex*math.Sin(e.b()*y) + 0.3*x
}

// Problem returns the w x h rectangle whose edges, of the given kinds
// (indexed by problem.Side), carry the field's data: its value, its
// entering flux, or for convection with coefficient hc the ambient that
// makes it exact.
func (e Smooth) Problem(w, h float64, kinds [4]problem.Kind, hc float64) *problem.Problem {
	pr := &problem.Problem{W: w, H: h, Kx: e.Kx, Ky: e.Ky, Source: e.Src}
	for _, side := range problem.Sides {
		entering := func(s float64) float64 {
			ux, uy := e.Grad(pr.Point(side, s))
			return [4]float64{problem.Bottom: -e.Ky * uy, problem.Right: e.Kx * ux, problem.Top: e.Ky * uy, problem.Left: -e.Kx * ux}[side]
		}
		ed := problem.Edge{Kind: kinds[side]}
		switch kinds[side] {
		case problem.Value:
			ed.F = func(s float64) float64 { return e.U(pr.Point(side, s)) }
		case problem.Flux:
			ed.F = entering
		case problem.Convection:
			ed.Hc = hc
			ed.F = func(s float64) float64 { return e.U(pr.Point(side, s)) + entering(s)/hc }
		}
		pr.Edges[side] = ed
	}
	return pr
}

// Mean returns the field's mean over the w x h rectangle (a 40 x 40
// point Gauss-Legendre rule: exact to rounding for these fields on
// rectangles up to a few units of A^-1 across).
func (e Smooth) Mean(w, h float64) float64 {
	const n = 40
	x, wx := make([]float64, n), make([]float64, n)
	y, wy := make([]float64, n), make([]float64, n)
	gauss.Legendre(x, wx, 0, w)
	gauss.Legendre(y, wy, 0, h)
	s := 0.0
	for i := range x {
		for j := range y {
			s += wx[i] * wy[j] * e.U(x[i], y[j])
		}
	}
	return s / (w * h)
}
