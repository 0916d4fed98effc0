package contour_test

import (
	"fmt"

	"edgewise/solver/contour"
)

func ExampleLevels() {
	fmt.Println(contour.Levels(21.3, 178.9, 6))
	fmt.Println(contour.Levels(-0.3, 0.3, 5))
	// Output:
	// [25 50 75 100 125 150 175]
	// [-0.2 -0.1 0 0.1 0.2]
}

func ExampleJoin() {
	// u = x + y on a 2 x 2 grid over the unit square; level 1 is the
	// diagonal from (1, 0) to (0, 1).
	u := []float64{
		0, 0.5, 1, // y = 0
		0.5, 1, 1.5, // y = 0.5
		1, 1.5, 2, // y = 1
	}
	segs := contour.Lines(nil, u, 2, 2, 1, 1, 1)
	for _, l := range contour.Join(segs) {
		fmt.Println(len(l)/2, "points")
	}
	for _, s := range contour.LabelSpots(contour.Join(segs), 0.5) {
		fmt.Printf("label at (%.2f, %.2f), %.0f degrees\n", s.X, s.Y, s.Angle*180/3.141592653589793)
	}
	// Output:
	// 3 points
	// label at (0.50, 0.50), -45 degrees
}
