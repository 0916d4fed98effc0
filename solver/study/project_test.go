package study

import (
	"strings"
	"testing"

	"edgewise/solver/project"
)

const keptProject = `{"schema": "edgewise/1", "physics": "heat", "width": 1, "height": 1,
 "parameters": {"h_top": 20}, "conductivity": 10,
 "edges": {"bottom": {"kind": "value", "expr": "100"}, "right": {"kind": "flux", "expr": "0"},
  "top": {"kind": "convection", "h": "h_top", "ambient": "20"}, "left": {"kind": "flux", "expr": "0"}},
 "study": %s}`

// A project keeps its study through a round trip of its file, and
// FromProject checks it against the project with paths from the top.
func TestProjectStudy(t *testing.T) {
	good := `{"schema": "edgewise-study/1", "vary": [{"name": "h_top", "from": 5, "to": 50, "steps": 3}], "report": ["max.value"]}`
	p, err := project.Decode([]byte(strings.Replace(keptProject, "%s", good, 1)))
	if err != nil {
		t.Fatal(err)
	}
	q, err := project.Decode(p.JSON())
	if err != nil {
		t.Fatal(err)
	}
	if q.Study != p.Study || !strings.Contains(p.Study, `"steps":3`) {
		t.Fatalf("study after a round trip %q, before %q", q.Study, p.Study)
	}
	s, err := FromProject(q)
	if err != nil || s.Rows() != 3 {
		t.Fatalf("FromProject: %v, %v", s, err)
	}
	for _, c := range []struct{ study, want string }{
		{`{"schema": "edgewise-study/1", "vary": [{"name": "k", "values": [1]}], "report": ["max.value"]}`, "study.vary[0].name"},
		{`{"schema": "edgewise-study/1", "vary": [{"name": "h_top", "from": 5, "to": 50, "steps": 1}], "report": ["max.value"]}`, "study.vary[0].steps"},
	} {
		p, err := project.Decode([]byte(strings.Replace(keptProject, "%s", c.study, 1)))
		if err != nil {
			t.Fatal(err)
		}
		_, err = FromProject(p)
		var pe *project.Error
		if err == nil || !errorAs(err, &pe) || pe.Path != c.want {
			t.Errorf("%s: error %v, want path %s", c.study, err, c.want)
		}
	}
	if _, err := project.Decode([]byte(strings.Replace(keptProject, "%s", `[1]`, 1))); err == nil || !strings.HasPrefix(err.Error(), "study: ") {
		t.Errorf("a study that is not an object: %v", err)
	}
}

func errorAs(err error, target **project.Error) bool {
	e, ok := err.(*project.Error)
	if ok {
		*target = e
	}
	return ok
}
