package series

import (
	"fmt"
	"math"
	"sort"

	"edgewise/solver/problem"
)

// A break is a place where an edge's data stop being smooth. The engine
// finds the breaks once per problem (FindBreaks), carries each out of the
// series analytically (corner breaks by the corner pieces, breaks inside
// an edge by break pieces, see breakfield.go), and reports those that make
// a flow infinite. The class says what breaks.
type BreakClass int

const (
	// ValueBreak: the prescribed value jumps inside a value edge (a step
	// written with when(...) or rise(s, at)). Near it the gradient grows
	// like 1/r: the flow through that edge is infinite.
	ValueBreak BreakClass = iota
	// FluxBreak: the entering flux of a flux edge, or the ambient of a
	// convection edge, jumps inside the edge. The flows stay finite.
	FluxBreak
	// CornerBreak: two value edges prescribe different values at their
	// common corner. The flows through both edges are infinite.
	CornerBreak
	// A break of slope (a kink, as in abs(s - a)) is the class to add
	// next: FindBreaks would report it, and a break piece of one order
	// higher would carry it.
)

var breakClassNames = [...]string{ValueBreak: "value break", FluxBreak: "flux break", CornerBreak: "corner break"}

func (c BreakClass) String() string {
	if c < 0 || int(c) >= len(breakClassNames) {
		return fmt.Sprintf("BreakClass(%d)", int(c))
	}
	return breakClassNames[c]
}

// Break is one place where edge data break.
type Break struct {
	Class BreakClass
	// Side is the edge; for a CornerBreak the corner's first edge (see
	// Corner).
	Side problem.Side
	// Corner is, for a CornerBreak, the corner: 0 bottom-left,
	// 1 bottom-right, 2 top-right, 3 top-left; its first edge is
	// Side(Corner), its second Side(Corner+3 mod 4). -1 otherwise.
	Corner int
	// S is the place along Side (for a CornerBreak, the corner's place
	// along its first edge).
	S float64
	// From and To are the data just before and just after the break; for
	// a CornerBreak the value on the corner's first edge and on its
	// second.
	From, To float64
}

// Edges returns the edges a break concerns, in canonical order.
func (b Break) Edges() []problem.Side {
	if b.Class != CornerBreak {
		return []problem.Side{b.Side}
	}
	e1, e2 := problem.Side(b.Corner), problem.Side((b.Corner+3)%4)
	if e2 < e1 {
		e1, e2 = e2, e1
	}
	return []problem.Side{e1, e2}
}

// PoleError reports edge data that grow without bound near a place inside
// an edge (a pole between sample points, as in 1/(s - a) or tan(k s)):
// neither a break nor finite data.
type PoleError struct {
	Side problem.Side
	S    float64 // where along the edge
}

func (e *PoleError) Error() string {
	return fmt.Sprintf("%v: the data grow without bound near s = %.6g (a pole, not a step)", e.Side, e.S)
}

// MaxData is the largest magnitude of edge data the engine handles (its
// products with sizes and powers of them must not overflow).
const MaxData = 1e100

// DataRangeError reports edge data beyond MaxData in magnitude.
type DataRangeError struct {
	Side problem.Side
	S, V float64 // where along the edge, and the value there
}

func (e *DataRangeError) Error() string {
	return fmt.Sprintf("%v: %g at s = %.6g is outside the range the engine handles (magnitude up to %g)", e.Side, e.V, e.S, MaxData)
}

// Sampling for the breaks inside edges: samples along each edge, the
// largest number of candidate intervals refined, and bisection steps (each
// halves the interval; 60 take it below the resolution of float64
// positions).
const (
	breakSamples    = 1024
	breakCandidates = 8
	breakBisections = 60
)

// FindBreaks returns the breaks of p's edge data: inside the edges and at
// the corners, every edge in the order of problem.Sides. It records the
// places of the flux breaks in p.Edges[e].Breaks (replacing what was
// there), where every solver that integrates the data reads them. Data
// that grow without bound near a place inside an edge return a
// *PoleError, data that are not finite at a sample point a
// *problem.NonFiniteError, data beyond MaxData a *DataRangeError.
//
// Inside an edge: each edge is sampled, the intervals where the data
// change most are taken, and each is halved towards the larger change. A
// break keeps its size however short the interval gets; a steep but
// smooth change (rise(s, at, width) with a small width) shrinks away.
// Breaks smaller than 1e-6 of the edge's range of values, and places
// within 1e-9 of a corner (the corner pieces' business), are left out.
// A pole is told from a break by how the data grow near it: at a break they
// stay bounded as the place is approached, at a pole they grow like a
// power of the distance.
//
// At the corners: two value edges whose values there differ by more than
// 1e-14 of the data scale (see Solution.Scale).
func FindBreaks(p *problem.Problem) ([]Break, error) {
	var out []Break
	for _, side := range problem.Sides {
		p.Edges[side].Breaks = nil
		bs, err := edgeBreaks(p, side)
		if err != nil {
			return nil, err
		}
		for _, b := range bs {
			if b.Class == FluxBreak {
				p.Edges[side].Breaks = append(p.Edges[side].Breaks, b.S)
			}
		}
		sort.Float64s(p.Edges[side].Breaks)
		out = append(out, bs...)
	}
	m := newModel(p)
	out = append(out, cornerBreaks(m, m.dataScale())...)
	return out, nil
}

// edgeBreaks finds the breaks inside one edge (see FindBreaks).
func edgeBreaks(p *problem.Problem, side problem.Side) ([]Break, error) {
	e := p.Edges[side]
	if e.Kind == problem.Convection && e.Hc == 0 {
		return nil, nil // the ambient plays no part
	}
	class := FluxBreak
	if e.Kind == problem.Value {
		class = ValueBreak
	}
	L := p.Length(side)
	v := make([]float64, breakSamples+1)
	lo, hi := math.Inf(1), math.Inf(-1)
	for i := range v {
		v[i] = e.F(L * float64(i) / breakSamples)
		if v[i]-v[i] != 0 {
			return nil, &problem.NonFiniteError{Side: side, S: L * float64(i) / breakSamples}
		}
		if math.Abs(v[i]) > MaxData {
			return nil, &DataRangeError{Side: side, S: L * float64(i) / breakSamples, V: v[i]}
		}
		lo, hi = min(lo, v[i]), max(hi, v[i])
	}
	if hi-lo <= 0 {
		return nil, nil
	}
	if s0, ok := findPole(e.F, v, L); ok {
		return nil, &PoleError{Side: side, S: s0}
	}
	idx := make([]int, breakSamples)
	for i := range idx {
		idx[i] = i
	}
	sort.Slice(idx, func(a, b int) bool {
		return math.Abs(v[idx[a]+1]-v[idx[a]]) > math.Abs(v[idx[b]+1]-v[idx[b]])
	})
	var out []Break
	for _, i := range idx[:breakCandidates] {
		a, b := L*float64(i)/breakSamples, L*float64(i+1)/breakSamples
		fa, fb := v[i], v[i+1]
		size := math.Abs(fb - fa)
		if size <= 1e-6*(hi-lo) {
			break
		}
		for k := 0; k < breakBisections && b-a > 0; k++ {
			m := (a + b) / 2
			if m <= a || m >= b {
				break
			}
			fm := e.F(m)
			if fm-fm != 0 {
				// infinite where the data change most: a pole hit exactly
				return nil, &PoleError{Side: side, S: m}
			}
			if math.Abs(fm-fa) >= math.Abs(fb-fm) {
				b, fb = m, fm
			} else {
				a, fa = m, fm
			}
		}
		s0 := (a + b) / 2
		if a >= 1e-9*L && b <= L*(1-1e-9) && isPole(e.F, s0, L) {
			return nil, &PoleError{Side: side, S: s0}
		}
		if math.Abs(fb-fa) < 0.5*size || a < 1e-9*L || b > L*(1-1e-9) {
			continue // smooth after all, or the corner
		}
		dup := false
		for _, o := range out {
			dup = dup || math.Abs(o.S-s0) < 1e-9*L
		}
		if !dup {
			out = append(out, Break{Class: class, Side: side, Corner: -1, S: s0, From: fa, To: fb})
		}
	}
	return out, nil
}

// isPole tells a pole from a break (or a steep but smooth change) at s0,
// where bisection ended: at a break the data stay bounded as s0 is
// approached; near a pole they grow like a power of the distance. The
// largest |data| at distances 1e-4, 1e-7 and 1e-10 of L on either side
// must grow tenfold at each stage (a thousandfold for 1/(s - s0), thirty
// for 1/sqrt|s - s0|; a logarithm, bounded at every distance the data can
// be sampled at, is not taken for a pole).
func isPole(f func(float64) float64, s0, L float64) bool {
	g := func(d float64) float64 {
		return max(math.Abs(f(max(s0-d*L, 0))), math.Abs(f(min(s0+d*L, L))))
	}
	g1, g2, g3 := g(1e-4), g(1e-7), g(1e-10)
	return g3 > 10*g2 && g2 > 10*g1
}

// poleCandidates is the number of largest local maxima of |data| among
// the samples that findPole examines.
const poleCandidates = 4

// findPole looks for a pole between the samples v of f (at L i/(len(v)-1)):
// from each of the largest local maxima of |v| inside the edge it climbs
// |f| by ternary search over the two neighbouring intervals, and tests the
// top with isPole. A non-finite value met on the way is a pole hit exactly.
func findPole(f func(float64) float64, v []float64, L float64) (float64, bool) {
	n := len(v) - 1
	var peaks []int
	for i := 1; i < n; i++ {
		if math.Abs(v[i]) >= math.Abs(v[i-1]) && math.Abs(v[i]) >= math.Abs(v[i+1]) && math.Abs(v[i]) > 0 {
			peaks = append(peaks, i)
		}
	}
	sort.Slice(peaks, func(a, b int) bool { return math.Abs(v[peaks[a]]) > math.Abs(v[peaks[b]]) })
	for _, i := range peaks[:min(len(peaks), poleCandidates)] {
		a, b := L*float64(i-1)/float64(n), L*float64(i+1)/float64(n)
		for k := 0; k < 120 && b > a; k++ {
			m1, m2 := a+(b-a)/3, b-(b-a)/3
			f1, f2 := f(m1), f(m2)
			if f1-f1 != 0 {
				return m1, true
			}
			if f2-f2 != 0 {
				return m2, true
			}
			if math.Abs(f1) < math.Abs(f2) {
				a = m1
			} else {
				b = m2
			}
		}
		s0 := (a + b) / 2
		if s0 > 1e-9*L && s0 < L*(1-1e-9) && isPole(f, s0, L) {
			return s0, true
		}
	}
	return 0, false
}

// cornerBreaks returns the corners where two value edges disagree by more
// than 1e-14 of the data scale.
func cornerBreaks(m *model, scale float64) []Break {
	var out []Break
	for c := 0; c < 4; c++ {
		e1, e2 := problem.Side(c), problem.Side((c+3)%4)
		if m.kinds[e1] != problem.Value || m.kinds[e2] != problem.Value {
			continue
		}
		end1 := edgeEnd(e1, c)
		f1 := m.data(e1, float64(end1)*m.length(e1))
		f2 := m.data(e2, float64(edgeEnd(e2, c))*m.length(e2))
		if math.Abs(f1-f2) > 1e-14*scale {
			s := float64(end1) * m.p.Length(e1)
			out = append(out, Break{Class: CornerBreak, Side: e1, Corner: c, S: s, From: f1, To: f2})
		}
	}
	return out
}

// warning tells the user about a value break and how to smooth it: over 1%
// of the edge's length L.
func (b Break) warning(L float64) string {
	return fmt.Sprintf("The prescribed value on the %v edge jumps from %.6g to %.6g at s = %.6g: the flow through "+
		"that edge is infinite there (the gradient grows like 1/r near the jump; the field itself is exact, the jump "+
		"being carried by an angle function). "+
		"For finite flows give the step a width, for example %.6g + (%.6g)*rise(s, %.6g, %.3g).",
		b.Side, b.From, b.To, b.S, b.From, b.To-b.From, b.S, 0.01*L)
}
