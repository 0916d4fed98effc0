package series

import (
	"cmp"
	"errors"
	"fmt"
	"math"
	"runtime"
	"slices"
	"strconv"
	"sync"

	"edgewise/solver/linalg"
	"edgewise/solver/problem"
)

// Mixed edges (problem.Edge.Parts): the conditions change along an edge,
// and a convection coefficient may vary along it.
//
// Method (a dual formulation with singular enrichment). Each mixed edge is
// solved as a VALUE edge of an unmixed problem (the "inner" problem, which
// the series solves as any other), whose value on the edge's value parts
// is the user's and on each run of flux and convection parts (a span) an
// unknown polynomial v(s) = sum_j a_j T_j(tau), tau mapping the span onto
// [-1, 1]. Where a value part meets a flux or convection part the field
// grows like r^(1/2) (a gradient like r^(-1/2)), which no polynomial
// carries: the singular family of the edge (mixedfamily.go), the
// functions F_ij = Re(c_i (zeta - z_i)^(j + 1/2)) of each meeting z_i,
// carries it analytically. Each vanishes on the value side of its meeting
// and has no normal derivative on the other side, along the whole line of
// the edge; what it puts elsewhere (beyond the other meetings, on the
// other edges) is smooth and goes into the inner problem's data. The
// field is
//
//	u = inner(a, b) + sum_k b_k F_k,
//
// linear in the unknowns a (polynomials) and b (family). The conditions of
// the flux and convection parts (entering flux = q, or = h(s) (ambient - u))
// are collocated at Chebyshev points of each span, and the inner data are
// held smooth where a span meets a value part and continuous where it
// meets a value condition at a corner, by construction (see span), so
// that the inner problem has no break there; the system is solved in the
// least-squares sense by a singular value decomposition (linalg.MinNorm). Each unknown's
// response is one series solve of the inner problem with that unknown's
// data alone (the series is linear in its data); the answer is one more
// series solve with the fitted data.
//
// Accuracy: the residual of the flux and convection conditions is checked
// at places between the collocation points; a flux residual r over a span
// of length l moves the field by about r l / k, which is added to the
// series' own estimate. If that is above the target the polynomials and
// the family grow (mixedLevels), and the level with the smallest estimate
// is kept; when that misses the target a warning says so and gives the
// estimate (not converged above mixedUnconverged of the data's range).
//
// Why this method: the singular family makes the meetings exact in form
// (the coefficients of r^(1/2), r^(3/2) ... are fitted, not approximated by
// a series), so values, gradients away from the meetings, and flows and
// means of every part converge fast; the alternative dual-series route
// (weighted Chebyshev fluxes on the value parts) needs the series kernel
// split into its logarithmic and smooth parts for every edge basis, which
// this engine's four families of bases would each need anew.

// Sizes of the fit, by level: polynomial terms per span, family members
// per meeting (plus two), collocation points per unknown.
var mixedLevels = [...]struct{ poly, perMeet int }{{10, 4}, {16, 6}}

const (
	mixedRowsPer   = 3     // collocation points per unknown of a span
	mixedRcond     = 1e-10 // singular values treated as zero, relative
	mixedCheckEach = 4     // check places per collocation interval
	// a level beyond the first is tried only up to this many unknowns
	mixedMaxUnknowns = 200
	// each unknown's response: its errors enter the fit, which the check
	// of the final field measures; the final field is solved to Options.Tol
	mixedResponseTol   = 1e-9
	mixedResponseTerms = 512
)

// mixedEdge is one mixed edge, as the solver sees it.
type mixedEdge struct {
	side   problem.Side
	e      problem.Edge
	L      float64
	value  []bool    // part i holds a value
	meets  []float64 // where a value part meets another kind, or a holding step of h (holdSteps)
	before []bool    // for each meeting: the value (or holding) side is before it
	logs   []bool    // for each meeting: a step of flux or of h inside a span (log functions)
	fam    *family   // nil without meetings
	famOff int
	spans  []span
}

// span is a run of flux and convection parts of a mixed edge. Its inner
// data are
//
//	v(tau) = sum_c d_c Phi_c(tau) + B(tau) sum_j a_j T_j(tau)
//
// where the conditions c pin v and its first three derivatives to the
// inner data of the value part it meets inside the edge (the regular part
// of the field continues the value data analytically across a meeting),
// or v to a value condition it meets at a corner: Phi_c are the cardinal
// polynomials of those conditions and B = (1 + tau)^pl (1 - tau)^ph
// vanishes to the matching order (pl, ph: 4 at a meeting, 1 at a value
// corner, 0 at a free end). So every unknown's data, and the user's, are
// smooth to the third derivative at the meetings: no unknown puts a break
// into the inner problem, and the series converge fast.
type span struct {
	from, to   float64
	first, end int // parts first .. end-1
	off, m     int // its coefficients a_j in the unknowns
	rows       []float64
	pl, ph     int
	conds      []cond
	phi        [][]float64 // Phi_c as monomial coefficients in tau
}

// cond is one pinning condition of a span end: the value (order 0) or a
// derivative along s of the inner data of edge side at s, from the side
// dir.
type cond struct {
	at    float64 // tau: -1 or 1
	order int
	side  problem.Side
	s     float64
	dir   int
}

func (sp *span) tau(s float64) float64 { return (2*s - sp.from - sp.to) / (sp.to - sp.from) }

// cheb writes T_j(tau) and their derivatives by tau.
func cheb(tau float64, t, dt []float64) {
	t0, t1, d0, d1 := 1.0, tau, 0.0, 1.0
	for j := range t {
		switch j {
		case 0:
			t[j], dt[j] = 1, 0
		case 1:
			t[j], dt[j] = tau, 1
		default:
			t0, t1, d0, d1 = t1, 2*tau*t1-t0, d1, 2*t1+2*tau*d1-d0
			t[j], dt[j] = t1, d1
		}
	}
}

// mixedSolver holds a problem with mixed edges and its unknowns.
type mixedSolver struct {
	pr     *problem.Problem // the user's problem
	opt    Options
	edges  []*mixedEdge
	bySide [4]*mixedEdge
	n      int // unknowns
}

// simplify returns p with every mixed edge that is no more than a one-
// condition edge with breaks (all parts values; all fluxes or insulated;
// all convection with one constant h) written as that edge.
func simplify(p *problem.Problem) *problem.Problem {
	q := *p
	for _, side := range problem.Sides {
		e := p.Edges[side]
		if !e.Mixed() {
			continue
		}
		L := p.Length(side)
		kind, h, same := e.Parts[0].Kind, -1.0, true
		for i, part := range e.Parts {
			k := part.Kind
			if k == problem.Convection {
				from, to := e.PartRange(i, L)
				hc, constant := ConstantH(part.Hc, from, to)
				if constant && hc == 0 {
					k = problem.Flux // insulated
				} else if !constant || (h >= 0 && hc != h) {
					same = false
				} else {
					h = hc
				}
			}
			if i == 0 {
				kind = k
			}
			same = same && k == kind
		}
		if !same {
			continue
		}
		parts := e.Parts
		f := func(s float64) float64 {
			i := e.PartAt(s)
			if parts[i].Kind == problem.Convection && kind == problem.Flux {
				return 0
			}
			return parts[i].F(s)
		}
		q.Edges[side] = problem.Edge{Kind: kind, F: f, Hc: max(h, 0)}
	}
	return &q
}

// ConstantH samples h at 65 places over [from, to] and reports whether it
// is one number, and which.
func ConstantH(h func(float64) float64, from, to float64) (float64, bool) {
	v := h(from)
	for i := 1; i <= 64; i++ {
		if h(from+(to-from)*float64(i)/64) != v {
			return 0, false
		}
	}
	return v, true
}

// solveMixed solves a problem with mixed edges (see the method above).
func solveMixed(p *problem.Problem, opt Options) (Field, error) {
	if err := p.Validate(); err != nil {
		return nil, err
	}
	q := simplify(p)
	if !mixed(q) {
		breaks, err := FindBreaks(q)
		if err != nil {
			return nil, err
		}
		f, err := SolveBreaks(q, breaks, opt)
		if err != nil {
			return nil, err
		}
		return &mixedField{pr: p, inner: f}, nil
	}
	var last *mixedField
	opt.cache = newProjCache()
	for level := range mixedLevels {
		ms := newMixedSolver(q, opt, level)
		if level > 0 && ms.n > mixedMaxUnknowns {
			break // many meetings: the first level's answer stands, with its estimate
		}
		mf, err := ms.solve()
		if err != nil {
			return nil, err
		}
		mf.pr = p
		if last == nil || mf.ErrorEstimate() < last.ErrorEstimate() {
			last = mf // the best level so far
		}
		if mf.ErrorEstimate() <= mf.target {
			break
		}
	}
	if est := last.ErrorEstimate(); est > mixedUnconverged*last.scale {
		last.warnings = append(last.warnings, problem.Warning{Code: problem.NotConverged, Edges: last.mixedSides(),
			Text: fmt.Sprintf("The conditions along the mixed edges were met only to an estimated %.3g in the field "+
				"(%.2g of the data's range): the numbers are not reliable.", est, est/last.scale)})
	} else if est > last.target {
		last.warnings = append(last.warnings, problem.Warning{Code: problem.TermLimit, Edges: last.mixedSides(),
			Text: fmt.Sprintf("The conditions along the mixed edges were met to an estimated %.3g in the field "+
				"(%.2g of the data's range), above the engine's usual target.", est, est/last.scale)})
	}
	return last, nil
}

func newMixedSolver(p *problem.Problem, opt Options, level int) *mixedSolver {
	ms := &mixedSolver{pr: p, opt: opt}
	lv := mixedLevels[level]
	// many meetings (up to 63 on an edge of 64 segments): fewer functions
	// each, so that the fit stays a few hundred unknowns
	meets := 0
	for _, e := range p.Edges {
		for i := 1; i < len(e.Parts); i++ {
			if (e.Parts[i].Kind == problem.Value) != (e.Parts[i-1].Kind == problem.Value) {
				meets++
			}
		}
	}
	if meets > 6 {
		lv.poly, lv.perMeet = 6, 1
	}
	c := math.Sqrt(p.Kx / p.Ky)
	for _, side := range problem.Sides {
		e := p.Edges[side]
		if !e.Mixed() {
			continue
		}
		me := &mixedEdge{side: side, e: e, L: p.Length(side)}
		for _, part := range e.Parts {
			me.value = append(me.value, part.Kind == problem.Value)
		}
		for i := 1; i < len(e.Parts); i++ {
			if me.value[i] != me.value[i-1] {
				me.meets = append(me.meets, e.Parts[i-1].To)
				me.before = append(me.before, me.value[i-1])
				me.logs = append(me.logs, false)
			}
		}
		ms.holdSteps(me)
		corners := ms.valueCorners(me)
		if len(me.meets)+len(corners) > 0 {
			ts := 1.0
			kappa := math.Sqrt(p.Kx * p.Ky)
			if side == problem.Left || side == problem.Right {
				ts, kappa = c, p.Kx
			}
			lm := me.L * ts
			per := lv.perMeet + 2
			fam := &family{fr: newFrame(p, side), centre: lm / 2, half: lm / 2,
				per: per, n: per * (len(me.meets) + len(corners)), kappa: kappa, ts: ts}
			for i, s := range me.meets {
				fam.z = append(fam.z, complex((s*ts-fam.centre)/fam.half, 0))
				c := complex(1, 0) // the value part (or holding side) before the meeting
				if !me.before[i] {
					c = complex(0, -1)
				}
				fam.c = append(fam.c, c)
			}
			fam.logs = append([]bool(nil), me.logs...)
			if len(corners) > 0 {
				fam.corner = make([]int8, len(me.meets), len(me.meets)+len(corners))
				for _, end := range corners {
					fam.z = append(fam.z, complex(float64(2*end-1), 0))
					fam.c = append(fam.c, 1)
					fam.logs = append(fam.logs, false)
					fam.corner = append(fam.corner, int8(2*end-1))
				}
			}
			me.fam, me.famOff = fam, ms.n
			ms.n += fam.n
		}
		for i := 0; i < len(e.Parts); {
			if me.value[i] {
				i++
				continue
			}
			j := i
			for j < len(e.Parts) && !me.value[j] {
				j++
			}
			from, _ := e.PartRange(i, me.L)
			_, to := e.PartRange(j-1, me.L)
			me.spans = append(me.spans, span{from: from, to: to, first: i, end: j, off: ms.n, m: lv.poly})
			ms.n += lv.poly
			i = j
		}
		ms.edges = append(ms.edges, me)
		ms.bySide[side] = me
	}
	for _, me := range ms.edges {
		for k := range me.spans {
			ms.pin(me, &me.spans[k])
		}
	}
	return ms
}

// valueCorners returns the ends of edge me (0 start, 1 end) where a flux
// or convection part meets a corner whose other edge holds a value there:
// the family's corner members (see family) carry the field's r ln r
// there.
func (ms *mixedSolver) valueCorners(me *mixedEdge) []int {
	var out []int
	for end := 0; end < 2; end++ {
		i := 0
		if end == 1 {
			i = len(me.value) - 1
		}
		if me.value[i] {
			continue
		}
		c := cornerAt(me.side, end == 1)
		other := problem.Side(c)
		if other == me.side {
			other = problem.Side((c + 3) % 4)
		}
		if kind, _ := endCondition(ms.pr, other, edgeEnd(other, c)); kind == problem.Value {
			out = append(out, end)
		}
	}
	return out
}

// pin sets the conditions of a span's two ends (see span).
func (ms *mixedSolver) pin(me *mixedEdge, sp *span) {
	for end, s := range [2]float64{sp.from, sp.to} {
		at, dir := -1.0, -1 // the value part or corner lies before s
		if end == 1 {
			at, dir = 1, 1
		}
		order := 0
		switch {
		case s != 0 && s != me.L: // a value part inside the edge
			for k := 0; k < 4; k++ {
				sp.conds = append(sp.conds, cond{at: at, order: k, side: me.side, s: s, dir: dir})
			}
			order = 4
		default:
			c := cornerAt(me.side, end == 1)
			other := problem.Side(c)
			if other == me.side {
				other = problem.Side((c + 3) % 4)
			}
			so := float64(edgeEnd(other, c)) * ms.pr.Length(other)
			kind, _ := endCondition(ms.pr, other, edgeEnd(other, c))
			// a value condition there pins the end; so does a span of a
			// mixed edge earlier in the order of sides (no cycles)
			if kind == problem.Value || (ms.bySide[other] != nil && other < me.side) {
				odir := 1
				if so != 0 {
					odir = -1
				}
				sp.conds = append(sp.conds, cond{at: at, side: other, s: so, dir: odir})
				order = 1
			}
		}
		if end == 0 {
			sp.pl = order
		} else {
			sp.ph = order
		}
	}
	// cardinal polynomials: sum_k p_k tau^k with the conditions' values
	n := len(sp.conds)
	a := make([]float64, n*n)
	for r, c := range sp.conds {
		for k := c.order; k < n; k++ {
			f := 1.0 // k!/(k - order)!
			for j := 0; j < c.order; j++ {
				f *= float64(k - j)
			}
			a[r*n+k] = f * math.Pow(c.at, float64(k-c.order))
		}
	}
	for c := 0; c < n; c++ {
		rhs := make([]float64, n)
		rhs[c] = 1
		p, err := linalg.Solve(a, rhs)
		if err != nil {
			p = make([]float64, n) // cannot happen: the conditions are independent
		}
		sp.phi = append(sp.phi, p)
	}
}

// condValues returns the values of a span's conditions for the unknowns x
// (derivatives along s turned into derivatives along tau).
func (ms *mixedSolver) condValues(sp *span, x []float64, base bool) []float64 {
	d := make([]float64, len(sp.conds))
	for i, c := range sp.conds {
		v := ms.innerData(c.side, c.s, c.dir, x, base)
		d[i] = v[c.order] * math.Pow((sp.to-sp.from)/2, float64(c.order))
	}
	return d
}

// spanV returns the span's inner data at s, and its slope along s, for
// the unknowns x and the condition values d.
func (sp *span) spanV(x, d []float64, s float64) (v, dv float64) {
	tau := sp.tau(s)
	for c, p := range sp.phi {
		pv, pd := 0.0, 0.0 // sum p_k tau^k and its derivative, by Horner
		for k := len(p) - 1; k >= 0; k-- {
			pd = pd*tau + pv
			pv = pv*tau + p[k]
		}
		v += d[c] * pv
		dv += d[c] * pd
	}
	t, dt := make([]float64, sp.m), make([]float64, sp.m)
	cheb(tau, t, dt)
	b := math.Pow(1+tau, float64(sp.pl)) * math.Pow(1-tau, float64(sp.ph))
	db := 0.0
	if sp.pl > 0 {
		db += float64(sp.pl) * math.Pow(1+tau, float64(sp.pl-1)) * math.Pow(1-tau, float64(sp.ph))
	}
	if sp.ph > 0 {
		db -= float64(sp.ph) * math.Pow(1+tau, float64(sp.pl)) * math.Pow(1-tau, float64(sp.ph-1))
	}
	for j := 0; j < sp.m; j++ {
		a := x[sp.off+j]
		v += a * b * t[j]
		dv += a * (db*t[j] + b*dt[j])
	}
	return v, dv * 2 / (sp.to - sp.from)
}

// famSum evaluates, at (x, y), the family members of every mixed edge but
// skip, weighted by x, and returns their sum and its gradient.
func (ms *mixedSolver) famSum(x []float64, px, py float64, skip ...*mixedEdge) (u, ux, uy float64) {
	for _, me := range ms.edges {
		if me.fam == nil || (len(skip) > 0 && skip[0] == me) {
			continue
		}
		fm := me.fam
		t, d := fm.fr.at(px, py)
		g, gt, gd := fm.sum(t, d, x[me.famOff:me.famOff+fm.n])
		u += g
		ux += gt*fm.fr.tx + gd*fm.fr.dx
		uy += gt*fm.fr.ty + gd*fm.fr.dy
	}
	return u, ux, uy
}

// inner returns the inner problem for the unknowns x; with base the
// user's data are in it, without only the unknowns' part.
func (ms *mixedSolver) inner(x []float64, base bool) *problem.Problem {
	x = append([]float64(nil), x...)
	anyFam := false
	for _, me := range ms.edges {
		if me.fam != nil {
			for k := 0; k < me.fam.n; k++ {
				anyFam = anyFam || x[me.famOff+k] != 0
			}
		}
	}
	pr := ms.pr
	q := *pr
	if !base {
		q.Source = 0 // an unknown's response is linear in it: no source
	}
	var conds [4][][]float64 // each span's condition values, set below
	for _, side := range problem.Sides {
		side := side
		e := pr.Edges[side]
		fam := func(s float64) (u, in float64) {
			if !anyFam {
				return 0, 0
			}
			px, py := pr.Point(side, s)
			u, ux, uy := ms.famSum(x, px, py)
			return u, Entering(pr, side, ux, uy)
		}
		data := func(s float64) float64 {
			if base {
				return e.F(s)
			}
			return 0
		}
		if me := ms.bySide[side]; me != nil {
			q.Edges[side] = problem.Edge{Kind: problem.Value, F: func(s float64) float64 {
				i := me.e.PartAt(s)
				if me.value[i] {
					v := 0.0
					if base {
						v = me.e.Parts[i].F(s)
					}
					u, _ := fam(s)
					return v - u
				}
				for k := range me.spans {
					sp := &me.spans[k]
					if i >= sp.first && i < sp.end {
						v, _ := sp.spanV(x, conds[me.side][k], s)
						return v
					}
				}
				return 0
			}}
			continue
		}
		switch {
		case e.Kind == problem.Value:
			q.Edges[side].F = func(s float64) float64 { u, _ := fam(s); return data(s) - u }
		case e.Kind == problem.Flux || e.Hc == 0:
			q.Edges[side] = problem.Edge{Kind: problem.Flux, F: func(s float64) float64 {
				_, in := fam(s)
				if e.Kind == problem.Flux {
					return data(s) - in
				}
				return -in
			}}
		default:
			hc := e.Hc
			q.Edges[side].F = func(s float64) float64 { u, in := fam(s); return data(s) - u - in/hc }
		}
	}
	for _, side := range problem.Sides {
		q.Edges[side].Breaks = nil
	}
	for _, me := range ms.edges {
		for k := range me.spans {
			conds[me.side] = append(conds[me.side], ms.condValues(&me.spans[k], x, base))
		}
	}
	return &q
}

// Holding steps: where the convection coefficient steps, inside a span,
// from a stretch that nearly holds its ambient (h l / k above holdBiot,
// l the stretch's length) to one that exchanges little (below 1, or a
// flux part), the field behaves like it does where a value part meets a
// flux part, down to the distance k/h: the meeting gets the singular
// family too, its holding side taken as the value side.
const holdBiot = 10

// holdSteps adds the holding steps of the spans of me to its meetings, and
// every other step inside a span (of kind between flux and convection, of
// h, of the flux or the ambient) as a meeting of the logarithmic kind
// (see family).
func (ms *mixedSolver) holdSteps(me *mixedEdge) {
	pr := ms.pr
	kn := pr.Ky
	if me.side == problem.Left || me.side == problem.Right {
		kn = pr.Kx
	}
	// the places where h or the kind changes inside runs of non-value parts
	type stretch struct {
		from, to float64
		h        float64 // mean h (0 for flux)
	}
	var cuts []float64
	for i := range me.e.Parts {
		from, to := me.e.PartRange(i, me.L)
		if me.value[i] {
			continue
		}
		cuts = append(cuts, from)
		p := me.e.Parts[i]
		// steps of h, and of the flux or ambient, inside the part
		fs := []func(float64) float64{p.F}
		if p.Kind == problem.Convection {
			fs = append(fs, p.Hc)
		}
		for _, f := range fs {
			one := *pr
			one.Edges[me.side] = problem.Edge{Kind: problem.Flux, F: f}
			if bs, err := edgeBreaks(&one, me.side); err == nil {
				for _, b := range bs {
					if b.Class == FluxBreak && b.S > from && b.S < to {
						cuts = append(cuts, b.S)
					}
				}
			}
		}
		cuts = append(cuts, to)
	}
	slices.Sort(cuts)
	cuts = slices.Compact(cuts)
	var st []stretch
	for k := 0; k+1 < len(cuts); k++ {
		a, b := cuts[k], cuts[k+1]
		i := me.e.PartAt((a + b) / 2)
		if me.value[i] {
			st = append(st, stretch{a, b, -1})
			continue
		}
		h := 0.0
		if p := me.e.Parts[i]; p.Kind == problem.Convection {
			for j := 0; j < 16; j++ {
				h += p.Hc(a+(b-a)*(float64(j)+0.5)/16) / 16
			}
		}
		st = append(st, stretch{a, b, h})
	}
	hold := func(x stretch) bool { return x.h >= 0 && x.h*(x.to-x.from)/kn >= holdBiot }
	weak := func(x stretch) bool { return x.h >= 0 && x.h*(x.to-x.from)/kn < 1 }
	for k := 0; k+1 < len(st); k++ {
		a, b := st[k], st[k+1]
		if a.to != b.from || a.h < 0 || b.h < 0 {
			continue
		}
		if (hold(a) && weak(b)) || (weak(a) && hold(b)) {
			// like a value part meeting a flux part beyond the distance k/h,
			// a step of flux within it: both families
			me.meets = append(me.meets, a.to, a.to)
			me.before = append(me.before, hold(a), false)
			me.logs = append(me.logs, false, true)
			continue
		}
		// any other step of kind, h, flux or ambient: the flux into the
		// region steps there, and the trace goes like t ln|t|
		me.meets = append(me.meets, a.to)
		me.before = append(me.before, false)
		me.logs = append(me.logs, true)
	}
	// keep the meetings in order along the edge
	idx := make([]int, len(me.meets))
	for i := range idx {
		idx[i] = i
	}
	slices.SortFunc(idx, func(i, j int) int { return cmp.Compare(me.meets[i], me.meets[j]) })
	m, bf, lg := make([]float64, len(idx)), make([]bool, len(idx)), make([]bool, len(idx))
	for k, i := range idx {
		m[k], bf[k], lg[k] = me.meets[i], me.before[i], me.logs[i]
	}
	me.meets, me.before, me.logs = m, bf, lg
}

// responseCache keeps the response matrix of the last mixed solve, keyed
// by everything it depends on (mixedSolver.fingerprint): the geometry,
// the conductivity, every edge's kind and convection coefficient, the
// parts' places and kinds, the meetings and the fit's level, and h at the
// collocation places; not the edge data, which the responses do not see.
type responseCache struct {
	mu  sync.Mutex
	key string
	a   []float64
}

var responses responseCache

func (c *responseCache) get(key string) []float64 {
	c.mu.Lock()
	defer c.mu.Unlock()
	if c.key == key && c.a != nil {
		return c.a
	}
	return nil
}

func (c *responseCache) put(key string, a []float64) {
	c.mu.Lock()
	defer c.mu.Unlock()
	c.key, c.a = key, append([]float64(nil), a...)
}

// fingerprint returns the key of the responses (see responseCache); place
// gives the collocation places and weight their rows' weights.
func (ms *mixedSolver) fingerprint(weight []float64, place func(i int) (*mixedEdge, float64)) string {
	var b []byte
	num := func(v float64) { b = strconv.AppendUint(append(b, ' '), math.Float64bits(v), 36) }
	pr := ms.pr
	num(pr.W)
	num(pr.H)
	num(pr.Kx)
	num(pr.Ky)
	num(float64(ms.n))
	for _, side := range problem.Sides {
		e := pr.Edges[side]
		b = append(b, '|')
		if me := ms.bySide[side]; me != nil {
			for i, p := range e.Parts {
				num(float64(p.Kind))
				if i < len(e.Parts)-1 {
					num(p.To)
				}
			}
			for i, m := range me.meets {
				num(m)
				b = strconv.AppendBool(b, me.before[i])
				b = strconv.AppendBool(b, me.logs[i])
			}
			for _, sp := range me.spans {
				num(sp.from)
				num(sp.to)
				num(float64(sp.m))
			}
			continue
		}
		num(float64(e.Kind))
		num(e.Hc)
	}
	b = append(b, '|')
	for i, w := range weight {
		me, s := place(i)
		num(float64(me.side))
		num(s)
		num(w)
		if p := me.e.Parts[me.e.PartAt(s)]; p.Kind == problem.Convection {
			num(p.Hc(s))
		}
	}
	return string(b)
}

// solveInner solves an inner problem: to Options.Tol (full) or to the
// responses' tolerance, with every break of its data found (user) or only
// its corner breaks (an unknown's response, whose data break nowhere
// inside an edge by construction, see span).
func (ms *mixedSolver) solveInner(q *problem.Problem, full, user bool) (Field, error) {
	opt := ms.opt
	if !full {
		opt.Tol, opt.MaxTerms = mixedResponseTol, mixedResponseTerms
	}
	if user {
		breaks, err := FindBreaks(q)
		if err != nil {
			return nil, err
		}
		return SolveBreaks(q, breaks, opt)
	}
	m := newModel(q)
	return SolveBreaks(q, cornerBreaks(m, m.dataScale()), opt)
}

// places lists about n places of a span, Chebyshev points of the first
// kind (which stop short of the ends) on each stretch between its
// meetings (steps inside it included), so that a short part gets its own
// places: each stretch at least 6, the rest in proportion to length.
func (me *mixedEdge) places(sp *span, n int) []float64 {
	cuts := []float64{sp.from}
	for _, m := range me.meets {
		if m > sp.from && m < sp.to {
			cuts = append(cuts, m)
		}
	}
	cuts = append(cuts, sp.to)
	var s []float64
	for k := 0; k+1 < len(cuts); k++ {
		a, b := cuts[k], cuts[k+1]
		if b <= a {
			continue // two kinds of functions at one meeting
		}
		m := max(6, int(math.Round(float64(n)*(b-a)/(sp.to-sp.from))))
		for i := 0; i < m; i++ {
			tau := -math.Cos(math.Pi * (float64(i) + 0.5) / float64(m))
			s = append(s, a+(b-a)*(tau+1)/2)
		}
	}
	return s
}

// residual returns, for the field u (inner plus family with weights x) at
// s on a flux or convection part of edge me, the entering flux less what
// the part's condition asks for; with base false the user's data are left
// out (the response of one unknown).
func (ms *mixedSolver) residual(me *mixedEdge, inner Field, x []float64, s float64, base bool) float64 {
	pr := ms.pr
	px, py := pr.Point(me.side, s)
	_, ix, iy := inner.At(px, py)
	fu, fx, fy := ms.famSum(x, px, py)
	in := Entering(pr, me.side, ix+fx, iy+fy)
	i := me.e.PartAt(s)
	if me.value[i] { // at a span's end: the span's part
		if i > 0 && !me.value[i-1] {
			i--
		} else {
			i++
		}
	}
	part := me.e.Parts[i]
	if part.Kind == problem.Flux {
		if base {
			return in - part.F(s)
		}
		return in
	}
	// the trace of u: the span's inner data plus the family
	u := fu
	for k := range me.spans {
		sp := &me.spans[k]
		if i >= sp.first && i < sp.end {
			v, _ := sp.spanV(x, ms.condValues(sp, x, base), s)
			u += v
		}
	}
	h := part.Hc(s)
	if base {
		return in - h*(part.F(s)-u)
	}
	return in + h*u
}

// solve fits the unknowns and returns the field.
func (ms *mixedSolver) solve() (*mixedField, error) {
	n := ms.n
	// collocation places
	type place struct {
		me *mixedEdge
		s  float64
	}
	var places []place
	for _, me := range ms.edges {
		famShare := 0
		if me.fam != nil {
			famShare = me.fam.n / max(len(me.spans), 1)
		}
		for k := range me.spans {
			sp := &me.spans[k]
			sp.rows = me.places(sp, mixedRowsPer*(sp.m+famShare)+4)
			for _, s := range sp.rows {
				places = append(places, place{me, s})
			}
		}
	}
	rows := len(places)
	a := make([]float64, rows*n)
	b := make([]float64, rows)
	zero := make([]float64, n)
	// the user's data alone, to the responses' tolerance: like theirs, its
	// error enters the fit, which the check of the final field measures
	base, err := ms.solveInner(ms.inner(zero, true), false, true)
	if err != nil {
		return nil, err
	}
	// rows on a convection part weighted by 1/(1 + h l/k), as in the
	// estimate (mixedField.check): a residual there is an error of the
	// field times about k/l + h
	weight := make([]float64, len(places))
	for r, pl := range places {
		weight[r] = pl.me.rowWeight(ms.pr, pl.s)
		b[r] = -weight[r] * ms.residual(pl.me, base, zero, pl.s, true)
	}
	// the responses of the last mixed solve with the same structure (an
	// edit of data values on the page changes none of them)
	key := ms.fingerprint(weight, func(i int) (*mixedEdge, float64) { return places[i].me, places[i].s })
	if cached := responses.get(key); cached != nil {
		copy(a, cached)
		return ms.finish(a, b, rows)
	}
	// one response per unknown, on every processor (each writes its own
	// column of a)
	errs := make([]error, n)
	var wg sync.WaitGroup
	next := make(chan int)
	for range max(1, min(runtime.GOMAXPROCS(0), n)) {
		wg.Go(func() {
			unit := make([]float64, n)
			for i := range next {
				unit[i] = 1
				f, err := ms.solveInner(ms.inner(unit, false), false, false)
				if err != nil {
					errs[i] = err
				} else {
					for r, pl := range places {
						a[r*n+i] = weight[r] * ms.residual(pl.me, f, unit, pl.s, false)
					}
				}
				unit[i] = 0
			}
		})
	}
	for i := 0; i < n; i++ {
		next <- i
	}
	close(next)
	wg.Wait()
	if err := errors.Join(errs...); err != nil {
		return nil, err
	}
	responses.put(key, a)
	return ms.finish(a, b, rows)
}

// finish solves the fit from the responses a (rows x n) and the user's
// residuals b, and solves the final field.
func (ms *mixedSolver) finish(a, b []float64, rows int) (*mixedField, error) {
	n := ms.n
	a = append([]float64(nil), a...) // the cache keeps its own
	// scale the columns, solve, scale back
	norm := make([]float64, n)
	for i := 0; i < n; i++ {
		for r := 0; r < rows; r++ {
			norm[i] = math.Hypot(norm[i], a[r*n+i])
		}
		if norm[i] == 0 {
			norm[i] = 1
		}
		for r := 0; r < rows; r++ {
			a[r*n+i] /= norm[i]
		}
	}
	x := linalg.MinNorm(a, rows, n, b, mixedRcond)
	for i := range x {
		x[i] /= norm[i]
		if x[i]-x[i] != 0 {
			return nil, errors.New("series: the fit of the mixed edges failed (not a finite number)")
		}
	}
	final, err := ms.solveInner(ms.inner(x, true), true, true)
	if err != nil {
		return nil, err
	}
	mf := &mixedField{pr: ms.pr, inner: final, ms: ms, x: x}
	mf.check()
	return mf, nil
}

// innerData returns the inner data of edge side at s, taken from the part
// before s (dir < 0) or after it (dir > 0), and its first three
// derivatives along s (by one-sided differences within the part, the
// data there being smooth; zero for a span, whose conditions need only
// its value).
func (ms *mixedSolver) innerData(side problem.Side, s float64, dir int, x []float64, base bool) (d [4]float64) {
	pr := ms.pr
	e := pr.Edges[side]
	me := ms.bySide[side]
	if me == nil || me.value[me.partOn(s, dir)] {
		f := e.F
		length := pr.Length(side)
		if me == nil {
			if e.Kind != problem.Value {
				return d // not a value: no continuity to hold
			}
		} else {
			i := me.partOn(s, dir)
			f = e.Parts[i].F
			from, to := e.PartRange(i, me.L)
			length = min(length, (to-from)*3)
		}
		val := func(t float64) float64 {
			px, py := pr.Point(side, t)
			fu, _, _ := ms.famSum(x, px, py)
			if base {
				return f(t) - fu
			}
			return -fu
		}
		h := 2e-3 * length * float64(dir)
		var v [6]float64
		for i := range v {
			v[i] = val(s + float64(i)*h)
		}
		d[0] = v[0]
		for k, w := range oneSidedWeights {
			sum := 0.0
			for i := range v {
				sum += w[i] * v[i]
			}
			d[k+1] = sum / math.Pow(h, float64(k+1))
		}
		return d
	}
	i := me.partOn(s, dir)
	for k := range me.spans {
		sp := &me.spans[k]
		if i >= sp.first && i < sp.end {
			d[0], d[1] = sp.spanV(x, ms.condValues(sp, x, base), s)
		}
	}
	return d
}

// oneSidedWeights are the one-sided difference weights, on f(s + i h) for
// i = 0..5, of the first (fifth order), second (fourth) and third (third)
// derivatives.
var oneSidedWeights = [3][6]float64{
	{-137.0 / 60, 5, -5, 10.0 / 3, -5.0 / 4, 1.0 / 5},
	{15.0 / 4, -77.0 / 6, 107.0 / 6, -13, 61.0 / 12, -5.0 / 6},
	{-17.0 / 4, 71.0 / 4, -59.0 / 2, 49.0 / 2, -41.0 / 4, 7.0 / 4},
}

// rowWeight returns the weight of a condition's residual at s: 1 on a flux
// part, 1/(1 + h l/k) on a convection part (l the length of the span that
// holds s, k the conductivity across the edge).
func (me *mixedEdge) rowWeight(pr *problem.Problem, s float64) float64 {
	p := me.e.Parts[me.e.PartAt(s)]
	if p.Kind != problem.Convection {
		return 1
	}
	kn := pr.Ky
	if me.side == problem.Left || me.side == problem.Right {
		kn = pr.Kx
	}
	ell := me.L
	for _, sp := range me.spans {
		if s >= sp.from && s <= sp.to {
			ell = sp.to - sp.from
		}
	}
	return 1 / (1 + p.Hc(s)*ell/kn)
}

// partOn returns the part holding the side dir of s.
func (me *mixedEdge) partOn(s float64, dir int) int {
	for i := range me.e.Parts {
		from, to := me.e.PartRange(i, me.L)
		if (dir < 0 && s > from && s <= to) || (dir > 0 && s >= from && s < to) {
			return i
		}
	}
	if dir < 0 {
		return 0
	}
	return len(me.e.Parts) - 1
}

// cornerAt returns the corner at the start (end false) or end of an edge.
func cornerAt(side problem.Side, end bool) int {
	for c := 0; c < 4; c++ {
		if (problem.Side(c) == side || problem.Side((c+3)%4) == side) && (edgeEnd(side, c) == 1) == end {
			return c
		}
	}
	return 0
}
