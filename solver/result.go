package solver

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
	Warnings []string `json:"warnings"`
	Cautions []string `json:"cautions"`
	Grid     GridSize `json:"grid"`
	// Colour is how every picture of this result is coloured (colour.Choose
	// over Min.Value .. Max.Value).
	Colour ColourScale `json:"colour"`
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
}

// EdgeFlows holds the flow through each edge.
type EdgeFlows struct {
	Bottom EdgeFlow `json:"bottom"`
	Top    EdgeFlow `json:"top"`
	Left   EdgeFlow `json:"left"`
	Right  EdgeFlow `json:"right"`
}

// EdgeFlow is the flow into the region through one edge, per unit depth;
// Flow is nil (null) when it is infinite.
type EdgeFlow struct {
	Flow   *float64 `json:"flow"`
	Finite bool     `json:"finite"`
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
	// finite-difference cross-check (Richardson-extrapolated) at the
	// cross-check nodes away from singular corners; null when skipped.
	Crosscheck       *float64 `json:"crosscheck"`
	CrosscheckGrid   string   `json:"crosscheck_grid,omitempty"`
	CrosscheckReason string   `json:"crosscheck_skipped,omitempty"`
}
