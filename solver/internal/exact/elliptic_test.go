package exact

import (
	"math"
	"math/cmplx"
	"testing"
)

// The moduli give the asked ratio K'/K, and k^2 + k'^2 = 1 (identities).
func TestModuli(t *testing.T) {
	for _, r := range []float64{0.05, 0.2, 0.5, 1, 2, 3.7, 10} {
		k, kc := moduli(r)
		if d := k*k + kc*kc - 1; math.Abs(d) > 1e-15 { // a few roundings
			t.Errorf("ratio %g: k^2 + k'^2 - 1 = %g", r, d)
		}
		if got := complete(k) / complete(kc); math.Abs(got/r-1) > 1e-14 {
			t.Errorf("ratio %g: K'/K = %.17g", r, got)
		}
	}
	// K'/K = 1 at k = 1/sqrt(2) exactly (the lemniscatic case)
	if k, _ := moduli(1); math.Abs(k-math.Sqrt(0.5)) > 1e-15 {
		t.Errorf("ratio 1: k = %.17g, want 1/sqrt 2", k)
	}
	// K(1/sqrt 2) = Gamma(1/4)^2 / (4 sqrt(pi)) (classical closed form)
	want := math.Gamma(0.25) * math.Gamma(0.25) / (4 * math.Sqrt(math.Pi))
	if got := complete(math.Sqrt(0.5)); math.Abs(got/want-1) > 1e-15 {
		t.Errorf("K(1/sqrt 2) = %.17g, want %.17g", got, want)
	}
}

// sn(K) = 1, the Pythagorean identities, and sn' = cn dn.
func TestJacobi(t *testing.T) {
	for _, k := range []float64{0, 0.3, math.Sqrt(0.5), 0.9, 0.999999} {
		kc := math.Sqrt(1 - k*k)
		bigK := complete(kc)
		if s, c, d := jacobi(bigK, k, kc); math.Abs(s-1) > 1e-15 || math.Abs(c) > 1e-7 || math.Abs(d-kc) > 1e-7 {
			t.Errorf("k %g: sn, cn, dn(K) = %g, %g, %g, want 1, 0, k'", k, s, c, d)
		}
		for _, u := range []float64{-1.3, 0.1, 0.7, bigK * 0.99} {
			s, c, d := jacobi(u, k, kc)
			if e := math.Abs(s*s + c*c - 1); e > 1e-15 {
				t.Errorf("k %g u %g: sn^2 + cn^2 - 1 = %g", k, u, e)
			}
			if e := math.Abs(d*d + k*k*s*s - 1); e > 1e-15 {
				t.Errorf("k %g u %g: dn^2 + k^2 sn^2 - 1 = %g", k, u, e)
			}
			const h = 1e-5 // central difference, error about h^2 = 1e-10
			sp, _, _ := jacobi(u+h, k, kc)
			sm, _, _ := jacobi(u-h, k, kc)
			if e := math.Abs((sp-sm)/(2*h) - c*d); e > 1e-9 {
				t.Errorf("k %g u %g: sn' - cn dn = %g", k, u, e)
			}
		}
	}
	// k = 0 gives sin and cos
	if s, c, _ := jacobi(0.4, 0, 1); math.Abs(s-math.Sin(0.4)) > 1e-16 || math.Abs(c-math.Cos(0.4)) > 1e-16 {
		t.Errorf("k 0: sn, cn = %g, %g", s, c)
	}
}

// R_F against closed forms: R_F(x, x, x) = 1/sqrt x, R_F(0, 1, 1) = pi/2,
// R_F(0, 1, 2) = Gamma(1/4)^2/(4 sqrt(2 pi)) (the lemniscate case), and F
// against asin at m = 0, atanh-form at m = 1: F(w|1) = atanh(w); and
// F(w) for complex w against a numerical integral along the segment 0..w.
func TestEllipticF(t *testing.T) {
	if got := carlsonRF(4+0i, 4, 4); cmplx.Abs(got-0.5) > 1e-16 {
		t.Errorf("R_F(4, 4, 4) = %v", got)
	}
	if got := carlsonRF(0, 1, 1); cmplx.Abs(got-math.Pi/2) > 1e-15 {
		t.Errorf("R_F(0, 1, 1) = %v", got)
	}
	lem := math.Gamma(0.25) * math.Gamma(0.25) / (4 * math.Sqrt(2*math.Pi))
	if got := carlsonRF(0, 1, 2); cmplx.Abs(got-complex(lem, 0)) > 1e-15 {
		t.Errorf("R_F(0, 1, 2) = %v, want %v", got, lem)
	}
	for _, w := range []float64{-0.9, 0.2, 0.99} {
		if got := realF(w, 0); math.Abs(got-math.Asin(w)) > 1e-15 {
			t.Errorf("F(%g|0) = %g, want asin", w, got)
		}
		if got := realF(w, 1); math.Abs(got-math.Atanh(w)) > 2e-15*math.Abs(math.Atanh(w)) {
			t.Errorf("F(%g|1) = %g, want atanh", w, got)
		}
	}
	kap := math.Sqrt(0.7)
	bigL := complete(kap)
	for _, w := range []complex128{0.3 + 0.4i, 1.5 + 0.01i, -2 + 0.5i, 4 + 3i} {
		m := kap * kap
		// Simpson with 2000 intervals on z = w t, t in [0, 1] (the path stays
		// in the upper half-plane, away from the branch points)
		const n = 2000
		sum := complex(0, 0)
		for i := 0; i <= n; i++ {
			z := w * complex(float64(i)/n, 0)
			f := 1 / (cmplx.Sqrt(1-z*z) * cmplx.Sqrt(1-complex(m, 0)*z*z))
			wt := 2.0
			if i == 0 || i == n {
				wt = 1
			} else if i%2 == 1 {
				wt = 4
			}
			sum += complex(wt, 0) * f
		}
		want := sum * w / (3 * n)
		if got := ellipticF(w, kap, bigL); cmplx.Abs(got-want) > 1e-10 {
			t.Errorf("F(%v|%g) = %v, Simpson %v", w, m, got, want)
		}
	}
}

// The theta-series sn, cn, dn agree with the AGM values at real
// arguments, keep the identities at complex ones, and sn(z + iK') =
// 1/(k sn z) (the quasi-period; an identity).
func TestThetaJacobi(t *testing.T) {
	for _, r := range []float64{2, 3.3, 10, 62} {
		th := newTheta(r)
		for _, x := range []float64{-th.bigK, -0.7 * th.bigK, 0.1, 0.5 * th.bigK, th.bigK} {
			s, c, d := th.sncndn(complex(x, 0))
			s0, c0, d0 := jacobi(x, th.k, th.kc)
			if cmplx.Abs(s-complex(s0, 0))+cmplx.Abs(c-complex(c0, 0))+cmplx.Abs(d-complex(d0, 0)) > 1e-14 {
				t.Errorf("K'/K %g x %g: theta (%v %v %v), AGM (%g %g %g)", r, x, s, c, d, s0, c0, d0)
			}
			for _, f := range []float64{0.1, 0.3, 0.5} {
				z := complex(x, f*th.bigKc)
				s, c, d := th.sncndn(z)
				k2 := complex(th.k*th.k, 0)
				if e := cmplx.Abs(s*s+c*c-1) + cmplx.Abs(d*d+k2*s*s-1); e > 1e-13*(1+cmplx.Abs(s*s)) {
					t.Errorf("K'/K %g z %v: identities off by %g", r, z, e)
				}
				s2, _, _ := th.sncndn(z - complex(0, th.bigKc))
				if e := cmplx.Abs(s*complex(th.k, 0)*s2 - 1); f == 0.5 && e > 1e-13 {
					t.Errorf("K'/K %g z %v: k sn(z) sn(z - iK') - 1 = %g", r, z, e)
				}
			}
		}
	}
}

// jacobi (the tests' independent reference for the theta series)
// returns sn, cn and dn of a real argument u for modulus k
// (complementary modulus kc) by the arithmetic-geometric mean method: with
// a0 = 1, b0 = k', c0 = k and a(n+1) = (a+b)/2, b(n+1) = sqrt(a b),
// c(n+1) = (a-b)/2 until c(N) vanishes, phi(N) = 2^N a(N) u and
// phi(n-1) = (phi(n) + asin(c(n) sin(phi(n)) / a(n)))/2; then sn = sin
// phi(0), cn = cos phi(0), and dn = sqrt(k'^2 + k^2 cn^2), which keeps
// its relative accuracy when k is near 1.
func jacobi(u, k, kc float64) (sn, cn, dn float64) {
	var a, c [32]float64
	a[0], c[0] = 1, k
	b := kc
	n := 0
	for n < len(a)-1 && math.Abs(c[n]) > 1e-17 {
		a[n+1], b, c[n+1] = (a[n]+b)/2, math.Sqrt(a[n]*b), (a[n]-b)/2
		n++
	}
	phi := math.Ldexp(a[n]*u, n)
	for ; n > 0; n-- {
		phi = (phi + math.Asin(c[n]*math.Sin(phi)/a[n])) / 2
	}
	sn, cn = math.Sin(phi), math.Cos(phi)
	return sn, cn, math.Sqrt(kc*kc + k*k*cn*cn)
}
