package series

type gridWork struct{}

// Grid fills u (and ux, uy when non-nil) at the (nx+1)*(ny+1) nodes
// x = i W/nx, y = j H/ny, index j*(nx+1)+i.
func (s *Solution) Grid(nx, ny int, u, ux, uy []float64) {
	if nx < 1 || ny < 1 || len(u) < (nx+1)*(ny+1) {
		panic("series: bad grid size or buffer")
	}
	for j := 0; j <= ny; j++ {
		for i := 0; i <= nx; i++ {
			a, b, c := s.At(s.m.p.W*float64(i)/float64(nx), s.m.p.H*float64(j)/float64(ny))
			k := j*(nx+1) + i
			u[k] = a
			if ux != nil {
				ux[k] = b
			}
			if uy != nil {
				uy[k] = c
			}
		}
	}
}
