package colour

import (
	"math"
	"testing"
)

// Colour-vision-deficiency simulation matrices of Machado, Oliveira &
// Fernandes, "A Physiologically-based Model for Simulation of Color Vision
// Deficiency", IEEE TVCG 15(6), 2009, severity 1.0, applied to linear sRGB.
// Values recalled from memory; each row sums to 1 (to the printed 1e-6),
// which TestMachadoRowsSumToOne checks as a guard against a mistyped digit.
var (
	machadoProtan = [3][3]float64{
		{0.152286, 1.052583, -0.204868},
		{0.114503, 0.786281, 0.099216},
		{-0.003882, -0.048116, 1.051998},
	}
	machadoDeutan = [3][3]float64{
		{0.367322, 0.860646, -0.227968},
		{0.280085, 0.672501, 0.047413},
		{-0.011820, 0.042940, 0.968881},
	}
	machadoTritan = [3][3]float64{
		{1.255528, -0.076749, -0.178779},
		{-0.078411, 0.930809, 0.147602},
		{0.004733, 0.691367, 0.303900},
	}
)

func TestMachadoRowsSumToOne(t *testing.T) {
	for name, m := range map[string][3][3]float64{"protan": machadoProtan, "deutan": machadoDeutan, "tritan": machadoTritan} {
		for i, row := range m {
			if s := row[0] + row[1] + row[2]; math.Abs(s-1) > 2e-6 { // printed to 6 decimals
				t.Errorf("%s row %d sums to %.7f", name, i, s)
			}
		}
	}
}

// simulatedLab returns the OKLab colour a viewer with the given deficiency
// sees for the map's emitted colour at t.
func simulatedLab(m *Map, sim *[3][3]float64, t float64) (L, A, B float64) {
	r8, g8, b8 := m.At(t)
	r, g, b := mul3(sim, Decode(float64(r8)/255), Decode(float64(g8)/255), Decode(float64(b8)/255))
	clamp := func(c float64) float64 { return math.Max(0, math.Min(1, c)) } // the display clips
	return LinearToOKLab(clamp(r), clamp(g), clamp(b))
}

func dist(L1, a1, b1, L2, a2, b2 float64) float64 {
	return math.Sqrt((L1-L2)*(L1-L2) + (a1-a2)*(a1-a2) + (b1-b2)*(b1-b2))
}

// Neighbouring levels of a 16-level legend must stay apart for protanopes,
// deuteranopes and tritanopes: OKLab distance at least minStep. minStep = 0.02 is
// about one just-noticeable difference in OKLab (common practice, no
// source); 16 levels is more than the page's usual dozen isoline bands.
const (
	cvdLevels = 16
	minStep   = 0.02
)

func TestColourBlindSteps(t *testing.T) {
	sims := []struct {
		name string
		m    *[3][3]float64
	}{{"protanopia", &machadoProtan}, {"deuteranopia", &machadoDeutan}, {"tritanopia", &machadoTritan}, {"normal", &[3][3]float64{{1, 0, 0}, {0, 1, 0}, {0, 0, 1}}}}
	for _, m := range []*Map{Sequential, Diverging} {
		for _, s := range sims {
			worst := math.Inf(1)
			pL, pa, pb := simulatedLab(m, s.m, 0)
			for k := 1; k < cvdLevels; k++ {
				L, a, b := simulatedLab(m, s.m, float64(k)/(cvdLevels-1))
				d := dist(L, a, b, pL, pa, pb)
				worst = math.Min(worst, d)
				if d < minStep {
					t.Errorf("%s, %s: levels %d and %d only %.4f apart", m.Name(), s.name, k-1, k, d)
				}
				pL, pa, pb = L, a, b
			}
			t.Logf("%s, %s: smallest step %.4f", m.Name(), s.name, worst)
		}
	}
}

// The two arms of the diverging map have equal lightness at equal distance
// from the centre, so only hue tells them apart: that must survive the
// simulation. Pairs t, 1-t with |2t-1| >= 0.25 must be at least 2*minStep
// apart (the arms should be told apart at a glance, not just barely).
func TestColourBlindDivergingArms(t *testing.T) {
	for _, s := range []struct {
		name string
		m    *[3][3]float64
	}{{"protanopia", &machadoProtan}, {"deuteranopia", &machadoDeutan}, {"tritanopia", &machadoTritan}} {
		for k := 0; k <= 6; k++ {
			tt := 0.375 * float64(k) / 6 // 0 .. 0.375
			L1, a1, b1 := simulatedLab(Diverging, s.m, tt)
			L2, a2, b2 := simulatedLab(Diverging, s.m, 1-tt)
			if d := dist(L1, a1, b1, L2, a2, b2); d < 2*minStep {
				t.Errorf("%s: t=%.3f and t=%.3f only %.4f apart", s.name, tt, 1-tt, d)
			}
		}
	}
}
