package series

import (
	"errors"
	"fmt"
	"math"
	"sort"

	"edgewise/solver/gauss"
	"edgewise/solver/linalg"
	"edgewise/solver/problem"
)

// Options controls the series.
type Options struct {
	// Tol is the target for the maximum truncation error of u, relative
	// to the data scale (see Solution.Scale); default 1e-9 (also for
	// zero, negative, NaN or infinite values).
	Tol float64
	// MaxTerms caps the terms of each sub-problem; default 4096 (values
	// are held within 16..65536).
	MaxTerms int
	// balanced: an all-flux problem balanced by construction (the weak
	// exchange limit); its imbalance, rounding, is not checked.
	balanced bool
	// cache: the projection tables shared by the many solves of one mixed
	// problem (nil: none).
	cache *projCache
}

// ImbalanceError reports an all-flux problem whose inflow and source do
// not add up to zero, so that it has no steady state.
type ImbalanceError struct {
	Inflow, SourceTotal float64
}

func (e *ImbalanceError) Error() string {
	return fmt.Sprintf("series: no steady state: every edge holds a flux and the inflow %.6g plus the source total %.6g is %.6g, not zero",
		e.Inflow, e.SourceTotal, e.Inflow+e.SourceTotal)
}

// quadratic is A x^2 + B x + C y^2 + D y + E in mapped coordinates.
type quadratic struct{ A, B, C, D, E float64 }

func (q *quadratic) value(x, y float64) (u, ux, uy float64) {
	return q.A*x*x + q.B*x + q.C*y*y + q.D*y + q.E, 2*q.A*x + q.B, 2*q.C*y + q.D
}

// Field is a solved problem: the series, and the break pieces when the
// data break inside edges.
type Field interface {
	// At returns the field and its gradient at (x, y).
	At(x, y float64) (u, ux, uy float64)
	// Grid fills the field on a grid (see Solution.Grid).
	Grid(nx, ny int, u, ux, uy []float64)
	// Flow returns the flow entering through edge e, and whether it is
	// finite.
	Flow(e problem.Side) (flow float64, finite bool)
	Mean() float64
	Terms() int
	ErrorEstimate() float64
	Warnings() []problem.Warning
}

// SolveBreaks solves p, whose breaks FindBreaks has found: the corner
// breaks go to the corner pieces, the breaks inside edges to break pieces
// (see breakfield.go), the series sums the rest. Errors as for Solve.
func SolveBreaks(p *problem.Problem, breaks []Break, opt Options) (Field, error) {
	if mixed(p) {
		return solveMixed(p, opt)
	}
	var corners, inner []Break
	for _, b := range breaks {
		if b.Class == CornerBreak {
			corners = append(corners, b)
		} else {
			inner = append(inner, b)
		}
	}
	series := func(q *problem.Problem) (Field, error) {
		s, err := solve(q, opt, corners)
		if err != nil {
			return nil, err
		}
		return s, nil
	}
	if weakExchange(p) && !opt.balanced {
		return solveWeak(p, breaks, opt)
	}
	if len(inner) == 0 {
		return series(p)
	}
	return solveWithBreaks(p, inner, series)
}

// Solution is a solved problem. It is safe for concurrent use except Grid,
// which reuses internal buffers.
type Solution struct {
	m        *model
	quad     quadratic
	pieces   []piece
	subs     [4]*sub
	scale    float64
	tolAbs   float64
	est      float64
	corners  []Break    // the corner breaks, with the values of the user's data
	corner   [4]bool    // a corner break, carried by an angle function
	cornerJ  [4]float64 // its size J: value on Side(c) minus value on Side(c+3)
	third    [4]bool    // value/flux corner with a third-order condition
	flows    [4]float64
	finite   [4]bool
	mean     float64
	warnings []problem.Warning
	gw       *gridWork // during Grid: the work buffers (spareWork)
}

// Solve solves p by superposition of separated series, with the corner
// breaks carried by corner pieces and flux breaks at p.Edges[e].Breaks
// splitting the quadratures (value breaks inside edges are left to the
// series: see SolveBreaks). Bad input returns an error: problem validation
// errors, *problem.NonFiniteError for edge data that is not finite
// (returned unchanged), *ImbalanceError for an all-flux problem without a
// steady state.
func Solve(p *problem.Problem, opt Options) (*Solution, error) {
	if err := p.Validate(); err != nil {
		return nil, err
	}
	m := newModel(p)
	return solve(p, opt, cornerBreaks(m, m.dataScale()))
}

// solve is Solve with the corner breaks given.
func solve(p *problem.Problem, opt Options, corners []Break) (*Solution, error) {
	if err := p.Validate(); err != nil {
		return nil, err
	}
	if mixed(p) {
		return nil, errors.New("series: a mixed edge reached the plain series (SolveBreaks solves mixed edges)")
	}
	if !(opt.Tol > 0) || math.IsInf(opt.Tol, 1) {
		opt.Tol = 1e-9
	}
	if opt.MaxTerms <= 0 {
		opt.MaxTerms = 4096
	}
	opt.MaxTerms = min(max(opt.MaxTerms, 16), 1<<16)
	m := newModel(p)
	m.setBreaks(p)
	s := &Solution{m: m, corners: corners}
	s.scale = m.dataScale()
	if m.err != nil {
		return nil, m.err
	}
	s.tolAbs = opt.Tol * s.scale
	var fluxInt [4]float64
	for _, e := range problem.Sides {
		if m.kinds[e] == problem.Flux {
			fluxInt[e] = m.integral(e)
		}
	}
	if m.err != nil {
		return nil, m.err
	}
	if m.allFlx {
		in, mag := 0.0, 0.0
		for _, e := range problem.Sides {
			in += m.k * fluxInt[e]
			mag += math.Abs(m.k * fluxInt[e])
		}
		src := p.Source * p.W * p.H
		if !opt.balanced && math.Abs(in+src) > 1e-9*math.Max(mag+math.Abs(src), 1e-300) {
			return nil, &ImbalanceError{Inflow: in, SourceTotal: src}
		}
	} else if m.lap != 0 {
		if m.H <= m.W {
			s.quad = quadratic{C: m.lap / 2, D: -m.lap * m.H / 2}
		} else {
			s.quad = quadratic{A: m.lap / 2, B: -m.lap * m.W / 2}
		}
	}
	// Corner treatment, from the full one down to first order only, and at
	// last to the angle functions alone, when the pieces grow so large
	// that adding them up would lose digits (large Biot numbers on short
	// edges make the amplitudes grow like (beta L)^k).
	for level := 2; level >= -1; level-- {
		s.pieces, s.third, s.corner = s.pieces[:0], [4]bool{}, [4]bool{}
		s.cornerPieces(level)
		if m.err != nil {
			return nil, m.err
		}
		if err := s.fitSmooth(level); err != nil {
			return nil, err
		}
		if m.err != nil {
			return nil, m.err
		}
		if s.pieceMagnitude() <= 1e4*s.scale {
			break
		}
	}
	s.cornerWarnings()
	if m.allFlx {
		s.fluxQuadratic(fluxInt)
	}
	// the four sub-problems are independent: built side by side where
	// there are processors for it (in order in the wasm build)
	forEach(len(problem.Sides), func(i int) {
		e := problem.Sides[i]
		r := func(t float64) float64 { return s.residual(e, t) }
		s.subs[e] = newSub(m, e, r, s.tolAbs/4, opt.MaxTerms, m.breaks[e], opt.cache)
	})
	for _, e := range problem.Sides {
		if m.errs[e] != nil {
			return nil, m.errs[e] // the first edge in order whose data failed
		}
	}
	for _, e := range problem.Sides {
		s.est += s.subs[e].tail
		if s.subs[e].capped {
			s.warnings = append(s.warnings, problem.Warning{Code: problem.TermLimit, Edges: []problem.Side{e},
				Text: fmt.Sprintf("the series for the %v edge stopped at %d terms before reaching the requested accuracy (estimated error %.3g)", e, opt.MaxTerms, s.subs[e].tail)})
		}
	}
	s.est += 1e-14 * s.scale
	s.mean = s.area() / (m.W * m.H)
	if m.allFlx {
		s.quad.E -= s.mean
		s.mean = 0
		s.warnings = append(s.warnings, problem.Warning{Code: problem.MeanFixed, Edges: []problem.Side{},
			Text: "every edge holds a flux (no value edge, no exchange by convection), so the field is fixed only up to a constant: " +
				"it is shown with area mean 0, and only differences of value are meaningful"})
	}
	for _, e := range problem.Sides {
		if m.kinds[e] == problem.Flux {
			s.flows[e], s.finite[e] = m.k*fluxInt[e], true
		} else {
			s.flows[e], s.finite[e] = s.flowOf(e)
		}
	}
	return s, nil
}

// fluxQuadratic sets the particular solution of an all-flux problem: a
// quadratic A x^2 + B x + C y^2 + D y that takes, through each edge, the net
// flow of that edge's data less what the harmonic pieces carry, so that no
// residual has a constant mode (the balance makes its Laplacian the
// source).
func (s *Solution) fluxQuadratic(fluxInt [4]float64) {
	m := s.m
	var phi [4]float64
	for _, e := range problem.Sides {
		var x0, y0, x1, y1 float64
		c0, c1 := cornerOf(e, 0), cornerOf(e, 1)
		if e == problem.Top || e == problem.Left {
			c0, c1 = c1, c0
		}
		x0, y0 = m.cornerPoint(c0)
		x1, y1 = m.cornerPoint(c1)
		phi[e] = fluxInt[e]
		for i := range s.pieces {
			phi[e] -= s.pieces[i].conj(x1, y1) - s.pieces[i].conj(x0, y0)
		}
	}
	s.quad = quadratic{
		B: -phi[problem.Left] / m.H,
		D: -phi[problem.Bottom] / m.W,
	}
	s.quad.C = (phi[problem.Top]/m.W - s.quad.D) / (2 * m.H)
	s.quad.A = (phi[problem.Right]/m.H - s.quad.B) / (2 * m.W)
}

// dataScale returns the scale Options.Tol is relative to: the largest of
// the range of the prescribed values and ambients, the largest |flux|
// times the longer side over k, and |Source| times the shorter side
// squared over 8k (all in mapped units); 1 if all are zero.
func (m *model) dataScale() float64 {
	lo, hi := math.Inf(1), math.Inf(-1)
	fl := 0.0
	for _, e := range problem.Sides {
		L := m.length(e)
		for i := 0; i <= 32; i++ {
			v := m.data(e, L*float64(i)/32)
			switch m.kinds[e] {
			case problem.Value:
				lo, hi = math.Min(lo, v), math.Max(hi, v)
			case problem.Convection:
				v /= m.beta[e]
				lo, hi = math.Min(lo, v), math.Max(hi, v)
			default:
				fl = math.Max(fl, math.Abs(v))
			}
		}
	}
	sc := fl * math.Max(m.W, m.H)
	if hi >= lo {
		sc = math.Max(sc, hi-lo)
		if sc == 0 {
			sc = math.Max(math.Abs(hi), math.Abs(lo))
		}
	}
	sc = math.Max(sc, math.Abs(m.lap)*math.Pow(math.Min(m.W, m.H), 2)/8)
	if sc == 0 || math.IsNaN(sc) {
		sc = 1
	}
	return sc
}

// integral returns the integral of the normalised data of edge e along it.
func (m *model) integral(e problem.Side) float64 {
	const n = 512
	xs, ws := make([]float64, n), make([]float64, n)
	sum := 0.0
	m.pieces(e, func(lo, hi float64) {
		gauss.Legendre(xs, ws, lo, hi)
		for i, x := range xs {
			sum += ws[i] * m.data(e, x)
		}
	})
	return sum
}

// setBreaks keeps the places of the flux breaks (problem.Edge.Breaks),
// in mapped s.
func (m *model) setBreaks(p *problem.Problem) {
	for _, e := range problem.Sides {
		L := m.length(e)
		scale := 1.0
		if e == problem.Left || e == problem.Right {
			scale = m.a
		}
		var list []float64
		for _, s := range p.Edges[e].Breaks {
			if t := s * scale; t > 0 && t < L {
				list = append(list, t)
			}
		}
		sort.Float64s(list)
		m.breaks[e] = list
	}
}

// pieces calls f for the stretches of edge e between its breaks (mapped s).
func (m *model) pieces(e problem.Side, f func(lo, hi float64)) {
	lo := 0.0
	for _, b := range m.breaks[e] {
		if b > lo {
			f(lo, b)
			lo = b
		}
	}
	f(lo, m.length(e))
}

// known returns u, ux, uy of the carried-out part (particular solution and
// harmonic pieces) at mapped (x, y), skipping pieces at corner skip.
func (s *Solution) known(x, y float64, skip int) (u, ux, uy float64) {
	u, ux, uy = s.quad.value(x, y)
	for i := range s.pieces {
		pc := &s.pieces[i]
		if skip >= 0 && pc.corner == skip {
			continue
		}
		a, b, c := pc.value(x, y)
		u, ux, uy = u+a, ux+b, uy+c
	}
	return
}

// op applies the condition operator of edge e to (u, ux, uy).
func (m *model) op(e problem.Side, u, ux, uy float64) float64 {
	switch m.kinds[e] {
	case problem.Value:
		return u
	}
	n := normal[e]
	d := ux*real(n) + uy*imag(n)
	if m.kinds[e] == problem.Convection {
		d += m.beta[e] * u
	}
	return d
}

// residual returns the data left for the series on edge e at s.
func (s *Solution) residual(e problem.Side, t float64) float64 {
	x, y := s.m.point(e, t)
	u, ux, uy := s.known(x, y, -1)
	return s.m.data(e, t) - s.m.op(e, u, ux, uy)
}

// stencil holds one-sided finite-difference weights on the points 0..6
// (unit spacing) for the first, second and third derivative at 0, exact
// for polynomials of degree 6 (solved once from the Vandermonde system).
var stencil = func() (w [4][7]float64) {
	for d := 1; d <= 3; d++ {
		a := make([]float64, 7*7)
		rhs := make([]float64, 7)
		fact := 1.0
		for k := 0; k < 7; k++ {
			for j := 0; j < 7; j++ {
				a[k*7+j] = math.Pow(float64(j), float64(k))
			}
			if k == d {
				rhs[k] = fact
			}
			fact *= float64(k + 1)
		}
		x, err := linalg.Solve(a, rhs)
		if err != nil {
			panic("series: stencil: " + err.Error())
		}
		sum := 0.0
		for j := 1; j < 7; j++ {
			w[d][j] = x[j]
			sum += w[d][j]
		}
		w[d][0] = -sum // constants differentiate to exactly zero
	}
	return w
}()

// slope5 holds one-sided weights on the points 0..4 (unit spacing) for the
// first derivative at 0, exact for polynomials of degree 4: beside the
// 7-point stencil it measures how uncertain a slope from the data is.
var slope5 = [5]float64{-25.0 / 12, 4, -3, 4.0 / 3, -1.0 / 4}

// slopeNoise returns how uncertain the slope derivs gives for edge e at
// corner c is: the difference between the 7-point and the 5-point
// estimates (the truncation error of the 5-point one, which bounds that of
// the 7-point one on data smooth at the spacing L/256).
func (m *model) slopeNoise(e problem.Side, c int) float64 {
	end := edgeEnd(e, c)
	L := m.length(e)
	h := L / 256
	var v [7]float64
	for j := range v {
		sj := h * float64(j)
		if end == 1 {
			sj = L - sj
		}
		v[j] = m.data(e, sj)
	}
	d7, d5 := 0.0, 0.0
	for j := 1; j < 7; j++ {
		d7 += stencil[1][j] * (v[j] - v[0])
		if j < 5 {
			d5 += slope5[j] * (v[j] - v[0])
		}
	}
	return math.Abs(d7-d5) / h
}

// pieceFloor[k] is the size of a k-th order corner mismatch (times the
// longer side^k, relative to the data scale) below which it is taken as
// finite-difference noise (rounding grows like 256^k here) and no piece is
// added: such a piece would change the series by about as little.
var pieceFloor = [4]float64{0, 1e-11, 1e-8, 1e-6}

// derivs returns the normalised data of edge e at the end touching corner
// c, and its first three derivatives along the edge away from it
// (one-sided differences on 7 points with spacing L/256).
func (m *model) derivs(e problem.Side, c int) (f, d1, d2, d3 float64) {
	end := edgeEnd(e, c)
	L := m.length(e)
	h := L / 256
	var v [7]float64
	for j := range v {
		sj := h * float64(j)
		if end == 1 {
			sj = L - sj
		}
		v[j] = m.data(e, sj)
	}
	var d [4]float64
	for k := 1; k <= 3; k++ {
		for j := 1; j < len(v); j++ {
			d[k] += stencil[k][j] * (v[j] - v[0]) // weights sum to zero
		}
	}
	return v[0], d[1] / h, d[2] / (h * h), d[3] / (h * h * h)
}

// cornerPieces adds the singular corner functions whose amplitudes follow
// from the local data alone (smooth parts cancel from them).
func (s *Solution) cornerPieces(level int) {
	m := s.m
	for c := 0; c < 4; c++ {
		e1, e2 := problem.Side(c), problem.Side((c+3)%4)
		k1, k2 := m.kinds[e1], m.kinds[e2]
		x0, y0 := m.cornerPoint(c)
		z0 := complex(x0, y0)
		rho := cornerRho[c]
		add := func(kind pieceKind, n int, coef complex128) {
			s.pieces = append(s.pieces, piece{kind: kind, n: n, z0: z0, rho: rho, c: coef, corner: c})
		}
		if level < 0 && !(k1 == problem.Value && k2 == problem.Value) {
			continue // last resort: the angle functions alone
		}
		switch {
		case k1 == problem.Value && k2 == problem.Value:
			f1, _, s1, _ := m.derivs(e1, c)
			f2, _, s2, _ := m.derivs(e2, c)
			if s.hasCornerBreak(c) {
				// J (1 - 2 theta / pi): J on the first edge, 0 on the second,
				// J measured on the data solved (break pieces inside the
				// edges, continuous at the corner, leave it unchanged).
				jmp := f1 - f2
				add(powPiece, 0, complex(jmp, 0))
				add(logPiece, 0, complex(0, 2*jmp/math.Pi))
				s.corner[c] = true
				s.cornerJ[c] = jmp
			}
			b := -(s1 + s2 - m.lap) / math.Pi
			if level >= 1 && math.Abs(b)*math.Pow(math.Max(m.W, m.H), 2) > pieceFloor[2]*s.scale {
				add(z2logPiece, 0, complex(0, -b)) // b Im(zeta^2 log zeta)
			}
		case k1 != problem.Value && k2 != problem.Value:
			// Each residual must meet the other edge's homogeneous
			// condition along itself; the two demands differ by m unless
			// a kappa Re(zeta^2 log zeta) piece takes the difference.
			f1, d1, _, _ := m.derivs(e1, c)
			f2, d2, _, _ := m.derivs(e2, c)
			mis := (-d1 + m.beta[e2]*f1) - (-d2 + m.beta[e1]*f2)
			if math.Abs(mis)*math.Pow(math.Max(m.W, m.H), 2) > pieceFloor[2]*s.scale {
				k := mis / math.Pi
				add(z2logPiece, 0, complex(k, 0))
				// On a convection edge beta times that piece leaves
				// +-beta kappa s^2 log s; a zeta^3 log zeta piece with
				// c = (beta2 kappa - i beta1 kappa)/3 takes both back.
				if b1, b2 := m.beta[e1], m.beta[e2]; level >= 2 && (b1 != 0 || b2 != 0) {
					add(z3logPiece, 0, complex(b2*k/3, -b1*k/3))
				}
			}
		case k1 == problem.Value || k2 == problem.Value:
			ev, ef := e1, e2
			if k2 == problem.Value {
				ev, ef = e2, e1
			}
			fv, dv, sv, tv := m.derivs(ev, c)
			ff, _, sf, _ := m.derivs(ef, c)
			beta := m.beta[ef]
			L := math.Max(m.W, m.H)
			a := ff - (-dv + beta*fv)
			// A mismatch within the uncertainty of the value edge's slope
			// (steep data: the 7-point slope is good to about h^6 times
			// the seventh derivative) is the data agreeing: no piece, whose
			// gradient would be unbounded at the corner; the series takes
			// what is left, its estimate with it.
			if math.Abs(a) > 4*m.slopeNoise(ev, c) && math.Abs(a)*L > pieceFloor[1]*s.scale {
				if ev == e1 {
					add(zlogPiece, 0, complex(0, 2*a/math.Pi))
				} else {
					add(zlogPiece, 0, complex(-2*a/math.Pi, 0))
					add(powPiece, 1, complex(0, a))
				}
				// With beta != 0 this piece leaves -beta a (2/pi) tau log tau
				// on the convection edge (tau along it); kappa Im(zeta^2 log
				// zeta), zero on the value edge (mirrored when the value
				// edge is the second one), takes it back with kappa =
				// -a beta / pi, leaving only smooth terms there.
				if level >= 2 && beta != 0 {
					k := -a * beta / math.Pi
					add(z2logPiece, 0, complex(0, -k))
					if ev != e1 {
						add(powPiece, 2, complex(-k*math.Pi/2, 0))
					}
				}
			}
			// Third order: the value edge's residual r must have (primes
			// along the edges) -r3 + beta r2 = 0, the other edge's r2 = 0; for
			// a harmonic field the two demands differ by m3 unless a
			// zeta^3 log zeta piece (zero on the value edge) takes it.
			if level < 2 {
				continue
			}
			s.third[c] = true
			// The pieces above add -a beta^2 to the other edge's r2.
			m3 := -tv + beta*(sv-m.lap) + sf
			if math.Abs(a)*L > pieceFloor[1]*s.scale {
				m3 -= a * beta * beta
			}
			if math.Abs(m3)*L*L*L <= pieceFloor[3]*s.scale {
				continue
			}
			if ev == e1 {
				add(z3logPiece, 0, complex(0, -m3/(3*math.Pi)))
			} else {
				k := -m3 / (3 * math.Pi)
				add(z3logPiece, 0, complex(k, 0))
				add(powPiece, 3, complex(0, -math.Pi/2*k))
			}
		}
	}
}

// hasCornerBreak reports whether corner c has a corner break.
func (s *Solution) hasCornerBreak(c int) bool {
	for _, b := range s.corners {
		if b.Corner == c {
			return true
		}
	}
	return false
}

// cornerWarnings says which flows are infinite and why, with the values of
// the user's data at the corner.
func (s *Solution) cornerWarnings() {
	for _, b := range s.corners {
		c := b.Corner
		if !s.corner[c] {
			continue
		}
		e1, e2 := problem.Side(c), problem.Side((c+3)%4)
		f1, f2 := b.From, b.To
		s.warnings = append(s.warnings,
			problem.Warning{Code: problem.CornerJump, Edges: []problem.Side{e1},
				Text: fmt.Sprintf("flow through the %v edge is infinite: the value jumps from %.6g to %.6g at the %s corner", e1, f1, f2, cornerNames[c])},
			problem.Warning{Code: problem.CornerJump, Edges: []problem.Side{e2},
				Text: fmt.Sprintf("flow through the %v edge is infinite: the value jumps from %.6g to %.6g at the %s corner", e2, f2, f1, cornerNames[c])})
	}
}

// pieceMagnitude returns the largest sum of |piece| over sample points
// away from the corners: how much cancellation the pieces need.
func (s *Solution) pieceMagnitude() float64 {
	m := s.m
	big := 0.0
	for i := 0; i <= 4; i++ {
		for j := 0; j <= 4; j++ {
			if (i == 0 || i == 4) && (j == 0 || j == 4) {
				continue
			}
			x, y := m.W*float64(i)/4, m.H*float64(j)/4
			sum := 0.0
			for k := range s.pieces {
				u, _, _ := s.pieces[k].value(x, y)
				sum += math.Abs(u)
			}
			big = math.Max(big, sum)
		}
	}
	return big
}

// fitSmooth fits harmonic polynomials of degree <= 5 (minimum norm) so
// that, with the singular pieces, the residual data meet the corner
// conditions that make the series coefficients fall fast: at a value/value
// corner the residual and its second derivative along both edges vanish;
// at a value/flux or value/convection corner the residual of the value
// edge meets the other edge's homogeneous condition and the other edge's
// residual vanishes. At the last-resort level (-1) only the values at the
// value/value corners are fitted: the series vanishes there, so without
// them such a corner would show 0 instead of its value.
func (s *Solution) fitSmooth(level int) error {
	m := s.m
	S := math.Max(m.W, m.H) / 2
	z0 := complex(m.W/2, m.H/2)
	var cols []piece
	cols = append(cols, piece{kind: powPiece, n: 0, z0: z0, rho: complex(1/S, 0), c: 1, corner: -1})
	for n := 1; n <= 5; n++ {
		cols = append(cols,
			piece{kind: powPiece, n: n, z0: z0, rho: complex(1/S, 0), c: 1, corner: -1},
			piece{kind: powPiece, n: n, z0: z0, rho: complex(1/S, 0), c: -1i, corner: -1})
	}
	var rows [][]float64
	var rhs []float64
	for c := 0; c < 4; c++ {
		e1, e2 := problem.Side(c), problem.Side((c+3)%4)
		k1, k2 := m.kinds[e1], m.kinds[e2]
		x, y := m.cornerPoint(c)
		ku, kx, ky := s.known(x, y, c)
		if level < 0 && !(k1 == problem.Value && k2 == problem.Value) {
			continue // last resort: the angle functions alone
		}
		switch {
		case k1 == problem.Value && k2 == problem.Value:
			f1, _, s1, _ := m.derivs(e1, c)
			dir := dirAway(e1, edgeEnd(e1, c))
			own := 0.0
			if s.corner[c] {
				own = real(s.pieces[s.cornerIndex(c, powPiece)].c)
			}
			row := make([]float64, len(cols))
			row2 := make([]float64, len(cols))
			for j := range cols {
				row[j], _, _ = cols[j].value(x, y)
				row2[j] = cols[j].second(x, y, dir)
			}
			rows = append(rows, row)
			if level < 1 {
				rhs = append(rhs, f1-own-ku)
				continue
			}
			rows = append(rows, row2)
			sec := 2 * s.quad.A
			if imag(dir) != 0 {
				sec = 2 * s.quad.C
			}
			for i := range s.pieces {
				if s.pieces[i].corner != c {
					sec += s.pieces[i].second(x, y, dir)
				}
			}
			rhs = append(rhs, f1-own-ku, s1-sec)
		case k1 != problem.Value && k2 != problem.Value:
			f1, d1, _, _ := m.derivs(e1, c)
			xi, eta := dirAway(e1, edgeEnd(e1, c)), dirAway(e2, edgeEnd(e2, c))
			b1, b2 := m.beta[e1], m.beta[e2]
			lop := func(u, ux, uy, uxe float64) float64 {
				g := complex(ux, uy)
				dxi := real(g)*real(xi) + imag(g)*imag(xi)
				deta := real(g)*real(eta) + imag(g)*imag(eta)
				return uxe - b1*dxi - b2*deta + b1*b2*u
			}
			row := make([]float64, len(cols))
			for j := range cols {
				u, ux, uy := cols[j].value(x, y)
				row[j] = lop(u, ux, uy, cols[j].mixed(x, y, xi, eta))
			}
			mx := 2*s.quad.A*real(xi)*real(eta) + 2*s.quad.C*imag(xi)*imag(eta)
			for i := range s.pieces {
				if s.pieces[i].corner != c {
					mx += s.pieces[i].mixed(x, y, xi, eta)
				}
			}
			rows = append(rows, row)
			rhs = append(rhs, -d1+b2*f1-lop(ku, kx, ky, mx))
		case k1 == problem.Value || k2 == problem.Value:
			ev, ef := e1, e2
			if k2 == problem.Value {
				ev, ef = e2, e1
			}
			fv, dv, sv, tv := m.derivs(ev, c)
			beta := m.beta[ef]
			row := make([]float64, len(cols))
			for j := range cols {
				u, ux, uy := cols[j].value(x, y)
				row[j] = m.op(ef, u, ux, uy)
			}
			rows = append(rows, row)
			rhs = append(rhs, -dv+beta*fv-m.op(ef, ku, kx, ky))
			if !s.third[c] {
				continue
			}
			// -W_sss + beta W_ss along the value edge (s away from c).
			sd := dirAway(ev, edgeEnd(ev, c))
			row3 := make([]float64, len(cols))
			for j := range cols {
				row3[j] = -cols[j].third(x, y, sd, sd, sd) + beta*cols[j].second(x, y, sd)
			}
			known := beta * (2*s.quad.A*real(sd)*real(sd) + 2*s.quad.C*imag(sd)*imag(sd))
			for i := range s.pieces {
				if s.pieces[i].corner != c {
					known += -s.pieces[i].third(x, y, sd, sd, sd) + beta*s.pieces[i].second(x, y, sd)
				}
			}
			rows = append(rows, row3)
			rhs = append(rhs, -tv+beta*sv-known)
		}
	}
	if m.err != nil || len(rows) == 0 {
		return nil
	}
	// Equilibrate rows, then solve for the minimum-norm coefficients
	// (singular values below 1e-12 of the largest count as zero).
	A := make([]float64, len(rows)*len(cols))
	b := make([]float64, len(rows))
	for i, r := range rows {
		nrm := 0.0
		for _, v := range r {
			nrm += v * v
		}
		nrm = math.Sqrt(nrm)
		if nrm == 0 {
			nrm = 1
		}
		for j, v := range r {
			A[i*len(cols)+j] = v / nrm
		}
		b[i] = rhs[i] / nrm
	}
	coef := linalg.MinNorm(A, len(rows), len(cols), b, 1e-12)
	for _, c := range coef {
		if c-c != 0 {
			return errors.New("series: the corner fit overflowed on these data; please report this project")
		}
	}
	for j := range cols {
		if coef[j] != 0 {
			pc := cols[j]
			pc.c *= complex(coef[j], 0)
			s.pieces = append(s.pieces, pc)
		}
	}
	return nil
}

func (s *Solution) cornerIndex(c int, kind pieceKind) int {
	for i := range s.pieces {
		if s.pieces[i].corner == c && s.pieces[i].kind == kind {
			return i
		}
	}
	return -1
}

// area returns the integral of u over the mapped rectangle.
func (s *Solution) area() float64 {
	m := s.m
	W, H := m.W, m.H
	q := s.quad
	sum := q.A*W*W*W*H/3 + q.B*W*W*H/2 + q.C*W*H*H*H/3 + q.D*W*H*H/2 + q.E*W*H
	for i := range s.pieces {
		sum += s.pieces[i].area(W, H)
	}
	for _, sp := range s.subs {
		for i := 0; i < sp.n; i++ {
			iy, _, _ := sp.intY(i)
			sum += sp.b.Int[i] * iy
		}
	}
	return sum
}

// flowOf returns the entering flow through edge e computed from the
// solution, and whether it is finite.
func (s *Solution) flowOf(e problem.Side) (float64, bool) {
	m := s.m
	// Counter-clockwise end points.
	var x0, y0, x1, y1 float64
	c0, c1 := cornerOf(e, 0), cornerOf(e, 1)
	if e == problem.Top || e == problem.Left {
		c0, c1 = c1, c0
	}
	x0, y0 = m.cornerPoint(c0)
	x1, y1 = m.cornerPoint(c1)
	if s.corner[c0] || s.corner[c1] {
		// Near a corner break the inflow density is k (A - B)(2/pi)/r with A
		// this edge's value and B the neighbour's: +Inf or -Inf, NaN when
		// the two corners disagree.
		sign := 0.0
		for _, c := range [2]int{c0, c1} {
			if !s.corner[c] {
				continue
			}
			j := s.cornerJ[c] // value on Side(c) minus value on Side(c+3)
			if problem.Side(c) != e {
				j = -j
			}
			if sign != 0 && math.Signbit(sign) != math.Signbit(j) {
				return math.NaN(), false
			}
			sign = j
		}
		return math.Inf(int(math.Copysign(1, sign))), false
	}
	L := m.length(e)
	_, qx, qy := s.quad.value((x0+x1)/2, (y0+y1)/2)
	flow := L * (qx*real(normal[e]) + qy*imag(normal[e]))
	for i := range s.pieces {
		flow += s.pieces[i].conj(x1, y1) - s.pieces[i].conj(x0, y0)
	}
	for _, sp := range s.subs {
		flow = sp.addFlow(e, flow)
	}
	return m.k * flow, true
}

// addFlow adds to flow, term by term, sp's part of the flow entering
// through edge e (before the conductivity). It is a function of its own,
// not inlined, to keep its loop out of a large function (see the package
// doc of edgewise/solver, Loops in functions of their own).
//
//go:noinline
func (sp *sub) addFlow(e problem.Side, flow float64) float64 {
	_, _, opp := neighbours(sp.side)
	na, nb, _ := neighbours(sp.side)
	for i := 0; i < sp.n; i++ {
		iy, d0, dD := sp.intY(i)
		switch e {
		case sp.side:
			flow -= sp.b.Int[i] * d0
		case opp:
			flow += sp.b.Int[i] * dD
		case na:
			_, dx := sp.b.X(i, 0)
			flow -= dx * iy
		case nb:
			_, dx := sp.b.X(i, sp.L)
			flow += dx * iy
		}
	}
	return flow
}

// At returns the field and its gradient at (x, y) in the original
// coordinates (inside or on the boundary). At a corner break u is the mean
// of the two values and the gradient is NaN.
func (s *Solution) At(x, y float64) (u, ux, uy float64) {
	m := s.m
	yp := y * m.a
	u, ux, uy = s.known(x, yp, -1)
	for _, sp := range s.subs {
		ls, lt := sp.local(x, yp, m.W, m.H)
		a, bs, bt := sp.at(ls, lt)
		gx, gy := sp.global(bs, bt)
		u, ux, uy = u+a, ux+gx, uy+gy
	}
	return u, ux, uy * m.a
}

// Flow returns the flow per unit depth entering through edge e, and false
// if it is infinite (a corner break at one of its ends);
// the flow is then +Inf or -Inf by the direction of the break(s), or NaN if
// its two corners push opposite ways, never a finite number.
// Flux edges report the integral of their data; the others are computed
// from the solution.
func (s *Solution) Flow(e problem.Side) (flow float64, finite bool) {
	return s.flows[e], s.finite[e]
}

// Mean returns the area mean of u. For an all-flux problem the free
// constant is fixed so that this mean is zero.
func (s *Solution) Mean() float64 { return s.mean }

// Terms returns the largest number of terms used by a sub-problem.
func (s *Solution) Terms() int {
	n := 0
	for _, sp := range s.subs {
		n = max(n, sp.n)
	}
	return n
}

// ErrorEstimate returns the estimated maximum error of u away from
// singular corners: the sum of the estimated series tails.
func (s *Solution) ErrorEstimate() float64 { return s.est }

// Scale returns the data scale Options.Tol is relative to.
func (s *Solution) Scale() float64 { return s.scale }

// Warnings returns notes about the solution for the user.
func (s *Solution) Warnings() []problem.Warning { return append([]problem.Warning(nil), s.warnings...) }
