package problem

import (
	"fmt"

	"edgewise/solver/jsonlite"
)

// Code names a kind of warning. The page and scripts branch on the code,
// never on the English text, which may change.
type Code string

// The warning codes the engine emits. Add a code here, next to its
// meaning, before emitting it anywhere.
const (
	// CornerJump: two prescribed values disagree at a corner; the flows
	// through both edges that meet there are infinite (gradient ~ 1/r).
	CornerJump Code = "corner-jump"
	// StepJump: a prescribed value jumps inside an edge; the flow through
	// that edge is infinite (gradient ~ 1/r).
	StepJump Code = "step-jump"
	// TermLimit: a series stopped at its largest number of terms before
	// reaching the requested accuracy.
	TermLimit Code = "term-limit"
	// MeanFixed: every edge holds a flux (no value edge, no exchange by
	// convection), so the field is fixed only up to a constant: its area
	// mean is set to zero and only differences of value are meaningful.
	MeanFixed Code = "mean-fixed"
	// WeakExchange: the convection edges exchange so weakly (Biot
	// numbers below 1e-4, no value edge) that the field is nearly uniform; its level is
	// fixed by the balance of the exchange, as in the limit h -> 0.
	WeakExchange Code = "weak-exchange"
	// NotConverged: the result failed a check (an extreme outside the
	// range the maximum principle allows) or the series could not reach a
	// useful accuracy; Accuracy.Converged is false and the numbers are not
	// to be relied on.
	NotConverged Code = "not-converged"
)

// Warning is one structured warning: a code, the edges it concerns (for
// example the edges whose flow it makes infinite) and a one-line text for
// people.
type Warning struct {
	Code  Code
	Edges []Side // the edges concerned, in canonical order; may be empty
	Text  string
}

// EdgeNames returns the names of the edges concerned in canonical order
// (bottom, right, top, left), each once; never nil.
func (w Warning) EdgeNames() []string {
	names := []string{}
	for _, s := range Sides {
		for _, e := range w.Edges {
			if e == s {
				names = append(names, s.String())
				break
			}
		}
	}
	return names
}

// WriteJSON writes the warning as {"code": .., "edges": [..], "text": ..},
// the edges by name in canonical order ([] when none).
func (w Warning) WriteJSON(jw *jsonlite.Writer) {
	jw.Open('{').Key("code").Str(string(w.Code)).Key("edges").Open('[')
	for _, n := range w.EdgeNames() {
		jw.Str(n)
	}
	jw.Close(']').Key("text").Str(w.Text).Close('}')
}

// MarshalJSON encodes the warning as WriteJSON does.
func (w Warning) MarshalJSON() ([]byte, error) {
	var jw jsonlite.Writer
	w.WriteJSON(&jw)
	return jw.Bytes(), nil
}

// UnmarshalJSON reads what MarshalJSON writes.
func (w *Warning) UnmarshalJSON(data []byte) error {
	v, err := jsonlite.Parse(data)
	if err != nil {
		return err
	}
	m, ok := v.(map[string]any)
	if !ok {
		return fmt.Errorf("problem: a warning is an object, got %s", data)
	}
	code, _ := m["code"].(string)
	text, _ := m["text"].(string)
	list, _ := m["edges"].([]any)
	*w = Warning{Code: Code(code), Text: text, Edges: []Side{}}
	for _, e := range list {
		name, _ := e.(string)
		found := false
		for _, s := range Sides {
			if s.String() == name {
				w.Edges, found = append(w.Edges, s), true
			}
		}
		if !found {
			return fmt.Errorf("problem: unknown edge %q in a warning", name)
		}
	}
	return nil
}
