package report

import (
	"reflect"
	"testing"

	"edgewise/solver/export"
	"edgewise/solver/project"
)

// The picture's outline gets every edge's parts: one for an edge of one
// condition, each segment of a split edge with its stretch (the last to
// the edge's end), and the physics' names of the kinds for the key.
func TestEdgePartsOfProject(t *testing.T) {
	p, err := project.Decode([]byte(`{"schema":"edgewise/1","physics":"seepage","width":30,"height":10,"conductivity":1e-5,
	  "edges":{"bottom":{"kind":"flux","expr":"0"},"right":{"kind":"flux","expr":"0"},"left":{"kind":"convection","h":1e-6,"ambient":"3"},
	  "top":{"segments":[{"to":10,"kind":"value","expr":"12"},{"to":20,"kind":"flux","expr":"0"},{"kind":"value","expr":"2"}]}}}`))
	if err != nil {
		t.Fatal(err)
	}
	parts, names := edgeParts(p)
	want := []export.EdgePart{
		{Side: "bottom", From: 0, To: 30, Kind: "flux"},
		{Side: "right", From: 0, To: 10, Kind: "flux"},
		{Side: "top", From: 0, To: 10, Kind: "value"},
		{Side: "top", From: 10, To: 20, Kind: "flux"},
		{Side: "top", From: 20, To: 30, Kind: "value"},
		{Side: "left", From: 0, To: 10, Kind: "convection"},
	}
	if !reflect.DeepEqual(parts, want) {
		t.Errorf("parts %v\nwant %v", parts, want)
	}
	if names["value"] != "Fixed head, water level (Dirichlet)" || names["flux"] == "" || names["convection"] == "" {
		t.Errorf("kind names %v", names)
	}
}
