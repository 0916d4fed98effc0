package project

import "edgewise/solver/jsonlite"

// Asked holds what the user gives for the derived answers (the project's
// optional "answers" object). Zero means "not given": the engine then uses
// the stated default (common practice) or leaves the answer out.
//
//	"answers": {"channels": 8,
//	            "dielectric": "FR-4", "breakdown_strength": 2e7,
//	            "saturated_unit_weight": 20, "water_unit_weight": 9.81,
//	            "specific_gravity": 2.65, "void_ratio": 0.6}
type Asked struct {
	// Channels is the number of flow channels of the flow net (1 .. 100).
	Channels int
	// Dielectric names the insulating material; BreakdownStrength is its
	// breakdown field strength in V/m.
	Dielectric        string
	BreakdownStrength float64
	// SaturatedUnitWeight and WaterUnitWeight are in kN/m³; the critical
	// hydraulic gradient is (γsat - γw)/γw when γsat is given.
	SaturatedUnitWeight float64
	WaterUnitWeight     float64
	// SpecificGravity (Gs) and VoidRatio (e) give the critical gradient
	// (Gs - 1)/(1 + e) when both are given and γsat is not.
	SpecificGravity float64
	VoidRatio       float64
	// Datum is the height y (m, in the section's coordinates) where the
	// elevation z is zero, for the uplift under an impervious base: the
	// pore pressure is γw (h − z), z = y − Datum, the heads being measured
	// from the same datum. 0 (the default) puts it at the bottom edge.
	Datum float64
}

// MaxChannels is the largest number of flow channels a project may ask for.
const MaxChannels = 100

var askedKeys = []string{"channels", "dielectric", "breakdown_strength", "saturated_unit_weight",
	"water_unit_weight", "specific_gravity", "void_ratio", "datum"}

func (d *decoder) asked(v any) *Asked {
	m := d.object(v, "answers", nil, askedKeys...)
	if m == nil {
		return nil
	}
	a := &Asked{}
	if x, ok := m["channels"]; ok {
		a.Channels = d.integer(x, "answers.channels", 1, MaxChannels)
	}
	if x, ok := m["dielectric"]; ok {
		a.Dielectric = d.text(x, "answers.dielectric")
	}
	pos := func(key string, dst *float64) {
		if x, ok := m[key]; ok {
			*dst = d.positive(x, "answers."+key)
		}
	}
	pos("breakdown_strength", &a.BreakdownStrength)
	pos("saturated_unit_weight", &a.SaturatedUnitWeight)
	pos("water_unit_weight", &a.WaterUnitWeight)
	pos("specific_gravity", &a.SpecificGravity)
	pos("void_ratio", &a.VoidRatio)
	if x, ok := m["datum"]; ok {
		a.Datum = d.number(x, "answers.datum")
	}
	if d.err == nil && a.SaturatedUnitWeight > 0 {
		gw := a.WaterUnitWeight
		if gw == 0 {
			gw = 9.81
		}
		if a.SaturatedUnitWeight <= gw {
			d.fail("answers.saturated_unit_weight", "%g kN/m³ is not heavier than water (%g kN/m³)", a.SaturatedUnitWeight, gw)
		}
	}
	if d.err == nil && a.SpecificGravity > 0 && a.SpecificGravity <= 1 {
		d.fail("answers.specific_gravity", "%g is not heavier than water (Gs > 1)", a.SpecificGravity)
	}
	return a
}

func (a *Asked) write(w *jsonlite.Writer) {
	w.Open('{')
	if a.Channels > 0 {
		w.Key("channels").Int(a.Channels)
	}
	if a.Dielectric != "" {
		w.Key("dielectric").Str(a.Dielectric)
	}
	for _, f := range []struct {
		k string
		v float64
	}{{"breakdown_strength", a.BreakdownStrength}, {"saturated_unit_weight", a.SaturatedUnitWeight},
		{"water_unit_weight", a.WaterUnitWeight}, {"specific_gravity", a.SpecificGravity}, {"void_ratio", a.VoidRatio}} {
		if f.v > 0 {
			w.Key(f.k).Num(f.v)
		}
	}
	if a.Datum != 0 {
		w.Key("datum").Num(a.Datum)
	}
	w.Close('}')
}
