package problem

import (
	"encoding/json"
	"testing"
)

// A warning is written with its edges by name in canonical order (bottom,
// right, top, left), each once, and [] when there are none; the text is
// escaped as JSON.
func TestWarningJSON(t *testing.T) {
	tests := []struct {
		w    Warning
		want string
	}{
		{Warning{Code: CornerJump, Edges: []Side{Left, Bottom}, Text: "a"},
			`{"code":"corner-jump","edges":["bottom","left"],"text":"a"}`},
		{Warning{Code: TermLimit, Edges: []Side{Top, Right, Top}, Text: "b"},
			`{"code":"term-limit","edges":["right","top"],"text":"b"}`},
		{Warning{Code: StepJump, Text: "say \"x\"\n"},
			`{"code":"step-jump","edges":[],"text":"say \"x\"\n"}`},
	}
	for _, tc := range tests {
		got, err := json.Marshal(tc.w)
		if err != nil {
			t.Fatal(err)
		}
		if string(got) != tc.want {
			t.Errorf("%+v: %s, want %s", tc.w, got, tc.want)
		}
	}
}
