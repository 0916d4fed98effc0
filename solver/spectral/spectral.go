package spectral

import (
	"errors"
	"fmt"
	"math"

	"edgewise/solver/linalg"
	"edgewise/solver/problem"
)

// MaxNodes is the largest number of GLL intervals a side accepts.
const MaxNodes = 160

// Field is the spectral solution: its values at the GLL nodes of both
// directions, from which At interpolates anywhere in the rectangle.
type Field struct {
	W, H   float64
	x, y   *line
	u      []float64 // (Nx+1)*(Ny+1) node values, index j*(Nx+1)+i
	Floats bool      // the problem was all flux: the field has mean 0
}

// line is one direction: its GLL nodes on [0, L], weights and the 1-D
// operator with the two ends' conditions.
type line struct {
	n    int
	s, w []float64 // nodes and weights on [0, L]
	bary []float64 // barycentric weights of the nodes
	a    []float64 // (n+1)^2: k S + Hc at the ends
	held [2]bool   // whether the low and high end hold values
}

// Solve solves pr on nx x ny GLL intervals. Mixed edges are refused (the
// check does not take them; see the package doc). A problem with a non
// finite datum returns the *problem.NonFiniteError.
func Solve(pr *problem.Problem, nx, ny int) (*Field, error) {
	if nx < 2 || ny < 2 || nx > MaxNodes || ny > MaxNodes {
		panic(fmt.Sprintf("spectral: %d x %d intervals: need 2 to %d a side", nx, ny, MaxNodes))
	}
	for _, side := range problem.Sides {
		if pr.Edges[side].Mixed() {
			return nil, errors.New("spectral: edges made of parts are not taken")
		}
	}
	e := &pr.Edges
	lx := newLine(nx, pr.W, pr.Kx, &e[problem.Left], &e[problem.Right])
	ly := newLine(ny, pr.H, pr.Ky, &e[problem.Bottom], &e[problem.Top])
	f := &Field{W: pr.W, H: pr.H, x: lx, y: ly, u: make([]float64, (nx+1)*(ny+1))}
	// the held nodes, and the loads of the free ones
	b, err := f.loads(pr)
	if err != nil {
		return nil, err
	}
	fx, fy := lx.free(), ly.free()
	// B of the free nodes, less what the held nodes of their row and
	// column put on them
	mx, my := len(fx), len(fy)
	c := f.freeLoads(b, fx, fy)
	lamx, qx := lx.eigen(fx)
	lamy, qy := ly.eigen(fy)
	// C <- Qx^T C Qy, divide, and back
	c = mulT(qx, mx, c, my)    // Qx^T C: mx x my
	c = mul(c, mx, my, qy, my) // (Qx^T C) Qy
	floats := !lx.held[0] && !lx.held[1] && !ly.held[0] && !ly.held[1] &&
		!(e[problem.Left].Kind == problem.Convection && e[problem.Left].Hc > 0) &&
		!(e[problem.Right].Kind == problem.Convection && e[problem.Right].Hc > 0) &&
		!(e[problem.Bottom].Kind == problem.Convection && e[problem.Bottom].Hc > 0) &&
		!(e[problem.Top].Kind == problem.Convection && e[problem.Top].Hc > 0)
	divide(c, lamx, lamy, floats)
	c = mul(qx, mx, mx, c, my) // Qx C
	c = mulBT(c, mx, my, qy)   // (Qx C) Qy^T
	f.scatter(c, fx, fy)
	if floats {
		f.Floats = true
		subtract(f.u, f.Mean())
	}
	return f, nil
}

// The loops of Solve are functions of their own, not inlined, so that the
// browser does not optimize the whole of Solve for them (see the package
// doc of edgewise/solver, "Loops in functions of their own").

// loads returns the loads of the nodes (the source's, and the flux and
// convection edges') and puts the values of the value edges into f.u; the
// first non-finite datum is the error.
//
//go:noinline
func (f *Field) loads(pr *problem.Problem) ([]float64, error) {
	lx, ly := f.x, f.y
	nx, ny := lx.n, ly.n
	row := nx + 1
	b := make([]float64, len(f.u))
	for j := 0; j <= ny; j++ {
		for i := 0; i <= nx; i++ {
			b[j*row+i] = pr.Source * lx.w[i] * ly.w[j]
		}
	}
	var bad error
	// value edges along y first, so that at a corner the edge along x
	// (left, right) has the last word, as for every other node of it
	for i := 0; i <= nx; i++ {
		f.load(pr, b, &bad, problem.Bottom, i, lx.s[i], lx.w[i])
		f.load(pr, b, &bad, problem.Top, ny*row+i, lx.s[i], lx.w[i])
	}
	for j := 0; j <= ny; j++ {
		f.load(pr, b, &bad, problem.Left, j*row, ly.s[j], ly.w[j])
		f.load(pr, b, &bad, problem.Right, j*row+nx, ly.s[j], ly.w[j])
	}
	return b, bad
}

// load takes the datum of side at s into node k (weight w); the first
// error is kept in *bad.
func (f *Field) load(pr *problem.Problem, b []float64, bad *error, side problem.Side, k int, s, w float64) {
	ed := &pr.Edges[side]
	if ed.Kind != problem.Value && ed.Kind != problem.Flux && ed.Kind != problem.Convection {
		return
	}
	v, err := pr.Eval(side, s)
	if err != nil && *bad == nil {
		*bad = err
	}
	switch ed.Kind {
	case problem.Value:
		f.u[k] = v
	case problem.Flux:
		b[k] += v * w
	case problem.Convection:
		b[k] += ed.Hc * v * w
	}
}

// freeLoads returns the loads of the free nodes fx x fy (index p*len(fy)+q),
// less what the held nodes of their row and column put on them, scaled by
// the inverse square root of their weights.
//
//go:noinline
func (f *Field) freeLoads(b []float64, fx, fy []int) []float64 {
	lx, ly := f.x, f.y
	nx, ny := lx.n, ly.n
	row := nx + 1
	my := len(fy)
	c := make([]float64, len(fx)*my) // index p*my + q: x-major for the products
	for q, j := range fy {
		for p, i := range fx {
			v := b[j*row+i]
			for end, k := range [2]int{0, nx} {
				if lx.held[end] {
					v -= lx.a[i*(nx+1)+k] * ly.w[j] * f.u[j*row+k]
				}
			}
			for end, l := range [2]int{0, ny} {
				if ly.held[end] {
					v -= lx.w[i] * ly.a[j*(ny+1)+l] * f.u[l*row+i]
				}
			}
			c[p*my+q] = v / math.Sqrt(lx.w[i]*ly.w[j])
		}
	}
	return c
}

// divide divides mode (p, q) of c by lamx[p] + lamy[q]; when the field
// floats (no held value, no convection) the constant mode is set to 0.
//
//go:noinline
func divide(c, lamx, lamy []float64, floats bool) {
	my := len(lamy)
	big := 0.0
	for _, l := range lamx {
		big = max(big, math.Abs(l))
	}
	for _, l := range lamy {
		big = max(big, math.Abs(l))
	}
	for p := range lamx {
		for q := range my {
			d := lamx[p] + lamy[q]
			if floats && math.Abs(d) <= 1e-11*big {
				c[p*my+q] = 0 // the constant mode: the mean is set below
				continue
			}
			c[p*my+q] /= d
		}
	}
}

// scatter puts the free nodes' values (c scaled back by the square root
// of their weights) into f.u.
//
//go:noinline
func (f *Field) scatter(c []float64, fx, fy []int) {
	lx, ly := f.x, f.y
	row := lx.n + 1
	my := len(fy)
	for q, j := range fy {
		for p, i := range fx {
			f.u[j*row+i] = c[p*my+q] / math.Sqrt(lx.w[i]*ly.w[j])
		}
	}
}

// subtract takes m from every value.
//
//go:noinline
func subtract(u []float64, m float64) {
	for k := range u {
		u[k] -= m
	}
}

// newLine builds one direction of n intervals on [0, L] with conductivity
// k, its low end under edge lo and its high end under edge hi.
func newLine(n int, L, k float64, lo, hi *problem.Edge) *line {
	t, w := lobatto(n)
	ln := &line{n: n, s: make([]float64, n+1), w: make([]float64, n+1), a: make([]float64, (n+1)*(n+1))}
	for i := range t {
		ln.s[i] = L * (1 + t[i]) / 2
		ln.w[i] = w[i] * L / 2
	}
	ln.s[0], ln.s[n] = 0, L
	// D_ij = P_n(t_i) / (P_n(t_j) (t_i - t_j)), diagonal by the row sums
	d := derivative(t)
	// S_ik = sum_q w_q D_qi D_qk, times 2/L for the map from [-1, 1]
	stiffness(ln.a, w, d, k*2/L)
	for end, ed := range [2]*problem.Edge{lo, hi} {
		at := end * n
		switch ed.Kind {
		case problem.Value:
			ln.held[end] = true
		case problem.Convection:
			ln.a[at*(n+1)+at] += ed.Hc
		}
	}
	ln.bary = barycentric(t)
	return ln
}

// The loops of newLine are functions of their own, not inlined (see
// loads).

// derivative returns the GLL differentiation matrix on the nodes t of
// [-1, 1]: D_ij = P_n(t_i) / (P_n(t_j) (t_i - t_j)), the diagonal by the
// row sums.
//
//go:noinline
func derivative(t []float64) []float64 {
	n := len(t) - 1
	pn := make([]float64, n+1)
	for i, ti := range t {
		pn[i], _ = legendre(n, ti)
	}
	d := make([]float64, (n+1)*(n+1))
	for i := 0; i <= n; i++ {
		sum := 0.0
		for j := 0; j <= n; j++ {
			if i != j {
				d[i*(n+1)+j] = pn[i] / (pn[j] * (t[i] - t[j]))
				sum += d[i*(n+1)+j]
			}
		}
		d[i*(n+1)+i] = -sum
	}
	return d
}

// stiffness sets a to S_ik = sum_q w_q D_qi D_qk times scale.
//
//go:noinline
func stiffness(a, w, d []float64, scale float64) {
	n := len(w) - 1
	for i := 0; i <= n; i++ {
		for kk := i; kk <= n; kk++ {
			s := 0.0
			for q := 0; q <= n; q++ {
				s += w[q] * d[q*(n+1)+i] * d[q*(n+1)+kk]
			}
			a[i*(n+1)+kk], a[kk*(n+1)+i] = s*scale, s*scale
		}
	}
}

// barycentric returns the barycentric weights 1/prod(t_j - t_k) of the
// nodes t, scaled to 1 at their largest.
//
//go:noinline
func barycentric(t []float64) []float64 {
	bary := make([]float64, len(t))
	big := 0.0
	for j := range t {
		p := 1.0
		for kk := range t {
			if kk != j {
				p *= t[j] - t[kk]
			}
		}
		bary[j] = 1 / p
		big = max(big, math.Abs(bary[j]))
	}
	for j := range bary {
		bary[j] /= big
	}
	return bary
}

// free returns the indices of the nodes that hold no value.
func (ln *line) free() []int {
	var out []int
	for i := 0; i <= ln.n; i++ {
		if !(i == 0 && ln.held[0] || i == ln.n && ln.held[1]) {
			out = append(out, i)
		}
	}
	return out
}

// eigen returns the eigenvalues and eigenvectors (column p of q, row-major
// len(f) x len(f)) of the free nodes' operator M^-1/2 A M^-1/2.
func (ln *line) eigen(f []int) ([]float64, []float64) {
	m := len(f)
	a := make([]float64, m*m)
	for p, i := range f {
		for q, k := range f {
			a[p*m+q] = ln.a[i*(ln.n+1)+k] / math.Sqrt(ln.w[i]*ln.w[k])
		}
	}
	return linalg.SymEigen(a, m)
}

// mul returns a (r x k) times b (k x c).
func mul(a []float64, r, k int, b []float64, c int) []float64 {
	out := make([]float64, r*c)
	for i := 0; i < r; i++ {
		o := out[i*c : (i+1)*c]
		for l := 0; l < k; l++ {
			v := a[i*k+l]
			if v == 0 {
				continue
			}
			for j, bj := range b[l*c : (l+1)*c] {
				o[j] += v * bj
			}
		}
	}
	return out
}

// mulT returns a^T b for a square r x r and b r x c.
func mulT(a []float64, r int, b []float64, c int) []float64 {
	out := make([]float64, r*c)
	for l := 0; l < r; l++ {
		for i := 0; i < r; i++ {
			v := a[l*r+i]
			o := out[i*c : (i+1)*c]
			for j, bj := range b[l*c : (l+1)*c] {
				o[j] += v * bj
			}
		}
	}
	return out
}

// mulBT returns a (r x c) times b^T for a square c x c b.
func mulBT(a []float64, r, c int, b []float64) []float64 {
	out := make([]float64, r*c)
	for i := 0; i < r; i++ {
		ai := a[i*c : (i+1)*c]
		for j := 0; j < c; j++ {
			bj := b[j*c : (j+1)*c]
			s := 0.0
			for l, v := range ai {
				s += v * bj[l]
			}
			out[i*c+j] = s
		}
	}
	return out
}

// At returns the field at (x, y) inside the rectangle.
func (f *Field) At(x, y float64) float64 {
	cx := f.x.interp(x)
	cy := f.y.interp(y)
	row := f.x.n + 1
	v := 0.0
	for j, wj := range cy {
		if wj == 0 {
			continue
		}
		s := 0.0
		for i, wi := range cx {
			s += wi * f.u[j*row+i]
		}
		v += wj * s
	}
	return v
}

// interp returns the weights that interpolate the nodes' values at s
// (barycentric formula of the second kind).
func (ln *line) interp(s float64) []float64 {
	c := make([]float64, ln.n+1)
	sum := 0.0
	for j, sj := range ln.s {
		if s == sj {
			clear(c)
			c[j] = 1
			return c
		}
		c[j] = ln.bary[j] / (s - sj)
		sum += c[j]
	}
	for j := range c {
		c[j] /= sum
	}
	return c
}

// Grid fills dst with the field at the (nx+1)*(ny+1) nodes x = i W/nx,
// y = j H/ny, index j*(nx+1)+i; dst nil allocates.
func (f *Field) Grid(nx, ny int, dst []float64) []float64 {
	if nx < 1 || ny < 1 {
		panic("spectral: bad grid size")
	}
	if dst == nil {
		dst = make([]float64, (nx+1)*(ny+1))
	}
	row := f.x.n + 1
	cx := make([][]float64, nx+1)
	for i := range cx {
		cx[i] = f.x.interp(min(f.W, float64(i)*f.W/float64(nx)))
	}
	// interpolate along y first: t[j][i'] over the x nodes i'
	t := make([]float64, row)
	for j := 0; j <= ny; j++ {
		f.gridRow(dst[j*(nx+1):(j+1)*(nx+1)], f.y.interp(min(f.H, float64(j)*f.H/float64(ny))), cx, t)
	}
	return dst
}

// gridRow fills one row of the grid: the field interpolated along y with
// the weights cy into t, then along x with the weights cx[i] into out[i].
// A function of its own, not inlined (see loads).
//
//go:noinline
func (f *Field) gridRow(out, cy []float64, cx [][]float64, t []float64) {
	row := f.x.n + 1
	clear(t)
	for l, wl := range cy {
		if wl == 0 {
			continue
		}
		for i := range t {
			t[i] += wl * f.u[l*row+i]
		}
	}
	for i, c := range cx {
		s := 0.0
		for k, v := range c {
			s += v * t[k]
		}
		out[i] = s
	}
}

// Mean returns the mean of the field over the rectangle (GLL rule).
func (f *Field) Mean() float64 {
	row := f.x.n + 1
	s := 0.0
	for j, wj := range f.y.w {
		for i, wi := range f.x.w {
			s += wi * wj * f.u[j*row+i]
		}
	}
	return s / (f.W * f.H)
}

// Nodes returns the number of GLL intervals each way.
func (f *Field) Nodes() (nx, ny int) { return f.x.n, f.y.n }
