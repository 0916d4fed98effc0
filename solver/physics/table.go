package physics

import (
	"embed"
	"io/fs"
)

// examples holds each physics' example project, as the page offers it when
// the user switches to that physics (examples/ID.json; heat's is the
// page's first demo, site/demo.json), and its further examples
// (examples/ID-NAME.json, e.g. one whose edges are made of segments).
//
//go:embed examples/*.json
var examples embed.FS

// Ids of the physics in the table, as a project file writes them.
const (
	Heat          = "heat"
	Electrostatic = "electrostatic"
	Seepage       = "seepage"
	Generic       = "generic"
)

// Physics is one entry of the table.
type Physics struct {
	ID   string // as written in a project file
	Name string // the page's choice, e.g. "Heat conduction (temperature)"
	Units
	Kinds  Kinds
	Labels Labels
	Hints  Hints
	// Magnitude names the size of the gradient as a column heading, saying
	// that it is a magnitude; Readout names it in the pointer readout.
	Magnitude, Readout string
	// Also shows the size of the gradient in a second unit as well (the
	// field strength in kV/mm); zero when there is none.
	Also Also
	// DefaultH is the h the page fills in when an edge turns to convection.
	DefaultH string
	// Usual is the span of values a project of this physics usually has;
	// the page warns about a number outside it (a number typed for another
	// physics, or a slip of the exponent), but solves all the same.
	Usual Usual
	// Cautions lists the physics-specific cautions of a solved field
	// (without the Deferral, which Cautions adds); nil when there are none.
	cautions func(p *Physics, f Field) []string
	// Terms name the derived answers (answers.go in package solver).
	Terms Terms
}

// Terms name the derived answers of a physics with their units.
type Terms struct {
	Conductance, ConductanceUnit string // flow per unit difference between two terminals
	Resistance, ResistanceUnit   string // its inverse, when the trade quotes it
	EdgeFlow                     string // the flow through a value part (charge on an electrode)
	PerLength, PerLengthUnit     string // flow per unit length of edge
	// SourceRate names the source as a rate the trade recognises, with
	// its unit spelt out.
	SourceRate, SourceRateUnit string
	// Dielectrics are typical insulating materials offered for the
	// breakdown check, each with its source.
	Dielectrics []Dielectric
}

// Dielectric is an insulating material with its breakdown strength (V/m)
// and relative permittivity, and where the values come from.
type Dielectric struct {
	Name              string
	Strength, RelPerm float64
	Source            string
}

// VacuumPermittivity is ε0 in F/m (CODATA 2018).
const VacuumPermittivity = 8.8541878128e-12

// Units names the quantities and units of one physics, for labels,
// legends, CSV headers and cautions. Lengths are in metres throughout.
type Units struct {
	Physics      string
	Value        string // name of the field
	ValueUnit    string // its unit
	Gradient     string // name of the gradient
	GradientUnit string // unit of the gradient
	Conductivity string // name of the material constant
	CondUnit     string
	Flux         string // name of the flux density
	FluxUnit     string
	FlowUnit     string // flow through an edge per metre of depth
	Source       string
	SourceUnit   string
	Coefficient  string // the Robin (convection) coefficient
	CoefUnit     string
	Length       string
}

// Kinds names the three edge kinds for a physics, with the textbook name
// of the condition after it.
type Kinds struct{ Value, Flux, Convection string }

// Labels name the data of an edge in the trade's own words (the value and
// the coefficient are named by Units).
type Labels struct {
	// FluxIn names what a flux edge's formula gives: the flux entering the
	// region per unit area (heat flux in, surface charge density, inflow).
	FluxIn string
	// Ambient names what a Robin edge's formula gives: the value on the
	// far side of the boundary layer (fluid temperature, electrode
	// potential, head beyond a leaky layer).
	Ambient string
}

// Hints are shown beside the inputs: typical values with their sources
// (rules of thumb are marked as common practice).
type Hints struct {
	Physics      string // under the choice of physics
	Conductivity string
	Source       string
	H            string // under a convection edge's coefficient
}

// Usual holds the usual spans [low, high] of the material constant and
// of the Robin coefficient (zero spans: no check), and where they come from.
type Usual struct {
	Conductivity, H [2]float64
	Source          string
}

// Example returns the physics' example project (JSON), or nil when it has
// none.
func (p *Physics) Example() []byte {
	b, err := examples.ReadFile("examples/" + p.ID + ".json")
	if err != nil {
		return nil
	}
	return b
}

// MoreExamples returns the physics' further example projects (JSON), in
// the order of their file names.
func (p *Physics) MoreExamples() [][]byte {
	names, err := fs.Glob(examples, "examples/"+p.ID+"-*.json")
	if err != nil {
		panic("physics: " + err.Error())
	}
	var out [][]byte
	for _, name := range names {
		b, err := examples.ReadFile(name)
		if err != nil {
			panic("physics: " + err.Error())
		}
		out = append(out, b)
	}
	return out
}

// Also is a second unit for the size of the gradient: Scale gradient units
// make one Unit.
type Also struct {
	Unit  string
	Scale float64
}

// table is every physics, in the order the page offers them.
var table = []*Physics{
	{
		ID: Heat, Name: "Heat conduction (temperature)",
		Units: Units{Physics: Heat,
			Value: "temperature", ValueUnit: "°C",
			Gradient: "temperature gradient", GradientUnit: "K/m",
			Conductivity: "thermal conductivity", CondUnit: "W/(m·K)",
			Flux: "heat flux", FluxUnit: "W/m²", FlowUnit: "W/m",
			Source: "heat generation", SourceUnit: "W/m³",
			Coefficient: "convection coefficient", CoefUnit: "W/(m²·K)", Length: "m"},
		Kinds: Kinds{
			Value:      "Fixed temperature (Dirichlet)",
			Flux:       "Heat flux in; 0 = insulated (Neumann)",
			Convection: "Convection to a fluid (Robin)",
		},
		Labels: Labels{FluxIn: "heat flux in", Ambient: "fluid temperature"},
		Hints: Hints{
			// the burn threshold: common practice (see BurnTemperature)
			Physics: "Surfaces above about 60 °C burn skin on brief contact (common practice).",
			// Incropera & DeWitt, Fundamentals of Heat and Mass Transfer, Table A.1 (read)
			Conductivity: "Typical: stainless steel ≈ 15, carbon steel ≈ 50, aluminium 170–237, copper ≈ 400 W/(m·K) (Incropera, Table A.1).",
			Source:       "Heat generated per unit volume, e.g. by a current or a reaction; 0 for none.",
			// Incropera & DeWitt, Table 1.1 (from memory)
			H: "Free convection in gases ≈ 2–25, forced ≈ 25–250 W/(m²·K) (Incropera, Table 1.1).",
		},
		Magnitude: "temperature gradient magnitude |∇T|", Readout: "temperature gradient |∇T|",
		DefaultH: "10",
		// polyurethane foam about 0.026, diamond about 2300 W/(m·K)
		// (Incropera & DeWitt, Tables A.1 and A.3, from memory); free
		// convection in gases from about 2, boiling and condensation up to
		// about 1e5 W/(m²·K) (Incropera, Table 1.1, from memory)
		Usual: Usual{Conductivity: [2]float64{0.01, 2500}, H: [2]float64{0.5, 1e5},
			Source: "insulating foams to diamond; still air to condensing steam (Incropera & DeWitt, Tables A.1, A.3 and 1.1)"},
		cautions: heatCautions,
		Terms: Terms{
			Conductance: "thermal conductance", ConductanceUnit: "W/(m·K)",
			Resistance: "thermal resistance", ResistanceUnit: "m·K/W",
			EdgeFlow: "heat flow", PerLength: "heat flow per metre of edge", PerLengthUnit: "W/m²",
			SourceRate: "heat generation", SourceRateUnit: "W/m³",
		},
	},
	{
		ID: Electrostatic, Name: "Electrostatics (potential)",
		Units: Units{Physics: Electrostatic,
			Value: "potential", ValueUnit: "V",
			Gradient: "potential gradient", GradientUnit: "V/m",
			Conductivity: "permittivity", CondUnit: "F/m",
			Flux: "electric displacement", FluxUnit: "C/m²", FlowUnit: "C/m",
			Source: "charge density", SourceUnit: "C/m³",
			Coefficient: "layer capacitance per area", CoefUnit: "F/m²", Length: "m"},
		Kinds: Kinds{
			Value:      "Fixed potential, electrode (Dirichlet)",
			Flux:       "Surface charge; 0 = symmetry line (Neumann)",
			Convection: "Thin dielectric layer over an electrode (Robin)",
		},
		// the normal electric displacement entering the region equals the
		// surface charge density on the boundary (Gauss's law, no field
		// outside)
		Labels: Labels{FluxIn: "surface charge density σ", Ambient: "electrode potential beyond the layer"},
		Hints: Hints{
			// AMS Glossary of Meteorology (read); see AirBreakdown
			Physics: "Dry air at sea level breaks down near 3 kV/mm (AMS Glossary of Meteorology).",
			// the vacuum permittivity is the CODATA value
			Conductivity: "Permittivity ε = εr × 8.854×10⁻¹² F/m; dry air εr ≈ 1.",
			Source:       "Free charge per unit volume; 0 in an air or vacuum gap.",
			H:            "A thin coating of permittivity εl and thickness d over an electrode: εl/d, e.g. a 0.1 mm film with εr = 4 gives 3.5×10⁻⁷ F/m².",
		},
		Magnitude: "field strength |E|", Readout: "field strength |E|",
		Also:     Also{Unit: "kV/mm", Scale: 1e6},
		DefaultH: "3.5e-7",
		// vacuum (εr = 1) to ferroelectric ceramics (εr up to about 1e4,
		// from memory); no material is below the vacuum permittivity
		// layer capacitance: vacuum over 1 m to εr 1e4 over 1 µm
		Usual: Usual{Conductivity: [2]float64{8.8e-12, 8.9e-8}, H: [2]float64{8.8e-12, 0.1},
			Source: "from vacuum (εr = 1) to ferroelectric ceramics (εr ≈ 10⁴)"},
		cautions: electrostaticCautions,
		Terms: Terms{
			Conductance: "capacitance", ConductanceUnit: "F/m",
			EdgeFlow: "charge", PerLength: "mean surface charge density", PerLengthUnit: "C/m²",
			SourceRate: "charge density", SourceRateUnit: "C/m³",
			Dielectrics: []Dielectric{
				// AMS Glossary of Meteorology, "dielectric strength" (read)
				{Name: "dry air at sea level", Strength: AirBreakdown, RelPerm: 1, Source: "AMS Glossary of Meteorology"},
				// laminate datasheets quote about 20 kV/mm and εr about 4.4 (common practice)
				{Name: "FR-4 laminate", Strength: 20e6, RelPerm: 4.4, Source: "common practice; check the laminate's datasheet"},
			},
		},
	},
	{
		ID: Seepage, Name: "Groundwater seepage (hydraulic head)",
		Units: Units{Physics: Seepage,
			Value: "hydraulic head", ValueUnit: "m",
			Gradient: "hydraulic gradient", GradientUnit: "m/m",
			Conductivity: "hydraulic conductivity", CondUnit: "m/s",
			Flux: "Darcy flux", FluxUnit: "m/s", FlowUnit: "m²/s",
			Source: "recharge", SourceUnit: "1/s",
			Coefficient: "leakance", CoefUnit: "1/s", Length: "m"},
		Kinds: Kinds{
			Value:      "Fixed head, water level (Dirichlet)",
			Flux:       "Inflow; 0 = impermeable (Neumann)",
			Convection: "Leaky boundary through a semi-pervious layer (Robin)",
		},
		Labels: Labels{FluxIn: "inflow (Darcy flux in)", Ambient: "head beyond the leaky layer"},
		Hints: Hints{
			// the critical gradient: common practice in soil mechanics (see CriticalGradient)
			Physics:      "Exit gradients near (Gs − 1)/(1 + e) ≈ 1 start heave and piping (common practice).",
			Conductivity: "Hydraulic conductivity of the ground; layered soils are often more permeable along the layers.",
			Source:       "Recharge per unit volume (1/s); 0 for none.",
			H:            "Leakance of a semi-pervious layer: its conductivity over its thickness.",
		},
		Magnitude: "hydraulic gradient magnitude |i|", Readout: "hydraulic gradient |i|",
		DefaultH: "1e-7",
		// unfractured rock about 1e-13, clean gravel about 1 m/s (Freeze &
		// Cherry, Groundwater, Table 2.2, from memory); leakance: the same
		// conductivities over layers 0.1 to 10 m thick (common practice)
		Usual: Usual{Conductivity: [2]float64{1e-13, 1}, H: [2]float64{1e-14, 10},
			Source: "unfractured rock to clean gravel (Freeze & Cherry, Groundwater, Table 2.2)"},
		cautions: seepageCautions,
		Terms: Terms{
			Conductance: "discharge per metre of head difference", ConductanceUnit: "m²/s per m",
			EdgeFlow: "discharge", PerLength: "mean Darcy flux across the edge", PerLengthUnit: "m/s",
			SourceRate: "recharge rate", SourceRateUnit: "m³ of water per m³ of ground per second",
		},
	},
	{
		ID: Generic, Name: "Generic (lengths in m, no other units)",
		Units: Units{Physics: Generic,
			Value: "value u", Gradient: "gradient of u", Conductivity: "conductivity K",
			Flux: "flux", Source: "source", Coefficient: "Robin coefficient h", Length: "m"},
		Kinds: Kinds{
			Value:      "Value (Dirichlet)",
			Flux:       "Flux in (Neumann)",
			Convection: "Mixed, h (u_amb - u) in (Robin)",
		},
		Labels: Labels{FluxIn: "flux in", Ambient: "outside value u_amb"},
		Hints: Hints{
			Conductivity: "Coefficient of the equation div(K grad u) + source = 0.",
			Source:       "Uniform source term.",
			H:            "Coefficient h of the mixed condition.",
		},
		Magnitude: "gradient magnitude |∇u|", Readout: "gradient |∇u|",
		DefaultH: "1",
		Terms:    Terms{Conductance: "conductance", EdgeFlow: "flow", PerLength: "flow per unit length of edge", SourceRate: "source"},
	},
}

// All returns every physics in the page's order. The entries are shared:
// callers must not change them.
func All() []*Physics { return table }

// Lookup returns the physics with this id. It stays out of line: inlined
// at its many calls (a loop each) it made the engine 8 KB larger.
//
//go:noinline
func Lookup(id string) (*Physics, bool) {
	for _, p := range table {
		if p.ID == id {
			return p, true
		}
	}
	return nil, false
}

// Get returns the physics with this id, or the generic one for an unknown
// id.
func Get(id string) *Physics {
	if p, ok := Lookup(id); ok {
		return p
	}
	p, _ := Lookup(Generic)
	return p
}

// Choices lists the ids for an error message: "heat, electrostatic,
// seepage or generic".
func Choices() string {
	s := ""
	for i, p := range table {
		switch {
		case i == 0:
		case i == len(table)-1:
			s += " or "
		default:
			s += ", "
		}
		s += p.ID
	}
	return s
}
