package physics

import (
	"strings"
	"testing"
)

// field is a made-up solved field.
type field struct {
	max, maxX, maxY float64
	onEdge          bool
	peak            float64
	exits           []Exit
	singular        bool
	dielectric      string  // "" for dry air
	strength        float64 // V/m, with dielectric
}

func (f *field) Max() (v, x, y float64, onEdge bool) { return f.max, f.maxX, f.maxY, f.onEdge }
func (f *field) PeakGradient() (g, x, y float64)     { return f.peak, 0.1, 0.2 }
func (f *field) Exits() []Exit                       { return f.exits }
func (f *field) Singular() bool                      { return f.singular }
func (f *field) Dielectric() (name, source string, strength, peak, x, y, near float64) {
	if f.dielectric != "" {
		return f.dielectric, "given by the user", f.strength, f.peak, 0.1, 0.2, 0.004
	}
	return "dry air at sea level", "AMS Glossary of Meteorology", AirBreakdown, f.peak, 0.1, 0.2, 0.004
}

func TestCautions(t *testing.T) {
	tests := []struct {
		name    string
		physics string
		f       field
		want    []string // fragments of the cautions before the deferral, in order
	}{
		{"heat below the burn threshold", Heat, field{max: 59.9}, nil},
		{"heat at the burn threshold", Heat, field{max: 60, maxX: 0.2, maxY: 0.1}, []string{"60 °C inside the section at (0.2, 0.1) m"}},
		{"heat on an edge", Heat, field{max: 90, onEdge: true}, []string{"90 °C on its edge at (0, 0) m"}},
		{"electrostatic low", Electrostatic, field{peak: 0.5e6}, []string{"0.5 kV/mm at (0.1, 0.2) m, against about 3 kV/mm"}},
		{"electrostatic a third", Electrostatic, field{peak: 1e6}, []string{"more than a third of about 3 kV/mm"}},
		{"electrostatic breakdown", Electrostatic, field{peak: 3e6, singular: true},
			[]string{"(at least 0.004 m from where two prescribed potentials meet or an electrode's edge meets the insulation) exceeds about 3 kV/mm, the breakdown strength of dry air",
				"unbounded where two prescribed potentials meet or an electrode's edge meets the insulation (a sharp electrode edge or corner); the ideal value there is not a design number"}},
		// the caution names the dielectric it assumes, and no longer says
		// that a gap in another material breaks down like air
		{"electrostatic named dielectric", Electrostatic, field{peak: 8e6, dielectric: "FR-4", strength: 20e6},
			[]string{"8 kV/mm at (0.1, 0.2) m is more than a third of about 20 kV/mm, the breakdown strength of FR-4 (given by the user)"}},
		{"electrostatic named dielectric exceeded", Electrostatic, field{peak: 25e6, dielectric: "FR-4", strength: 20e6},
			[]string{"exceeds about 20 kV/mm, the breakdown strength of FR-4"}},
		{"seepage exits", Seepage, field{exits: []Exit{{Edge: "top", G: 0.2}, {Edge: "left", G: 0.6}, {Edge: "right", G: 1}}},
			[]string{"0.2 on the top edge (at 0, 0 m) is below", "left edge (at 0, 0 m) is more than half of", "right edge (at 0, 0 m) is at or above"}},
		{"seepage singular", Seepage, field{singular: true}, []string{"unbounded where the prescribed head jumps"}},
		{"generic", Generic, field{max: 1e9, peak: 1e9, singular: true}, nil},
	}
	for _, tc := range tests {
		got := Get(tc.physics).Cautions(&tc.f)
		if len(got) == 0 || got[len(got)-1] != Deferral {
			t.Errorf("%s: %q does not end with the deferral", tc.name, got)
			continue
		}
		got = got[:len(got)-1]
		if len(got) != len(tc.want) {
			t.Errorf("%s: %d cautions %q, want %d", tc.name, len(got), got, len(tc.want))
			continue
		}
		for i, w := range tc.want {
			if !strings.Contains(got[i], w) {
				t.Errorf("%s: caution %d = %q, want it to contain %q", tc.name, i, got[i], w)
			}
		}
	}
}
