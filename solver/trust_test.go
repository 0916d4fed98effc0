package solver

import (
	"encoding/json"
	"fmt"
	"math"
	"os"
	"strings"
	"testing"

	"edgewise/solver/physics"
	"edgewise/solver/problem"
	"edgewise/solver/project"
)

// Tests for results that must never be wrong with confidence: each case
// here was once solved to a wrong number, or refused with a message that
// did not name its cause.

// solveErr decodes and solves a project and returns the error of either.
func solveErr(text string) error {
	p, err := project.Decode([]byte(text))
	if err != nil {
		return err
	}
	var s Solver
	_, err = s.Solve(p, Options{NoCrossCheck: true})
	return err
}

// A pole between sample points is not a step: the data grow without
// bound there, and the solve is refused naming the edge's formula and the
// place (the pole of 1/(s - a) is at a; those of tan(1000 s) at odd
// multiples of pi/2000).
func TestPoleIsRefused(t *testing.T) {
	for _, tc := range []struct {
		expr string
		at   float64 // a pole; the error must name one
		step float64 // tan: poles every pi/1000
	}{
		{"1/(s - 0.0123456789)", 0.0123456789, 0},
		{"tan(1000*s)", math.Pi / 2000, math.Pi / 1000},
		{"5/sqrt(abs(s - 0.3))", 0.3, 0},
	} {
		err := solveErr(fmt.Sprintf(`{"schema":"edgewise/1","physics":"heat","width":1,"height":1,"conductivity":1,
		 "edges":{"bottom":{"kind":"value","expr":%q},"top":{"kind":"value","expr":"0"},
		 "left":{"kind":"value","expr":"0"},"right":{"kind":"flux","expr":"0"}}}`, tc.expr))
		if err == nil {
			t.Errorf("%s: solved, want a refusal", tc.expr)
			continue
		}
		msg := err.Error()
		var s float64
		if !strings.HasPrefix(msg, "edges.bottom.expr: grows without bound near s = ") {
			t.Errorf("%s: %q", tc.expr, msg)
			continue
		}
		fmt.Sscanf(strings.TrimPrefix(msg, "edges.bottom.expr: grows without bound near s = "), "%g", &s)
		d := s - tc.at
		if tc.step > 0 {
			d = math.Remainder(d, tc.step)
		}
		if math.Abs(d) > 1e-5 { // printed to 6 digits
			t.Errorf("%s: %q names s = %g, want a pole (at %g)", tc.expr, msg, s, tc.at)
		}
	}
	// a step is still a step
	if err := solveErr(`{"schema":"edgewise/1","physics":"heat","width":1,"height":1,"conductivity":1,
	 "edges":{"bottom":{"kind":"value","expr":"when(s < 0.5, 1e6, -3)"},"top":{"kind":"value","expr":"0"},
	 "left":{"kind":"value","expr":"0"},"right":{"kind":"flux","expr":"0"}}}`); err != nil {
		t.Errorf("a large step: %v", err)
	}
}

// The corner warnings give the user's values at the corner, also when
// an edge has a step inside it (the step's piece was once subtracted from
// the values printed: "from 0 to -50").
func TestCornerWarningWithInnerStep(t *testing.T) {
	_, out := mustSolve(t, `{"schema":"edgewise/1","physics":"heat","width":1,"height":1,"conductivity":1,
	 "edges":{"bottom":{"kind":"value","expr":"when(s < 0.5, 100, 0)"},"top":{"kind":"value","expr":"0"},
	 "left":{"kind":"value","expr":"50"},"right":{"kind":"value","expr":"0"}}}`, Options{NoCrossCheck: true})
	text := warningText(out.Result.Warnings, problem.CornerJump)
	for _, want := range []string{
		"bottom edge is infinite: the value jumps from 100 to 50 at the bottom-left corner",
		"left edge is infinite: the value jumps from 50 to 100 at the bottom-left corner",
		"left edge is infinite: the value jumps from 50 to 0 at the top-left corner",
	} {
		if !strings.Contains(text, want) {
			t.Errorf("corner warnings %q, want %q", text, want)
		}
	}
}

// Refused up front, naming the field and the range the engine handles.
func TestEngineRangesRefused(t *testing.T) {
	project := func(w, h, k, hc, val string) string {
		return fmt.Sprintf(`{"schema":"edgewise/1","physics":"heat","width":%s,"height":%s,"conductivity":%s,
		 "edges":{"bottom":{"kind":"value","expr":%q},"top":{"kind":"convection","h":%s,"ambient":"22"},
		 "left":{"kind":"flux","expr":"0"},"right":{"kind":"value","expr":"1"}}}`, w, h, k, val, hc)
	}
	for _, tc := range []struct {
		text, want string
	}{
		{project("1e300", "1e300", "1", "1", "1"), "width: 1e+300 is outside the range the engine handles: sizes from 1e-12 to 1e+12"},
		{project("1e-300", "1e-300", "1", "1", "1"), "width: 1e-300 is outside the range the engine handles: sizes from 1e-12 to 1e+12"},
		{project("1", "1", "1e-300", "1", "1"), "conductivity: 1e-300 is outside the range the engine handles: conductivities from 1e-30 to 1e+30"},
		{project("1", "1", "1", "1e300", "1"), "edges.top.h: 1e+300 gives a Biot number h L/k = 1e+300"},
		{project("1", "1", "1", "1", "1e308"), "edges.bottom.expr: 1e+308 at s = 0 is outside the range the engine handles (magnitude up to 1e+100)"},
		{project("1", "1", "1", "1", "1.7e308"), "edges.bottom.expr: 1.7e+308 at s = 0 is outside the range the engine handles"},
	} {
		err := solveErr(tc.text)
		if err == nil || !strings.HasPrefix(err.Error(), tc.want) || strings.Contains(err.Error(), "series:") || strings.Contains(err.Error(), "\n") {
			t.Errorf("got %v, want %q...", err, tc.want)
		}
	}
	// the edges of the ranges still solve
	if err := solveErr(project("1e-12", "1e-12", "1e30", "1", "1e100")); err != nil {
		t.Errorf("at the edges of the ranges: %v", err)
	}
}

// A series that stops at its limit says the limit (4096), not the terms
// it kept after dropping negligible ones (a cusp, sqrt|s - 1/2|, at the
// middle of a value edge between value edges, which no piece carries: its
// sine coefficients of even order vanish,
// and the last one, 4096, was dropped: "stopped at 4095 terms").
func TestTermLimitWarningSaysTheLimit(t *testing.T) {
	_, out := mustSolve(t, `{"schema":"edgewise/1","physics":"heat","width":1,"height":1,"conductivity":1,
	 "edges":{"bottom":{"kind":"value","expr":"sqrt(abs(s - 0.5))"},"top":{"kind":"value","expr":"0"},
	 "left":{"kind":"value","expr":"0.5"},"right":{"kind":"value","expr":"0.5"}}}`, Options{NoCrossCheck: true})
	text := warningText(out.Result.Warnings, problem.TermLimit)
	if text == "" || strings.Contains(text, "4095") || !strings.Contains(text, "stopped at 4096 terms") {
		t.Errorf("term-limit warnings %q", text)
	}
}

// All-flux problems: the result says that only differences are meaningful
// (mean-fixed), and the cross-check runs on a balanced problem whose own
// trapezoid rule does not balance (s^2 on 24 intervals overestimates its
// integral by about 1e-3): it was skipped as "unbalanced".
func TestAllFluxMeanFixedAndCrossChecked(t *testing.T) {
	_, out := mustSolve(t, `{"schema":"edgewise/1","physics":"generic","width":2,"height":1,"conductivity":3,
	 "edges":{"bottom":{"kind":"flux","expr":"s^2"},"top":{"kind":"flux","expr":"-4/3"},
	 "left":{"kind":"flux","expr":"0"},"right":{"kind":"convection","h":0,"ambient":"7"}}}`, Options{})
	r := out.Result
	if warningText(r.Warnings, problem.MeanFixed) == "" {
		t.Errorf("no mean-fixed warning: %+v", r.Warnings)
	}
	if math.Abs(r.Mean) > 1e-12 {
		t.Errorf("mean %g, want 0", r.Mean)
	}
	// the field's range is about 0.4 here; the finite differences on 24
	// x 12 and 48 x 24 intervals, extrapolated, agree to about 1e-4 of it
	if cc := r.Accuracy.Crosscheck; cc == nil || *cc > 1e-3 {
		t.Errorf("cross-check %v (%s)", cc, r.Accuracy.CrosscheckReason)
	}
	if !r.Accuracy.Converged {
		t.Errorf("not converged: %+v", r.Warnings)
	}
	// a problem with a value edge has no mean-fixed warning
	_, out = mustSolve(t, `{"schema":"edgewise/1","physics":"generic","width":2,"height":1,"conductivity":3,
	 "edges":{"bottom":{"kind":"flux","expr":"s^2"},"top":{"kind":"value","expr":"1"},
	 "left":{"kind":"flux","expr":"0"},"right":{"kind":"flux","expr":"0"}}}`, Options{NoCrossCheck: true})
	if w := warningText(out.Result.Warnings, problem.MeanFixed); w != "" {
		t.Errorf("mean-fixed with a value edge: %q", w)
	}
}

// With no source and no prescribed inflow the field lies within the range
// of its value and ambient data (the maximum principle). Where the series
// cannot hold that (huge Biot numbers, an ambient that steps a thousand
// times), the result is marked unconverged with a not-converged warning
// instead of headlining extremes far outside the data; a result that
// holds it is converged.
func TestMaximumPrincipleCheck(t *testing.T) {
	for _, tc := range []struct {
		name, edges string
		lo, hi      float64
	}{
		{"Biot 1.3e7", `"bottom":{"kind":"value","expr":"30"},"top":{"kind":"convection","h":1e9,"ambient":"22"},
		  "left":{"kind":"flux","expr":"0"},"right":{"kind":"value","expr":"30"}`, 22, 30},
		{"stepped ambient", `"bottom":{"kind":"convection","h":1e6,"ambient":"floor(1000*s)"},"top":{"kind":"convection","h":1e6,"ambient":"floor(1000*s)"},
		  "left":{"kind":"convection","h":1e6,"ambient":"floor(1000*s)"},"right":{"kind":"convection","h":1e6,"ambient":"floor(1000*s)"}`, 0, 199},
	} {
		if tc.name == "stepped ambient" && (raceEnabled || testing.Short()) {
			continue // 40 s of series at its term limit; runs without -race and -short
		}
		_, out := mustSolve(t, `{"schema":"edgewise/1","physics":"heat","width":0.2,"height":0.05,"conductivity":15,"edges":{`+tc.edges+`}}`,
			Options{NoCrossCheck: true, Nx: 20, Ny: 5})
		r := out.Result
		inside := r.Min.Value >= tc.lo-r.Accuracy.Estimate && r.Max.Value <= tc.hi+r.Accuracy.Estimate
		if r.Accuracy.Converged && !inside {
			t.Errorf("%s: converged with extremes %g .. %g outside %g .. %g (estimate %g)", tc.name, r.Min.Value, r.Max.Value, tc.lo, tc.hi, r.Accuracy.Estimate)
		}
		if !r.Accuracy.Converged && warningText(r.Warnings, problem.NotConverged) == "" {
			t.Errorf("%s: unconverged without a not-converged warning", tc.name)
		}
		if !r.Accuracy.Converged && !strings.Contains(string(r.JSON()), `"converged":false`) {
			t.Errorf("%s: the JSON does not say converged false", tc.name)
		}
		if tc.name == "Biot 1.3e7" {
			// where the bottom and right edges both prescribe 30 the field is
			// 30, also when the corner fit falls back to its last resort
			// (it once fitted nothing there: 1.5e-11)
			if u := out.U[out.Nx]; math.Abs(u-30) > 1e-9 {
				t.Errorf("%s: %g at the bottom-right corner, want 30", tc.name, u)
			}
		}
	}
	// an ordinary problem within its data: converged, no warning
	_, out := mustSolve(t, `{"schema":"edgewise/1","physics":"heat","width":0.2,"height":0.05,"conductivity":15,"edges":{
	 "bottom":{"kind":"value","expr":"30 + 10*sin(pi*s/W)"},"top":{"kind":"convection","h":25,"ambient":"22"},
	 "left":{"kind":"flux","expr":"0"},"right":{"kind":"value","expr":"30"}}}`, Options{NoCrossCheck: true})
	if r := out.Result; !r.Accuracy.Converged || r.Min.Value < 22 || r.Max.Value > 40 || warningText(r.Warnings, problem.NotConverged) != "" {
		t.Errorf("ordinary problem: converged %v, %g .. %g, %+v", r.Accuracy.Converged, r.Min.Value, r.Max.Value, r.Warnings)
	}
}

// The maximum-principle check itself: a field pushed outside its data
// range by more than the estimate is flagged.
func TestCheckConvergedFlagsOutOfRange(t *testing.T) {
	pr := &problem.Problem{W: 1, H: 1, Kx: 1, Ky: 1}
	for _, s := range problem.Sides {
		pr.Edges[s] = problem.Edge{Kind: problem.Value, F: problem.Const(10)}
	}
	pr.Edges[problem.Top] = problem.Edge{Kind: problem.Convection, Hc: 3, F: problem.Const(20)}
	for _, tc := range []struct {
		min, max, est float64
		want          bool
	}{
		{10, 20, 1e-9, true},
		{10 - 1e-10, 20, 1e-9, true}, // within twice the estimate
		{10, 20.5, 1e-9, false},
		{10, 20.5, 1, true}, // the estimate admits it
		{math.NaN(), 20, 1e-9, false},
	} {
		r := Result{Min: Extreme{Value: tc.min}, Max: Extreme{Value: tc.max}, Accuracy: Accuracy{Estimate: tc.est}}
		checkConverged(pr, &r)
		if r.Accuracy.Converged != tc.want {
			t.Errorf("%g .. %g, estimate %g: converged %v, want %v", tc.min, tc.max, tc.est, r.Accuracy.Converged, tc.want)
		}
	}
	// a prescribed inflow lifts the bound: no check
	pr.Edges[problem.Left] = problem.Edge{Kind: problem.Flux, F: problem.Const(1)}
	r := Result{Min: Extreme{Value: 10}, Max: Extreme{Value: 25}, Accuracy: Accuracy{Estimate: 1e-9}}
	if checkConverged(pr, &r); !r.Accuracy.Converged {
		t.Errorf("flagged although an inflow is prescribed")
	}
}

// Every edge convection with a tiny h: the exact answer is the ambient
// everywhere (20; exact identity: a uniform field meets every condition).
// It was 17.0068 at h = 1e-30 with an estimate of 2e-13, and the
// cross-check was skipped. With an ambient that varies, the level tends,
// as h -> 0, to the h-weighted mean of the ambients (the balance of the
// exchange: here 20 + (0.2^2/2)/0.5 = 20.04 on a 0.2 x 0.05 plate whose top
// ambient is 20 + s).
func TestTinyExchange(t *testing.T) {
	for _, tc := range []struct {
		h    float64
		top  string
		want float64
	}{
		{1e-30, "20", 20},
		{1e-50, "20", 20},
		{1e-12, "20", 20},
		{1e-30, "20 + s", 20.04},
		{1e-16, "20 + s", 20.04},
	} {
		_, out := mustSolve(t, fmt.Sprintf(`{"schema":"edgewise/1","physics":"heat","width":0.2,"height":0.05,"conductivity":15,
		 "edges":{"bottom":{"kind":"convection","h":%g,"ambient":"20"},"top":{"kind":"convection","h":%g,"ambient":%q},
		 "left":{"kind":"convection","h":%g,"ambient":"20"},"right":{"kind":"convection","h":%g,"ambient":"20"}},
		 "probes":[{"x":0.1,"y":0.025}]}`, tc.h, tc.h, tc.top, tc.h, tc.h), Options{})
		r := out.Result
		// tolerance: rounding of a level of 20 (the field varies by h L/k
		// times the ambients' variation, below 1e-30 here)
		for _, v := range []float64{r.Min.Value, r.Max.Value, r.Mean, r.Probes[0].Value} {
			if math.Abs(v-tc.want) > 1e-12 {
				t.Errorf("h %g, top %s: %v, want %g everywhere", tc.h, tc.top, v, tc.want)
			}
		}
		if r.Accuracy.Estimate > 1e-10 || !r.Accuracy.Converged {
			t.Errorf("h %g: estimate %g, converged %v", tc.h, r.Accuracy.Estimate, r.Accuracy.Converged)
		}
		if cc := r.Accuracy.Crosscheck; cc == nil || *cc > 1e-9 {
			t.Errorf("h %g: cross-check %v (%s)", tc.h, cc, r.Accuracy.CrosscheckReason)
		}
		if warningText(r.Warnings, problem.WeakExchange) == "" {
			t.Errorf("h %g: no weak-exchange warning in %+v", tc.h, r.Warnings)
		}
	}
}

// The published check cases (testdata/checks.json), which agree with
// their references, are all converged: the flag is kept for results that
// cannot be relied on, not raised by a pessimistic estimate.
func TestPublishedChecksConverged(t *testing.T) {
	data, err := os.ReadFile("../testdata/checks.json")
	if err != nil {
		t.Fatal(err)
	}
	var file struct {
		Cases []struct {
			ID      string          `json:"id"`
			Project json.RawMessage `json:"project"`
		} `json:"cases"`
	}
	if err := json.Unmarshal(data, &file); err != nil {
		t.Fatal(err)
	}
	if len(file.Cases) == 0 {
		t.Fatal("no cases")
	}
	for _, c := range file.Cases {
		_, out := mustSolve(t, string(c.Project), Options{NoCrossCheck: true, Nx: 16, Ny: 16})
		if !out.Result.Accuracy.Converged {
			t.Errorf("%s: not converged: %s", c.ID, warningText(out.Result.Warnings, problem.NotConverged))
		}
	}
}

// A result that did not converge gives no physics cautions: they would be
// computed from extremes the engine cannot stand behind (issue: a burn
// caution once came from a maximum of 4.2e5 on a field bounded by 999).
// The case is the strongly exchanging top edge of TestMaximumPrincipleCheck
// lifted into the burn range, where a converged result would caution.
func TestUnconvergedWithholdsCautions(t *testing.T) {
	_, out := mustSolve(t, `{"schema":"edgewise/1","physics":"heat","width":0.2,"height":0.05,"conductivity":15,"source":0,
	 "edges":{"bottom":{"kind":"value","expr":"90"},"right":{"kind":"value","expr":"90"},
	 "top":{"kind":"convection","h":1e9,"ambient":"82"},"left":{"kind":"flux","expr":"0"}}}`, Options{NoCrossCheck: true})
	r := out.Result
	if r.Accuracy.Converged {
		t.Fatalf("converged with estimate %g and extremes %g .. %g; the case was chosen because it does not", r.Accuracy.Estimate, r.Min.Value, r.Max.Value)
	}
	if len(r.Cautions) != 2 || r.Cautions[0] != CautionsWithheld || r.Cautions[1] != physics.Deferral {
		t.Errorf("cautions %q, want only the withheld note and the deferral", r.Cautions)
	}
	if r.Answers != nil || strings.Contains(string(r.JSON()), `"answers"`) {
		t.Errorf("derived answers given for an unconverged result")
	}
	// the same plate with a value top edge converges and cautions burns
	_, out = mustSolve(t, `{"schema":"edgewise/1","physics":"heat","width":0.2,"height":0.05,"conductivity":15,"source":0,
	 "edges":{"bottom":{"kind":"value","expr":"90"},"right":{"kind":"value","expr":"90"},
	 "top":{"kind":"value","expr":"82"},"left":{"kind":"flux","expr":"0"}}}`, Options{NoCrossCheck: true})
	if c := out.Result.Cautions; !out.Result.Accuracy.Converged || len(c) < 2 || c[0] == CautionsWithheld {
		t.Errorf("converged %v, cautions %q: want the physics' own cautions", out.Result.Accuracy.Converged, c)
	}
}

// Kinks written in the formula language are carried like steps: the flow
// through a flux edge with readings(s, 0, 0, 0.5, 8, 1, 2) is the integral
// of its data, 0.5 (0 + 8)/2 + 0.5 (8 + 2)/2 = 4.5, exact to rounding (it
// was off by 2e-6 relative when the quadrature did not split at the knot),
// and the value edge max(0, 40 (s - 0.25)) is met at its kink (the field
// there was 0.0023 where the data say 0).
func TestKinksInFormulas(t *testing.T) {
	_, out := mustSolve(t, `{"schema":"edgewise/1","physics":"heat","width":1,"height":1,"conductivity":2,
	 "edges":{"bottom":{"kind":"flux","expr":"readings(s, 0, 0, 0.5, 8, 1, 2)"},"top":{"kind":"value","expr":"max(0, 40*(s - 0.25))"},
	 "left":{"kind":"value","expr":"0"},"right":{"kind":"flux","expr":"10*abs(s - 0.3)"}},
	 "probes":[{"x":0.25,"y":1},{"x":0.6,"y":1}]}`, Options{NoCrossCheck: true})
	r := out.Result
	if q := r.Edges[problem.Bottom].Flow; q == nil || math.Abs(*q-4.5) > 1e-13 {
		t.Errorf("bottom flow %v, want 4.5", q)
	}
	// 10 |s - 0.3| over [0, 1]: 10 (0.3^2 + 0.7^2)/2 = 2.9
	if q := r.Edges[problem.Right].Flow; q == nil || math.Abs(*q-2.9) > 1e-13 {
		t.Errorf("right flow %v, want 2.9", q)
	}
	for i, want := range []float64{0, 14} {
		if d := math.Abs(r.Probes[i].Value - want); d > r.Accuracy.Estimate {
			t.Errorf("probe %d on the value edge: %.10g, data %g (estimate %.3g)", i, r.Probes[i].Value, want, r.Accuracy.Estimate)
		}
	}
	if text := warningText(r.Warnings, problem.TermLimit); text != "" {
		t.Errorf("kinks should not need the term limit: %s", text)
	}
}

// When the engine itself warns that it did not converge (here the fit of a
// mixed edge whose flux part is 2e-5 m long between two pools), the result
// says so: not converged, no derived answers, the cautions withheld.
func TestEngineNotConvergedIsNotConverged(t *testing.T) {
	p, err := project.Decode([]byte(`{"schema":"edgewise/1","physics":"seepage","width":30,"height":10,"conductivity":1e-5,
	 "edges":{"bottom":{"kind":"flux","expr":"0"},"left":{"kind":"flux","expr":"0"},"right":{"kind":"flux","expr":"0"},
	 "top":{"segments":[{"to":14.99999,"kind":"value","expr":"9"},{"to":15.00001,"kind":"flux","expr":"0"},{"kind":"value","expr":"2"}]}}}`))
	if err != nil {
		t.Fatal(err)
	}
	var s Solver
	out, err := s.Solve(p, Options{Nx: 30, Ny: 10, NoCrossCheck: true})
	if err != nil {
		t.Fatal(err)
	}
	r := out.Result
	warned := false
	for _, w := range r.Warnings {
		warned = warned || w.Code == problem.NotConverged
	}
	if !warned {
		t.Fatalf("no not-converged warning (estimate %.3g); the case no longer tests this", r.Accuracy.Estimate)
	}
	if r.Accuracy.Converged || r.Answers != nil || len(r.Cautions) == 0 || r.Cautions[0] != CautionsWithheld {
		t.Errorf("converged %v, answers %v, cautions %q", r.Accuracy.Converged, r.Answers != nil, r.Cautions)
	}
}
