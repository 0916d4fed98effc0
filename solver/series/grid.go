package series

import (
	"math"
	"sync/atomic"

	"gonum.org/v1/gonum/dsp/fourier"

	"edgewise/solver/problem"
)

// spareWork keeps one gridWork between Grid calls, of any Solution (a
// solve per edit makes a new Solution each time): its tables and buffers
// of up to a few MB are not allocated and cleared anew.
var spareWork atomic.Pointer[gridWork]

// gridWork holds buffers reused across Grid calls.
type gridWork struct {
	logs       []complex128 // log(x_i + i y_j) at every node (bottom-left frame)
	theta      []float64    // its imaginary part alone
	sinTab     []float64    // sin(n pi i / M), n < tabTerms
	cosTab     []float64
	tabM       int
	xtab, ctab []float64  // X_k and its cosine partner on the nodes (separable path)
	bufs       []*rowBuf  // one per worker of gridRows
	sines      []*sineBuf // one per worker of gridSinePair
}

// sineBuf is one worker's buffers for gridSinePair.
type sineBuf struct {
	a, b       []float64 // a row's coefficients and their t-derivatives
	col        []float64 // a row's sum from the tables
	cu, cs, ct []float64 // a chunk of grid columns as rows: u and its derivatives along and across
	fa, fb, fc []float64 // folded transform inputs
	dst        *fourier.DST
	dct        *fourier.DCT
}

func grow(s []float64, n int) []float64 {
	if cap(s) < n {
		return make([]float64, n)
	}
	return s[:n]
}

// Grid fills u (and ux, uy when non-nil) at the (nx+1)*(ny+1) nodes
// x = i W/nx, y = j H/ny, index j*(nx+1)+i (original coordinates). The
// buffers are the caller's; Grid reuses internal work buffers across calls
// and is not safe for concurrent use on one Solution. Sub-problems whose
// basis is the sine series (value edges on both neighbours) are summed by
// one DST per row (DCT for the derivative along the edge), the others as
// separable products X_n(s_i) Y_n(t_j), two opposite sub-problems in one
// product per row (gridSubs), the X_n tabulated by rotation recurrence;
// every row keeps only the terms that still matter at its distance from
// the loaded edge. Rows are shared among up to GOMAXPROCS goroutines.
// Caller bugs (nx, ny < 1, short buffers) panic.
func (s *Solution) Grid(nx, ny int, u, ux, uy []float64) {
	nn := (nx + 1) * (ny + 1)
	if nx < 1 || ny < 1 || len(u) < nn || (ux != nil && len(ux) < nn) || (uy != nil && len(uy) < nn) {
		panic("series: bad grid size or buffer")
	}
	u = u[:nn]
	clear(u)
	if ux != nil {
		ux = ux[:nn]
		clear(ux)
	}
	if uy != nil {
		uy = uy[:nn]
		clear(uy)
	}
	m := s.m
	// the buffers and tables of the last Grid of any Solution, if free
	s.gw = spareWork.Swap(nil)
	if s.gw == nil {
		s.gw = new(gridWork)
	}
	defer func() {
		spareWork.Store(s.gw)
		s.gw = nil
	}()
	s.gridPieces(nx, ny, u, ux, uy)
	// Each row drops the terms whose sum is below cut (a bound: |X_n| <= 1,
	// |A e^-lambda t| + |B e^-lambda (2D - t)| <= (|A| + |B|) e^-lambda t).
	// The four sub-problems may so drop up to 4 cut: a tenth of the error
	// estimate, so that what the grid shows stays within it like a probe
	// (with 0.1 Tol, as before, the grid's error was 5 to 10 times the
	// probes' and up to the whole estimate).
	cut := 0.025 * s.est
	done := [4]bool{}
	if nx >= 2 && s.subs[problem.Bottom].sine {
		s.gridSinePair(problem.Bottom, problem.Top, nx, ny, cut, u, ux, uy)
		done[problem.Bottom], done[problem.Top] = true, true
	}
	if ny >= 2 && s.subs[problem.Left].sine {
		s.gridSinePair(problem.Left, problem.Right, nx, ny, cut, u, ux, uy)
		done[problem.Left], done[problem.Right] = true, true
	}
	for _, p := range [2][2]problem.Side{{problem.Bottom, problem.Top}, {problem.Left, problem.Right}} {
		var near, far *sub
		if !done[p[0]] {
			near = s.subs[p[0]]
		}
		if !done[p[1]] {
			far = s.subs[p[1]]
		}
		if near != nil || far != nil {
			s.gridSubs(near, far, nx, ny, cut, u, ux, uy)
		}
	}
	if uy != nil && m.a != 1 {
		for i := range uy {
			uy[i] *= m.a
		}
	}
	// Corner nodes: the singular pieces need their limits there.
	for c := 0; c < 4; c++ {
		i, j := 0, 0
		if c == 1 || c == 2 {
			i = nx
		}
		if c >= 2 {
			j = ny
		}
		x, y := m.cornerPoint(c)
		a, b, d := s.At(x, y/m.a)
		k := j*(nx+1) + i
		u[k] = a
		if ux != nil {
			ux[k] = b
		}
		if uy != nil {
			uy[k] = d
		}
	}
}

// cornerSum is the sum of the pieces at one corner:
// a0 + a1 zeta + a2 zeta^2 + a3 zeta^3 + (b0 + b1 zeta + b2 zeta^2 + b3 zeta^3) log zeta.
type cornerSum struct {
	on                             bool
	a0, a1, a2, a3, b0, b1, b2, b3 complex128
	logs                           bool
	z0, rho                        complex128
}

// atanPos returns atan2(y, x) for x, y >= 0, not both zero.
func atanPos(y, x float64) float64 {
	if y <= x {
		return math.Atan(y / x)
	}
	return math.Pi/2 - math.Atan(x/y)
}

// gridPieces adds the particular solution and the harmonic pieces.
func (s *Solution) gridPieces(nx, ny int, u, ux, uy []float64) {
	m := s.m
	hx, hy := m.W/float64(nx), m.H/float64(ny)
	// Smooth polynomial pieces share one centre and scale: one Horner sum.
	var poly [6]complex128
	var pz0, prho complex128
	var corner [4]cornerSum
	for i := range s.pieces {
		p := &s.pieces[i]
		if p.corner < 0 {
			poly[p.n] += p.c
			pz0, prho = p.z0, p.rho
			continue
		}
		cr := &corner[p.corner]
		cr.on, cr.z0, cr.rho = true, p.z0, p.rho
		switch p.kind {
		case powPiece:
			switch p.n {
			case 0:
				cr.a0 += p.c
			case 1:
				cr.a1 += p.c
			case 2:
				cr.a2 += p.c
			case 3:
				cr.a3 += p.c
			default:
				panic("series: unexpected corner power")
			}
		case logPiece:
			cr.b0 += p.c
			cr.logs = true
		case zlogPiece:
			cr.b1 += p.c
			cr.logs = true
		case z2logPiece:
			cr.b2 += p.c
			cr.logs = true
		case z3logPiece:
			cr.b3 += p.c
			cr.logs = true
		}
	}
	// When the only logarithmic pieces are angle functions (corner breaks,
	// b0 imaginary) and the corners carry no power above the first, one
	// arctangent per node, shared by the four corners through symmetry,
	// does (gridPiecesFast); otherwise a complex logarithm per node.
	needLogs, fullLogs := false, false
	for c := range corner {
		cr := &corner[c]
		needLogs = needLogs || cr.logs
		if cr.logs && (cr.b1 != 0 || cr.b2 != 0 || cr.b3 != 0 || cr.a2 != 0 || cr.a3 != 0 || real(cr.b0) != 0) {
			fullLogs = true
		}
	}
	w := s.gw
	nn := (nx + 1) * (ny + 1)
	if needLogs && fullLogs {
		if cap(w.logs) < nn {
			w.logs = make([]complex128, nn)
		}
		w.logs = w.logs[:nn]
		logs := w.logs
		s.gridRows(ny+1, func(r0, r1 int, _ *rowBuf) {
			for j := r0; j < r1; j++ {
				y := float64(j) * hy
				row := logs[j*(nx+1) : (j+1)*(nx+1)]
				for i := range row {
					x := float64(i) * hx
					if i == 0 && j == 0 {
						row[i] = 0
						continue
					}
					row[i] = complex(0.5*math.Log(x*x+y*y), atanPos(y, x))
				}
			}
		})
	} else if needLogs {
		w.theta = grow(w.theta, nn)
		for j := 0; j <= ny; j++ {
			y := float64(j) * hy
			row := w.theta[j*(nx+1) : (j+1)*(nx+1)]
			row[0] = math.Pi / 2
			i0 := 1
			if hx == hy && j <= nx {
				// Square cells: theta(i, j) = pi/2 - theta(j, i), the
				// latter from an earlier row.
				for i := 1; i < j; i++ {
					row[i] = math.Pi/2 - w.theta[i*(nx+1)+j]
				}
				i0 = max(j, 1)
			}
			for i := i0; i < len(row); i++ {
				row[i] = atanPos(y, float64(i)*hx)
			}
		}
	}
	if !fullLogs {
		s.gridPiecesFast(nx, ny, u, ux, uy, poly, pz0, prho, &corner)
		return
	}
	// The corners' powers join the smooth polynomial (re-expanded about its
	// centre: rho_c (z - z_c) = alpha zeta + beta with zeta = prho (z - pz0));
	// the corners keep their logarithmic parts alone.
	if prho == 0 {
		pz0, prho = complex(m.W/2, m.H/2), complex(2/math.Max(m.W, m.H), 0)
	}
	binom := [4][4]float64{{1}, {1, 1}, {1, 2, 1}, {1, 3, 3, 1}}
	var on []logCorner
	for c := range corner {
		cr := &corner[c]
		if !cr.on {
			continue
		}
		alpha, beta := cr.rho/prho, cr.rho*(pz0-cr.z0)
		for n, an := range [4]complex128{cr.a0, cr.a1, cr.a2, cr.a3} {
			if an == 0 {
				continue
			}
			// an (alpha zeta + beta)^n = an sum_k C(n,k) alpha^k beta^(n-k) zeta^k
			for k := 0; k <= n; k++ {
				poly[k] += an * complex(binom[n][k], 0) * cpow(alpha, k) * cpow(beta, n-k)
			}
		}
		if cr.logs {
			on = append(on, logCorner{c: c, rho: cr.rho, z0: cr.z0, b: [4]complex128{cr.b0, cr.b1, cr.b2, cr.b3}})
		}
	}
	s.gridRows(ny+1, func(r0, r1 int, _ *rowBuf) {
		for j := r0; j < r1; j++ {
			s.piecesRow(j, nx, ny, hx, hy, u, ux, uy, &poly, pz0, prho, on)
		}
	})
}

// logCorner is the logarithmic part of a corner's pieces,
// (b0 + b1 zeta + b2 zeta^2 + b3 zeta^3) log zeta.
type logCorner struct {
	c       int
	rho, z0 complex128
	b       [4]complex128
}

// binom6 holds the binomial coefficients C(n, k), n <= 5.
var binom6 = [6][6]float64{{1}, {1, 1}, {1, 2, 1}, {1, 3, 3, 1}, {1, 4, 6, 4, 1}, {1, 5, 10, 10, 5, 1}}

// cpow returns z^n for small n >= 0.
func cpow(z complex128, n int) complex128 {
	p := complex(1, 0)
	for ; n > 0; n-- {
		p *= z
	}
	return p
}

// piecesRow adds the particular solution and the pieces on row j (the
// full path of gridPieces): the smooth polynomial by Horner's rule, and
// each corner's logarithmic part with its logarithm from w.logs (the
// bottom-left corner's table, mirrored for the others).
func (s *Solution) piecesRow(j, nx, ny int, hx, hy float64, u, ux, uy []float64, poly *[6]complex128, pz0, prho complex128, on []logCorner) {
	q := s.quad
	w := s.gw
	grad := ux != nil || uy != nil
	y := float64(j) * hy
	k0 := j * (nx + 1)
	urow := u[k0 : k0+nx+1]
	var uxrow, uyrow []float64
	if ux != nil {
		uxrow = ux[k0 : k0+nx+1]
	}
	if uy != nil {
		uyrow = uy[k0 : k0+nx+1]
	}
	cy := q.C*y*y + q.D*y + q.E
	gy := -(2*q.C*y + q.D)
	if imag(prho) == 0 {
		// zeta = X + i eta with eta fixed on the row: P(zeta) = sum_k e_k X^k,
		// e_k = sum_(n>=k) c_n C(n,k) (i eta)^(n-k), and P' = sum_k (k+1) e_(k+1) X^k,
		// so the row takes real polynomials in X (as gridPiecesFast)
		rh := real(prho)
		var cu, cx, cyy [6]float64
		rowPolyCoeffs(poly, complex(0, rh*(y-imag(pz0))), rh, &cu, &cx, &cyy)
		polyRowReal(q, urow, uxrow, uyrow, hx, rh, real(pz0), cy, gy, &cu, &cx, &cyy)
	} else {
		polyRowComplex(q, urow, uxrow, uyrow, poly, hx, y, cy, gy, pz0, prho)
	}
	for k := range on {
		cr := &on[k]
		// log zeta_c on this row: the table's row j (corners 0, 1) or
		// ny - j (2, 3), read backwards for corners 1 and 2, and
		// i pi/2 + conj(...) for corners 1 and 3
		lr := j
		if cr.c >= 2 {
			lr = ny - j
		}
		lrow := w.logs[lr*(nx+1) : (lr+1)*(nx+1)]
		back := cr.c == 1 || cr.c == 2
		conj := cr.c == 1 || cr.c == 3
		logPolyRow(cr, lrow, urow, uxrow, uyrow, hx, y, back, conj, grad)
	}
}

// rowPolyCoeffs sets the coefficients of u (cu) and of its gradient (cx,
// cyy) in powers of X on a row with zeta = X + eta, eta = i rh (y -
// Im pz0), from those of the smooth polynomial in zeta (piecesRow). It is a function of its own, not inlined, to keep its loop out of a
// large function (see the package doc of edgewise/solver, Loops in
// functions of their own).
//
//go:noinline
func rowPolyCoeffs(poly *[6]complex128, eta complex128, rh float64, cu, cx, cyy *[6]float64) {
	var e [6]complex128
	for k := 0; k <= 5; k++ {
		pw := complex(1, 0)
		for n := k; n <= 5; n++ {
			e[k] += poly[n] * complex(binom6[n][k], 0) * pw
			pw *= eta
		}
	}
	for k := 0; k <= 5; k++ {
		cu[k] = real(e[k])
		if k < 5 {
			cx[k] = rh * float64(k+1) * real(e[k+1])
			cyy[k] = -rh * float64(k+1) * imag(e[k+1])
		}
	}
}

// polyRowReal adds the quadratic q and the smooth polynomial, in real
// powers of X = rh (x - x0) with coefficients cu (cx, cyy for the
// gradient), on a row of piecesRow. It is a function of its own, not
// inlined, to keep its loop out of a large function (see the package doc
// of edgewise/solver, Loops in functions of their own).
//
//go:noinline
func polyRowReal(q quadratic, urow, uxrow, uyrow []float64, hx, rh, x0, cy, gy float64, cu, cx, cyy *[6]float64) {
	for i := range urow {
		x := float64(i) * hx
		X := rh * (x - x0)
		urow[i] += q.A*x*x + q.B*x + cy + ((((cu[5]*X+cu[4])*X+cu[3])*X+cu[2])*X+cu[1])*X + cu[0]
		if uxrow != nil {
			uxrow[i] += 2*q.A*x + q.B + (((cx[4]*X+cx[3])*X+cx[2])*X+cx[1])*X + cx[0]
		}
		if uyrow != nil {
			uyrow[i] += -gy + (((cyy[4]*X+cyy[3])*X+cyy[2])*X+cyy[1])*X + cyy[0]
		}
	}
}

// polyRowComplex is polyRowReal for a complex scale prho: the polynomial
// by Horner's rule in zeta = prho (z - pz0).
// Not inlined: see the package doc of edgewise/solver, Loops in
// functions of their own.
//
//go:noinline
func polyRowComplex(q quadratic, urow, uxrow, uyrow []float64, poly *[6]complex128, hx, y, cy, gy float64, pz0, prho complex128) {
	grad := uxrow != nil || uyrow != nil
	for i := range urow {
		x := float64(i) * hx
		z := prho * complex(x-real(pz0), y-imag(pz0))
		pv := poly[5]
		pd := complex(0, 0)
		for n := 4; n >= 0; n-- {
			if grad {
				pd = pd*z + pv
			}
			pv = pv*z + poly[n]
		}
		urow[i] += q.A*x*x + q.B*x + cy + real(pv)
		if grad {
			g := complex(2*q.A*x+q.B, gy) + pd*prho // u_x - i u_y
			if uxrow != nil {
				uxrow[i] += real(g)
			}
			if uyrow != nil {
				uyrow[i] -= imag(g)
			}
		}
	}
}

// logPolyRow adds a corner's (b0 + b1 zeta + b2 zeta^2 + b3 zeta^3) log
// zeta (b0 log zeta alone, an angle function when b0 is imaginary, when
// b1 = b2 = b3 = 0), its logarithm from lrow (read backwards when back,
// i pi/2 + conj(...) when conj), on a row y of piecesRow. It is a
// function of its own, not inlined, to keep its loop out of a large
// function (see the package doc of edgewise/solver, Loops in functions of
// their own).
//
//go:noinline
func logPolyRow(cr *logCorner, lrow []complex128, urow, uxrow, uyrow []float64, hx, y float64, back, conj, grad bool) {
	nx := len(urow) - 1
	b0, b1, b2, b3 := cr.b[0], cr.b[1], cr.b[2], cr.b[3]
	alone := b1 == 0 && b2 == 0 && b3 == 0
	rho, z0 := cr.rho, cr.z0
	for i := range urow {
		x := float64(i) * hx
		zc := rho * complex(x-real(z0), y-imag(z0))
		if zc == 0 {
			continue // the corner node: Grid sets it from At
		}
		ii := i
		if back {
			ii = nx - i
		}
		l := lrow[ii]
		if conj {
			l = complex(real(l), math.Pi/2-imag(l))
		}
		if alone {
			urow[i] += real(b0)*real(l) - imag(b0)*imag(l)
			if grad {
				r2 := real(zc)*real(zc) + imag(zc)*imag(zc)
				g := b0 * complex(real(zc)/r2, -imag(zc)/r2) * rho
				if uxrow != nil {
					uxrow[i] += real(g)
				}
				if uyrow != nil {
					uyrow[i] -= imag(g)
				}
			}
			continue
		}
		pl := b0 + zc*(b1+zc*(b2+zc*b3))
		urow[i] += real(pl * l)
		if grad {
			// d/dzeta (pl log zeta) = pl' log zeta + pl/zeta, with
			// b0/zeta = b0 conj(zeta)/|zeta|^2
			d := (b1+zc*(2*b2+3*zc*b3))*l + b1 + zc*(b2+zc*b3)
			if b0 != 0 {
				r2 := real(zc)*real(zc) + imag(zc)*imag(zc)
				d += b0 * complex(real(zc)/r2, -imag(zc)/r2)
			}
			g := d * rho
			if uxrow != nil {
				uxrow[i] += real(g)
			}
			if uyrow != nil {
				uyrow[i] -= imag(g)
			}
		}
	}
}

// gridPiecesFast adds the pieces when the only logarithmic pieces are
// angle functions and the corners carry no power above the first: every
// power piece is folded into one polynomial about the centre, expanded per
// row into powers of x, and the four angle functions are summed in one pass
// from the shared table (the gradient, when wanted, by fastGradRow).
func (s *Solution) gridPiecesFast(nx, ny int, u, ux, uy []float64, poly [6]complex128, pz0, prho complex128, corner *[4]cornerSum) {
	m := s.m
	hx, hy := m.W/float64(nx), m.H/float64(ny)
	if prho == 0 {
		pz0, prho = complex(m.W/2, m.H/2), complex(2/math.Max(m.W, m.H), 0)
	}
	var bi [4]float64
	for c := range corner {
		cr := &corner[c]
		if !cr.on {
			continue
		}
		// a0 + a1 rho_c (z - z_c) = a0 + a1 rho_c (z0 - z_c) + a1 rho_c zeta / prho
		poly[0] += cr.a0 + cr.a1*cr.rho*(pz0-cr.z0)
		poly[1] += cr.a1 * cr.rho / prho
		if cr.logs {
			bi[c] = imag(cr.b0)
		}
	}
	fp := &fastPieces{s: s, nx: nx, ny: ny, hx: hx, hy: hy, S: 1 / real(prho), // prho is real for the smooth pieces
		poly: poly, pz0: pz0, prho: prho, corner: corner, bi: bi, u: u, ux: ux, uy: uy}
	// Rows are independent: shared among the workers.
	forRows(ny+1, func(r0, r1, _ int) {
		for j := r0; j < r1; j++ {
			fp.row(j)
		}
	})
}

// fastPieces is gridPiecesFast's summation on the grid.
type fastPieces struct {
	s         *Solution
	nx, ny    int
	hx, hy, S float64
	poly      [6]complex128
	pz0, prho complex128
	corner    *[4]cornerSum
	bi        [4]float64 // the corners' angle functions
	u, ux, uy []float64
}

// row adds row j: the polynomial and the quadratic in u, the corners'
// angle functions from the table of angles, and the gradient
// (fastGradRow).
func (fp *fastPieces) row(j int) {
	s, nx, ny, hx, S, poly, pz0, bi, u := fp.s, fp.nx, fp.ny, fp.hx, fp.S, &fp.poly, fp.pz0, &fp.bi, fp.u
	q, w := s.quad, s.gw
	y := float64(j) * fp.hy
	eta := complex(0, (y-imag(pz0))/S)
	// Re(sum_n c_n (X + i eta)^n) = sum_k X^k Re(sum_n c_n C(n,k) (i eta)^(n-k))
	var co [6]float64
	for k := 0; k <= 5; k++ {
		var acc complex128
		pw := complex(1, 0)
		for n := k; n <= 5; n++ {
			acc += poly[n] * complex(binom6[n][k], 0) * pw
			pw *= eta
		}
		co[k] = real(acc)
	}
	cy := q.C*y*y + q.D*y + q.E
	row := u[j*(nx+1) : (j+1)*(nx+1)]
	for i := range row {
		x := float64(i) * hx
		X := (x - real(pz0)) / S
		row[i] += q.A*x*x + q.B*x + cy + ((((co[5]*X+co[4])*X+co[3])*X+co[2])*X+co[1])*X + co[0]
	}
	if fp.ux != nil || fp.uy != nil {
		s.fastGradRow(j, nx, hx, y, fp.ux, fp.uy, fp.poly, pz0, fp.prho, fp.corner)
	}
	if *bi == [4]float64{} {
		return
	}
	// u -= b0_imag * theta_c for each corner (see cornerSum).
	t0 := w.theta[j*(nx+1) : (j+1)*(nx+1)]
	t3 := w.theta[(ny-j)*(nx+1) : (ny-j+1)*(nx+1)]
	cst := -(bi[1] + bi[3]) * math.Pi / 2
	for i := range row {
		row[i] += cst - bi[0]*t0[i] + bi[1]*t0[nx-i] - bi[2]*t3[nx-i] + bi[3]*t3[i]
	}
}

// fastGradRow adds the gradient of the pieces on row j for gridPiecesFast:
// u_x - i u_y = prho P'(zeta) + quadratic + sum_c rho_c b0 / zeta_c (the
// corners' a0 + a1 zeta are folded into P),
// with b0 / zeta_c = b0 conj(zeta_c) / |zeta_c|^2 (no complex division).
// Corner nodes (zeta_c = 0) are left to Grid, which sets them from At.
func (s *Solution) fastGradRow(j, nx int, hx, y float64, ux, uy []float64, poly [6]complex128, pz0, prho complex128, corner *[4]cornerSum) {
	q := s.quad
	k0 := j * (nx + 1)
	for i := 0; i <= nx; i++ {
		x := float64(i) * hx
		z := prho * complex(x-real(pz0), y-imag(pz0))
		pd := 5 * poly[5]
		for n := 4; n >= 1; n-- {
			pd = pd*z + complex(float64(n), 0)*poly[n]
		}
		g := complex(2*q.A*x+q.B, -(2*q.C*y+q.D)) + pd*prho
		for c := range corner {
			cr := &corner[c]
			if !cr.on {
				continue
			}
			var d complex128 // a0 and a1 are in the polynomial already
			if cr.logs {
				zc := cr.rho * complex(x-real(cr.z0), y-imag(cr.z0))
				r2 := real(zc)*real(zc) + imag(zc)*imag(zc)
				if r2 == 0 {
					continue
				}
				d += cr.b0 * complex(real(zc)/r2, -imag(zc)/r2)
			}
			g += d * cr.rho
		}
		if ux != nil {
			ux[k0+i] += real(g)
		}
		if uy != nil {
			uy[k0+i] -= imag(g)
		}
	}
}

// rowY adds Y_i(t) (coefficient included) to a[i] and sign dY_i/dt to
// b[i] for the first n terms of sp.
func (sp *sub) rowY(t float64, n int, a, b []float64, sign float64) {
	for i := 0; i < n; i++ {
		var y, dy float64
		if sp.zero && i == 0 {
			y, dy = sp.A[0]+sp.B[0]*t, sp.B[0]
		} else {
			lam := sp.b.Lambda[i]
			ea := math.Exp(-lam * t)
			eb := 0.0
			if sp.B[i] != 0 {
				eb = math.Exp(-lam * (2*sp.D - t))
			}
			y = sp.A[i]*ea + sp.B[i]*eb
			dy = lam * (sp.B[i]*eb - sp.A[i]*ea)
		}
		a[i] += y
		b[i] += sign * dy
	}
}

// gridSinePair sums two opposite sub-problems that share the sine basis
// along s (e1 loaded at t = 0 of the row coordinate, e2 at the far side)
// by one DST per row, the rows shared among the workers (grid columns,
// for the left and right pair, by forColumns).
func (s *Solution) gridSinePair(e1, e2 problem.Side, nx, ny int, cut float64, u, ux, uy []float64) {
	m := s.m
	s1, s2 := s.subs[e1], s.subs[e2]
	vert := e1 == problem.Left
	M, rows := nx, ny // nodes along s: M+1; rows across
	D := m.H
	if vert {
		M, rows, D = ny, nx, m.W
	}
	w := s.gw
	if w.tabM != M {
		w.sinTab = grow(w.sinTab, tabTerms*(M+1))
		w.cosTab = grow(w.cosTab, tabTerms*(M+1))
		for i := 0; i <= M; i++ {
			sn, cs := math.Sincos(math.Pi * float64(i) / float64(M))
			s0, c0 := sn, cs
			for n := 0; n < tabTerms; n++ {
				w.sinTab[n*(M+1)+i], w.cosTab[n*(M+1)+i] = sn, cs
				sn, cs = sn*c0+cs*s0, cs*c0-sn*s0
			}
		}
		w.tabM = M
	}
	sp := &sinePass{s: s, s1: s1, s2: s2, M: M, rows: rows, D: D, cut: cut, lam0: math.Pi / s1.L}
	gs, gt := ux, uy // the derivatives along s and across
	if vert {
		gs, gt = uy, ux
	}
	nmax := max(s1.n, s2.n)
	for len(w.sines) < rowWorkers(rows+1) {
		w.sines = append(w.sines, new(sineBuf))
	}
	sines := w.sines
	// Rows are independent: each worker sums its own with its own buffers
	// and transforms, every node getting its additions in the same order.
	each := forRows
	if vert {
		each = forColumns
	}
	each(rows+1, func(r0, r1, worker int) {
		sb := sines[worker]
		sb.a, sb.b = grow(sb.a, nmax), grow(sb.b, nmax)
		sb.fa, sb.fb, sb.fc = grow(sb.fa, M+1), grow(sb.fb, M+1), grow(sb.fc, M+1)
		if !vert {
			for r := r0; r < r1; r++ {
				g := r * (nx + 1)
				sp.row(sb, r, u[g:g+M+1], rowOf(gs, g, M+1), rowOf(gt, g, M+1))
			}
			return
		}
		// A row is a grid column: the chunk's columns are copied out
		// next to each other, summed as rows and copied back, so that
		// the workers do not write the same cache lines term after term.
		nr := r1 - r0
		sb.cu, sb.cs, sb.ct = grow(sb.cu, nr*(M+1)), grow(sb.cs, nr*(M+1)), grow(sb.ct, nr*(M+1))
		cols := [3][2][]float64{{u, sb.cu}, {gs, sb.cs}, {gt, sb.ct}}
		for _, c := range cols {
			if c[0] != nil {
				transpose(c[1], c[0], nx, M, r0, r1, false)
			}
		}
		cs, ct := sb.cs, sb.ct
		if gs == nil {
			cs = nil
		}
		if gt == nil {
			ct = nil
		}
		for r := r0; r < r1; r++ {
			o := (r - r0) * (M + 1)
			sp.row(sb, r, sb.cu[o:o+M+1], rowOf(cs, o, M+1), rowOf(ct, o, M+1))
		}
		for _, c := range cols {
			if c[0] != nil {
				transpose(c[1], c[0], nx, M, r0, r1, true)
			}
		}
	})
}

// sinePass is one sine pair's summation on the grid (gridSinePair): s1
// loaded at row 0, s2 at row rows, D apart, M intervals along each row.
type sinePass struct {
	s            *Solution
	s1, s2       *sub
	M, rows      int
	D, cut, lam0 float64
}

// row adds row r of the pair to du and, when not nil, its derivatives
// along the row and across to ds and dt (M+1 nodes each), with the
// worker's buffers sb: from the tables when the row keeps few terms,
// else by one transform for each.
func (p *sinePass) row(sb *sineBuf, r int, du, ds, dt []float64) {
	s1, s2, M, D, cut, lam0 := p.s1, p.s2, p.M, p.D, p.cut, p.lam0
	t1 := D * float64(r) / float64(p.rows)
	t2 := D * float64(p.rows-r) / float64(p.rows)
	n1, n2 := s1.rowTerms(t1, cut), s2.rowTerms(t2, cut)
	n := max(n1, n2)
	if n == 0 {
		return
	}
	a, b := sb.a[:n], sb.b[:n]
	clear(a)
	clear(b)
	s1.rowY(t1, n1, a, b, 1)
	s2.rowY(t2, n2, a, b, -1)
	if n <= tabTerms {
		p.s.sineRow(sb, M, a, b, lam0, du, ds, dt)
		return
	}
	if sb.dst == nil || sb.dst.Len() != M-1 {
		sb.dst = fourier.NewDST(M - 1)
	}
	if ds != nil && (sb.dct == nil || sb.dct.Len() != M+1) {
		sb.dct = fourier.NewDCT(M + 1)
	}
	sb.addSines(du, a, M)
	if dt != nil {
		sb.addSines(dt, b, M)
	}
	if ds != nil {
		// du/ds: sum_n lambda_n a_n cos(n pi i / M) = DCT-I of the
		// folded coefficients, halved inside
		foldSeries(sb.fb, a, M, lam0, true)
		for k := 1; k < M; k++ {
			sb.fb[k] /= 2
		}
		out := sb.dct.Transform(sb.fc[:M+1], sb.fb[:M+1])
		for i := 0; i <= M; i++ {
			ds[i] += out[i]
		}
	}
}

// addSines adds sum_n c_n sin(n pi i / M) to d at i = 1 to M-1: one
// DST-I of the c_n/2, folded into the transform's terms.
func (sb *sineBuf) addSines(d, c []float64, M int) {
	foldSeries(sb.fa, c, M, 0, false)
	for k := 1; k < M; k++ {
		sb.fa[k-1] = sb.fa[k] / 2
	}
	out := sb.dst.Transform(sb.fc[:M-1], sb.fa[:M-1])
	for i := 1; i < M; i++ {
		d[i] += out[i-1]
	}
}

// foldSeries folds the coefficients src (of terms n = 1, 2, ...) into
// dst (M+1 long) by the period 2M of sin(n pi i / M) (or of the cosine),
// each multiplied by lam n first when lam is not 0.
func foldSeries(dst, src []float64, M int, lam float64, cosine bool) {
	clear(dst)
	for i, v := range src {
		if v == 0 {
			continue
		}
		if lam != 0 {
			v *= lam * float64(i+1)
		}
		nn := (i + 1) % (2 * M)
		switch {
		case cosine && nn > M:
			dst[2*M-nn] += v
		case cosine:
			dst[nn] += v
		case nn == 0 || nn == M:
		case nn < M:
			dst[nn] += v
		default:
			dst[2*M-nn] -= v
		}
	}
}

// rowOf returns n values of g from o on, or nil when g is nil.
func rowOf(g []float64, o, n int) []float64 {
	if g == nil {
		return nil
	}
	return g[o : o+n]
}

// transpose copies grid columns r0 to r1-1 (M+1 nodes each, grid rows
// nx+1 long) of g to the rows of c, one after another; back copies them
// from c to g instead.
func transpose(c, g []float64, nx, M, r0, r1 int, back bool) {
	nr := r1 - r0
	for i := 0; i <= M; i++ {
		gi := g[i*(nx+1)+r0 : i*(nx+1)+r1]
		for j := 0; j < nr; j++ {
			if back {
				gi[j] = c[j*(M+1)+i]
			} else {
				c[j*(M+1)+i] = gi[j]
			}
		}
	}
}

// tabTerms is the number of terms below which a row is summed from a
// table of sines instead of by a transform.
const tabTerms = 24

// sineRow adds sum_n a_n sin(n pi i/M) (and the derivatives) for one row
// of a sine pair from the tables.
func (s *Solution) sineRow(sb *sineBuf, M int, a, b []float64, lam0 float64, du, ds, dt []float64) {
	w := s.gw
	sb.col = grow(sb.col, M+1)
	col := sb.col
	clear(col)
	for k := range a {
		ak := a[k]
		sn := w.sinTab[k*(M+1) : (k+1)*(M+1)]
		for i, v := range sn {
			col[i] += ak * v
		}
	}
	du = du[:M+1]
	for i, v := range col {
		du[i] += v
	}
	for k := range a {
		ak, bk := a[k], b[k]
		sn := w.sinTab[k*(M+1) : (k+1)*(M+1)]
		if dt != nil {
			dt = dt[:M+1]
			for i, v := range sn {
				dt[i] += bk * v
			}
		}
		if ds != nil {
			ds = ds[:M+1]
			al := ak * lam0 * float64(k+1)
			for i, v := range w.cosTab[k*(M+1) : (k+1)*(M+1)] {
				ds[i] += al * v
			}
		}
	}
}

// maxTab caps the terms tabulated on the nodes by the separable path
// (and tabEntries the size of each table: 4 MB).
var maxTab = 1024 // a variable so tests can exercise the rotation path

const tabEntries = 1 << 19

// gidx returns the node index of s-node i in row r.
func gidx(vert bool, nx, i, r int) int {
	if vert {
		return i*(nx+1) + r
	}
	return r*(nx+1) + i
}

// rowBuf is one worker's buffers for gridSubs.
type rowBuf struct {
	a, b, al   []float64 // Y_k, dY_k/dt and lambda_k Y_k of a row
	cu, cs, ct []float64 // a chunk's rows of sums: u, du/ds, du/dt
}

// gridSubs adds two opposite sub-problems (near loaded at row 0: bottom
// or left; far at the last row: top or right; either may be nil) as
// separable products, row by row. They share their basis (the same
// neighbours, in the same order along s), so a row's factors are summed
// first,
//
//	Y_k = Y_k^near(t) + Y_k^far(D - t),
//
// and the row is one product with the tables X_k(s_i) = sin(lambda_k s_i
// + phi_k) and C_k(s_i) (its cosine partner) on the nodes:
//
//	u = sum_k Y_k X_k,  du/ds = sum_k lambda_k Y_k C_k,  du/dt = sum_k Y_k' X_k,
//
// summed four terms at a time (sumTerms4), over the terms each keeps in
// that row (rowTerms); terms beyond the tables by rotation. Rows are
// shared among the processors (gridRows).
func (s *Solution) gridSubs(near, far *sub, nx, ny int, cut float64, u, ux, uy []float64) {
	if near != nil && far != nil && !sameBasis(near, far) {
		s.gridSubs(near, nil, nx, ny, cut, u, ux, uy)
		s.gridSubs(nil, far, nx, ny, cut, u, ux, uy)
		return
	}
	sp := near // the basis and the tables
	if sp == nil || (far != nil && far.n > sp.n) {
		sp = far
	}
	vert := sp.side == problem.Left || sp.side == problem.Right
	M, rows := nx, ny
	if vert {
		M, rows = ny, nx
	}
	hs := sp.L / float64(M)
	w := s.gw
	// Tables of X_k and cos(lambda_k s + phi_k) on the nodes for the first
	// terms (every row uses them); later terms by rotation.
	nt := min(sp.n, maxTab, tabEntries/(M+1))
	w.xtab, w.ctab = grow(w.xtab, nt*(M+1)), grow(w.ctab, nt*(M+1))
	rotationTables(w.xtab, w.ctab, sp.b.Lambda[:nt], sp.b.Phi[:nt], hs, M)
	p := &subsPass{near: near, far: far, sp: sp, M: M, rows: rows, nx: nx, nt: nt,
		hs: hs, cut: cut, vert: vert, grad: ux != nil || uy != nil,
		xtab: w.xtab, ctab: w.ctab, u: u, ux: ux, uy: uy}
	// (du/ds, du/dt) to (ux, uy) in the near side's frame (sub.global):
	// the far side's t runs the other way, hence its sign -1 in rowY
	p.sx, p.tx, p.sy, p.ty = 1, 0, 0, 1
	if vert {
		p.sx, p.tx, p.sy, p.ty = 0, 1, 1, 0
	}
	s.gridRows(rows+1, p.chunk)
}

// rotationTables fills xt and ct, M+1 values per term, with
// sin(lambda_k s_i + phi_k) and its cosine at s_i = i hs, by rotation.
// It is a function of its own, not inlined, to keep its loop out of a
// large function (see the package doc of edgewise/solver, Loops in
// functions of their own).
//
//go:noinline
func rotationTables(xt, ct, lambda, phi []float64, hs float64, M int) {
	for k := range phi {
		sn, cn := math.Sincos(phi[k])
		ds, dc := math.Sincos(lambda[k] * hs)
		xs, cs := xt[k*(M+1):(k+1)*(M+1)], ct[k*(M+1):(k+1)*(M+1)]
		for i := range xs {
			xs[i], cs[i] = sn, cn
			sn, cn = sn*dc+cn*ds, cn*dc-sn*ds
		}
	}
}

// subsPass is one pair's summation on the grid (gridSubs): near and far
// (either may be nil) in the basis of sp, M intervals along each of the
// rows+1 rows, the first nt terms from the tables xtab and ctab, and
// (du/ds, du/dt) to (ux, uy) by (sx, tx) and (sy, ty).
type subsPass struct {
	near, far, sp   *sub
	M, rows, nx, nt int
	hs, cut         float64
	vert, grad      bool
	xtab, ctab      []float64
	u, ux, uy       []float64
	sx, tx, sy, ty  float64
}

// chunk sums rows r0 to r1-1 into buf and adds them to the grid.
func (p *subsPass) chunk(r0, r1 int, buf *rowBuf) {
	M := p.M
	buf.cu = grow(buf.cu, gridChunk*(M+1))
	if p.grad {
		buf.cs, buf.ct = grow(buf.cs, gridChunk*(M+1)), grow(buf.ct, gridChunk*(M+1))
	}
	nmax := 0 // the most terms a row can keep
	if p.near != nil {
		nmax = p.near.n
	}
	if p.far != nil {
		nmax = max(nmax, p.far.n)
	}
	buf.a, buf.b, buf.al = grow(buf.a, nmax), grow(buf.b, nmax), grow(buf.al, nmax)
	for r := r0; r < r1; r++ {
		p.row(r, (r-r0)*(M+1), buf)
	}
	if !p.vert {
		p.addRows(r0, r1, buf)
		return
	}
	p.addColumns(r0, r1, buf)
}

// row sums row r into buf's sums from o on.
func (p *subsPass) row(r, o int, buf *rowBuf) {
	M, rows, near, far, sp := p.M, p.rows, p.near, p.far, p.sp
	cu := buf.cu[o : o+M+1]
	clear(cu)
	var cs, ct []float64
	if p.grad {
		cs, ct = buf.cs[o:o+M+1], buf.ct[o:o+M+1]
		clear(cs)
		clear(ct)
	}
	t1, t2 := sp.D*float64(r)/float64(rows), sp.D*float64(rows-r)/float64(rows)
	n1, n2 := 0, 0
	if near != nil {
		n1 = near.rowTerms(t1, p.cut)
	}
	if far != nil {
		n2 = far.rowTerms(t2, p.cut)
	}
	n := max(n1, n2)
	if n == 0 {
		return
	}
	a, b, al := buf.a[:n], buf.b[:n], buf.al[:n]
	clear(a)
	clear(b)
	if near != nil {
		near.rowY(t1, n1, a, b, 1)
	}
	if far != nil {
		far.rowY(t2, n2, a, b, -1)
	}
	mulTerms(al, a, sp.b.Lambda)
	sumRow(sp, p.hs, p.xtab, p.ctab, p.nt, a, b, al, cu, cs, ct)
}

// mulTerms sets d_k = a_k l_k for k < len(d). It is a function of its
// own, not inlined, to keep its loop out of a large function (see the
// package doc of edgewise/solver, Loops in functions of their own).
//
//go:noinline
func mulTerms(d, a, l []float64) {
	for k := range d {
		d[k] = a[k] * l[k]
	}
}

// addRows adds the sums of rows r0 to r1-1 to the grid rows.
// Not inlined: see the package doc of edgewise/solver, Loops in
// functions of their own.
//
//go:noinline
func (p *subsPass) addRows(r0, r1 int, buf *rowBuf) {
	M, nx, u, ux, uy := p.M, p.nx, p.u, p.ux, p.uy
	for r := r0; r < r1; r++ {
		o, g := (r-r0)*(M+1), r*(nx+1)
		addRow(u[g:g+M+1], buf.cu[o:o+M+1])
		if ux != nil {
			addRow2(ux[g:g+M+1], buf.cs[o:o+M+1], buf.ct[o:o+M+1], p.sx, p.tx)
		}
		if uy != nil {
			addRow2(uy[g:g+M+1], buf.cs[o:o+M+1], buf.ct[o:o+M+1], p.sy, p.ty)
		}
	}
}

// addColumns adds the sums of rows r0 to r1-1 to the grid columns: a
// column of the grid per row, the chunk's rows next to each other in
// every grid row. It is a function of its own, not inlined, to keep its
// loop out of a large function (see the package doc of edgewise/solver,
// Loops in functions of their own).
//
//go:noinline
func (p *subsPass) addColumns(r0, r1 int, buf *rowBuf) {
	M, nx, u, ux, uy := p.M, p.nx, p.u, p.ux, p.uy
	sx, tx, sy, ty := p.sx, p.tx, p.sy, p.ty
	nr := r1 - r0
	for i := 0; i <= M; i++ {
		g := i*(nx+1) + r0
		for j := 0; j < nr; j++ {
			o := j*(M+1) + i
			u[g+j] += buf.cu[o]
			if ux != nil {
				ux[g+j] += sx*buf.cs[o] + tx*buf.ct[o]
			}
			if uy != nil {
				uy[g+j] += sy*buf.cs[o] + ty*buf.ct[o]
			}
		}
	}
}

// sameBasis reports whether two opposite sub-problems have the same
// basis, term for term (the same neighbours give the same eigenvalues;
// checked, not assumed).
func sameBasis(a, b *sub) bool {
	if a.L != b.L || a.zero != b.zero {
		return false
	}
	n := min(a.n, b.n)
	for k := 0; k < n; k++ {
		if a.b.Lambda[k] != b.b.Lambda[k] || a.b.Phi[k] != b.b.Phi[k] {
			return false
		}
	}
	return true
}

// sumRow adds to cu (and du/ds, du/dt to cs, ct when not nil) the row
// sum_k a_k X_k (sum_k al_k C_k, sum_k b_k X_k) over k < len(a): the
// terms below nt from the tables xtab and ctab (nt rows of len(cu)), the
// rest by rotation in sp's basis, hs apart.
func sumRow(sp *sub, hs float64, xtab, ctab []float64, nt int, a, b, al, cu, cs, ct []float64) {
	n := len(a)
	M := len(cu) - 1
	grad := cs != nil
	m := min(n, nt)
	k := 0
	for ; k+4 <= m; k += 4 {
		x := xtab[k*(M+1) : (k+4)*(M+1)]
		if grad {
			c := ctab[k*(M+1) : (k+4)*(M+1)]
			sumTerms4Grad(cu, cs, ct, x, c, a[k:k+4], al[k:k+4], b[k:k+4])
		} else {
			sumTerms4(cu, x, a[k:k+4])
		}
	}
	for ; k < m; k++ {
		xs := xtab[k*(M+1) : (k+1)*(M+1)]
		addScaled(cu, xs, a[k])
		if grad {
			addScaled(cs, ctab[k*(M+1):(k+1)*(M+1)], al[k])
			addScaled(ct, xs, b[k])
		}
	}
	for ; k < n; k++ {
		sn, cn := math.Sincos(sp.b.Phi[k])
		ds, dc := math.Sincos(sp.b.Lambda[k] * hs)
		if !grad {
			addRotated(cu, a[k], sn, cn, ds, dc)
			continue
		}
		addRotatedGrad(cu, cs, ct, a[k], al[k], b[k], sn, cn, ds, dc)
	}
}

// addScaled adds c x_i to d_i for i < len(x). It is a function of its
// own, not inlined, to keep its loop out of a large function (see the
// package doc of edgewise/solver, Loops in functions of their own).
//
//go:noinline
func addScaled(d, x []float64, c float64) {
	for i, v := range x {
		d[i] += c * v
	}
}

// addRotated adds a sin(theta + i delta) to cu_i, from (sn, cn) =
// (sin, cos) theta and (ds, dc) = (sin, cos) delta by rotation.
// Not inlined: see the package doc of edgewise/solver, Loops in
// functions of their own.
//
//go:noinline
func addRotated(cu []float64, a, sn, cn, ds, dc float64) {
	for i := range cu {
		cu[i] += a * sn
		sn, cn = sn*dc+cn*ds, cn*dc-sn*ds
	}
}

// addRotatedGrad is addRotated adding al cos(theta + i delta) to cs and
// b sin(theta + i delta) to ct as well.
// Not inlined: see the package doc of edgewise/solver, Loops in
// functions of their own.
//
//go:noinline
func addRotatedGrad(cu, cs, ct []float64, a, al, b, sn, cn, ds, dc float64) {
	for i := range cu {
		cu[i] += a * sn
		cs[i] += al * cn
		ct[i] += b * sn
		sn, cn = sn*dc+cn*ds, cn*dc-sn*ds
	}
}

// sumTerms4 adds sum_{k<4} a_k x_k to cu, x holding the four rows x_k of
// length len(cu) one after another.
func sumTerms4(cu, x, a []float64) {
	n := len(cu)
	x0, x1, x2, x3 := x[:n], x[n:2*n], x[2*n:3*n], x[3*n:4*n]
	a0, a1, a2, a3 := a[0], a[1], a[2], a[3]
	for i := range cu {
		cu[i] += a0*x0[i] + a1*x1[i] + a2*x2[i] + a3*x3[i]
	}
}

// sumTerms4Grad is sumTerms4 for u, du/ds (al with the cosine rows c) and
// du/dt (b with x) at once.
func sumTerms4Grad(cu, cs, ct, x, c, a, al, b []float64) {
	n := len(cu)
	cs, ct = cs[:n], ct[:n]
	x0, x1, x2, x3 := x[:n], x[n:2*n], x[2*n:3*n], x[3*n:4*n]
	c0, c1, c2, c3 := c[:n], c[n:2*n], c[2*n:3*n], c[3*n:4*n]
	a0, a1, a2, a3 := a[0], a[1], a[2], a[3]
	l0, l1, l2, l3 := al[0], al[1], al[2], al[3]
	b0, b1, b2, b3 := b[0], b[1], b[2], b[3]
	for i := range cu {
		v0, v1, v2, v3 := x0[i], x1[i], x2[i], x3[i]
		cu[i] += a0*v0 + a1*v1 + a2*v2 + a3*v3
		ct[i] += b0*v0 + b1*v1 + b2*v2 + b3*v3
		cs[i] += l0*c0[i] + l1*c1[i] + l2*c2[i] + l3*c3[i]
	}
}

// addRow adds src to dst. It is a function of its own, not inlined, to
// keep its loop out of a larger function (see the package doc of
// edgewise/solver, Loops in functions of their own).
//
//go:noinline
func addRow(dst, src []float64) {
	src = src[:len(dst)]
	for i := range dst {
		dst[i] += src[i]
	}
}

// addRow2 adds p a + q b to dst.
// Not inlined: see the package doc of edgewise/solver, Loops in
// functions of their own.
//
//go:noinline
func addRow2(dst, a, b []float64, p, q float64) {
	a, b = a[:len(dst)], b[:len(dst)]
	for i := range dst {
		dst[i] += p*a[i] + q*b[i]
	}
}
