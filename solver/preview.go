package solver

import (
	"edgewise/solver/problem"
	"edgewise/solver/project"
)

// PreviewEdge samples the formula of one edge at n+1 evenly spaced points
// along it, for the page's small profile plot: the value, the entering flux
// or the ambient, whichever the edge's kind takes. Only the fields the
// preview needs are checked; the error names the field path and, for a
// formula, the column. A sample that is not a finite number is an error
// with its place along the edge.
func PreviewEdge(p *project.Project, e problem.Side, n int) (s, v []float64, err error) {
	if n < 1 || n > 4096 {
		panic("solver: PreviewEdge needs 1 <= n <= 4096")
	}
	f, _, path, err := p.EdgeData(e)
	if err != nil {
		return nil, nil, err
	}
	L := (&problem.Problem{W: p.Width, H: p.Height}).Length(e)
	s, v = make([]float64, n+1), make([]float64, n+1)
	for i := range s {
		s[i] = L * float64(i) / float64(n)
		v[i] = f(s[i])
		if v[i]-v[i] != 0 {
			return nil, nil, project.Errorf(path, "not a finite number at s = %.6g", s[i])
		}
	}
	return s, v, nil
}
