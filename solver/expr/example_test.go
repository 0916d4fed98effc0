package expr_test

import (
	"fmt"

	"edgewise/solver/expr"
)

func Example() {
	// A bottom edge 0.4 m long: hot in the middle, 140 at both ends.
	e, err := expr.Compile("180 - 40*(2*s/W - 1)^2", "x", "y", "s", "W", "H")
	if err != nil {
		fmt.Println(err)
		return
	}
	for _, s := range []float64{0, 0.1, 0.2} {
		fmt.Printf("s = %.1f: %g\n", s, e.Eval([]float64{s, 0, s, 0.4, 0.15}))
	}
	fmt.Println(e.Uses("s"), e.Uses("y"))

	// A mistake, shown the way the page shows it.
	src := "20 + 5*sinn(pi*s/W)"
	_, err = expr.Compile(src, "x", "y", "s", "W", "H")
	line, caret := expr.Caret(src, err)
	fmt.Println("edges.top.expr:", err)
	fmt.Println(line)
	fmt.Println(caret)
	// Output:
	// s = 0.0: 140
	// s = 0.1: 170
	// s = 0.2: 180
	// true false
	// edges.top.expr: col 8: unknown name "sinn" (did you mean sinh?)
	// 20 + 5*sinn(pi*s/W)
	//        ^
}

func ExampleCompile_readings() {
	// Thermocouple readings along an edge (position in m, temperature in C);
	// straight lines between them, the end values held outside.
	e, _ := expr.Compile("readings(s, 0, 21.5, 0.1, 24, 0.3, 30)", "s")
	for _, s := range []float64{-0.1, 0.05, 0.2, 0.5} {
		fmt.Printf("%g ", e.Eval([]float64{s}))
	}
	fmt.Println()
	// Output:
	// 21.5 22.75 27 30
}
