package project

import (
	"errors"
	"math"
	"slices"
	"sort"

	"edgewise/solver/expr"
	"edgewise/solver/jsonlite"
)

// MaxParameters bounds the number of parameters of a project.
const MaxParameters = 100

// Parameter is a named number of a project. Every formula may use it like
// pi, and so may every number field written as text ("width": "w_plate",
// "h": "2*h_top").
type Parameter struct {
	Name  string
	Value float64
}

// Consts returns the parameters as the named constants of the formula
// language.
func (p *Project) Consts() []expr.Const {
	if len(p.Parameters) == 0 {
		return nil
	}
	c := make([]expr.Const, len(p.Parameters))
	for i, q := range p.Parameters {
		c[i] = expr.Const{Name: q.Name, Value: q.Value}
	}
	return c
}

// Parameter returns the value of the named parameter.
func (p *Project) Parameter(name string) (float64, bool) {
	for _, q := range p.Parameters {
		if q.Name == name {
			return q.Value, true
		}
	}
	return 0, false
}

// With returns the project with some parameters set to other values: every
// number field written as text is worked out again and checked as Decode
// checks it (a width that becomes negative is an error naming "width").
// Naming a parameter the project does not define is an error. p is not
// changed.
func (p *Project) With(values map[string]float64) (*Project, error) {
	return DecodeWith(p.JSON(), values)
}

// DecodeWith is Decode with the values of some parameters replaced by
// values, as if the file had been written with them.
func DecodeWith(data []byte, values map[string]float64) (*Project, error) {
	return decode(data, values)
}

// parameters reads the "parameters" object: names that a formula can use
// and that shadow nothing, each a finite number. Values in d.override
// replace the file's. The parameters are kept in name order.
func (d *decoder) parameters(v any) []Parameter {
	m, ok := v.(map[string]any)
	if !ok {
		d.fail("parameters", "expected an object {\"name\": number, ...}, got %s", Describe(v))
		return nil
	}
	if len(m) > MaxParameters {
		d.fail("parameters", "at most %d parameters, got %d", MaxParameters, len(m))
		return nil
	}
	names := make([]string, 0, len(m))
	for k := range m {
		names = append(names, k)
	}
	sort.Strings(names)
	var out []Parameter
	for _, name := range names {
		path := "parameters." + name
		if err := expr.CheckName(name); err != nil {
			d.fail(path, "cannot name a parameter: %v", err)
			return nil
		}
		if _, isText := m[name].(string); isText {
			d.fail(path, "a parameter is a number, got %s", Describe(m[name]))
			return nil
		}
		val := d.number(m[name], path)
		if o, ok := d.override[name]; ok {
			val = o
		}
		out = append(out, Parameter{Name: name, Value: val})
	}
	var unknown []string
	for name, val := range d.override {
		if !slices.ContainsFunc(out, func(q Parameter) bool { return q.Name == name }) {
			unknown = append(unknown, name)
		}
		if math.IsInf(val, 0) || math.IsNaN(val) {
			d.fail("parameters."+name, "%g is not a finite number", val)
		}
	}
	if len(unknown) > 0 {
		sort.Strings(unknown)
		d.fail("parameters."+unknown[0], "not a parameter of this project")
	}
	return out
}

// quantity reads a number field that may also be written as text: a
// formula of the parameters and constants such as pi, worked out once.
// The text is kept in d.texts under the field's path, so that the project
// is written back as it was written.
func (d *decoder) quantity(v any, path string) float64 {
	src, ok := v.(string)
	if !ok {
		return d.number(v, path)
	}
	if d.err != nil {
		return 0
	}
	if len(src) > MaxTextBytes {
		d.fail(path, "text is longer than %d bytes", MaxTextBytes)
		return 0
	}
	e, err := expr.CompileWith(src, d.consts)
	if err != nil {
		var xe *expr.Error
		if errors.As(err, &xe) {
			d.err = &Error{Path: path, Col: xe.Col, Msg: xe.Msg}
		} else {
			d.fail(path, "%v", err)
		}
		return 0
	}
	f, _ := e.Const() // no variables: always a constant
	if math.IsInf(f, 0) || math.IsNaN(f) {
		d.fail(path, "%s gives %g, not a finite number", src, f)
		return 0
	}
	d.use(e.Named())
	if d.texts == nil {
		d.texts = map[string]string{}
	}
	d.texts[path] = src
	return f
}

func (d *decoder) use(names []string) {
	if d.used == nil {
		d.used = map[string]bool{}
	}
	for _, n := range names {
		d.used[n] = true
	}
}

// checkUsed refuses a parameter that no formula and no number field uses.
// A formula that does not compile is left to Compile to report with its
// column; the check is then skipped, so that the first error the user sees
// is the formula's.
func (d *decoder) checkUsed(p *Project) {
	if d.err != nil || p == nil || len(p.Parameters) == 0 {
		return
	}
	for _, e := range p.Edges {
		for _, s := range e.Segments {
			src, _ := s.data()
			x, err := expr.CompileWith(src, d.consts, formulaVars...)
			if err != nil {
				return
			}
			d.use(x.Named())
		}
	}
	for _, q := range p.Parameters {
		if !d.used[q.Name] {
			d.fail("parameters."+q.Name, "defined but not used (use it in a formula or a number field, or remove it)")
			return
		}
	}
}

// writeParameters writes the "parameters" object, if any.
func (p *Project) writeParameters(w *jsonlite.Writer) {
	if len(p.Parameters) == 0 {
		return
	}
	w.Key("parameters").Open('{')
	for _, q := range p.Parameters {
		w.Key(q.Name).Num(q.Value)
	}
	w.Close('}')
}

// writeNum writes the number field at path as it was written: its text
// when it was written as text, else the number.
func (p *Project) writeNum(w *jsonlite.Writer, path string, v float64) {
	if t, ok := p.Texts[path]; ok {
		w.Str(t)
		return
	}
	w.Num(v)
}
