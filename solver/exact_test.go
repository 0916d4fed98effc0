package solver

import (
	"fmt"
	"math"
	"testing"

	"edgewise/solver/internal/exact"
	"edgewise/solver/problem"
	"edgewise/solver/project"
)

// The engine against the exact two-part fields (package exact, the
// Schwarz-Christoffel map) on whole-edge problems it solves today: two
// edges held at two values, the other two insulated. Opposite edges give
// the linear field, which the engine sums exactly; adjacent edges meet at
// a corner where the value jumps (the field grows like the angle there,
// the flow is infinite), which the engine carries by its corner pieces.
// Both are exact in the engine: measured 3e-15 of |UB-UA| in value and
// 3e-14 in gradient at worst, flows 4e-16, so the bounds 1e-12 (values)
// and 1e-13 (flows) can fail.
func TestEngineAgainstExact(t *testing.T) {
	for _, c := range []struct {
		name         string
		w, h, kx, ky float64
		a, b         problem.Side
		tol          float64 // largest difference allowed, relative to |UB - UA|
	}{
		{"opposite", 0.4, 0.15, 167, 167, problem.Left, problem.Right, 1e-12},
		{"opposite orthotropic", 0.3, 0.2, 40, 10, problem.Bottom, problem.Top, 1e-12},
		{"adjacent square", 1, 1, 1, 1, problem.Bottom, problem.Right, 1e-12},
		{"adjacent wide orthotropic", 0.5, 0.2, 20, 45, problem.Left, problem.Bottom, 1e-12},
	} {
		t.Run(c.name, func(t *testing.T) {
			const ua, ub = 20.0, 95.0
			lengthOf := func(e problem.Side) float64 {
				if e == problem.Bottom || e == problem.Top {
					return c.w
				}
				return c.h
			}
			ex, err := exact.New(c.w, c.h, c.kx, c.ky, exact.Part{Side: c.a, To: lengthOf(c.a)}, exact.Part{Side: c.b, To: lengthOf(c.b)}, ua, ub)
			if err != nil {
				t.Fatal(err)
			}
			edges := map[problem.Side]string{}
			for _, e := range problem.Sides {
				edges[e] = `{"kind": "flux", "expr": "0"}`
			}
			edges[c.a] = fmt.Sprintf(`{"kind": "value", "expr": "%g"}`, ua)
			edges[c.b] = fmt.Sprintf(`{"kind": "value", "expr": "%g"}`, ub)
			src := fmt.Sprintf(`{"schema": "edgewise/1", "physics": "heat", "width": %g, "height": %g, "conductivity": {"x": %g, "y": %g},
				"edges": {"bottom": %s, "right": %s, "top": %s, "left": %s}, "probes": [`,
				c.w, c.h, c.kx, c.ky, edges[problem.Bottom], edges[problem.Right], edges[problem.Top], edges[problem.Left])
			var pts [][2]float64
			for i := 1; i < 10; i++ {
				for j := 1; j < 10; j++ {
					pts = append(pts, [2]float64{c.w * float64(i) / 10, c.h * float64(j) / 10})
				}
			}
			for i, p := range pts {
				if i > 0 {
					src += ","
				}
				src += fmt.Sprintf(`{"x": %g, "y": %g}`, p[0], p[1])
			}
			p, err := project.Decode([]byte(src + "]}"))
			if err != nil {
				t.Fatal(err)
			}
			var s Solver
			out, err := s.Solve(p, Options{Nx: 8, Ny: 8, NoCrossCheck: true})
			if err != nil {
				t.Fatal(err)
			}
			worst, worstGrad := 0.0, 0.0
			for i, pr := range out.Result.Probes {
				u, ux, uy := ex.At(pts[i][0], pts[i][1])
				worst = max(worst, math.Abs(pr.Value-u)/(ub-ua))
				g := math.Hypot(pr.Gradient[0]-ux, pr.Gradient[1]-uy) / ((ub - ua) / min(c.w, c.h))
				worstGrad = max(worstGrad, g)
			}
			t.Logf("worst difference: value %.2g, gradient %.2g (relative to |UB-UA| and |UB-UA|/min(W,H))", worst, worstGrad)
			if worst > c.tol || worstGrad > 100*c.tol {
				t.Errorf("engine and exact field differ by %.3g in value, %.3g in gradient (allowed %g, %g)", worst, worstGrad, c.tol, 100*c.tol)
			}
			fb, fa := out.Result.Edges[c.b], out.Result.Edges[c.a]
			if f := ex.Flow(); math.IsInf(f, 0) {
				if fb.Finite || fa.Finite {
					t.Errorf("flows finite (%v, %v); the exact flow is infinite", fb.Finite, fa.Finite)
				}
			} else if !fb.Finite || !fa.Finite || math.Abs(*fb.Flow-f) > 1e-13*math.Abs(f) || math.Abs(*fa.Flow+f) > 1e-13*math.Abs(f) {
				t.Errorf("flows %v, %v, want %.12g and its negative", fb.Flow, fa.Flow, f)
			} else {
				t.Logf("flows differ by %.2g relative", max(math.Abs(*fb.Flow-f), math.Abs(*fa.Flow+f))/math.Abs(f))
			}
		})
	}
}

// Two electrode strips, one on the bottom edge and one on the top, the
// rest insulated, written as edges made of segments in a project: the
// engine's field, each segment's flow and the conductance against the
// exact Schwarz-Christoffel solution, to 1e-6 (the target; measured:
// conductance within 3e-10) and within the estimate, (package exact: the classical
// conformal map, found in any potential-theory text).
func TestSolveSegmentsTwoStrips(t *testing.T) {
	const W, H = 1.0, 0.6
	ex, err := exact.New(W, H, 1, 1, exact.Part{Side: problem.Bottom, From: 0.2, To: 0.5},
		exact.Part{Side: problem.Top, From: 0.3, To: 0.7}, 0, 1)
	if err != nil {
		t.Fatal(err)
	}
	p, err := project.Decode([]byte(`{"schema": "edgewise/1", "physics": "electrostatic", "width": 1, "height": 0.6, "conductivity": 1,
		"edges": {"left": {"kind": "flux", "expr": "0"}, "right": {"kind": "flux", "expr": "0"},
		"bottom": {"segments": [{"to": 0.2, "kind": "flux", "expr": "0"}, {"to": 0.5, "kind": "value", "expr": "0"}, {"kind": "flux", "expr": "0"}]},
		"top": {"segments": [{"to": 0.3, "kind": "flux", "expr": "0"}, {"to": 0.7, "kind": "value", "expr": "1"}, {"kind": "flux", "expr": "0"}]}},
		"probes": [{"x": 0.5, "y": 0.3}, {"x": 0.9, "y": 0.5}]}`))
	if err != nil {
		t.Fatal(err)
	}
	var s Solver
	out, err := s.Solve(p, Options{Nx: 40, Ny: 24, NoCrossCheck: true})
	if err != nil {
		t.Fatal(err)
	}
	r := out.Result
	est := r.Accuracy.Estimate
	for _, q := range r.Probes {
		if e := math.Abs(q.Value - ex.Value(q.X, q.Y)); e > 1e-6 || e > est {
			t.Errorf("probe (%g, %g): %.12g, exact %.12g (estimate %.3g)", q.X, q.Y, q.Value, ex.Value(q.X, q.Y), est)
		}
	}
	top, bottom := r.Edges[problem.Top].Segments, r.Edges[problem.Bottom].Segments
	if len(top) != 3 || len(bottom) != 3 {
		t.Fatalf("segments: top %d, bottom %d; want 3 and 3", len(top), len(bottom))
	}
	want := ex.FlowThrough(problem.Top, 0.3, 0.7)
	if g := top[1]; !g.Finite || math.Abs(*g.Flow-want) > 1e-6*math.Abs(want) || g.Kind != "value" || g.From != 0.3 || g.To != 0.7 {
		t.Errorf("top strip %+v, flow want %.12g", g, want)
	}
	if g := bottom[1]; !g.Finite || math.Abs(*g.Flow+want) > 1e-6*math.Abs(want) {
		t.Errorf("bottom strip %+v (flow %.12g), flow want %.12g", g, *g.Flow, -want)
	}
	sum := 0.0
	for _, g := range top {
		sum += *g.Flow
	}
	if math.Abs(sum-*r.Edges[problem.Top].Flow) > 1e-12 {
		t.Errorf("top segments sum to %.12g, the edge's flow is %.12g", sum, *r.Edges[problem.Top].Flow)
	}
	// the mean under the insulated part next to the top strip, exact by quadrature
	if m, w := top[2].Mean, ex.MeanAlong(problem.Top, 0.7, 1); math.Abs(m-w) > 1e-6 || math.Abs(m-w) > est {
		t.Errorf("mean of top[2] %.12g, exact %.12g", m, w)
	}
	c := r.Answers.Conductance
	if c == nil {
		t.Fatalf("no conductance: %s", r.Answers.NoConductance)
	}
	if math.Abs(c.PerDifference-ex.Conductance()) > 1e-6*ex.Conductance() {
		t.Errorf("conductance %.12g, exact %.12g", c.PerDifference, ex.Conductance())
	}
	t.Logf("conductance %.12g (exact %.12g), estimate %.3g, converged %v", c.PerDifference, ex.Conductance(), est, r.Accuracy.Converged)
}

// The exit gradient along the downstream pool of a section with two pools
// and an impervious floor between them (heads 9 and 2, the rest
// impervious) against the exact conformal-map field (package exact): it
// grows without bound at the floor's toe like r^-1/2, so it is compared at
// stated distances from the toe (0.1 to 5 m), to 1e-6 relative.
func TestExitGradientAgainstConformalMap(t *testing.T) {
	const W, H, k = 40.0, 12.0, 2e-5
	ex, err := exact.New(W, H, k, k, exact.Part{Side: problem.Top, From: 0, To: 15},
		exact.Part{Side: problem.Top, From: 25, To: 40}, 9, 2)
	if err != nil {
		t.Fatal(err)
	}
	ds := []float64{0.1, 0.5, 1, 2, 5}
	probes := ""
	for i, d := range ds {
		if i > 0 {
			probes += ","
		}
		probes += fmt.Sprintf(`{"x": %g, "y": 12}`, 25+d)
	}
	p, err := project.Decode([]byte(`{"schema": "edgewise/1", "physics": "seepage", "width": 40, "height": 12, "conductivity": 2e-5,
		"edges": {"bottom": {"kind": "flux", "expr": "0"}, "left": {"kind": "flux", "expr": "0"}, "right": {"kind": "flux", "expr": "0"},
		"top": {"segments": [{"to": 15, "kind": "value", "expr": "9"}, {"to": 25, "kind": "flux", "expr": "0"}, {"kind": "value", "expr": "2"}]}},
		"probes": [` + probes + `]}`))
	if err != nil {
		t.Fatal(err)
	}
	var s Solver
	out, err := s.Solve(p, Options{Nx: 40, Ny: 12, NoCrossCheck: true})
	if err != nil {
		t.Fatal(err)
	}
	for i, q := range out.Result.Probes {
		g := math.Hypot(q.Gradient[0], q.Gradient[1])
		want := math.Abs(ex.Inflow(problem.Top, 25+ds[i])) / k // leaving through a held part: all normal
		t.Logf("%g m from the toe: exit gradient %.10g, exact %.10g", ds[i], g, want)
		if math.Abs(g-want) > 1e-6*want {
			t.Errorf("%g m from the toe: exit gradient %.10g, exact %.10g", ds[i], g, want)
		}
	}
	// the discharge per metre of head difference against the exact
	// conductance (exact.Conductance includes the conductivity)
	c := out.Result.Answers.Conductance
	if c == nil || math.Abs(c.PerDifference-ex.Conductance()) > 1e-6*ex.Conductance() {
		t.Errorf("conductance %+v, exact %.10g", c, ex.Conductance())
	}
}
