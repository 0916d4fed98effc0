package physics

import "fmt"

// Rules of thumb behind the cautions.
const (
	// BurnTemperature: skin burns on brief contact with metal above about
	// 60 °C (common practice).
	BurnTemperature = 60.0
	// AirBreakdown: breakdown field of dry air at sea level, about 3 kV/mm
	// (AMS Glossary of Meteorology, read).
	AirBreakdown = 3e6 // V/m
	// CriticalGradient: critical hydraulic gradient (Gs - 1)/(1 + e), about 1
	// for common soils (soil mechanics texts; common practice).
	CriticalGradient = 1.0
)

// Deferral ends every list of cautions.
const Deferral = "edgewise solves an idealised two-dimensional steady model: check what you take from it " +
	"against the codes and standards that apply where you work, and have a licensed professional approve " +
	"any decision that depends on it."

// Field is what the cautions read from a solved field. The solver
// implements it; a method may do real work (a pass over the grid), so each
// caution asks only for what it needs.
type Field interface {
	// Max is the largest value and where it is; onEdge is true when that
	// place is on the boundary.
	Max() (v, x, y float64, onEdge bool)
	// PeakGradient is the largest size of the gradient on the output grid
	// and where it is; nodes where it is unbounded are left out.
	PeakGradient() (g, x, y float64)
	// Exits lists the value edges through which the flux leaves the region,
	// each with the largest size of the gradient where it leaves.
	Exits() []Exit
	// Singular reports whether the gradient is unbounded somewhere (a
	// jump of prescribed value at a corner or inside an edge, or a held
	// part meeting another kind).
	Singular() bool
	// Dielectric is the insulating material the breakdown caution
	// assumes, where its breakdown strength comes from, that strength
	// (V/m), and the peak field strength at least near from the points
	// where it is unbounded.
	Dielectric() (name, source string, strength, peak, x, y, near float64)
}

// Exit is the largest size of the gradient where the flux leaves through
// one value edge, and where it is.
type Exit struct {
	Edge    string // "bottom", "top", "left" or "right"
	G, X, Y float64
}

// Cautions returns the cautions of a solved field of this physics, the
// Deferral last.
func (p *Physics) Cautions(f Field) []string {
	var list []string
	if p.cautions != nil {
		list = p.cautions(p, f)
	}
	return append(list, Deferral)
}

func heatCautions(p *Physics, f Field) []string {
	v, x, y, onEdge := f.Max()
	if v < BurnTemperature {
		return nil
	}
	where := "inside the section"
	if onEdge {
		where = "on its edge"
	}
	u := p.ValueUnit
	return []string{fmt.Sprintf("The hottest point is %.4g %s %s at (%.4g, %.4g) m: bare skin touching metal above "+
		"about %g %s can burn within seconds (common practice). Guard or insulate surfaces people can reach.",
		v, u, where, x, y, BurnTemperature, u)}
}

func electrostaticCautions(p *Physics, f Field) []string {
	name, source, strength, peak, x, y, near := f.Dielectric()
	kvmm, bd := peak/1e6, strength/1e6
	at := fmt.Sprintf("Peak field strength %.3g kV/mm at (%.4g, %.4g) m", kvmm, x, y)
	if f.Singular() {
		at += fmt.Sprintf(" (at least %.3g m from where two prescribed potentials meet or an electrode's edge meets the insulation)", near)
	}
	against := fmt.Sprintf("about %.3g kV/mm, the breakdown strength of %s (%s)", bd, name, source)
	var msg string
	switch {
	case peak >= strength:
		msg = at + " exceeds " + against + ": a gap of this shape in that dielectric would break down."
	case peak >= strength/3:
		msg = at + " is more than a third of " + against + "; humidity, dirt, ageing and sharp edges lower it in practice."
	default:
		msg = at + ", against " + against + "."
	}
	list := []string{msg}
	if f.Singular() {
		list = append(list, "The field strength is unbounded where two prescribed potentials meet or an electrode's edge "+
			"meets the insulation (a sharp electrode edge or corner); the ideal value there is not a design number. Real edges are rounded: the peak above is taken "+
			"at a stated distance from those points.")
	}
	return list
}

func seepageCautions(p *Physics, f Field) []string {
	var list []string
	for _, e := range f.Exits() {
		level := "below"
		if e.G >= CriticalGradient {
			level = "at or above"
		} else if e.G >= CriticalGradient/2 {
			level = "more than half of"
		}
		list = append(list, fmt.Sprintf("Exit gradient %.3g on the %s edge (at %.4g, %.4g m) is %s the critical hydraulic "+
			"gradient of about 1 ((Gs - 1)/(1 + e) for common soils; common practice): heave and piping start there, "+
			"so designs keep a wide margin below it.", e.G, e.Edge, e.X, e.Y, level))
	}
	if f.Singular() {
		list = append(list, "The hydraulic gradient is unbounded where the prescribed head jumps (at a corner or "+
			"inside an edge); exit gradients near that point are larger than any grid value shows.")
	}
	return list
}
