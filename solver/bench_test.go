package solver

import (
	"fmt"
	"os"
	"testing"

	"edgewise/solver/project"
)

// benchProject has four value edges whose values jump at every corner and
// vary along the edges: the hard case for a series.
const benchProject = `{"schema":"edgewise/1","physics":"heat","width":0.3,"height":0.2,"conductivity":50,
 "edges":{"bottom":{"kind":"value","expr":"180 - 40*(2*s/W - 1)^2"},"top":{"kind":"value","expr":"20 + 5*sin(pi*s/W)"},
 "left":{"kind":"value","expr":"60"},"right":{"kind":"value","expr":"90 - 30*s/H"}}}`

// BenchmarkSolve is the whole solve as the page runs it: decode, compile,
// series, output grid with gradients, result numbers; with and without the
// finite-difference cross-check.
func BenchmarkSolve(b *testing.B) {
	p, err := project.Decode([]byte(benchProject))
	if err != nil {
		b.Fatal(err)
	}
	for _, n := range []int{65, 129, 257, 513, 1025} {
		for _, cc := range []bool{false, true} {
			name := fmt.Sprintf("%dx%d", n, n)
			if cc {
				name += "+crosscheck"
			}
			b.Run(name, func(b *testing.B) {
				var s Solver
				opt := Options{Nx: n - 1, Ny: n - 1, NoCrossCheck: !cc}
				for b.Loop() {
					if _, err := s.Solve(p, opt); err != nil {
						b.Fatal(err)
					}
				}
			})
		}
	}
}

// BenchmarkSolveSegments is the page's whole solve of the two-pool
// section (an edge of three parts), default grid, with the cross-check:
// each edit of a data value reuses the fit's responses.
func BenchmarkSolveSegments(b *testing.B) {
	data, err := os.ReadFile("physics/examples/seepage-two-pools.json")
	if err != nil {
		b.Fatal(err)
	}
	p, err := project.Decode(data)
	if err != nil {
		b.Fatal(err)
	}
	var s Solver
	for b.Loop() {
		if _, err := s.Solve(p, Options{}); err != nil {
			b.Fatal(err)
		}
	}
}
