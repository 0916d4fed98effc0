package fdcheck

import (
	"slices"

	"edgewise/solver/gauss"
	"edgewise/solver/problem"
)

// partMeans returns the mean of the field along each part of each edge:
// on a value part the mean of its data (an 8-point Gauss-Legendre rule on
// each piece between the edge's breaks, exact for the data the part
// prescribes), on any other part the mean of the piecewise-linear
// interpolation of the edge's node values (exact integrals over each
// interval, cut at the part's ends).
func (s *system) partMeans() ([4][]float64, error) {
	var out [4][]float64
	var xs, ws [8]float64
	for _, e := range problem.Sides {
		parts := s.parts[e]
		length := s.p.Length(e)
		m := s.edgeNodes(e)
		h := length / float64(m)
		out[e] = make([]float64, len(parts))
		for i, q := range parts {
			from, to := partRange(parts, i, length)
			sum := 0.0
			if q.Kind == problem.Value {
				cuts := []float64{from, to}
				for _, b := range s.p.Edges[e].Breaks {
					if b > from && b < to {
						cuts = append(cuts, b)
					}
				}
				slices.Sort(cuts)
				cuts = slices.Compact(cuts)
				for k := 0; k+1 < len(cuts); k++ {
					gauss.Legendre(xs[:], ws[:], cuts[k], cuts[k+1])
					for j, x := range xs {
						v, err := evalAt(q.F, e, x)
						if err != nil {
							return out, err
						}
						sum += ws[j] * v
					}
				}
				out[e][i] = sum / (to - from)
				continue
			}
			u := func(c float64) float64 { // the interpolation at c
				k, t := locate(c, length, m)
				return (1-t)*s.u[s.bnodes[e][k].a] + t*s.u[s.bnodes[e][k+1].a]
			}
			for k := 0; k < m; k++ {
				c0, c1 := max(from, float64(k)*h), min(to, float64(k+1)*h)
				if c1 > c0 {
					sum += (c1 - c0) * (u(c0) + u(c1)) / 2
				}
			}
			out[e][i] = sum / (to - from)
		}
	}
	return out, nil
}
