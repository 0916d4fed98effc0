package study

import (
	"fmt"
	"math"
	"strings"

	"edgewise/solver/jsonlite"
	"edgewise/solver/project"
)

// Schema is the study-file schema.
const Schema = "edgewise-study/1"

// Limits on what a study may ask for.
const (
	MaxRows   = 10_000_000 // combinations of a vary
	MaxValues = 100_000    // values of one axis
	maxBytes  = 1 << 20
)

// Linear and Log are the scales of an axis given by from, to and steps.
const (
	Linear = "linear"
	Log    = "log"
)

// Study is a decoded study file.
type Study struct {
	Vary   []Axis
	Report []string
	Seek   *Seek // a seek instead of a vary

	outs      []output
	crossNeed bool // some output needs the cross-check
}

// Axis is one varied parameter and every value it takes, in order.
type Axis struct {
	Name   string
	Values []float64
}

// Seek asks for the value of the parameter Name in [From, To] at which the
// output Output equals Target within Tolerance.
type Seek struct {
	Name      string
	From, To  float64
	Output    string
	Target    float64
	Tolerance float64

	out output
}

// Decode reads a study file for project p strictly: unknown keys, a
// parameter p does not define, steps below 2, a log scale that reaches zero
// or below, an unknown report path are errors (*project.Error) naming the
// path in the study file, such as vary[1].steps.
func Decode(data []byte, p *project.Project) (*Study, error) {
	if len(data) > maxBytes {
		return nil, project.Errorf("", "study file is larger than %d bytes", maxBytes)
	}
	v, err := jsonlite.Parse(data)
	if err != nil {
		return nil, project.Errorf("", "not a study file: %v", err)
	}
	d := &decoder{p: p}
	s := d.study(v)
	if d.err != nil {
		return nil, d.err
	}
	return s, nil
}

type decoder struct {
	p   *project.Project
	err *project.Error
}

//go:noinline
func (d *decoder) fail(path, format string, args ...any) {
	if d.err == nil {
		d.err = project.Errorf(path, format, args...)
	}
}

func (d *decoder) object(v any, path string, required []string, optional ...string) map[string]any {
	m, err := project.Object(v, path, required, optional...)
	if err != nil && d.err == nil {
		d.err = err
	}
	return m
}

func (d *decoder) number(v any, path string) float64 {
	n, ok := v.(jsonlite.Number)
	if !ok {
		d.fail(path, "expected a number, got %s", project.Describe(v))
		return 0
	}
	f, err := n.Float64()
	if err != nil || math.IsInf(f, 0) || math.IsNaN(f) {
		d.fail(path, "%s is not a finite number", project.Shorten(string(n)))
		return 0
	}
	return f
}

func (d *decoder) text(v any, path string) string {
	s, ok := v.(string)
	if !ok {
		d.fail(path, "expected text in quotes, got %s", project.Describe(v))
	}
	return s
}

func (d *decoder) list(v any, path string) []any {
	l, ok := v.([]any)
	if !ok {
		d.fail(path, "expected a list [...], got %s", project.Describe(v))
	}
	return l
}

// parameter reads the name of a parameter of the project.
func (d *decoder) parameter(v any, path string) string {
	name := d.text(v, path)
	if d.err != nil {
		return ""
	}
	if _, ok := d.p.Parameter(name); !ok {
		has := make([]string, len(d.p.Parameters))
		for i, q := range d.p.Parameters {
			has[i] = q.Name
		}
		if len(has) == 0 {
			d.fail(path, "unknown parameter %q (the project defines no parameters)", project.Clip(name))
		} else {
			d.fail(path, "unknown parameter %q (the project defines %s)", project.Clip(name), strings.Join(has, ", "))
		}
	}
	return name
}

func (d *decoder) study(v any) *Study {
	m := d.object(v, "", []string{"schema"}, "vary", "report", "seek")
	if m == nil {
		return nil
	}
	if sc := d.text(m["schema"], "schema"); d.err == nil && sc != Schema {
		d.fail("schema", "expected %q, got %q (not an edgewise study, or a newer version)", Schema, project.Clip(sc))
	}
	s := &Study{}
	_, hasVary := m["vary"]
	_, hasSeek := m["seek"]
	switch {
	case hasVary && hasSeek:
		d.fail("seek", "a study has vary or seek, not both")
	case !hasVary && !hasSeek:
		d.fail("vary", "missing (or give a seek)")
	}
	if hasVary {
		s.Vary = d.vary(m["vary"])
	}
	if r, ok := m["report"]; ok {
		for i, pv := range d.list(r, "report") {
			path := fmt.Sprintf("report[%d]", i)
			name := d.text(pv, path)
			if d.err != nil {
				return nil
			}
			s.Report = append(s.Report, name)
			s.outs = append(s.outs, d.output(name, path))
		}
	} else if hasVary {
		d.fail("report", "missing (list the outputs to collect, such as \"max.value\")")
	}
	if hasVary && d.err == nil && len(s.Report) == 0 {
		d.fail("report", "empty (list the outputs to collect, such as \"max.value\")")
	}
	if hasSeek {
		s.Seek = d.seek(m["seek"])
	}
	if d.err != nil {
		return nil
	}
	for _, c := range crossCheckPaths {
		for _, r := range s.Report {
			s.crossNeed = s.crossNeed || r == c
		}
		s.crossNeed = s.crossNeed || s.Seek != nil && s.Seek.Output == c
	}
	return s
}

func (d *decoder) output(name, path string) output {
	o, err := Lookup(name, d.p)
	if err != nil {
		d.fail(path, "%v", err)
	}
	return o
}

func (d *decoder) vary(v any) []Axis {
	list := d.list(v, "vary")
	if d.err == nil && len(list) == 0 {
		d.fail("vary", "empty (give at least one parameter to vary)")
	}
	var axes []Axis
	rows := 1
	for i, av := range list {
		path := fmt.Sprintf("vary[%d]", i)
		a := d.axis(av, path)
		if d.err != nil {
			return nil
		}
		for _, b := range axes {
			if b.Name == a.Name {
				d.fail(path+".name", "%q is varied twice", a.Name)
				return nil
			}
		}
		if rows *= len(a.Values); rows > MaxRows {
			d.fail(path, "the study would have more than %d rows", MaxRows)
			return nil
		}
		axes = append(axes, a)
	}
	return axes
}

// axis reads {"name", "from", "to", "steps", "scale"} or {"name", "values"}.
func (d *decoder) axis(v any, path string) Axis {
	m, ok := v.(map[string]any)
	if !ok {
		d.fail(path, "expected an object {\"name\": ..}, got %s", project.Describe(v))
		return Axis{}
	}
	if _, ok := m["values"]; ok {
		m = d.object(v, path, []string{"name", "values"})
	} else {
		m = d.object(v, path, []string{"name", "from", "to", "steps"}, "scale")
	}
	if m == nil {
		return Axis{}
	}
	a := Axis{Name: d.parameter(m["name"], path+".name")}
	if vs, ok := m["values"]; ok {
		list := d.list(vs, path+".values")
		if d.err == nil && (len(list) == 0 || len(list) > MaxValues) {
			d.fail(path+".values", "give from 1 to %d values, got %d", MaxValues, len(list))
		}
		for j, x := range list {
			a.Values = append(a.Values, d.number(x, fmt.Sprintf("%s.values[%d]", path, j)))
		}
		return a
	}
	from, to := d.number(m["from"], path+".from"), d.number(m["to"], path+".to")
	steps := d.number(m["steps"], path+".steps")
	if d.err != nil {
		return a
	}
	if steps != math.Trunc(steps) || steps < 2 || steps > MaxValues {
		d.fail(path+".steps", "must be a whole number from 2 to %d (the number of values, both ends included), got %g", MaxValues, steps)
		return a
	}
	scale := Linear
	if sv, ok := m["scale"]; ok {
		scale = d.text(sv, path+".scale")
	}
	switch {
	case d.err != nil:
	case scale != Linear && scale != Log:
		d.fail(path+".scale", "unknown scale %q (use linear or log)", project.Clip(scale))
	case scale == Log && !(from > 0 && to > 0):
		bad, at := from, ".from"
		if from > 0 {
			bad, at = to, ".to"
		}
		d.fail(path+at, "a log scale needs both ends above zero, got %g", bad)
	default:
		a.Values = Steps(from, to, int(steps), scale)
	}
	return a
}

// Steps returns n values from from to to, both ends included and exact:
// equally spaced on a linear scale, in equal ratios on a log scale (the
// same numbers on every processor: see pow).
func Steps(from, to float64, n int, scale string) []float64 {
	vals := make([]float64, n)
	for i := range vals {
		t := float64(i) / float64(n-1)
		switch {
		case i == n-1:
			vals[i] = to
		case scale == Log:
			vals[i] = from * pow(to/from, t)
		default:
			vals[i] = from + t*(to-from)
		}
	}
	vals[0] = from
	return vals
}

// seek reads {"name", "from", "to", "target": {"path": value}, "tolerance"}.
func (d *decoder) seek(v any) *Seek {
	m := d.object(v, "seek", []string{"name", "from", "to", "target"}, "tolerance")
	if m == nil {
		return nil
	}
	s := &Seek{Name: d.parameter(m["name"], "seek.name")}
	s.From, s.To = d.number(m["from"], "seek.from"), d.number(m["to"], "seek.to")
	if d.err == nil && s.From == s.To {
		d.fail("seek.to", "the bracket is empty: from and to are both %g", s.From)
	}
	tm, ok := m["target"].(map[string]any)
	if d.err == nil && (!ok || len(tm) != 1) {
		d.fail("seek.target", "expected one output and its target, such as {\"max.value\": 85}, got %s", project.Describe(m["target"]))
	}
	for k, tv := range tm {
		s.Output = k
		s.out = d.output(k, "seek.target")
		s.Target = d.number(tv, "seek.target."+k)
	}
	if tv, ok := m["tolerance"]; ok {
		s.Tolerance = d.number(tv, "seek.tolerance")
		if d.err == nil && !(s.Tolerance > 0) {
			d.fail("seek.tolerance", "must be greater than zero, got %g", s.Tolerance)
		}
	} else {
		s.Tolerance = DefaultTolerance(s.Target)
	}
	return s
}

// DefaultTolerance is the seek's tolerance on the output when the study
// gives none: a millionth of the target, and at least 1e-9.
func DefaultTolerance(target float64) float64 { return max(1e-6*math.Abs(target), 1e-9) }
