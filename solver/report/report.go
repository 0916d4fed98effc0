package report

import (
	"strconv"

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
	add := func(t *Table, cells ...string) { t.Rows = append(t.Rows, cells) }
	add(&rep.Inputs, "physics", p.Physics)
	add(&rep.Inputs, with("width W", l.Length), num(p.Width))
	add(&rep.Inputs, with("height H", l.Length), num(p.Height))
	if p.Conductivity.X == p.Conductivity.Y {
		add(&rep.Inputs, with(l.Conductivity, l.CondUnit), num(p.Conductivity.X))
	} else {
		add(&rep.Inputs, with(l.Conductivity+" along x", l.CondUnit), num(p.Conductivity.X))
		add(&rep.Inputs, with(l.Conductivity+" along y", l.CondUnit), num(p.Conductivity.Y))
	}
	add(&rep.Inputs, with(l.Source+" (uniform)", l.SourceUnit), num(p.Source))
	add(&rep.Inputs, "output grid (intervals)", strconv.Itoa(out.Nx)+" x "+strconv.Itoa(out.Ny))

	rep.Edges = Table{Caption: "Edge conditions (s runs along the edge: bottom and top from the left, left and right from the bottom)",
		Head: []string{"edge", "kind", "condition"}}
	for _, side := range problem.Sides {
		segs := p.Edges[side].Segments
		for i, s := range segs {
			c := condition(s, l)
			if i < len(segs)-1 {
				c += " up to s = " + num(s.To) + unitNote(l.Length)
			}
			add(&rep.Edges, side.String(), s.Kind.String(), c)
		}
	}

	rep.Extremes = Table{Caption: "Extremes on the output grid and mean",
		Head: []string{"", with(l.Value, l.ValueUnit), with("x", l.Length), with("y", l.Length)}}
	add(&rep.Extremes, "minimum", num(r.Min.Value), num(r.Min.X), num(r.Min.Y))
	add(&rep.Extremes, "maximum", num(r.Max.Value), num(r.Max.X), num(r.Max.Y))
	add(&rep.Extremes, "mean over the region", num(r.Mean), "", "")

	rep.Flows = Table{Caption: "Flows into the region per metre of depth",
		Head: []string{"through", with("flow", l.FlowUnit)}}
	for _, side := range problem.Sides {
		add(&rep.Flows, side.String()+" edge", flow(r.Edges[side]))
	}
	add(&rep.Flows, "source in the region", num(r.SourceTotal))
	if r.Balance != nil {
		add(&rep.Flows, "balance (sum, should be 0)", num(*r.Balance))
	} else {
		add(&rep.Flows, "balance (sum, should be 0)", "not a number: an edge flow is infinite (a jump in value at a corner)")
	}

	rep.Probes = Table{Caption: "Probes",
		Head: []string{"label", with("x", l.Length), with("y", l.Length), with(l.Value, l.ValueUnit),
			with("gradient x", l.GradientUnit), with("gradient y", l.GradientUnit),
			with(l.Flux+" x", l.FluxUnit), with(l.Flux+" y", l.FluxUnit)}}
	for _, q := range r.Probes {
		add(&rep.Probes, q.Label, num(q.X), num(q.Y), num(q.Value), num(q.Gradient[0]), num(q.Gradient[1]), num(q.Flux[0]), num(q.Flux[1]))
	}

	rep.Accuracy = Table{Caption: "Accuracy and cross-check", Head: []string{"", "value"}}
	add(&rep.Accuracy, "series terms", strconv.Itoa(r.Accuracy.Terms))
	add(&rep.Accuracy, with("estimated largest series error", l.ValueUnit), num(r.Accuracy.Estimate))
	if r.Accuracy.Crosscheck != nil {
		add(&rep.Accuracy, with("largest difference from the finite-difference cross-check", l.ValueUnit), num(*r.Accuracy.Crosscheck))
		if r.Accuracy.CrosscheckGrid != "" {
			add(&rep.Accuracy, "cross-check grids", r.Accuracy.CrosscheckGrid)
		}
	} else {
		reason := r.Accuracy.CrosscheckReason
		if reason == "" {
			reason = "not run"
		}
		add(&rep.Accuracy, "finite-difference cross-check", "skipped: "+reason)
	}
	rep.Answers = answerTables(p, out)
	return rep
}

// condition describes one edge condition with units.
func condition(e project.Segment, l solver.UnitSet) string {
	switch e.Kind {
	case problem.Value:
		return l.Value + " = " + e.Expr + unitNote(l.ValueUnit)
	case problem.Flux:
		return "entering " + l.Flux + " = " + e.Expr + unitNote(l.FluxUnit)
	case problem.Convection:
		return l.Coefficient + " h = " + num(e.H) + unitNote(l.CoefUnit) + " to ambient " + e.Ambient + unitNote(l.ValueUnit)
	}
	return e.Kind.String()
}

func unitNote(u string) string {
	if u == "" {
		return ""
	}
	return " " + u
}

func flow(f solver.EdgeFlow) string {
	if !f.Finite || f.Flow == nil {
		return "infinite (a jump in value at a corner of this edge)"
	}
	return num(*f.Flow)
}

// num prints a number with six significant digits.
func num(v float64) string { return strconv.FormatFloat(v, 'g', 6, 64) }
