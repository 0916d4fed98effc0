package verify

import (
	"bytes"
	"encoding/json"
	"fmt"
	"math"
	"regexp"
	"strings"

	"edgewise/solver"
)

// Schema names the checks-file format.
const Schema = "edgewise-checks/1"

// File is a checks file.
type File struct {
	Schema string `json:"schema"`
	Cases  []Case `json:"cases"`
}

// Case is one published check.
type Case struct {
	ID        string          `json:"id"`
	Title     string          `json:"title"`
	Source    string          `json:"source"`
	Basis     string          `json:"basis"`
	Project   json.RawMessage `json:"project"`
	Quantity  Quantity        `json:"quantity"`
	Expect    *float64        `json:"expect,omitempty"`
	Reference *Reference      `json:"reference,omitempty"`
	Tol       float64         `json:"tol"`
	TolReason string          `json:"tol_reason"`
}

// Quantity names what a case computes from its solve.
type Quantity struct {
	Formula string `json:"formula"`
	Probe   string `json:"probe,omitempty"`
	Edge    string `json:"edge,omitempty"`
}

// Reference is a second solve whose quantity is the expected value (for
// exact identities between two problems).
type Reference struct {
	Project  json.RawMessage `json:"project"`
	Quantity Quantity        `json:"quantity"`
}

// Outcome is the result of one case.
type Outcome struct {
	ID         string   `json:"id"`
	Title      string   `json:"title"`
	Source     string   `json:"source"`
	Basis      string   `json:"basis"`
	Formula    string   `json:"formula"`
	Computed   *float64 `json:"computed"`
	Expected   *float64 `json:"expected"`
	Difference *float64 `json:"difference"`
	Tol        float64  `json:"tol"`
	TolReason  string   `json:"tol_reason"`
	Pass       bool     `json:"pass"`
	Error      string   `json:"error,omitempty"`
}

var (
	idRE     = regexp.MustCompile(`^[A-Za-z0-9_-]{1,64}$`)
	bases    = []string{"exact", "read", "memory", "recomputed", "common practice"}
	formulas = []string{"probe_value", "edge_flow", "balance", "mean", "torsion_beta", "duct_fre", "decay_rate"}
	edges    = []string{"bottom", "top", "left", "right"}
)

// Parse reads a checks file strictly: unknown keys, a wrong schema,
// repeated or malformed ids, unknown bases or formulas, a missing source,
// a case with both or neither of expect and reference, and tolerances that
// are not positive are errors naming the case.
func Parse(data []byte) (*File, error) {
	dec := json.NewDecoder(bytes.NewReader(data))
	dec.DisallowUnknownFields()
	var f File
	if err := dec.Decode(&f); err != nil {
		return nil, fmt.Errorf("checks: %v", err)
	}
	if dec.More() {
		return nil, fmt.Errorf("checks: text after the checks object")
	}
	if f.Schema != Schema {
		return nil, fmt.Errorf("checks: schema %q, want %q", f.Schema, Schema)
	}
	if len(f.Cases) == 0 {
		return nil, fmt.Errorf("checks: no cases")
	}
	seen := map[string]bool{}
	for i := range f.Cases {
		c := &f.Cases[i]
		where := fmt.Sprintf("checks: case %d (%q)", i, c.ID)
		switch {
		case !idRE.MatchString(c.ID):
			return nil, fmt.Errorf("%s: id must be 1-64 letters, digits, - or _", where)
		case seen[c.ID]:
			return nil, fmt.Errorf("%s: repeated id", where)
		case strings.TrimSpace(c.Title) == "" || strings.TrimSpace(c.Source) == "":
			return nil, fmt.Errorf("%s: needs a title and a source", where)
		case !contains(bases, c.Basis):
			return nil, fmt.Errorf("%s: basis %q (use %s)", where, c.Basis, strings.Join(bases, ", "))
		case (c.Expect == nil) == (c.Reference == nil):
			return nil, fmt.Errorf("%s: give exactly one of expect and reference", where)
		case !(c.Tol > 0) || math.IsInf(c.Tol, 0) || strings.TrimSpace(c.TolReason) == "":
			return nil, fmt.Errorf("%s: needs a positive tol and its tol_reason", where)
		case len(c.Project) == 0:
			return nil, fmt.Errorf("%s: no project", where)
		}
		seen[c.ID] = true
		if err := c.Quantity.check(); err != nil {
			return nil, fmt.Errorf("%s: quantity: %v", where, err)
		}
		if c.Reference != nil {
			if len(c.Reference.Project) == 0 {
				return nil, fmt.Errorf("%s: reference has no project", where)
			}
			if err := c.Reference.Quantity.check(); err != nil {
				return nil, fmt.Errorf("%s: reference quantity: %v", where, err)
			}
		}
	}
	return &f, nil
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
	if needEdge != (q.Edge != "") || (needEdge && !contains(edges, q.Edge)) {
		return fmt.Errorf("%s: edge %q (use bottom, top, left or right, only for edge_flow)", q.Formula, q.Edge)
	}
	return nil
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
	o := Outcome{ID: c.ID, Title: c.Title, Source: c.Source, Basis: c.Basis,
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
func Compute(s *solver.Solver, project []byte, q Quantity) (float64, error) {
	p, err := solver.Decode(project)
	if err != nil {
		return 0, err
	}
	nx, ny := solver.Proportional(p.Width, p.Height, 16)
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
func Evaluate(p *solver.Project, r *solver.Result, q Quantity) (float64, error) {
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
		var f solver.EdgeFlow
		switch q.Edge {
		case "bottom":
			f = r.Edges.Bottom
		case "top":
			f = r.Edges.Top
		case "left":
			f = r.Edges.Left
		case "right":
			f = r.Edges.Right
		}
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
func zeroEdgesWithSource(p *solver.Project, source float64) error {
	if p.Source != source {
		return fmt.Errorf("needs source %g, the project has %g", source, p.Source)
	}
	if p.Conductivity.X != 1 || p.Conductivity.Y != 1 {
		return fmt.Errorf("needs isotropic conductivity 1")
	}
	for _, e := range []solver.EdgeSpec{p.Edges.Bottom, p.Edges.Top, p.Edges.Left, p.Edges.Right} {
		if e.Kind != "value" || strings.TrimSpace(e.Expr) != "0" {
			return fmt.Errorf("needs the four edges at value 0")
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
