package solver

import (
	"edgewise/solver/jsonlite"
	"edgewise/solver/problem"
	"edgewise/solver/project"
)

// ResultSchema names the result format.
const ResultSchema = "edgewise-result/1"

// Result is what a solve reports (JSON schema "edgewise-result/1").
// Flows are per unit depth and positive into the region.
type Result struct {
	Schema      string        `json:"schema"`
	Probes      []ProbeResult `json:"probes"`
	Edges       EdgeFlows     `json:"edges"`
	SourceTotal float64       `json:"source_total"`
	// Balance is the sum of the edge inflows and the source total (zero
	// up to the accuracy); null when an edge flow is infinite.
	Balance  *float64 `json:"balance"`
	Mean     float64  `json:"mean"`
	Min      Extreme  `json:"min"`
	Max      Extreme  `json:"max"`
	Accuracy Accuracy `json:"accuracy"`
	// Warnings are the engine's warnings: a code, the edges concerned
	// and a text (JSON {"code": .., "edges": ["bottom", ..], "text": ..}).
	Warnings []problem.Warning `json:"warnings"`
	Cautions []string          `json:"cautions"`
	Grid     project.GridSize  `json:"grid"`
	// Colour is how every picture of this result is coloured (colour.Choose
	// over Min.Value .. Max.Value).
	Colour ColourScale `json:"colour"`
	// Answers are the derived quantities each trade reports (answers.go);
	// written as "conductance" (or "conductance_none") and "answers".
	Answers *Answers `json:"-"`
}

// ColourScale names a colour map (colour.Map.Name) and the values its two
// ends stand for: {"map": "fen", "from": 20, "to": 90}.
type ColourScale struct {
	Map  string  `json:"map"`
	From float64 `json:"from"`
	To   float64 `json:"to"`
}

// ProbeResult is the field at one probe.
type ProbeResult struct {
	Label    string     `json:"label"`
	X        float64    `json:"x"`
	Y        float64    `json:"y"`
	Value    float64    `json:"value"`
	Gradient [2]float64 `json:"gradient"`
	Flux     [2]float64 `json:"flux"`
	// Unbounded says, when the gradient has no value at the probe (null),
	// why: the probe sits where the boundary data jump or change kind.
	Unbounded string `json:"gradient_none,omitempty"`
}

// EdgeFlows holds the flow through each edge, indexed by problem.Side; the
// JSON object is keyed by the side names.
type EdgeFlows [4]EdgeFlow

// EdgeFlow is the flow into the region through one edge, per unit depth;
// Flow is nil (null) when it is infinite.
type EdgeFlow struct {
	Flow   *float64 `json:"flow"`
	Finite bool     `json:"finite"`
	// Mean is the average field value along the edge; PerLength the flow
	// per unit length of edge (nil when infinite).
	Mean      float64  `json:"mean"`
	PerLength *float64 `json:"per_length"`
	// Segments lists the edge's parts in order (one for a one-condition
	// edge), each with its own flow and mean.
	Segments []SegmentFlow `json:"segments"`
}

// SegmentFlow is one part of an edge: where it runs along the edge, its
// kind, the flow into the region through it (nil when infinite) and the
// average field value along it.
type SegmentFlow struct {
	From   float64  `json:"from"`
	To     float64  `json:"to"`
	Kind   string   `json:"kind"`
	Flow   *float64 `json:"flow"`
	Finite bool     `json:"finite"`
	Mean   float64  `json:"mean"`
}

// Extreme is a smallest or largest value and where it is.
type Extreme struct {
	Value float64 `json:"value"`
	X     float64 `json:"x"`
	Y     float64 `json:"y"`
}

// Accuracy says how far the numbers can be trusted.
type Accuracy struct {
	Terms    int     `json:"terms"`
	Estimate float64 `json:"estimate"` // estimated largest error of the series, away from singular corners
	// Crosscheck is the largest difference between the series and the
	// independent solution of the cross-check (see crossCheck) at the
	// cross-check nodes away from singular corners; null when skipped.
	Crosscheck *float64 `json:"crosscheck"`
	// CrosscheckResolution is how far the independent solution resolves
	// the problem itself: the largest difference between its two
	// resolutions (spectral) or between its two grids (finite differences); null
	// when skipped.
	CrosscheckResolution *float64 `json:"crosscheck_resolution"`
	// CrosscheckVerdict says what the check shows: VerdictConfirms,
	// VerdictLimited or VerdictDiffers; empty when skipped.
	CrosscheckVerdict string `json:"crosscheck_verdict,omitempty"`
	// CrosscheckLimit says, when the verdict is VerdictLimited, what
	// keeps the independent solution from resolving the problem better.
	CrosscheckLimit string `json:"crosscheck_limit,omitempty"`
	// CrosscheckMethod names the independent solution: CheckSpectral or
	// CheckFiniteDifferences; CrosscheckGrid describes it and its grids.
	CrosscheckMethod string `json:"crosscheck_method,omitempty"`
	CrosscheckGrid   string `json:"crosscheck_grid,omitempty"`
	CrosscheckReason string `json:"crosscheck_skipped,omitempty"`
	// Statement is the one accuracy statement: what the numbers are good
	// to, which figure to rely on, and what the cross-check shows, with
	// the markers {estimate}, {difference} and {resolution} where the
	// numbers go, for each reader to write in its own units.
	Statement string `json:"statement"`
	// Converged is false when the result failed the maximum-principle
	// check or the series stopped far from its tolerance (see
	// checkConverged); a warning with code not-converged says why.
	Converged bool `json:"converged"`
}

// JSON returns the result text (schema "edgewise-result/1"). Numbers that
// are not finite are written as null.
func (r *Result) JSON() []byte {
	var w jsonlite.Writer
	w.Open('{').Key("schema").Str(ResultSchema)
	w.Key("probes").Open('[')
	for _, q := range r.Probes {
		w.Open('{').Key("label").Str(q.Label).Key("x").Num(q.X).Key("y").Num(q.Y).Key("value").Num(q.Value)
		w.Key("gradient").Open('[').Num(q.Gradient[0]).Num(q.Gradient[1]).Close(']')
		w.Key("flux").Open('[').Num(q.Flux[0]).Num(q.Flux[1]).Close(']')
		if q.Unbounded != "" {
			w.Key("gradient_none").Str(q.Unbounded)
		}
		w.Close('}')
	}
	w.Close(']')
	w.Key("edges").Open('{')
	for _, side := range problem.Sides {
		f := r.Edges[side]
		w.Key(side.String()).Open('{').Key("flow")
		numOrNull(&w, f.Flow)
		w.Key("finite").Bool(f.Finite).Key("mean").Num(f.Mean).Key("per_length")
		numOrNull(&w, f.PerLength)
		w.Key("segments").Open('[')
		for _, g := range f.Segments {
			w.Open('{').Key("from").Num(g.From).Key("to").Num(g.To).Key("kind").Str(g.Kind).Key("flow")
			numOrNull(&w, g.Flow)
			w.Key("finite").Bool(g.Finite).Key("mean").Num(g.Mean).Close('}')
		}
		w.Close(']')
		w.Close('}')
	}
	w.Close('}')
	w.Key("source_total").Num(r.SourceTotal).Key("balance")
	numOrNull(&w, r.Balance)
	w.Key("mean").Num(r.Mean)
	extreme := func(k string, e Extreme) {
		w.Key(k).Open('{').Key("value").Num(e.Value).Key("x").Num(e.X).Key("y").Num(e.Y).Close('}')
	}
	extreme("min", r.Min)
	extreme("max", r.Max)
	a := r.Accuracy
	w.Key("accuracy").Open('{').Key("terms").Int(a.Terms).Key("estimate").Num(a.Estimate).Key("crosscheck")
	numOrNull(&w, a.Crosscheck)
	w.Key("crosscheck_resolution")
	numOrNull(&w, a.CrosscheckResolution)
	if a.CrosscheckVerdict != "" {
		w.Key("crosscheck_verdict").Str(a.CrosscheckVerdict)
	}
	if a.CrosscheckLimit != "" {
		w.Key("crosscheck_limit").Str(a.CrosscheckLimit)
	}
	if a.CrosscheckMethod != "" {
		w.Key("crosscheck_method").Str(a.CrosscheckMethod)
	}
	if a.CrosscheckGrid != "" {
		w.Key("crosscheck_grid").Str(a.CrosscheckGrid)
	}
	if a.CrosscheckReason != "" {
		w.Key("crosscheck_skipped").Str(a.CrosscheckReason)
	}
	w.Key("statement").Str(a.Statement)
	w.Key("converged").Bool(a.Converged)
	w.Close('}')
	strs := func(k string, list []string) {
		w.Key(k).Open('[')
		for _, s := range list {
			w.Str(s)
		}
		w.Close(']')
	}
	w.Key("warnings").Open('[')
	for _, x := range r.Warnings {
		x.WriteJSON(&w)
	}
	w.Close(']')
	strs("cautions", r.Cautions)
	w.Key("grid").Open('{').Key("nx").Int(r.Grid.Nx).Key("ny").Int(r.Grid.Ny).Close('}')
	c := r.Colour
	w.Key("colour").Open('{').Key("map").Str(c.Map).Key("from").Num(c.From).Key("to").Num(c.To).Close('}')
	if r.Answers != nil {
		r.Answers.writeJSON(&w)
	}
	return w.Close('}').Bytes()
}

func numOrNull(w *jsonlite.Writer, v *float64) {
	if v == nil {
		w.Null()
		return
	}
	w.Num(*v)
}
