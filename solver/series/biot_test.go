package series

import (
	"fmt"
	"math"
	"testing"

	"edgewise/solver/problem"
)

// biotCase is the exact field of TestManufacturedAllKinds on a 1.3 x 0.7
// rectangle, every edge a convection edge with coefficient hc, or the
// bottom a value edge (value): the comparison the speed target names (a
// high-Biot case at most 3 times the same case with a value edge).
func biotCase(hc float64, value bool) *problem.Problem {
	exact := func(x, y float64) (u, ux, uy float64) {
		ex := math.Exp(x)
		return x*x - y*y + 3*x*y + 2 + ex*math.Sin(y), 2*x + 3*y + ex*math.Sin(y), -2*y + 3*x + ex*math.Cos(y)
	}
	p := &problem.Problem{W: 1.3, H: 0.7, Kx: 2, Ky: 2}
	for _, e := range problem.Sides {
		e, kind := e, problem.Convection
		if value && e == problem.Bottom {
			kind = problem.Value
		}
		p.Edges[e] = problem.Edge{Kind: kind, Hc: hc, F: func(s float64) float64 {
			x, y := p.Point(e, s)
			u, ux, uy := exact(x, y)
			n := normal[e]
			if kind == problem.Value {
				return u
			}
			return u + p.Kx*(ux*real(n)+uy*imag(n))/hc
		}}
	}
	return p
}

// BenchmarkHighBiot: Bi = hc L/k from about 0.65 to 6500. Measured
// (native, shared 2-core machine): 3.5 ms at hc = 1; at hc = 1000 0.49 s
// with four convection edges and 0.31 s with the bottom a value edge; at
// hc = 10000 0.91 s and 1.33 s (about 4096 terms on the convection edges:
// their coefficients fall fast only past lambda ~ beta).
func BenchmarkHighBiot(b *testing.B) {
	for _, hc := range []float64{1, 1000, 10000} {
		for _, value := range []bool{false, true} {
			name := fmt.Sprintf("hc=%g/convection", hc)
			if value {
				name = fmt.Sprintf("hc=%g/value-bottom", hc)
			}
			b.Run(name, func(b *testing.B) {
				p := biotCase(hc, value)
				for i := 0; i < b.N; i++ {
					bs, err := FindBreaks(p)
					if err != nil {
						b.Fatal(err)
					}
					if _, err := SolveBreaks(p, bs, Options{}); err != nil {
						b.Fatal(err)
					}
				}
			})
		}
	}
}
