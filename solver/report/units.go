package report

import (
	"edgewise/solver"
	"edgewise/solver/export"
)

// Labels names the quantities of one physics and their units. An empty
// unit means the physics has none (generic).
type Labels struct {
	Quantity     string // the field, e.g. "temperature"
	Unit         string // of the field
	FluxName     string // e.g. "heat flux"
	FluxUnit     string
	FlowUnit     string // flow through an edge per unit depth
	Conductivity string // name of the material constant
	CondUnit     string
	SourceUnit   string // uniform volumetric source
	HUnit        string // convection coefficient
	LengthUnit   string
}

// LabelsFor returns the labels of a physics; an unknown name gets the
// generic labels.
func LabelsFor(physics string) Labels {
	switch physics {
	case solver.Heat:
		return Labels{"temperature", "°C", "heat flux", "W/m2", "W/m", "thermal conductivity", "W/(m K)", "W/m3", "W/(m2 K)", "m"}
	case solver.Electrostatic:
		return Labels{"potential", "V", "electric displacement", "C/m2", "C/m", "permittivity", "F/m", "C/m3", "F/m2", "m"}
	case solver.Seepage:
		return Labels{"hydraulic head", "m", "Darcy flux", "m/s", "m2/s", "hydraulic conductivity", "m/s", "1/s", "1/s", "m"}
	}
	return Labels{Quantity: "value", FluxName: "flux", Conductivity: "conductivity", LengthUnit: "m"}
}

// Units returns the labels as the export package takes them.
func (l Labels) Units() export.Units {
	return export.Units{Quantity: l.Quantity, Unit: l.Unit, FluxUnit: l.FluxUnit, LengthUnit: l.LengthUnit}
}

// with writes "name [unit]", or the bare name when there is no unit.
func with(name, unit string) string {
	if unit == "" {
		return name
	}
	return name + " [" + unit + "]"
}
