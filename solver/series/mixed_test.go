package series

import (
	"math"
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
	breaks, err := FindBreaks(pr)
	if err != nil {
		t.Fatal(err)
	}
	f, err := SolveBreaks(pr, breaks, Options{})
	if err != nil {
		t.Fatal(err)
	}
	worst := 0.0
	for _, xy := range [][2]float64{{0.5, 0.3}, {0.1, 0.1}, {0.9, 0.5}, {0.35, 0.05}, {0.5, 0.59}, {0.25, 0.0}} {
		u, _, _ := f.At(xy[0], xy[1])
		worst = max(worst, math.Abs(u-ex.Value(xy[0], xy[1])))
	}
	t.Logf("worst value error %.3g, estimate %.3g, terms %d", worst, f.ErrorEstimate(), f.Terms())
	if worst > 1e-5 || worst > f.ErrorEstimate() {
		t.Errorf("worst value error %.3g (estimate %.3g)", worst, f.ErrorEstimate())
	}
	parts := PartsOf(f, pr, problem.Top)
	want := ex.FlowThrough(problem.Top, 0.3, 0.7)
	t.Logf("top strip flow %.12g, exact %.12g, conductance %.12g", parts[1].Flow, want, ex.Conductance())
	if math.Abs(parts[1].Flow-want) > 1e-5*math.Abs(want) {
		t.Errorf("top strip flow %.12g, exact %.12g", parts[1].Flow, want)
	}
	for _, w := range f.Warnings() {
		t.Logf("warning %s: %s", w.Code, w.Text)
	}
}
