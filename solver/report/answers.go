package report

import (
	"bytes"
	"math"
	"strconv"
	"strings"

	"edgewise/solver"
	"edgewise/solver/physics"
	"edgewise/solver/problem"
	"edgewise/solver/project"
)

// answerTables lays out the derived answers of a solve (solver.Answers)
// as report tables, in the trade's own terms and units.
func answerTables(p *project.Project, out *solver.Output, sh *shown) []Table {
	r := &out.Result
	a := r.Answers
	if a == nil {
		return nil
	}
	l := solver.Units(p.Physics)
	tm := physics.Get(p.Physics).Terms
	var list []Table
	add := addRow

	perLength := sh.perLength(tm)
	edges := Table{Caption: "Along each edge", Head: []string{"edge", with("mean "+l.Value, sh.unit("value")), with(tm.PerLength, perLength.Unit)}}
	for _, side := range problem.Sides {
		e := r.Edges[side]
		pl := "infinite"
		if e.PerLength != nil {
			pl = num(*e.PerLength * perLength.Scale)
		}
		add(&edges, side.String(), sh.num("value", e.Mean), pl)
	}
	list = append(list, edges)

	c := Table{Caption: "Between two terminals", Head: []string{"", "value"}}
	if k := a.Conductance; k != nil {
		cc, inverse := sh.conductance(tm)
		add(&c, "high terminal", sh.num("value", k.High.Value)+unitNote(sh.unit("value"))+" on "+strings.Join(k.High.Parts, ", "))
		add(&c, "low terminal", sh.num("value", k.Low.Value)+unitNote(sh.unit("value"))+" on "+strings.Join(k.Low.Parts, ", "))
		add(&c, with("flow between them", sh.unit("flow")), sh.diff("flow", k.Flow))
		add(&c, with(tm.Conductance+" per metre of depth", cc.Unit), num(k.PerDifference*cc.Scale))
		if tm.Resistance != "" {
			add(&c, with(tm.Resistance+" per metre of depth", inverse), num(1/(k.PerDifference*cc.Scale)))
		}
		add(&c, "shape factor Q/(k ΔU)", num(k.ShapeFactor))
	} else {
		add(&c, tm.Conductance, a.NoConductance)
	}
	list = append(list, c)

	n := a.FlowNet
	net := Table{Caption: "Flow net", Head: []string{"", "value"}}
	switch {
	case n.Reason != "":
		add(&net, "flow net", n.Reason)
	case n.Traced:
		add(&net, "flow channels", strconv.Itoa(n.Channels))
		add(&net, with("outflow per channel", sh.unit("flow")), sh.diff("flow", n.FlowStep))
		add(&net, "flow net", n.Note)
	default:
		add(&net, "flow channels", strconv.Itoa(n.Channels))
		add(&net, "potential drops (square cells)", num(n.Drops))
		add(&net, "channels / drops = Q/(k ΔU)", num(n.Ratio))
		add(&net, with("flow per channel", sh.unit("flow")), sh.diff("flow", n.FlowStep))
		add(&net, with(l.Value+" per drop", sh.unit("value")), sh.diff("value", n.PotentialStep))
	}
	list = append(list, net)

	switch {
	case a.Heat != nil:
		h := a.Heat
		t := Table{Caption: "Heat lost to the fluid on convection edges", Head: []string{"part", with("heat lost", sh.unit("flow")), "Biot number h L/k", with("L", sh.unit("length")), "reading"}}
		for _, cv := range h.Convection {
			add(&t, cv.Part, sh.diff("flow", cv.Loss), num(cv.Biot), sh.num("length", cv.L), cv.Reading)
		}
		s := Table{Caption: "Mean surface temperature under flux and convection parts", Head: []string{"part", "kind", with("mean temperature", sh.unit("value"))}}
		for _, x := range h.Surfaces {
			add(&s, x.Part, x.Kind, sh.num("value", x.Mean))
		}
		list = append(list, t, s)
	case a.Electrostatic != nil:
		e := a.Electrostatic
		t := Table{Caption: "Electrodes (value parts)", Head: []string{"part", with("potential", sh.unit("value")), "charge [C/m]", "surface charge density, least .. greatest [C/m²]"}}
		for _, el := range e.Electrodes {
			q := "infinite"
			if el.Charge != nil {
				q = num(*el.Charge)
			}
			lo, hi := el.Sigma[0], el.Sigma[0]
			for _, v := range el.Sigma {
				lo, hi = min(lo, v), max(hi, v)
			}
			add(&t, el.Part, sh.num("value", el.Potential), q, num(lo)+" .. "+num(hi))
		}
		b := Table{Caption: "Peak field strength against breakdown", Head: []string{"", "value"}}
		L := " " + sh.unit("length")
		add(&b, "peak field strength [kV/mm]", num(e.Peak.G/1e6)+" at ("+sh.num("length", e.Peak.X)+", "+sh.num("length", e.Peak.Y)+")"+L)
		if len(a.Singular) > 0 {
			add(&b, "taken at least", sh.num("length", a.Near)+L+" from where two prescribed potentials meet (unbounded there in the ideal model)")
		}
		add(&b, "dielectric assumed", e.Dielectric+" ("+e.Source+")")
		add(&b, "breakdown strength [kV/mm]", num(e.Breakdown/1e6))
		add(&b, "peak / breakdown", num(e.Ratio))
		list = append(list, t, b)
	case a.Seepage != nil:
		s := a.Seepage
		t := Table{Caption: "Discharge and exit gradient", Head: []string{"", "value"}}
		add(&t, "discharge per metre [m³/s]", num(s.Discharge))
		add(&t, "discharge per metre [m³/day]", num(s.PerDay))
		if s.PerHead != nil {
			add(&t, with(tm.Conductance, tm.ConductanceUnit), num(*s.PerHead))
		}
		if s.Recharge != 0 {
			add(&t, "recharge into the section per metre [m³/day]", num(s.Recharge*86400))
		}
		add(&t, "critical hydraulic gradient", num(s.Critical)+": "+s.Rule)
		for _, x := range s.Exits {
			add(&t, "exit gradient on "+x.Part, num(x.G)+" at ("+sh.num("length", x.X)+", "+sh.num("length", x.Y)+") "+sh.unit("length")+"; factor of safety against heave "+num(x.FactorOfSafety))
		}
		list = append(list, t)
		for _, u := range s.Uplift {
			ut := Table{Caption: "Uplift under the impervious base " + u.Part + ": pore pressure u = γw (h − z), γw = " + num(s.WaterWeight) +
				" kN/m³, heads and elevations from the datum y = " + num(s.Datum) + " m", Head: []string{"", "value"}}
			add(&ut, "uplift force per metre [kN/m]", num(u.Force))
			line := "none (the resultant is zero)"
			if !math.IsNaN(u.Line) {
				line = "x = " + num(u.Line) + " m"
			}
			add(&ut, "line of action", line)
			add(&ut, "mean head under the base [m]", num(u.MeanHead))
			add(&ut, "base elevation z [m]", num(u.Elevation))
			for i := 0; i < len(u.S); i += 10 {
				add(&ut, "pressure at x = "+num(u.S[i])+" m [kPa]", num(u.Pressure[i]))
			}
			list = append(list, ut)
		}
	}
	return list
}

// ProfileLine is a line profile asked for: from (X0, Y0) to (X1, Y1).
type ProfileLine struct{ X0, Y0, X1, Y1 float64 }

// profilePoints is the number of intervals of a profile in the CSV; the
// report shows every tenth.
const profilePoints = 100

// profileTable is the report's table of a line profile.
func profileTable(p *project.Project, out *solver.Output, line ProfileLine) Table {
	l, sh := solver.Units(p.Physics), newShown(p)
	L := func(v float64) string { return sh.num("length", v) }
	t := Table{Caption: "Line profile from (" + L(line.X0) + ", " + L(line.Y0) + ") to (" + L(line.X1) + ", " + L(line.Y1) + ") " + sh.unit("length"),
		Head: []string{with("distance", sh.unit("length")), with("x", sh.unit("length")), with("y", sh.unit("length")), with(l.Value, sh.unit("value")),
			with(l.Flux+" x", sh.unit("flux")), with(l.Flux+" y", sh.unit("flux"))}}
	for i, q := range out.Profile(line.X0, line.Y0, line.X1, line.Y1, profilePoints) {
		if i%10 == 0 {
			t.Rows = append(t.Rows, []string{L(q.D), L(q.X), L(q.Y), sh.num("value", q.Value), sh.diff("flux", q.Qx), sh.diff("flux", q.Qy)})
		}
	}
	return t
}

// profileCSV writes a line profile as CSV: distance, x, y, value,
// gradient and flux, with units in the header.
// edgesCSV writes every edge's parts, SI: the edge, the part's index, kind,
// where it starts and ends along the edge, the flow into the region
// through it (empty when infinite), whether it is finite, and the mean
// field value along it.
func edgesCSV(b *bytes.Buffer, p *project.Project, out *solver.Output) {
	l := solver.Units(p.Physics)
	head := []string{"edge", "part", "kind", with("from", l.Length), with("to", l.Length), with("flow", l.FlowUnit), "finite", with("mean "+l.Value, l.ValueUnit)}
	b.WriteString(strings.Join(head, ",") + "\r\n")
	f := func(v float64) string { return strconv.FormatFloat(v, 'g', -1, 64) }
	for _, side := range problem.Sides {
		for i, g := range out.Result.Edges[side].Segments {
			flow := ""
			if g.Finite && g.Flow != nil {
				flow = f(*g.Flow)
			}
			b.WriteString(strings.Join([]string{side.String(), strconv.Itoa(i), g.Kind, f(g.From), f(g.To), flow, strconv.FormatBool(g.Finite), f(g.Mean)}, ",") + "\r\n")
		}
	}
}

func profileCSV(b *bytes.Buffer, p *project.Project, out *solver.Output, line ProfileLine) {
	l := solver.Units(p.Physics)
	head := []string{with("distance", l.Length), with("x", l.Length), with("y", l.Length), with(l.Value, l.ValueUnit),
		with("grad_x", l.GradientUnit), with("grad_y", l.GradientUnit), with("flux_x", l.FluxUnit), with("flux_y", l.FluxUnit)}
	b.WriteString(strings.Join(head, ",") + "\r\n")
	f := func(v float64) string { return strconv.FormatFloat(v, 'g', 10, 64) }
	for _, q := range out.Profile(line.X0, line.Y0, line.X1, line.Y1, profilePoints) {
		b.WriteString(strings.Join([]string{f(q.D), f(q.X), f(q.Y), f(q.Value), f(q.Gx), f(q.Gy), f(q.Qx), f(q.Qy)}, ",") + "\r\n")
	}
}
