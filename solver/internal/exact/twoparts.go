package exact

import (
	"fmt"
	"math"
	"math/cmplx"
	"slices"

	"edgewise/solver/gauss"
	"edgewise/solver/problem"
)

// Part is a stretch of one edge, From < To, as distances s along the edge
// (bottom and top from the left end, left and right from the bottom end,
// as in the project file).
type Part struct {
	Side     problem.Side
	From, To float64
}

// TwoParts is the exact field in the rectangle 0 < x < W, 0 < y < H of
// conductivity Kx, Ky, without source, with part A held at UA, part B at
// UB and the rest of the boundary insulated (see the package comment).
type TwoParts struct {
	W, H, Kx, Ky float64
	A, B         Part
	UA, UB       float64

	c          float64       // sqrt(Kx/Ky): y maps to c y
	rot        bool          // the map works on the rectangle turned a quarter (see inner)
	a, b       float64       // the isotropic rectangle the map works on, a <= b
	k, kc      float64       // modulus of the rectangle map and its complement
	th         *theta        // its theta functions
	kr         float64       // 2 K(k) / W: x - W/2 maps to kr (x - W/2)
	bigKc      float64       // K'(k), the mapped height
	m          [2][2]float64 // the Moebius map, zeta -> w
	det        float64       // det m > 0
	across     bool          // the parts go to [-1, 1] and beyond +-1/kap (see New)
	kap, kapc  float64       // modulus of the half-plane image, and complement
	bigK, bigL float64       // K(kap), K'(kap) = K(kap')
	alpha      float64       // u = alpha + Re(beta F(w | kap^2))
	beta       complex128
	cond       float64       // the conductance for unit conductivity
	ends       [4]float64    // perimeter positions of the part ends a1, a2, b1, b2
	endF       [4]complex128 // F there: the corners of F's rectangle
}

// New returns the two-part problem. It fails when a part is not inside
// its edge or is empty, or when the parts overlap or touch at both ends.
// Parts that touch at one end (whole adjacent edges) are allowed: the
// field jumps there and the flow between them is infinite.
func New(w, h, kx, ky float64, a, b Part, ua, ub float64) (*TwoParts, error) {
	return build(w, h, kx, ky, a, b, ua, ub, auto)
}

// arrangement chooses where the parts go in the half-plane.
type arrangement int

const (
	auto   arrangement = iota // across when the cross-ratio lambda > 1/2
	beside                    // [-1/kap, -1] and [1, 1/kap]
	across                    // [-1, 1] and beyond +-1/kap
)

func build(w, h, kx, ky float64, a, b Part, ua, ub float64, arr arrangement) (*TwoParts, error) {
	if !(w > 0 && h > 0 && kx > 0 && ky > 0) || math.IsInf(w+h+kx+ky, 0) {
		return nil, fmt.Errorf("exact: rectangle %g x %g, conductivity %g, %g: want positive finite numbers", w, h, kx, ky)
	}
	t := &TwoParts{W: w, H: h, Kx: kx, Ky: ky, A: a, B: b, UA: ua, UB: ub}
	t.c = math.Sqrt(kx / ky)
	t.a, t.b = w, h*t.c
	if t.rot = t.b < t.a; t.rot {
		t.a, t.b = t.b, t.a
	}
	t.th = newTheta(2 * t.b / t.a)
	t.k, t.kc = t.th.k, t.th.kc
	t.kr, t.bigKc = 2*t.th.bigK/t.a, t.th.bigKc
	var ends [4]float64 // perimeter positions of a1, a2, b1, b2 counter-clockwise
	for i, p := range []Part{a, b} {
		if !(p.From < p.To) || p.From < 0 || p.To > t.length(p.Side) {
			return nil, fmt.Errorf("exact: part %v %g..%g is not inside its edge", p.Side, p.From, p.To)
		}
		p0, p1 := t.perimeter(p.Side, p.From), t.perimeter(p.Side, p.To)
		ends[2*i], ends[2*i+1] = min(p0, p1), max(p0, p1)
	}
	total := 2 * (w + h)
	t.ends = ends
	for i := 1; i < 4; i++ { // measure from a1, counter-clockwise
		if ends[i] < ends[0] || i == 3 && ends[3] < ends[2] {
			ends[i] += total
		}
	}
	if !(ends[1] <= ends[2] && ends[2] < ends[3] && ends[3] <= ends[0]+total) || ends[1] == ends[2] && ends[3] == ends[0]+total {
		return nil, fmt.Errorf("exact: parts %v and %v overlap or touch at both ends", a, b)
	}
	if ends[1] == ends[2] {
		// touching where A ends and B starts: take B first, so that they
		// touch where the second part ends and the first starts, which the
		// first arrangement sends to infinity (kap = 0, infinite flow)
		s, err := build(w, h, kx, ky, b, a, ub, ua, arr)
		if err == nil {
			s.A, s.B, s.UA, s.UB = a, b, ua, ub
		}
		return s, err
	}
	var p [4][2]float64 // the ends' images on the real axis, as [n, d] for n/d
	for i, e := range ends {
		x, y := t.onPerimeter(math.Mod(e, total))
		n, d, _ := t.zeta(t.inner(x, y))
		p[i] = [2]float64{real(n), real(d)}
	}
	// cross-ratio lambda = (t3-t2)(t4-t1)/((t3-t1)(t4-t2)) and its
	// complement mu = 1 - lambda = (t2-t1)(t4-t3)/((t3-t1)(t4-t2)).
	den := wedge(p[2], p[0]) * wedge(p[3], p[1])
	lambda := wedge(p[2], p[1]) * wedge(p[3], p[0]) / den
	mu := wedge(p[1], p[0]) * wedge(p[3], p[2]) / den
	var target [3][2]float64
	t.across = arr == across || arr == auto && lambda > 0.5
	if !t.across {
		// parts on [-1/kap, -1] and [1, 1/kap]: lambda = 4 kap/(1+kap)^2,
		// so with s = sqrt(mu), kap = (1-s)/(1+s) = lambda/(1+s)^2 and
		// kap' = 2 sqrt(s)/(1+s). F maps the half-plane onto the rectangle
		// |Re F| < K, 0 < Im F < K' with the parts on its sides Re F = -+K.
		s := math.Sqrt(mu)
		t.kap, t.kapc = lambda/((1+s)*(1+s)), 2*math.Sqrt(s)/(1+s)
		target = [3][2]float64{{-1, t.kap}, {-1, 1}, {1, 1}}
	} else {
		// parts on [-1, 1] and beyond +-1/kap (when lambda is near 1 the
		// first arrangement would crowd them at +-1): mu = 4 kap/(1+kap)^2,
		// with r = sqrt(lambda), kap = mu/(1+r)^2, kap' = 2 sqrt(r)/(1+r).
		// The parts go to the bottom and the top of the rectangle.
		r := math.Sqrt(lambda)
		t.kap, t.kapc = mu/((1+r)*(1+r)), 2*math.Sqrt(r)/(1+r)
		target = [3][2]float64{{-1, 1}, {1, 1}, {1, t.kap}}
	}
	t.bigK, t.bigL = complete(t.kapc), complete(t.kap)
	if t.kap == 0 { // the parts touch: K' is infinite
		t.bigL = math.Inf(1)
	}
	bK, bL := complex(t.bigK, 0), complex(0, t.bigL)
	if !t.across {
		t.endF = [4]complex128{-bK + bL, -bK, bK, bK + bL}
	} else {
		t.endF = [4]complex128{-bK, bK, bK + bL, -bK + bL}
	}
	if !t.across {
		t.alpha, t.beta, t.cond = (ua+ub)/2, complex((ub-ua)/(2*t.bigK), 0), t.bigL/(2*t.bigK)
	} else {
		t.alpha, t.beta, t.cond = ua, complex(0, -(ub-ua)/t.bigL), 2*t.bigK/t.bigL
	}
	// Moebius: S_target^-1 S_ends, each S sending its first three points to 0, 1, inf.
	se := toZeroOneInf(p[0], p[1], p[2])
	st := toZeroOneInf(target[0], target[1], target[2])
	inv := [2][2]float64{{st[1][1], -st[0][1]}, {-st[1][0], st[0][0]}}
	for i := range 2 {
		for j := range 2 {
			t.m[i][j] = inv[i][0]*se[0][j] + inv[i][1]*se[1][j]
		}
	}
	t.det = t.m[0][0]*t.m[1][1] - t.m[0][1]*t.m[1][0]
	if !(t.det > 0) || !(t.kap >= 0 && t.kap < 1) || t.across && t.kap == 0 {
		return nil, fmt.Errorf("exact: parts %v and %v: degenerate map (kap %g, det %g)", a, b, t.kap, t.det)
	}
	return t, nil
}

// wedge returns n_a d_b - n_b d_a, which is (a - b) d_a d_b for the
// points a = n_a/d_a, b = n_b/d_b.
func wedge(a, b [2]float64) float64 { return a[0]*b[1] - b[0]*a[1] }

// toZeroOneInf returns the matrix of the Moebius map sending p1, p2, p3 to
// 0, 1, infinity: zeta -> (zeta^p1)(p2^p3) / ((zeta^p3)(p2^p1)).
func toZeroOneInf(p1, p2, p3 [2]float64) [2][2]float64 {
	c1, c2 := wedge(p2, p3), wedge(p2, p1)
	return [2][2]float64{{c1 * p1[1], -c1 * p1[0]}, {c2 * p3[1], -c2 * p3[0]}}
}

func (t *TwoParts) length(e problem.Side) float64 {
	if e == problem.Bottom || e == problem.Top {
		return t.W
	}
	return t.H
}

// perimeter returns the counter-clockwise distance from the bottom-left
// corner to the point s of edge e.
func (t *TwoParts) perimeter(e problem.Side, s float64) float64 {
	switch e {
	case problem.Bottom:
		return s
	case problem.Right:
		return t.W + s
	case problem.Top:
		return t.W + t.H + (t.W - s)
	}
	return 2*t.W + t.H + (t.H - s)
}

// onPerimeter is the inverse of perimeter, as a point (x, y).
func (t *TwoParts) onPerimeter(p float64) (x, y float64) {
	switch {
	case p <= t.W:
		return p, 0
	case p <= t.W+t.H:
		return t.W, p - t.W
	case p <= 2*t.W+t.H:
		return 2*t.W + t.H - p, t.H
	}
	return 0, 2*(t.W+t.H) - p
}

// point returns the point s of edge e.
func (t *TwoParts) point(e problem.Side, s float64) (x, y float64) {
	switch e {
	case problem.Bottom:
		return s, 0
	case problem.Right:
		return t.W, s
	case problem.Top:
		return s, t.H
	}
	return 0, s
}

// inner returns the point (x, y) of the rectangle on the isotropic
// rectangle a x b the map works on: (x, c y) when W <= c H, otherwise
// turned a quarter counter-clockwise, (c (H - y), x), so that b >= a and
// the ends of the parts spread over the half-plane rather than crowd
// near +-1 (K'/K = 2b/a >= 2). The turn multiplies d/dz by i.
func (t *TwoParts) inner(x, y float64) (X, Y float64) {
	if t.rot {
		return t.c * (t.H - y), x
	}
	return x, t.c * y
}

// zeta returns the image zeta = sn(z', k) = num/den of the point (X, Y)
// of the inner rectangle in the upper half-plane, z' = kr (X - a/2) + i
// kr Y, and dq = den^2 dzeta/dz'. In the lower half of the mapped
// rectangle num = sn, den = 1, dq = cn dn. In the upper half, where sn has
// its pole at iK', it takes sn(u + iK') = 1/(k sn(u)) with u = z' - iK'
// instead: num = 1, den = k sn(u), dq = -k cn(u) dn(u). Either way
// |Im| <= K'/2 for the theta series.
func (t *TwoParts) zeta(x, y float64) (num, den, dq complex128) {
	yp := t.kr * y
	if yp <= t.bigKc/2 {
		sn, cn, dn := t.th.sncndn(complex(t.kr*(x-t.a/2), yp))
		return sn, 1, cn * dn
	}
	sn, cn, dn := t.th.sncndn(complex(t.kr*(x-t.a/2), yp-t.bigKc))
	k := complex(t.k, 0)
	return 1, k * sn, -k * cn * dn
}

// image returns w = P/Q, the image of (x, y) in the half-plane where the
// parts lie on [-1/kap, -1] and [1, 1/kap], and Q^2 dw/dz, z = x + i c y.
func (t *TwoParts) image(x, y float64) (p, q, dwq complex128) {
	num, den, dq := t.zeta(t.inner(x, y))
	if t.rot {
		dq *= 1i
	}
	p = complex(t.m[0][0], 0)*num + complex(t.m[0][1], 0)*den
	q = complex(t.m[1][0], 0)*num + complex(t.m[1][1], 0)*den
	return p, q, complex(t.det*t.kr, 0) * dq
}

// Value returns the exact field at (x, y) inside or on the rectangle.
func (t *TwoParts) Value(x, y float64) float64 {
	p, q, _ := t.image(x, y)
	if onEdge := x <= 0 || x >= t.W || y <= 0 || y >= t.H; onEdge {
		re, im := t.edgeF(real(p), real(q))
		return t.alpha + real(t.beta)*re - imag(t.beta)*im // Re(alpha + beta F)
	}
	return t.alpha + real(t.beta*ellipticF(p/q, t.kap, t.bigL))
}

// edgeF returns F(w) at a real w = p/q, the limit from the upper
// half-plane. With m = kap^2, Re F is F(asin w | m) for |w| <= 1, +-K
// between +-1 and +-1/kap, and F(asin(1/(kap w)) | m) beyond; Im F is 0
// for |w| <= 1, K' beyond +-1/kap, and between them
//
//	int_1^|w| dt / sqrt((t^2-1)(1-m t^2)) = F(asin X | 1-m),  X^2 = (w^2-1)/(kap'^2 w^2)
//
// (the substitution t^2 = 1/(1 - kap'^2 sin^2); from memory, checked by
// the tests against the integral off the axis and the flux density).
func (t *TwoParts) edgeF(p, q float64) (re, im float64) {
	m := t.kap * t.kap
	ap, aq := math.Abs(p), math.Abs(q)
	switch {
	case ap <= aq:
		return realF(p/q, m), 0
	case t.kap*ap >= aq:
		if q == 0 {
			return 0, t.bigL
		}
		return realF(q/(t.kap*p), m), t.bigL
	}
	re = t.bigK
	if p*q < 0 {
		re = -re
	}
	// X^2 = (p^2-q^2)/(kap'^2 p^2), 1 - X^2 = (q^2 - m p^2)/(kap'^2 p^2),
	// 1 - kap'^2 X^2 = q^2/p^2
	x := math.Sqrt((ap-aq)*(ap+aq)) / (t.kapc * ap)
	return re, x * real(carlsonRF(complex((aq-t.kap*ap)*(aq+t.kap*ap)/(t.kapc*t.kapc*ap*ap), 0), complex(q*q/(p*p), 0), 1))
}

// psi returns the stream function Im(alpha + beta F(w)) at the point s of
// edge e, for unit conductivity on the mapped rectangle: the flow entering
// along the boundary counter-clockwise from one point to another is the
// change of psi.
//
// At the part ends themselves, branch points of the map where F is only
// good to the square root of the rounding, it takes F's exact values, the
// corners of its rectangle.
func (t *TwoParts) psi(e problem.Side, s float64) float64 {
	var re, im float64
	pos, total := t.perimeter(e, s), 2*(t.W+t.H)
	if i := slices.IndexFunc(t.ends[:], func(end float64) bool { return end == pos || math.Abs(end-pos) == total }); i >= 0 {
		re, im = real(t.endF[i]), imag(t.endF[i])
	} else {
		p, q, _ := t.image(t.point(e, s))
		re, im = t.edgeF(real(p), real(q))
	}
	if math.IsInf(im, 0) {
		return math.Copysign(math.Inf(1), real(t.beta)*im)
	}
	return imag(t.beta)*re + real(t.beta)*im
}

// FlowThrough returns the exact flow entering the region through the
// stretch from s0 to s1 of edge e, per unit depth (infinite when the
// stretch holds a point where the parts touch). It is the conductivity
// sqrt(Kx Ky) times the change of the stream function along the stretch,
// counter-clockwise: no quadrature, so it holds to the last digits even
// across the ends of a part.
func (t *TwoParts) FlowThrough(e problem.Side, s0, s1 float64) float64 {
	d := t.psi(e, s1) - t.psi(e, s0)
	if e == problem.Top || e == problem.Left { // s runs clockwise
		d = -d
	}
	return math.Sqrt(t.Kx*t.Ky) * d
}

// At returns the exact field and its gradient at an interior point.
func (t *TwoParts) At(x, y float64) (u, ux, uy float64) {
	p, q, dwq := t.image(x, y)
	w := p / q
	m := complex(t.kap*t.kap, 0)
	// d/dz of Phi = alpha + beta F(w), whose real part is u
	dphi := t.beta * dwq / (q * q * cmplx.Sqrt(1-w*w) * cmplx.Sqrt(1-m*w*w))
	u = t.alpha + real(t.beta*ellipticF(w, t.kap, t.bigL))
	return u, real(dphi), -imag(dphi) * t.c
}

// Inflow returns the flux density entering the region at the point s of
// edge e, per unit length of the edge: zero on the insulated parts,
// growing like r^-1/2 towards an end of a part that meets the insulated
// rest inside an edge. It is the exit gradient (times the conductivity
// across the edge) along a part.
func (t *TwoParts) Inflow(e problem.Side, s float64) float64 {
	x, y := t.point(e, s)
	pc, qc, dwq := t.image(x, y)
	p, q := real(pc), real(qc)
	// Q^2 sqrt(1-w^2) sqrt(1-kap^2 w^2), the roots taken as limits from the
	// upper half-plane: their phase is 1 for |w| < 1, -i for 1 < w < 1/kap,
	// i for -1/kap < w < -1, and -1 beyond.
	mag := math.Sqrt(math.Abs(q*q-p*p) * math.Abs(q*q-t.kap*t.kap*p*p))
	var root complex128
	switch {
	case math.Abs(p) <= math.Abs(q):
		root = complex(mag, 0)
	case t.kap*math.Abs(p) >= math.Abs(q):
		root = complex(-mag, 0)
	case p*q > 0:
		root = complex(0, -mag)
	default:
		root = complex(0, mag)
	}
	dphi := t.beta * dwq / root
	tangent := [4]complex128{problem.Bottom: 1, problem.Right: 1i, problem.Top: -1, problem.Left: -1i}[e]
	q0 := imag(dphi * tangent) // entering, per unit length of the mapped edge, unit conductivity
	if e == problem.Bottom || e == problem.Top {
		return math.Sqrt(t.Kx*t.Ky) * q0
	}
	return t.Kx * q0
}

// Conductance returns the flow between the parts per unit depth and unit
// difference of value: sqrt(Kx Ky) K'(kap) / (2 K(kap)) in the first
// arrangement, sqrt(Kx Ky) 2 K(kap) / K'(kap) in the second.
func (t *TwoParts) Conductance() float64 {
	return math.Sqrt(t.Kx*t.Ky) * t.cond
}

// Flow returns the flow entering the region through part B, per unit
// depth: (UB - UA) times the conductance (infinite when the parts touch).
// Part A takes in its negative.
func (t *TwoParts) Flow() float64 { return (t.UB - t.UA) * t.Conductance() }

// MeanAlong returns the mean of the exact field along the stretch from s0
// to s1 of edge e (for an insulated stretch, the mean surface value under
// it). It is a quadrature: the stretch is cut at the part ends inside it,
// where the field goes like a constant plus r^(1/2), and each piece is
// taken by 48-point Gauss-Legendre through s = a + (b-a)(1 - cos t)/2,
// which makes r^(1/2) smooth at both ends of the piece (about 1e-12 of
// |UB - UA|).
func (t *TwoParts) MeanAlong(e problem.Side, s0, s1 float64) float64 {
	if !(s0 < s1) || s0 < 0 || s1 > t.length(e) {
		panic(fmt.Sprintf("exact: MeanAlong %v %g..%g is not a stretch of the edge", e, s0, s1))
	}
	cuts := []float64{s0, s1}
	for _, p := range []Part{t.A, t.B} {
		for _, s := range []float64{p.From, p.To} {
			if p.Side == e && s0 < s && s < s1 {
				cuts = append(cuts, s)
			}
		}
	}
	slices.Sort(cuts)
	x, w := make([]float64, 48), make([]float64, 48)
	gauss.Legendre(x, w, 0, math.Pi)
	sum := 0.0
	for i := 0; i+1 < len(cuts); i++ {
		a, b := cuts[i], cuts[i+1]
		for j := range x {
			s := a + (b-a)*(1-math.Cos(x[j]))/2
			sum += w[j] * t.Value(t.point(e, s)) * (b - a) * math.Sin(x[j]) / 2
		}
	}
	return sum / (s1 - s0)
}
