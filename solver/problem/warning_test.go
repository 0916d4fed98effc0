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
		// and back: the edges in canonical order, each once
		var back Warning
		if err := json.Unmarshal(got, &back); err != nil {
			t.Fatal(err)
		}
		again, _ := json.Marshal(back)
		if string(again) != tc.want || back.Code != tc.w.Code || back.Text != tc.w.Text {
			t.Errorf("round trip of %s gave %+v", got, back)
		}
	}
	var w Warning
	if err := json.Unmarshal([]byte(`{"code":"x","edges":["middle"],"text":""}`), &w); err == nil {
		t.Errorf("an unknown edge was accepted: %+v", w)
	}
}
