package series

import (
	"math"

	"edgewise/solver/problem"
)

// weakBiot is the largest Biot number h L/k (L the longer side, k the
// smaller conductivity) of a convection edge below which, when no edge
// holds a value, the exchange is solved as the limit h -> 0 (solveWeak):
// the sub-problems' first eigenvalue, about sqrt(2 Bi)/L, is then too small
// for their exponentials to keep the digits of the nearly uniform level
// (measured: the level off by 1e-9 of the data at Bi = 1e-12, by 15% at
// 1e-31), and the cross-check's grid system nearly singular. Up to Bi =
// 1e-3 both ways agree to 1e-12 of the level; 1e-4 leaves a margin.
const weakBiot = 1e-4

// weakExchange reports whether p exchanges only weakly: no value edge, at
// least one convection edge with h > 0, and every such edge below
// weakBiot.
func weakExchange(p *problem.Problem) bool {
	L, k := max(p.W, p.H), min(p.Kx, p.Ky)
	exchanging := false
	for _, e := range p.Edges {
		switch {
		case e.Kind == problem.Value:
			return false
		case e.Kind == problem.Convection && e.Hc > 0:
			if e.Hc*L/k >= weakBiot {
				return false
			}
			exchanging = true
		}
	}
	return exchanging
}

// solveWeak solves a weakly exchanging problem as the limit h -> 0: the
// field is a level C plus a part v of area mean zero, and the convection
// edges become flux edges with the entering flux h (a - C - v) they carry:
//
//	C = (integral of h a over the convection edges + the other inflows
//	     + the source - integral of h v) / integral of h
//
// so that the flux problem for v balances by construction. v starts at 0
// and is corrected with the last v on the edges; each correction gains a
// factor of the Biot number, so one or two solves reach the tolerance.
func solveWeak(p *problem.Problem, breaks []Break, opt Options) (Field, error) {
	L, k := max(p.W, p.H), min(p.Kx, p.Ky)
	bi := 0.0
	for _, e := range p.Edges {
		if e.Kind == problem.Convection {
			bi = max(bi, e.Hc*L/k)
		}
	}
	tol := opt.Tol
	if !(tol > 0) || math.IsInf(tol, 1) {
		tol = 1e-9
	}
	// solves: the error after n of them is about bi^n of the variation
	n := 1
	for r := bi; r > 1e-3*tol && n < 8; r *= bi {
		n++
	}
	opt.balanced = true
	var v Field // the last v; nil before the first solve
	var q problem.Problem
	var c float64
	for it := 0; it < n; it++ {
		q = *p
		vPrev := v
		edgeV := func(side problem.Side, s float64) float64 {
			if vPrev == nil {
				return 0
			}
			x, y := p.Point(side, s)
			u, _, _ := vPrev.At(x, y)
			return u
		}
		// C from the balance, with Gauss-Legendre rules split at the breaks
		num, den := p.Source*p.W*p.H, 0.0
		for _, side := range problem.Sides {
			e, side := p.Edges[side], side
			switch {
			case e.Kind == problem.Flux:
				num += edgeIntegral(p, side, e.F)
			case e.Kind == problem.Convection && e.Hc > 0:
				hc, f := e.Hc, e.F
				num += edgeIntegral(p, side, func(s float64) float64 { return hc * (f(s) - edgeV(side, s)) })
				den += hc * p.Length(side)
			}
		}
		c = num / den
		for _, side := range problem.Sides {
			e, side := p.Edges[side], side
			if e.Kind == problem.Convection && e.Hc > 0 {
				hc, f, cc := e.Hc, e.F, c
				q.Edges[side] = problem.Edge{Kind: problem.Flux, Breaks: e.Breaks,
					F: func(s float64) float64 { return hc * (f(s) - cc - edgeV(side, s)) }}
			}
		}
		var qb []Break
		for _, b := range breaks {
			if e := p.Edges[b.Side]; (b.Class == FluxBreak || b.Class == KinkBreak) && e.Kind == problem.Convection {
				b.From, b.To = e.Hc*b.From, e.Hc*b.To // the flux h (a - C - v) breaks by h times the ambient's break
			}
			qb = append(qb, b)
		}
		f, err := SolveBreaks(&q, qb, opt)
		if err != nil {
			return nil, err
		}
		v = f
	}
	w := &weakField{v: v, c: c, q: q}
	// what the last correction left: about bi times the change of v
	w.est = v.ErrorEstimate()
	if n > 0 {
		lo, hi := math.Inf(1), math.Inf(-1)
		for _, side := range problem.Sides {
			for i := 0; i <= 16; i++ {
				x, y := p.Point(side, p.Length(side)*float64(i)/16)
				u, _, _ := v.At(x, y)
				lo, hi = min(lo, u), max(hi, u)
			}
		}
		w.est += math.Pow(bi, float64(n))*(hi-lo) + 1e-14*max(math.Abs(c), hi-lo) // and rounding of the level
	}
	return w, nil
}

// edgeIntegral integrates f along edge side: 16-point Gauss-Legendre rules
// on 64 panels, split at the edge's flux breaks.
func edgeIntegral(p *problem.Problem, side problem.Side, f func(float64) float64) float64 {
	L := p.Length(side)
	cuts := []float64{0}
	for _, b := range p.Edges[side].Breaks {
		if b > 0 && b < L {
			cuts = append(cuts, b)
		}
	}
	cuts = append(cuts, L)
	sum := 0.0
	for i := 0; i+1 < len(cuts); i++ {
		a, b := cuts[i], cuts[i+1]
		const panels = 64
		h := (b - a) / panels
		for j := 0; j < panels; j++ {
			m, r := a+(float64(j)+0.5)*h, h/2
			for q := range gl16x {
				sum += gl16w[q] * r * f(m+r*gl16x[q])
			}
		}
	}
	return sum
}

// weakField is a weakly exchanging problem's field: the level c plus v.
type weakField struct {
	v   Field
	c   float64
	q   problem.Problem // the flux problem v solves
	est float64
}

func (w *weakField) At(x, y float64) (u, ux, uy float64) {
	u, ux, uy = w.v.At(x, y)
	return u + w.c, ux, uy
}

func (w *weakField) Grid(nx, ny int, u, ux, uy []float64) {
	w.v.Grid(nx, ny, u, ux, uy)
	for i := range u[:(nx+1)*(ny+1)] {
		u[i] += w.c
	}
}

func (w *weakField) Flow(e problem.Side) (float64, bool) { return w.v.Flow(e) }
func (w *weakField) Mean() float64                       { return w.v.Mean() + w.c }
func (w *weakField) Terms() int                          { return w.v.Terms() }
func (w *weakField) ErrorEstimate() float64              { return w.est }

// Equivalent returns the flux problem the field's varying part solves,
// with area mean zero, and the level added to it: a check by another
// method solves that problem (the weakly exchanging one is nearly singular
// for it too).
func (w *weakField) Equivalent() (*problem.Problem, float64) { return &w.q, w.c }

// Warnings returns v's warnings, the level being fixed by the exchange
// rather than by the rule mean = 0, and says how the level was found.
func (w *weakField) Warnings() []problem.Warning {
	out := []problem.Warning{}
	for _, x := range w.v.Warnings() {
		if x.Code != problem.MeanFixed {
			out = append(out, x)
		}
	}
	return append(out, problem.Warning{Code: problem.WeakExchange, Edges: []problem.Side{},
		Text: "the convection edges exchange so weakly (Biot number h L/k below 1e-4) that the field is nearly uniform: " +
			"its level is fixed by the balance of the exchange with the ambients, as in the limit of h going to 0"})
}
