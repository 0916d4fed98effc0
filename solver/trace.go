package solver

import (
	"math"

	"edgewise/solver/problem"
	"edgewise/solver/series"
)

// With a source no flow function exists: the flow grows along its path.
// The flow lines are then traced upstream through the flux field from
// seeds on the boundary where the flux leaves, placed at equal steps of
// the outflow (the trapezoid sum of the leaving flux at the boundary
// nodes), so that each pair of neighbouring lines takes the same share of
// the outflow where it leaves. The net this draws is not square.

// tracedNote says what the traced lines mean.
const tracedNote = "flow lines traced through the flux field, starting at equal steps of the outflow; with a source the flow grows along each channel, so the net is not square"

// traceFlowLines returns the traced flow lines as segments x0,y0,x1,y1.
func (o *Output) traceFlowLines(pr *problem.Problem, channels int, outflow float64) []float64 {
	nx, ny := o.Nx, o.Ny
	hx, hy := o.W/float64(nx), o.H/float64(ny)
	nodes, sides := boundaryWalk(nx, ny)
	leaving := func(k int, side problem.Side) float64 {
		q := -series.Entering(pr, side, o.Ux[k], o.Uy[k])
		if q-q != 0 { // a corner node with no gradient of its own
			return 0
		}
		return max(q, 0)
	}
	step := outflow / float64(channels)
	var segs []float64
	var qmax float64
	for k := range o.Ux {
		if q := math.Hypot(o.kx*o.Ux[k], o.ky*o.Uy[k]); q > qmax && q-q == 0 {
			qmax = q
		}
	}
	next := step // a seed at every step of the outflow: the lines bound the channels
	sum, prev := 0.0, 0
	for t, k := range nodes {
		side := sides[t]
		h := hx
		if side == problem.Left || side == problem.Right {
			h = hy
		}
		q0, q1 := leaving(prev, side), leaving(k, side)
		add := (q0 + q1) / 2 * h
		for add > 0 && sum+add >= next && next < outflow-step/2 {
			f := (next - sum) / add // place along the step
			x0, y0 := o.nodeXY(prev)
			x1, y1 := o.nodeXY(k)
			segs = o.trace(segs, x0+f*(x1-x0), y0+f*(y1-y0), qmax)
			next += step
		}
		sum += add
		prev = k
	}
	return segs
}

func (o *Output) nodeXY(k int) (x, y float64) {
	return float64(k%(o.Nx+1)) * o.W / float64(o.Nx), float64(k/(o.Nx+1)) * o.H / float64(o.Ny)
}

// fluxAt is the flux -K grad u at (x, y), bilinear from the output grid.
func (o *Output) fluxAt(x, y float64) (qx, qy float64) {
	nx, ny := o.Nx, o.Ny
	fi := min(max(x/o.W*float64(nx), 0), float64(nx))
	fj := min(max(y/o.H*float64(ny), 0), float64(ny))
	i, j := min(int(fi), nx-1), min(int(fj), ny-1)
	a, b := fi-float64(i), fj-float64(j)
	k := j*(nx+1) + i
	lerp := func(v []float64) float64 {
		return (1-b)*((1-a)*v[k]+a*v[k+1]) + b*((1-a)*v[k+nx+1]+a*v[k+nx+2])
	}
	return -o.kx * lerp(o.Ux), -o.ky * lerp(o.Uy)
}

// trace follows the flux upstream from (x, y) by midpoint steps of half a
// cell until it leaves the rectangle, the flux dies away (a divide) or the
// path grows longer than the rectangle's perimeter many times over; qmax
// is the largest flux on the grid.
func (o *Output) trace(segs []float64, x, y, qmax float64) []float64 {
	h := 0.5 * min(o.W/float64(o.Nx), o.H/float64(o.Ny))
	dir := func(x, y float64) (dx, dy float64, ok bool) {
		qx, qy := o.fluxAt(x, y)
		q := math.Hypot(qx, qy)
		if !(q > 1e-6*qmax) {
			return 0, 0, false
		}
		return -qx / q, -qy / q, true // upstream
	}
	inside := func(x, y float64) bool { return x >= 0 && x <= o.W && y >= 0 && y <= o.H }
	maxSteps := int(8 * (o.W + o.H) / h)
	for s := 0; s < maxSteps; s++ {
		dx, dy, ok := dir(x, y)
		if !ok {
			break
		}
		mx, my := x+dx*h/2, y+dy*h/2
		if dx, dy, ok = dir(mx, my); !ok {
			break
		}
		nx, ny := x+dx*h, y+dy*h
		if !inside(nx, ny) {
			if s > 0 {
				break
			}
			// the first step from the boundary: nudge inside
			nx, ny = min(max(nx, 0), o.W), min(max(ny, 0), o.H)
		}
		segs = append(segs, x, y, nx, ny)
		x, y = nx, ny
	}
	return segs
}
