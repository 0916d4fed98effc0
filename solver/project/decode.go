package project

import (
	"fmt"
	"math"
	"strings"

	"edgewise/solver/expr"
	"edgewise/solver/jsonlite"
	"edgewise/solver/physics"
	"edgewise/solver/problem"
)

// Schema is the project-file schema this package reads and writes.
const Schema = "edgewise/1"

// Project is a decoded project file.
type Project struct {
	Schema       string       `json:"schema"`
	Title        string       `json:"title,omitempty"`
	Physics      string       `json:"physics"`              // an id of the physics table (package physics): labels, units, cautions; never the mathematics
	Parameters   []Parameter  `json:"parameters,omitempty"` // in name order
	Width        float64      `json:"width"`
	Height       float64      `json:"height"`
	Conductivity Conductivity `json:"conductivity"`
	Source       float64      `json:"source"`
	Edges        Edges        `json:"edges"`
	Probes       []Probe      `json:"probes"`
	Grid         *GridSize    `json:"grid,omitempty"`
	Answers      *Asked       `json:"answers,omitempty"` // inputs of the derived answers (answers.go)
	Sheet        *Sheet       `json:"sheet,omitempty"`   // the calculation sheet's title block (sheet.go)
	Display      Display      `json:"display,omitempty"` // the page's choice of display units (display.go)
	// Texts holds the number fields written as text (a formula of the
	// parameters), keyed by their path ("width", "edges.top.h",
	// "probes[0].x"); the number field holds its value.
	Texts map[string]string `json:"-"`
	// Study is the project's study file as canonical JSON text, or ""
	// (the optional key "study"; see study.go).
	Study string `json:"-"`
}

// Conductivity is isotropic (X == Y) or orthotropic. It encodes as a single
// number when isotropic.
type Conductivity struct{ X, Y float64 }

// Probe is a point where the user wants the value, gradient and flux.
type Probe struct {
	X     float64 `json:"x"`
	Y     float64 `json:"y"`
	Label string  `json:"label"`
}

// GridSize is the output grid in intervals along x and y.
type GridSize struct {
	Nx int `json:"nx"`
	Ny int `json:"ny"`
}

// Limits on what a project may ask for.
const (
	MaxGrid      = 1024 // intervals per side of the output grid
	MaxProbes    = 100
	MaxTextBytes = 4096 // title, labels and formulas
	maxFileBytes = 1 << 20
	MaxFileBytes = maxFileBytes // the largest project file Decode reads, for readers to stop at
)

// Error is a problem with one field of a project. Col is the 1-based byte
// column within a formula, or 0.
type Error struct {
	Path string
	Col  int
	Msg  string
}

func (e *Error) Error() string {
	if e.Col > 0 {
		return Shorten(fmt.Sprintf("%s: col %d: %s", e.Path, e.Col, e.Msg))
	}
	if e.Path == "" {
		return Shorten(e.Msg)
	}
	return Shorten(e.Path + ": " + e.Msg)
}

// Errorf returns an *Error for the field at path. It stays out of line:
// inlined at its hundred calls it made the engine 16 KB larger.
//
//go:noinline
func Errorf(path, format string, args ...any) *Error {
	return &Error{Path: path, Msg: fmt.Sprintf(format, args...)}
}

// Decode reads a project file strictly: unknown keys, missing required
// fields, wrong types, non-finite or out-of-range numbers are errors that
// name the field path. Formulas are checked by Compile, not here.
func Decode(data []byte) (*Project, error) { return decode(data, nil) }

func decode(data []byte, override map[string]float64) (*Project, error) {
	if len(data) > maxFileBytes {
		return nil, Errorf("", "project file is larger than %d bytes", maxFileBytes)
	}
	v, err := jsonlite.Parse(data)
	if err != nil {
		return nil, Errorf("", "not a project file: %v", err)
	}
	d := decoder{override: override}
	p := d.project(v)
	d.checkUsed(p)
	if d.err != nil {
		return nil, d.err
	}
	p.Texts = d.texts
	return p, nil
}

// decoder walks the generic JSON tree; the first error sticks.
type decoder struct {
	err      *Error
	override map[string]float64 // parameter values that replace the file's (DecodeWith)
	consts   []expr.Const       // the parameters, once read
	texts    map[string]string  // number fields written as text, by path
	used     map[string]bool    // parameters some field or formula uses
}

//go:noinline
func (d *decoder) fail(path, format string, args ...any) {
	if d.err == nil {
		d.err = Errorf(path, format, args...)
	}
}

func (d *decoder) object(v any, path string, required []string, optional ...string) map[string]any {
	m, err := Object(v, path, required, optional...)
	if err != nil && d.err == nil {
		d.err = err
	}
	return m
}

func (d *decoder) number(v any, path string) float64 {
	switch t := v.(type) {
	case jsonlite.Number:
		f, err := t.Float64()
		if err != nil || math.IsInf(f, 0) || math.IsNaN(f) {
			d.fail(path, "%s is not a finite number", string(t))
			return 0
		}
		return f
	case string:
		if strings.Contains(t, ",") {
			d.fail(path, "expected a number, got the text %q (use a decimal point, not a comma)", t)
		} else {
			d.fail(path, "expected a number, got the text %q", t)
		}
	default:
		d.fail(path, "expected a number, got %s", Describe(v))
	}
	return 0
}

func (d *decoder) positive(v any, path string) float64 {
	f := d.quantity(v, path)
	if d.err == nil && !(f > 0) {
		d.fail(path, "must be greater than zero, got %g", f)
	}
	return f
}

func (d *decoder) text(v any, path string) string {
	s, ok := v.(string)
	if !ok {
		d.fail(path, "expected text in quotes, got %s", Describe(v))
		return ""
	}
	if len(s) > MaxTextBytes {
		d.fail(path, "text is longer than %d bytes", MaxTextBytes)
	}
	return s
}

// formula accepts a formula as text, or a plain JSON number.
func (d *decoder) formula(v any, path string) string {
	if n, ok := v.(jsonlite.Number); ok {
		d.number(n, path)
		return string(n)
	}
	s := d.text(v, path)
	if d.err == nil && strings.TrimSpace(s) == "" {
		d.fail(path, "empty formula (write 0 for zero)")
	}
	return s
}

func (d *decoder) integer(v any, path string, lo, hi int) int {
	f := d.number(v, path)
	if d.err != nil {
		return 0
	}
	if f != math.Trunc(f) || f < float64(lo) || f > float64(hi) {
		d.fail(path, "must be a whole number from %d to %d, got %g", lo, hi, f)
		return 0
	}
	return int(f)
}

func (d *decoder) project(v any) *Project {
	m := d.object(v, "", []string{"schema", "physics", "width", "height", "conductivity", "edges"},
		"title", "source", "probes", "grid", "parameters", "study", "sheet", "answers", "display")
	if m == nil {
		return nil
	}
	p := &Project{}
	p.Schema = d.text(m["schema"], "schema")
	if d.err == nil && p.Schema != Schema {
		d.fail("schema", "expected %q, got %q (not an edgewise project, or a newer version)", Schema, p.Schema)
	}
	if t, ok := m["title"]; ok {
		p.Title = d.text(t, "title")
	}
	p.Physics = d.text(m["physics"], "physics")
	if _, known := physics.Lookup(p.Physics); d.err == nil && !known {
		d.fail("physics", "unknown physics %q (use %s)", p.Physics, physics.Choices())
	}
	if pv, ok := m["parameters"]; ok {
		p.Parameters = d.parameters(pv)
		d.consts = p.Consts()
	}
	p.Width = d.positive(m["width"], "width")
	p.Height = d.positive(m["height"], "height")
	if d.err == nil {
		if r := p.Width / p.Height; r > 1e3 || r < 1e-3 {
			d.fail("width", "the aspect ratio width/height = %g is outside 1e-3 .. 1e3", r)
		}
	}
	p.Conductivity = d.conductivity(m["conductivity"], "conductivity")
	if d.err == nil && p.Conductivity.X != p.Conductivity.Y {
		// the series works on the equivalent isotropic rectangle, whose
		// height is H sqrt(kx/ky): its aspect ratio must stay in range too
		if r := p.Width / (p.Height * math.Sqrt(p.Conductivity.X/p.Conductivity.Y)); r > 1e3 || r < 1e-3 {
			d.fail("conductivity", "with kx/ky = %.3g this rectangle acts like one of aspect ratio %.3g, outside 1e-3 .. 1e3",
				p.Conductivity.X/p.Conductivity.Y, r)
		}
	}
	if s, ok := m["source"]; ok {
		p.Source = d.quantity(s, "source")
	}
	em := d.object(m["edges"], "edges", sideNames())
	for _, side := range problem.Sides {
		if em == nil {
			break
		}
		p.Edges[side] = d.edge(em[side.String()], "edges."+side.String(), p.length(side))
	}
	if pv, ok := m["probes"]; ok {
		p.Probes = d.probes(pv, p)
	}
	if g, ok := m["grid"]; ok {
		gm := d.object(g, "grid", []string{"nx", "ny"})
		if gm != nil {
			p.Grid = &GridSize{Nx: d.integer(gm["nx"], "grid.nx", 2, MaxGrid), Ny: d.integer(gm["ny"], "grid.ny", 2, MaxGrid)}
		}
	}
	if sv, ok := m["study"]; ok {
		p.Study = d.studyText(sv)
	}
	if sv, ok := m["sheet"]; ok {
		p.Sheet = d.sheet(sv)
	}
	if a, ok := m["answers"]; ok {
		p.Answers = d.asked(a)
	}
	if dv, ok := m["display"]; ok {
		p.Display = d.display(dv)
	}
	d.inRange(p)
	return p
}

func (d *decoder) conductivity(v any, path string) Conductivity {
	if _, ok := v.(map[string]any); ok {
		m := d.object(v, path, []string{"x", "y"})
		if m == nil {
			return Conductivity{}
		}
		return Conductivity{X: d.positive(m["x"], path+".x"), Y: d.positive(m["y"], path+".y")}
	}
	k := d.positive(v, path)
	return Conductivity{X: k, Y: k}
}

// sideNames lists the JSON keys of the four edges, in the side order.
func sideNames() []string {
	names := make([]string, len(problem.Sides))
	for i, s := range problem.Sides {
		names[i] = s.String()
	}
	return names
}

func (d *decoder) probes(v any, p *Project) []Probe {
	list, ok := v.([]any)
	if !ok {
		d.fail("probes", "expected a list [...], got %s", Describe(v))
		return nil
	}
	if len(list) > MaxProbes {
		d.fail("probes", "at most %d probes, got %d", MaxProbes, len(list))
		return nil
	}
	out := make([]Probe, 0, len(list))
	for i, pv := range list {
		path := fmt.Sprintf("probes[%d]", i)
		m := d.object(pv, path, []string{"x", "y"}, "label")
		if m == nil {
			return nil
		}
		pr := Probe{X: d.quantity(m["x"], path+".x"), Y: d.quantity(m["y"], path+".y")}
		if l, ok := m["label"]; ok {
			pr.Label = d.text(l, path+".label")
		} else {
			pr.Label = fmt.Sprintf("P%d", i+1)
		}
		if d.err == nil && (pr.X < 0 || pr.X > p.Width) {
			d.fail(path+".x", "%g is outside the rectangle (0 .. %g)", pr.X, p.Width)
		}
		if d.err == nil && (pr.Y < 0 || pr.Y > p.Height) {
			d.fail(path+".y", "%g is outside the rectangle (0 .. %g)", pr.Y, p.Height)
		}
		out = append(out, pr)
	}
	return out
}
