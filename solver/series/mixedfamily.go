package series

import (
	"math"
	"math/cmplx"

	"edgewise/solver/problem"
)

// frame is an edge's local coordinates, in the mapped (isotropic)
// coordinates y' = y sqrt(Kx/Ky): t along the edge from its start (s = 0),
// d into the region; both affine in (x, y).
type frame struct {
	d0, dx, dy float64
	t0, tx, ty float64
}

func newFrame(pr *problem.Problem, side problem.Side) frame {
	c := math.Sqrt(pr.Kx / pr.Ky)
	switch side {
	case problem.Bottom: // d = c y, t = x
		return frame{dy: c, tx: 1}
	case problem.Top: // d = c (H - y), t = x
		return frame{d0: c * pr.H, dy: -c, tx: 1}
	case problem.Left: // d = x, t = c y
		return frame{dx: 1, ty: c}
	}
	return frame{d0: pr.W, dx: -1, ty: c} // right: d = W - x, t = c y
}

func (f *frame) at(x, y float64) (t, d float64) {
	d = f.d0 + f.dx*x + f.dy*y
	if d <= 0 {
		d = 0 // on the edge, and never beyond it by rounding: +0 keeps the branch
	}
	return f.t0 + f.tx*x + f.ty*y, d
}

// family is the singular family of one mixed edge: with zeta the
// normalised local coordinate (t - centre)/half + i d/half and z_i the
// places where a value part meets a flux or convection part, per meeting
// the Motz-type functions
//
//	G_ij(zeta) = c_i (zeta - z_i)^(j + 1/2),  j = 0 .. per-1,   F_ij = Re G_ij,
//
// with c_i = 1 where the value part lies before z_i and -i where it lies
// after (the branch cut of the square root runs along the edge before
// z_i, outside the region). F_ij is zero along the whole line of the edge
// on the value side of z_i and has no normal derivative on its other
// side, and carries the r^(j + 1/2) behaviour of the meeting. The F_ij
// are harmonic in the mapped coordinates (so they solve the orthotropic
// equation); where they do not meet the edge's conditions (beyond the
// other meetings) and on the other edges they are smooth, and go into
// the inner problem's data.
//
// At a step inside a run of flux and convection parts (of the kind, of h,
// of the flux or the ambient) the entering flux steps and the trace goes
// like t ln|t|: there the members are
//
//	G_ij = (zeta - z_i)^(j + 1) log(zeta - z_i),
//
// whose normal derivative steps at z_i (j = 0) or has a kink of order j.
//
// Where a run of flux and convection parts reaches a corner whose other
// edge holds a value, the entering flux there tends to a number that is
// not zero in general (h (ambient - value), or the flux data), and the
// field goes like r ln r along the edge: the corner (z = -1 at the edge's
// start, +1 at its end) has the members
//
//	G_j = w^(2j+1) (log w - i pi/2),   F_j = Re G_j,
//
// with w = zeta - z at the start and w = -conj(zeta - z) at the end (the
// region then lies in Re w >= 0, Im w >= 0). Each F_j is zero along the
// whole line of the other edge (w = i r: (i r)^(2j+1) ln r is imaginary),
// its trace along the edge is r^(2j+1) ln r, and its normal derivative
// there is smooth (pi/2 (2j+1) r^(2j) / half): F_0 carries the corner's
// r ln r, and the fit's polynomials what is left, which is smoother.
type family struct {
	fr           frame
	centre, half float64
	z            []complex128
	c            []complex128
	logs         []bool // meeting i is a step inside a span: logarithmic members
	corner       []int8 // -1, +1: z_i is the edge's start or end corner (corner members); 0 a meeting
	per          int    // members per meeting
	n            int
	kappa, ts    float64 // entering flux = -kappa dF/dd; t per unit s
}

// eval writes F_k and its derivatives along t and d (nil: values only)
// for k < len(f), at local (t, d). At a meeting itself the derivatives of
// its first member are NaN.
func (fm *family) eval(t, d float64, f, ft, fd []float64) {
	zeta := complex((t-fm.centre)/fm.half, d/fm.half)
	for i, z := range fm.z {
		w := zeta - z
		if fm.isCorner(i) {
			fm.evalCorner(i, w, f, ft, fd)
			continue
		}
		if fm.logs[i] {
			fm.evalLog(i, w, f, ft, fd)
			continue
		}
		sq := fm.c[i] * cmplx.Sqrt(w)
		p := sq             // c w^(j + 1/2)
		pm := complex(0, 0) // c w^(j - 1/2), for the derivative
		if w != 0 {
			pm = sq / w
		}
		for j := 0; j < fm.per; j++ {
			k := i*fm.per + j
			if k >= len(f) {
				return
			}
			f[k] = real(p)
			if ft != nil {
				var dg complex128
				switch {
				case j > 0:
					dg = complex(float64(j)+0.5, 0) * pm
				case w != 0:
					dg = 0.5 * pm
				default:
					dg = complex(math.NaN(), math.NaN())
				}
				ft[k], fd[k] = real(dg)/fm.half, -imag(dg)/fm.half
			}
			if j == 0 {
				pm = sq
			} else {
				pm *= w
			}
			p *= w
		}
	}
}

// evalLog writes the logarithmic members of meeting i at w = zeta - z_i.
func (fm *family) evalLog(i int, w complex128, f, ft, fd []float64) {
	var lw complex128
	if w != 0 {
		lw = cmplx.Log(w)
	}
	wj := complex(1, 0) // w^j
	for j := 0; j < fm.per; j++ {
		k := i*fm.per + j
		if k >= len(f) {
			return
		}
		f[k] = real(wj * w * lw)
		if ft != nil {
			dg := wj * (complex(float64(j+1), 0)*lw + 1)
			if w == 0 && j == 0 {
				dg = complex(math.NaN(), math.NaN())
			}
			ft[k], fd[k] = real(dg)/fm.half, -imag(dg)/fm.half
		}
		wj *= w
	}
}

func (fm *family) isCorner(i int) bool { return fm.corner != nil && fm.corner[i] != 0 }

// cornerW returns the corner members' variable for w = zeta - z_i, and
// the sign of d/dt (the end corner's w is reflected across the other
// edge's line).
func (fm *family) cornerW(i int, w complex128) (complex128, float64) {
	if fm.corner[i] > 0 {
		return complex(-real(w), imag(w)), -1
	}
	return w, 1
}

// evalCorner writes the corner members of meeting i (a corner) at w =
// zeta - z_i: F_j = Re G_j(v), G_j = v^(2j+1) (log v - i pi/2), v =
// cornerW(w); d/dt = sign Re G'/half, d/dd = -Im G'/half.
func (fm *family) evalCorner(i int, w complex128, f, ft, fd []float64) {
	v, sign := fm.cornerW(i, w)
	var lv complex128
	if v != 0 {
		lv = cmplx.Log(v) - complex(0, math.Pi/2)
	}
	v2 := v * v
	vn := complex(1, 0) // v^(2j)
	for j := 0; j < fm.per; j++ {
		k := i*fm.per + j
		if k >= len(f) {
			return
		}
		n := float64(2*j + 1)
		f[k] = real(vn * v * lv)
		if ft != nil {
			dg := vn * (complex(n, 0)*lv + 1)
			if v == 0 && j == 0 {
				dg = complex(math.NaN(), math.NaN())
			}
			ft[k], fd[k] = sign*real(dg)/fm.half, -imag(dg)/fm.half
		}
		vn *= v2
	}
}

// xy evaluates the family at (x, y): F_k and their gradients (values
// only when fx is nil).
func (fm *family) xy(x, y float64, f, fx, fy []float64) {
	t, d := fm.fr.at(x, y)
	if fx == nil {
		fm.eval(t, d, f, nil, nil)
		return
	}
	fm.eval(t, d, f, fx, fy)
	for k := range f {
		ft, fd := fx[k], fy[k]
		fx[k] = ft*fm.fr.tx + fd*fm.fr.dx
		fy[k] = ft*fm.fr.ty + fd*fm.fr.dy
	}
}

// conjugate returns Im G_k at local (t, 0) for k < len(g): the flow of F_k
// entering through its own edge between s1 and s2 is
// kappa/ts (Im G_k(s2) - Im G_k(s1)).
func (fm *family) conjugate(t float64, g []float64) {
	zeta := complex((t-fm.centre)/fm.half, 0)
	for i, z := range fm.z {
		w := zeta - z
		if fm.isCorner(i) {
			// along the edge v is real and >= 0: Im G_j = -pi/2 v^(2j+1); at
			// the end corner F = Re K with K(w) = conj(G(-conj w)), whose
			// imaginary part is -Im G
			v, sign := fm.cornerW(i, w)
			p := v
			for j := 0; j < fm.per; j++ {
				if k := i*fm.per + j; k < len(g) {
					g[k] = sign * -math.Pi / 2 * real(p)
				}
				p *= v * v
			}
			continue
		}
		if fm.logs[i] {
			var lw complex128
			if w != 0 {
				lw = cmplx.Log(w)
			}
			p := w * lw
			for j := 0; j < fm.per; j++ {
				if k := i*fm.per + j; k < len(g) {
					g[k] = imag(p)
				}
				p *= w
			}
			continue
		}
		p := fm.c[i] * cmplx.Sqrt(w)
		for j := 0; j < fm.per; j++ {
			if k := i*fm.per + j; k < len(g) {
				g[k] = imag(p)
			}
			p *= w
		}
	}
}

// Entering turns a gradient into the flux entering the region through edge
// e (see package problem for the convention).
func Entering(pr *problem.Problem, e problem.Side, ux, uy float64) float64 {
	switch e {
	case problem.Bottom:
		return -pr.Ky * uy
	case problem.Top:
		return pr.Ky * uy
	case problem.Left:
		return -pr.Kx * ux
	}
	return pr.Kx * ux
}

// sum returns sum_k a_k F_k and its derivatives along t and d at local
// (t, d), for the weights a (one per member): per meeting one square root
// and two polynomials in w = zeta - z_i by Horner's rule,
//
//	G = c sqrt(w) sum_j a_j w^j,   G' = c / sqrt(w) sum_j (j + 1/2) a_j w^j.
func (fm *family) sum(t, d float64, a []float64) (f, ft, fd float64) {
	zeta := complex((t-fm.centre)/fm.half, d/fm.half)
	for i, z := range fm.z {
		w := zeta - z
		co := a[i*fm.per : (i+1)*fm.per]
		if fm.isCorner(i) {
			// G = v (log v - i pi/2) P(v^2), G' = (log v - i pi/2) Q(v^2) + P(v^2),
			// Q = sum (2j+1) a_j v^2j
			v, sign := fm.cornerW(i, w)
			v2 := v * v
			var p, q complex128
			for j := fm.per - 1; j >= 0; j-- {
				p = p*v2 + complex(co[j], 0)
				q = q*v2 + complex(float64(2*j+1)*co[j], 0)
			}
			var lv complex128
			if v != 0 {
				lv = cmplx.Log(v) - complex(0, math.Pi/2)
			}
			g := v * lv * p
			dg := lv*q + p
			if v == 0 && co[0] != 0 {
				dg = complex(math.NaN(), math.NaN())
			}
			f += real(g)
			ft += sign * real(dg) / fm.half
			fd -= imag(dg) / fm.half
			continue
		}
		if fm.logs[i] {
			// G = w log w P(w), G' = log w Q(w) + P(w), Q = sum (j+1) a_j w^j
			var p, q complex128
			for j := fm.per - 1; j >= 0; j-- {
				p = p*w + complex(co[j], 0)
				q = q*w + complex(float64(j+1)*co[j], 0)
			}
			var lw complex128
			if w != 0 {
				lw = cmplx.Log(w)
			}
			g := w * lw * p
			dg := lw*q + p
			if w == 0 && co[0] != 0 {
				dg = complex(math.NaN(), math.NaN())
			}
			f += real(g)
			ft += real(dg) / fm.half
			fd -= imag(dg) / fm.half
			continue
		}
		var p, q complex128
		for j := fm.per - 1; j >= 0; j-- {
			p = p*w + complex(co[j], 0)
			q = q*w + complex((float64(j)+0.5)*co[j], 0)
		}
		sq := fm.c[i] * sqrtC(w)
		g := sq * p
		f += real(g)
		var dg complex128
		if w != 0 {
			dg = q * sq / w
		} else if co[0] != 0 {
			dg = complex(math.NaN(), math.NaN())
		}
		ft += real(dg) / fm.half
		fd -= imag(dg) / fm.half
	}
	return f, ft, fd
}

// sumFast is sum in real arithmetic for the grid: the square root's
// modulus without math.Hypot (zeta is normalised: |w| is of order 1, far
// from overflow), and G' = c Q / sqrt(w) = c Q conj(sqrt w) / |w| without
// a complex division. Logarithmic meetings as in sum.
func (fm *family) sumFast(t, d float64, a []float64) (f, ft, fd float64) {
	zr, zi := (t-fm.centre)/fm.half, d/fm.half
	for i, z := range fm.z {
		if fm.logs[i] || fm.isCorner(i) {
			g, gt, gd := fm.sumOne(i, t, d, a)
			f, ft, fd = f+g, ft+gt, fd+gd
			continue
		}
		wr, wi := zr-real(z), zi-imag(z)
		co := a[i*fm.per : (i+1)*fm.per]
		if wr == 0 && wi == 0 {
			// at the meeting: the value is 0, the gradient unbounded unless
			// the first member is absent
			if co[0] != 0 {
				ft, fd = math.NaN(), math.NaN()
			}
			continue
		}
		// p = sum_j a_j w^j, q = sum_j (j + 1/2) a_j w^j by Horner's rule
		var pr, pi, qr, qi float64
		for j := fm.per - 1; j >= 0; j-- {
			pr, pi = pr*wr-pi*wi+co[j], pr*wi+pi*wr
			qr, qi = qr*wr-qi*wi+(float64(j)+0.5)*co[j], qr*wi+qi*wr
		}
		// principal square root (sqrtC)
		r := math.Sqrt(wr*wr + wi*wi)
		s := math.Sqrt((r + math.Abs(wr)) / 2)
		var sr, si float64
		if wr >= 0 {
			sr, si = s, wi/(2*s)
		} else {
			sr, si = math.Abs(wi)/(2*s), math.Copysign(s, wi)
		}
		cr, ci := real(fm.c[i]), imag(fm.c[i])
		sr, si = cr*sr-ci*si, cr*si+ci*sr // c sqrt(w)
		f += sr*pr - si*pi
		// c q conj(sqrt w) / r: conj(c sqrt w) = conj(c) conj(sqrt w), and |c| = 1
		// with c in {1, -i}: c conj(sqrt w) = c^2 conj(c sqrt w)
		c2r, c2i := cr*cr-ci*ci, 2*cr*ci
		ur, ui := c2r*sr+c2i*si, c2i*sr-c2r*si // c^2 conj(c sqrt w)
		rh := 1 / (r * fm.half)
		ft += (qr*ur - qi*ui) * rh
		fd -= (qr*ui + qi*ur) * rh
	}
	return f, ft, fd
}

// sumOne is sum for meeting i alone.
func (fm *family) sumOne(i int, t, d float64, a []float64) (f, ft, fd float64) {
	sub := family{fr: fm.fr, centre: fm.centre, half: fm.half, z: fm.z[i : i+1], c: fm.c[i : i+1],
		logs: fm.logs[i : i+1], per: fm.per}
	if fm.corner != nil {
		sub.corner = fm.corner[i : i+1]
	}
	return sub.sum(t, d, a[i*fm.per:(i+1)*fm.per])
}

// sqrtC is the principal square root, by two real square roots (the
// branch cut along the negative real axis, with -0 and +0 imaginary
// parts taken as cmplx.Sqrt takes them).
func sqrtC(w complex128) complex128 {
	x, y := real(w), imag(w)
	if x == 0 && y == 0 {
		return complex(0, y)
	}
	r := math.Hypot(x, y)
	a := math.Sqrt((r + math.Abs(x)) / 2)
	if x >= 0 {
		return complex(a, y/(2*a))
	}
	return complex(math.Abs(y)/(2*a), math.Copysign(a, y))
}

// area returns the integral over the region of sum_k a_k F_k, exactly: in
// the frame (t along the edge, d across, dx dy = dt dd / c, c the
// orthotropic stretch) the region is [0, Lm] x [0, depth], zeta runs over
// [-1, 1] x [0, depth/half], and with Q” = G
//
//	int int Re G dxi deta = Im(Q(1 + i e) - Q(-1 + i e) - Q(1) + Q(-1)),  e = depth/half,
//
// since Re G = d/deta Im P (P' = G) and Im P integrates along xi to Im Q;
// the corners on the edge itself are taken from above the branch cuts.
// For G = c w^(j+1/2): Q = c w^(j+5/2) / ((j + 3/2)(j + 5/2)); for
// G = w^(j+1) log w: Q = w^(j+3) (log w / ((j+2)(j+3)) - 1/((j+2)(j+3)^2) - 1/((j+2)^2 (j+3))).
// For a corner's G_j = v^n (log v - i pi/2), n = 2j+1: the same with n for
// j+1, less i pi/2 v^(n+2) / ((n+1)(n+2)); at the end corner F = Re K,
// K(w) = conj(G(-conj w)), and Q_K(w) = conj(Q_G(-conj w)).
func (fm *family) area(a []float64, depth, stretch float64) float64 {
	e := depth / fm.half
	corners := [4]complex128{complex(1, e), complex(-1, e), complex(1, 0), complex(-1, 0)}
	sign := [4]float64{1, -1, -1, 1}
	total := 0.0
	for i, z := range fm.z {
		for k, zeta := range corners {
			w := zeta - z
			var q complex128
			for j := 0; j < fm.per; j++ {
				co := a[i*fm.per+j]
				if co == 0 {
					continue
				}
				fj := float64(j)
				if fm.isCorner(i) {
					v, sign := fm.cornerW(i, w)
					if v == 0 {
						continue
					}
					n := float64(2*j + 1)
					qv := cmplx.Pow(v, complex(n+2, 0)) * ((cmplx.Log(v)-complex(0, math.Pi/2))/complex((n+1)*(n+2), 0) -
						complex(1/((n+1)*(n+2)*(n+2))+1/((n+1)*(n+1)*(n+2)), 0))
					if sign < 0 {
						qv = cmplx.Conj(qv)
					}
					q += complex(co, 0) * qv
					continue
				}
				if fm.logs[i] {
					if w == 0 {
						continue
					}
					lw := cmplx.Log(w)
					q += complex(co, 0) * cmplx.Pow(w, complex(fj+3, 0)) *
						(lw/complex((fj+2)*(fj+3), 0) - complex(1/((fj+2)*(fj+3)*(fj+3))+1/((fj+2)*(fj+2)*(fj+3)), 0))
					continue
				}
				wp := cmplx.Sqrt(w) * w * w // w^(5/2)
				for m := 0; m < j; m++ {
					wp *= w
				}
				q += complex(co/((fj+1.5)*(fj+2.5)), 0) * fm.c[i] * wp
			}
			total += sign[k] * imag(q)
		}
	}
	return total * fm.half * fm.half / stretch
}
