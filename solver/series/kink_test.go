package series

import (
	"math"
	"math/cmplx"
	"sort"
	"testing"

	"edgewise/solver/problem"
)

// kinkTerm is Re(c w^n log w) about a place s0 on an edge, w = t + i d in
// the mapped (isotropic) coordinates: t along the edge past s0, d into the
// region. Its trace has a kink at s0: for n = 1 and c = -i J/pi the value
// J min(0, t); for n = 2 and real c the normal derivative
// -2 c pi min(0, t). It is the exact singular part of a field whose data
// kink there.
type kinkTerm struct {
	side problem.Side
	s0   float64
	n    int
	c    complex128
}

// value returns the term and its gradient in the original coordinates of
// p at (x, y), with a = sqrt(Kx/Ky).
func (k kinkTerm) value(p *problem.Problem, x, y float64) (u, ux, uy float64) {
	a := math.Sqrt(p.Kx / p.Ky)
	var t, d, tx, ty, dx, dy float64
	switch k.side {
	case problem.Bottom:
		t, d, tx, dy = x-k.s0, a*y, 1, a
	case problem.Top:
		t, d, tx, dy = x-k.s0, a*(p.H-y), 1, -a
	case problem.Left:
		t, d, ty, dx = a*(y-k.s0), x, a, 1
	case problem.Right:
		t, d, ty, dx = a*(y-k.s0), p.W-x, a, -1
	}
	d = max(d, 0)
	w := complex(t, d)
	if w == 0 {
		return 0, 0, 0
	}
	wn := cmplx.Pow(w, complex(float64(k.n-1), 0))
	if k.n == 1 {
		wn = 1
	}
	if k.n == 0 {
		wn = 1 / w
	}
	lw := cmplx.Log(w)
	f := k.c * wn * w * lw
	df := k.c * wn * (complex(float64(k.n), 0)*lw + 1)
	ut, ud := real(df), -imag(df)
	return real(f), ut*tx + ud*dx, ut*ty + ud*dy
}

// kinkCase is an exact field: a smooth harmonic part (in the mapped
// coordinates) plus kink terms, on a rectangle whose edges take their data
// from it.
type kinkCase struct {
	name  string
	p     *problem.Problem
	kinks []kinkTerm
	steps []kinkTerm // angle terms (n = 0, c = -i J/pi): steps of value or flux
	nKink int        // kinks FindBreaks must find
	nStep int        // steps FindBreaks must find
}

func (c *kinkCase) exact(x, y float64) (u, ux, uy float64) {
	a := math.Sqrt(c.p.Kx / c.p.Ky)
	X, Y := x/1.3, a*y/1.3
	e := math.Exp(X)
	u = 2*e*math.Cos(Y) + 0.5*x*a*y + 1
	ux = 2*e*math.Cos(Y)/1.3 + 0.5*a*y
	uy = -2*e*math.Sin(Y)*a/1.3 + 0.5*x*a
	for _, k := range append(c.kinks, c.steps...) {
		v, vx, vy := k.value(c.p, x, y)
		u, ux, uy = u+v, ux+vx, uy+vy
	}
	return
}

// setEdges gives every edge of c.p its data from the exact field.
func (c *kinkCase) setEdges(kinds [4]problem.Kind, hc [4]float64) {
	p := c.p
	for _, e := range problem.Sides {
		e, kind, h := e, kinds[e], hc[e]
		p.Edges[e] = problem.Edge{Kind: kind, Hc: h, F: func(s float64) float64 {
			x, y := p.Point(e, s)
			u, ux, uy := c.exact(x, y)
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
			return u + in/h
		}}
	}
}

func kinkCases() []*kinkCase {
	V, F, C := problem.Value, problem.Flux, problem.Convection
	var out []*kinkCase
	// a value kink of slope jump 40 on the bottom (as max(0, 40 (s - s0)))
	c := &kinkCase{name: "value kink", p: &problem.Problem{W: 1.5, H: 1, Kx: 2, Ky: 0.5},
		kinks: []kinkTerm{{side: problem.Bottom, s0: 0.55, n: 1, c: complex(0, -40/math.Pi)}}, nKink: 1}
	c.setEdges([4]problem.Kind{V, C, V, F}, [4]float64{0, 3, 0, 0})
	out = append(out, c)
	// two flux kinks on the bottom, with value, convection, flux elsewhere
	c = &kinkCase{name: "flux kinks", p: &problem.Problem{W: 1, H: 1.2, Kx: 1, Ky: 1},
		kinks: []kinkTerm{{side: problem.Bottom, s0: 0.3, n: 2, c: 3}, {side: problem.Bottom, s0: 0.7, n: 2, c: -1.5}}, nKink: 2}
	c.setEdges([4]problem.Kind{F, V, C, F}, [4]float64{0, 0, 2, 0})
	out = append(out, c)
	// an ambient kink on a convection edge (left), orthotropic; the
	// exact field has the kink of the flux and the term taking back the
	// exchange's t^2 ln t
	hc := 4.0
	p := &problem.Problem{W: 1.2, H: 0.8, Kx: 3, Ky: 1.5}
	kappa := p.Kx
	cc := 0.7
	c = &kinkCase{name: "ambient kink", p: p,
		kinks: []kinkTerm{{side: problem.Left, s0: 0.35, n: 2, c: complex(cc, 0)},
			{side: problem.Left, s0: 0.35, n: 3, c: complex(0, -hc*cc/(3*kappa))}}, nKink: 1}
	c.setEdges([4]problem.Kind{V, V, F, C}, [4]float64{0, 0, 0, hc})
	out = append(out, c)
	// a flux kink on the right edge next to value and flux corners
	c = &kinkCase{name: "flux kink right", p: &problem.Problem{W: 2, H: 1, Kx: 1, Ky: 4},
		kinks: []kinkTerm{{side: problem.Right, s0: 0.6, n: 2, c: -2}}, nKink: 1}
	c.setEdges([4]problem.Kind{V, F, F, V}, [4]float64{})
	out = append(out, c)
	// a flux step and a flux kink at the same place on the top (the flux
	// jumps there and so does its slope); the step term is Re(c w log w)
	// with real c (n = 1), whose normal derivative on the edge is -c theta
	c = &kinkCase{name: "flux step with kink", p: &problem.Problem{W: 1.4, H: 1, Kx: 1, Ky: 1},
		kinks: []kinkTerm{{side: problem.Top, s0: 0.8, n: 2, c: 1.2}},
		steps: []kinkTerm{{side: problem.Top, s0: 0.8, n: 1, c: -0.9}}, nKink: 1, nStep: 1}
	c.setEdges([4]problem.Kind{V, V, F, C}, [4]float64{0, 0, 0, 1.5})
	out = append(out, c)
	// weak exchange (Bi 1e-5, no value edge): a flux kink on the bottom and
	// an ambient kink on the right, solved in the limit h -> 0
	hw := 1e-5
	p = &problem.Problem{W: 1, H: 1, Kx: 1, Ky: 1}
	c = &kinkCase{name: "weak exchange kinks", p: p,
		kinks: []kinkTerm{{side: problem.Bottom, s0: 0.4, n: 2, c: 1},
			{side: problem.Right, s0: 0.5, n: 2, c: 0.5}, {side: problem.Right, s0: 0.5, n: 3, c: complex(0, -hw*0.5/3)}}, nKink: 2}
	c.setEdges([4]problem.Kind{F, C, F, C}, [4]float64{0, hw, 0, hw})
	out = append(out, c)
	return out
}

// Exact kinked fields: FindBreaks finds each kink, and at every probe
// (inside, on the edges, at the kinks themselves) and at every node of the
// output grid the true error is at or below the reported estimate. The
// estimate must not be more than 1e4 times pessimistic at the worst node
// (it is a bound on the tails; the median over the cases is reported).
func TestKinksManufactured(t *testing.T) {
	var ratios []float64
	worst := 0.0
	for _, c := range kinkCases() {
		bs, err := FindBreaks(c.p)
		if err != nil {
			t.Fatal(err)
		}
		n, nStep := 0, 0
		for _, b := range bs {
			if b.Class == KinkBreak {
				n++
				found := false
				for _, k := range c.kinks {
					found = found || (k.side == b.Side && math.Abs(k.s0-b.S) < 1e-9)
				}
				if !found {
					t.Errorf("%s: kink at %v s=%g not in the data", c.name, b.Side, b.S)
				}
			} else if b.Class == FluxBreak && c.nStep > 0 {
				nStep++
			} else {
				t.Errorf("%s: unexpected %v at %v s=%g", c.name, b.Class, b.Side, b.S)
			}
		}
		if n != c.nKink || nStep != c.nStep {
			t.Errorf("%s: found %d kinks and %d steps, want %d and %d", c.name, n, nStep, c.nKink, c.nStep)
		}
		f, err := SolveBreaks(c.p, bs, Options{})
		if err != nil {
			t.Fatal(err)
		}
		est := f.ErrorEstimate()
		maxErr := 0.0
		check := func(where string, x, y, u float64) {
			e, _, _ := c.exact(x, y)
			d := math.Abs(u - e)
			maxErr = max(maxErr, d)
			worst = max(worst, d/est)
			if d > est {
				t.Errorf("%s: %s (%.4g, %.4g): error %.3g above the estimate %.3g", c.name, where, x, y, d, est)
			}
		}
		var pts [][2]float64
		for i := 0; i <= 12; i++ {
			for j := 0; j <= 12; j++ {
				pts = append(pts, [2]float64{c.p.W * float64(i) / 12, c.p.H * math.Pow(float64(j)/12, 1.5)})
			}
		}
		for _, k := range c.kinks {
			x, y := c.p.Point(k.side, k.s0)
			pts = append(pts, [2]float64{x, y})
		}
		for _, pt := range pts {
			u, _, _ := f.At(pt[0], pt[1])
			check("probe", pt[0], pt[1], u)
		}
		const nx, ny = 60, 40
		g := make([]float64, (nx+1)*(ny+1))
		f.Grid(nx, ny, g, nil, nil)
		for j := 0; j <= ny; j++ {
			for i := 0; i <= nx; i++ {
				x, y := c.p.W*float64(i)/nx, c.p.H*float64(j)/ny
				check("grid node", x, y, g[j*(nx+1)+i])
			}
		}
		ratios = append(ratios, est/maxErr)
		if est > 1e4*maxErr && est > 1e-12*10 {
			t.Errorf("%s: estimate %.3g is %.3g times the largest error", c.name, est, est/maxErr)
		}
		t.Logf("%s: estimate %.3g, largest error %.3g, terms %d", c.name, est, maxErr, f.Terms())
	}
	sort.Float64s(ratios)
	t.Logf("worst error/estimate %.3g; pessimism (estimate/largest error) median %.3g", worst, ratios[len(ratios)/2])
}

// The flow through a flux edge whose data are piecewise linear (the
// readings form: 0 at 0, 8 at 0.5, 2 at 1) is the integral of its data,
// exact to rounding: 0.5 (0 + 8)/2 + 0.5 (8 + 2)/2 = 4.5.
func TestKinkedFluxFlowExact(t *testing.T) {
	p := &problem.Problem{W: 1, H: 1, Kx: 1, Ky: 1}
	p.Edges[problem.Bottom] = problem.Edge{Kind: problem.Flux, F: func(s float64) float64 {
		if s < 0.5 {
			return 16 * s
		}
		return 8 - 12*(s-0.5)
	}}
	p.Edges[problem.Right] = problem.Edge{Kind: problem.Value, F: problem.Const(1)}
	p.Edges[problem.Top] = problem.Edge{Kind: problem.Value, F: problem.Const(1)}
	p.Edges[problem.Left] = problem.Edge{Kind: problem.Flux, F: func(s float64) float64 { return 3*math.Abs(s-0.25) - 1 }}
	bs, err := FindBreaks(p)
	if err != nil {
		t.Fatal(err)
	}
	if len(bs) != 2 {
		t.Fatalf("breaks %v, want the kinks at 0.5 (bottom) and 0.25 (left)", bs)
	}
	f, err := SolveBreaks(p, bs, Options{})
	if err != nil {
		t.Fatal(err)
	}
	// 3 |s - 0.25| - 1 over [0, 1]: 3 (0.25^2 + 0.75^2)/2 - 1 = -0.0625
	for _, c := range []struct {
		e    problem.Side
		want float64
	}{{problem.Bottom, 4.5}, {problem.Left, -0.0625}} {
		q, ok := f.Flow(c.e)
		if !ok || math.Abs(q-c.want) > 1e-13 {
			t.Errorf("flow through %v = %.17g (finite %v), want %g", c.e, q, ok, c.want)
		}
	}
}

// On a value edge with a kink the field equals the data, at the kink too:
// max(0, 40 (s - 0.25)) on the bottom, 0 elsewhere.
func TestValueKinkOnEdge(t *testing.T) {
	p := &problem.Problem{W: 1, H: 1, Kx: 1, Ky: 1}
	data := func(s float64) float64 { return max(0, 40*(s-0.25)) }
	p.Edges[problem.Bottom] = problem.Edge{Kind: problem.Value, F: data}
	p.Edges[problem.Right] = problem.Edge{Kind: problem.Flux, F: problem.Const(0)}
	p.Edges[problem.Top] = problem.Edge{Kind: problem.Value, F: problem.Const(0)}
	p.Edges[problem.Left] = problem.Edge{Kind: problem.Flux, F: problem.Const(0)}
	f := solveForTest(t, p)
	est := f.ErrorEstimate()
	for _, s := range []float64{0.1, 0.25, 0.2501, 0.5, 0.9} {
		u, _, _ := f.At(s, 0)
		if d := math.Abs(u - data(s)); d > est {
			t.Errorf("u(%g, 0) = %.10g, data %.10g (estimate %.3g)", s, u, data(s), est)
		}
	}
}
