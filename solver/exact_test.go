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

// Until the engine solves edges made of segments, Solve refuses them with
// the one-line error that says so, and no number comes out.
func TestSolveRefusesSegments(t *testing.T) {
	for _, c := range []struct{ top, want string }{
		{`{"segments": [{"to": 10, "kind": "value", "expr": "12"}, {"kind": "flux", "expr": "0"}]}`,
			"edges.top.segments: mixed conditions along one edge are not solved yet (2 segments); give the edge one condition"},
		{`{"kind": "convection", "h": "when(s < 25, 8, 20)", "ambient": "18"}`,
			"edges.top.h: an h that varies along the edge is not solved yet; give one number"},
	} {
		p, err := project.Decode([]byte(`{"schema": "edgewise/1", "physics": "heat", "width": 30, "height": 10, "conductivity": 1,
			"edges": {"bottom": {"kind": "value", "expr": "0"}, "left": {"kind": "flux", "expr": "0"}, "right": {"kind": "flux", "expr": "0"},
			"top": ` + c.top + `}}`))
		if err != nil {
			t.Fatal(err)
		}
		var s Solver
		out, err := s.Solve(p, Options{Nx: 8, Ny: 8})
		if err == nil || err.Error() != c.want || out != nil {
			t.Errorf("solve: %v, %v; want no output and the error %q", out != nil, err, c.want)
		}
	}
}
