package series

import (
	"fmt"
	"math"
	"math/cmplx"
	"math/rand/v2"
	"testing"

	"edgewise/solver/internal/exact"
	"edgewise/solver/problem"
)

func konst(v float64) func(float64) float64 { return func(float64) float64 { return v } }

// partsEdge builds a mixed edge of value parts (at the given values) and
// insulated parts: kinds[i] true for a value part.
func partsEdge(ends []float64, values []float64, isValue []bool) problem.Edge {
	var e problem.Edge
	for i := range isValue {
		p := problem.Part{Kind: problem.Flux, F: konst(0)}
		if isValue[i] {
			p = problem.Part{Kind: problem.Value, F: konst(values[i])}
		}
		if i < len(ends) {
			p.To = ends[i]
		}
		e.Parts = append(e.Parts, p)
	}
	e.Kind, e.F = e.Parts[0].Kind, e.Parts[0].F
	return e
}

// Two electrode strips, one on the bottom and one on the top, the rest
// insulated: the exact field by the Schwarz-Christoffel map (package exact;
// the classical conformal-map solution found in any potential-theory text).
func TestMixedTwoStrips(t *testing.T) {
	const W, H = 1.0, 0.6
	ex, err := exact.New(W, H, 1, 1, exact.Part{Side: problem.Bottom, From: 0.2, To: 0.5},
		exact.Part{Side: problem.Top, From: 0.3, To: 0.7}, 0, 1)
	if err != nil {
		t.Fatal(err)
	}
	pr := &problem.Problem{W: W, H: H, Kx: 1, Ky: 1}
	pr.Edges[problem.Bottom] = partsEdge([]float64{0.2, 0.5}, []float64{0, 0, 0}, []bool{false, true, false})
	pr.Edges[problem.Top] = partsEdge([]float64{0.3, 0.7}, []float64{0, 1, 0}, []bool{false, true, false})
	pr.Edges[problem.Left] = problem.Edge{Kind: problem.Flux, F: konst(0)}
	pr.Edges[problem.Right] = problem.Edge{Kind: problem.Flux, F: konst(0)}
	f := solveForTest(t, pr)
	worst := 0.0
	for _, xy := range [][2]float64{{0.5, 0.3}, {0.1, 0.1}, {0.9, 0.5}, {0.35, 0.05}, {0.5, 0.59}, {0.25, 0.0}} {
		u, _, _ := f.At(xy[0], xy[1])
		worst = max(worst, math.Abs(u-ex.Value(xy[0], xy[1])))
	}
	t.Logf("worst value error %.3g, estimate %.3g, terms %d", worst, f.ErrorEstimate(), f.Terms())
	if worst > 1e-6 || worst > f.ErrorEstimate() {
		t.Errorf("worst value error %.3g (estimate %.3g)", worst, f.ErrorEstimate())
	}
	parts := PartsOf(f, pr, problem.Top)
	want := ex.FlowThrough(problem.Top, 0.3, 0.7)
	t.Logf("top strip flow %.12g, exact %.12g, conductance %.12g", parts[1].Flow, want, ex.Conductance())
	if math.Abs(parts[1].Flow-want) > 1e-6*math.Abs(want) {
		t.Errorf("top strip flow %.12g, exact %.12g", parts[1].Flow, want)
	}
	for _, w := range f.Warnings() {
		t.Logf("warning %s: %s", w.Code, w.Text)
	}
}

// solveForTest solves pr through FindBreaks and SolveBreaks with the
// default options, failing the test or benchmark on an error.
func solveForTest(t testing.TB, pr *problem.Problem) Field {
	t.Helper()
	breaks, err := FindBreaks(pr)
	if err != nil {
		t.Fatal(err)
	}
	f, err := SolveBreaks(pr, breaks, Options{})
	if err != nil {
		t.Fatal(err)
	}
	return f
}

func insulatedEdge() problem.Edge { return problem.Edge{Kind: problem.Flux, F: konst(0)} }

// The classical mixed-condition singularity benchmark (value 0 on the left
// half of the bottom of a 2 x 1 rectangle, the right half insulated, 500
// on the right side, the rest insulated). Its singular coefficients, from
// Motz (Quart. Appl. Math. 1946), Rosser & Papamichael (1975) and Li,
// Mathon & Sermer (SIAM J. Numer. Anal. 1987), recalled from memory as in
// package exact: d0 = 401.162453745, d1 = 87.6559201951. The field along
// the insulated half is d0 r^(1/2) + d1 r^(3/2) + ...: the engine's
// coefficients of r^(1/2) and r^(3/2) at the meeting are its family's.
// The field is also checked against the exact conformal-map solution.
func TestMixedMotz(t *testing.T) {
	ex, err := exact.New(2, 1, 1, 1, exact.Part{Side: problem.Bottom, From: 0, To: 1},
		exact.Part{Side: problem.Right, From: 0, To: 1}, 0, 500)
	if err != nil {
		t.Fatal(err)
	}
	pr := &problem.Problem{W: 2, H: 1, Kx: 1, Ky: 1}
	pr.Edges[problem.Bottom] = partsEdge([]float64{1}, []float64{0, 0}, []bool{true, false})
	pr.Edges[problem.Right] = problem.Edge{Kind: problem.Value, F: konst(500)}
	pr.Edges[problem.Top], pr.Edges[problem.Left] = insulatedEdge(), insulatedEdge()
	f := solveForTest(t, pr)
	mf := f.(*mixedField)
	fm := mf.ms.edges[0].fam
	// u = x_0 ((s - 1)/half)^(1/2) + x_1 ((s - 1)/half)^(3/2) + smooth
	d0 := mf.x[mf.ms.edges[0].famOff] / math.Sqrt(fm.half)
	d1 := mf.x[mf.ms.edges[0].famOff+1] / math.Pow(fm.half, 1.5)
	t.Logf("d0 %.12g (published 401.162453745), d1 %.12g (87.6559201951), estimate %.3g", d0, d1, f.ErrorEstimate())
	if math.Abs(d0/401.162453745-1) > 1e-6 {
		t.Errorf("d0 = %.12g, published 401.162453745", d0)
	}
	if math.Abs(d1/87.6559201951-1) > 1e-4 {
		t.Errorf("d1 = %.12g, published 87.6559201951", d1)
	}
	worst, near := 0.0, 0.0
	for _, xy := range [][2]float64{{0.5, 0.5}, {1.5, 0.2}, {0.2, 0.9}, {1.9, 0.99}, {1, 0.3}} {
		u, _, _ := f.At(xy[0], xy[1])
		worst = max(worst, math.Abs(u-ex.Value(xy[0], xy[1])))
	}
	// next to the meeting, on both sides and above it
	for _, xy := range [][2]float64{{1.001, 0}, {0.999, 0.001}, {1, 0.0005}, {1.02, 0}} {
		u, _, _ := f.At(xy[0], xy[1])
		near = max(near, math.Abs(u-ex.Value(xy[0], xy[1])))
	}
	t.Logf("worst value error %.3g away, %.3g next to the meeting; estimate %.3g", worst, near, f.ErrorEstimate())
	if max(worst, near) > 1e-6*500 || max(worst, near) > f.ErrorEstimate() {
		t.Errorf("value errors %.3g away and %.3g near the meeting; estimate %.3g", worst, near, f.ErrorEstimate())
	}
	parts := PartsOf(f, pr, problem.Bottom)
	want := ex.FlowThrough(problem.Bottom, 0, 1)
	if math.Abs(parts[0].Flow-want) > 1e-6*math.Abs(want) || math.Abs(parts[1].Flow) > 1e-6*math.Abs(want) {
		t.Errorf("bottom parts flow %.12g and %.12g; exact %.12g and 0", parts[0].Flow, parts[1].Flow, want)
	}
	if m, w := parts[1].Mean, ex.MeanAlong(problem.Bottom, 1, 2); math.Abs(m-w) > 1e-6*500 {
		t.Errorf("mean along the insulated half %.12g, exact %.12g", m, w)
	}
}

// Orthotropic strips on two different edges (bottom and left), by the
// coordinate map of the exact solution (package exact).
func TestMixedOrthotropicStrips(t *testing.T) {
	const W, H, kx, ky = 2.0, 1.0, 4.0, 1.0
	ex, err := exact.New(W, H, kx, ky, exact.Part{Side: problem.Bottom, From: 0.8, To: 1.5},
		exact.Part{Side: problem.Left, From: 0.3, To: 0.7}, 10, 30)
	if err != nil {
		t.Fatal(err)
	}
	pr := &problem.Problem{W: W, H: H, Kx: kx, Ky: ky}
	pr.Edges[problem.Bottom] = partsEdge([]float64{0.8, 1.5}, []float64{0, 10, 0}, []bool{false, true, false})
	pr.Edges[problem.Left] = partsEdge([]float64{0.3, 0.7}, []float64{0, 30, 0}, []bool{false, true, false})
	pr.Edges[problem.Top], pr.Edges[problem.Right] = insulatedEdge(), insulatedEdge()
	f := solveForTest(t, pr)
	worst := 0.0
	for _, xy := range [][2]float64{{0.5, 0.5}, {1.5, 0.2}, {0.2, 0.9}, {1.9, 0.99}, {0.01, 0.5}, {1.2, 0.001}} {
		u, _, _ := f.At(xy[0], xy[1])
		worst = max(worst, math.Abs(u-ex.Value(xy[0], xy[1])))
	}
	left := PartsOf(f, pr, problem.Left)
	want := ex.FlowThrough(problem.Left, 0.3, 0.7)
	t.Logf("worst value error %.3g (estimate %.3g); left strip flow %.12g, exact %.12g", worst, f.ErrorEstimate(), left[1].Flow, want)
	if worst > 1e-6*20 || worst > f.ErrorEstimate() {
		t.Errorf("worst value error %.3g, estimate %.3g", worst, f.ErrorEstimate())
	}
	if math.Abs(left[1].Flow-want) > 1e-6*math.Abs(want) {
		t.Errorf("left strip flow %.12g, exact %.12g", left[1].Flow, want)
	}
}

// A convection part with a very large h holds its ambient: the two-strip
// case with the top strip exchanging with h = 1e6 (Biot h l / k = 4e5)
// gives the strip's flow of the value-strip case (exact, package exact)
// to the order of k/(h l), both written as a part and as an h that steps
// along a one-condition convection edge.
func TestMixedLargeH(t *testing.T) {
	const W, H, h = 1.0, 0.6, 1e6
	ex, err := exact.New(W, H, 1, 1, exact.Part{Side: problem.Bottom, From: 0.2, To: 0.5},
		exact.Part{Side: problem.Top, From: 0.3, To: 0.7}, 0, 1)
	if err != nil {
		t.Fatal(err)
	}
	want := ex.FlowThrough(problem.Top, 0.3, 0.7)
	conv := problem.Part{Kind: problem.Convection, F: konst(1), Hc: konst(h)}
	asPart := partsEdge([]float64{0.3, 0.7}, []float64{0, 0, 0}, []bool{false, false, false})
	asPart.Parts[1] = conv
	asPart.Parts[1].To = 0.7
	stepH := problem.Edge{Kind: problem.Convection, F: konst(1), Parts: []problem.Part{{Kind: problem.Convection, F: konst(1),
		Hc: func(s float64) float64 {
			if s > 0.3 && s < 0.7 {
				return h
			}
			return 0
		}}}}
	for _, c := range []struct {
		name string
		top  problem.Edge
	}{{"part", asPart}, {"h step", stepH}} {
		pr := &problem.Problem{W: W, H: H, Kx: 1, Ky: 1}
		pr.Edges[problem.Bottom] = partsEdge([]float64{0.2, 0.5}, []float64{0, 0, 0}, []bool{false, true, false})
		pr.Edges[problem.Top] = c.top
		pr.Edges[problem.Left], pr.Edges[problem.Right] = insulatedEdge(), insulatedEdge()
		f := solveForTest(t, pr)
		bottom := PartsOf(f, pr, problem.Bottom)
		got := -bottom[1].Flow
		rel := math.Abs(got-want) / want
		t.Logf("%s: flow %.12g, value strip %.12g, relative %.2g (k/(h l) = %.2g); estimate %.3g", c.name, got, want, rel, 1/(h*0.4), f.ErrorEstimate())
		if rel > 10/(h*0.4) {
			t.Errorf("%s: flow %.12g, value strip %.12g (relative %.2g)", c.name, got, want, rel)
		}
	}
}

// benchMixedProblem: three segments on the top edge (two pools over an
// impervious floor) and mixed kinds elsewhere (a value edge, a convection
// edge, a flux edge).
func benchMixedProblem() *problem.Problem {
	pr := &problem.Problem{W: 30, H: 10, Kx: 1, Ky: 1}
	pr.Edges[problem.Top] = partsEdge([]float64{10, 20}, []float64{12, 0, 2}, []bool{true, false, true})
	pr.Edges[problem.Bottom] = insulatedEdge()
	pr.Edges[problem.Left] = problem.Edge{Kind: problem.Convection, F: konst(8), Hc: 0.5}
	pr.Edges[problem.Right] = problem.Edge{Kind: problem.Value, F: func(s float64) float64 { return 2 + 0.1*s }}
	return pr
}

// The full solve on a 513 x 513 grid (target: 50 ms natively): cold (the
// fit's responses solved) and warm (kept from the last solve of the same
// structure, as when only data values change).
func BenchmarkMixedSolve513(b *testing.B) {
	u, ux, uy := make([]float64, 513*513), make([]float64, 513*513), make([]float64, 513*513)
	for _, warm := range []bool{false, true} {
		name := "cold"
		if warm {
			name = "warm"
		}
		b.Run(name, func(b *testing.B) {
			for b.Loop() {
				if !warm {
					responses.put("", nil)
				}
				pr := benchMixedProblem()
				f := solveForTest(b, pr)
				f.Grid(512, 512, u, ux, uy)
			}
		})
	}
}

// Manufactured mixed edges: the exact harmonic field of
// TestManufacturedAllKinds (orthotropic by the coordinate map) gives every
// part its data (the value, the entering flux, or an ambient with h), so
// the exact field is smooth and every meeting's singular coefficients are
// zero. Random arrangements (seeded): one or two mixed edges with two to
// four parts of random kinds, h constant or stepping, the other edges of
// random kinds, every other case with a uniform source. The engine must
// give the field within its estimate and
// within 1e-6 of the field's range, and its part flows must add up to
// each edge's flow.
func TestMixedManufactured(t *testing.T) {
	const W, H, kx, ky = 1.3, 0.7, 2.0, 0.5
	c := math.Sqrt(kx / ky)
	source := 0.0 // set per case: u gains -source x^2 / (2 kx)
	exact := func(x, y float64) (u, ux, uy float64) {
		Y := c * y // harmonic in (x, c y): solves kx u_xx + ky u_yy = 0
		ex := math.Exp(x)
		u = x*x - Y*Y + 3*x*Y + 2 + ex*math.Sin(Y) - source*x*x/(2*kx)
		ux = 2*x + 3*Y + ex*math.Sin(Y) - source*x/kx
		uy = c * (-2*Y + 3*x + ex*math.Cos(Y))
		return
	}
	rnd := rand.New(rand.NewPCG(7, 11))
	cases := 24
	if raceOn {
		cases = 6
	}
	worst := 0.0
	for n := 0; n < cases; n++ {
		source = 0
		if n%2 == 1 {
			source = 3 // a uniform source: kx u_xx + ky u_yy = -3
		}
		pr := &problem.Problem{W: W, H: H, Kx: kx, Ky: ky, Source: source}
		data := func(side problem.Side, kind problem.Kind, h func(float64) float64) func(float64) float64 {
			return func(s float64) float64 {
				x, y := pr.Point(side, s)
				u, ux, uy := exact(x, y)
				in := Entering(pr, side, ux, uy)
				switch kind {
				case problem.Value:
					return u
				case problem.Flux:
					return in
				}
				return u + in/h(s) // entering = h (ambient - u)
			}
		}
		mixedSides := map[problem.Side]bool{problem.Side(rnd.IntN(4)): true}
		if rnd.IntN(2) == 0 {
			mixedSides[problem.Side(rnd.IntN(4))] = true
		}
		desc := ""
		for _, side := range problem.Sides {
			L := pr.Length(side)
			if !mixedSides[side] {
				kind := problem.Kind(rnd.IntN(3))
				hc := 0.5 + 5*rnd.Float64()
				pr.Edges[side] = problem.Edge{Kind: kind, Hc: hc, F: data(side, kind, konst(hc))}
				desc += fmt.Sprintf(" %v:%v", side, kind)
				continue
			}
			np := 2 + rnd.IntN(3)
			var e problem.Edge
			for i := 0; i < np; i++ {
				kind := problem.Kind(rnd.IntN(3))
				var h func(float64) float64
				if kind == problem.Convection {
					h0, h1, at := 0.5+5*rnd.Float64(), 0.5+5*rnd.Float64(), rnd.Float64()*L
					h = func(s float64) float64 {
						if s < at {
							return h0
						}
						return h1
					}
				}
				p := problem.Part{Kind: kind, F: data(side, kind, h), Hc: h, To: L * float64(i+1) / float64(np) * (0.9 + 0.1*rnd.Float64())}
				e.Parts = append(e.Parts, p)
				desc += fmt.Sprintf(" %v[%d]:%v", side, i, kind)
			}
			e.Kind, e.F = e.Parts[0].Kind, e.Parts[0].F
			pr.Edges[side] = e
		}
		breaks, err := FindBreaks(pr)
		if err != nil {
			t.Fatalf("case %d%s: %v", n, desc, err)
		}
		f, err := SolveBreaks(pr, breaks, Options{})
		if err != nil {
			t.Fatalf("case %d%s: %v", n, desc, err)
		}
		e, lo, hi, ex, ey := latticeError(f, exact, W, H, 12, 12)
		worst = max(worst, e/(hi-lo))
		if e > f.ErrorEstimate() || e > 1e-6*(hi-lo) {
			mf := f.(*mixedField)
			t.Errorf("case %d%s: error %.3g (%.2g of the range) at (%g, %g), estimate %.3g (fit %.3g)", n, desc, e, e/(hi-lo), ex, ey, f.ErrorEstimate(), mf.fit)
			for _, me := range mf.ms.edges {
				t.Logf("  %v meets %v logs %v spans %+v", me.side, me.meets, me.logs, me.spans)
			}
			for _, yy := range []float64{0.17, 0.174, 0.175, 0.176, 0.18} {
				u, _, _ := f.At(W, yy)
				w, _, _ := exact(W, yy)
				t.Logf("  y %g: %.3g", yy, u-w)
			}
		}
		for side := range mixedSides {
			q, fin := f.Flow(side)
			sum := 0.0
			for _, p := range PartsOf(f, pr, side) {
				sum += p.Flow
			}
			if fin && math.Abs(sum-q) > 1e-9*max(1, math.Abs(q)) {
				t.Errorf("case %d%s: %v parts sum to %.12g, edge flow %.12g", n, desc, side, sum, q)
			}
		}
	}
	t.Logf("worst error %.3g of the range over %d cases", worst, cases)
}

// The responses kept from the last mixed solve serve an edit of the data
// values alone, and give the same field as a solve from scratch; a change
// of structure (a part's end) does not reuse them.
func TestMixedResponsesKept(t *testing.T) {
	build := func(h1, to float64) *problem.Problem {
		pr := benchMixedProblem()
		pr.Edges[problem.Top] = partsEdge([]float64{to, 20}, []float64{h1, 0, 2}, []bool{true, false, true})
		return pr
	}
	at := func(f Field) [3]float64 {
		var v [3]float64
		for i, xy := range [][2]float64{{5, 5}, {15, 9.9}, {29, 1}} {
			v[i], _, _ = f.At(xy[0], xy[1])
		}
		return v
	}
	responses.put("", nil)
	solveForTest(t, build(12, 10)) // fills the cache
	kept := at(solveForTest(t, build(15, 10)))
	if responses.get(responses.key) == nil {
		t.Fatal("no responses kept")
	}
	key := responses.key
	responses.put("", nil)
	fresh := at(solveForTest(t, build(15, 10)))
	if responses.key != key {
		t.Errorf("the same structure gave another key")
	}
	for i := range kept {
		if math.Abs(kept[i]-fresh[i]) > 1e-12*15 {
			t.Errorf("point %d: %.15g with kept responses, %.15g from scratch", i, kept[i], fresh[i])
		}
	}
	solveForTest(t, build(15, 11))
	if responses.key == key {
		t.Errorf("a part that ends elsewhere kept the key")
	}
}

// The family's area integral, exact by its second antiderivative, agrees
// with graded quadrature on the manufactured-style arrangements: square-root
// members (meetings on the bottom and the left, orthotropic) and
// logarithmic ones (steps inside a run of flux and convection parts).
func TestFamilyArea(t *testing.T) {
	pr := &problem.Problem{W: 2, H: 1, Kx: 4, Ky: 1}
	pr.Edges[problem.Bottom] = partsEdge([]float64{0.8, 1.5}, []float64{0, 10, 0}, []bool{false, true, false})
	pr.Edges[problem.Left] = partsEdge([]float64{0.3, 0.7}, []float64{0, 30, 0}, []bool{false, true, false})
	right := problem.Edge{Kind: problem.Flux, F: konst(0), Parts: []problem.Part{
		{To: 0.4, Kind: problem.Flux, F: konst(1)},
		{Kind: problem.Convection, F: konst(3), Hc: konst(2)}}}
	pr.Edges[problem.Right] = right
	pr.Edges[problem.Top] = insulatedEdge()
	mf := solveForTest(t, pr).(*mixedField)
	exact, quad := mf.familyArea(), mf.familyAreaByQuadrature()
	t.Logf("family area %.15g exact, %.15g by quadrature", exact, quad)
	if math.Abs(exact-quad) > 1e-9*max(1, math.Abs(quad)) {
		t.Errorf("family area %.15g exact, %.15g by quadrature", exact, quad)
	}
}

// An edge of 24 parts (23 meetings, more than 64 singular functions): the
// solve stays a few hundred unknowns, panics nowhere, and the parts'
// flows add up to the edge's and balance the other edges.
func TestMixedManyParts(t *testing.T) {
	pr := &problem.Problem{W: 30, H: 10, Kx: 1, Ky: 1}
	var ends, values []float64
	var isValue []bool
	for i := 0; i < 24; i++ {
		if i < 23 {
			ends = append(ends, 30*float64(i+1)/24)
		}
		values = append(values, 10-0.3*float64(i))
		isValue = append(isValue, i%2 == 0)
	}
	pr.Edges[problem.Top] = partsEdge(ends, values, isValue)
	pr.Edges[problem.Bottom], pr.Edges[problem.Left], pr.Edges[problem.Right] = insulatedEdge(), insulatedEdge(), insulatedEdge()
	f := solveForTest(t, pr)
	if mf := f.(*mixedField); mf.ms.n > 3*mixedMaxUnknowns {
		t.Errorf("%d unknowns", mf.ms.n)
	}
	sum, in := 0.0, 0.0
	for _, p := range PartsOf(f, pr, problem.Top) {
		sum += p.Flow
		in += max(p.Flow, 0)
	}
	q, _ := f.Flow(problem.Top)
	if math.Abs(sum-q) > 1e-9*in || math.Abs(q) > 1e-6*in {
		t.Errorf("parts sum to %g, the edge's flow %g (inflow %g): the section must balance", sum, q, in)
	}
	t.Logf("24 parts: inflow %.6g, net %.3g, estimate %.3g", in, q, f.ErrorEstimate())
}

// A flux part that reaches a corner whose other edge holds a value, with
// an entering flux there that is not zero: the field goes like r ln r
// along the edge (the corner members of the family). Exact field (an
// identity): u = A F + S with, at the top right corner, w = (W - x) +
// i (H - y) and F = Re(w log w) + pi/2 Im(w), harmonic, zero along the
// whole right edge, r ln r along the top, its entering flux through the
// top -A pi/2 there; S a smooth harmonic polynomial. The top edge is a
// value part, then a flux part to the corner; the right edge holds S, the
// others u. Without the corner members the fit missed its tolerance by far
// (estimated 0.1 to 9 of the range on such edges; this field: not
// converged).
func TestMixedFluxReachesValueCorner(t *testing.T) {
	const W, H, A = 3.0, 1.0, 2.0
	for _, c := range []struct {
		at, kx, ky float64
		start      bool // the flux part at the edge's start, the field mirrored
	}{{1.2, 1, 1, false}, {2.4, 1, 1, false}, {1.2, 2, 0.5, false}, {1.2, 1, 1, true}, {2.4, 2, 0.5, true}} {
		at, m := c.at, math.Sqrt(c.kx/c.ky)
		// orthotropic: harmonic in (x, m y), so kx u_xx + ky u_yy = 0
		exactEnd := func(x, y float64) (u, ux, uy float64) {
			Y := m * y
			w := complex(W-x, m*H-Y)
			var g, dg complex128 // g = w log w - i pi/2 w, dg = g'
			if w != 0 {
				g = w*cmplx.Log(w) - complex(0, math.Pi/2)*w
				dg = cmplx.Log(w) + 1 - complex(0, math.Pi/2)
			}
			// dw/dx = -1, dw/dY = -i
			u = A*real(g) + 1 + 0.3*x*Y + 0.2*(x*x-Y*Y)
			ux = -A*real(dg) + 0.3*Y + 0.4*x
			uy = m * (A*imag(dg) + 0.3*x - 0.4*Y)
			return
		}
		exact := exactEnd
		if c.start {
			exact = func(x, y float64) (u, ux, uy float64) {
				u, ux, uy = exactEnd(W-x, y)
				return u, -ux, uy
			}
		}
		pr := &problem.Problem{W: W, H: H, Kx: c.kx, Ky: c.ky}
		data := func(side problem.Side, kind problem.Kind) func(float64) float64 {
			return func(s float64) float64 {
				x, y := pr.Point(side, s)
				u, ux, uy := exact(x, y)
				if kind == problem.Flux {
					return Entering(pr, side, ux, uy)
				}
				return u
			}
		}
		for _, side := range problem.Sides {
			pr.Edges[side] = problem.Edge{Kind: problem.Value, F: data(side, problem.Value)}
		}
		pr.Edges[problem.Bottom] = problem.Edge{Kind: problem.Flux, F: data(problem.Bottom, problem.Flux)}
		parts := []problem.Part{
			{To: at, Kind: problem.Value, F: data(problem.Top, problem.Value)},
			{Kind: problem.Flux, F: data(problem.Top, problem.Flux)},
		}
		if c.start {
			parts = []problem.Part{
				{To: W - at, Kind: problem.Flux, F: data(problem.Top, problem.Flux)},
				{Kind: problem.Value, F: data(problem.Top, problem.Value)},
			}
		}
		pr.Edges[problem.Top] = problem.Edge{Kind: parts[0].Kind, F: parts[0].F, Parts: parts}
		f := solveForTest(t, pr)
		worst, lo, hi, _, _ := latticeError(f, exact, W, H, 30, 10)
		notConverged := false
		for _, w := range f.Warnings() {
			notConverged = notConverged || w.Code == problem.NotConverged
		}
		// the flux part's flow (its data is linear along the edge: the
		// midpoint rule is exact) and the mean (a midpoint rule, fine
		// enough for r ln r), which take the corner members' conjugate and
		// area
		fp := 1
		if c.start {
			fp = 0
		}
		from, to := pr.Edges[problem.Top].PartRange(fp, W)
		want := data(problem.Top, problem.Flux)((from+to)/2) * (to - from)
		got := PartsOf(f, pr, problem.Top)[fp].Flow
		const n = 600
		mean := 0.0
		for i := 0; i < n; i++ {
			for j := 0; j < n/3; j++ {
				u, _, _ := exact(W*(float64(i)+0.5)/n, H*(float64(j)+0.5)/(n/3))
				mean += u / (n * n / 3)
			}
		}
		t.Logf("%+v: flux part's flow %.10g (exact %.10g), mean %.8g (midpoint rule %.8g)", c, got, want, f.Mean(), mean)
		if math.Abs(got-want) > 1e-7*math.Abs(want) {
			t.Errorf("%+v: the flux part's flow %.12g, exact %.12g", c, got, want)
		}
		if math.Abs(f.Mean()-mean) > 1e-5*(hi-lo) {
			t.Errorf("%+v: mean %.10g, by a midpoint rule %.10g", c, f.Mean(), mean)
		}
		t.Logf("%+v: worst error %.3g (%.2g of the range), estimate %.3g", c, worst, worst/(hi-lo), f.ErrorEstimate())
		if notConverged || worst > f.ErrorEstimate() || worst > 1e-5*(hi-lo) {
			t.Errorf("%+v: not converged %v, worst error %.3g (%.2g of the range), estimate %.3g", c, notConverged, worst, worst/(hi-lo), f.ErrorEstimate())
		}
	}
}

// latticeError compares f with exact on the (nx+1) x (ny+1) nodes of a
// lattice over the W x H rectangle: the largest difference, where it is,
// and the exact field's range there.
func latticeError(f Field, exact func(x, y float64) (u, ux, uy float64), W, H float64, nx, ny int) (worst, lo, hi, wx, wy float64) {
	lo, hi = math.Inf(1), math.Inf(-1)
	for i := 0; i <= nx; i++ {
		for j := 0; j <= ny; j++ {
			x, y := W*float64(i)/float64(nx), H*float64(j)/float64(ny)
			u, _, _ := f.At(x, y)
			w, _, _ := exact(x, y)
			lo, hi = min(lo, w), max(hi, w)
			if d := math.Abs(u - w); d > worst {
				worst, wx, wy = d, x, y
			}
		}
	}
	return worst, lo, hi, wx, wy
}
