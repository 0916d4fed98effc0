package spectral

import "math"

// lobatto returns the n+1 Gauss-Lobatto-Legendre nodes on [-1, 1] in
// increasing order, -1, the n-1 roots of P_n', 1, and their weights
//
//	w_i = 2 / (n (n + 1) P_n(t_i)^2)
//
// The inner nodes are found by Newton's method on
// q(t) = (1 - t^2) P_n'(t) = n (P_{n-1}(t) - t P_n(t)), whose derivative
// is -n (n + 1) P_n(t), from the Chebyshev-Gauss-Lobatto points
// -cos(pi i / n); the nodes are made exactly symmetric.
func lobatto(n int) (t, w []float64) {
	t = make([]float64, n+1)
	w = make([]float64, n+1)
	nn := float64(n)
	for i := 0; i <= n/2; i++ {
		x := -math.Cos(math.Pi * float64(i) / nn)
		if i > 0 {
			for it := 0; it < 100; it++ {
				p, pm := legendre(n, x)
				dx := nn * (pm - x*p) / (-nn * (nn + 1) * p)
				x -= dx
				if math.Abs(dx) < 1e-16 {
					break
				}
			}
		}
		t[i], t[n-i] = x, -x
	}
	if n%2 == 0 {
		t[n/2] = 0
	}
	for i, x := range t {
		p, _ := legendre(n, x)
		w[i] = 2 / (nn * (nn + 1) * p * p)
	}
	return t, w
}

// legendre returns P_n(x) and P_{n-1}(x) by the three-term recurrence.
func legendre(n int, x float64) (p, pm float64) {
	p, pm = x, 1
	if n == 0 {
		return 1, 0
	}
	for j := 1; j < n; j++ {
		fj := float64(j)
		p, pm = ((2*fj+1)*x*p-fj*pm)/(fj+1), p
	}
	return p, pm
}
