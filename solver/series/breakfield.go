package series

import (
	"math"
	"math/cmplx"
	"slices"

	"edgewise/solver/gauss"
	"edgewise/solver/problem"
)

// A break piece carries one break inside an edge out of the series, the
// way the corner pieces do at corners. With d the distance into the region
// from the edge and t the distance along it past the break at s0, both in the
// coordinates y' = y sqrt(Kx/Ky) in which the problem is isotropic, and
// theta = atan2(d, t) in [0, pi], r^2 = d^2 + t^2:
//
//	a value break, from A to B:  phi = (A - B) theta / pi
//	a flux break:                phi = -a (t ln r - d theta) / pi = -a Re(w log w) / pi,  w = t + i d
//
// Both are harmonic in (x, y'), so they solve Kx u_xx + Ky u_yy = 0. On its
// own edge the first is A - B before s0 and 0 after it; the second has
// d phi/dd = a theta/pi, a before s0 and 0 after, so its entering flux
// -kappa d phi/dd (kappa = sqrt(Kx Ky) on the bottom and top, Kx on the
// sides) breaks by kappa a; a convection edge whose ambient breaks by D takes
// the break Hc D of entering flux. Subtracting the pieces leaves continuous
// data, which the series sums fast; everywhere else on the boundary the
// pieces are smooth and go into the other edges' data. The field is then
// the series plus the pieces.
//
// A kink (the slope of the data jumps inside an edge) takes a piece of one
// order higher, phi = Re(C w^n log w) with w = t + i d:
//
//	a value kink, slope sL to sR (per unit t):  C = -i (sL - sR)/pi, n = 1
//	a flux kink, entering flux slope qL to qR:  C = (qL - qR)/(2 kappa pi), n = 2
//
// On its own edge the first is Im(w log w) (sL - sR)/pi = (sL - sR) t
// before s0 and 0 after it; the second has d phi/dd = -2 C pi t before
// and 0 after, so its entering flux has the slope qL - qR before s0 and 0
// after. A convection edge whose ambient's slope jumps by D takes the flux
// kink of Hc D, plus Re(i E w^3 log w), E = -Hc C/(3 kappa), whose flux
// takes back the Hc C t^2 ln|t| the first leaves in the exchange (it leaves
// only a jump of the third derivative). The data less these pieces have a
// continuous slope; flows stay finite (a value kink's flux grows like
// ln r at it, an integrable singularity).
type breakPiece struct {
	side    problem.Side
	flux    bool // a flux break (w log w) rather than a value break (angle)
	kink    bool // a kink piece Re(cc w^n log w)
	n       int  // its power of w
	cc      complex128
	s0, amp float64 // where, and (A - B) or a
	kappa   float64 // entering flux = -kappa d phi/dd
	w, h, c float64 // rectangle and sqrt(Kx/Ky)
	kx, ky  float64
	dx, dy  float64 // derivatives of d
	tx, ty  float64 // derivatives of t
	d0, t0  float64 // d = d0 + dx x + dy y, t = t0 + tx x + ty y
}

func newBreakPiece(pr *problem.Problem, br Break) breakPiece {
	c := math.Sqrt(pr.Kx / pr.Ky)
	a := breakPiece{side: br.Side, s0: br.S, w: pr.W, h: pr.H, c: c, kx: pr.Kx, ky: pr.Ky}
	switch br.Side {
	case problem.Bottom: // d = c y, t = x - s0
		a.dy, a.tx, a.t0 = c, 1, -br.S
	case problem.Top: // d = c (H - y), t = x - s0
		a.d0, a.dy, a.tx, a.t0 = c*pr.H, -c, 1, -br.S
	case problem.Left: // d = x, t = c (y - s0)
		a.dx, a.ty, a.t0 = 1, c, -c*br.S
	case problem.Right: // d = W - x, t = c (y - s0)
		a.d0, a.dx, a.ty, a.t0 = pr.W, -1, c, -c*br.S
	}
	e := pr.Edges[br.Side]
	kappa := pr.Kx
	if br.Side == problem.Bottom || br.Side == problem.Top {
		kappa = math.Sqrt(pr.Kx * pr.Ky)
	}
	a.kappa = kappa
	if br.Class == KinkBreak {
		// slopes per unit t: t = s on the bottom and top, c s on the sides
		ts := 1.0
		if br.Side == problem.Left || br.Side == problem.Right {
			ts = c
		}
		jump := (br.From - br.To) / ts
		a.kink = true
		switch e.Kind {
		case problem.Value:
			a.n, a.cc = 1, complex(0, -jump/math.Pi)
		case problem.Flux:
			a.n, a.cc = 2, complex(jump/(2*kappa*math.Pi), 0)
		default:
			a.n, a.cc = 2, complex(e.Hc*jump/(2*kappa*math.Pi), 0)
		}
		return a
	}
	switch e.Kind {
	case problem.Value:
		a.amp = br.From - br.To
	case problem.Flux:
		a.flux, a.amp = true, (br.To-br.From)/kappa
	default: // convection: the entering flux Hc (ambient - u) breaks by Hc D
		a.flux, a.amp = true, e.Hc*(br.To-br.From)/kappa
	}
	return a
}

// at returns phi and its gradient at (x, y). At the break itself a value
// piece takes the mean of its two values and a flux piece 0; the
// gradient (unbounded there) is NaN.
func (a *breakPiece) at(x, y float64) (phi, px, py float64) {
	d := a.d0 + a.dx*x + a.dy*y
	t := a.t0 + a.tx*x + a.ty*y
	if d <= 0 {
		d = 0 // on the edge (and not beyond it by rounding)
	}
	if a.kink {
		return a.kinkAt(t, d)
	}
	r2 := d*d + t*t
	if r2 == 0 {
		if a.flux {
			return 0, math.NaN(), math.NaN()
		}
		return a.amp / 2, math.NaN(), math.NaN()
	}
	k := a.amp / math.Pi
	theta := math.Atan2(d, t)
	if a.flux {
		// d/dt = -(ln r + 1) a/pi, d/dd = a theta/pi
		lr := 0.5 * math.Log(r2)
		gt, gd := -k*(lr+1), k*theta
		return -k * (t*lr - d*theta), gt*a.tx + gd*a.dx, gt*a.ty + gd*a.dy
	}
	// grad theta = (t grad d - d grad t) / (d^2 + t^2)
	return k * theta, k * (t*a.dx - d*a.tx) / r2, k * (t*a.dy - d*a.ty) / r2
}

// kinkAt returns a kink piece and its gradient at local (t, d), d >= 0.
// At the kink itself phi is 0 and so is the gradient for n >= 2; for
// n = 1 it grows like ln r there and is NaN.
func (a *breakPiece) kinkAt(t, d float64) (phi, px, py float64) {
	w := complex(t, d)
	if w == 0 {
		if a.n == 1 {
			return 0, math.NaN(), math.NaN()
		}
		return 0, 0, 0
	}
	lw := cmplx.Log(w)
	wn1 := complex(1, 0) // w^(n-1)
	for k := 1; k < a.n; k++ {
		wn1 *= w
	}
	f := a.cc * wn1 * w * lw
	df := a.cc * wn1 * (complex(float64(a.n), 0)*lw + 1)
	gt, gd := real(df), -imag(df)
	return real(f), gt*a.tx + gd*a.dx, gt*a.ty + gd*a.dy
}

// entering returns the flux of phi entering the region through edge e at
// (x, y) on it.
func (a *breakPiece) entering(e problem.Side, x, y float64) float64 {
	if a.flux && !a.kink && e == a.side && math.Abs(a.t0+a.tx*x+a.ty*y) == 0 {
		// at the break itself: the value just after it (the along-edge
		// derivative, unbounded there, carries no flux through the edge)
		return 0
	}
	_, px, py := a.at(x, y)
	return Entering(&problem.Problem{Kx: a.kx, Ky: a.ky}, e, px, py)
}

// gradedGauss integrates f over [a, b] with Gauss-Legendre rules on panels
// that halve towards both ends, down to (b - a) 2^-depth, so that a peak of
// width w near an end (the angle field of a break at distance w from a
// corner, seen along the neighbouring edge) is resolved whatever w is.
func gradedGauss(f func(s float64) float64, a, b float64, depth int, x, w []float64) float64 {
	L := b - a
	breaks := []float64{a}
	for k := depth; k >= 2; k-- {
		breaks = append(breaks, a+math.Ldexp(L, -k))
	}
	breaks = append(breaks, a+L/2)
	for k := 2; k <= depth; k++ {
		breaks = append(breaks, b-math.Ldexp(L, -k))
	}
	breaks = append(breaks, b)
	return onPanels(f, breaks, x, w)
}

// onPanels integrates f with the rule (x, w) on [-1, 1] mapped onto each
// panel between consecutive points.
func onPanels(f func(s float64) float64, pts, x, w []float64) float64 {
	sum := 0.0
	for i := 0; i+1 < len(pts); i++ {
		m, r := (pts[i]+pts[i+1])/2, (pts[i+1]-pts[i])/2
		for q := range x {
			sum += w[q] * r * f(m+r*x[q])
		}
	}
	return sum
}

// Gauss-Legendre nodes and weights on [-1, 1] (solver/gauss): 16 points
// for the flows along edges, 8 for the area mean.
var (
	gl16x, gl16w = legendre(16)
	gl8x, gl8w   = legendre(8)
)

func legendre(n int) (x, w []float64) {
	x, w = make([]float64, n), make([]float64, n)
	gauss.Legendre(x, w, -1, 1)
	return x, w
}

// breakField is the series solution of the problem with the breaks inside
// its edges taken out, plus the break pieces that carry them.
type breakField struct {
	v          Field
	phis       []breakPiece
	inflow     [4]float64 // flows of the break pieces through the edges
	valueBreak [4]bool    // edges with a value break inside: infinite flow
	mean       float64    // area mean of the pieces
	shift      float64    // added to u: keeps the area mean 0 when only fluxes hold the field
	breaks     []Break
	length     [4]float64 // edge lengths, for the warnings
}

// solveWithBreaks solves a problem whose edge data break inside edges: the
// break pieces take the breaks out of the data, solve (the series) sums
// the rest, and the field returned adds them back. Flows through edges with
// a value break are infinite.
func solveWithBreaks(pr *problem.Problem, breaks []Break, solve func(*problem.Problem) (Field, error)) (Field, error) {
	bf := &breakField{breaks: breaks}
	for _, side := range problem.Sides {
		bf.length[side] = pr.Length(side)
	}
	for _, br := range breaks {
		a := newBreakPiece(pr, br)
		bf.phis = append(bf.phis, a)
		if e := pr.Edges[br.Side]; a.kink && e.Kind == problem.Convection {
			// takes back the Hc C t^2 ln|t| of the exchange
			b := a
			b.n, b.cc = 3, complex(0, -e.Hc*real(a.cc)/(3*a.kappa))
			bf.phis = append(bf.phis, b)
		}
		bf.valueBreak[br.Side] = bf.valueBreak[br.Side] || (br.Class == ValueBreak && pr.Edges[br.Side].Kind == problem.Value)
	}
	q := *pr
	for _, side := range problem.Sides {
		e, side := pr.Edges[side], side
		at := func(s float64) (phi, in float64) {
			x, y := pr.Point(side, s)
			return bf.phi(x, y), bf.entering(side, x, y)
		}
		f := e.F
		switch {
		case e.Kind == problem.Value:
			q.Edges[side].F = func(s float64) float64 {
				v := f(s)
				phi, _ := at(s)
				for i := range bf.phis {
					a := &bf.phis[i]
					if a.side == side && !a.flux && !a.kink && s == a.s0 {
						// at the break itself the piece is taken on the side
						// the data are on (the piece field shows the mean)
						phi -= a.amp / 2
						if math.Abs(v-(a.amp+breakTo(a, f))) < math.Abs(v-breakTo(a, f)) {
							phi += a.amp
						}
					}
				}
				return v - phi
			}
		case e.Kind == problem.Flux:
			q.Edges[side].F = func(s float64) float64 {
				v := f(s)
				_, in := at(s)
				return v - in - bf.breakSide(side, s, v, f)
			}
		case e.Hc == 0: // insulated convection: the break pieces' flux must be undone
			q.Edges[side] = problem.Edge{Kind: problem.Flux, F: func(s float64) float64 { _, in := at(s); return -in }}
		default: // Hc (a - v - phi) - in = Hc ((a - phi - in/Hc) - v)
			hc := e.Hc
			q.Edges[side].F = func(s float64) float64 {
				v := f(s)
				phi, in := at(s)
				return v - phi - (in+bf.breakSide(side, s, v, f))/hc
			}
		}
	}
	v, err := solve(&q)
	if err != nil {
		return nil, err
	}
	bf.v = v
	for _, side := range problem.Sides {
		if bf.valueBreak[side] {
			continue
		}
		// split at the pieces' own breaks on this edge, where their flux breaks
		cuts := []float64{0}
		for _, a := range bf.phis {
			if a.side == side {
				cuts = append(cuts, a.s0)
			}
		}
		cuts = append(cuts, pr.Length(side))
		slices.Sort(cuts)
		for k := 0; k+1 < len(cuts); k++ {
			if cuts[k+1] > cuts[k] {
				bf.inflow[side] += gradedGauss(func(s float64) float64 {
					x, y := pr.Point(side, s)
					return bf.entering(side, x, y)
				}, cuts[k], cuts[k+1], 40, gl16x, gl16w)
			}
		}
	}
	for _, a := range bf.phis {
		bf.mean += a.mean() / (pr.W * pr.H)
	}
	// With no value edge and no exchange by convection the level of u is
	// free and fixed by the rule area mean = 0; the pieces must not move it.
	fixed := false
	for _, e := range pr.Edges {
		fixed = fixed || e.Kind == problem.Value || (e.Kind == problem.Convection && e.Hc > 0)
	}
	if !fixed {
		bf.shift = -bf.mean
	}
	return bf, nil
}

// breakSide corrects the entering flux of the flux pieces at their own
// break, where entering gives the value after the break: when the data v
// there are on the side before it, the flux before it is used instead.
func (bf *breakField) breakSide(side problem.Side, s, v float64, f func(float64) float64) float64 {
	add := 0.0
	for i := range bf.phis {
		a := &bf.phis[i]
		if a.side == side && a.flux && !a.kink && s == a.s0 {
			after := breakTo(a, f)
			before := f(math.Nextafter(a.s0, math.Inf(-1)))
			if math.Abs(v-before) < math.Abs(v-after) {
				add += -a.kappa * a.amp // the entering flux before the break
			}
		}
	}
	return add
}

// breakTo returns the value an edge's data take just after the break of
// piece a.
func breakTo(a *breakPiece, f func(float64) float64) float64 {
	return f(math.Nextafter(a.s0, math.Inf(1)))
}

func (bf *breakField) phi(x, y float64) float64 {
	sum := 0.0
	for i := range bf.phis {
		p, _, _ := bf.phis[i].at(x, y)
		sum += p
	}
	return sum
}

func (bf *breakField) entering(e problem.Side, x, y float64) float64 {
	in := 0.0
	for i := range bf.phis {
		in += bf.phis[i].entering(e, x, y)
	}
	return in
}

// mean returns the integral of phi over the rectangle: along its edge split
// at the break, across it towards the edge, both graded towards the break.
func (a *breakPiece) mean() float64 {
	along, across := a.w, a.h
	if a.side == problem.Left || a.side == problem.Right {
		along, across = a.h, a.w
	}
	point := func(s, n float64) (x, y float64) { // s along the edge, n into the region
		switch a.side {
		case problem.Bottom:
			return s, n
		case problem.Top:
			return s, a.h - n
		case problem.Left:
			return n, s
		}
		return a.w - n, s
	}
	inner := func(s float64) float64 {
		return gradedGauss(func(n float64) float64 {
			phi, _, _ := a.at(point(s, n))
			return phi
		}, 0, across, 12, gl8x, gl8w)
	}
	return gradedGauss(inner, 0, a.s0, 12, gl8x, gl8w) + gradedGauss(inner, a.s0, along, 12, gl8x, gl8w)
}

func (bf *breakField) At(x, y float64) (u, ux, uy float64) {
	u, ux, uy = bf.v.At(x, y)
	u += bf.shift
	for i := range bf.phis {
		p, px, py := bf.phis[i].at(x, y)
		u, ux, uy = u+p, ux+px, uy+py
	}
	return u, ux, uy
}

func (bf *breakField) Grid(nx, ny int, u, ux, uy []float64) {
	bf.v.Grid(nx, ny, u, ux, uy)
	w, h := bf.phis[0].w, bf.phis[0].h
	for j := 0; j <= ny; j++ {
		for i := 0; i <= nx; i++ {
			k := j*(nx+1) + i
			x, y := float64(i)*w/float64(nx), float64(j)*h/float64(ny)
			u[k] += bf.shift
			for a := range bf.phis {
				p, px, py := bf.phis[a].at(x, y)
				u[k] += p
				if ux != nil {
					ux[k] += px
				}
				if uy != nil {
					uy[k] += py
				}
			}
		}
	}
}

func (bf *breakField) Flow(e problem.Side) (float64, bool) {
	q, ok := bf.v.Flow(e)
	if bf.valueBreak[e] {
		return 0, false
	}
	return q + bf.inflow[e], ok
}

func (bf *breakField) Mean() float64          { return bf.v.Mean() + bf.mean + bf.shift }
func (bf *breakField) Terms() int             { return bf.v.Terms() }
func (bf *breakField) ErrorEstimate() float64 { return bf.v.ErrorEstimate() }

// Warnings returns the series' warnings, then one for each value break.
func (bf *breakField) Warnings() []problem.Warning {
	w := bf.v.Warnings()
	for _, b := range bf.breaks {
		if b.Class == ValueBreak {
			w = append(w, problem.Warning{Code: problem.StepJump, Edges: b.Edges(), Text: b.warning(bf.length[b.Side])})
		}
	}
	return w
}
