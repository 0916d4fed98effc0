package solver

import (
	"fmt"
	"math"
	"strings"
	"testing"

	"edgewise/solver/problem"
	"edgewise/solver/project"
	"edgewise/solver/series"
)

// twoTerminal is a project whose terminals are two opposite full sides;
// the other two sides are insulated.
func twoTerminal(physics, cond string, w, h float64, vertical bool, extra string) string {
	hiSide, loSide, ins1, ins2 := "left", "right", "bottom", "top"
	if vertical {
		hiSide, loSide, ins1, ins2 = "bottom", "top", "left", "right"
	}
	return fmt.Sprintf(`{"schema": "edgewise/1", "physics": %q, "width": %g, "height": %g, "conductivity": %s,
	  "edges": {%q: {"kind": "value", "expr": "100"}, %q: {"kind": "value", "expr": "20"},
	    %q: {"kind": "flux", "expr": "0"}, %q: {"kind": "flux", "expr": "0"}}%s}`,
		physics, w, h, cond, hiSide, loSide, ins1, ins2, extra)
}

// Full-side terminals: the field is linear and the conductance per
// difference is kx H / W (terminals left and right) or ky W / H (bottom
// and top), exactly; the shape factor divides by sqrt(kx ky). Exact
// identities, to 1e-9.
func TestConductanceFullSides(t *testing.T) {
	for _, tc := range []struct {
		cond     string
		kx, ky   float64
		vertical bool
	}{
		{"50", 50, 50, false},
		{"50", 50, 50, true},
		{`{"x": 40, "y": 10}`, 40, 10, false},
		{`{"x": 40, "y": 10}`, 40, 10, true},
		{`{"x": 0.5, "y": 8}`, 0.5, 8, true},
	} {
		const w, h = 0.4, 0.1
		_, out := mustSolve(t, twoTerminal("heat", tc.cond, w, h, tc.vertical, ""), Options{NoCrossCheck: true})
		c := out.Result.Answers.Conductance
		if c == nil {
			t.Fatalf("%s vertical=%v: no conductance: %s", tc.cond, tc.vertical, out.Result.Answers.NoConductance)
		}
		want := tc.kx * h / w
		hi, lo := "left[0]", "right[0]"
		if tc.vertical {
			want, hi, lo = tc.ky*w/h, "bottom[0]", "top[0]"
		}
		sf := want / math.Sqrt(tc.kx*tc.ky)
		if math.Abs(c.PerDifference-want) > 1e-9*want || math.Abs(c.ShapeFactor-sf) > 1e-9*sf ||
			math.Abs(c.Flow-80*want) > 1e-9*80*want {
			t.Errorf("%s vertical=%v: per difference %.15g, shape factor %.15g, flow %.15g; want %.15g, %.15g, %.15g",
				tc.cond, tc.vertical, c.PerDifference, c.ShapeFactor, c.Flow, want, sf, 80*want)
		}
		if c.High.Value != 100 || c.Low.Value != 20 || strings.Join(c.High.Parts, ",") != hi || strings.Join(c.Low.Parts, ",") != lo {
			t.Errorf("%s vertical=%v: terminals %+v %+v", tc.cond, tc.vertical, c.High, c.Low)
		}
		heat := out.Result.Answers.Heat
		if heat == nil || heat.ThermalResistance == nil || math.Abs(*heat.ThermalResistance*want-1) > 1e-9 {
			t.Errorf("%s: thermal resistance %v, want 1/%g", tc.cond, heat, want)
		}
		net := out.Result.Answers.FlowNet
		if net.Reason != "" || math.Abs(net.Ratio-sf) > 1e-9*sf || math.Abs(float64(net.Channels)/net.Drops-sf) > 1e-9*sf {
			t.Errorf("%s: flow net %+v, want channels/drops = shape factor %g", tc.cond, net, sf)
		}
	}
}

// Where the conductance is not defined, one line says why.
func TestConductanceNotDefined(t *testing.T) {
	base := `{"schema": "edgewise/1", "physics": "heat", "width": 0.4, "height": 0.2, "conductivity": 50, %s
	  "edges": {"bottom": %s, "top": %s, "left": %s, "right": %s}}`
	v := func(e string) string { return `{"kind": "value", "expr": "` + e + `"}` }
	ins := `{"kind": "flux", "expr": "0"}`
	for _, tc := range []struct {
		name, text, want string
	}{
		{"source", fmt.Sprintf(base, `"source": 1000,`, v("100"), v("20"), ins, ins), "there is a source"},
		{"convection", fmt.Sprintf(base, "", v("100"), `{"kind": "convection", "h": 10, "ambient": "20"}`, ins, ins), "convection is present (the top edge)"},
		{"three values", fmt.Sprintf(base, "", v("100"), v("20"), ins, `{"kind": "value", "expr": "50"}`), "3 different values, more than two"},
		{"not uniform", fmt.Sprintf(base, "", v("100 + s"), v("20"), ins, ins), "the value on bottom[0] is not uniform"},
		{"heated", fmt.Sprintf(base, "", v("100"), v("20"), `{"kind": "flux", "expr": "5"}`, ins), "a flux enters through left[0]"},
		{"one value", fmt.Sprintf(base, "", v("100"), v("100"), ins, ins), "not two different prescribed values"},
		{"corner", fmt.Sprintf(base, "", v("100"), ins, v("20"), ins), "the two terminals meet at a corner"},
	} {
		_, out := mustSolve(t, tc.text, Options{NoCrossCheck: true})
		a := out.Result.Answers
		if a.Conductance != nil || !strings.Contains(a.NoConductance, tc.want) || strings.Contains(a.NoConductance, "\n") {
			t.Errorf("%s: conductance %+v, reason %q; want none because %q", tc.name, a.Conductance, a.NoConductance, tc.want)
		}
	}
}

// The flow function is constant along insulated edges, its change along
// each edge is the flow leaving through it, to 1e-9 of the total flow (its
// boundary values come from the series), and inside its gradient is k
// times the field's (the Cauchy-Riemann equations in the mapped
// coordinates: the cells are square), to the accuracy of the drawing.
func TestFlowFunction(t *testing.T) {
	text := `{"schema": "edgewise/1", "physics": "seepage", "width": 2, "height": 1, "conductivity": {"x": 4e-5, "y": 1e-5},
	  "edges": {"bottom": {"kind": "flux", "expr": "0"}, "top": {"kind": "value", "expr": "3 + 2*cos(pi*s/W)"},
	    "left": {"kind": "flux", "expr": "0"}, "right": {"kind": "convection", "h": 2e-5, "ambient": "1"}}}`
	_, out := mustSolve(t, text, Options{NoCrossCheck: true, Nx: 160, Ny: 80})
	net := out.Result.Answers.FlowNet
	if net.Reason != "" {
		t.Fatal(net.Reason)
	}
	nx, ny := out.Nx, out.Ny
	psi := net.psi
	at := func(i, j int) float64 { return psi[j*(nx+1)+i] }
	total := net.Flow
	// insulated bottom and left: psi stays 0, up to the balance (the
	// walk closes at (0, 0) with the sum of the inflows, round-off here)
	// and the flow the series' own error lets through an insulated edge
	// (k times its error estimate)
	tol := 1e-9*total + math.Abs(*out.Result.Balance) + math.Sqrt(4e-5*1e-5)*out.Result.Accuracy.Estimate
	t.Logf("total flow %g, balance %g, estimate %g", total, *out.Result.Balance, out.Result.Accuracy.Estimate)
	for i := 0; i <= nx; i++ {
		if math.Abs(at(i, 0)) > tol {
			t.Fatalf("psi on the insulated bottom at node %d = %g", i, at(i, 0))
		}
	}
	for j := 0; j <= ny; j++ {
		if math.Abs(at(0, j)) > tol {
			t.Fatalf("psi on the insulated left at node %d = %g", j, at(0, j))
		}
	}
	// the jump along right (bottom to top) and top (right to left) is the
	// flow leaving through each
	right := at(nx, ny) - at(nx, 0)
	top := at(0, ny) - at(nx, ny)
	for _, c := range []struct {
		name string
		got  float64
		side problem.Side
	}{{"right", right, problem.Right}, {"top", top, problem.Top}} {
		if want := -*out.Result.Edges[c.side].Flow; math.Abs(c.got-want) > 1e-9*total {
			t.Errorf("psi jumps %.15g along the %s edge, want the flow leaving %.15g", c.got, c.name, want)
		}
	}
	// Cauchy-Riemann in mapped coordinates: |grad' psi| = k |grad' u|
	k, a := math.Sqrt(4e-5*1e-5), 2.0
	hx, hy := out.W/float64(nx), out.H/float64(ny)
	worst := 0.0
	for j := ny / 4; j <= 3*ny/4; j++ {
		for i := nx / 4; i <= 3*nx/4; i++ {
			px := (at(i+1, j) - at(i-1, j)) / (2 * hx)
			py := (at(i, j+1) - at(i, j-1)) / (2 * hy) / a
			kk := j*(nx+1) + i
			gu := k * math.Hypot(out.Ux[kk], out.Uy[kk]/a)
			worst = max(worst, math.Abs(math.Hypot(px, py)-gu)/gu)
		}
	}
	// central differences and the trapezoid columns on a 160 x 80 grid:
	// second order, a few 1e-4 here; 1e-2 is the drawing's accuracy
	if worst > 1e-2 {
		t.Errorf("|grad psi| differs from k |grad u| by %.3g relatively", worst)
	}
	flow, equi := out.FlowLines()
	if len(flow) == 0 || len(equi) == 0 {
		t.Errorf("no flow lines (%d) or equipotentials (%d)", len(flow), len(equi))
	}
}

// With full-side terminals left and right the flow lines are the
// horizontal lines that split the height into equal channels.
func TestFlowLinesEqualChannels(t *testing.T) {
	_, out := mustSolve(t, twoTerminal("generic", "1", 2, 1, false, `, "answers": {"channels": 5}`), Options{NoCrossCheck: true})
	flow, _ := out.FlowLines()
	seen := map[int]bool{}
	for k := 0; k < len(flow); k += 2 {
		y := flow[k+1]
		// psi = Q y / H walking up the right edge: lines at y = H c / 5
		c := math.Round(y * 5)
		if math.Abs(y-c/5) > 1e-6 {
			t.Fatalf("flow line point at y = %g, not on a fifth of the height", y)
		}
		seen[int(c)] = true
	}
	if len(seen) != 4 {
		t.Errorf("flow lines at %v fifths, want 4 lines (5 channels)", seen)
	}
	if n := out.Result.Answers.FlowNet; n.Channels != 5 || math.Abs(n.Drops-10) > 1e-9 {
		t.Errorf("channels %d drops %g, want 5 and 10 (shape factor 1/2)", n.Channels, n.Drops)
	}
}

// Heat lost to a convection edge is its outflow; the Biot number is
// h L / k across the edge, read against the common-practice thresholds;
// the mean under the edge is the series' mean there.
func TestHeatConvectionAnswers(t *testing.T) {
	for _, tc := range []struct {
		h    float64
		want string
	}{{1, "close to insulated"}, {100, "neither"}, {1e4, "close to isothermal"}} {
		text := fmt.Sprintf(`{"schema": "edgewise/1", "physics": "heat", "width": 0.4, "height": 0.1, "conductivity": {"x": 40, "y": 10},
		  "edges": {"bottom": {"kind": "value", "expr": "100"}, "top": {"kind": "convection", "h": %g, "ambient": "20"},
		    "left": {"kind": "flux", "expr": "0"}, "right": {"kind": "flux", "expr": "0"}}}`, tc.h)
		_, out := mustSolve(t, text, Options{NoCrossCheck: true})
		heat := out.Result.Answers.Heat
		if len(heat.Convection) != 1 {
			t.Fatalf("h=%g: convection answers %+v", tc.h, heat.Convection)
		}
		c := heat.Convection[0]
		// a one-dimensional wall: q = (100 - 20)/(H/ky + 1/h) W/m², over W
		q := 80 / (0.1/10 + 1/tc.h) * 0.4
		if c.Part != "top[0]" || math.Abs(c.Loss-q) > 1e-9*q || math.Abs(c.Biot-tc.h*0.1/10) > 1e-12*c.Biot || !strings.Contains(c.Reading, tc.want) {
			t.Errorf("h=%g: %+v, want loss %g, Bi %g, %q", tc.h, c, q, tc.h*0.1/10, tc.want)
		}
		// the surface temperature: 20 + q/(h W)
		ts := 20 + q/(tc.h*0.4)
		var mean float64
		for _, s := range heat.Surfaces {
			if s.Part == "top[0]" {
				mean = s.Mean
			}
		}
		if math.Abs(mean-ts) > 1e-9*ts || math.Abs(out.Result.Edges[problem.Top].Mean-ts) > 1e-9*ts {
			t.Errorf("h=%g: mean surface temperature %.12g, want %.12g", tc.h, mean, ts)
		}
	}
}

// Capacitance per metre of a full-side gap is eps H / W; the charge on
// each electrode is its inflow and the surface charge density integrates
// to it; the breakdown check names the dielectric it assumes.
func TestElectrostaticAnswers(t *testing.T) {
	eps := 4.4 * 8.8541878128e-12
	extra := `, "answers": {"dielectric": "FR-4", "breakdown_strength": 2e7}`
	_, out := mustSolve(t, twoTerminal("electrostatic", fmt.Sprint(eps), 0.002, 0.01, false, extra), Options{NoCrossCheck: true})
	e := out.Result.Answers.Electrostatic
	want := eps * 0.01 / 0.002
	if e.Capacitance == nil || math.Abs(*e.Capacitance-want) > 1e-9*want {
		t.Errorf("capacitance %v, want %g", e.Capacitance, want)
	}
	for _, el := range e.Electrodes {
		var sum float64
		for _, s := range el.Sigma {
			sum += s * 0.01 / float64(len(el.Sigma))
		}
		if math.Abs(sum-*el.Charge) > 1e-9*math.Abs(*el.Charge) {
			t.Errorf("%s: surface charge sums to %g, charge %g", el.Part, sum, *el.Charge)
		}
	}
	// the field is uniform, 80 V over 2 mm
	if math.Abs(e.Peak.G-4e4) > 1e-6*4e4 || e.Dielectric != "FR-4" || math.Abs(e.Ratio-4e4/2e7) > 1e-9 {
		t.Errorf("peak %+v, dielectric %q ratio %g", e.Peak, e.Dielectric, e.Ratio)
	}
	if c := out.Result.Cautions[0]; !strings.Contains(c, "FR-4") || strings.Contains(c, "air") {
		t.Errorf("caution %q does not name FR-4 alone", c)
	}
}

// Electrodes meeting at a corner: the peak is taken at least the stated
// distance from the corner, and the caution says the ideal value there is
// not a design number.
func TestPeakAwayFromCorner(t *testing.T) {
	text := `{"schema": "edgewise/1", "physics": "electrostatic", "width": 0.01, "height": 0.01, "conductivity": 8.854e-12,
	  "edges": {"bottom": {"kind": "value", "expr": "1000"}, "left": {"kind": "value", "expr": "0"},
	    "top": {"kind": "flux", "expr": "0"}, "right": {"kind": "flux", "expr": "0"}}}`
	_, out := mustSolve(t, text, Options{NoCrossCheck: true})
	a := out.Result.Answers
	e := a.Electrostatic
	if len(a.Singular) != 1 || math.Hypot(e.Peak.X, e.Peak.Y) < a.Near || a.Near != 0.02*0.01 {
		t.Errorf("singular %v, near %g, peak at (%g, %g)", a.Singular, a.Near, e.Peak.X, e.Peak.Y)
	}
	// the wedge field 2 U/(pi r), largest at the nearest node at r >= near
	if r := math.Hypot(e.Peak.X, e.Peak.Y); math.Abs(e.Peak.G-2*1000/(math.Pi*r)) > 1e-3*e.Peak.G {
		t.Errorf("peak %g at r = %g, want the wedge's 2U/(pi r) = %g", e.Peak.G, r, 2*1000/(math.Pi*r))
	}
	joined := strings.Join(out.Result.Cautions, " ")
	if !strings.Contains(joined, "not a design number") || !strings.Contains(joined, "at least 0.0002 m from") {
		t.Errorf("cautions %q", joined)
	}
}

// Seepage: discharge in m³/s and m³/day per metre; the exit gradient of a
// full-side flow is the head drop over the length; the factor of safety
// divides the critical gradient from the unit weights by it.
func TestSeepageAnswers(t *testing.T) {
	extra := `, "answers": {"saturated_unit_weight": 19.62}`
	_, out := mustSolve(t, twoTerminal("seepage", "1e-5", 40, 10, false, extra), Options{NoCrossCheck: true})
	s := out.Result.Answers.Seepage
	q := 1e-5 * 80 * 10 / 40
	if math.Abs(s.Discharge-q) > 1e-9*q || math.Abs(s.PerDay-q*86400) > 1e-9*q*86400 || s.PerHead == nil || math.Abs(*s.PerHead*80-q) > 1e-9*q {
		t.Errorf("discharge %g, per day %g, per head %v; want %g", s.Discharge, s.PerDay, s.PerHead, q)
	}
	// (19.62 - 9.81)/9.81 = 1
	if math.Abs(s.Critical-1) > 1e-12 || !strings.Contains(s.Rule, "γsat") {
		t.Errorf("critical %g by %q", s.Critical, s.Rule)
	}
	if len(s.Exits) != 1 || s.Exits[0].Part != "right[0]" || math.Abs(s.Exits[0].G-2) > 1e-9 || math.Abs(s.Exits[0].FactorOfSafety-0.5) > 1e-9 {
		t.Errorf("exits %+v, want right[0] at gradient 2, factor of safety 0.5", s.Exits)
	}
	_, out = mustSolve(t, twoTerminal("seepage", "1e-5", 40, 10, false, `, "answers": {"specific_gravity": 2.65, "void_ratio": 0.65}`), Options{NoCrossCheck: true})
	if s := out.Result.Answers.Seepage; math.Abs(s.Critical-1) > 1e-12 || !strings.Contains(s.Rule, "Gs") {
		t.Errorf("critical %g by %q, want (2.65 - 1)/(1 + 0.65) = 1", s.Critical, s.Rule)
	}
}

// BenchmarkAnswers is the cost of the derived answers (edge means, flow
// function, peaks) after a solve, on a mixed problem with a flow net.
func BenchmarkAnswers(b *testing.B) {
	text := `{"schema": "edgewise/1", "physics": "electrostatic", "width": 2, "height": 1, "conductivity": {"x": 4, "y": 1},
	  "edges": {"bottom": {"kind": "flux", "expr": "0"}, "top": {"kind": "value", "expr": "3 + 2*cos(pi*s/W)"},
	    "left": {"kind": "flux", "expr": "0"}, "right": {"kind": "convection", "h": 2, "ambient": "1"}}}`
	p, err := project.Decode([]byte(text))
	if err != nil {
		b.Fatal(err)
	}
	pr, err := project.Compile(p)
	if err != nil {
		b.Fatal(err)
	}
	breaks, _ := series.FindBreaks(pr)
	f, err := series.SolveBreaks(pr, breaks, seriesOptions)
	if err != nil {
		b.Fatal(err)
	}
	var s Solver
	out, err := s.Solve(p, Options{NoCrossCheck: true})
	if err != nil {
		b.Fatal(err)
	}
	b.Run("answers", func(b *testing.B) {
		for b.Loop() {
			answers(p, pr, f, out, breaks)
		}
	})
	b.Run("solve", func(b *testing.B) {
		for b.Loop() {
			s.Solve(p, Options{NoCrossCheck: true})
		}
	})
}

// With a source there is no flow function: the lines are traced upstream
// from equal steps of the outflow, and the result says the net is not
// square. A uniform source in a square held at 0 all round: every line
// starts on the boundary and climbs towards the centre (the field rises
// along it), and there is one line per channel.
func TestTracedFlowLinesWithSource(t *testing.T) {
	text := `{"schema": "edgewise/1", "physics": "heat", "width": 1, "height": 1, "conductivity": 2, "source": 100,
	  "edges": {"bottom": {"kind": "value", "expr": "0"}, "top": {"kind": "value", "expr": "0"},
	    "left": {"kind": "value", "expr": "0"}, "right": {"kind": "value", "expr": "0"}}, "answers": {"channels": 12}}`
	_, out := mustSolve(t, text, Options{NoCrossCheck: true, Nx: 80, Ny: 80})
	net := out.Result.Answers.FlowNet
	if net.Reason != "" || !net.Traced || !strings.Contains(net.Note, "not square") || math.Abs(net.Flow-100) > 1e-6 {
		t.Fatalf("flow net %+v", net)
	}
	flow, equi := out.FlowLines()
	if equi != nil || len(flow) == 0 {
		t.Fatalf("%d flow segments, %d equipotential segments", len(flow), len(equi))
	}
	// split into lines: a segment that does not start where the last ended
	// begins a new line
	lines := 0
	var sx, sy float64
	end := func(k int) {
		u0, _, _ := out.field.At(sx, sy)
		u1, _, _ := out.field.At(flow[k-2], flow[k-1])
		if !(u1 > u0) || !(onBoundary(&problem.Problem{W: 1, H: 1}, sx, sy)) {
			t.Errorf("line from (%g, %g) to (%g, %g): u %g -> %g, want a start on the boundary and a climb", sx, sy, flow[k-2], flow[k-1], u0, u1)
		}
	}
	for k := 0; k < len(flow); k += 4 {
		if k == 0 || flow[k] != flow[k-2] || flow[k+1] != flow[k-1] {
			if k > 0 {
				end(k)
			}
			lines++
			sx, sy = flow[k], flow[k+1]
		}
	}
	end(len(flow))
	// 12 channels round a closed outflow boundary are bounded by 12 lines;
	// the walk's start, the corner (0, 0) where nothing flows, is the 12th
	if lines != 11 {
		t.Errorf("%d traced lines, want 11 (one per inner step of the outflow)", lines)
	}
}

// One edge lets the flow in and out (its net flow is zero): the net
// carries the span of the flow function, the flow that passes through,
// and its numbers stay finite (a net flow of round-off once asked for
// 10^20 drops).
func TestFlowNetInAndOutOneEdge(t *testing.T) {
	text := `{"schema":"edgewise/1","physics":"seepage","width":40,"height":10,"conductivity":{"x":4e-5,"y":1e-5},
	  "edges":{"bottom":{"kind":"flux","expr":"0"},"top":{"kind":"value","expr":"12 + 4*cos(pi*s/W)"},
	  "left":{"kind":"flux","expr":"0"},"right":{"kind":"flux","expr":"0"}}}`
	_, out := mustSolve(t, text, Options{NoCrossCheck: true})
	net := out.Result.Answers.FlowNet
	if net.Reason != "" || net.Drops > 100 || !(net.Flow > 0) {
		t.Fatalf("flow net %+v", net)
	}
	// the flow that passes is what enters through the top's left half
	// (the head there is above the head below it), from the series:
	// entering flux through the top = Ky du/dy; the net's span comes from
	// trapezoid sums on the grid, so it agrees to drawing accuracy
	xs, ws := edgeRule(0, 20)
	var q float64
	for i, x := range xs {
		_, _, uy := out.field.At(x, 10)
		q += ws[i] * 1e-5 * uy
	}
	if math.Abs(net.Flow-q) > 1e-3*q {
		t.Errorf("net flow %g, want the inflow through the top's left half %g", net.Flow, q)
	}
	if flow, equi := out.FlowLines(); len(flow) == 0 || len(equi) == 0 {
		t.Errorf("no lines")
	}
}

// A long thin slab needs more drops than a drawing can hold for the
// default channels: the net says to ask for fewer instead of drawing 800
// lines; one channel fits.
func TestFlowNetTooManyDrops(t *testing.T) {
	_, out := mustSolve(t, twoTerminal("heat", "1", 100, 1, false, ""), Options{NoCrossCheck: true})
	if n := out.Result.Answers.FlowNet; !strings.Contains(n.Reason, "8 channels would need 800 drops") {
		t.Errorf("flow net %+v", n)
	}
	_, out = mustSolve(t, twoTerminal("heat", "1", 100, 1, false, `, "answers": {"channels": 1}`), Options{NoCrossCheck: true})
	if n := out.Result.Answers.FlowNet; n.Reason != "" || math.Abs(n.Drops-100) > 1e-9 {
		t.Errorf("one channel: %+v", n)
	}
}

// Uplift under a symmetric impervious base between two pools: by symmetry
// the head along the base is the mean of the two heads plus a part odd
// about its centre, so the uplift force is exactly γw ((h1 + h2)/2 − z)
// times its length, and the pressure falls from the upstream end (the
// resultant acts upstream of the centre).
func TestUpliftSymmetricBase(t *testing.T) {
	_, out := mustSolve(t, `{"schema":"edgewise/1","physics":"seepage","width":40,"height":12,"conductivity":2e-5,
	 "edges":{"bottom":{"kind":"flux","expr":"0"},"left":{"kind":"flux","expr":"0"},"right":{"kind":"flux","expr":"0"},
	 "top":{"segments":[{"to":15,"kind":"value","expr":"9"},{"to":25,"kind":"flux","expr":"0"},{"kind":"value","expr":"2"}]}},
	 "answers":{"datum":12,"water_unit_weight":9.81}}`, Options{NoCrossCheck: true})
	s := out.Result.Answers.Seepage
	if s == nil || len(s.Uplift) != 1 {
		t.Fatalf("seepage answers %+v", s)
	}
	u := s.Uplift[0]
	want := 9.81 * ((9+2)/2.0 - 0) * 10
	if math.Abs(u.Force-want) > 1e-8*want || u.Elevation != 0 || u.Part != "top[1]" {
		t.Errorf("uplift %+v, force want %.12g", u, want)
	}
	if !(u.Line > 15 && u.Line < 20) {
		t.Errorf("line of action %g, want upstream of the centre 20", u.Line)
	}
	if len(u.Pressure) != upliftPoints || !(u.Pressure[0] > u.Pressure[upliftPoints-1]) {
		t.Errorf("pressure profile %v", u.Pressure)
	}
	// the discharge enters through the upstream pool and leaves through the
	// other, on one edge: it is the pool's flow, the conductance times 7 m
	if c := out.Result.Answers.Conductance; c == nil || math.Abs(s.Discharge-7*c.PerDifference) > 1e-9*s.Discharge || s.Discharge <= 0 {
		t.Errorf("discharge %g, want the conductance %+v times 7 m of head", s.Discharge, c)
	}
	// the flow net carries the same discharge: its channels-to-drops ratio
	// is the shape factor (where the flux grows like r^-1/2 beside the
	// floor, the flow function takes the parts' flows, not grid sums)
	if fn, c := out.Result.Answers.FlowNet, out.Result.Answers.Conductance; c == nil || math.Abs(fn.Flow-s.Discharge) > 1e-6*s.Discharge ||
		math.Abs(fn.Ratio-c.ShapeFactor) > 1e-6*c.ShapeFactor {
		t.Errorf("flow net carries %g with ratio %g; the discharge is %g and the shape factor %+v", fn.Flow, fn.Ratio, s.Discharge, c)
	}
	t.Logf("uplift %.10g kN/m (exact %.10g), line of action x = %.6g m", u.Force, want, u.Line)
}

// Where an electrode part meets the insulation the field is unbounded while
// every flow is finite: the breakdown caution says its peak is taken away
// from there and that the ideal value there is not a design number.
func TestCautionAtElectrodeEdge(t *testing.T) {
	_, out := mustSolve(t, `{"schema":"edgewise/1","physics":"electrostatic","width":0.03,"height":0.01,"conductivity":2.66e-11,
	 "edges":{"top":{"kind":"flux","expr":"0"},"left":{"kind":"flux","expr":"0"},"right":{"kind":"value","expr":"0"},
	 "bottom":{"segments":[{"to":0.004,"kind":"flux","expr":"0"},{"to":0.012,"kind":"value","expr":"1500"},{"kind":"flux","expr":"0"}]}}}`, Options{NoCrossCheck: true})
	for _, e := range out.Result.Edges {
		if !e.Finite {
			t.Fatalf("an infinite flow: %+v", out.Result.Edges)
		}
	}
	all := strings.Join(out.Result.Cautions, "\n")
	if !strings.Contains(all, "electrode's edge meets the insulation") || !strings.Contains(all, "not a design number") {
		t.Errorf("cautions %q", out.Result.Cautions)
	}
}
