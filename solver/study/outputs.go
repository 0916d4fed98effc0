package study

import (
	"fmt"
	"sort"
	"strings"

	"edgewise/solver"
	"edgewise/solver/problem"
	"edgewise/solver/project"
)

// An output reads one number from a result; ok is false when the result
// has no number there (an infinite edge flow, a skipped cross-check).
type output func(r *solver.Result) (v float64, ok bool)

// outputs is the table of report paths. A path may hold one placeholder:
// <side> (bottom, right, top, left) or <label> (a probe's label); get
// receives the side's or the probe's index. A new output of the result is
// one line here.
var outputs = []struct {
	path string
	get  func(r *solver.Result, i int) (float64, bool)
}{
	{"max.value", func(r *solver.Result, _ int) (float64, bool) { return r.Max.Value, true }},
	{"max.x", func(r *solver.Result, _ int) (float64, bool) { return r.Max.X, true }},
	{"max.y", func(r *solver.Result, _ int) (float64, bool) { return r.Max.Y, true }},
	{"min.value", func(r *solver.Result, _ int) (float64, bool) { return r.Min.Value, true }},
	{"min.x", func(r *solver.Result, _ int) (float64, bool) { return r.Min.X, true }},
	{"min.y", func(r *solver.Result, _ int) (float64, bool) { return r.Min.Y, true }},
	{"mean", func(r *solver.Result, _ int) (float64, bool) { return r.Mean, true }},
	{"balance", func(r *solver.Result, _ int) (float64, bool) { return deref(r.Balance) }},
	{"source_total", func(r *solver.Result, _ int) (float64, bool) { return r.SourceTotal, true }},
	{"accuracy.terms", func(r *solver.Result, _ int) (float64, bool) { return float64(r.Accuracy.Terms), true }},
	{"accuracy.estimate", func(r *solver.Result, _ int) (float64, bool) { return r.Accuracy.Estimate, true }},
	{"accuracy.crosscheck", func(r *solver.Result, _ int) (float64, bool) { return deref(r.Accuracy.Crosscheck) }},
	{"edges.<side>.flow", func(r *solver.Result, i int) (float64, bool) { return deref(r.Edges[i].Flow) }},
	{"edges.<side>.mean", func(r *solver.Result, i int) (float64, bool) { return r.Edges[i].Mean, true }},
	{"edges.<side>.per_length", func(r *solver.Result, i int) (float64, bool) { return deref(r.Edges[i].PerLength) }},
	{"conductance.flow", conductance(func(c *solver.Conductance) float64 { return c.Flow })},
	{"conductance.per_difference", conductance(func(c *solver.Conductance) float64 { return c.PerDifference })},
	{"conductance.shape_factor", conductance(func(c *solver.Conductance) float64 { return c.ShapeFactor })},
	{"answers.flow_net.ratio", func(r *solver.Result, _ int) (float64, bool) {
		if r.Answers == nil || r.Answers.FlowNet.Reason != "" || r.Answers.FlowNet.Traced {
			return 0, false
		}
		return r.Answers.FlowNet.Ratio, true
	}},
	{"answers.heat.thermal_conductance", heat(func(h *solver.HeatAnswers) *float64 { return h.ThermalConductance })},
	{"answers.heat.thermal_resistance", heat(func(h *solver.HeatAnswers) *float64 { return h.ThermalResistance })},
	{"answers.electrostatic.capacitance", func(r *solver.Result, _ int) (float64, bool) {
		if r.Answers == nil || r.Answers.Electrostatic == nil {
			return 0, false
		}
		return deref(r.Answers.Electrostatic.Capacitance)
	}},
	{"answers.electrostatic.peak.value", func(r *solver.Result, _ int) (float64, bool) {
		if r.Answers == nil || r.Answers.Electrostatic == nil {
			return 0, false
		}
		return r.Answers.Electrostatic.Peak.G, true
	}},
	{"answers.seepage.discharge", seepage(func(s *solver.SeepageAnswers) (float64, bool) { return s.Discharge, true })},
	{"answers.seepage.per_day", seepage(func(s *solver.SeepageAnswers) (float64, bool) { return s.PerDay, true })},
	{"answers.seepage.per_head", seepage(func(s *solver.SeepageAnswers) (float64, bool) { return deref(s.PerHead) })},
	{"probes.<label>.value", func(r *solver.Result, i int) (float64, bool) { return r.Probes[i].Value, true }},
	{"probes.<label>.gradient.x", func(r *solver.Result, i int) (float64, bool) { return r.Probes[i].Gradient[0], true }},
	{"probes.<label>.gradient.y", func(r *solver.Result, i int) (float64, bool) { return r.Probes[i].Gradient[1], true }},
	{"probes.<label>.flux.x", func(r *solver.Result, i int) (float64, bool) { return r.Probes[i].Flux[0], true }},
	{"probes.<label>.flux.y", func(r *solver.Result, i int) (float64, bool) { return r.Probes[i].Flux[1], true }},
}

// crossCheckPaths are the outputs that need the finite-difference
// cross-check; a study that reports none of them skips it (it changes no
// other number).
var crossCheckPaths = []string{"accuracy.crosscheck"}

// conductance, heat and seepage read a number of the result's derived
// answers; a result without them (no two terminals, another physics) has
// no number there.
func conductance(get func(*solver.Conductance) float64) func(*solver.Result, int) (float64, bool) {
	return func(r *solver.Result, _ int) (float64, bool) {
		if r.Answers == nil || r.Answers.Conductance == nil {
			return 0, false
		}
		return get(r.Answers.Conductance), true
	}
}

func heat(get func(*solver.HeatAnswers) *float64) func(*solver.Result, int) (float64, bool) {
	return func(r *solver.Result, _ int) (float64, bool) {
		if r.Answers == nil || r.Answers.Heat == nil {
			return 0, false
		}
		return deref(get(r.Answers.Heat))
	}
}

func seepage(get func(*solver.SeepageAnswers) (float64, bool)) func(*solver.Result, int) (float64, bool) {
	return func(r *solver.Result, _ int) (float64, bool) {
		if r.Answers == nil || r.Answers.Seepage == nil {
			return 0, false
		}
		return get(r.Answers.Seepage)
	}
}

func deref(v *float64) (float64, bool) {
	if v == nil {
		return 0, false
	}
	return *v, true
}

// placeholders resolve the middle part of a path to an index.
var placeholders = map[string]func(p *project.Project, name string) (int, bool){
	"<side>": func(_ *project.Project, name string) (int, bool) {
		s, ok := problem.ParseSide(name)
		return int(s), ok
	},
	"<label>": func(p *project.Project, name string) (int, bool) {
		for i, q := range p.Probes {
			if q.Label == name {
				return i, true
			}
		}
		return 0, false
	},
}

// Lookup returns the output at a report path of a result of project p
// (probe labels are p's). The error says what paths there are.
func Lookup(path string, p *project.Project) (output, error) {
	for _, o := range outputs {
		pre, post, wild := cutPlaceholder(o.path)
		if wild == "" {
			if path == o.path {
				get := o.get
				return func(r *solver.Result) (float64, bool) { return get(r, 0) }, nil
			}
			continue
		}
		if len(path) <= len(pre)+len(post) || !strings.HasPrefix(path, pre) || !strings.HasSuffix(path, post) {
			continue
		}
		name := path[len(pre) : len(path)-len(post)]
		i, ok := placeholders[wild](p, name)
		if !ok {
			what := "an edge (bottom, right, top or left)"
			if wild == "<label>" {
				what = "a probe label (the project has " + probeLabels(p) + ")"
			}
			return nil, fmt.Errorf("unknown output %q: %q is not %s", project.Clip(path), project.Clip(name), what)
		}
		get := o.get
		return func(r *solver.Result) (float64, bool) {
			if wild == "<label>" && i >= len(r.Probes) {
				return 0, false
			}
			return get(r, i)
		}, nil
	}
	return nil, fmt.Errorf("unknown output %q (use one of %s)", project.Clip(path), Paths())
}

// Paths lists the report paths, placeholders included, in table order.
func Paths() string {
	names := make([]string, len(outputs))
	for i, o := range outputs {
		names[i] = o.path
	}
	return strings.Join(names, ", ")
}

func cutPlaceholder(path string) (pre, post, wild string) {
	for w := range placeholders {
		if i := strings.Index(path, w); i >= 0 {
			return path[:i], path[i+len(w):], w
		}
	}
	return path, "", ""
}

func probeLabels(p *project.Project) string {
	if len(p.Probes) == 0 {
		return "no probes"
	}
	labels := make([]string, len(p.Probes))
	for i, q := range p.Probes {
		labels[i] = q.Label
	}
	sort.Strings(labels)
	return strings.Join(labels, ", ")
}
