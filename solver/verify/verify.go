package verify

import (
	"fmt"
	"math"
	"strings"

	"edgewise/solver"
	"edgewise/solver/jsonlite"
	"edgewise/solver/problem"
	"edgewise/solver/project"
)

// Schema names the checks-file format.
const Schema = "edgewise-checks/1"

// File is a checks file.
type File struct {
	Cases []Case
}

// Case is one published check.
type Case struct {
	ID        string
	Title     string
	Source    string
	Basis     string
	Kind      string // identity, closed form or table (Kinds)
	Project   []byte // the project's JSON text
	Quantity  Quantity
	Expect    *float64 // nil when Reference is set
	Reference *Reference
	Tol       float64
	TolReason string
}

// Quantity names what a case computes from its solve.
type Quantity struct {
	Formula string
	Probe   string
	Edge    string // a side name, for edge_flow
}

// Reference is a second solve whose quantity is the expected value (for
// exact identities between two problems).
type Reference struct {
	Project  []byte
	Quantity Quantity
}

// Outcome is the result of one case. Computed, Expected and Difference are
// nil when the case could not be computed; Error then says why.
type Outcome struct {
	ID, Title, Source, Basis, Kind, Formula string
	Computed, Expected, Difference          *float64
	Tol                                     float64
	TolReason                               string
	Pass                                    bool
	Error                                   string
}

var (
	bases = []string{"exact", "read", "memory", "recomputed", "common practice"}
	// Kinds are what a case's expected value is: an exact identity, a
	// closed form from a named published method (its formula evaluated),
	// or a value printed in a table (read there or recalled from memory,
	// as its basis says).
	Kinds    = []string{"identity", "closed form", "table"}
	formulas = []string{"probe_value", "edge_flow", "balance", "mean", "torsion_beta", "duct_fre", "decay_rate"}
)

// Parse reads a checks file strictly: unknown keys, a wrong schema,
// repeated or malformed ids, unknown bases or formulas, a missing source,
// a case with both or neither of expect and reference, and tolerances that
// are not positive are errors naming the case.
func Parse(data []byte) (*File, error) {
	tree, err := jsonlite.Parse(data)
	if err != nil {
		return nil, fmt.Errorf("checks: %v", err)
	}
	top, err := object(tree, "checks", []string{"schema", "cases"}, nil)
	if err != nil {
		return nil, err
	}
	if s, _ := top["schema"].(string); s != Schema {
		return nil, fmt.Errorf("checks: schema %q, want %q", describe(top["schema"]), Schema)
	}
	list, ok := top["cases"].([]any)
	if !ok || len(list) == 0 {
		return nil, fmt.Errorf("checks: no cases")
	}
	f := &File{Cases: make([]Case, len(list))}
	seen := map[string]bool{}
	for i, v := range list {
		c := &f.Cases[i]
		where := fmt.Sprintf("checks: case %d", i)
		m, err := object(v, where, []string{"id", "title", "source", "basis", "kind", "project", "quantity", "tol", "tol_reason"}, []string{"expect", "reference"})
		if err != nil {
			return nil, err
		}
		c.ID, _ = m["id"].(string)
		where = fmt.Sprintf("checks: case %d (%q)", i, c.ID)
		c.Title, _ = m["title"].(string)
		c.Source, _ = m["source"].(string)
		c.Basis, _ = m["basis"].(string)
		c.Kind, _ = m["kind"].(string)
		c.TolReason, _ = m["tol_reason"].(string)
		tol, tolOK := number(m["tol"])
		c.Tol = tol
		switch {
		case !validID(c.ID):
			return nil, fmt.Errorf("%s: id must be 1-64 letters, digits, - or _", where)
		case seen[c.ID]:
			return nil, fmt.Errorf("%s: repeated id", where)
		case strings.TrimSpace(c.Title) == "" || strings.TrimSpace(c.Source) == "":
			return nil, fmt.Errorf("%s: needs a title and a source", where)
		case !contains(bases, c.Basis):
			return nil, fmt.Errorf("%s: basis %q (use %s)", where, c.Basis, strings.Join(bases, ", "))
		case !contains(Kinds, c.Kind):
			return nil, fmt.Errorf("%s: kind %q (use %s)", where, c.Kind, strings.Join(Kinds, ", "))
		case (m["expect"] == nil) == (m["reference"] == nil):
			return nil, fmt.Errorf("%s: give exactly one of expect and reference", where)
		case !tolOK || !(c.Tol > 0) || math.IsInf(c.Tol, 0) || strings.TrimSpace(c.TolReason) == "":
			return nil, fmt.Errorf("%s: needs a positive tol and its tol_reason", where)
		}
		seen[c.ID] = true
		if c.Project, err = projectText(m["project"], where+": project"); err != nil {
			return nil, err
		}
		if c.Quantity, err = quantity(m["quantity"], where+": quantity"); err != nil {
			return nil, err
		}
		if e, ok := m["expect"]; ok && e != nil {
			v, ok := number(e)
			if !ok || math.IsInf(v, 0) {
				return nil, fmt.Errorf("%s: expect must be a finite number", where)
			}
			c.Expect = &v
		}
		if r, ok := m["reference"]; ok && r != nil {
			rm, err := object(r, where+": reference", []string{"project", "quantity"}, nil)
			if err != nil {
				return nil, err
			}
			c.Reference = &Reference{}
			if c.Reference.Project, err = projectText(rm["project"], where+": reference project"); err != nil {
				return nil, err
			}
			if c.Reference.Quantity, err = quantity(rm["quantity"], where+": reference quantity"); err != nil {
				return nil, err
			}
		}
	}
	return f, nil
}

// object checks that v is an object with all the required keys and no
// keys beyond the required and optional ones.
func object(v any, where string, required, optional []string) (map[string]any, error) {
	m, ok := v.(map[string]any)
	if !ok {
		return nil, fmt.Errorf("%s: expected an object, got %s", where, describe(v))
	}
	for _, k := range required {
		if _, ok := m[k]; !ok {
			return nil, fmt.Errorf("%s: missing %q", where, k)
		}
	}
	for k := range m {
		if !contains(required, k) && !contains(optional, k) {
			return nil, fmt.Errorf("%s: unknown field %q", where, k)
		}
	}
	return m, nil
}

func number(v any) (float64, bool) {
	n, ok := v.(jsonlite.Number)
	if !ok {
		return 0, false
	}
	f, err := n.Float64()
	return f, err == nil
}

func describe(v any) string {
	switch x := v.(type) {
	case string:
		return x
	case nil:
		return "null"
	case jsonlite.Number:
		return string(x)
	case map[string]any:
		return "an object"
	case []any:
		return "an array"
	}
	return fmt.Sprint(v)
}

// projectText writes a project subtree back to JSON text for project.Decode
// (which reads it strictly).
func projectText(v any, where string) ([]byte, error) {
	if _, ok := v.(map[string]any); !ok {
		return nil, fmt.Errorf("%s: expected an object, got %s", where, describe(v))
	}
	var w jsonlite.Writer
	if err := w.Value(v); err != nil {
		return nil, fmt.Errorf("%s: %v", where, err)
	}
	return w.Bytes(), nil
}

func quantity(v any, where string) (Quantity, error) {
	m, err := object(v, where, []string{"formula"}, []string{"probe", "edge"})
	if err != nil {
		return Quantity{}, err
	}
	var q Quantity
	q.Formula, _ = m["formula"].(string)
	q.Probe, _ = m["probe"].(string)
	q.Edge, _ = m["edge"].(string)
	if err := q.check(); err != nil {
		return q, fmt.Errorf("%s: %v", where, err)
	}
	return q, nil
}

func validID(id string) bool {
	if len(id) == 0 || len(id) > 64 {
		return false
	}
	for _, r := range id {
		if !(r >= 'a' && r <= 'z' || r >= 'A' && r <= 'Z' || r >= '0' && r <= '9' || r == '-' || r == '_') {
			return false
		}
	}
	return true
}

func (q Quantity) check() error {
	if !contains(formulas, q.Formula) {
		return fmt.Errorf("formula %q (use %s)", q.Formula, strings.Join(formulas, ", "))
	}
	needProbe := q.Formula == "probe_value" || q.Formula == "decay_rate"
	needEdge := q.Formula == "edge_flow"
	if needProbe != (q.Probe != "") {
		return fmt.Errorf("%s: probe given or missing", q.Formula)
	}
	if _, known := problem.ParseSide(q.Edge); needEdge != (q.Edge != "") || (needEdge && !known) {
		return fmt.Errorf("%s: edge %q (use bottom, top, left or right, only for edge_flow)", q.Formula, q.Edge)
	}
	return nil
}

// JSON returns the outcome as a JSON object with the keys id, title,
// source, basis, kind, formula, computed, expected, difference (numbers or
// null), tol, tol_reason, pass and error.
func (o *Outcome) JSON() []byte {
	var w jsonlite.Writer
	o.write(&w)
	return w.Bytes()
}

func (o *Outcome) write(w *jsonlite.Writer) {
	opt := func(v *float64) {
		if v == nil {
			w.Null()
		} else {
			w.Num(*v)
		}
	}
	w.Open('{')
	w.Key("id").Str(o.ID).Key("title").Str(o.Title).Key("source").Str(o.Source)
	w.Key("basis").Str(o.Basis).Key("kind").Str(o.Kind).Key("formula").Str(o.Formula)
	w.Key("computed")
	opt(o.Computed)
	w.Key("expected")
	opt(o.Expected)
	w.Key("difference")
	opt(o.Difference)
	w.Key("tol").Num(o.Tol).Key("tol_reason").Str(o.TolReason)
	w.Key("pass").Bool(o.Pass).Key("error").Str(o.Error)
	w.Close('}')
}

// Find returns the case with the given id, or nil.
func (f *File) Find(id string) *Case {
	for i := range f.Cases {
		if f.Cases[i].ID == id {
			return &f.Cases[i]
		}
	}
	return nil
}

// Run solves the case (and its reference) with s and compares.
func (c *Case) Run(s *solver.Solver) Outcome {
	o := Outcome{ID: c.ID, Title: c.Title, Source: c.Source, Basis: c.Basis, Kind: c.Kind,
		Formula: c.Quantity.Formula, Tol: c.Tol, TolReason: c.TolReason}
	v, err := Compute(s, c.Project, c.Quantity)
	if err != nil {
		o.Error = err.Error()
		return o
	}
	o.Computed = &v
	want := 0.0
	if c.Expect != nil {
		want = *c.Expect
	} else {
		want, err = Compute(s, c.Reference.Project, c.Reference.Quantity)
		if err != nil {
			o.Error = "reference: " + err.Error()
			return o
		}
	}
	o.Expected = &want
	d := v - want
	o.Difference = &d
	o.Pass = math.Abs(d) <= c.Tol
	return o
}

// Compute solves a project and evaluates a quantity of it.
func Compute(s *solver.Solver, text []byte, q Quantity) (float64, error) {
	p, err := project.Decode(text)
	if err != nil {
		return 0, err
	}
	nx, ny := problem.Proportional(p.Width, p.Height, 16)
	out, err := s.Solve(p, solver.Options{Nx: nx, Ny: ny, NoCrossCheck: true})
	if err != nil {
		return 0, err
	}
	v, err := Evaluate(p, &out.Result, q)
	if err != nil {
		return 0, err
	}
	if math.IsNaN(v) || math.IsInf(v, 0) {
		return 0, fmt.Errorf("%s is not a finite number", q.Formula)
	}
	return v, nil
}

// Evaluate computes a quantity from a project and its result.
func Evaluate(p *project.Project, r *solver.Result, q Quantity) (float64, error) {
	switch q.Formula {
	case "probe_value":
		pr, err := probe(r, q.Probe)
		if err != nil {
			return 0, err
		}
		return pr.Value, nil
	case "decay_rate":
		pr, err := probe(r, q.Probe)
		if err != nil {
			return 0, err
		}
		if pr.Value == 0 {
			return 0, fmt.Errorf("decay_rate: the field is 0 at probe %q", q.Probe)
		}
		return -p.Height * pr.Gradient[0] / pr.Value, nil
	case "edge_flow":
		side, known := problem.ParseSide(q.Edge)
		if !known {
			return 0, fmt.Errorf("edge_flow: no edge %q", q.Edge)
		}
		f := r.Edges[side]
		if !f.Finite || f.Flow == nil {
			return 0, fmt.Errorf("edge_flow: the flow through the %s edge is infinite", q.Edge)
		}
		return *f.Flow, nil
	case "balance":
		if r.Balance == nil {
			return 0, fmt.Errorf("balance: no balance (an edge flow is infinite)")
		}
		return *r.Balance, nil
	case "mean":
		return r.Mean, nil
	case "torsion_beta":
		if err := zeroEdgesWithSource(p, 2); err != nil {
			return 0, fmt.Errorf("torsion_beta: %v", err)
		}
		a, b := max(p.Width, p.Height), min(p.Width, p.Height)
		j := 2 * r.Mean * p.Width * p.Height
		return j / (a * b * b * b), nil
	case "duct_fre":
		if err := zeroEdgesWithSource(p, 1); err != nil {
			return 0, fmt.Errorf("duct_fre: %v", err)
		}
		if r.Mean <= 0 {
			return 0, fmt.Errorf("duct_fre: mean velocity %g is not positive", r.Mean)
		}
		dh := 2 * p.Width * p.Height / (p.Width + p.Height)
		return dh * dh / (2 * r.Mean), nil
	}
	return 0, fmt.Errorf("unknown formula %q", q.Formula)
}

// zeroEdgesWithSource checks the precondition of the derived formulas:
// -lap(u) = source with u = 0 on the four edges.
func zeroEdgesWithSource(p *project.Project, source float64) error {
	if p.Source != source {
		return fmt.Errorf("needs source %g, the project has %g", source, p.Source)
	}
	if p.Conductivity.X != 1 || p.Conductivity.Y != 1 {
		return fmt.Errorf("needs isotropic conductivity 1")
	}
	for _, e := range p.Edges {
		for _, s := range e.Segments {
			if s.Kind != problem.Value || strings.TrimSpace(s.Expr) != "0" {
				return fmt.Errorf("needs the four edges at value 0")
			}
		}
	}
	return nil
}

func probe(r *solver.Result, label string) (*solver.ProbeResult, error) {
	for i := range r.Probes {
		if r.Probes[i].Label == label {
			return &r.Probes[i], nil
		}
	}
	return nil, fmt.Errorf("no probe %q in the project", label)
}

func contains(list []string, s string) bool {
	for _, x := range list {
		if x == s {
			return true
		}
	}
	return false
}
