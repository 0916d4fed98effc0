package solver

import (
	"math"

	"edgewise/solver/gauss"
	"edgewise/solver/physics"
	"edgewise/solver/problem"
	"edgewise/solver/project"
	"edgewise/solver/series"
)

// HeatAnswers are the answers of a heat problem.
type HeatAnswers struct {
	// ThermalConductance (W/(m·K)) and ThermalResistance (m·K/W) are per
	// metre of depth, between the two terminals; nil when not defined.
	ThermalConductance, ThermalResistance *float64
	Convection                            []ConvectionEdge
	// Surfaces are the mean temperatures under the flux and convection
	// parts.
	Surfaces []SurfaceMean
}

// ConvectionEdge is the heat lost to the fluid through one convection
// part and its Biot number.
type ConvectionEdge struct {
	Part string
	// Loss is the heat leaving to the fluid, W per metre of depth (the
	// edge's inflow with the sign turned).
	Loss float64
	// Biot = h L / k with L the extent of the rectangle across the edge
	// and k the conductivity across it.
	Biot, L float64
	Reading string
}

// SurfaceMean is the mean field value along a flux or convection part.
type SurfaceMean struct {
	Part string
	Kind string
	Mean float64
}

// Biot number thresholds (common practice): above BiotHigh the surface
// sits close to the fluid's temperature, below BiotLow the surface film
// resistance dominates and the edge passes little heat.
const (
	BiotHigh = 10.0
	BiotLow  = 0.1
)

func biotReading(bi float64) string {
	switch {
	case bi > BiotHigh:
		return "close to isothermal at the fluid temperature (Bi > 10, common practice)"
	case bi < BiotLow:
		return "close to insulated: the surface film limits the heat flow (Bi < 0.1, common practice)"
	}
	return "neither: conduction and the surface film both matter (0.1 ≤ Bi ≤ 10)"
}

func heatAnswers(pr *problem.Problem, r *Result, a *Answers) *HeatAnswers {
	h := &HeatAnswers{}
	if c := a.Conductance; c != nil {
		g, res := c.PerDifference, 1/c.PerDifference
		h.ThermalConductance, h.ThermalResistance = &g, &res
	}
	for _, side := range problem.Sides {
		for _, q := range partsOf(pr, r, side) {
			if q.kind == problem.Value || q.seg == nil {
				continue
			}
			h.Surfaces = append(h.Surfaces, SurfaceMean{Part: q.name(), Kind: q.kind.String(), Mean: q.seg.Mean})
			hc, constant := q.constH()
			if q.kind != problem.Convection || hc == 0 || !q.seg.Finite {
				continue
			}
			L, k := pr.H, pr.Ky
			if side == problem.Left || side == problem.Right {
				L, k = pr.W, pr.Kx
			}
			loss := -*q.seg.Flow
			if !constant {
				// h varies along the part: the Biot number of its mean h
				hc = 0
				for k := 0; k < 64; k++ {
					hc += q.hc(q.from+(q.to-q.from)*(float64(k)+0.5)/64) / 64
				}
			}
			bi := hc * L / k
			h.Convection = append(h.Convection, ConvectionEdge{Part: q.name(), Loss: loss, Biot: bi, L: L, Reading: biotReading(bi)})
		}
	}
	return h
}

// Peak is the largest size of the gradient and where, away from the
// points where it is unbounded.
type Peak struct {
	G, X, Y float64
}

// peakAway returns the largest size of the gradient over the output grid
// nodes at least d from every singular point.
func peakAway(out *Output, pts [][2]float64, d float64) Peak {
	var p Peak
	nx, ny := out.Nx, out.Ny
	for j := 0; j <= ny; j++ {
		for i := 0; i <= nx; i++ {
			k := j*(nx+1) + i
			x, y := float64(i)*out.W/float64(nx), float64(j)*out.H/float64(ny)
			if g := math.Hypot(out.Ux[k], out.Uy[k]); g > p.G && farFrom(pts, x, y, d) {
				p = Peak{G: g, X: x, Y: y}
			}
		}
	}
	return p
}

// ElectroAnswers are the answers of an electrostatic problem.
type ElectroAnswers struct {
	Capacitance *float64 // F per metre of depth between the terminals
	Electrodes  []Electrode
	Peak        Peak
	// Dielectric is the insulating material the breakdown check assumes,
	// Breakdown its breakdown strength (V/m) and Source where that value
	// comes from; Ratio = Peak.G / Breakdown.
	Dielectric, Source string
	Breakdown, Ratio   float64
}

// Electrode is a value part: its potential, the charge on it per metre
// of depth (nil when infinite) and the surface charge density along it.
type Electrode struct {
	Part      string
	Potential float64
	Charge    *float64
	S, Sigma  []float64 // C/m² at places s along the edge
}

// profilePoints is the number of places of a surface charge profile.
const profilePoints = 41

func electroAnswers(pr *problem.Problem, f field, out *Output, a *Answers, asked project.Asked) *ElectroAnswers {
	r := &out.Result
	e := &ElectroAnswers{Capacitance: nil}
	if c := a.Conductance; c != nil {
		v := c.PerDifference
		e.Capacitance = &v
	}
	for _, side := range problem.Sides {
		for _, q := range partsOf(pr, r, side) {
			if q.kind != problem.Value || q.seg == nil {
				continue
			}
			el := Electrode{Part: q.name(), Potential: q.seg.Mean, Charge: q.seg.Flow}
			for i := 0; i < profilePoints; i++ {
				s := q.from + (q.to-q.from)*(float64(i)+0.5)/profilePoints
				x, y := pr.Point(side, s)
				_, ux, uy := f.At(x, y)
				el.S, el.Sigma = append(el.S, s), append(el.Sigma, series.Entering(pr, side, ux, uy))
			}
			e.Electrodes = append(e.Electrodes, el)
		}
	}
	e.Peak = peakAway(out, a.Singular, a.Near)
	e.Dielectric, e.Breakdown, e.Source = "dry air at sea level", physics.AirBreakdown, "AMS Glossary of Meteorology"
	if asked.BreakdownStrength > 0 {
		e.Dielectric, e.Breakdown, e.Source = asked.Dielectric, asked.BreakdownStrength, "given by the user"
		if e.Dielectric == "" {
			e.Dielectric = "the dielectric given"
		}
	}
	e.Ratio = e.Peak.G / e.Breakdown
	return e
}

// SeepageAnswers are the answers of a seepage problem.
type SeepageAnswers struct {
	// Discharge is the total inflow, m³/s per metre of depth; PerDay the
	// same in m³/day.
	Discharge, PerDay float64
	// PerHead is the discharge per metre of head difference between the
	// terminals (m²/s per m); nil when not defined.
	PerHead *float64
	Exits   []ExitGradient
	// Critical is the critical hydraulic gradient and Rule how it was
	// found.
	Critical float64
	Rule     string
	// Recharge is the source over the whole section, m³/s per metre of
	// depth (0 for none).
	Recharge float64
	// Uplift lists the water pressure under each impervious base (an
	// insulated part of the top edge), with the unit weight of water and
	// the datum it was computed with.
	Uplift      []Uplift
	WaterWeight float64 // kN/m³
	Datum       float64 // m: the height y where z = 0
}

// Uplift is the water pressure on an impervious base: the pore pressure
// u = γw (h − z) along it, z its elevation, and the resultant per metre of
// depth (the uplift force, kN/m, upward when positive) and the place x
// along the base where it acts (NaN when the resultant is zero).
type Uplift struct {
	Part      string
	From, To  float64
	Elevation float64 // z of the base, m
	MeanHead  float64 // the mean head along it, m
	Force     float64 // kN per metre of depth
	Line      float64 // x of the resultant, m
	// S and Pressure are the pressure profile (kPa) at upliftPoints
	// places along the base.
	S, Pressure []float64
}

// upliftPoints is the number of places of an uplift profile.
const upliftPoints = 41

// uplift computes the uplift under part q of the top edge: the mean head
// is the part's mean from the engine (exact in form at the base's ends,
// where the head goes like a square root); the moment of the pressure by
// Gauss-Legendre in theta, s = a + (b - a)(1 - cos theta)/2, which leaves
// that square root smooth.
func uplift(pr *problem.Problem, f field, q part, gw, datum float64) Uplift {
	z := pr.H - datum
	u := Uplift{Part: q.name(), From: q.from, To: q.to, Elevation: z, MeanHead: q.seg.Mean}
	L := q.to - q.from
	u.Force = gw * (q.seg.Mean - z) * L
	xs, ws := make([]float64, 64), make([]float64, 64)
	gauss.Legendre(xs, ws, 0, math.Pi)
	moment := 0.0
	for i, th := range xs {
		s := q.from + L*(1-math.Cos(th))/2
		h, _, _ := f.At(s, pr.H)
		moment += ws[i] * L / 2 * math.Sin(th) * gw * (h - z) * s
	}
	u.Line = math.NaN()
	if math.Abs(u.Force) > 1e-12*gw*L*max(math.Abs(z), math.Abs(q.seg.Mean), 1) {
		u.Line = moment / u.Force
	}
	for i := 0; i < upliftPoints; i++ {
		s := q.from + L*float64(i)/(upliftPoints-1)
		h, _, _ := f.At(s, pr.H)
		u.S, u.Pressure = append(u.S, s), append(u.Pressure, gw*(h-z))
	}
	return u
}

// ExitGradient is the largest hydraulic gradient where water leaves
// through a value part, away from singular points, and the factor of
// safety against heave there (Critical / G).
type ExitGradient struct {
	Part           string
	G, X, Y        float64
	FactorOfSafety float64
}

// WaterUnitWeight is the unit weight of water in kN/m³ when the user does
// not give one.
const WaterUnitWeight = 9.81

func seepageAnswers(pr *problem.Problem, out *Output, a *Answers, asked project.Asked) *SeepageAnswers {
	r := &out.Result
	s := &SeepageAnswers{Recharge: r.SourceTotal}
	// what enters: part by part (an edge with a pool at each end carries
	// the discharge in at one and out at the other, and none in sum)
	for _, e := range r.Edges {
		if len(e.Segments) == 0 {
			if e.Finite {
				s.Discharge += max(*e.Flow, 0)
			}
			continue
		}
		for _, g := range e.Segments {
			if g.Finite {
				s.Discharge += max(*g.Flow, 0)
			}
		}
	}
	s.Discharge += max(r.SourceTotal, 0)
	s.PerDay = s.Discharge * 86400
	if c := a.Conductance; c != nil {
		v := c.PerDifference
		s.PerHead = &v
	}
	gw := asked.WaterUnitWeight
	if gw == 0 {
		gw = WaterUnitWeight
	}
	s.WaterWeight, s.Datum = gw, asked.Datum
	for _, q := range partsOf(pr, r, problem.Top) {
		if q.kind == problem.Flux && insulated(pr, q) && q.seg != nil {
			s.Uplift = append(s.Uplift, uplift(pr, out.field, q, gw, asked.Datum))
		}
	}
	switch {
	case asked.SaturatedUnitWeight > 0:
		s.Critical = (asked.SaturatedUnitWeight - gw) / gw
		s.Rule = "(γsat − γw)/γw from the unit weights given"
	case asked.SpecificGravity > 0 && asked.VoidRatio > 0:
		s.Critical = (asked.SpecificGravity - 1) / (1 + asked.VoidRatio)
		s.Rule = "(Gs − 1)/(1 + e) from the soil data given"
	default:
		s.Critical = physics.CriticalGradient
		s.Rule = "about 1 for common soils (common practice)"
	}
	for _, side := range problem.Sides {
		for _, q := range partsOf(pr, nil, side) {
			if q.kind != problem.Value {
				continue
			}
			g, x, y, found := exitGradientAway(pr, out, side, q.from, q.to, a.Singular, a.Near)
			if !found {
				continue
			}
			s.Exits = append(s.Exits, ExitGradient{Part: q.name(), G: g, X: x, Y: y, FactorOfSafety: s.Critical / g})
		}
	}
	return s
}
