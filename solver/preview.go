package solver

import "edgewise/solver/problem"

// PreviewEdge samples the formula of one edge at n+1 evenly spaced points along it, for the page's small
// profile plot: the value, the entering flux or the ambient, whichever the
// edge's kind takes. Only the fields the preview needs are checked; the
// error names the field path and, for a formula, the column. A sample that
// is not a finite number is an error with its place along the edge.
func PreviewEdge(p *Project, e problem.Side, n int) (s, v []float64, err error) {
	if n < 1 || n > 4096 {
		panic("solver: PreviewEdge needs 1 <= n <= 4096")
	}
	pr := &problem.Problem{W: p.Width, H: p.Height}
	src, path := p.Edges[e].data(e)
	f, err := compileFormula(src, path, func(s float64) (x, y float64) { return pr.Point(e, s) }, p.Width, p.Height)
	if err != nil {
		return nil, nil, err
	}
	L := pr.Length(e)
	s, v = make([]float64, n+1), make([]float64, n+1)
	for i := range s {
		s[i] = L * float64(i) / float64(n)
		v[i] = f(s[i])
		if v[i]-v[i] != 0 {
			return nil, nil, errorf(path, "not a finite number at s = %.6g", s[i])
		}
	}
	return s, v, nil
}
