package study_test

import (
	"fmt"

	"edgewise/solver/project"
	"edgewise/solver/study"
)

// The rows of a study run through every combination, the last axis
// changing fastest.
func ExampleStudy_Values() {
	p, err := project.Decode([]byte(`{"schema": "edgewise/1", "physics": "heat", "parameters": {"h_top": 25, "k_plate": 200},
	  "width": 0.3, "height": 0.1, "conductivity": "k_plate",
	  "edges": {"bottom": {"kind": "value", "expr": "120"}, "top": {"kind": "convection", "h": "h_top", "ambient": "25"},
	            "left": {"kind": "flux", "expr": "0"}, "right": {"kind": "flux", "expr": "0"}}}`))
	if err != nil {
		fmt.Println(err)
		return
	}
	s, err := study.Decode([]byte(`{"schema": "edgewise-study/1",
	  "vary": [{"name": "h_top", "from": 10, "to": 1000, "steps": 3, "scale": "log"}, {"name": "k_plate", "values": [120, 200]}],
	  "report": ["max.value", "edges.top.flow"]}`), p)
	if err != nil {
		fmt.Println(err)
		return
	}
	fmt.Println(s.Header())
	for i := range s.Rows() {
		fmt.Println(i, s.Values(i))
	}
	// Output:
	// [row h_top k_plate max.value edges.top.flow error]
	// 0 [10 120]
	// 1 [10 200]
	// 2 [100 120]
	// 3 [100 200]
	// 4 [1000 120]
	// 5 [1000 200]
}
