package solver

import (
	"math"
	"testing"

	"edgewise/solver/internal/exact"
	"edgewise/solver/problem"
	"edgewise/solver/series"
)

// exactField is a series.Field that is an exact two-part field (package
// exact), standing in for the series in the cross-check.
type exactField struct {
	tp   *exact.TwoParts
	w, h float64
}

func (f exactField) At(x, y float64) (u, ux, uy float64) { return f.tp.At(x, y) }

// Grid fills u with the exact field at the nodes; at a part's end, the
// branch point of the exact map, it takes the value just inside the
// rectangle (the field is continuous there).
func (f exactField) Grid(nx, ny int, u, _, _ []float64) {
	for j := 0; j <= ny; j++ {
		for i := 0; i <= nx; i++ {
			x, y := float64(i)*f.w/float64(nx), float64(j)*f.h/float64(ny)
			v := f.tp.Value(x, y)
			if v-v != 0 {
				v = f.tp.Value(x+1e-9*(f.w/2-x), y+1e-9*(f.h/2-y))
			}
			u[j*(nx+1)+i] = v
		}
	}
}

func (f exactField) Flow(problem.Side) (float64, bool) { return 0, false }
func (f exactField) Mean() float64                     { return 0 }
func (f exactField) Terms() int                        { return 0 }
func (f exactField) ErrorEstimate() float64            { return 0 }
func (f exactField) Warnings() []problem.Warning       { return nil }

// The cross-check leaves out the neighbourhood of the points where a value
// part meets an insulated part (series.PartMeet), where the field goes
// like r^(1/2) and the finite differences are first order. On the
// classical singularity benchmark (value 0 on the left half of the bottom
// of a 2 x 1 rectangle, 500 on the right side, the rest insulated; exact
// field from package exact, the Schwarz-Christoffel solution of any
// complex-analysis text, written there from memory) the difference
// reported must be smaller than with the meeting point counted as an
// ordinary place, and below 2% of the 500 between the values (observed
// 0.65% with the point left out, 1.4% with it; what is left is the finite
// differences' first-order pollution of the whole field).
func TestCrossCheckSkipsPartMeetings(t *testing.T) {
	tp, err := exact.New(2, 1, 1, 1,
		exact.Part{Side: problem.Bottom, From: 0, To: 1},
		exact.Part{Side: problem.Right, From: 0, To: 1}, 0, 500)
	if err != nil {
		t.Fatal(err)
	}
	pr := &problem.Problem{W: 2, H: 1, Kx: 1, Ky: 1}
	pr.Edges[problem.Right] = problem.Edge{Kind: problem.Value, F: problem.Const(500)}
	pr.Edges[problem.Top] = problem.Edge{Kind: problem.Flux, F: problem.Const(0)}
	pr.Edges[problem.Left] = problem.Edge{Kind: problem.Flux, F: problem.Const(0)}
	bottom := problem.Edge{Kind: problem.Value, Parts: []problem.Part{
		{To: 1, Kind: problem.Value, F: problem.Const(0)},
		{Kind: problem.Flux, F: problem.Const(0)},
	}}
	bottom.F = func(s float64) float64 { return bottom.Parts[bottom.PartAt(s)].F(s) }
	pr.Edges[problem.Bottom] = bottom
	breaks, err := series.FindBreaks(pr)
	if err != nil {
		t.Fatal(err)
	}
	var meets, plain []series.Break
	for _, b := range breaks {
		if b.Class == series.PartMeet {
			meets = append(meets, b)
			b.Class = series.FluxBreak // an ordinary place for the comparison
		}
		plain = append(plain, b)
	}
	if len(meets) != 1 || meets[0].Side != problem.Bottom || math.Abs(meets[0].S-1) > 1e-12 {
		t.Fatalf("breaks %v, want one part meeting at s = 1 on the bottom", breaks)
	}
	f := exactField{tp: tp, w: 2, h: 1}
	var with, without Result
	crossCheck(pr, f, &with, breaks)
	crossCheck(pr, f, &without, plain)
	if with.Accuracy.Crosscheck == nil || without.Accuracy.Crosscheck == nil {
		t.Fatalf("cross-check skipped: %q, %q", with.Accuracy.CrosscheckReason, without.Accuracy.CrosscheckReason)
	}
	got, all := *with.Accuracy.Crosscheck, *without.Accuracy.Crosscheck
	if !(got < all) || got > 0.02*500 {
		t.Errorf("cross-check difference %.4g with the meeting point left out, %.4g with it; want the first smaller and below 10", got, all)
	}
	t.Logf("difference %.4g with the meeting point left out, %.4g with it", got, all)
}
