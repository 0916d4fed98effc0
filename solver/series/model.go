package series

import (
	"math"
	"sync"

	"edgewise/solver/problem"
)

// model is the problem mapped onto an isotropic rectangle [0, W] x [0, H]
// (H = H_orig sqrt(Kx/Ky)) with conductivity k = sqrt(Kx Ky) and
// operator-normalised edge data:
//
//	value:       u                = d(s)   (d = F)
//	flux:        du/dn            = d(s)   (d = F/k, n the outward normal)
//	convection:  du/dn + beta u   = d(s)   (beta = Hc/k, d = beta F)
//
// On the left and right edges s' = s sqrt(Kx/Ky), and the flux and Hc are
// divided by sqrt(Kx/Ky) (the edge is longer by that factor, the total flow
// is unchanged); on the bottom and top edges they are unchanged.
type model struct {
	p      *problem.Problem
	W, H   float64
	a      float64 // sqrt(Kx/Ky): y' = a y
	k      float64
	lap    float64 // Laplacian of u in mapped coordinates: -Source'/k
	kinds  [4]problem.Kind
	beta   [4]float64
	allFlx bool
	breaks [4][]float64 // mapped places of the flux breaks (problem.Edge.Breaks)
	errMu  sync.Mutex   // the sub-problems are built concurrently (solve)
	err    error        // the first error of data
	errs   [4]error     // the first error of each edge's data
}

func newModel(p *problem.Problem) *model {
	m := &model{p: p, W: p.W, a: math.Sqrt(p.Kx / p.Ky), k: math.Sqrt(p.Kx * p.Ky)}
	m.H = p.H * m.a
	m.lap = -p.Source / m.a / m.k
	m.allFlx = true
	for _, s := range problem.Sides {
		e := p.Edges[s]
		kind := e.Kind
		if kind == problem.Convection && e.Hc == 0 {
			kind = problem.Flux // no exchange: insulated
		}
		m.kinds[s] = kind
		if kind == problem.Convection {
			m.beta[s] = e.Hc / m.k
			if s == problem.Left || s == problem.Right {
				m.beta[s] /= m.a
			}
		}
		if kind != problem.Flux {
			m.allFlx = false
		}
	}
	return m
}

// length returns the mapped length of edge s.
func (m *model) length(s problem.Side) float64 {
	if s == problem.Bottom || s == problem.Top {
		return m.W
	}
	return m.H
}

// data returns the operator-normalised data of edge e at mapped s. The
// first non-finite value is kept in m.err (0 is returned then).
func (m *model) data(e problem.Side, s float64) float64 {
	so := s
	vert := e == problem.Left || e == problem.Right
	if vert {
		so = s / m.a
		if so > m.p.H {
			so = m.p.H
		}
	}
	if m.p.Edges[e].Kind == problem.Convection && m.kinds[e] == problem.Flux {
		return 0
	}
	v, err := m.p.Eval(e, so)
	if err != nil {
		m.noteErr(e, err)
		return 0
	}
	switch m.kinds[e] {
	case problem.Flux:
		v /= m.k
		if vert {
			v /= m.a
		}
	case problem.Convection:
		v *= m.beta[e]
	}
	return v
}

// noteErr keeps err as the first error of the data and of edge e. It is
// a function of its own, not inlined, to keep this rare path out of data,
// which runs for every sample (see the package doc of edgewise/solver,
// Loops in functions of their own).
//
//go:noinline
func (m *model) noteErr(e problem.Side, err error) {
	m.errMu.Lock()
	if m.err == nil {
		m.err = err
	}
	if m.errs[e] == nil {
		m.errs[e] = err
	}
	m.errMu.Unlock()
}

// neighbours returns the edges at s = 0 and s = L of edge e, and the edge
// opposite it.
func neighbours(e problem.Side) (a, b, opp problem.Side) {
	switch e {
	case problem.Bottom:
		return problem.Left, problem.Right, problem.Top
	case problem.Top:
		return problem.Left, problem.Right, problem.Bottom
	case problem.Left:
		return problem.Bottom, problem.Top, problem.Right
	}
	return problem.Bottom, problem.Top, problem.Left
}

// cornerOf returns the corner index (0 bottom-left, 1 bottom-right,
// 2 top-right, 3 top-left) at end 0 (s = 0) or 1 (s = L) of edge e.
func cornerOf(e problem.Side, end int) int {
	switch e {
	case problem.Bottom:
		return end
	case problem.Right:
		return 1 + end
	case problem.Top:
		return 3 - end
	}
	return 3 * end
}

var cornerNames = [4]string{"bottom-left", "bottom-right", "top-right", "top-left"}

// normal is the outward unit normal of each edge as a complex number.
var normal = [4]complex128{problem.Bottom: -1i, problem.Right: 1, problem.Top: 1i, problem.Left: -1}

// point returns the mapped coordinates of s along edge e.
func (m *model) point(e problem.Side, s float64) (x, y float64) {
	switch e {
	case problem.Bottom:
		return s, 0
	case problem.Top:
		return s, m.H
	case problem.Left:
		return 0, s
	}
	return m.W, s
}

// cornerPoint returns the mapped coordinates of corner c.
func (m *model) cornerPoint(c int) (x, y float64) {
	switch c {
	case 0:
		return 0, 0
	case 1:
		return m.W, 0
	case 2:
		return m.W, m.H
	}
	return 0, m.H
}

// cornerRho is the rotation putting corner c at the origin with its first
// edge (Side(c)) along the positive real axis and its second edge
// (Side(c+3 mod 4)) along the positive imaginary axis.
var cornerRho = [4]complex128{1, -1i, -1, 1i}

// edgeEnd returns the end (0 or 1) of edge e that touches corner c, or -1.
func edgeEnd(e problem.Side, c int) int {
	for end := 0; end < 2; end++ {
		if cornerOf(e, end) == c {
			return end
		}
	}
	return -1
}

// dirAway returns the unit direction along edge e pointing away from its
// end `end`.
func dirAway(e problem.Side, end int) complex128 {
	var d complex128 = 1
	if e == problem.Left || e == problem.Right {
		d = 1i
	}
	if end == 1 {
		d = -d
	}
	return d
}
