package exact_test

import (
	"fmt"
	"math"

	"edgewise/solver/internal/exact"
	"edgewise/solver/problem"
)

// Two opposite sides held, the rest insulated: the conductance is k H/W
// (one-dimensional conduction). The classical singularity benchmark as a
// two-part problem on 0 < x < 2, 0 < y < 1 (u = 0 on the left half of the
// bottom, 500 on the right side, the rest insulated): along the insulated
// half of the bottom, u = d0 r^(1/2) + d1 r^(3/2) + d2 r^(5/2) + ..., so
// u/sqrt(r) - d1 r - d2 r^2 is d0 to about 8 r^3, with the published
// d0 = 401.162453745, d1 = 87.6559201951, d2 = 17.2379150 (Motz 1946;
// Rosser & Papamichael 1975; Li, Mathon & Sermer 1987; from memory).
func ExampleTwoParts() {
	sides, err := exact.New(2, 1, 1, 1,
		exact.Part{Side: problem.Left, From: 0, To: 1},
		exact.Part{Side: problem.Right, From: 0, To: 1}, 0, 1)
	if err != nil {
		panic(err)
	}
	fmt.Printf("opposite sides: %.12f\n", sides.Conductance())

	motz, err := exact.New(2, 1, 1, 1,
		exact.Part{Side: problem.Bottom, From: 0, To: 1},
		exact.Part{Side: problem.Right, From: 0, To: 1}, 0, 500)
	if err != nil {
		panic(err)
	}
	const r, d1, d2 = 1e-4, 87.6559201951, 17.2379150
	fmt.Printf("d0: %.9f\n", motz.Value(1+r, 0)/math.Sqrt(r)-d1*r-d2*r*r)
	// Output:
	// opposite sides: 0.500000000000
	// d0: 401.162453745
}
