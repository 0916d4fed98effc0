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
	// KinkBreak: the data of an edge (value, flux or ambient) are
	// continuous but their slope jumps inside the edge, as in abs(s - a),
	// max(0, ...) or the knots of readings(...). From and To are the
	// slopes (data per unit of s) before and after. The flows stay finite.
	KinkBreak
	// PartMeet: inside a mixed edge (problem.Edge.Parts) a value part
	// meets a flux or convection part. Near it the gradient grows like
	// r^-1/2: the flows stay finite.
	PartMeet
)

var breakClassNames = [...]string{ValueBreak: "value break", FluxBreak: "flux break", CornerBreak: "corner break", KinkBreak: "kink", PartMeet: "part meeting"}

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
	// second; for a KinkBreak the slopes dF/ds before and after.
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
	if mixed(p) {
		return mixedBreaks(p)
	}
	var out []Break
	for _, side := range problem.Sides {
		p.Edges[side].Breaks = nil
		bs, err := edgeBreaks(p, side)
		if err != nil {
			return nil, err
		}
		for _, b := range bs {
			if b.Class == FluxBreak || b.Class == KinkBreak {
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
	lo, hi, i := sampleEdge(e.F, v, L)
	if i >= 0 && v[i]-v[i] != 0 {
		return nil, &problem.NonFiniteError{Side: side, S: L * float64(i) / breakSamples}
	}
	if i >= 0 {
		return nil, &DataRangeError{Side: side, S: L * float64(i) / breakSamples, V: v[i]}
	}
	if hi-lo <= 0 {
		return nil, nil
	}
	if s0, ok := findPole(e.F, v, L); ok {
		return nil, &PoleError{Side: side, S: s0}
	}
	idx := make([]int, breakSamples)
	countUp(idx)
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
		a, b, fa, fb = bisect(e.F, a, b, fa, fb)
		if fa-fa != 0 || fb-fb != 0 {
			// infinite where the data change most: a pole hit exactly
			return nil, &PoleError{Side: side, S: a}
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
	return append(out, edgeKinks(e.F, side, v, L, hi-lo, out)...), nil
}

// sampleEdge sets v[i] = f(L i / breakSamples) in turn and returns the
// range of the values; it stops at the first value that is not finite or
// beyond MaxData and returns its index i (else i = -1). It is a function
// of its own, not inlined, to keep its loop out of a large function (see
// the package doc of edgewise/solver, Loops in functions of their own).
//
//go:noinline
func sampleEdge(f func(float64) float64, v []float64, L float64) (lo, hi float64, i int) {
	lo, hi = math.Inf(1), math.Inf(-1)
	for i := range v {
		v[i] = f(L * float64(i) / breakSamples)
		if v[i]-v[i] != 0 || math.Abs(v[i]) > MaxData {
			return lo, hi, i
		}
		lo, hi = min(lo, v[i]), max(hi, v[i])
	}
	return lo, hi, -1
}

// countUp sets idx[i] = i.
// Not inlined: see the package doc of edgewise/solver, Loops in
// functions of their own.
//
//go:noinline
func countUp(idx []int) {
	for i := range idx {
		idx[i] = i
	}
}

// bisect narrows [a, b] (f(a) = fa, f(b) = fb) breakBisections times
// to the half where f changes most. When f is not finite at a midpoint m
// it returns at once with a = b = m, fa = fb = f(m).
// Not inlined: see the package doc of edgewise/solver, Loops in
// functions of their own.
//
//go:noinline
func bisect(f func(float64) float64, a, b, fa, fb float64) (float64, float64, float64, float64) {
	for k := 0; k < breakBisections && b-a > 0; k++ {
		m := (a + b) / 2
		if m <= a || m >= b {
			break
		}
		fm := f(m)
		if fm-fm != 0 {
			return m, m, fm, fm
		}
		if math.Abs(fm-fa) >= math.Abs(fb-fm) {
			b, fb = m, fm
		} else {
			a, fa = m, fm
		}
	}
	return a, b, fa, fb
}

// Kinks: a sample whose second difference stands out from those two
// samples away by more than kinkContrast is a candidate (a kink puts a
// second difference of the slope jump times the spacing on one or two
// neighbouring samples, smooth data the curvature times the spacing
// squared on all); at most kinkCandidates of them, the largest first.
const (
	kinkContrast   = 8
	kinkCandidates = 32
)

// edgeKinks finds the kinks of f inside an edge of length L from its
// samples v, away from the steps already found. Each candidate is placed
// where the lines through the samples on either side meet, and the place
// refined with spacings shrinking eightfold down to 1e-13 of L; the slopes
// before and after are then taken by one-sided second-order differences
// over 1e-4 of L. A kink is kept if its slopes differ by more than 1e-6 of
// the edge's range over L (smooth data give equal slopes to about 1e-8).
// A step whose two sides have different slopes is a kink too, at the
// step's place.
func edgeKinks(f func(float64) float64, side problem.Side, v []float64, L, rng float64, steps []Break) []Break {
	n := len(v) - 1
	h := L / float64(n)
	d2 := make([]float64, n+1)
	for i := 1; i < n; i++ {
		d2[i] = v[i-1] - 2*v[i] + v[i+1]
	}
	var cand []int
	for i := 3; i <= n-3; i++ {
		ref := max(math.Abs(d2[i-2]), math.Abs(d2[i+2]))
		if math.Abs(d2[i]) <= kinkContrast*ref || math.Abs(d2[i]) <= 1e-12*rng {
			continue
		}
		near := false
		for _, b := range steps {
			near = near || math.Abs(b.S-h*float64(i)) < 4*h
		}
		if !near {
			cand = append(cand, i)
		}
	}
	sort.Slice(cand, func(a, b int) bool { return math.Abs(d2[cand[a]]) > math.Abs(d2[cand[b]]) })
	var out []Break
	for _, i := range cand[:min(len(cand), kinkCandidates)] {
		s0 := h * float64(i)
		for g := h; g > 1e-13*L; g /= 8 {
			s0 = kinkMeet(f, s0, g, L)
		}
		if !(s0 > 2e-4*L && s0 < L*(1-2e-4)) {
			continue // the corner's business
		}
		const d = 1e-4
		a, b := s0*(1-1e-15)-1e-13*L, s0*(1+1e-15)+1e-13*L
		fa, fb := f(a), f(b)
		sl := (3*fa - 4*f(a-d*L) + f(a-2*d*L)) / (2 * d * L)
		sr := (-3*fb + 4*f(b+d*L) - f(b+2*d*L)) / (2 * d * L)
		if math.Abs(sr-sl)*L <= 1e-6*rng || math.Abs(fb-fa) > 1e-6*rng {
			continue // smooth after all, or a step
		}
		dup := false
		for _, o := range out {
			dup = dup || math.Abs(o.S-s0) < 1e-9*L
		}
		if !dup {
			out = append(out, Break{Class: KinkBreak, Side: side, Corner: -1, S: s0, From: sl, To: sr})
		}
	}
	// A step may also break the slope: the slopes on either side of it.
	for _, st := range steps {
		const d = 1e-4
		a, b := st.S*(1-1e-15)-1e-13*L, st.S*(1+1e-15)+1e-13*L
		if a-2*d*L < 0 || b+2*d*L > L {
			continue
		}
		sl := (3*f(a) - 4*f(a-d*L) + f(a-2*d*L)) / (2 * d * L)
		sr := (-3*f(b) + 4*f(b+d*L) - f(b+2*d*L)) / (2 * d * L)
		if math.Abs(sr-sl)*L > 1e-6*rng {
			out = append(out, Break{Class: KinkBreak, Side: side, Corner: -1, S: st.S, From: sl, To: sr})
		}
	}
	sort.Slice(out, func(a, b int) bool { return out[a].S < out[b].S })
	return out
}

// kinkMeet returns where the line through f at s0-2g, s0-g meets the one
// through f at s0+g, s0+2g, held within [s0-g, s0+g] (s0 itself when the
// lines are parallel).
func kinkMeet(f func(float64) float64, s0, g, L float64) float64 {
	a2, a1 := max(s0-2*g, 0), max(s0-g, 0)
	b1, b2 := min(s0+g, L), min(s0+2*g, L)
	fa2, fa1, fb1, fb2 := f(a2), f(a1), f(b1), f(b2)
	if a1 <= a2 || b2 <= b1 {
		return s0
	}
	sl, sr := (fa1-fa2)/(a1-a2), (fb2-fb1)/(b2-b1)
	if sl == sr || sl-sl != 0 || sr-sr != 0 {
		return s0
	}
	// fa1 + sl (s - a1) = fb1 + sr (s - b1)
	s := (fb1 - fa1 + sl*a1 - sr*b1) / (sl - sr)
	if !(s >= s0-g && s <= s0+g) {
		return s0
	}
	return s
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
