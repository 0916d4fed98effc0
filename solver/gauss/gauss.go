package gauss

import (
	"math"
	"sync"
)

// Legendre fills x and w with the len(x)-point Gauss-Legendre rule on
// [lo, hi], nodes in descending order (see the package comment). It is
// safe for concurrent use. It panics if x and w differ in length, if
// lo >= hi or if a bound is not finite.
func Legendre(x, w []float64, lo, hi float64) {
	if len(x) != len(w) {
		panic("gauss: slice length mismatch")
	}
	if !(lo < hi) {
		panic("gauss: lo >= hi")
	}
	if math.IsInf(lo, 0) || math.IsInf(hi, 0) {
		panic("gauss: infinite bound")
	}
	n := len(x)
	if n == 0 {
		return
	}
	if n > maxNewton {
		for i := range x {
			// node i+1 from x = 1, or its mirror image past the middle
			var t, wt float64
			if 2*i+1 > n {
				t, wt = asymptotic(n, n-i)
				t = math.Pi - t
			} else {
				t, wt = asymptotic(n, i+1)
			}
			x[i] = (math.Cos(t)+1)/2*(hi-lo) + lo
			w[i] = wt * (hi - lo) / 2
		}
		return
	}
	r := reference(n)
	for i := range x {
		x[i] = (r.x[i]+1)/2*(hi-lo) + lo
		w[i] = r.w[i] * (hi - lo) / 2
	}
}

// maxNewton is the largest n whose rule comes from Newton's method; it is
// made once and kept (at most this many rules, 80 KiB in all). Larger
// rules come from the asymptotic formulas, O(1) a node.
const maxNewton = 100

// rule is a rule on [-1, 1].
type rule struct{ x, w []float64 }

var (
	mu    sync.Mutex
	rules = map[int]*rule{}
)

// reference returns the n-point rule on [-1, 1] by Newton's method, made
// once for each n.
func reference(n int) *rule {
	mu.Lock()
	defer mu.Unlock()
	if r, ok := rules[n]; ok {
		return r
	}
	r := newRule(n)
	rules[n] = r
	return r
}

func newRule(n int) *rule {
	r := &rule{x: make([]float64, n), w: make([]float64, n)}
	fn := float64(n)
	for k := 1; k <= (n+1)/2; k++ {
		i := k - 1 // r.x[i] is the k-th largest node
		if n%2 == 1 && k == (n+1)/2 {
			r.x[i], r.w[i] = 0, weight(n, 0)
			continue
		}
		x := (1 - 1/(8*fn*fn) + 1/(8*fn*fn*fn)) * math.Cos(math.Pi*(4*float64(k)-1)/(4*fn+2))
		x = newton(n, x)
		r.x[i], r.w[i] = x, weight(n, x)
		r.x[n-1-i], r.w[n-1-i] = -x, r.w[i]
	}
	return r
}

// newton returns the root of P_n near the guess x. Newton converges
// quadratically from newRule's guess: once a step is below 1e-10 the next
// one is at the rounding level; take it and stop (the cap only guards
// against a guess gone astray). It is a function of its own, not inlined,
// to keep its loop out of a larger function (see the package doc of
// edgewise/solver, Loops in functions of their own).
//
//go:noinline
func newton(n int, x float64) float64 {
	for it := 0; it < 20; it++ {
		p, d := legendre(n, x)
		dx := p / d
		x -= dx
		if math.Abs(dx) < 1e-10 {
			p, d = legendre(n, x)
			x -= p / d
			break
		}
	}
	return x
}

// legendre returns P_n(x) and P_n'(x) for |x| < 1.
func legendre(n int, x float64) (p, d float64) {
	p0, p1 := 1.0, x
	for j := 1; j < n; j++ {
		fj := float64(j)
		p0, p1 = p1, ((2*fj+1)*x*p1-fj*p0)/(fj+1)
	}
	if n == 0 {
		return 1, 0
	}
	return p1, float64(n) * (p0 - x*p1) / (1 - x*x)
}

// weight returns the weight of the node next to x. With
// D(x) = (1 - x^2) P_n'(x), the weight 2 / ((1 - x^2) P_n'(x)^2) is
// 2 (1 - x^2) / D(x)^2 at the root r. Since D' = -n(n+1) P_n, D changes
// only to second order between x and r, but 1 - x^2 changes to first
// order: near the ends of [-1, 1] by enough to matter (the node rounded to
// float64 moves the weight of the end node of a 100-point rule by 1.6e-13
// of itself), so it is taken at r = x + delta, delta = -P_n(x) / P_n'(x).
// The recurrence runs in double-double arithmetic (about 32 digits): in
// plain float64 its rounding grows with n.
func weight(n int, x float64) float64 {
	p0, p1 := dd{1, 0}, dd{x, 0}
	for j := 1; j < n; j++ {
		fj := float64(j)
		p0, p1 = p1, p1.mul(x).mul(2*fj+1).sub(p0.mul(fj)).div(fj+1)
	}
	hx, lx := twoProd(x, x)
	s := dd{1, 0}.sub(dd{hx, lx}).hi // 1 - x^2
	d := p0.sub(p1.mul(x)).mul(float64(n))
	D := d.hi + d.lo
	delta := -(p1.hi + p1.lo) * s / D
	s -= 2*x*delta + delta*delta
	return 2 * s / (D * D)
}

// dd is a double-double number hi + lo, |lo| <= ulp(hi)/2.
type dd struct{ hi, lo float64 }

func twoSum(a, b float64) (s, e float64) {
	s = a + b
	bb := s - a
	return s, (a - (s - bb)) + (b - bb)
}

// twoProd returns p = a*b rounded and its exact error e = a*b - p, by
// Dekker's product (Veltkamp's split of each factor into halves of 26
// bits, whose products are exact): the same e as math.FMA(a, b, -p)
// wherever no partial product overflows or underflows, which holds for
// the recurrence's numbers (of order 1 down to 1e-20, times integers). In
// WebAssembly, which has no fused multiply-add, math.FMA is a long
// software routine: it took most of the time of building a rule there.
// The conversions keep a compiler from fusing the products.
func twoProd(a, b float64) (p, e float64) {
	p = a * b
	ah, al := split(a)
	bh, bl := split(b)
	e = float64(al*bl) - (((p - float64(ah*bh)) - float64(al*bh)) - float64(ah*bl))
	return p, e
}

// split is Veltkamp's split of a into hi + lo, each with at most 26
// significant bits.
func split(a float64) (hi, lo float64) {
	c := float64((1<<27 + 1) * a)
	hi = c - (c - a)
	return hi, a - hi
}

func quick(s, e float64) dd {
	h := s + e
	return dd{h, e - (h - s)}
}

func (a dd) sub(b dd) dd {
	s, e := twoSum(a.hi, -b.hi)
	return quick(s, e+(a.lo-b.lo))
}

func (a dd) mul(c float64) dd {
	p, e := twoProd(a.hi, c)
	return quick(p, e+a.lo*c)
}

func (a dd) div(c float64) dd {
	q := a.hi / c
	p, e := twoProd(q, c)
	r := (a.hi - p - e + a.lo) / c
	return quick(q, r)
}
