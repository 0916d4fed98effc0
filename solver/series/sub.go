package series

import (
	"math"
	"sync"

	"edgewise/solver/gauss"
	"edgewise/solver/problem"
	"edgewise/solver/series/basis"
)

// sub is the sub-problem that carries the residual data of one edge, the
// other three edges homogeneous of their own kind. In local coordinates s
// (along the loaded edge) and t (distance from it into the region, 0..D):
//
//	u = sum_n X_n(s) [A_n exp(-lambda_n t) + B_n exp(-lambda_n (2D - t))]
//
// which is the overflow-free form of c_n Z_n(D - t) / N_n with
// Z_n(tau) = cos(theta) cosh(lambda tau) + sin(theta) sinh(lambda tau)
// meeting the opposite edge's homogeneous condition and N_n the loaded
// edge's condition operator applied to Z_n. A zero eigenvalue (flux
// neighbours on both ends) has u = X_0 (A_0 + B_0 t).
type sub struct {
	side    problem.Side
	L, D    float64
	b       *basis.Basis
	n       int
	zero    bool // term 0 has lambda = 0
	A, B    []float64
	e1      []float64 // exp(-lambda D)
	tailMax []float64 // max over m >= n of |A_m| + |B_m|
	tail    float64   // estimated truncation error of u (max over the region)
	capped  bool      // stopped at MaxTerms before meeting the tolerance
	sine    bool      // value neighbours on both ends: X_n = sin(n pi s / L)
	// X_n and X_n' at s = 0 and s = L (where the flows through the
	// neighbouring edges are taken), made once by the first at there
	endOnce [2]sync.Once
	endX    [2][2][]float64
}

func biot(m *model, e problem.Side, L float64) float64 {
	switch m.kinds[e] {
	case problem.Value:
		return math.Inf(1)
	case problem.Flux:
		return 0
	}
	return m.beta[e] * L
}

// newSub builds the sub-problem of edge e for the residual data r, adding
// terms until the estimated tail is below tol or maxTerms is reached.
func newSub(m *model, e problem.Side, r func(s float64) float64, tol float64, maxTerms int, breaks []float64, cache *projCache) *sub {
	na, nb, opp := neighbours(e)
	sp := &sub{side: e, L: m.length(e), D: m.length(na)}
	sp.sine = m.kinds[na] == problem.Value && m.kinds[nb] == problem.Value
	sp.b = basis.New(sp.L, biot(m, na, sp.L), biot(m, nb, sp.L), 16)
	var c []float64
	for n := 16; ; n *= 2 {
		if n > maxTerms {
			n = maxTerms
		}
		sp.b.Grow(n)
		c = cache.project(sp.b, r, n, c, breaks)
		sp.setTerms(m, e, opp, c, n)
		sp.tail = sp.tailEstimate(n)
		if sp.tail <= tol || n >= maxTerms {
			sp.capped = sp.tail > tol
			break
		}
	}
	sp.trim(tol)
	return sp
}

// amp returns |u-coefficient| at t = 0 for the first n terms.
func (sp *sub) amp(n int) []float64 {
	a := make([]float64, n)
	for i := range a {
		a[i] = math.Abs(sp.A[i]) + math.Abs(sp.B[i])*sp.e1[i]*sp.e1[i]
		if sp.zero && i == 0 {
			a[i] = math.Abs(sp.A[0])
		}
	}
	return a
}

// trim drops trailing terms whose total is negligible against tol.
func (sp *sub) trim(tol float64) {
	a := sp.amp(sp.n)
	sum := 0.0
	n := sp.n
	for n > 1 && sum+a[n-1] < 1e-3*tol {
		sum += a[n-1]
		n--
	}
	sp.n = n
	sp.tailMax = make([]float64, n+1)
	for i := n - 1; i >= 0; i-- {
		sp.tailMax[i] = math.Max(sp.tailMax[i+1], math.Abs(sp.A[i])+math.Abs(sp.B[i]))
	}
}

// setTerms folds the data coefficients c into A_n, B_n.
func (sp *sub) setTerms(m *model, e, opp problem.Side, c []float64, n int) {
	sp.n = n
	sp.A = resize(sp.A, n)
	sp.B = resize(sp.B, n)
	sp.e1 = resize(sp.e1, n)
	sp.zero = false
	sp.foldTerms(m, e, opp, c)
}

// foldTerms is setTerms' loop over the terms. It is a function of its own,
// not inlined, to keep its loop out of a large function (see the package
// doc of edgewise/solver, Loops in functions of their own).
//
//go:noinline
func (sp *sub) foldTerms(m *model, e, opp problem.Side, c []float64) {
	for i := 0; i < sp.n; i++ {
		if sp.b.Lambda[i] == 0 {
			sp.zero = true
			sp.zeroTerm(m, e, opp, c, i)
			continue
		}
		sp.foldTerm(m, e, opp, c, i)
	}
}

// zeroTerm sets the coefficients of term i, of eigenvalue 0.
func (sp *sub) zeroTerm(m *model, e, opp problem.Side, c []float64, i int) {
	beta, betaO := m.beta[e], m.beta[opp]
	z0, z1 := 1.0, betaO
	if m.kinds[opp] == problem.Value {
		z0, z1 = 0, 1
	}
	var N float64
	switch m.kinds[e] {
	case problem.Value:
		N = z0 + z1*sp.D
	case problem.Flux:
		N = z1
	default:
		N = z1 + beta*(z0+z1*sp.D)
	}
	sp.e1[i] = 1
	if N == 0 { // all-flux constant mode: fixed later by the mean
		sp.A[i], sp.B[i] = 0, 0
		return
	}
	sp.A[i] = c[i] * (z0 + z1*sp.D) / N
	sp.B[i] = -c[i] * z1 / N
}

// foldTerm sets the coefficients of term i, of eigenvalue not 0.
func (sp *sub) foldTerm(m *model, e, opp problem.Side, c []float64, i int) {
	beta, betaO := m.beta[e], m.beta[opp]
	lam := sp.b.Lambda[i]
	var cs, sn float64
	switch m.kinds[opp] {
	case problem.Value:
		cs, sn = 0, 1
	case problem.Flux:
		cs, sn = 1, 0
	default:
		th := math.Atan2(betaO, lam)
		sn, cs = math.Sincos(th)
	}
	e1 := math.Exp(-lam * sp.D)
	om := -math.Expm1(-2 * lam * sp.D) // 1 - exp(-2 lambda D)
	op := 1 + e1*e1
	val := cs*op + sn*om // (c+s) + (c-s) e2
	der := lam * (cs*om + sn*op)
	var N float64
	switch m.kinds[e] {
	case problem.Value:
		N = val
	case problem.Flux:
		N = der
	default:
		N = der + beta*val
	}
	sp.e1[i] = e1
	sp.A[i] = c[i] * (cs + sn) / N
	sp.B[i] = c[i] * (cs - sn) / N
}

func resize(s []float64, n int) []float64 {
	if cap(s) >= n {
		return s[:n]
	}
	return make([]float64, n)
}

// project returns the first n generalised Fourier coefficients of r in
// basis b by Gauss-Legendre quadrature with n+32 nodes.
func project(b *basis.Basis, r func(s float64) float64, n int, dst []float64, breaks []float64) []float64 {
	dst = resize(dst, n)
	for i := range dst {
		dst[i] = 0
	}
	xs, ws := projectionRule(b.L, n, breaks)
	// the nodes and weighted data of a basis whose terms are not evenly
	// spaced, gathered for robinProject
	nodes, wrs := projectNodes(b, r, xs, ws, dst)
	if len(nodes) > 0 {
		robinProject(b, nodes, wrs, dst[:n])
	}
	divideTerms(dst, b.Norm)
	return dst
}

// projectNodes adds w_j r(s_j) X_i(s_j) to dst[i] (i < len(dst)) for the
// nodes s_j = xs[j] of a uniform basis; for the other bases it returns the
// nodes and their weighted data w_j r(s_j), both without the zeros, for
// robinProject. It is a function of its own, not inlined, to keep its loop
// out of a large function (see the package doc of edgewise/solver, Loops
// in functions of their own).
//
//go:noinline
func projectNodes(b *basis.Basis, r func(s float64) float64, xs, ws, dst []float64) (nodes, wrs []float64) {
	for j, s := range xs {
		wr := ws[j] * r(s)
		if wr == 0 {
			continue
		}
		if b.Uniform {
			addNode(b, s, wr, dst)
			continue
		}
		nodes, wrs = append(nodes, s), append(wrs, wr)
	}
	return nodes, wrs
}

// addNode adds wr X_i(s) to dst[i] (i < len(dst)) for a uniform basis b:
// sin(lambda_i s + phi) with lambda_i = lambda_0 + i pi/L, by rotation.
func addNode(b *basis.Basis, s, wr float64, dst []float64) {
	sn, cs := math.Sincos(b.Lambda[0]*s + b.Phi[0])
	ds, dc := math.Sincos(math.Pi * s / b.L)
	addRotated(dst, wr, sn, cs, ds, dc)
}

// divideTerms divides d[i] by norm[i]. It is a function of its own, not
// inlined, to keep its loop out of a large function (see the package doc
// of edgewise/solver, Loops in functions of their own).
//
//go:noinline
func divideTerms(d, norm []float64) {
	for i := range d {
		d[i] /= norm[i]
	}
}

// projectionRule returns the nodes and weights of the projection of n
// terms over [0, L]: one Gauss-Legendre rule of n+32 nodes per stretch
// between the flux breaks, so that a break costs the rule no accuracy.
func projectionRule(L float64, n int, breaks []float64) (xs, ws []float64) {
	q := n + 32
	x, w := make([]float64, q), make([]float64, q)
	lo := 0.0
	for k := 0; k <= len(breaks); k++ {
		hi := L
		if k < len(breaks) {
			hi = breaks[k]
		}
		if hi <= lo {
			continue
		}
		gauss.Legendre(x, w, lo, hi)
		lo = hi
		xs, ws = append(xs, x...), append(ws, w...)
	}
	return xs, ws
}

// tailEstimate estimates the largest error of u left by truncating after
// n terms. The terms n/2..n-1 are summed at the loaded edge (t = 0, where
// every term is largest) on 129 Chebyshev points; with the envelope of the
// u-coefficients falling like n^-p over the last two octaves, the tail
// beyond n is that difference times r/(1-r), r = 2^(1-p), and a safety
// factor of 2 is applied. A pure 1/n^p bound (sum of |a_n|) is used when n
// is small.
func (sp *sub) tailEstimate(n int) float64 {
	a := sp.amp(n)
	if n < 16 {
		s := 0.0
		for _, v := range a {
			s += v
		}
		return s
	}
	e2 := maxOf(a[n/2 : n])
	if e2 == 0 {
		return 0
	}
	e1 := maxOf(a[n/4 : n/2])
	p := 8.0
	if e1 > 0 {
		p = math.Log2(e1 / e2)
	}
	p = math.Max(1.5, math.Min(p, 8))
	r := math.Pow(2, 1-p)
	diff := sp.tailDiff(n)
	// The sampled maximum may miss a peak between points: never report less
	// than the largest single dropped-term amplitude.
	diff = math.Max(diff, e2)
	return 2 * diff * r / (1 - r)
}

// maxOf returns the largest of 0 and the values of a. It is a function of
// its own, not inlined, to keep its loop out of a large function (see the
// package doc of edgewise/solver, Loops in functions of their own).
//
//go:noinline
func maxOf(a []float64) float64 {
	m := 0.0
	for _, v := range a {
		m = math.Max(m, v)
	}
	return m
}

// tailDiff returns the largest |sum| of the terms n/2..n-1 at the loaded
// edge over the Chebyshev points of tailEstimate. It is a function of its
// own, not inlined, to keep its loop out of a large function (see the
// package doc of edgewise/solver, Loops in functions of their own).
//
//go:noinline
func (sp *sub) tailDiff(n int) float64 {
	diff := 0.0
	var row []float64
	const np = 128
	for j := 0; j <= np; j++ {
		s := sp.L * (1 - math.Cos(math.Pi*float64(j)/np)) / 2
		var sum float64
		if sp.b.Uniform {
			sum = sp.tailSumUniform(s, n)
		} else {
			row = resize(row, n-n/2)
			sp.b.Row(s, n/2, n, row, nil)
			sum = sp.tailSumRow(row, n)
		}
		diff = math.Max(diff, math.Abs(sum))
	}
	return diff
}

// tailSumUniform returns the sum of the terms n/2..n-1 at the loaded edge
// at s for a uniform basis (lambda_i = lambda_0 + i pi/L): by rotation
// from term n/2.
// Not inlined: see the package doc of edgewise/solver, Loops in
// functions of their own.
//
//go:noinline
func (sp *sub) tailSumUniform(s float64, n int) float64 {
	sum := 0.0
	i0 := n / 2
	sn, cs := math.Sincos(sp.b.Lambda[i0]*s + sp.b.Phi[i0])
	ds, dc := math.Sincos(math.Pi * s / sp.L)
	for i := i0; i < n; i++ {
		sum += (sp.A[i] + sp.B[i]*sp.e1[i]*sp.e1[i]) * sn
		sn, cs = sn*dc+cs*ds, cs*dc-sn*ds
	}
	return sum
}

// tailSumRow is tailSumUniform with the terms' X_i(s) in row.
// Not inlined: see the package doc of edgewise/solver, Loops in
// functions of their own.
//
//go:noinline
func (sp *sub) tailSumRow(row []float64, n int) float64 {
	sum := 0.0
	for i := n / 2; i < n; i++ {
		sum += (sp.A[i] + sp.B[i]*sp.e1[i]*sp.e1[i]) * row[i-n/2]
	}
	return sum
}

// expEvery is how often sub.at takes the exponentials afresh on a basis
// of evenly spaced eigenvalues (between them, a product per term: the
// error grows by a rounding per step, to about 1e-15 relative).
const expEvery = 8

// at returns u, du/ds, du/dt at local (s, t).
func (sp *sub) at(s, t float64) (u, us, ut float64) {
	if t < 0 {
		t = 0
	}
	cut := sp.rowTerms(t, 0)
	var xs, dxs []float64
	if s == 0 || s == sp.L {
		xs, dxs = sp.endRow(s)
	}
	if len(xs) < cut {
		var xb, dxb [128]float64
		xs, dxs = xb[:], dxb[:]
		if cut > len(xs) {
			xs, dxs = make([]float64, cut), make([]float64, cut)
		}
		sp.b.Row(s, 0, cut, xs, dxs)
	}
	// evenly spaced eigenvalues (lambda_(i+1) - lambda_i = pi/L): between
	// exact exponentials every expEvery terms, the step factors
	var qa, qb float64
	uniform := sp.b.Uniform && t != 0 && t != sp.D
	if uniform {
		qa, qb = math.Exp(-math.Pi/sp.L*t), math.Exp(-math.Pi/sp.L*(2*sp.D-t))
	}
	return sp.sumAt(xs[:cut], dxs[:cut], t, uniform, qa, qb)
}

// endRow returns X_i(s) and X_i'(s) for all the terms at an end s = 0
// or s = L, made once.
func (sp *sub) endRow(s float64) (xs, dxs []float64) {
	end := 0
	if s == sp.L {
		end = 1
	}
	sp.endOnce[end].Do(func() {
		x, dx := make([]float64, sp.n), make([]float64, sp.n)
		sp.b.Row(s, 0, sp.n, x, dx) // the same recurrence: Row's prefix
		sp.endX[end] = [2][]float64{x, dx}
	})
	return sp.endX[end][0], sp.endX[end][1]
}

// sumAt returns u, du/ds, du/dt at t from the terms' X_i(s) in xs and
// X_i'(s) in dxs (at's loop over the terms; qa and qb its step factors
// when uniform). It is a function of its own, not inlined, to keep its
// loop out of a large function (see the package doc of edgewise/solver,
// Loops in functions of their own).
//
//go:noinline
func (sp *sub) sumAt(xs, dxs []float64, t float64, uniform bool, qa, qb float64) (u, us, ut float64) {
	var ea, eb float64
	cut := len(xs)
	for i := 0; i < cut; i++ {
		x, dx := xs[i], dxs[i]
		if sp.zero && i == 0 {
			y := sp.A[0] + sp.B[0]*t
			u += x * y
			ut += x * sp.B[0]
			continue
		}
		lam := sp.b.Lambda[i]
		// on the loaded edge and on the opposite one (where the flows are
		// taken) the exponentials are known: 1, exp(-lambda D)^2, and
		// exp(-lambda D) twice; eb is not needed when B is zero
		switch {
		case t == 0:
			ea, eb = 1, sp.e1[i]*sp.e1[i]
		case t == sp.D:
			ea, eb = sp.e1[i], sp.e1[i]
		case uniform && i%expEvery != 0 && (i-1 > 0 || !sp.zero):
			ea, eb = ea*qa, eb*qb // from term i-1, computed just before
			if eb < 1e-300 {
				eb = 0 // no subnormal steps: B eb is nothing beside A ea
			}
		default:
			ea = math.Exp(-lam * t)
			eb = 0
			if sp.B[i] != 0 || uniform {
				eb = math.Exp(-lam * (2*sp.D - t))
			}
		}
		y := sp.A[i]*ea + sp.B[i]*eb
		u += x * y
		us += dx * y
		ut += x * lam * (sp.B[i]*eb - sp.A[i]*ea)
	}
	return u, us, ut
}

// rowTerms returns how many terms are needed at distance t from the loaded
// edge for the dropped ones to stay below cut (cut = 0: a tiny floor).
func (sp *sub) rowTerms(t, cut float64) int {
	n := sp.n
	gap := 2 * t / sp.L
	if gap < 1e-6 || n == 0 {
		return n
	}
	if cut == 0 {
		cut = 1e-17 * (sp.tailMax[0] + 1e-300)
	}
	geo := 1 / -math.Expm1(-gap)
	ok := func(i int) bool {
		return sp.tailMax[i]*math.Exp(-sp.b.Lambda[i]*t)*geo < cut
	}
	lo, hi := 0, n // find the first i with ok(i)
	for lo < hi {
		mid := (lo + hi) / 2
		if ok(mid) {
			hi = mid
		} else {
			lo = mid + 1
		}
	}
	return lo
}

// local maps mapped (x, y) to the sub-problem's (s, t).
func (sp *sub) local(x, y, w, h float64) (s, t float64) {
	switch sp.side {
	case problem.Bottom:
		return x, y
	case problem.Top:
		return x, h - y
	case problem.Left:
		return y, x
	}
	return y, w - x
}

// global maps (du/ds, du/dt) to (du/dx, du/dy).
func (sp *sub) global(us, ut float64) (ux, uy float64) {
	switch sp.side {
	case problem.Bottom:
		return us, ut
	case problem.Top:
		return us, -ut
	case problem.Left:
		return ut, us
	}
	return -ut, us
}

// intY returns the integral over 0 <= t <= D of the t-factor of term i
// (coefficient included), and its t-derivative at t = 0 and t = D.
func (sp *sub) intY(i int) (integral, d0, dD float64) {
	if sp.zero && i == 0 {
		return sp.A[0]*sp.D + sp.B[0]*sp.D*sp.D/2, sp.B[0], sp.B[0]
	}
	lam := sp.b.Lambda[i]
	e1 := sp.e1[i]
	integral = (sp.A[i] + sp.B[i]*e1) * -math.Expm1(-lam*sp.D) / lam
	d0 = lam * (sp.B[i]*e1*e1 - sp.A[i])
	dD = lam * e1 * (sp.B[i] - sp.A[i])
	return
}

// robinProject adds sum_j w_j X_i(s_j) to dst[i] for a basis whose terms
// are not evenly spaced (a convection neighbour): term by term, every node
// at once (independent rotations, which the processor overlaps). From term
// i-1 to term i each node's sine and cosine rotate by pi s/L and by the
// small angle (lambda_i - lambda_(i-1) - pi/L) s + phi_i - phi_(i-1),
// whose sine and cosine come from their Taylor series when it is below
// 0.02 over the whole edge (to rounding); a term with a larger step is
// taken afresh by math.Sincos at every node. The rotations keep the sines
// exact to about i 1e-16, far below the series' tolerance.
func robinProject(b *basis.Basis, s, w, dst []float64) {
	q := len(s)
	sn, cs, rs, rc := make([]float64, q), make([]float64, q), make([]float64, q), make([]float64, q)
	dst[0] += robinStart(b, s, w, sn, cs, rs, rc)
	for i := 1; i < len(dst); i++ {
		dl := b.Lambda[i] - b.Lambda[i-1] - math.Pi/b.L
		dp := b.Phi[i] - b.Phi[i-1]
		if math.Abs(dl)*b.L+math.Abs(dp) >= 0.02 { // a large step: afresh
			dst[i] += robinAfresh(b.Lambda[i], b.Phi[i], s, w, sn, cs)
			continue
		}
		sum, sum2 := robinStep(dl, dp, s, w, sn, cs, rs, rc)
		dst[i] += sum + sum2
	}
}

// robinStart sets sn, cs to the sine and cosine of term 0 at the nodes s,
// and rs, rc to those of pi s/L, and returns sum_j w_j sn_j
// (robinProject's first term). It is a function of its own, not inlined,
// to keep its loop out of a large function (see the package doc of
// edgewise/solver, Loops in functions of their own).
//
//go:noinline
func robinStart(b *basis.Basis, s, w, sn, cs, rs, rc []float64) float64 {
	sum := 0.0
	for j, x := range s {
		sn[j], cs[j] = math.Sincos(b.Lambda[0]*x + b.Phi[0])
		rs[j], rc[j] = math.Sincos(math.Pi * x / b.L)
		sum += w[j] * sn[j]
	}
	return sum
}

// robinAfresh sets sn, cs to the sine and cosine of lam s + phi at the
// nodes s and returns sum_j w_j sn_j.
// Not inlined: see the package doc of edgewise/solver, Loops in
// functions of their own.
//
//go:noinline
func robinAfresh(lam, phi float64, s, w, sn, cs []float64) float64 {
	sum := 0.0
	for j, x := range s {
		sn[j], cs[j] = math.Sincos(lam*x + phi)
		sum += w[j] * sn[j]
	}
	return sum
}

// robinStep rotates sn, cs at the nodes s by (rs, rc) and the small angle
// dl s + dp, and returns the two halves of sum_j w_j sn_j (even and odd j).
// Not inlined: see the package doc of edgewise/solver, Loops in
// functions of their own.
//
//go:noinline
func robinStep(dl, dp float64, s, w, sn, cs, rs, rc []float64) (sum, sum2 float64) {
	// Taylor series to t^5 and t^6 (the next terms are below 3e-16 of
	// them for |t| < 0.02); constants as products, divisions being slow
	const s3, s5, c2, c4, c6 = 1.0 / 6, 1.0 / 20, 0.5, 1.0 / 12, 1.0 / 30
	// two sums, so that the additions overlap
	for j, x := range s {
		a, c := sn[j]*rc[j]+cs[j]*rs[j], cs[j]*rc[j]-sn[j]*rs[j]
		t := dl*x + dp
		t2 := t * t
		es := t * (1 - t2*s3*(1-t2*s5))
		ec := 1 - t2*c2*(1-t2*c4*(1-t2*c6))
		v, u := a*ec+c*es, c*ec-a*es
		sn[j], cs[j] = v, u
		if j&1 == 0 {
			sum += w[j] * v
		} else {
			sum2 += w[j] * v
		}
	}
	return sum, sum2
}
