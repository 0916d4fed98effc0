package solver

import (
	"math"
	"slices"
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

// On smooth data the cross-check confirms the series' estimate: over all
// 81 combinations of edge kinds, on a square and on a 3:1 orthotropic
// plate with a source, its difference from the series lies within
// confirmWithin times the estimate, the verdict says so, and the
// difference is the series' true error or less than 100 times it plus
// the check's own resolution (measured: median check/true error and
// worst estimate/true error in the log).
func TestCrossCheckConfirmsOnSmoothData(t *testing.T) {
	if raceEnabled {
		t.Skip("runs without -race in make test-sweep")
	}
	var ratios, fdRatios []float64
	worstOver := 0.0
	for _, geo := range []struct {
		w, h float64
		e    exact.Smooth
		hc   float64
	}{
		{1, 1, exact.Smooth{Kx: 1, Ky: 1, Src: 0, A: 1.2}, 3},
		{3, 1, exact.Smooth{Kx: 2, Ky: 0.5, Src: 4, A: 0.5}, 0.7},
	} {
		for c := 0; c < 81; c++ {
			var kinds [4]problem.Kind
			for i, v := 0, c; i < 4; i, v = i+1, v/3 {
				kinds[i] = problem.Kind(v % 3)
			}
			pr := geo.e.Problem(geo.w, geo.h, kinds, geo.hc)
			f, err := solveSeries(pr)
			if err != nil {
				t.Fatalf("%v: %v", kinds, err)
			}
			var r Result
			breaks, _ := series.FindBreaks(pr)
			crossCheck(pr, f, &r, breaks)
			a := r.Accuracy
			if a.Crosscheck == nil {
				t.Errorf("%v: skipped: %s", kinds, a.CrosscheckReason)
				continue
			}
			// the series' true error at the compared nodes (all-flux
			// fields are compared less their means: the series sets its
			// mean to 0)
			nx, ny := problem.Proportional(pr.W, pr.H, CrossCheckGrid)
			keep := compared(pr, nx, ny, breaks)
			shift := 0.0
			if kinds == [4]problem.Kind{problem.Flux, problem.Flux, problem.Flux, problem.Flux} {
				shift = geo.e.Mean(pr.W, pr.H)
			}
			trueErr := 0.0
			for j := 0; j <= ny; j++ {
				for i := 0; i <= nx; i++ {
					if !keep[j*(nx+1)+i] {
						continue
					}
					x, y := pr.W*float64(i)/float64(nx), pr.H*float64(j)/float64(ny)
					u, _, _ := f.At(x, y)
					trueErr = max(trueErr, math.Abs(u-(geo.e.U(x, y)-shift)))
				}
			}
			est := f.ErrorEstimate()
			if a.CrosscheckVerdict != VerdictConfirms || *a.Crosscheck > confirmWithin*est {
				t.Errorf("%v %gx%g: check %.3g (%s, resolution %.2g), estimate %.3g, true error %.3g: verdict %q",
					kinds, pr.W, pr.H, *a.Crosscheck, a.CrosscheckGrid, *a.CrosscheckResolution, est, trueErr, a.CrosscheckVerdict)
			}
			if *a.Crosscheck > 100*trueErr+*a.CrosscheckResolution {
				t.Errorf("%v: check %.3g against true error %.3g: the check measures itself", kinds, *a.Crosscheck, trueErr)
			}
			ratios = append(ratios, *a.Crosscheck/max(trueErr, 1e-300))
			// what the finite differences alone would have said
			sum := make([]float64, (nx+1)*(ny+1))
			f.Grid(nx, ny, sum, nil, nil)
			if fd, err := fdCheck(pr, nx, ny, sum, keep); err == nil {
				fdRatios = append(fdRatios, fd.diff/max(trueErr, 1e-300))
			}
			worstOver = max(worstOver, trueErr/est)
		}
	}
	slices.Sort(ratios)
	slices.Sort(fdRatios)
	t.Logf("%d cases: check/true error median %.3g, largest %.3g (finite differences alone: median %.3g); true error/estimate largest %.3g",
		len(ratios), ratios[len(ratios)/2], ratios[len(ratios)-1], fdRatios[len(fdRatios)/2], worstOver)
	if !(ratios[len(ratios)/2] < fdRatios[len(fdRatios)/2]/10) {
		t.Errorf("the check's median ratio to the true error %.3g is not ten times better than the finite differences' %.3g", ratios[len(ratios)/2], fdRatios[len(fdRatios)/2])
	}
}

// The cross-check's cost next to the series solve it checks (the solve
// and the page's default grid): a smooth problem (spectral only) and one
// with corners whose conditions disagree (spectral twice, then finite
// differences).
func BenchmarkCrossCheck(b *testing.B) {
	kinds := [4]problem.Kind{problem.Value, problem.Convection, problem.Flux, problem.Convection}
	for _, c := range []struct {
		name string
		pr   *problem.Problem
	}{
		{"smooth", exact.Smooth{Kx: 1, Ky: 1, Src: 1, A: 1}.Problem(2, 1, kinds, 3)},
		{"corners", sweepProblem(kinds)},
	} {
		f, err := solveSeries(c.pr)
		if err != nil {
			b.Fatal(err)
		}
		breaks, _ := series.FindBreaks(c.pr)
		// the series as the page runs it: the solve and the default grid
		nx, ny := problem.Proportional(c.pr.W, c.pr.H, DefaultGrid)
		u, ux, uy := make([]float64, (nx+1)*(ny+1)), make([]float64, (nx+1)*(ny+1)), make([]float64, (nx+1)*(ny+1))
		b.Run(c.name+"/series", func(b *testing.B) {
			for b.Loop() {
				f, err := solveSeries(c.pr)
				if err != nil {
					b.Fatal(err)
				}
				f.Grid(nx, ny, u, ux, uy)
			}
		})
		b.Run(c.name+"/crosscheck", func(b *testing.B) {
			for b.Loop() {
				var r Result
				crossCheck(c.pr, f, &r, breaks)
			}
		})
	}
}

// Where the data do not join smoothly at the corners (the 81 sweep
// problems: values that disagree at corners, varying fluxes and
// ambients), no independent solution resolves the field to the series'
// accuracy near the corners: the check must say it is limited and by
// what, never that the series is wrong (measured: all 81 limited, none
// confirms or differs; the spectral solution names the corner for most).
func TestCrossCheckSaysWhatLimitsIt(t *testing.T) {
	if raceEnabled {
		t.Skip("runs without -race in make test-sweep")
	}
	limits := map[string]int{}
	for c := 0; c < 81; c++ {
		var kinds [4]problem.Kind
		for i, v := 0, c; i < 4; i, v = i+1, v/3 {
			kinds[i] = problem.Kind(v % 3)
		}
		pr := sweepProblem(kinds)
		f, err := solveSeries(pr)
		if err != nil {
			t.Fatal(err)
		}
		var r Result
		breaks, _ := series.FindBreaks(pr)
		crossCheck(pr, f, &r, breaks)
		a := r.Accuracy
		switch {
		case a.Crosscheck == nil:
			t.Errorf("%v: skipped: %s", kinds, a.CrosscheckReason)
		case a.CrosscheckVerdict == VerdictDiffers || len(r.Warnings) > 0:
			t.Errorf("%v: %s by %.3g (resolution %.3g, estimate %.3g): %v", kinds, a.CrosscheckVerdict, *a.Crosscheck, *a.CrosscheckResolution, f.ErrorEstimate(), r.Warnings)
		case a.CrosscheckVerdict == VerdictLimited && a.CrosscheckLimit == "":
			t.Errorf("%v: limited, but not said by what", kinds)
		}
		limits[a.CrosscheckLimit]++
	}
	for what, n := range limits {
		t.Logf("%2d: %s", n, what)
	}
}
