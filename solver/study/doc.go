// Package study runs studies of an edgewise project (schema
// "edgewise-study/1"): a sweep over every combination of parameter values,
// or a seek for the value of one parameter that makes an output meet a
// target.
//
//	{"schema": "edgewise-study/1",
//	 "vary":   [{"name": "h_top", "from": 5, "to": 100, "steps": 20, "scale": "linear"},
//	            {"name": "k_plate", "values": [120, 167, 200]}],
//	 "report": ["max.value", "edges.top.flow", "probes.T1.value"]}
//
//	{"schema": "edgewise-study/1",
//	 "seek":   {"name": "h_top", "from": 5, "to": 500, "target": {"max.value": 85}, "tolerance": 0.001},
//	 "report": ["edges.top.flow"]}
//
// An axis of a vary is either from, to and steps (the number of values,
// both ends included, at least 2) on a linear scale (equal differences, the
// default) or a log scale (equal ratios; both ends above zero), or a list of
// values. Rows run through every combination like nested loops: the first
// axis outermost, the last one changing fastest (Study.Values). Row i of a
// study is always the same case, so a study can be split into shards (the
// rows whose index modulo N is I) that run anywhere and merge back by the
// row index.
//
// Report paths name numbers of the result (Lookup, Paths): max.value,
// max.x, max.y, min.*, mean, balance, source_total, accuracy.terms,
// accuracy.estimate, accuracy.crosscheck, edges.<side>.flow|mean|per_length,
// probes.<label>.value, probes.<label>.gradient.x|y,
// probes.<label>.flux.x|y, conductance.flow|per_difference|shape_factor,
// answers.flow_net.ratio, answers.heat.thermal_conductance|thermal_resistance,
// answers.electrostatic.capacitance|peak.value and
// answers.seepage.discharge|per_day|per_head (a result without such an
// answer gives an empty field). A new output is one line in the outputs
// table.
//
// Each row is the project with the varied parameters set (Project.With),
// solved as a single solve would solve it, so a row's numbers are the
// single solve's to the last digit. The finite-difference cross-check,
// which changes no other number, runs only when accuracy.crosscheck is
// reported.
//
// For a page or any other caller with a single thread, Study.Run solves
// one row and Study.Find runs a seek with a progress callback that can
// stop it; Study.Sweep runs rows on several goroutines and hands them back
// in row order.
package study
