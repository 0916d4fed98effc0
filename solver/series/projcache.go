package series

import (
	"math"
	"sync"

	"edgewise/solver/series/basis"
)

// projCache keeps the quadrature tables of the projections (the nodes,
// weights and the eigenfunctions' values at the nodes) for the many
// series solves of one mixed problem, which all share the same bases: the
// fit solves one inner problem per unknown. Only bases whose terms are not
// a rotation recurrence (a convection neighbour), and only up to
// projCacheTerms terms, are kept.
type projCache struct {
	mu   sync.Mutex
	tabs map[projKey]*projTab
}

const projCacheTerms = 512

type projKey struct {
	L, a, b float64
	n       int
	breaks  string
}

type projTab struct {
	xs, ws []float64
	x      []float64 // x[j*n + i] = X_i(xs[j])
}

func newProjCache() *projCache { return &projCache{tabs: map[projKey]*projTab{}} }

// project is project (sub.go), through the cache when it holds the basis.
func (c *projCache) project(b *basis.Basis, r func(s float64) float64, n int, dst []float64, breaks []float64) []float64 {
	if c == nil || b.Uniform || n > projCacheTerms {
		return project(b, r, n, dst, breaks)
	}
	key := projKey{L: b.L, a: b.BiA, b: b.BiB, n: n}
	for _, s := range breaks {
		key.breaks += string(rune(len(key.breaks))) + formatKey(s)
	}
	c.mu.Lock()
	tab := c.tabs[key]
	c.mu.Unlock()
	if tab == nil {
		tab = &projTab{}
		tab.xs, tab.ws = projectionRule(b.L, n, breaks)
		tab.x = make([]float64, len(tab.xs)*n)
		for j, s := range tab.xs {
			row := tab.x[j*n : (j+1)*n]
			for i := range row {
				row[i] = math.Sin(b.Lambda[i]*s + b.Phi[i])
			}
		}
		c.mu.Lock()
		c.tabs[key] = tab
		c.mu.Unlock()
	}
	dst = resize(dst, n)
	for i := range dst {
		dst[i] = 0
	}
	// dst += sum_j w_j r(s_j) X(s_j), four nodes at a time (one pass over
	// dst for four rows of the table)
	wr := make([]float64, 0, 4)
	var rows [4][]float64
	flush := func() {
		switch len(wr) {
		case 4:
			w0, w1, w2, w3 := wr[0], wr[1], wr[2], wr[3]
			x0, x1, x2, x3 := rows[0][:n], rows[1][:n], rows[2][:n], rows[3][:n]
			for i := range dst {
				dst[i] += w0*x0[i] + w1*x1[i] + w2*x2[i] + w3*x3[i]
			}
		default:
			for k, w := range wr {
				for i, v := range rows[k][:n] {
					dst[i] += w * v
				}
			}
		}
		wr = wr[:0]
	}
	for j, s := range tab.xs {
		v := tab.ws[j] * r(s)
		if v == 0 {
			continue
		}
		rows[len(wr)] = tab.x[j*n : (j+1)*n]
		wr = append(wr, v)
		if len(wr) == 4 {
			flush()
		}
	}
	flush()
	for i := range dst {
		dst[i] /= b.Norm[i]
	}
	return dst
}

// formatKey writes a float64's bits as a string key.
func formatKey(v float64) string {
	u := math.Float64bits(v)
	var b [8]byte
	for i := range b {
		b[i] = byte(u >> (8 * i))
	}
	return string(b[:])
}
