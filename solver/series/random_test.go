package series

import (
	"math"
	"math/rand"
	"testing"

	"edgewise/solver/problem"
)

func randomCase(rng *rand.Rand) *problem.Problem {
	w := math.Pow(10, rng.Float64()*4-2)
	h := w * math.Pow(10, rng.Float64()*3-1.5)
	kx := math.Pow(10, rng.Float64()*2-1)
	ky := kx * math.Pow(10, rng.Float64()*2-1)
	p := &problem.Problem{W: w, H: h, Kx: kx, Ky: ky}
	if rng.Intn(2) == 0 {
		p.Source = rng.NormFloat64() * 100
	}
	for _, e := range problem.Sides {
		kind := problem.Kind(rng.Intn(3))
		L := p.Length(e)
		c0, c1, c2 := rng.NormFloat64()*50, rng.NormFloat64()*20, rng.NormFloat64()*10
		fr := rng.Float64() * 5
		f := func(s float64) float64 { x := s / L; return c0 + c1*x + c2*math.Sin(fr*x) }
		p.Edges[e] = problem.Edge{Kind: kind, F: f, Hc: math.Pow(10, rng.Float64()*4-2) * kx / L}
	}
	return p
}

// Seeded random problems (sizes 0.01..100, aspect up to ~30 either way,
// orthotropy, a source half the time, any kinds, Biot numbers 1e-2..1e2 on
// the edge's own length, data c0 + c1 s + c2 sin(f s)): no error, no NaN,
// Grid equal to At within the larger of 1e-8 of the scale and the error
// estimate, and the balance closes to 1e-6 of the largest flow whenever the
// flows are finite. MaxTerms 1024 keeps the hard ones (large Biot on a
// short edge, very long strips) quick; their estimate says so.
func TestRandomProblems(t *testing.T) {
	rng := rand.New(rand.NewSource(7))
	n := 60
	if raceOn {
		n = 12
	}
	for it := 0; it < n; it++ {
		p := randomCase(rng)
		s, err := Solve(p, Options{MaxTerms: 1024})
		if err != nil {
			if _, ok := err.(*ImbalanceError); ok {
				continue
			}
			t.Fatalf("case %d: %v", it, err)
		}
		sum, mag, finite := p.Source*p.W*p.H, math.Abs(p.Source*p.W*p.H), true
		for _, e := range problem.Sides {
			f, ok := s.Flow(e)
			finite = finite && ok
			sum += f
			mag = math.Max(mag, math.Abs(f))
		}
		if finite && math.Abs(sum) > 1e-6*mag {
			t.Errorf("case %d: balance %.3g of %.3g", it, sum, mag)
		}
		tol := math.Max(1e-8*s.Scale(), s.ErrorEstimate())
		nx, ny := 20, 13
		u := make([]float64, (nx+1)*(ny+1))
		s.Grid(nx, ny, u, nil, nil)
		for j := 0; j <= ny; j++ {
			for i := 0; i <= nx; i++ {
				if (i == 0 || i == nx) && (j == 0 || j == ny) {
					continue
				}
				a, _, _ := s.At(p.W*float64(i)/float64(nx), p.H*float64(j)/float64(ny))
				k := j*(nx+1) + i
				if math.IsNaN(u[k]) || math.Abs(a-u[k]) > tol {
					t.Fatalf("case %d node %d,%d: grid %g At %g (estimate %.3g)", it, i, j, u[k], a, s.ErrorEstimate())
				}
			}
		}
	}
}
