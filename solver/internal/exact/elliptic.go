package exact

import (
	"math"
	"math/cmplx"
)

// agm returns the arithmetic-geometric mean of a, b >= 0.
func agm(a, b float64) float64 {
	for range 64 {
		if math.Abs(a-b) <= 1e-16*a {
			break
		}
		a, b = (a+b)/2, math.Sqrt(a*b)
	}
	return (a + b) / 2
}

// complete returns the complete elliptic integral of the first kind
// K(k) = pi / (2 agm(1, k')) from the complementary modulus k'.
func complete(kc float64) float64 { return math.Pi / (2 * agm(1, kc)) }

// moduli returns k and k' = sqrt(1 - k^2), each to full relative accuracy,
// for which K(k')/K(k) = ratio, through the nome q = exp(-pi ratio) and
// k = theta2^2/theta3^2, k' = theta4^2/theta3^2; for ratio < 1 the roles
// swap (q' = exp(-pi/ratio) gives k' and k), so that q <= exp(-pi) always.
func moduli(ratio float64) (k, kc float64) {
	if ratio < 1 {
		kc, k = moduli(1 / ratio)
		return k, kc
	}
	q := math.Exp(-math.Pi * ratio)
	var t2, t3, t4 float64 = 0, 1, 1
	for n := 0; n < 30; n++ {
		fn := float64(n)
		t2 += 2 * math.Pow(q, (fn+0.5)*(fn+0.5))
		if n > 0 {
			p := 2 * math.Pow(q, fn*fn)
			t3 += p
			if n%2 == 1 {
				t4 -= p
			} else {
				t4 += p
			}
		}
	}
	return t2 * t2 / (t3 * t3), t4 * t4 / (t3 * t3)
}

// theta holds the nome q = exp(-pi K'/K) of a modulus, with q <= exp(-2 pi)
// (K'/K >= 2), and the theta constants theta2, theta3, theta4 at zero.
type theta struct {
	q, t2, t3, t4 float64
	k, kc         float64 // k = t2^2/t3^2, k' = t4^2/t3^2
	bigK, bigKc   float64 // K = pi t3^2 / 2, K'
}

// newTheta returns the theta constants for K'/K = ratio >= 2.
func newTheta(ratio float64) *theta {
	if !(ratio >= 2) {
		panic("exact: theta wants K'/K >= 2")
	}
	q := math.Exp(-math.Pi * ratio)
	th := &theta{q: q}
	th.k, th.kc = moduli(ratio)
	th.bigKc, th.bigK = complete(th.k), complete(th.kc)
	zero := complex(0, 0)
	t2, t3, t4 := th.funcs(zero)
	th.t2, th.t3, th.t4 = real(t2), real(t3), real(t4)
	return th
}

// funcs returns theta2, theta3, theta4 (v) together, and through sn
// theta1; the series
//
//	theta1(v) = 2 sum (-1)^n q^((n+1/2)^2) sin((2n+1) v)
//	theta2(v) = 2 sum q^((n+1/2)^2) cos((2n+1) v)
//	theta3(v) = 1 + 2 sum q^(n^2) cos(2n v)
//	theta4(v) = 1 + 2 sum (-1)^n q^(n^2) cos(2n v)
//
// converge like q^(n^2) exp(2n |Im v|); for |Im v| <= pi K'/(4K) and
// q <= exp(-2 pi) eight terms are far more than enough.
func (th *theta) funcs(v complex128) (t2, t3, t4 complex128) {
	t3, t4 = 1, 1
	for n := 0; n < 8; n++ {
		fn := float64(n)
		e, f := th.terms((fn+0.5)*(fn+0.5), 2*fn+1, v)
		t2 += e + f
		if n > 0 {
			e, f := th.terms(fn*fn, 2*fn, v)
			if n%2 == 1 {
				t4 -= e + f
			} else {
				t4 += e + f
			}
			t3 += e + f
		}
	}
	return t2, t3, t4
}

func (th *theta) theta1(v complex128) complex128 {
	var t1 complex128
	for n := 0; n < 8; n++ {
		fn := float64(n)
		e, f := th.terms((fn+0.5)*(fn+0.5), 2*fn+1, v)
		if n%2 == 1 {
			t1 += 1i * (e - f)
		} else {
			t1 -= 1i * (e - f)
		}
	}
	return t1
}

// terms returns q^a exp(i m v) and q^a exp(-i m v), so that 2 q^a cos(m v)
// is their sum and 2 q^a sin(m v) is -i times their difference, each
// worked out as one exponential (q^a underflows and exp(m |Im v|)
// overflows long before their product does).
func (th *theta) terms(a, m float64, v complex128) (e, f complex128) {
	lq := complex(a*math.Log(th.q), 0)
	iv := complex(0, m) * v
	return cmplx.Exp(lq + iv), cmplx.Exp(lq - iv)
}

// sncndn returns sn, cn, dn(z) for complex z with |Im z| <= K'/2, with
// v = pi z / (2K):
//
//	sn = (theta3/theta2) theta1(v)/theta4(v),  cn = (theta4/theta2) theta2(v)/theta4(v),
//	dn = (theta4/theta3) theta3(v)/theta4(v)
//
// (Jacobi's theta-function forms; from memory, checked by the tests
// against the AGM values for real z and the Pythagorean identities).
// Unlike the AGM method at a real argument with the addition formulas,
// these keep their relative accuracy where cn and dn fall like exp(-Im z)
// (long rectangles).
func (th *theta) sncndn(z complex128) (sn, cn, dn complex128) {
	v := complex(math.Pi/(2*th.bigK), 0) * z
	t2, t3, t4 := th.funcs(v)
	t1 := th.theta1(v)
	c2, c3, c4 := complex(th.t2, 0), complex(th.t3, 0), complex(th.t4, 0)
	return c3 / c2 * t1 / t4, c4 / c2 * t2 / t4, c4 / c3 * t3 / t4
}

// carlsonRF returns Carlson's symmetric integral
//
//	R_F(x, y, z) = (1/2) int_0^inf dt / sqrt((t+x)(t+y)(t+z))
//
// for complex x, y, z off the cut (-inf, 0], at most one of them zero, by
// duplication: with lambda = sqrt(x)sqrt(y) + sqrt(x)sqrt(z) + sqrt(y)sqrt(z)
// (principal roots), (x, y, z) -> ((x+lambda)/4, ..) until the three agree
// to 0.0025 relative, then the fifth-order series in the deviations
// X, Y, Z from their mean A, E2 = XY - Z^2, E3 = XYZ:
//
//	R_F = (1 - E2/10 + E3/14 + E2^2/24 - 3 E2 E3/44) / sqrt(A)
//
// whose truncation error is below 1e-16 (Carlson, Numer. Algorithms 10,
// 1995; from memory).
func carlsonRF(x, y, z complex128) complex128 {
	for range 400 { // each step brings the three 4 times closer: 1e200 apart take 340
		a := (x + y + z) / 3
		dx, dy, dz := (a-x)/a, (a-y)/a, (a-z)/a
		if max(cmplx.Abs(dx), cmplx.Abs(dy), cmplx.Abs(dz)) < 0.0025 {
			e2 := dx*dy - dz*dz
			e3 := dx * dy * dz
			return (1 + (e2/24-0.1-3*e3/44)*e2 + e3/14) / cmplx.Sqrt(a)
		}
		sx, sy, sz := cmplx.Sqrt(x), cmplx.Sqrt(y), cmplx.Sqrt(z)
		l := sx*sy + sx*sz + sy*sz
		x, y, z = (x+l)/4, (y+l)/4, (z+l)/4
	}
	panic("exact: R_F did not converge")
}

// ellipticF returns the incomplete integral of the first kind
//
//	F(w) = int_0^w dt / sqrt((1 - t^2)(1 - m t^2)) = w R_F(1 - w^2, 1 - m w^2, 1)
//
// for w in the upper half-plane (the arguments of R_F then stay off its
// cut), or real in [-1, 1] (where it is F(asin w | m)); m = kap^2, and
// kc = K'(kap). Far out, |w| > 1/sqrt(kap), it takes instead
//
//	F(w) = i K' + F(1/(kap w))
//
// (substitute t = 1/(kap tau) in the integral from w to infinity, which is
// -F(1/(kap w)), and F(infinity) = i K'), so that the arguments of R_F stay
// below 1/kap.
func ellipticF(w complex128, kap, kc float64) complex128 {
	if cmplx.Abs(w)*math.Sqrt(kap) > 1 {
		return complex(0, kc) + ellipticF(1/(complex(kap, 0)*w), kap, kc)
	}
	w2 := w * w
	return w * carlsonRF(1-w2, 1-complex(kap*kap, 0)*w2, 1)
}

// realF returns F(asin w | m) for real w in [-1, 1].
func realF(w, m float64) float64 {
	return w * real(carlsonRF(complex(1-w*w, 0), complex(1-m*w*w, 0), 1))
}
