package report

import (
	"edgewise/solver"
	"edgewise/solver/physics"
	"edgewise/solver/project"
)

// The report shows its numbers in the project's display units (the
// optional "display" object, project.Display), as the page does
// (site/measure.js holds the same table; a browser test checks that the
// two agree). The project file, the CSV and the runner stay SI.
//
// Factors are exact definitions as listed in NIST SP 811 (2008),
// Appendix B: 1 in = 0.0254 m, 1 ft = 0.3048 m, 1 Btu_IT = 1055.05585262 J,
// 1 h = 3600 s, 1 day = 86400 s; T/°F = 1.8 T/°C + 32, T/K = T/°C + 273.15.
const (
	inch  = 0.0254
	foot  = 0.3048
	day   = 86400.0
	btuH  = 1055.05585262 / 3600 // W in one Btu_IT/h
	fPerK = 1.8
)

// conv turns an SI number into a shown one: v*Scale + Offset (the offset
// only for absolute values).
type conv struct {
	Unit          string
	Scale, Offset float64
}

// kindUnits lists each display kind's units by their name in the file.
var kindUnits = map[string]map[string]conv{
	"length":       {"m": {"m", 1, 0}, "mm": {"mm", 1e3, 0}, "cm": {"cm", 100, 0}, "in": {"in", 1 / inch, 0}, "ft": {"ft", 1 / foot, 0}},
	"temperature":  {"degC": {"°C", 1, 0}, "K": {"K", 1, 273.15}, "degF": {"°F", fPerK, 32}},
	"heat":         {"W": {"", 1, 0}, "BTU/h": {"", 1, 0}},
	"potential":    {"V": {"V", 1, 0}, "mV": {"mV", 1e3, 0}, "kV": {"kV", 1e-3, 0}},
	"field":        {"V/m": {"V/m", 1, 0}, "V/mm": {"V/mm", 1e-3, 0}, "kV/m": {"kV/m", 1e-3, 0}, "kV/mm": {"kV/mm", 1e-6, 0}},
	"permittivity": {"F/m": {"F/m", 1, 0}, "pF/m": {"pF/m", 1e12, 0}},
	"head":         {"m": {"m", 1, 0}, "cm": {"cm", 100, 0}, "ft": {"ft", 1 / foot, 0}},
	"darcy":        {"m/s": {"m/s", 1, 0}, "cm/s": {"cm/s", 100, 0}, "m/day": {"m/day", day, 0}, "ft/day": {"ft/day", day / foot, 0}},
	"discharge":    {"m3/s": {"m³/s per m", 1, 0}, "L/s": {"L/s per m", 1e3, 0}, "m3/day": {"m³/day per m", day, 0}, "ft3/day": {"ft³/day per ft", day / (foot * foot), 0}},
	"rate":         {"1/s": {"1/s", 1, 0}, "1/day": {"1/day", day, 0}},
}

// btu gives the US customary heat units for the W-based SI ones.
var btu = map[string]conv{
	"W/m":      {"Btu/(h·ft)", foot / btuH, 0},
	"W/m²":     {"Btu/(h·ft²)", foot * foot / btuH, 0},
	"W/m³":     {"Btu/(h·ft³)", foot * foot * foot / btuH, 0},
	"W/(m·K)":  {"Btu/(h·ft·°F)", foot / (btuH * fPerK), 0},
	"W/(m²·K)": {"Btu/(h·ft²·°F)", foot * foot / (btuH * fPerK), 0},
}

// shown converts the numbers of one project's report.
type shown struct {
	physics string
	l       solver.UnitSet
	d       project.Display
}

func newShown(p *project.Project) *shown {
	return &shown{physics: p.Physics, l: solver.Units(p.Physics), d: p.Display}
}

// kind returns the chosen unit of a display kind (SI when not chosen).
func (s *shown) kind(k string) conv {
	if c, ok := kindUnits[k][s.d[k]]; ok && s.d[k] != "" {
		return c
	}
	switch k {
	case "length", "head":
		return kindUnits[k]["m"]
	case "temperature":
		return kindUnits[k]["degC"]
	}
	return conv{Scale: 1}
}

// si is the SI unit of a role, from the physics table.
func (s *shown) si(role string) string {
	l := s.l
	return map[string]string{"value": l.ValueUnit, "gradient": l.GradientUnit, "conductivity": l.CondUnit, "flux": l.FluxUnit,
		"flow": l.FlowUnit, "source": l.SourceUnit, "coefficient": l.CoefUnit, "length": l.Length}[role]
}

// conv returns how a role is shown: value, gradient, conductivity, flux,
// flow, source, coefficient or length.
func (s *shown) conv(role string) conv {
	si := s.si(role)
	same := conv{Unit: si, Scale: 1}
	L := s.kind("length")
	if role == "length" {
		return L
	}
	pick := func(kinds map[string]string) conv {
		k, ok := kinds[role]
		if !ok {
			return same
		}
		c := s.kind(k)
		if c.Unit == "" {
			return same
		}
		return c
	}
	switch s.physics {
	case physics.Heat:
		T := s.kind("temperature")
		switch {
		case role == "value":
			return T
		case role == "gradient":
			u := "K"
			if s.d["temperature"] == "degF" {
				u = "°F"
			}
			return conv{Unit: u + "/" + L.Unit, Scale: T.Scale / L.Scale}
		case s.d["heat"] == "BTU/h":
			if c, ok := btu[si]; ok {
				return c
			}
		}
		return same
	case physics.Electrostatic:
		return pick(map[string]string{"value": "potential", "gradient": "field", "conductivity": "permittivity"})
	case physics.Seepage:
		return pick(map[string]string{"value": "head", "conductivity": "darcy", "flux": "darcy", "flow": "discharge", "source": "rate", "coefficient": "rate"})
	}
	if role == "gradient" && L.Scale != 1 {
		return conv{Unit: "per " + L.Unit, Scale: 1 / L.Scale}
	}
	return same
}

// num prints an absolute value of a role as shown; diff a difference (an
// error estimate, a step: no offset); unit the role's shown unit.
func (s *shown) num(role string, v float64) string {
	c := s.conv(role)
	return num(v*c.Scale + c.Offset)
}
func (s *shown) diff(role string, v float64) string { return num(v * s.conv(role).Scale) }

//go:noinline
func (s *shown) unit(role string) string { return s.conv(role).Unit }

// conductance returns how a conductance per metre is shown (it converts
// like the material constant for heat and electrostatics; seepage keeps
// SI) and the unit of its inverse.
func (s *shown) conductance(tm physics.Terms) (c conv, inverse string) {
	c = conv{Unit: tm.ConductanceUnit, Scale: 1}
	if s.physics == physics.Heat || s.physics == physics.Electrostatic {
		if k := s.conv("conductivity"); k.Unit != tm.ConductanceUnit {
			c = k
		}
	}
	switch {
	case c.Unit == tm.ConductanceUnit:
		return c, tm.ResistanceUnit
	case c.Unit == "Btu/(h·ft·°F)":
		return c, "h·ft·°F/Btu"
	}
	return c, "1/(" + c.Unit + ")"
}

// perLength returns how an edge's flow per length is shown (a flux
// density, except for electrostatics' surface charge, kept SI).
func (s *shown) perLength(tm physics.Terms) conv {
	if s.physics == physics.Electrostatic {
		return conv{Unit: tm.PerLengthUnit, Scale: 1}
	}
	c := s.conv("flux")
	if c.Unit == "" {
		return conv{Unit: tm.PerLengthUnit, Scale: 1}
	}
	return c
}

// Shown returns how the report shows a quantity of a physics under a
// display choice: shown = SI*scale + offset, in unit. role is one of value,
// gradient, conductivity, flux, flow, source, coefficient, length. The
// browser tests compare it with the page's table (site/measure.js).
func Shown(physicsID string, d project.Display, role string) (unit string, scale, offset float64) {
	s := newShown(&project.Project{Physics: physicsID, Display: d})
	c := s.conv(role)
	return c.Unit, c.Scale, c.Offset
}
