package solver

import "edgewise/solver/jsonlite"

// writeJSON writes the answers as the result's "conductance" (or
// "conductance_none", the one-line reason) and "answers" keys:
//
//	"conductance": {"high": {"value": .., "parts": ["bottom[0]"]}, "low": {..},
//	                "flow": Q, "per_difference": .., "shape_factor": ..},
//	"answers": {"near": d, "singular": [[x, y], ..],
//	            "flow_net": {"channels": .., "drops": .., "ratio": .., "flow": ..,
//	                         "difference": .., "flow_step": .., "potential_step": ..} | {"reason": ".."},
//	            "heat": {..} | "electrostatic": {..} | "seepage": {..}}
func (a *Answers) writeJSON(w *jsonlite.Writer) {
	if c := a.Conductance; c != nil {
		term := func(k string, t Terminal) {
			w.Key(k).Open('{').Key("value").Num(t.Value).Key("parts").Open('[')
			for _, p := range t.Parts {
				w.Str(p)
			}
			w.Close(']').Close('}')
		}
		w.Key("conductance").Open('{')
		term("high", c.High)
		term("low", c.Low)
		w.Key("flow").Num(c.Flow).Key("per_difference").Num(c.PerDifference).Key("shape_factor").Num(c.ShapeFactor)
		w.Close('}')
	} else {
		w.Key("conductance").Null().Key("conductance_none").Str(a.NoConductance)
	}
	w.Key("answers").Open('{').Key("near").Num(a.Near).Key("singular").Open('[')
	for _, p := range a.Singular {
		w.Open('[').Num(p[0]).Num(p[1]).Close(']')
	}
	w.Close(']')
	n := a.FlowNet
	w.Key("flow_net").Open('{')
	switch {
	case n.Reason != "":
		w.Key("reason").Str(n.Reason)
	case n.Traced:
		w.Key("channels").Int(n.Channels).Key("square").Bool(false).Key("note").Str(n.Note).
			Key("flow").Num(n.Flow).Key("flow_step").Num(n.FlowStep)
	default:
		w.Key("square").Bool(true)
		w.Key("channels").Int(n.Channels).Key("drops").Num(n.Drops).Key("ratio").Num(n.Ratio).
			Key("flow").Num(n.Flow).Key("difference").Num(n.Difference).
			Key("flow_step").Num(n.FlowStep).Key("potential_step").Num(n.PotentialStep)
	}
	w.Close('}')
	opt := func(k string, v *float64) {
		w.Key(k)
		numOrNull(w, v)
	}
	if h := a.Heat; h != nil {
		w.Key("heat").Open('{')
		opt("thermal_conductance", h.ThermalConductance)
		opt("thermal_resistance", h.ThermalResistance)
		w.Key("convection").Open('[')
		for _, c := range h.Convection {
			w.Open('{').Key("part").Str(c.Part).Key("loss").Num(c.Loss).Key("biot").Num(c.Biot).
				Key("length").Num(c.L).Key("reading").Str(c.Reading).Close('}')
		}
		w.Close(']').Key("surfaces").Open('[')
		for _, s := range h.Surfaces {
			w.Open('{').Key("part").Str(s.Part).Key("kind").Str(s.Kind).Key("mean").Num(s.Mean).Close('}')
		}
		w.Close(']').Close('}')
	}
	if e := a.Electrostatic; e != nil {
		w.Key("electrostatic").Open('{')
		opt("capacitance", e.Capacitance)
		w.Key("electrodes").Open('[')
		for _, el := range e.Electrodes {
			w.Open('{').Key("part").Str(el.Part).Key("potential").Num(el.Potential)
			opt("charge", el.Charge)
			nums := func(k string, list []float64) {
				w.Key(k).Open('[')
				for _, v := range list {
					w.Num(v)
				}
				w.Close(']')
			}
			nums("s", el.S)
			nums("sigma", el.Sigma)
			w.Close('}')
		}
		w.Close(']')
		w.Key("peak").Open('{').Key("value").Num(e.Peak.G).Key("x").Num(e.Peak.X).Key("y").Num(e.Peak.Y).Close('}')
		w.Key("dielectric").Str(e.Dielectric).Key("breakdown").Num(e.Breakdown).Key("breakdown_source").Str(e.Source).
			Key("ratio").Num(e.Ratio)
		w.Close('}')
	}
	if s := a.Seepage; s != nil {
		w.Key("seepage").Open('{').Key("discharge").Num(s.Discharge).Key("per_day").Num(s.PerDay)
		opt("per_head", s.PerHead)
		w.Key("critical_gradient").Num(s.Critical).Key("critical_rule").Str(s.Rule).Key("recharge").Num(s.Recharge)
		w.Key("exits").Open('[')
		for _, x := range s.Exits {
			w.Open('{').Key("part").Str(x.Part).Key("gradient").Num(x.G).Key("x").Num(x.X).Key("y").Num(x.Y).
				Key("factor_of_safety").Num(x.FactorOfSafety).Close('}')
		}
		w.Close(']')
		w.Key("water_unit_weight").Num(s.WaterWeight).Key("datum").Num(s.Datum).Key("uplift").Open('[')
		for _, u := range s.Uplift {
			w.Open('{').Key("part").Str(u.Part).Key("from").Num(u.From).Key("to").Num(u.To).Key("elevation").Num(u.Elevation).
				Key("mean_head").Num(u.MeanHead).Key("force").Num(u.Force).Key("line").Num(u.Line)
			w.Key("s").Open('[')
			for _, v := range u.S {
				w.Num(v)
			}
			w.Close(']').Key("pressure").Open('[')
			for _, v := range u.Pressure {
				w.Num(v)
			}
			w.Close(']').Close('}')
		}
		w.Close(']').Close('}')
	}
	w.Close('}')
}
