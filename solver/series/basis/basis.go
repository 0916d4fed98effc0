// Package basis holds the one-dimensional Sturm-Liouville bases that the
// series engine expands edge data in:
//
//	X'' + lambda^2 X = 0 on 0 <= s <= L
//	X'(0) = (BiA/L) X(0),   -X'(L) = (BiB/L) X(L)
//
// The Biot numbers BiA, BiB lie in [0, +Inf]: 0 is a Neumann end (the
// neighbouring edge holds a flux), +Inf a Dirichlet end (it holds a value),
// anything between a Robin end (convection). Every eigenfunction is written
//
//	X_n(s) = sin(lambda_n s + phi_n),   phi_n = atan2(mu_n, BiA),  mu_n = lambda_n L
//
// and the eigenvalues are the roots of the pole-free, strictly increasing
// phase equation
//
//	g_m(mu) = mu + atan2(mu, BiA) + atan2(mu, BiB) - m pi = 0,   m = 1, 2, ...
//
// (with atan2(mu, 0) taken as pi/2 also at mu = 0), which is the phase form
// of (BiA BiB - mu^2) sin mu + mu (BiA + BiB) cos mu = 0: it covers sine
// (value-value, mu = m pi), cosine with its constant mode (flux-flux,
// mu = (m-1) pi), quarter-wave (value-flux, mu = (m-1/2) pi), x tan x = Bi
// (flux-convection), x cot x = -Bi (value-convection) and the two-sided
// Robin form. Root m lies in [(m-1) pi, m pi]; it is found by Newton steps
// safeguarded by bisection on that bracket, so no root is missed or counted
// twice.
package basis

import "math"

// phase returns atan2(mu, bi) with the Neumann convention pi/2 at bi = 0.
func phase(mu, bi float64) float64 {
	if bi == 0 {
		return math.Pi / 2
	}
	return math.Atan2(mu, bi)
}

// dphase is d/dmu atan2(mu, bi) (zero for bi = 0 and bi = +Inf).
func dphase(mu, bi float64) float64 {
	if bi == 0 || math.IsInf(bi, 1) {
		return 0
	}
	return bi / (bi*bi + mu*mu)
}

// Root returns mu_m, the m-th (m >= 1) non-negative root of
// mu + atan2(mu, biA) + atan2(mu, biB) = m pi. It panics if m < 1 or a
// Biot number is negative or NaN (caller bugs).
func Root(m int, biA, biB float64) float64 {
	if m < 1 {
		panic("basis: root index must be >= 1")
	}
	if !(biA >= 0) || !(biB >= 0) {
		panic("basis: Biot numbers must be >= 0")
	}
	target := float64(m) * math.Pi
	g := func(mu float64) float64 { return mu + phase(mu, biA) + phase(mu, biB) - target }
	lo, hi := float64(m-1)*math.Pi, float64(m)*math.Pi
	if g(lo) >= 0 {
		return lo
	}
	if g(hi) <= 0 {
		return hi
	}
	// Start from the midpoint of the reduced bracket.
	mu := target - phase(lo+math.Pi/2, biA) - phase(lo+math.Pi/2, biB)
	if !(mu > lo && mu < hi) {
		mu = 0.5 * (lo + hi)
	}
	for it := 0; it < 200; it++ {
		v := g(mu)
		if v == 0 {
			return mu
		}
		if v < 0 {
			lo = mu
		} else {
			hi = mu
		}
		d := 1 + dphase(mu, biA) + dphase(mu, biB)
		next := mu - v/d
		if !(next > lo && next < hi) {
			next = 0.5 * (lo + hi)
		}
		if math.Abs(next-mu) <= 1e-16*math.Max(1, math.Abs(mu)) || hi-lo <= 4e-16*math.Max(1, hi) {
			return next
		}
		mu = next
	}
	return mu
}

// Basis is the first N eigenfunctions for one pair of end conditions on
// [0, L].
type Basis struct {
	L        float64
	BiA, BiB float64
	// Uniform reports that mu_n = Mu[0] + n pi exactly (both ends Dirichlet
	// or Neumann), so recurrences in n may be used.
	Uniform bool
	Mu      []float64 // mu_n = lambda_n L, non-decreasing
	Lambda  []float64 // lambda_n
	Phi     []float64 // phase at s = 0
	Norm    []float64 // integral of X_n^2 over [0, L]
	Int     []float64 // integral of X_n over [0, L]
}

// New returns the first n eigenfunctions. It panics on n < 1, L <= 0 or a
// negative Biot number (caller bugs).
func New(L, biA, biB float64, n int) *Basis {
	if n < 1 || !(L > 0) {
		panic("basis: need n >= 1 and L > 0")
	}
	b := &Basis{L: L, BiA: biA, BiB: biB}
	edge := func(bi float64) bool { return bi == 0 || math.IsInf(bi, 1) }
	b.Uniform = edge(biA) && edge(biB)
	b.Grow(n)
	return b
}

// Len returns the number of eigenfunctions held.
func (b *Basis) Len() int { return len(b.Mu) }

// Grow extends the basis to n eigenfunctions (no-op if it holds that many).
func (b *Basis) Grow(n int) {
	for m := len(b.Mu) + 1; m <= n; m++ {
		var mu float64
		if b.Uniform && m > 1 {
			mu = b.Mu[0] + float64(m-1)*math.Pi
		} else {
			mu = Root(m, b.BiA, b.BiB)
		}
		phi := phase(mu, b.BiA)
		lam := mu / b.L
		b.Mu = append(b.Mu, mu)
		b.Lambda = append(b.Lambda, lam)
		b.Phi = append(b.Phi, phi)
		b.Norm = append(b.Norm, 0.5*b.L*(1-math.Cos(mu+2*phi)*sinc(mu)))
		b.Int = append(b.Int, b.L*math.Sin(phi+mu/2)*sinc(mu/2))
	}
}

func sinc(x float64) float64 {
	if math.Abs(x) < 1e-4 {
		return 1 - x*x/6
	}
	return math.Sin(x) / x
}

// X returns X_n(s) and X_n'(s) (n counts from 0).
func (b *Basis) X(n int, s float64) (x, dx float64) {
	sn, cs := math.Sincos(b.Lambda[n]*s + b.Phi[n])
	return sn, b.Lambda[n] * cs
}

// Row writes X_i(s) to x[i-lo] and, when dx is not nil, X_i'(s) to
// dx[i-lo], for lo <= i < hi, rotating from term to term: by pi s/L, and
// for a basis whose terms are not evenly spaced also by the small angle
// (lambda_i - lambda_(i-1) - pi/L) s + phi_i - phi_(i-1), whose sine and
// cosine come from their Taylor series below 0.02 (to rounding; a larger
// step takes the term afresh by math.Sincos). Exact to about (hi - lo)
// 1e-16 relative, as X itself is to 1e-16.
func (b *Basis) Row(s float64, lo, hi int, x, dx []float64) {
	if hi <= lo {
		return
	}
	sn, cs := math.Sincos(b.Lambda[lo]*s + b.Phi[lo])
	rs, rc := math.Sincos(math.Pi * s / b.L)
	// two loops, the one for evenly spaced terms much the smaller: the
	// browser optimizes only the one in use (see the package doc of
	// edgewise/solver, Loops in functions of their own)
	if b.Uniform {
		rowUniform(b.Lambda[lo:hi], sn, cs, rs, rc, x, dx)
		return
	}
	b.rowSteps(s, lo, hi, sn, cs, rs, rc, x, dx)
}

// rowUniform is Row's loop for a basis of evenly spaced terms, lam their
// eigenvalues, (sn, cs) the sine and cosine of the first at s, (rs, rc)
// those of pi s/L.
// Not inlined: see the package doc of edgewise/solver, Loops in
// functions of their own.
//
//go:noinline
func rowUniform(lam []float64, sn, cs, rs, rc float64, x, dx []float64) {
	for i := range lam {
		if i > 0 {
			sn, cs = sn*rc+cs*rs, cs*rc-sn*rs
		}
		x[i] = sn
		if dx != nil {
			dx[i] = lam[i] * cs
		}
	}
}

// rowSteps is Row's loop for a basis whose terms are not evenly spaced.
// Not inlined: see the package doc of edgewise/solver, Loops in
// functions of their own.
//
//go:noinline
func (b *Basis) rowSteps(s float64, lo, hi int, sn, cs, rs, rc float64, x, dx []float64) {
	const s3, s5, c2, c4, c6 = 1.0 / 6, 1.0 / 20, 0.5, 1.0 / 12, 1.0 / 30
	for i := lo; i < hi; i++ {
		if i > lo {
			if t := (b.Lambda[i]-b.Lambda[i-1]-math.Pi/b.L)*s + b.Phi[i] - b.Phi[i-1]; math.Abs(t) < 0.02 {
				a, c := sn*rc+cs*rs, cs*rc-sn*rs
				t2 := t * t
				es := t * (1 - t2*s3*(1-t2*s5))
				ec := 1 - t2*c2*(1-t2*c4*(1-t2*c6))
				sn, cs = a*ec+c*es, c*ec-a*es
			} else {
				sn, cs = math.Sincos(b.Lambda[i]*s + b.Phi[i])
			}
		}
		x[i-lo] = sn
		if dx != nil {
			dx[i-lo] = b.Lambda[i] * cs
		}
	}
}
