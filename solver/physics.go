package solver

import "edgewise/solver/project"

// UnitSet names the quantities and units of one physics, for labels,
// legends, CSV headers and cautions. Lengths are in metres throughout.
type UnitSet struct {
	Physics      string `json:"physics"`
	Value        string `json:"value"`         // name of the field
	ValueUnit    string `json:"value_unit"`    // its unit
	Gradient     string `json:"gradient"`      // name of minus the gradient or the gradient
	GradientUnit string `json:"gradient_unit"` // unit of the gradient
	Conductivity string `json:"conductivity"`  // name of the material constant
	CondUnit     string `json:"conductivity_unit"`
	Flux         string `json:"flux"` // name of the flux density
	FluxUnit     string `json:"flux_unit"`
	FlowUnit     string `json:"flow_unit"` // flow through an edge per metre of depth
	Source       string `json:"source"`
	SourceUnit   string `json:"source_unit"`
	Coefficient  string `json:"coefficient"` // the Robin (convection) coefficient
	CoefUnit     string `json:"coefficient_unit"`
	Length       string `json:"length_unit"`
}

// Units returns the quantities and units of a physics; an unknown name
// gives the generic set.
func Units(physics string) UnitSet {
	switch physics {
	case project.Heat:
		return UnitSet{Physics: project.Heat,
			Value: "temperature", ValueUnit: "°C",
			Gradient: "temperature gradient", GradientUnit: "K/m",
			Conductivity: "thermal conductivity", CondUnit: "W/(m·K)",
			Flux: "heat flux", FluxUnit: "W/m²", FlowUnit: "W/m",
			Source: "heat generation", SourceUnit: "W/m³",
			Coefficient: "convection coefficient", CoefUnit: "W/(m²·K)", Length: "m"}
	case project.Electrostatic:
		return UnitSet{Physics: project.Electrostatic,
			Value: "potential", ValueUnit: "V",
			Gradient: "potential gradient", GradientUnit: "V/m",
			Conductivity: "permittivity", CondUnit: "F/m",
			Flux: "electric displacement", FluxUnit: "C/m²", FlowUnit: "C/m",
			Source: "charge density", SourceUnit: "C/m³",
			Coefficient: "Robin coefficient", CoefUnit: "F/m²", Length: "m"}
	case project.Seepage:
		return UnitSet{Physics: project.Seepage,
			Value: "hydraulic head", ValueUnit: "m",
			Gradient: "hydraulic gradient", GradientUnit: "m/m",
			Conductivity: "hydraulic conductivity", CondUnit: "m/s",
			Flux: "Darcy flux", FluxUnit: "m/s", FlowUnit: "m²/s",
			Source: "recharge", SourceUnit: "1/s",
			Coefficient: "leakance", CoefUnit: "1/s", Length: "m"}
	}
	return UnitSet{Physics: project.Generic,
		Value: "u", Gradient: "gradient", Conductivity: "conductivity",
		Flux: "flux", Source: "source", Coefficient: "Robin coefficient", Length: "m"}
}
