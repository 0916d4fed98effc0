package series

import (
	"math"
	"math/cmplx"

	"gonum.org/v1/gonum/dsp/fourier"

	"edgewise/solver/problem"
)

// The grid summation as it was before the blocked kernels (kept verbatim
// as the reference the fast grid is compared with, gridref_test.go's
// TestGridMatchesReference): the same series, summed term by term and node
// by node.

var refWork refGridWork

// refGridWork is gridWork with the single set of row buffers the
// reference used.
type refGridWork struct {
	gridWork
	col        []float64
	a, b       []float64
	fa, fb, fc []float64
	dst        *fourier.DST
	dct        *fourier.DCT
}

const refMaxTab = 512

func (s *Solution) refGrid(nx, ny int, u, ux, uy []float64) {
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
	s.refGridPieces(nx, ny, u, ux, uy)
	// Each row drops the terms whose sum is below cut (a bound: |X_n| <= 1,
	// |A e^-lambda t| + |B e^-lambda (2D - t)| <= (|A| + |B|) e^-lambda t).
	// The four sub-problems may so drop up to 4 cut: a tenth of the error
	// estimate, so that what the grid shows stays within it like a probe
	// (with 0.1 Tol, as before, the grid's error was 5 to 10 times the
	// probes' and up to the whole estimate).
	cut := 0.025 * s.est
	done := [4]bool{}
	if nx >= 2 && s.subs[problem.Bottom].sine {
		s.refGridSinePair(problem.Bottom, problem.Top, nx, ny, cut, u, ux, uy)
		done[problem.Bottom], done[problem.Top] = true, true
	}
	if ny >= 2 && s.subs[problem.Left].sine {
		s.refGridSinePair(problem.Left, problem.Right, nx, ny, cut, u, ux, uy)
		done[problem.Left], done[problem.Right] = true, true
	}
	for _, e := range problem.Sides {
		if !done[e] {
			s.refGridSub(s.subs[e], nx, ny, cut, u, ux, uy)
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

func (s *Solution) refGridPieces(nx, ny int, u, ux, uy []float64) {
	m := s.m
	hx, hy := m.W/float64(nx), m.H/float64(ny)
	grad := ux != nil || uy != nil
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
	w := &refWork
	nn := (nx + 1) * (ny + 1)
	if needLogs && fullLogs {
		if cap(w.logs) < nn {
			w.logs = make([]complex128, nn)
		}
		w.logs = w.logs[:nn]
		for j := 0; j <= ny; j++ {
			y := float64(j) * hy
			row := w.logs[j*(nx+1) : (j+1)*(nx+1)]
			for i := range row {
				x := float64(i) * hx
				if i == 0 && j == 0 {
					row[i] = 0
					continue
				}
				row[i] = complex(0.5*math.Log(x*x+y*y), atanPos(y, x))
			}
		}
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
		s.refGridPiecesFast(nx, ny, u, ux, uy, poly, pz0, prho, &corner)
		return
	}
	q := s.quad
	for j := 0; j <= ny; j++ {
		y := float64(j) * hy
		for i := 0; i <= nx; i++ {
			x := float64(i) * hx
			k := j*(nx+1) + i
			v := q.A*x*x + q.B*x + q.C*y*y + q.D*y + q.E
			z := prho * complex(x-real(pz0), y-imag(pz0))
			pv := poly[5]
			pd := complex(0, 0)
			for n := 4; n >= 0; n-- {
				if grad {
					pd = pd*z + pv
				}
				pv = pv*z + poly[n]
			}
			u[k] += v + real(pv)
			if grad {
				g := complex(2*q.A*x+q.B, -(2*q.C*y+q.D)) + pd*prho // u_x - i u_y
				if ux != nil {
					ux[k] += real(g)
				}
				if uy != nil {
					uy[k] -= imag(g)
				}
			}
		}
	}
	for c := range corner {
		cr := &corner[c]
		if !cr.on {
			continue
		}
		for j := 0; j <= ny; j++ {
			y := float64(j) * hy
			for i := 0; i <= nx; i++ {
				x := float64(i) * hx
				k := j*(nx+1) + i
				zc := cr.rho * complex(x-real(cr.z0), y-imag(cr.z0))
				f := cr.a0 + zc*(cr.a1+zc*(cr.a2+zc*cr.a3))
				d := cr.a1 + zc*(2*cr.a2+3*zc*cr.a3)
				if cr.logs && zc != 0 {
					var l complex128
					switch c {
					case 0:
						l = w.logs[k]
					case 1:
						l = 1i*math.Pi/2 + cmplx.Conj(w.logs[j*(nx+1)+nx-i])
					case 2:
						l = w.logs[(ny-j)*(nx+1)+nx-i]
					case 3:
						l = 1i*math.Pi/2 + cmplx.Conj(w.logs[(ny-j)*(nx+1)+i])
					}
					pl := cr.b0 + zc*(cr.b1+zc*(cr.b2+zc*cr.b3))
					f += pl * l
					if grad {
						// pl/zc without a complex division unless b0 != 0
						d += (cr.b1+zc*(2*cr.b2+3*zc*cr.b3))*l + cr.b1 + zc*(cr.b2+zc*cr.b3)
						if cr.b0 != 0 {
							d += cr.b0 / zc
						}
					}
				}
				u[k] += real(f)
				if grad {
					g := d * cr.rho
					if ux != nil {
						ux[k] += real(g)
					}
					if uy != nil {
						uy[k] -= imag(g)
					}
				}
			}
		}
	}
}

func (s *Solution) refGridPiecesFast(nx, ny int, u, ux, uy []float64, poly [6]complex128, pz0, prho complex128, corner *[4]cornerSum) {
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
	binom := [6][6]float64{{1}, {1, 1}, {1, 2, 1}, {1, 3, 3, 1}, {1, 4, 6, 4, 1}, {1, 5, 10, 10, 5, 1}}
	q := s.quad
	w := &refWork
	S := 1 / real(prho) // prho is real for the smooth pieces
	for j := 0; j <= ny; j++ {
		y := float64(j) * hy
		eta := complex(0, (y-imag(pz0))/S)
		// Re(sum_n c_n (X + i eta)^n) = sum_k X^k Re(sum_n c_n C(n,k) (i eta)^(n-k))
		var co [6]float64
		for k := 0; k <= 5; k++ {
			var acc complex128
			pw := complex(1, 0)
			for n := k; n <= 5; n++ {
				acc += poly[n] * complex(binom[n][k], 0) * pw
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
		if ux != nil || uy != nil {
			s.refFastGradRow(j, nx, hx, y, ux, uy, poly, pz0, prho, corner)
		}
		if bi == [4]float64{} {
			continue
		}
		// u -= b0_imag * theta_c for each corner (see cornerSum).
		t0 := w.theta[j*(nx+1) : (j+1)*(nx+1)]
		t3 := w.theta[(ny-j)*(nx+1) : (ny-j+1)*(nx+1)]
		cst := -(bi[1] + bi[3]) * math.Pi / 2
		for i := range row {
			row[i] += cst - bi[0]*t0[i] + bi[1]*t0[nx-i] - bi[2]*t3[nx-i] + bi[3]*t3[i]
		}
	}
}

func (s *Solution) refFastGradRow(j, nx int, hx, y float64, ux, uy []float64, poly [6]complex128, pz0, prho complex128, corner *[4]cornerSum) {
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

func (sp *sub) refRowY(t float64, n int, a, b []float64, add bool, sign float64) {
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
		if add {
			a[i] += y
			b[i] += sign * dy
		} else {
			a[i], b[i] = y, sign*dy
		}
	}
}

func (s *Solution) refGridSinePair(e1, e2 problem.Side, nx, ny int, cut float64, u, ux, uy []float64) {
	m := s.m
	s1, s2 := s.subs[e1], s.subs[e2]
	vert := e1 == problem.Left
	M, rows := nx, ny // nodes along s: M+1; rows across
	D := m.H
	if vert {
		M, rows, D = ny, nx, m.W
	}
	w := &refWork
	nmax := max(s1.n, s2.n)
	w.a, w.b = grow(w.a, nmax), grow(w.b, nmax)
	w.fa, w.fb, w.fc = grow(w.fa, M+1), grow(w.fb, M+1), grow(w.fc, M+1)
	if w.dst == nil || w.dst.Len() != M-1 {
		w.dst = fourier.NewDST(M - 1)
	}
	if (vert && uy != nil) || (!vert && ux != nil) {
		if w.dct == nil || w.dct.Len() != M+1 {
			w.dct = fourier.NewDCT(M + 1)
		}
	}
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
	needS := (vert && uy != nil) || (!vert && ux != nil)
	needT := (vert && ux != nil) || (!vert && uy != nil)
	lam0 := math.Pi / s1.L
	for r := 0; r <= rows; r++ {
		t1 := D * float64(r) / float64(rows)
		t2 := D * float64(rows-r) / float64(rows)
		n1, n2 := s1.rowTerms(t1, cut), s2.rowTerms(t2, cut)
		n := max(n1, n2)
		if n == 0 {
			continue
		}
		a, b := w.a[:n], w.b[:n]
		clear(a)
		clear(b)
		s1.refRowY(t1, n1, a, b, true, 1)
		s2.refRowY(t2, n2, a, b, true, -1)
		if n <= tabTerms {
			s.refSineRow(vert, nx, M, r, a, b, lam0, u, ux, uy)
			continue
		}
		fold := func(dst []float64, src []float64, scale func(i int) float64, cosine bool) {
			clear(dst)
			for i, v := range src {
				if v == 0 {
					continue
				}
				if scale != nil {
					v *= scale(i)
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
		// u: sum_n a_n sin(n pi i / M) = DST-I of a_n/2.
		fold(w.fa, a, nil, false)
		for k := 1; k < M; k++ {
			w.fa[k-1] = w.fa[k] / 2
		}
		out := w.dst.Transform(w.fc[:M-1], w.fa[:M-1])
		for i := 1; i < M; i++ {
			u[gidx(vert, nx, i, r)] += out[i-1]
		}
		if needT {
			fold(w.fa, b, nil, false)
			for k := 1; k < M; k++ {
				w.fa[k-1] = w.fa[k] / 2
			}
			out := w.dst.Transform(w.fc[:M-1], w.fa[:M-1])
			g := ux
			if !vert {
				g = uy
			}
			for i := 1; i < M; i++ {
				g[gidx(vert, nx, i, r)] += out[i-1]
			}
		}
		if needS {
			fold(w.fb, a, func(i int) float64 { return lam0 * float64(i+1) }, true)
			for k := 1; k < M; k++ {
				w.fb[k] /= 2
			}
			out := w.dct.Transform(w.fc[:M+1], w.fb[:M+1])
			g := uy
			if !vert {
				g = ux
			}
			for i := 0; i <= M; i++ {
				g[gidx(vert, nx, i, r)] += out[i]
			}
		}
	}
}

func (s *Solution) refSineRow(vert bool, nx, M, r int, a, b []float64, lam0 float64, u, ux, uy []float64) {
	w := &refWork
	gs, gt := ux, uy // derivative along s, across (t)
	if vert {
		gs, gt = uy, ux
	}
	w.col = grow(w.col, M+1)
	col := w.col
	clear(col)
	for k := range a {
		ak := a[k]
		sn := w.sinTab[k*(M+1) : (k+1)*(M+1)]
		for i, v := range sn {
			col[i] += ak * v
		}
	}
	if vert {
		for i, v := range col {
			u[i*(nx+1)+r] += v
		}
	} else {
		row := u[r*(nx+1) : r*(nx+1)+M+1]
		for i, v := range col {
			row[i] += v
		}
	}
	for k := range a {
		ak, bk := a[k], b[k]
		sn := w.sinTab[k*(M+1) : (k+1)*(M+1)]
		if gt != nil {
			for i, v := range sn {
				gt[gidx(vert, nx, i, r)] += bk * v
			}
		}
		if gs != nil {
			al := ak * lam0 * float64(k+1)
			for i, v := range w.cosTab[k*(M+1) : (k+1)*(M+1)] {
				gs[gidx(vert, nx, i, r)] += al * v
			}
		}
	}
}

func (s *Solution) refGridSub(sp *sub, nx, ny int, cut float64, u, ux, uy []float64) {
	vert := sp.side == problem.Left || sp.side == problem.Right
	far := sp.side == problem.Top || sp.side == problem.Right
	M, rows := nx, ny
	if vert {
		M, rows = ny, nx
	}
	hs := sp.L / float64(M)
	w := &refWork
	w.a, w.b = grow(w.a, sp.n), grow(w.b, sp.n)
	grad := ux != nil || uy != nil
	// Tables of X_k and cos(lambda_k s + phi_k) on the nodes for the first
	// terms (every row uses them); later terms by rotation.
	nt := min(sp.n, refMaxTab)
	w.xtab, w.ctab = grow(w.xtab, nt*(M+1)), grow(w.ctab, nt*(M+1))
	for k := 0; k < nt; k++ {
		sn, cn := math.Sincos(sp.b.Phi[k])
		ds, dc := math.Sincos(sp.b.Lambda[k] * hs)
		xs, cs := w.xtab[k*(M+1):(k+1)*(M+1)], w.ctab[k*(M+1):(k+1)*(M+1)]
		for i := range xs {
			xs[i], cs[i] = sn, cn
			sn, cn = sn*dc+cn*ds, cn*dc-sn*ds
		}
	}
	w.col = grow(w.col, 3*(M+1))
	cu, cs, ct := w.col[:M+1], w.col[M+1:2*(M+1)], w.col[2*(M+1):]
	for r := 0; r <= rows; r++ {
		rr := r
		if far {
			rr = rows - r
		}
		t := sp.D * float64(rr) / float64(rows)
		n := sp.rowTerms(t, cut)
		if n == 0 {
			continue
		}
		a, b := w.a[:n], w.b[:n]
		sp.refRowY(t, n, a, b, false, 1)
		clear(cu)
		if grad {
			clear(cs)
			clear(ct)
		}
		for k := 0; k < n; k++ {
			lam := sp.b.Lambda[k]
			ak, al, bk := a[k], a[k]*lam, b[k]
			if k < nt {
				xs := w.xtab[k*(M+1) : (k+1)*(M+1)]
				for i, v := range xs {
					cu[i] += ak * v
				}
				if grad {
					for i, v := range w.ctab[k*(M+1) : (k+1)*(M+1)] {
						cs[i] += al * v
					}
					for i, v := range xs {
						ct[i] += bk * v
					}
				}
				continue
			}
			sn, cn := math.Sincos(sp.b.Phi[k])
			ds, dc := math.Sincos(lam * hs)
			if !grad {
				for i := range cu {
					cu[i] += ak * sn
					sn, cn = sn*dc+cn*ds, cn*dc-sn*ds
				}
				continue
			}
			for i := range cu {
				cu[i] += ak * sn
				cs[i] += al * cn
				ct[i] += bk * sn
				sn, cn = sn*dc+cn*ds, cn*dc-sn*ds
			}
		}
		for i := range cu {
			g := gidx(vert, nx, i, r)
			u[g] += cu[i]
			if grad {
				gx, gy := sp.global(cs[i], ct[i])
				if ux != nil {
					ux[g] += gx
				}
				if uy != nil {
					uy[g] += gy
				}
			}
		}
	}
}

// refFieldGrid is Field.Grid as it was, for every kind of field.
func refFieldGrid(f Field, nx, ny int, u, ux, uy []float64) {
	switch f := f.(type) {
	case *Solution:
		f.refGrid(nx, ny, u, ux, uy)
	case *weakField:
		refFieldGrid(f.v, nx, ny, u, ux, uy)
		for i := range u[:(nx+1)*(ny+1)] {
			u[i] += f.c
		}
	case *breakField:
		refFieldGrid(f.v, nx, ny, u, ux, uy)
		w, h := f.phis[0].w, f.phis[0].h
		for j := 0; j <= ny; j++ {
			for i := 0; i <= nx; i++ {
				k := j*(nx+1) + i
				x, y := float64(i)*w/float64(nx), float64(j)*h/float64(ny)
				u[k] += f.shift
				for a := range f.phis {
					p, px, py := f.phis[a].at(x, y)
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
	case *mixedField:
		refFieldGrid(f.inner, nx, ny, u, ux, uy)
		if f.ms == nil {
			return
		}
		for j := 0; j <= ny; j++ {
			y := float64(j) * f.pr.H / float64(ny)
			for i := 0; i <= nx; i++ {
				x := float64(i) * f.pr.W / float64(nx)
				k := j*(nx+1) + i
				fu, fx, fy := f.ms.famSum(f.x, x, y)
				u[k] += fu
				if ux != nil {
					ux[k] += fx
				}
				if uy != nil {
					uy[k] += fy
				}
			}
		}
	default:
		panic("series: refFieldGrid: unknown field")
	}
}
