package basis

import "math"

// Method describes, in the words of the report, the basis along an edge
// whose ends have the Biot numbers biA and biB (+Inf at a value
// neighbour, 0 at a flux neighbour, anything between at a convection
// neighbour): the family New builds for them and how its eigenvalues are
// found.
func Method(biA, biB float64) string {
	value := func(bi float64) bool { return math.IsInf(bi, 1) }
	switch {
	case value(biA) && value(biB):
		return "Sine series along edges between two value edges (eigenvalues n pi/L)."
	case biA == 0 && biB == 0:
		return "Cosine series with its constant mode along edges between two flux edges (eigenvalues (n-1) pi/L)."
	case (value(biA) && biB == 0) || (biA == 0 && value(biB)):
		return "Quarter-wave sine and cosine series along edges between a value edge and a flux edge (eigenvalues (n-1/2) pi/L)."
	}
	return "Robin eigenfunctions sin(lambda s + phi) along edges next to a convection edge, their eigenvalues the roots of the phase equation " +
		"mu + atan2(mu, BiA) + atan2(mu, BiB) = m pi (the forms x tan x = Bi, x cot x = -Bi and the two-sided one), " +
		"each found by Newton steps safeguarded by bisection on its own bracket, so that no root is missed."
}
