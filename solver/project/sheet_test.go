package project

import (
	"reflect"
	"strings"
	"testing"
)

// The title block is optional, read strictly and written back unchanged.
func TestSheetRoundTrip(t *testing.T) {
	b := mutate(t, func(m map[string]any) {
		m["sheet"] = map[string]any{"project": "Line 4 bracket", "number": "C-0042", "prepared_by": "A. N. Engineer",
			"checked_by": "B. Checker", "date": "2026-12-02", "revision": "B"}
	})
	p, err := Decode(b)
	if err != nil {
		t.Fatal(err)
	}
	want := Sheet{Project: "Line 4 bracket", Number: "C-0042", PreparedBy: "A. N. Engineer", CheckedBy: "B. Checker", Date: "2026-12-02", Revision: "B"}
	if p.Sheet == nil || *p.Sheet != want {
		t.Fatalf("sheet %+v, want %+v", p.Sheet, want)
	}
	out := p.JSON()
	if !strings.Contains(string(out), `"sheet":{"project":"Line 4 bracket","number":"C-0042","prepared_by":"A. N. Engineer","checked_by":"B. Checker","date":"2026-12-02","revision":"B"}`) {
		t.Errorf("encoded %s", out)
	}
	q, err := Decode(out)
	if err != nil {
		t.Fatal(err)
	}
	if !reflect.DeepEqual(p, q) {
		t.Errorf("round trip changed the project: %+v vs %+v", p, q)
	}
	// a partial block keeps only what was given; none at all writes none
	p2, err := Decode(mutate(t, func(m map[string]any) { m["sheet"] = map[string]any{"revision": "0"} }))
	if err != nil || p2.Sheet == nil || *p2.Sheet != (Sheet{Revision: "0"}) {
		t.Errorf("partial sheet: %+v, %v", p2.Sheet, err)
	}
	p3, err := Decode([]byte(baseProject))
	if err != nil || p3.Sheet != nil || strings.Contains(string(p3.JSON()), "sheet") {
		t.Errorf("a project without a sheet: %+v, %v", p3.Sheet, err)
	}
}

func TestSheetErrors(t *testing.T) {
	for _, c := range []struct {
		sheet any
		want  string
	}{
		{map[string]any{"checker": "x"}, "sheet.checker: unknown key (allowed here: project, number, prepared_by, checked_by, date, revision)"},
		{map[string]any{"revision": 2}, "sheet.revision: expected text in quotes, got the number 2"},
		{"C-0042", "sheet: expected an object {...}"},
		{map[string]any{"project": strings.Repeat("x", MaxTextBytes+1)}, "sheet.project: text is longer than"},
	} {
		_, err := Decode(mutate(t, func(m map[string]any) { m["sheet"] = c.sheet }))
		if err == nil || !strings.HasPrefix(err.Error(), c.want) {
			t.Errorf("sheet %.40v: error %v, want %q", c.sheet, err, c.want)
		}
	}
}
