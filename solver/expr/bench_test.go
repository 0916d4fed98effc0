package expr

import "testing"

// benchFormula is a typical edge profile: 13 nodes (7 leaves, 6 operators).
const benchFormula = "180 - 40*(2*s/W - 1)^2"

// benchFormula2 has a transcendental function: 11 nodes.
const benchFormula2 = "20 + 5*sin(pi*s/W) + 0.1*x"

var sink float64

func BenchmarkEval(b *testing.B) {
	for _, src := range []string{benchFormula, benchFormula2, "readings(s, 0, 20, 0.05, 24, 0.1, 31, 0.2, 35, 0.3, 33, 0.4, 28)"} {
		b.Run(src, func(b *testing.B) {
			e := mustCompile(b, src)
			vals := []float64{0.1, 0, 0.1, 0.4, 0.15}
			b.ReportAllocs()
			for i := 0; b.Loop(); i++ {
				vals[2] = float64(i&1023) * (0.4 / 1024)
				sink += e.Eval(vals)
			}
		})
	}
}

func BenchmarkCompile(b *testing.B) {
	b.ReportAllocs()
	for b.Loop() {
		mustCompile(b, benchFormula)
	}
}
