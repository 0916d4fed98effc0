package report

import (
	"fmt"
	"strconv"
	"strings"

	"edgewise/solver"
	"edgewise/solver/csp"
	"edgewise/solver/jsonlite"
	"edgewise/solver/problem"
	"edgewise/solver/project"
)

// Table is a titled table of text cells.
type Table struct {
	Caption string
	Head    []string
	Rows    [][]string
}

// Report is the content of the printable report. The page lays it out;
// every string in it is plain text.
type Report struct {
	Title    string
	Date     string
	Version  string
	Physics  string
	Inputs   Table
	Edges    Table
	Extremes Table
	Flows    Table
	Probes   Table
	Accuracy Table
	// Answers are the derived answers of the trade (answers.go); Profile
	// is a line profile, when one was asked for (SetProfile).
	Answers  []Table
	Profile  *Table
	Cautions []string
	Warnings []string
	Methods  []string
}

// Release names the build; the build sets it with
// -ldflags "-X edgewise/solver/report.Release=<text>" (for example the
// output of git describe --always --dirty).
var Release = ""

// Version names the build of edgewise: Release, or "development build"
// when the build did not set it.
func Version() string {
	if Release != "" {
		return Release
	}
	return "development build"
}

// JSON returns the report as a JSON object with the keys title, date,
// version, physics, inputs, edges, extremes, flows, probes, accuracy (each
// a table {caption, head: [..], rows: [[..], ..]}), cautions, warnings and
// methods (lists of text), and csp, the Content-Security-Policy the page
// gives the report when it is downloaded as HTML.
func (r *Report) JSON() []byte {
	var w jsonlite.Writer
	strs := func(list []string) {
		w.Open('[')
		for _, s := range list {
			w.Str(s)
		}
		w.Close(']')
	}
	w.Open('{')
	w.Key("title").Str(r.Title).Key("date").Str(r.Date).Key("version").Str(r.Version).Key("physics").Str(r.Physics)
	for _, t := range []struct {
		key string
		t   *Table
	}{{"inputs", &r.Inputs}, {"edges", &r.Edges}, {"extremes", &r.Extremes}, {"flows", &r.Flows}, {"probes", &r.Probes}, {"accuracy", &r.Accuracy}} {
		w.Key(t.key).Open('{').Key("caption").Str(t.t.Caption).Key("head")
		strs(t.t.Head)
		w.Key("rows").Open('[')
		for _, row := range t.t.Rows {
			strs(row)
		}
		w.Close(']').Close('}')
	}
	table := func(t *Table) {
		w.Open('{').Key("caption").Str(t.Caption).Key("head")
		strs(t.Head)
		w.Key("rows").Open('[')
		for _, row := range t.Rows {
			strs(row)
		}
		w.Close(']').Close('}')
	}
	w.Key("answers").Open('[')
	for i := range r.Answers {
		table(&r.Answers[i])
	}
	w.Close(']')
	if r.Profile != nil {
		w.Key("profile")
		table(r.Profile)
	}
	w.Key("cautions")
	strs(r.Cautions)
	w.Key("warnings")
	strs(r.Warnings)
	w.Key("methods")
	strs(r.Methods)
	w.Key("csp").Str(csp.Report())
	w.Close('}')
	return w.Bytes()
}

// SetProfile adds the table of a line profile to the report.
func (r *Report) SetProfile(p *project.Project, out *solver.Output, line ProfileLine) {
	t := profileTable(p, out, line)
	r.Profile = &t
}

// Build makes the report of a solved project. date is printed as given.
func Build(p *project.Project, out *solver.Output, date, version string) *Report {
	l := solver.Units(p.Physics)
	sh := newShown(p) // numbers and units as the page shows them (shown.go)
	r := &out.Result
	title := p.Title
	if title == "" {
		title = "Untitled project"
	}
	rep := &Report{
		Title: title, Date: date, Version: version, Physics: p.Physics,
		Cautions: append([]string{}, r.Cautions...),
		Warnings: []string{},
		Methods:  Methods(p, r),
	}
	for _, w := range r.Warnings {
		rep.Warnings = append(rep.Warnings, w.Text)
	}

	rep.Inputs = Table{Caption: "Rectangle, material and source", Head: []string{"input", "value"}}
	add := addRow
	add(&rep.Inputs, "physics", p.Physics)
	add(&rep.Inputs, with("width W", sh.unit("length")), sh.num("length", p.Width))
	add(&rep.Inputs, with("height H", sh.unit("length")), sh.num("length", p.Height))
	if p.Conductivity.X == p.Conductivity.Y {
		add(&rep.Inputs, with(l.Conductivity, sh.unit("conductivity")), sh.num("conductivity", p.Conductivity.X))
	} else {
		add(&rep.Inputs, with(l.Conductivity+" along x", sh.unit("conductivity")), sh.num("conductivity", p.Conductivity.X))
		add(&rep.Inputs, with(l.Conductivity+" along y", sh.unit("conductivity")), sh.num("conductivity", p.Conductivity.Y))
	}
	add(&rep.Inputs, with(l.Source+" (uniform)", sh.unit("source")), sh.num("source", p.Source))
	add(&rep.Inputs, "output grid (intervals)", strconv.Itoa(out.Nx)+" x "+strconv.Itoa(out.Ny))

	rep.Edges = Table{Caption: "Edge conditions (s runs along the edge: bottom and top from the left, left and right from the bottom)",
		Head: []string{"edge", "kind", "condition"}}
	for _, side := range problem.Sides {
		segs := p.Edges[side].Segments
		for i, s := range segs {
			c := condition(s, l, sh)
			if i < len(segs)-1 {
				c += " up to s = " + sh.num("length", s.To) + unitNote(sh.unit("length"))
			}
			add(&rep.Edges, side.String(), s.Kind.String(), c)
		}
	}

	rep.Extremes = Table{Caption: "Extremes on the output grid and mean",
		Head: []string{"", with(l.Value, sh.unit("value")), with("x", sh.unit("length")), with("y", sh.unit("length"))}}
	add(&rep.Extremes, "minimum", sh.num("value", r.Min.Value), sh.num("length", r.Min.X), sh.num("length", r.Min.Y))
	add(&rep.Extremes, "maximum", sh.num("value", r.Max.Value), sh.num("length", r.Max.X), sh.num("length", r.Max.Y))
	add(&rep.Extremes, "mean over the region", sh.num("value", r.Mean), "", "")

	rep.Flows = Table{Caption: "Flows into the region per metre of depth",
		Head: []string{"through", with("flow", sh.unit("flow"))}}
	for _, side := range problem.Sides {
		add(&rep.Flows, side.String()+" edge", flow(r.Edges[side], sh))
		if segs := r.Edges[side].Segments; len(segs) > 1 {
			for i, g := range segs {
				f := "infinite (two values meet at its end)"
				if g.Finite && g.Flow != nil {
					f = sh.diff("flow", *g.Flow)
				}
				add(&rep.Flows, fmt.Sprintf("  %s[%d]: %s from s = %s to %s%s, mean %s %s", side, i, g.Kind,
					sh.num("length", g.From), sh.num("length", g.To), unitNote(sh.unit("length")), l.Value, sh.num("value", g.Mean)+unitNote(sh.unit("value"))), f)
			}
		}
	}
	add(&rep.Flows, "source in the region", sh.diff("flow", r.SourceTotal))
	if r.Balance != nil {
		add(&rep.Flows, "balance (sum, should be 0)", sh.diff("flow", *r.Balance))
	} else {
		add(&rep.Flows, "balance (sum, should be 0)", "not a number: an edge flow is infinite (a jump in value at a corner)")
	}

	rep.Probes = Table{Caption: "Probes",
		Head: []string{"label", with("x", sh.unit("length")), with("y", sh.unit("length")), with(l.Value, sh.unit("value")),
			with("gradient x", sh.unit("gradient")), with("gradient y", sh.unit("gradient")),
			with(l.Flux+" x", sh.unit("flux")), with(l.Flux+" y", sh.unit("flux"))}}
	for _, q := range r.Probes {
		add(&rep.Probes, q.Label, sh.num("length", q.X), sh.num("length", q.Y), sh.num("value", q.Value), sh.diff("gradient", q.Gradient[0]),
			sh.diff("gradient", q.Gradient[1]), sh.diff("flux", q.Flux[0]), sh.diff("flux", q.Flux[1]))
	}

	rep.Accuracy = Table{Caption: "Accuracy and cross-check", Head: []string{"", "value"}}
	add(&rep.Accuracy, "series terms", strconv.Itoa(r.Accuracy.Terms))
	// differences: no offset (1 K is 1.8 °F)
	add(&rep.Accuracy, with("estimated largest series error", sh.unit("value")), sh.diff("value", r.Accuracy.Estimate))
	if a := r.Accuracy; a.Crosscheck != nil {
		add(&rep.Accuracy, with("largest difference from the independent cross-check", sh.unit("value")), sh.diff("value", *a.Crosscheck))
		if a.CrosscheckResolution != nil {
			add(&rep.Accuracy, with("how far the cross-check resolves the problem itself", sh.unit("value")), sh.diff("value", *a.CrosscheckResolution))
		}
		if a.CrosscheckGrid != "" {
			add(&rep.Accuracy, "cross-check method", a.CrosscheckGrid)
		}
	} else {
		reason := a.CrosscheckReason
		if reason == "" {
			reason = "not run"
		}
		add(&rep.Accuracy, "independent cross-check", "skipped: "+reason)
	}
	add(&rep.Accuracy, "what the numbers are good to", accuracyStatement(&r.Accuracy, sh))
	rep.Answers = answerTables(p, out, sh)
	return rep
}

// accuracyStatement is the result's accuracy statement with its numbers
// written in the report's units.
func accuracyStatement(a *solver.Accuracy, sh *shown) string {
	num := func(v *float64) string {
		if v == nil {
			return "-"
		}
		return sh.diff("value", *v) + unitNote(sh.unit("value"))
	}
	s := strings.ReplaceAll(a.Statement, "{estimate}", num(&a.Estimate))
	s = strings.ReplaceAll(s, "{difference}", num(a.Crosscheck))
	return strings.ReplaceAll(s, "{resolution}", num(a.CrosscheckResolution))
}

// condition describes one edge condition with units. Formulas are SI,
// as written; h is a number and shown in the display unit.
func condition(e project.Segment, l solver.UnitSet, sh *shown) string {
	switch e.Kind {
	case problem.Value:
		return l.Value + " = " + e.Expr + unitNote(l.ValueUnit)
	case problem.Flux:
		return "entering " + l.Flux + " = " + e.Expr + unitNote(l.FluxUnit)
	case problem.Convection:
		if e.HExpr != "" { // a formula along the edge, SI as written
			return l.Coefficient + " h = " + e.HExpr + " (SI) to ambient " + e.Ambient + unitNote(l.ValueUnit)
		}
		return l.Coefficient + " h = " + sh.diff("coefficient", e.H) + unitNote(sh.unit("coefficient")) + " to ambient " + e.Ambient + unitNote(l.ValueUnit)
	}
	return e.Kind.String()
}

func unitNote(u string) string {
	if u == "" {
		return ""
	}
	return " " + u
}

func flow(f solver.EdgeFlow, sh *shown) string {
	if !f.Finite || f.Flow == nil {
		return "infinite (a jump in value at a corner of this edge)"
	}
	return sh.diff("flow", *f.Flow)
}

// num prints a number with six significant digits.
func num(v float64) string { return strconv.FormatFloat(v, 'g', 6, 64) }
