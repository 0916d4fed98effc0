package physics

import (
	"edgewise/solver/jsonlite"
)

// Schema names the JSON form of the table.
const Schema = "edgewise-physics/1"

// JSON returns the whole table in the form the page reads (see the
// package comment). The cautions stay in Go: the page shows the ones a
// solve returns.
func JSON() []byte {
	var w jsonlite.Writer
	w.Open('{').Key("schema").Str(Schema).Key("physics").Open('[')
	for _, p := range table {
		w.Open('{').Key("id").Str(p.ID).Key("name").Str(p.Name)
		w.Key("units")
		p.Units.write(&w)
		w.Key("kinds").Open('{').Key("value").Str(p.Kinds.Value).Key("flux").Str(p.Kinds.Flux).
			Key("convection").Str(p.Kinds.Convection).Close('}')
		w.Key("labels").Open('{').Key("flux_in").Str(p.Labels.FluxIn).Key("ambient").Str(p.Labels.Ambient).Close('}')
		w.Key("hints").Open('{').Key("physics").Str(p.Hints.Physics).Key("conductivity").Str(p.Hints.Conductivity).
			Key("source").Str(p.Hints.Source).Key("h").Str(p.Hints.H).Close('}')
		w.Key("magnitude").Str(p.Magnitude).Key("readout").Str(p.Readout)
		if p.Also.Unit != "" {
			w.Key("also").Open('{').Key("unit").Str(p.Also.Unit).Key("scale").Num(p.Also.Scale).Close('}')
		}
		w.Key("default_h").Str(p.DefaultH)
		if p.Usual.Conductivity[1] > 0 || p.Usual.H[1] > 0 {
			w.Key("usual").Open('{')
			for _, r := range []struct {
				key  string
				span [2]float64
			}{{"conductivity", p.Usual.Conductivity}, {"h", p.Usual.H}} {
				if r.span[1] > 0 {
					w.Key(r.key).Open('[').Num(r.span[0]).Num(r.span[1]).Close(']')
				}
			}
			w.Key("source").Str(p.Usual.Source).Close('}')
		}
		if ex := p.Example(); ex != nil {
			v, err := jsonlite.Parse(ex)
			if err != nil {
				panic("physics: example of " + p.ID + ": " + err.Error())
			}
			if w.Key("example"); w.Value(v) != nil {
				panic("physics: example of " + p.ID + " holds a number JSON cannot keep")
			}
		}
		if more := p.MoreExamples(); len(more) > 0 {
			w.Key("more_examples").Open('[')
			for _, ex := range more {
				v, err := jsonlite.Parse(ex)
				if err != nil {
					panic("physics: an example of " + p.ID + ": " + err.Error())
				}
				if w.Value(v) != nil {
					panic("physics: an example of " + p.ID + " holds a number JSON cannot keep")
				}
			}
			w.Close(']')
		}
		p.Terms.write(&w)
		w.Close('}')
	}
	return w.Close(']').Close('}').Bytes()
}

// write writes the unit set as a JSON object with the keys physics, value,
// value_unit, gradient, gradient_unit, conductivity, conductivity_unit,
// flux, flux_unit, flow_unit, source, source_unit, coefficient,
// coefficient_unit and length_unit.
func (u *Units) write(w *jsonlite.Writer) {
	w.Open('{')
	for _, kv := range u.Pairs() {
		w.Key(kv[0]).Str(kv[1])
	}
	w.Close('}')
}

// Pairs returns the unit set as key, value pairs with the keys of its JSON
// form, in that order.
func (u *Units) Pairs() [][2]string {
	return [][2]string{
		{"physics", u.Physics}, {"value", u.Value}, {"value_unit", u.ValueUnit},
		{"gradient", u.Gradient}, {"gradient_unit", u.GradientUnit},
		{"conductivity", u.Conductivity}, {"conductivity_unit", u.CondUnit},
		{"flux", u.Flux}, {"flux_unit", u.FluxUnit}, {"flow_unit", u.FlowUnit},
		{"source", u.Source}, {"source_unit", u.SourceUnit},
		{"coefficient", u.Coefficient}, {"coefficient_unit", u.CoefUnit},
		{"length_unit", u.Length},
	}
}

// write writes the answer terms as the key "terms": {"conductance", ..,
// "dielectrics": [{"name", "strength", "rel_perm", "source"}, ..]}.
func (t *Terms) write(w *jsonlite.Writer) {
	w.Key("terms").Open('{')
	for _, kv := range [][2]string{{"conductance", t.Conductance}, {"conductance_unit", t.ConductanceUnit},
		{"resistance", t.Resistance}, {"resistance_unit", t.ResistanceUnit}, {"edge_flow", t.EdgeFlow},
		{"per_length", t.PerLength}, {"per_length_unit", t.PerLengthUnit},
		{"source_rate", t.SourceRate}, {"source_rate_unit", t.SourceRateUnit}} {
		w.Key(kv[0]).Str(kv[1])
	}
	w.Key("vacuum_permittivity").Num(VacuumPermittivity)
	w.Key("dielectrics").Open('[')
	for _, d := range t.Dielectrics {
		w.Open('{').Key("name").Str(d.Name).Key("strength").Num(d.Strength).Key("rel_perm").Num(d.RelPerm).
			Key("source").Str(d.Source).Close('}')
	}
	w.Close(']').Close('}')
}
