package verify

import (
	"math"
	"os"
	"strings"
	"testing"

	"edgewise/solver"
	"edgewise/solver/jsonlite"
	"edgewise/solver/problem"
	"edgewise/solver/project"
)

// Every published case in the shared checks file passes. The expected
// values, their sources and tolerances are in testdata/checks.json.
func TestPublishedChecks(t *testing.T) {
	data, err := os.ReadFile("../../testdata/checks.json")
	if err != nil {
		t.Fatal(err)
	}
	f, err := Parse(data)
	if err != nil {
		t.Fatal(err)
	}
	var s solver.Solver
	for i := range f.Cases {
		c := &f.Cases[i]
		t.Run(c.ID, func(t *testing.T) {
			o := c.Run(&s)
			if o.Error != "" {
				t.Fatalf("%s: %s", c.Source, o.Error)
			}
			if !o.Pass {
				t.Errorf("%s: computed %.10g, expected %.10g (%s), difference %.3g > tol %g",
					c.Title, *o.Computed, *o.Expected, c.Source, *o.Difference, c.Tol)
			}
		})
	}
}

// The cases run by the checks panel are the ones of the test suite: the
// file holds every kind of published value the team relies on.
func TestChecksFileCoverage(t *testing.T) {
	data, err := os.ReadFile("../../testdata/checks.json")
	if err != nil {
		t.Fatal(err)
	}
	f, err := Parse(data)
	if err != nil {
		t.Fatal(err)
	}
	count := map[string]int{}
	for _, c := range f.Cases {
		count[c.Quantity.Formula]++
		if c.Basis != "exact" && !strings.ContainsAny(c.Source, "0123456789") {
			t.Errorf("%s: a published source should name its book and year or edition: %q", c.ID, c.Source)
		}
	}
	for _, formula := range formulas {
		if count[formula] == 0 && formula != "mean" {
			t.Errorf("no case uses %s", formula)
		}
	}
}

// square is a project the engine solves at every stage: a unit square with
// one edge (named) at 1, probes at (0.3, 0.5) and (0.5, 0.3).
func square(edge string) string {
	e := map[string]string{"bottom": "0", "top": "0", "left": "0", "right": "0"}
	e[edge] = "1"
	return `{"schema":"edgewise/1","physics":"generic","width":1,"height":1,"conductivity":1,
	 "edges":{"bottom":{"kind":"value","expr":"` + e["bottom"] + `"},"top":{"kind":"value","expr":"` + e["top"] + `"},
	 "left":{"kind":"value","expr":"` + e["left"] + `"},"right":{"kind":"value","expr":"` + e["right"] + `"}},
	 "probes":[{"x":0.3,"y":0.5,"label":"a"},{"x":0.5,"y":0.3,"label":"b"}]}`
}

func caseFile(body string) string {
	return `{"schema":"edgewise-checks/1","cases":[` + body + `]}`
}

// A reference case compares two solves; a wrong expectation fails.
func TestRun(t *testing.T) {
	// Exact identity: reflection in the diagonal x <-> y maps the top-edge
	// problem at (x, y) onto the right-edge problem at (y, x).
	text := caseFile(`{"id":"mirror","title":"reflection","source":"Exact identity: reflection in the diagonal","basis":"exact","kind":"identity",
	  "project":` + square("top") + `,"quantity":{"formula":"probe_value","probe":"a"},
	  "reference":{"project":` + square("right") + `,"quantity":{"formula":"probe_value","probe":"b"}},
	  "tol":1e-9,"tol_reason":"exact identity"},
	 {"id":"wrong","title":"a wrong expectation","source":"Exact identity: 1/4 at the centre, here mistyped as 0.3","basis":"exact","kind":"identity",
	  "project":` + strings.Replace(square("top"), `"x":0.3,"y":0.5`, `"x":0.5,"y":0.5`, 1) + `,"quantity":{"formula":"probe_value","probe":"a"},
	  "expect":0.3,"tol":1e-9,"tol_reason":"exact identity"},
	 {"id":"precondition","title":"torsion formula on a project that is not a torsion problem","source":"Exact identity","basis":"exact","kind":"identity",
	  "project":` + square("top") + `,"quantity":{"formula":"torsion_beta"},
	  "expect":0.141,"tol":1e-3,"tol_reason":"any"}`)
	f, err := Parse([]byte(text))
	if err != nil {
		t.Fatal(err)
	}
	var s solver.Solver
	o := f.Find("mirror").Run(&s)
	if !o.Pass || o.Error != "" || o.Computed == nil || *o.Computed < 0.1 {
		t.Errorf("mirror: %+v", o)
	}
	o = f.Find("wrong").Run(&s)
	if o.Pass || o.Difference == nil || math.Abs(*o.Difference+0.05) > 1e-9 {
		t.Errorf("wrong: %+v, want a failure by -0.05", o)
	}
	o = f.Find("precondition").Run(&s)
	if o.Pass || !strings.Contains(o.Error, "torsion_beta: needs source 2") {
		t.Errorf("precondition: %+v, want the precondition error", o)
	}
	// The outcome's JSON reads back with its numbers and its error.
	tree, err := jsonlite.Parse(o.JSON())
	if err != nil {
		t.Fatal(err)
	}
	m := tree.(map[string]any)
	if m["id"] != "precondition" || m["computed"] != nil || m["pass"] != false || !strings.Contains(m["error"].(string), "torsion_beta") {
		t.Errorf("outcome JSON %s", o.JSON())
	}
	o = f.Find("wrong").Run(&s)
	m = mustParse(t, o.JSON())
	if m["expected"] != jsonlite.Number("0.3") || m["computed"] == nil {
		t.Errorf("outcome JSON %s", o.JSON())
	}
	if f.Find("nothing") != nil {
		t.Errorf("Find found a case that is not there")
	}
}

func mustParse(t *testing.T, b []byte) map[string]any {
	t.Helper()
	tree, err := jsonlite.Parse(b)
	if err != nil {
		t.Fatal(err)
	}
	return tree.(map[string]any)
}

func TestParseErrors(t *testing.T) {
	good := `{"id":"a","title":"t","source":"s","basis":"exact","kind":"identity","project":{},"quantity":{"formula":"mean"},"expect":1,"tol":1,"tol_reason":"r"}`
	for _, c := range []struct{ name, text, want string }{
		{"not json", `{`, "checks:"},
		{"schema", `{"schema":"x","cases":[` + good + `]}`, `schema "x"`},
		{"no cases", caseFile(``), "no cases"},
		{"unknown key", caseFile(strings.Replace(good, `"id"`, `"extra":1,"id"`, 1)), "unknown field"},
		{"bad id", caseFile(strings.Replace(good, `"id":"a"`, `"id":"a b"`, 1)), "id must be"},
		{"repeated id", caseFile(good + "," + good), "repeated id"},
		{"no source", caseFile(strings.Replace(good, `"source":"s"`, `"source":" "`, 1)), "needs a title and a source"},
		{"basis", caseFile(strings.Replace(good, `"exact"`, `"guess"`, 1)), `basis "guess"`},
		{"kind", caseFile(strings.Replace(good, `"identity"`, `"hunch"`, 1)), `kind "hunch"`},
		{"both", caseFile(strings.Replace(good, `"expect":1`, `"expect":1,"reference":{"project":{},"quantity":{"formula":"mean"}}`, 1)), "exactly one"},
		{"neither", caseFile(strings.Replace(good, `"expect":1,`, ``, 1)), "exactly one"},
		{"tol", caseFile(strings.Replace(good, `"tol":1`, `"tol":0`, 1)), "positive tol"},
		{"no reason", caseFile(strings.Replace(good, `"tol_reason":"r"`, `"tol_reason":""`, 1)), "positive tol"},
		{"formula", caseFile(strings.Replace(good, `"mean"`, `"eval"`, 1)), `formula "eval"`},
		{"probe missing", caseFile(strings.Replace(good, `"mean"`, `"probe_value"`, 1)), "probe given or missing"},
		{"edge", caseFile(strings.Replace(good, `{"formula":"mean"}`, `{"formula":"edge_flow","edge":"north"}`, 1)), `edge "north"`},
		{"no project", caseFile(strings.Replace(good, `"project":{},`, ``, 1)), `missing "project"`},
		{"project not an object", caseFile(strings.Replace(good, `"project":{}`, `"project":[]`, 1)), "expected an object"},
		{"expect text", caseFile(strings.Replace(good, `"expect":1`, `"expect":"1"`, 1)), "finite number"},
		{"trailing", caseFile(good) + "{}", "text after"},
	} {
		_, err := Parse([]byte(c.text))
		if err == nil || !strings.Contains(err.Error(), c.want) {
			t.Errorf("%s: err = %v, want %q", c.name, err, c.want)
		}
	}
}

// meanDuct is the mean of w for -lap(w) = 1 on a x b with w = 0 on the
// edges, from the double sine series of the exact solution (the textbook
// closed form, summed here over m, n < M; the tail falls like 1/M^3, below
// 1e-8 of the mean for M = 1200):
//
//	mean = 64/pi^6 sum over odd m, n of 1 / (m^2 n^2 (m^2/a^2 + n^2/b^2))
func meanDuct(a, b float64, m int) float64 {
	s := 0.0
	for i := 1; i < m; i += 2 {
		fi := float64(i)
		for j := 1; j < m; j += 2 {
			fj := float64(j)
			s += 1 / (fi * fi * fj * fj * (fi*fi/(a*a) + fj*fj/(b*b)))
		}
	}
	return 64 / math.Pow(math.Pi, 6) * s
}

// The derived formulas turn the exact mean into the published table
// values: this checks the formulas and their reading of the tables
// independently of the engine.
func TestDerivedFormulas(t *testing.T) {
	zero := project.Segment{Kind: problem.Value, Expr: "0"}
	proj := func(w, h, source float64) *project.Project {
		return &project.Project{Width: w, Height: h, Source: source,
			Conductivity: project.Conductivity{X: 1, Y: 1},
			Edges:        project.Edges{project.Whole(zero), project.Whole(zero), project.Whole(zero), project.Whole(zero)}}
	}
	// Shah & London (1978), fully developed laminar flow, f Re for
	// rectangular ducts (recalled from memory); three printed decimals.
	for _, c := range []struct{ ba, fre float64 }{{1, 14.227}, {0.5, 15.548}, {0.25, 18.233}} {
		r := &solver.Result{Mean: meanDuct(1, c.ba, 1200)}
		got, err := Evaluate(proj(1, c.ba, 1), r, Quantity{Formula: "duct_fre"})
		if err != nil {
			t.Fatal(err)
		}
		if math.Abs(got-c.fre) > 5e-4 {
			t.Errorf("f Re(b/a = %g) = %.6f, Shah & London %.3f", c.ba, got, c.fre)
		}
	}
	// Timoshenko & Goodier, Theory of Elasticity, 3rd ed., torsion of
	// rectangular bars, beta (recalled from memory); three printed
	// decimals. The stress function for -lap(phi) = 2 is 2 w.
	for _, c := range []struct{ ab, beta float64 }{{1, 0.141}, {2, 0.229}, {5, 0.291}} {
		r := &solver.Result{Mean: 2 * meanDuct(c.ab, 1, 1200)}
		got, err := Evaluate(proj(c.ab, 1, 2), r, Quantity{Formula: "torsion_beta"})
		if err != nil {
			t.Fatal(err)
		}
		if math.Abs(got-c.beta) > 5e-4 {
			t.Errorf("beta(a/b = %g) = %.6f, Timoshenko & Goodier %.3f", c.ab, got, c.beta)
		}
	}
	// The preconditions hold the formulas to their problems.
	p := proj(1, 1, 2)
	p.Edges[problem.Top].Segments[0].Expr = "1"
	if _, err := Evaluate(p, &solver.Result{Mean: 1}, Quantity{Formula: "torsion_beta"}); err == nil {
		t.Errorf("torsion_beta accepted a project with an edge at 1")
	}
	p = proj(1, 1, 1)
	p.Conductivity.Y = 2
	if _, err := Evaluate(p, &solver.Result{Mean: 1}, Quantity{Formula: "duct_fre"}); err == nil {
		t.Errorf("duct_fre accepted an orthotropic project")
	}
}

// decay_rate reads the first root of x tan x = Bi from a field that decays
// along x: built here from the separated solution u = cos(l y/H)
// exp(-l x/H), with l found by bisection, and compared with R. G. Watts,
// Essentials of Applied Mathematics for Scientists and Engineers (2007),
// Appendix A, Table A.1 (read), four printed decimals.
func TestDecayRate(t *testing.T) {
	for _, c := range []struct{ bi, root float64 }{{0.1, 0.3111}, {1, 0.8603}, {10, 1.4289}} {
		lo, hi := 0.0, math.Pi/2 // x sin x - Bi cos x rises from -Bi to pi/2 here
		for k := 0; k < 200; k++ {
			mid := (lo + hi) / 2
			if mid*math.Sin(mid)-c.bi*math.Cos(mid) < 0 {
				lo = mid
			} else {
				hi = mid
			}
		}
		l := (lo + hi) / 2
		if math.Abs(l-c.root) > 5e-5 {
			t.Errorf("root for Bi = %g: %.6f, Watts %.4f", c.bi, l, c.root)
		}
		H, x, y := 2.0, 3.0, 0.7
		u := math.Cos(l*y/H) * math.Exp(-l*x/H)
		r := &solver.Result{Probes: []solver.ProbeResult{{Label: "p", X: x, Y: y, Value: u,
			Gradient: [2]float64{-l / H * u, -l / H * math.Sin(l*y/H) * math.Exp(-l*x/H)}}}}
		got, err := Evaluate(&project.Project{Width: 50, Height: H}, r, Quantity{Formula: "decay_rate", Probe: "p"})
		if err != nil {
			t.Fatal(err)
		}
		// Only rounding separates got from l.
		if math.Abs(got-l) > 1e-12 {
			t.Errorf("decay_rate = %.15g, want %.15g", got, l)
		}
	}
	if _, err := Evaluate(&project.Project{Height: 1}, &solver.Result{}, Quantity{Formula: "decay_rate", Probe: "p"}); err == nil {
		t.Errorf("decay_rate found a probe that is not there")
	}
}

// Parse never panics, and what it accepts has the invariants Run relies on.
func FuzzParse(f *testing.F) {
	data, err := os.ReadFile("../../testdata/checks.json")
	if err != nil {
		f.Fatal(err)
	}
	f.Add(data)
	f.Add([]byte(caseFile(`{"id":"a","title":"t","source":"s","basis":"exact","kind":"identity","project":{},"quantity":{"formula":"mean"},"expect":1,"tol":1,"tol_reason":"r"}`)))
	f.Add([]byte(`{"schema":"edgewise-checks/1","cases":[{"reference":{"project":{"a":[1,{"b":null}]}}}]}`))
	f.Fuzz(func(t *testing.T, b []byte) {
		file, err := Parse(b)
		if err != nil {
			return
		}
		for _, c := range file.Cases {
			if (c.Expect == nil) == (c.Reference == nil) || !(c.Tol > 0) || !validID(c.ID) || len(c.Project) == 0 {
				t.Fatalf("accepted a case Run cannot use: %+v", c)
			}
		}
	})
}
