package solver

import (
	"fmt"
	"math"
	"sort"

	"edgewise/solver/problem"
)

// A jump is a point inside a value edge where the prescribed value
// changes abruptly (a step written with when(...) or rise(s, at)). Near it
// the gradient grows like 1/r, so the flow through that edge is infinite.
// The series engine treats jumps at corners; these, inside an edge, are
// found here, carried out of the series by angle functions (innerjump.go)
// so that it converges fast, and reported so that the result says the flow
// is infinite instead of printing a meaningless number.
type jump struct {
	side     problem.Side
	s        float64 // where along the edge
	from, to float64 // the values just before and just after
}

// Sampling for findJumps: samples along each edge, the largest number of
// candidate intervals refined, and bisection steps (each halves the
// interval; 60 take it below the resolution of float64 positions).
const (
	jumpSamples    = 1024
	jumpCandidates = 8
	jumpBisections = 60
)

// findJumps returns the jumps inside the value edges (see dataJumps).
func findJumps(pr *problem.Problem) []jump {
	var out []jump
	for _, j := range dataJumps(pr) {
		if pr.Edges[j.side].Kind == problem.Value {
			out = append(out, j)
		}
	}
	return out
}

// dataJumps finds the jumps inside every edge's data, whatever its kind
// (for flux and convection edges a step of flux or of ambient, which the
// series integrates piece by piece). It samples each edge, takes the
// intervals where the data changes most, and halves each of them towards
// the larger change. A jump keeps its size however short the interval
// gets; a steep but smooth change (rise(s, at, width) with a small width)
// shrinks away. Jumps smaller than 1e-6 of the edge's range of values, and
// places within 1e-9 of a corner (the engine's own corner treatment), are
// left out.
func dataJumps(pr *problem.Problem) []jump {
	var out []jump
	for _, side := range problem.Sides {
		e := pr.Edges[side]
		if e.Kind == problem.Convection && e.Hc == 0 {
			continue // the ambient plays no part
		}
		L := pr.Length(side)
		v := make([]float64, jumpSamples+1)
		lo, hi := math.Inf(1), math.Inf(-1)
		for i := range v {
			v[i] = e.F(L * float64(i) / jumpSamples)
			if v[i]-v[i] != 0 {
				return nil // not finite: the engine reports it with its place
			}
			lo, hi = min(lo, v[i]), max(hi, v[i])
		}
		if hi-lo <= 0 {
			continue
		}
		idx := make([]int, jumpSamples)
		for i := range idx {
			idx[i] = i
		}
		sort.Slice(idx, func(a, b int) bool {
			return math.Abs(v[idx[a]+1]-v[idx[a]]) > math.Abs(v[idx[b]+1]-v[idx[b]])
		})
		for _, i := range idx[:jumpCandidates] {
			a, b := L*float64(i)/jumpSamples, L*float64(i+1)/jumpSamples
			fa, fb := v[i], v[i+1]
			size := math.Abs(fb - fa)
			if size <= 1e-6*(hi-lo) {
				break
			}
			for k := 0; k < jumpBisections && b-a > 0; k++ {
				m := (a + b) / 2
				if m <= a || m >= b {
					break
				}
				fm := e.F(m)
				if fm-fm != 0 {
					break // not finite: the engine reports it with its place
				}
				if math.Abs(fm-fa) >= math.Abs(fb-fm) {
					b, fb = m, fm
				} else {
					a, fa = m, fm
				}
			}
			if math.Abs(fb-fa) < 0.5*size || a < 1e-9*L || b > L*(1-1e-9) {
				continue // smooth after all, or the corner
			}
			j := jump{side: side, s: (a + b) / 2, from: fa, to: fb}
			dup := false
			for _, o := range out {
				dup = dup || (o.side == side && math.Abs(o.s-j.s) < 1e-9*L)
			}
			if !dup {
				out = append(out, j)
			}
		}
	}
	return out
}

// warning tells the user about a jump and how to smooth it: over 1% of
// the edge's length L.
func (j jump) warning(L float64) string {
	return fmt.Sprintf("The prescribed value on the %v edge jumps from %.6g to %.6g at s = %.6g: the flow through "+
		"that edge is infinite there (the gradient grows like 1/r near the jump; the field itself is exact, the jump "+
		"being carried by an angle function). "+
		"For finite flows give the step a width, for example %.6g + (%.6g)*rise(s, %.6g, %.3g).",
		j.side, j.from, j.to, j.s, j.from, j.to-j.from, j.s, 0.01*L)
}
