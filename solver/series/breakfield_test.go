package series

import (
	"math"
	"strings"
	"testing"

	"edgewise/solver/problem"
)

// zeroField is a field that is zero everywhere: it isolates the break
// pieces in solveWithBreaks.
type zeroField struct{}

func (zeroField) At(x, y float64) (u, ux, uy float64)  { return 0, 0, 0 }
func (zeroField) Grid(nx, ny int, u, ux, uy []float64) { clear(u); clear(ux); clear(uy) }
func (zeroField) Flow(problem.Side) (float64, bool)    { return 0, true }
func (zeroField) Mean() float64                        { return 0 }
func (zeroField) Terms() int                           { return 0 }
func (zeroField) ErrorEstimate() float64               { return 0 }
func (zeroField) Warnings() []problem.Warning          { return nil }

// insideBreaks returns the breaks inside p's edges (FindBreaks without the
// corner breaks).
func insideBreaks(t *testing.T, p *problem.Problem) []Break {
	t.Helper()
	all, err := FindBreaks(p)
	if err != nil {
		t.Fatal(err)
	}
	var out []Break
	for _, b := range all {
		if b.Class != CornerBreak {
			out = append(out, b)
		}
	}
	return out
}

// seriesOnly solves with the series alone, as SolveBreaks does.
func seriesOnly(q *problem.Problem) (Field, error) {
	s, err := Solve(q, Options{Tol: 1e-9})
	if err != nil {
		return nil, err
	}
	return s, nil
}

// step returns when(s < at, a, b) (or s <= at with orEqual).
func step(at, a, b float64, orEqual bool) func(float64) float64 {
	return func(s float64) float64 {
		if s < at || (orEqual && s == at) {
			return a
		}
		return b
	}
}

func stepProblem(kx, ky float64) *problem.Problem {
	p := &problem.Problem{W: 3, H: 2, Kx: kx, Ky: ky}
	for _, s := range problem.Sides {
		p.Edges[s] = problem.Edge{Kind: problem.Flux, F: problem.Const(0)}
	}
	p.Edges[problem.Bottom] = problem.Edge{Kind: problem.Value, F: func(s float64) float64 {
		if s < 1.2 {
			return 5
		}
		return 1
	}}
	return p
}

// The angle field of a jump J at s0 on the bottom edge of an isotropic
// rectangle, phi = (J/pi) atan2(y, x - s0), takes the flow
// k J/(2 pi) ln((s0^2 + H^2)/s0^2) in through the left edge (exact: the
// integral of -k dphi/dx = k (J/pi) y/(s0^2 + y^2) over 0 < y < H).
func TestAngleFieldFlowAndMean(t *testing.T) {
	p := stepProblem(7, 7)
	jumps := insideBreaks(t, p)
	if len(jumps) != 1 || math.Abs(jumps[0].S-1.2) > 1e-9 {
		t.Fatalf("jumps %+v", jumps)
	}
	f, err := solveWithBreaks(p, jumps, func(*problem.Problem) (Field, error) { return zeroField{}, nil })
	if err != nil {
		t.Fatal(err)
	}
	bf := f.(*breakField)
	J, s0, k, H := 4.0, 1.2, 7.0, 2.0
	want := k * J / (2 * math.Pi) * math.Log((s0*s0+H*H)/(s0*s0))
	if got, _ := bf.Flow(problem.Left); math.Abs(got-want) > 1e-10*want {
		t.Errorf("flow through the left edge %.15g, want %.15g", got, want)
	}
	if _, ok := bf.Flow(problem.Bottom); ok {
		t.Errorf("flow through the edge with the jump is finite")
	}
	// the mean against a midpoint sum on a fine grid (reference by brute
	// force; the midpoint rule errs by about 1e-6 here)
	n := 1500
	sum := 0.0
	for j := 0; j < n; j++ {
		for i := 0; i < n; i++ {
			u, _, _ := bf.phis[0].at((float64(i)+0.5)*p.W/float64(n), (float64(j)+0.5)*p.H/float64(n))
			sum += u
		}
	}
	if brute := sum / float64(n*n); math.Abs(bf.Mean()-brute) > 1e-5*J {
		t.Errorf("mean %.9g, midpoint sum %.9g", bf.Mean(), brute)
	}
}

// Each angle field solves Kx u_xx + Ky u_yy = 0 (exact identity; checked
// by central differences, which err by h^2 times fourth derivatives) and
// carries exactly the jump along its edge.
func TestAngleFieldIsHarmonic(t *testing.T) {
	for _, side := range problem.Sides {
		pr := &problem.Problem{W: 3, H: 2, Kx: 9, Ky: 1}
		br := Break{Class: ValueBreak, Side: side, Corner: -1, S: 0.4 * pr.Length(side), From: 3, To: -1}
		a := newBreakPiece(pr, br)
		h := 1e-3
		for _, pt := range [][2]float64{{1, 1}, {0.5, 1.5}, {2.5, 0.3}} {
			x, y := pt[0], pt[1]
			u := func(x, y float64) float64 { v, _, _ := a.at(x, y); return v }
			lap := pr.Kx*(u(x+h, y)-2*u(x, y)+u(x-h, y))/(h*h) + pr.Ky*(u(x, y+h)-2*u(x, y)+u(x, y-h))/(h*h)
			if math.Abs(lap) > 1e-4 {
				t.Errorf("%v: Kx u_xx + Ky u_yy = %g at (%g, %g)", side, lap, x, y)
			}
			_, gx, gy := a.at(x, y)
			if math.Abs(gx-(u(x+h, y)-u(x-h, y))/(2*h)) > 1e-5 || math.Abs(gy-(u(x, y+h)-u(x, y-h))/(2*h)) > 1e-5 {
				t.Errorf("%v: gradient (%g, %g) disagrees with differences", side, gx, gy)
			}
		}
		// along its own edge: J = 4 before s0, 0 after
		L := pr.Length(side)
		for _, s := range []float64{0.1 * L, 0.39 * L, 0.41 * L, 0.9 * L} {
			x, y := pr.Point(side, s)
			v, _, _ := a.at(x, y)
			want := 0.0
			if s < br.S {
				want = 4
			}
			if math.Abs(v-want) > 1e-12 {
				t.Errorf("%v at s = %g: %g, want %g", side, s, v, want)
			}
		}
	}
}

// Manufactured exact solution with a jump inside the bottom edge:
// u = (J/pi) atan2(c y, x - s0) + x^2 - (Kx/Ky) y^2 + 0.3 x y, c = sqrt(Kx/Ky),
// solves Kx u_xx + Ky u_yy = 0 (exact identity), with the bottom edge held
// at J before s0 plus x^2, convection on the top and fluxes on the sides
// taken from u. With the angle field carrying the jump, the series must
// reproduce u to its tolerance, in few terms; its flows through the edges
// without the jump must match the integrals of u's fluxes.
func TestStepOnEdgeManufactured(t *testing.T) {
	const kx, ky, s0, J, W, H, hc = 4.0, 1.0, 1.2, 4.0, 3.0, 2.0, 3.0
	c := math.Sqrt(kx / ky)
	exact := func(x, y float64) (u, ux, uy float64) {
		d, tt := c*y, x-s0
		r2 := d*d + tt*tt
		th := math.Atan2(d, tt)
		return J/math.Pi*th + x*x - kx/ky*y*y + 0.3*x*y,
			J/math.Pi*(-d)/r2 + 2*x + 0.3*y,
			J/math.Pi*tt*c/r2 - 2*kx/ky*y + 0.3*x
	}
	p := &problem.Problem{W: W, H: H, Kx: kx, Ky: ky}
	p.Edges[problem.Bottom] = problem.Edge{Kind: problem.Value, F: func(s float64) float64 {
		u, _, _ := exact(s, 0)
		return u
	}}
	p.Edges[problem.Top] = problem.Edge{Kind: problem.Convection, Hc: hc, F: func(s float64) float64 {
		u, _, uy := exact(s, H)
		return u + ky*uy/hc // entering ky u_y = hc (a - u)
	}}
	p.Edges[problem.Left] = problem.Edge{Kind: problem.Flux, F: func(s float64) float64 {
		_, ux, _ := exact(0, s)
		return -kx * ux
	}}
	p.Edges[problem.Right] = problem.Edge{Kind: problem.Flux, F: func(s float64) float64 {
		_, ux, _ := exact(W, s)
		return kx * ux
	}}
	jumps := insideBreaks(t, p)
	if len(jumps) != 1 {
		t.Fatalf("jumps %+v", jumps)
	}
	f, err := solveWithBreaks(p, jumps, seriesOnly)
	if err != nil {
		t.Fatal(err)
	}
	if f.Terms() >= 4096 {
		t.Errorf("the series still needs %d terms", f.Terms())
	}
	worst := 0.0
	for j := 0; j <= 20; j++ {
		for i := 0; i <= 30; i++ {
			x, y := float64(i)*W/30, float64(j)*H/20
			if math.Hypot(x-s0, y) < 1e-9 {
				continue
			}
			u, _, _ := f.At(x, y)
			e, _, _ := exact(x, y)
			worst = max(worst, math.Abs(u-e))
		}
	}
	// Tolerance: the series' target is 1e-9 of the data scale (here about
	// 20); 1e-7 allows the estimate's usual margin.
	if worst > 1e-7 {
		t.Errorf("largest error %.3g against the exact solution", worst)
	}
	// flows: the left edge takes int -kx u_x(0, y) dy in; check it by the
	// graded Gauss rule on the exact flux (a reference independent of the
	// angle field's own flow)
	want := gradedGauss(func(y float64) float64 { _, ux, _ := exact(0, y); return -kx * ux }, 0, H, 40, gl16x, gl16w)
	if got, ok := f.Flow(problem.Left); !ok || math.Abs(got-want) > 1e-7*math.Abs(want) {
		t.Errorf("left flow %.12g, want %.12g", got, want)
	}
	t.Logf("terms %d, largest error %.3g", f.Terms(), worst)
}

// Manufactured exact solution with steps of flux: a flux step on the bottom
// edge at x = 0.9 and a step of ambient on the convection top edge at
// x = 2.1, orthotropic. With kappa-scaled amplitudes a1, a2,
// u = psi1 + psi2 + x^2 - (Kx/Ky) y^2 + 0.3 x y, psi = -(a/pi)(t ln r - d theta)
// in the mapped coordinates of each edge, solves Kx u_xx + Ky u_yy = 0
// (exact identity). The edge data are taken from u; the solver must find
// both steps, carry them out of the series, and reproduce u and the exact
// inflow through the bottom (the integral of its piecewise data).
func TestFluxStepsManufactured(t *testing.T) {
	const kx, ky, W, H, hc = 4.0, 1.0, 3.0, 2.0, 3.0
	c := math.Sqrt(kx / ky)
	piece := func(a, t, d float64) (v, vt, vd float64) {
		r2 := t*t + d*d
		if r2 == 0 {
			return 0, 0, 0 // the step itself: data take the value after it
		}
		lr, th := 0.5*math.Log(r2), math.Atan2(d, t)
		return -a / math.Pi * (t*lr - d*th), -a / math.Pi * (lr + 1), a / math.Pi * th
	}
	exact := func(x, y float64) (u, ux, uy float64) {
		v1, v1t, v1d := piece(0.8, x-0.9, c*y)      // bottom: t = x - 0.9, d = c y
		v2, v2t, v2d := piece(-0.5, x-2.1, c*(H-y)) // top: t = x - 2.1, d = c (H - y)
		u = v1 + v2 + x*x - kx/ky*y*y + 0.3*x*y
		ux = v1t + v2t + 2*x + 0.3*y
		uy = c*v1d - c*v2d - 2*kx/ky*y + 0.3*x
		return u, ux, uy
	}
	pr := &problem.Problem{W: W, H: H, Kx: kx, Ky: ky}
	pr.Edges[problem.Bottom] = problem.Edge{Kind: problem.Flux, F: func(s float64) float64 {
		_, _, uy := exact(s, 0)
		return -ky * uy
	}}
	pr.Edges[problem.Top] = problem.Edge{Kind: problem.Convection, Hc: hc, F: func(s float64) float64 {
		u, _, uy := exact(s, H)
		return u + ky*uy/hc
	}}
	pr.Edges[problem.Left] = problem.Edge{Kind: problem.Value, F: func(s float64) float64 {
		u, _, _ := exact(0, s)
		return u
	}}
	pr.Edges[problem.Right] = problem.Edge{Kind: problem.Flux, F: func(s float64) float64 {
		_, ux, _ := exact(W, s)
		return kx * ux
	}}
	steps := insideBreaks(t, pr)
	if len(steps) != 2 {
		t.Fatalf("steps %+v, want one on the bottom and one on the top", steps)
	}
	f, err := solveWithBreaks(pr, steps, seriesOnly)
	if err != nil {
		t.Fatal(err)
	}
	if f.Terms() >= 1024 {
		t.Errorf("the series still needs %d terms", f.Terms())
	}
	worst := 0.0
	for j := 0; j <= 20; j++ {
		for i := 0; i <= 30; i++ {
			x, y := float64(i)*W/30, float64(j)*H/20
			u, _, _ := f.At(x, y)
			e, _, _ := exact(x, y)
			worst = max(worst, math.Abs(u-e))
		}
	}
	// Tolerance: the series' target is 1e-9 of the data scale (about 20
	// here); 1e-7 allows the estimate's usual margin.
	if worst > 1e-7 {
		t.Errorf("largest error %.3g against the exact solution", worst)
	}
	// inflow through the bottom: the integral of its data, split at the
	// step (graded Gauss on the exact flux, an independent reference)
	in := func(s float64) float64 { _, _, uy := exact(s, 0); return -ky * uy }
	want := gradedGauss(in, 0, 0.9, 40, gl16x, gl16w) + gradedGauss(in, 0.9, W, 40, gl16x, gl16w)
	if got, ok := f.Flow(problem.Bottom); !ok || math.Abs(got-want) > 1e-8*math.Abs(want) {
		t.Errorf("bottom flow %.12g, want %.12g", got, want)
	}
	t.Logf("terms %d, largest error %.3g", f.Terms(), worst)
}

// The data of a value edge with a jump stay continuous once the angle
// piece is taken out, also at the jump itself, whichever side the formula
// puts that point on (s < a or s <= a).
func TestJumpPointTakesItsSide(t *testing.T) {
	for _, formula := range []string{"when(s < 1.5, 8, 2)", "when(s <= 1.5, 8, 2)"} {
		p := &problem.Problem{W: 3, H: 2, Kx: 1, Ky: 1}
		for _, s := range problem.Sides {
			p.Edges[s] = problem.Edge{Kind: problem.Flux, F: problem.Const(0)}
		}
		f := step(1.5, 8, 2, strings.Contains(formula, "<="))
		p.Edges[problem.Bottom] = problem.Edge{Kind: problem.Value, F: f}
		jumps := insideBreaks(t, p)
		if len(jumps) != 1 {
			t.Fatalf("%s: jumps %+v", formula, jumps)
		}
		jumps[0].S = 1.5 // the place the engine may sample exactly
		var modified *problem.Problem
		_, err := solveWithBreaks(p, jumps, func(q *problem.Problem) (Field, error) {
			modified = q
			return zeroField{}, nil
		})
		if err != nil {
			t.Fatal(err)
		}
		g := modified.Edges[problem.Bottom].F
		for _, s := range []float64{1.4, 1.5, math.Nextafter(1.5, 0), 1.6} {
			if v := g(s); math.Abs(v-2) > 1e-12 {
				t.Errorf("%s: data left for the series at s = %v is %v, want 2", formula, s, v)
			}
		}
	}
}

// The same for a step of flux: continuous data for the series at the step,
// whichever side the formula puts that point on.
func TestFluxStepPointTakesItsSide(t *testing.T) {
	for _, formula := range []string{"when(s < 1.5, 8, 2)", "when(s <= 1.5, 8, 2)"} {
		p := &problem.Problem{W: 3, H: 2, Kx: 1, Ky: 1}
		for _, s := range problem.Sides {
			p.Edges[s] = problem.Edge{Kind: problem.Value, F: problem.Const(0)}
		}
		f := step(1.5, 8, 2, strings.Contains(formula, "<="))
		p.Edges[problem.Bottom] = problem.Edge{Kind: problem.Flux, F: f}
		steps := insideBreaks(t, p)
		if len(steps) != 1 {
			t.Fatalf("%s: steps %+v", formula, steps)
		}
		steps[0].S = 1.5 // the place the engine may sample exactly
		var modified *problem.Problem
		if _, err := solveWithBreaks(p, steps, func(q *problem.Problem) (Field, error) {
			modified = q
			return zeroField{}, nil
		}); err != nil {
			t.Fatal(err)
		}
		g := modified.Edges[problem.Bottom].F
		want := g(1.6)
		for _, s := range []float64{1.4, 1.5, math.Nextafter(1.5, 0)} {
			if v := g(s); math.Abs(v-want) > 1e-9 {
				t.Errorf("%s: data left for the series at s = %v is %v, want %v as around it", formula, s, v, want)
			}
		}
	}
}
