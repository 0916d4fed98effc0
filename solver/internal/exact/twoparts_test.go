package exact

import (
	"math"
	"math/rand/v2"
	"slices"
	"testing"

	"edgewise/solver/gauss"
	"edgewise/solver/problem"
)

func mustNew(t *testing.T, w, h, kx, ky float64, a, b Part, ua, ub float64) *TwoParts {
	t.Helper()
	tp, err := New(w, h, kx, ky, a, b, ua, ub)
	if err != nil {
		t.Fatal(err)
	}
	return tp
}

// cases are two-part problems of several shapes: parts on opposite,
// adjacent and the same edges, inside edges and whole edges.
var cases = []struct {
	name         string
	w, h, kx, ky float64
	a, b         Part
}{
	{"opposite sides", 2, 1, 1, 1, Part{problem.Left, 0, 1}, Part{problem.Right, 0, 1}},
	{"motz", 2, 1, 1, 1, Part{problem.Bottom, 0, 1}, Part{problem.Right, 0, 1}},
	{"strips on one edge", 3, 1, 1, 1, Part{problem.Top, 0.2, 1.1}, Part{problem.Top, 1.7, 2.5}},
	{"strips facing", 1, 0.6, 1, 1, Part{problem.Bottom, 0.3, 0.6}, Part{problem.Top, 0.1, 0.9}},
	{"left strip, whole bottom", 0.5, 2, 1, 1, Part{problem.Left, 0.5, 1.5}, Part{problem.Bottom, 0, 0.5}},
	{"orthotropic strips", 1.2, 0.8, 40, 10, Part{problem.Right, 0.1, 0.5}, Part{problem.Top, 0.2, 0.6}},
}

// Opposite whole sides, the rest insulated: the field is linear and the
// flow is k H / W exactly (one-dimensional conduction), isotropic and
// orthotropic (the flow is then kx H / W).
func TestOppositeSides(t *testing.T) {
	for _, c := range []struct{ w, h, kx, ky float64 }{{2, 1, 1, 1}, {0.3, 1.7, 5, 5}, {1, 1, 40, 10}, {4, 0.5, 2, 30}} {
		tp := mustNew(t, c.w, c.h, c.kx, c.ky, Part{problem.Left, 0, c.h}, Part{problem.Right, 0, c.h}, 10, 35)
		if got, want := tp.Conductance(), c.kx*c.h/c.w; math.Abs(got/want-1) > 1e-13 {
			t.Errorf("%v: conductance %.16g, want %.16g", c, got, want)
		}
		for _, f := range [][2]float64{{0.1, 0.5}, {0.5, 0.01}, {0.93, 0.99}, {0.5, 0.5}} {
			x, y := f[0]*c.w, f[1]*c.h
			u, ux, uy := tp.At(x, y)
			want := 10 + 25*x/c.w
			if math.Abs(u-want) > 1e-12*35 || math.Abs(ux-25/c.w) > 1e-11*25/c.w || math.Abs(uy) > 1e-11*25/c.w {
				t.Errorf("%v at (%g, %g): u %.15g grad (%g, %g), want %.15g (%g, 0)", c, x, y, u, ux, uy, want, 25/c.w)
			}
			if v := tp.Value(x, y); math.Abs(v-u) > 1e-12*35 {
				t.Errorf("%v at (%g, %g): Value %.15g, At %.15g", c, x, y, v, u)
			}
		}
	}
}

// The field is harmonic (in the mapped coordinates), the gradient is the
// derivative of the value, the parts hold their values, the insulated
// rest takes in nothing, and the flux density integrates to the flow.
func TestTwoPartsField(t *testing.T) {
	rng := rand.New(rand.NewPCG(1, 2))
	for _, c := range cases {
		tp := mustNew(t, c.w, c.h, c.kx, c.ky, c.a, c.b, -3, 7)
		for range 20 {
			x, y := c.w*(0.2+0.6*rng.Float64()), c.h*(0.2+0.6*rng.Float64())
			u, ux, uy := tp.At(x, y)
			if v := tp.Value(x, y); math.Abs(v-u) > 1e-13*10 || u < -3 || u > 7 {
				t.Errorf("%s (%g, %g): Value %g, At %g", c.name, x, y, v, u)
			}
			// central differences, step d: error about d^2 |u'''| ~ 1e-10
			d := 1e-5 * min(c.w, c.h)
			gx := (tp.Value(x+d, y) - tp.Value(x-d, y)) / (2 * d)
			gy := (tp.Value(x, y+d) - tp.Value(x, y-d)) / (2 * d)
			if math.Abs(gx-ux)+math.Abs(gy-uy) > 1e-7*(1+math.Abs(ux)+math.Abs(uy)) {
				t.Errorf("%s (%g, %g): gradient (%g, %g), differences (%g, %g)", c.name, x, y, ux, uy, gx, gy)
			}
			// kx u_xx + ky u_yy = 0, step e: error about e^2 u'''' ~ 1e-6,
			// against terms of size |u''| ~ 10
			e := 1e-3 * min(c.w, c.h)
			lap := c.kx*(tp.Value(x+e, y)-2*u+tp.Value(x-e, y))/(e*e) + c.ky*(tp.Value(x, y+e)-2*u+tp.Value(x, y-e))/(e*e)
			if math.Abs(lap) > 1e-4*(c.kx+c.ky)*10/(min(c.w, c.h)*min(c.w, c.h)) {
				t.Errorf("%s (%g, %g): kx u_xx + ky u_yy = %g", c.name, x, y, lap)
			}
		}
		for _, side := range problem.Sides {
			l := tp.length(side)
			for i := 1; i < 20; i++ {
				s := l * float64(i) / 20
				x, y := tp.point(side, s)
				in := tp.Inflow(side, s)
				switch {
				case inside(c.a, side, s):
					if v := tp.Value(x, y); math.Abs(v+3) > 1e-12 {
						t.Errorf("%s: %v s=%g on part A: %g, want -3", c.name, side, s, v)
					}
				case inside(c.b, side, s):
					if v := tp.Value(x, y); math.Abs(v-7) > 1e-12 {
						t.Errorf("%s: %v s=%g on part B: %g, want 7", c.name, side, s, v)
					}
				case !ends(c.a, side, s) && !ends(c.b, side, s):
					if math.Abs(in) > 1e-10*math.Abs(tp.Flow()) {
						t.Errorf("%s: %v s=%g insulated, inflow %g", c.name, side, s, in)
					}
				}
			}
		}
		for _, p := range []struct {
			part Part
			want float64
		}{{c.a, -tp.Flow()}, {c.b, tp.Flow()}} {
			if got := integrate(tp, p.part); math.Abs(got-p.want) > 1e-10*math.Abs(p.want) {
				t.Errorf("%s: flow through %v %.14g, want %.14g", c.name, p.part, got, p.want)
			}
		}
	}
}

func inside(p Part, e problem.Side, s float64) bool { return p.Side == e && p.From < s && s < p.To }
func ends(p Part, e problem.Side, s float64) bool {
	return p.Side == e && (math.Abs(s-p.From) < 1e-12 || math.Abs(s-p.To) < 1e-12)
}

// integrate returns the integral of the inflow along a part by 60-point
// Gauss-Legendre, through s = from + (to-from)(1 - cos t)/2 when both ends
// are inside the edge, which takes away the r^-1/2 growth there, and
// through the half of it that clusters at the one end inside the edge
// otherwise. At a corner the flux density is smooth (value meets
// insulated at a right angle: the local solutions are r^(2n+1) terms).
func integrate(tp *TwoParts, p Part) float64 {
	x, w := make([]float64, 60), make([]float64, 60)
	l := p.To - p.From
	lo, hi := p.From > 0, p.To < tp.length(p.Side)
	sub := func(t float64) (s, ds float64) { return p.From + l*(1-math.Cos(t))/2, l * math.Sin(t) / 2 }
	switch {
	case !lo && !hi:
		sub = func(t float64) (s, ds float64) { return p.From + l*t, l }
		gauss.Legendre(x, w, 0, 1)
	case lo && !hi:
		sub = func(t float64) (s, ds float64) { return p.From + l*(1-math.Cos(t)), l * math.Sin(t) }
		gauss.Legendre(x, w, 0, math.Pi/2)
	case !lo && hi:
		sub = func(t float64) (s, ds float64) { return p.To - l*(1-math.Cos(t)), l * math.Sin(t) }
		gauss.Legendre(x, w, 0, math.Pi/2)
	default:
		gauss.Legendre(x, w, 0, math.Pi)
	}
	sum := 0.0
	for i := range x {
		s, ds := sub(x[i])
		sum += w[i] * tp.Inflow(p.Side, s) * ds
	}
	return sum
}

// The inflow density on a part is the conductivity across the edge times
// the inward derivative of the field (one-sided second-order difference,
// step d: error about d^2 u”' ~ 1e-7 relative).
func TestInflowIsExitGradient(t *testing.T) {
	for _, c := range cases {
		tp := mustNew(t, c.w, c.h, c.kx, c.ky, c.a, c.b, 2, -5)
		for _, p := range []Part{c.a, c.b} {
			for _, f := range []float64{0.25, 0.5, 0.7} {
				s := p.From + f*(p.To-p.From)
				x, y := tp.point(p.Side, s)
				nx, ny, k := 0.0, 1.0, c.ky // inward normal, conductivity across
				switch p.Side {
				case problem.Right:
					nx, ny, k = -1, 0, c.kx
				case problem.Top:
					ny = -1
				case problem.Left:
					nx, ny, k = 1, 0, c.kx
				}
				d := 1e-4 * min(c.w, c.h)
				u0, u1, u2 := tp.Value(x, y), tp.Value(x+nx*d, y+ny*d), tp.Value(x+2*nx*d, y+2*ny*d)
				want := -k * (-3*u0 + 4*u1 - u2) / (2 * d) // entering: -k times the inward derivative
				if got := tp.Inflow(p.Side, s); math.Abs(got-want) > 1e-5*math.Abs(want) {
					t.Errorf("%s: %v s=%g: inflow %.10g, difference %.10g", c.name, p.Side, s, got, want)
				}
			}
		}
	}
}

// Duality (an identity of conformal modules): with unit conductivity the
// conductance between opposite whole sides times the conductance between
// the other two is 1; in a long rectangle one takes each arrangement.
func TestDuality(t *testing.T) {
	for _, c := range []struct{ w, h float64 }{{8, 0.5}, {0.2, 3}, {1, 1}} {
		lr := mustNew(t, c.w, c.h, 1, 1, Part{problem.Left, 0, c.h}, Part{problem.Right, 0, c.h}, 0, 1)
		bt := mustNew(t, c.w, c.h, 1, 1, Part{problem.Bottom, 0, c.w}, Part{problem.Top, 0, c.w}, 0, 1)
		if p := lr.Conductance() * bt.Conductance(); math.Abs(p-1) > 1e-13 {
			t.Errorf("%v: conductances %.16g x %.16g = %.16g, want 1", c, lr.Conductance(), bt.Conductance(), p)
		}
	}
}

// The two arrangements of the half-plane give the same field, flux
// density and conductance where both are well conditioned.
func TestArrangementsAgree(t *testing.T) {
	for _, c := range cases {
		one, err := build(c.w, c.h, c.kx, c.ky, c.a, c.b, 1, 4, beside)
		if err != nil {
			t.Fatal(err)
		}
		two, err := build(c.w, c.h, c.kx, c.ky, c.a, c.b, 1, 4, across)
		if err != nil {
			t.Fatal(err)
		}
		if d := math.Abs(one.Conductance()/two.Conductance() - 1); d > 1e-13 {
			t.Errorf("%s: conductance %.16g and %.16g", c.name, one.Conductance(), two.Conductance())
		}
		for _, f := range [][2]float64{{0.1, 0.2}, {0.5, 0.5}, {0.9, 0.7}, {0.3, 0.97}} {
			x, y := f[0]*c.w, f[1]*c.h
			u1, ux1, uy1 := one.At(x, y)
			u2, ux2, uy2 := two.At(x, y)
			if math.Abs(u1-u2) > 1e-12 || math.Abs(ux1-ux2)+math.Abs(uy1-uy2) > 1e-11*(1+math.Abs(ux1)+math.Abs(uy1)) {
				t.Errorf("%s at (%g, %g): %g (%g, %g) and %g (%g, %g)", c.name, x, y, u1, ux1, uy1, u2, ux2, uy2)
			}
		}
		for _, side := range problem.Sides {
			for i := 0; i <= 10; i++ {
				s := one.length(side) * (0.03 + 0.094*float64(i))
				if ends(c.a, side, s) || ends(c.b, side, s) {
					continue // singular points
				}
				x, y := one.point(side, s)
				if v1, v2 := one.Value(x, y), two.Value(x, y); math.Abs(v1-v2) > 1e-12 {
					t.Errorf("%s: %v s=%g: value %.15g and %.15g", c.name, side, s, v1, v2)
				}
				if q1, q2 := one.Inflow(side, s), two.Inflow(side, s); math.Abs(q1-q2) > 1e-11*(1+math.Abs(q1)) {
					t.Errorf("%s: %v s=%g: inflow %.15g and %.15g", c.name, side, s, q1, q2)
				}
			}
		}
	}
}

// Whole adjacent edges touch at a corner: in the square with the bottom at
// 0, the right side at 1 and the rest insulated, the reflection
// (x, y) -> (1-y, 1-x) swaps the two and fixes x + y = 1, where the field
// is 1/2 exactly (an identity); the flow is infinite.
func TestTouchingParts(t *testing.T) {
	for _, swap := range []bool{false, true} {
		a, b, ua, ub := Part{problem.Bottom, 0, 1}, Part{problem.Right, 0, 1}, 0.0, 1.0
		if swap {
			a, b, ua, ub = b, a, ub, ua
		}
		tp := mustNew(t, 1, 1, 1, 1, a, b, ua, ub)
		// (within d of the touching corner the value loses about 1e-16/d^2:
		// 1e-12 at d = 0.014)
		for _, x := range []float64{0.01, 0.3, 0.5, 0.8, 0.99} {
			if u := tp.Value(x, 1-x); math.Abs(u-0.5) > 1e-12 {
				t.Errorf("swap %v: u(%g, %g) = %.16g, want 1/2", swap, x, 1-x, u)
			}
			if u, v := tp.Value(x, 0.3), tp.Value(0.7, 1-x); math.Abs(u+v-1) > 1e-13 {
				t.Errorf("swap %v: u(%g, 0.3) + u(0.7, %g) = %.16g, want 1", swap, x, 1-x, u+v)
			}
		}
		if f := tp.Flow(); !math.IsInf(f, int(ub-ua)) {
			t.Errorf("swap %v: flow into B %g, want %g inf", swap, f, ub-ua)
		}
	}
}

// The flow through any stretch, from the stream function, equals the
// integral of the flux density over it; through a part it is the flow
// between the parts, and through the insulated rest nothing.
func TestFlowThrough(t *testing.T) {
	for _, c := range cases {
		tp := mustNew(t, c.w, c.h, c.kx, c.ky, c.a, c.b, 3, -8)
		f := tp.Flow()
		if got := tp.FlowThrough(c.b.Side, c.b.From, c.b.To); math.Abs(got-f) > 1e-12*math.Abs(f) {
			t.Errorf("%s: through B %.15g, want %.15g", c.name, got, f)
		}
		if got := tp.FlowThrough(c.a.Side, c.a.From, c.a.To); math.Abs(got+f) > 1e-12*math.Abs(f) {
			t.Errorf("%s: through A %.15g, want %.15g", c.name, got, -f)
		}
		total := 0.0
		for _, e := range problem.Sides {
			l := tp.length(e)
			total += tp.FlowThrough(e, 0, l)
			// pieces of the edge between the part ends: where a piece is
			// insulated nothing enters; inside a part it is the integral
			// of the flux density
			cuts := []float64{0, l}
			for _, p := range []Part{c.a, c.b} {
				if p.Side == e {
					cuts = append(cuts, p.From, p.To)
				}
			}
			slices.Sort(cuts)
			for i := 0; i+1 < len(cuts); i++ {
				s0, s1 := cuts[i], cuts[i+1]
				if s1 <= s0 {
					continue
				}
				got := tp.FlowThrough(e, s0, s1)
				mid := (s0 + s1) / 2
				if !inside(c.a, e, mid) && !inside(c.b, e, mid) {
					if math.Abs(got) > 1e-12*math.Abs(f) {
						t.Errorf("%s: %v %g..%g insulated, flow %g", c.name, e, s0, s1, got)
					}
					continue
				}
				// a piece of a part from its start to a point inside
				p := c.a
				if inside(c.b, e, mid) {
					p = c.b
				}
				sub := Part{e, p.From, p.From + 0.37*(p.To-p.From)}
				want := integrate(tp, Part{e, sub.From, sub.To})
				if got := tp.FlowThrough(e, sub.From, sub.To); math.Abs(got-want) > 1e-9*math.Abs(f) {
					t.Errorf("%s: %v %g..%g: flow %.12g, integral %.12g", c.name, e, sub.From, sub.To, got, want)
				}
			}
		}
		if math.Abs(total) > 1e-12*math.Abs(f) {
			t.Errorf("%s: net inflow %g, want 0", c.name, total)
		}
		// a part that ends at a corner, reached from the other edge
		if c.name == "motz" {
			if got := tp.FlowThrough(problem.Left, 0, 1); got != 0 {
				t.Errorf("motz: through the insulated left side %g, want 0 (its ends are a corner at a part end and a corner)", got)
			}
		}
	}
}

// The mean along a part is its value; along an insulated side between
// opposite held sides it is the mean of the two (the field is linear);
// in the square with touching parts (see TestTouchingParts) the means
// along the left and top sides add up to 1 (the reflection).
func TestMeanAlong(t *testing.T) {
	for _, c := range cases {
		tp := mustNew(t, c.w, c.h, c.kx, c.ky, c.a, c.b, 3, -8)
		if m := tp.MeanAlong(c.a.Side, c.a.From, c.a.To); math.Abs(m-3) > 1e-12 {
			t.Errorf("%s: mean along A %.15g, want 3", c.name, m)
		}
		if m := tp.MeanAlong(c.b.Side, c.b.From, c.b.To); math.Abs(m+8) > 1e-12 {
			t.Errorf("%s: mean along B %.15g, want -8", c.name, m)
		}
	}
	tp := mustNew(t, 2, 1, 1, 1, Part{problem.Left, 0, 1}, Part{problem.Right, 0, 1}, 10, 35)
	if m := tp.MeanAlong(problem.Top, 0, 2); math.Abs(m-22.5) > 1e-12 {
		t.Errorf("linear field: mean along the top %.15g, want 22.5", m)
	}
	if m := tp.MeanAlong(problem.Bottom, 0.5, 1); math.Abs(m-(10+25*0.375)) > 1e-12 {
		t.Errorf("linear field: mean along the bottom 0.5..1 %.15g, want %g", m, 10+25*0.375)
	}
	sq := mustNew(t, 1, 1, 1, 1, Part{problem.Bottom, 0, 1}, Part{problem.Right, 0, 1}, 0, 1)
	left, top := sq.MeanAlong(problem.Left, 0, 1), sq.MeanAlong(problem.Top, 0, 1)
	if math.Abs(left+top-1) > 1e-12 || !(left > 0 && left < top) {
		t.Errorf("touching square: means along left %.15g and top %.15g, want a sum of 1 and left < top", left, top)
	}
	// a stretch across a part end: the mean of the two pieces, weighted
	m := mustNew(t, 2, 1, 1, 1, Part{problem.Bottom, 0, 1}, Part{problem.Right, 0, 1}, 0, 500)
	whole, ins := m.MeanAlong(problem.Bottom, 0.5, 1.5), m.MeanAlong(problem.Bottom, 1, 1.5)
	if math.Abs(whole-ins/2) > 1e-12*500 {
		t.Errorf("motz: mean along 0.5..1.5 %.15g, want half the mean along 1..1.5 (%.15g)", whole, ins/2)
	}
}

// Long and thin rectangles, small parts and parts near corners: the parts
// hold their values, the flows through them agree, the net inflow is zero
// and the field stays between the two values (the maximum principle).
func TestHardGeometry(t *testing.T) {
	for _, c := range []struct {
		name string
		w, h float64
		a, b Part
	}{
		{"30:1 strips on the long side", 30, 1, Part{problem.Bottom, 2, 3}, Part{problem.Top, 26, 29.5}},
		{"1:30 ends", 1, 30, Part{problem.Bottom, 0, 1}, Part{problem.Left, 29, 30}},
		{"tiny part", 1, 1, Part{problem.Top, 0.5, 0.5 + 1e-6}, Part{problem.Bottom, 0.2, 0.8}},
		{"parts at a corner", 2, 1, Part{problem.Bottom, 1.9, 2}, Part{problem.Right, 1e-3, 0.5}},
	} {
		tp := mustNew(t, c.w, c.h, 1, 1, c.a, c.b, 0, 1)
		f := tp.Flow()
		if !(f > 0) || math.IsInf(f, 0) {
			t.Errorf("%s: flow %g", c.name, f)
			continue
		}
		if a := tp.FlowThrough(c.a.Side, c.a.From, c.a.To); math.Abs(a+f) > 1e-11*f {
			t.Errorf("%s: through A %.15g, B %.15g", c.name, a, f)
		}
		net := 0.0
		for _, e := range problem.Sides {
			net += tp.FlowThrough(e, 0, tp.length(e))
		}
		if math.Abs(net) > 1e-11*f {
			t.Errorf("%s: net inflow %g of %g", c.name, net, f)
		}
		for _, p := range []struct {
			part Part
			u    float64
		}{{c.a, 0}, {c.b, 1}} {
			for _, fr := range []float64{0.01, 0.5, 0.99} {
				x, y := tp.point(p.part.Side, p.part.From+fr*(p.part.To-p.part.From))
				if u := tp.Value(x, y); math.Abs(u-p.u) > 1e-11 {
					t.Errorf("%s: on the part at (%g, %g): %.15g, want %g", c.name, x, y, u, p.u)
				}
			}
		}
		for i := 1; i < 20; i++ {
			for j := 1; j < 20; j++ {
				if u := tp.Value(c.w*float64(i)/20, c.h*float64(j)/20); !(u >= -1e-12 && u <= 1+1e-12) {
					t.Errorf("%s: u(%g, %g) = %g outside [0, 1]", c.name, c.w*float64(i)/20, c.h*float64(j)/20, u)
				}
			}
		}
		t.Logf("%s: conductance %.15g", c.name, tp.Conductance())
	}
}

// mirror returns the part reflected in x = W/2 (flipX) or y = H/2.
func mirror(p Part, w, h float64, flipX bool) Part {
	switch {
	case flipX && (p.Side == problem.Bottom || p.Side == problem.Top):
		return Part{p.Side, w - p.To, w - p.From}
	case flipX && p.Side == problem.Left:
		return Part{problem.Right, p.From, p.To}
	case flipX:
		return Part{problem.Left, p.From, p.To}
	case p.Side == problem.Left || p.Side == problem.Right:
		return Part{p.Side, h - p.To, h - p.From}
	case p.Side == problem.Bottom:
		return Part{problem.Top, p.From, p.To}
	}
	return Part{problem.Bottom, p.From, p.To}
}

// Symmetry identities: naming the parts the other way round changes
// nothing; swapping the two values gives UA + UB - u; reflecting the
// rectangle reflects the field (each reflection reverses the boundary's
// direction, which the map must undo).
func TestSymmetries(t *testing.T) {
	rng := rand.New(rand.NewPCG(3, 4))
	for _, c := range cases {
		base := mustNew(t, c.w, c.h, c.kx, c.ky, c.a, c.b, 2, 9)
		renamed := mustNew(t, c.w, c.h, c.kx, c.ky, c.b, c.a, 9, 2)
		swapped := mustNew(t, c.w, c.h, c.kx, c.ky, c.a, c.b, 9, 2)
		fx := mustNew(t, c.w, c.h, c.kx, c.ky, mirror(c.a, c.w, c.h, true), mirror(c.b, c.w, c.h, true), 2, 9)
		fy := mustNew(t, c.w, c.h, c.kx, c.ky, mirror(c.a, c.w, c.h, false), mirror(c.b, c.w, c.h, false), 2, 9)
		for _, g := range []*TwoParts{renamed, swapped, fx, fy} {
			if d := math.Abs(g.Conductance()/base.Conductance() - 1); d > 1e-13 {
				t.Errorf("%s: conductance %.16g, base %.16g", c.name, g.Conductance(), base.Conductance())
			}
		}
		for range 10 {
			x, y := c.w*(0.02+0.96*rng.Float64()), c.h*(0.02+0.96*rng.Float64())
			u := base.Value(x, y)
			for _, v := range []struct {
				name string
				got  float64
				want float64
			}{
				{"renamed", renamed.Value(x, y), u},
				{"swapped", swapped.Value(x, y), 11 - u},
				{"mirrored in x", fx.Value(c.w-x, y), u},
				{"mirrored in y", fy.Value(x, c.h-y), u},
			} {
				if math.Abs(v.got-v.want) > 1e-12*7 {
					t.Errorf("%s %s at (%g, %g): %.15g, want %.15g", c.name, v.name, x, y, v.got, v.want)
				}
			}
		}
	}
}
