package solver

import (
	"math"
	"strings"
	"testing"

	"edgewise/solver/problem"
	"edgewise/solver/project"
	"edgewise/solver/series"
)

// valueBreaks returns the value breaks inside p's edges.
func valueBreaks(t *testing.T, p *problem.Problem) []series.Break {
	t.Helper()
	all, err := series.FindBreaks(p)
	if err != nil {
		t.Fatal(err)
	}
	var out []series.Break
	for _, b := range all {
		if b.Class == series.ValueBreak {
			out = append(out, b)
		}
	}
	return out
}

// warningText joins the texts of the warnings with the given code.
func warningText(list []problem.Warning, code problem.Code) string {
	var texts []string
	for _, w := range list {
		if w.Code == code {
			texts = append(texts, w.Text)
		}
	}
	return strings.Join(texts, "\n")
}

func TestFindBreaks(t *testing.T) {
	p := &problem.Problem{W: 12, H: 4, Kx: 1, Ky: 1}
	for _, s := range problem.Sides {
		p.Edges[s] = problem.Edge{Kind: problem.Value, F: problem.Const(0)}
	}
	compile := func(src string) func(float64) float64 {
		f, err := project.CompileFormula(src, "test", func(s float64) (float64, float64) { return s, 4 }, 12, 4)
		if err != nil {
			t.Fatal(err)
		}
		return f
	}
	tests := []struct {
		formula string
		want    []float64 // places of the jumps on the top edge
	}{
		{"when(s < 6, 8, 2)", []float64{6}},
		{"when(s < 2.5, 1, s < 7.25, 3, 0)", []float64{2.5, 7.25}},
		{"8 - 6*rise(s, 6, 0.1)", nil},          // steep but smooth
		{"8 - 6*rise(s, 6, 1e-6)", nil},         // very steep, still smooth
		{"5 + sin(pi*s/W)", nil},                // smooth
		{"readings(s, 0, 1, 6, 3, 12, 0)", nil}, // kinks are not jumps
		{"when(s < 12, 1, 5)", nil},             // at the corner: the engine's business
		{"floor(s/4)", []float64{4, 8}},
		// not poles: a bounded peak, steep but finite growth, an
		// oscillation, a large step
		{"100*exp(-((s - 6.0001)/0.003)^2)", nil},
		{"1/(s + 1e-3)", nil},
		{"1e3*sin(200*s)", nil},
		{"when(s < 6, 1e8, -1e8)", []float64{6}},
	}
	for _, tc := range tests {
		p.Edges[problem.Top].F = compile(tc.formula)
		got := valueBreaks(t, p)
		if len(got) != len(tc.want) {
			t.Errorf("%s: jumps %+v, want at %v", tc.formula, got, tc.want)
			continue
		}
		for _, w := range tc.want {
			found := false
			for _, j := range got {
				found = found || (j.Side == problem.Top && j.S > w-1e-9 && j.S < w+1e-9)
			}
			if !found {
				t.Errorf("%s: jumps %+v, want one at s = %g", tc.formula, got, w)
			}
		}
	}
}

// A step inside a value edge makes that edge's flow infinite; the result
// says so, suggests a smooth step, and leaves the balance out.
func TestJumpInsideEdgeInResult(t *testing.T) {
	p, out := mustSolve(t, `{"schema":"edgewise/1","physics":"seepage","width":12,"height":4,"conductivity":1e-5,
	 "edges":{"bottom":{"kind":"flux","expr":"0"},"top":{"kind":"value","expr":"when(s < 6, 8, 2)"},
	 "left":{"kind":"flux","expr":"0"},"right":{"kind":"flux","expr":"0"}}}`, Options{})
	r := out.Result
	if r.Edges[problem.Top].Finite || r.Edges[problem.Top].Flow != nil || r.Balance != nil {
		t.Errorf("top flow %+v, balance %v: want infinite and no balance", r.Edges[problem.Top], r.Balance)
	}
	w := warningText(r.Warnings, problem.StepJump)
	if !strings.Contains(w, "jumps from 8 to 2 at s = 6") || !strings.Contains(w, "8 + (-6)*rise(s, 6, 0.12)") {
		t.Errorf("warnings %q", r.Warnings)
	}
	// the suggested formula is itself valid and smooth
	p.Edges[problem.Top].Segments[0].Expr = "8 + (-6)*rise(s, 6, 0.12)"
	var s Solver
	out, err := s.Solve(p, Options{})
	if err != nil {
		t.Fatal(err)
	}
	if !out.Result.Edges[problem.Top].Finite || out.Result.Balance == nil {
		t.Errorf("smoothed step: top %+v balance %v", out.Result.Edges[problem.Top], out.Result.Balance)
	}
}

// The exit-gradient caution looks at every place where water leaves
// through a value edge, also when the edge as a whole takes water in (a
// head that falls along the top edge: in at the high end, out at the low).
func TestExitGradientWhereWaterLeaves(t *testing.T) {
	_, out := mustSolve(t, `{"schema":"edgewise/1","physics":"seepage","width":12,"height":4,"conductivity":1e-5,
	 "edges":{"bottom":{"kind":"flux","expr":"0"},"top":{"kind":"value","expr":"8 - 6*rise(s, 6, 1)"},
	 "left":{"kind":"flux","expr":"0"},"right":{"kind":"flux","expr":"0"}}}`, Options{})
	c := strings.Join(out.Result.Cautions, "\n")
	if !strings.Contains(c, "Exit gradient") || !strings.Contains(c, "top edge") {
		t.Fatalf("cautions %q, want an exit gradient on the top edge", out.Result.Cautions)
	}
	// water leaves on the low side (x > 6); the reported place is there
	g, x, _, found := exitGradient(&problem.Problem{W: 12, H: 4, Kx: 1e-5, Ky: 1e-5}, out, problem.Top)
	if !found || x <= 6 || g <= 0 {
		t.Errorf("exit gradient %g at x = %g, want on the low side x > 6", g, x)
	}
}

// A step of flux on a flux edge (a heater strip written with when(...)):
// the series integrates the data piece by piece, so the flows balance
// (conservation, an exact identity) to the engine's tolerance, where one
// Gauss rule across the step left 2e-4 of the total flow (a fixed bug
// found by FuzzSolve).
func TestFluxStepBalances(t *testing.T) {
	_, out := mustSolve(t, `{"schema":"edgewise/1","physics":"heat","width":0.3,"height":0.2,"conductivity":{"x":150,"y":50},
	 "edges":{"bottom":{"kind":"flux","expr":"when(0.1 <= s <= 0.17, 3000, 0)"},"top":{"kind":"convection","h":12,"ambient":"when(s < 0.2, 20, 30)"},
	 "left":{"kind":"value","expr":"readings(s, 0, 1, 0.05, 0.4, 0.1, 3)"},"right":{"kind":"flux","expr":"when(s < W/2, 0.43, 0)"}}}`, Options{NoCrossCheck: true})
	r := out.Result
	if r.Balance == nil {
		t.Fatalf("no balance: %+v", r.Edges)
	}
	// the heater strip puts in exactly 3000 x 0.07 = 210 W/m
	if q := *r.Edges[problem.Bottom].Flow; math.Abs(q-210) > 1e-9*210 {
		t.Errorf("bottom flow %.12g, want 210", q)
	}
	total := math.Abs(*r.Edges[problem.Bottom].Flow) + math.Abs(*r.Edges[problem.Top].Flow) + math.Abs(*r.Edges[problem.Left].Flow) + math.Abs(*r.Edges[problem.Right].Flow)
	if math.Abs(*r.Balance) > 1e-7*total {
		t.Errorf("balance %.3g of total flow %.3g", *r.Balance, total)
	}
}

// An all-flux problem with a step of flux keeps the documented rule for its
// free level: the area mean of u is zero (the series and the finite
// differences both use it), also with the step carried by a piece.
func TestFluxStepAllFluxKeepsMeanZero(t *testing.T) {
	_, out := mustSolve(t, `{"schema":"edgewise/1","physics":"generic","width":2,"height":1,"conductivity":3,
	 "edges":{"bottom":{"kind":"flux","expr":"when(0.5 <= s <= 1, 4, 0)"},"top":{"kind":"flux","expr":"-1"},
	 "left":{"kind":"flux","expr":"0"},"right":{"kind":"convection","h":0,"ambient":"7"}}}`, Options{})
	// the strip puts 4 x 0.5 = 2 in, the top takes 1 x 2 = 2 out: balanced
	if m := out.Result.Mean; math.Abs(m) > 1e-9 {
		t.Errorf("area mean %g, want 0", m)
	}
	// and the grid agrees: trapezoid mean of the output field
	nx, ny := out.Nx, out.Ny
	sum := 0.0
	for j := 0; j <= ny; j++ {
		for i := 0; i <= nx; i++ {
			w := 1.0
			if i == 0 || i == nx {
				w /= 2
			}
			if j == 0 || j == ny {
				w /= 2
			}
			sum += w * out.U[j*(nx+1)+i]
		}
	}
	// tolerance: the trapezoid rule on a 200 x 100 grid errs by about
	// h^2 times the curvature, below 1e-4 here
	if m := sum / float64(nx*ny); math.Abs(m) > 1e-4 {
		t.Errorf("grid mean %g, want 0", m)
	}
	if cc := out.Result.Accuracy.Crosscheck; cc == nil || *cc > 1e-2 {
		t.Errorf("cross-check %v (%s)", cc, out.Result.Accuracy.CrosscheckReason)
	}
}
