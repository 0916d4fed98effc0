package physics_test

import (
	"bytes"
	"encoding/json"
	"os"
	"reflect"
	"strings"
	"testing"

	"edgewise/solver"
	"edgewise/solver/physics"
	"edgewise/solver/project"
)

// Every physics but the generic one has an example project of its own: it
// names that physics, decodes, solves, and its numbers lie in the physics'
// usual spans (an example must not trip its own plausibility warnings).
// Heat's example is the page's first demo, site/demo.json.
func TestExamples(t *testing.T) {
	for _, p := range physics.All() {
		ex := p.Example()
		if p.ID == physics.Generic {
			if ex != nil {
				t.Errorf("generic has an example")
			}
			continue
		}
		if ex == nil {
			t.Errorf("%s: no example", p.ID)
			continue
		}
		proj, err := project.Decode(ex)
		if err != nil {
			t.Errorf("%s: example does not decode: %v", p.ID, err)
			continue
		}
		var raw struct {
			Physics      string  `json:"physics"`
			Conductivity float64 `json:"conductivity"`
			Edges        map[string]struct {
				H *float64 `json:"h"`
			} `json:"edges"`
		}
		if err := json.Unmarshal(ex, &raw); err != nil {
			t.Fatal(err)
		}
		if raw.Physics != p.ID {
			t.Errorf("%s: example says physics %q", p.ID, raw.Physics)
		}
		in := func(v float64, span [2]float64) bool { return span[1] == 0 || v >= span[0] && v <= span[1] }
		if !in(raw.Conductivity, p.Usual.Conductivity) {
			t.Errorf("%s: example's conductivity %g outside the usual %v", p.ID, raw.Conductivity, p.Usual.Conductivity)
		}
		for side, e := range raw.Edges {
			if e.H != nil && !in(*e.H, p.Usual.H) {
				t.Errorf("%s: example's %s h %g outside the usual %v", p.ID, side, *e.H, p.Usual.H)
			}
		}
		var s solver.Solver
		if _, err := s.Solve(proj, solver.Options{NoCrossCheck: true}); err != nil {
			t.Errorf("%s: example does not solve: %v", p.ID, err)
		}
	}
	demo, err := os.ReadFile("../../site/demo.json")
	if err != nil {
		t.Fatal(err)
	}
	var a, b any
	if err := json.Unmarshal(demo, &a); err != nil {
		t.Fatal(err)
	}
	heat, _ := physics.Lookup(physics.Heat)
	if err := json.NewDecoder(bytes.NewReader(heat.Example())).Decode(&b); err != nil {
		t.Fatal(err)
	}
	if !reflect.DeepEqual(a, b) {
		t.Errorf("heat's example differs from site/demo.json")
	}
}

// The usual spans are spans: low below high, both positive.
func TestUsualSpans(t *testing.T) {
	for _, p := range physics.All() {
		for what, s := range map[string][2]float64{"conductivity": p.Usual.Conductivity, "h": p.Usual.H} {
			if s != [2]float64{} && !(s[0] > 0 && s[1] > s[0]) {
				t.Errorf("%s: usual %s %v is not a span", p.ID, what, s)
			}
		}
		if (p.Usual.Conductivity != [2]float64{}) && p.Usual.Source == "" {
			t.Errorf("%s: usual spans without a source", p.ID)
		}
	}
}

// Every physics but the generic one has a further example whose edges are
// made of segments (an edge of two or more parts): it names that physics,
// decodes, keeps its numbers (h of every part too) in the usual spans, and
// solves once the engine solves segments.
func TestSegmentExamples(t *testing.T) {
	for _, p := range physics.All() {
		more := p.MoreExamples()
		if p.ID == physics.Generic {
			continue
		}
		split := 0
		for _, ex := range more {
			proj, err := project.Decode(ex)
			if err != nil {
				t.Errorf("%s: a further example does not decode: %v", p.ID, err)
				continue
			}
			var raw struct {
				Physics      string  `json:"physics"`
				Title        string  `json:"title"`
				Conductivity float64 `json:"conductivity"`
				Edges        map[string]struct {
					H        *float64 `json:"h"`
					Segments []struct {
						H *float64 `json:"h"`
					} `json:"segments"`
				} `json:"edges"`
			}
			if err := json.Unmarshal(ex, &raw); err != nil {
				t.Fatal(err)
			}
			if raw.Physics != p.ID {
				t.Errorf("%s: %q says physics %q", p.ID, raw.Title, raw.Physics)
			}
			in := func(v float64, span [2]float64) bool { return span[1] == 0 || v >= span[0] && v <= span[1] }
			if !in(raw.Conductivity, p.Usual.Conductivity) {
				t.Errorf("%s: %q: conductivity %g outside the usual %v", p.ID, raw.Title, raw.Conductivity, p.Usual.Conductivity)
			}
			parts := false
			for side, e := range raw.Edges {
				hs := []*float64{e.H}
				for _, s := range e.Segments {
					hs = append(hs, s.H)
				}
				for _, h := range hs {
					if h != nil && !in(*h, p.Usual.H) {
						t.Errorf("%s: %q: %s h %g outside the usual %v", p.ID, raw.Title, side, *h, p.Usual.H)
					}
				}
				parts = parts || len(e.Segments) > 1
			}
			if !parts {
				continue
			}
			split++
			var s solver.Solver
			if _, err := s.Solve(proj, solver.Options{NoCrossCheck: true}); err != nil {
				if strings.Contains(err.Error(), "not solved yet") {
					t.Logf("%s: %q waits for the engine to solve segments: %v", p.ID, raw.Title, err)
					continue
				}
				t.Errorf("%s: %q does not solve: %v", p.ID, raw.Title, err)
			}
		}
		if split == 0 {
			t.Errorf("%s: no further example has an edge made of segments", p.ID)
		}
	}
}
