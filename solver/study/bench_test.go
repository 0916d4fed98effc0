package study

import (
	"fmt"
	"runtime"
	"strings"
	"testing"

	"edgewise/solver"
)

// BenchmarkStudy1000 runs a 1,000-case study (40 convection coefficients on
// a log scale times 25 conductivities) of the plate project at the default
// output grid (200 x 67), with one worker and with one per core. One op is
// the whole study.
func BenchmarkStudy1000(b *testing.B) {
	proj := strings.Replace(string(load(b, "plate.json")), `"grid": {"nx": 60, "ny": 20}`, `"grid": {"nx": 200, "ny": 67}`, 1)
	p, s := decodeBoth(b, []byte(proj), []byte(`{"schema": "edgewise-study/1",
	  "vary": [{"name": "h_top", "from": 5, "to": 500, "steps": 40, "scale": "log"},
	           {"name": "k_plate", "from": 20, "to": 400, "steps": 25}],
	  "report": ["max.value", "probes.T1.value", "edges.top.flow", "balance"]}`))
	if s.Rows() != 1000 {
		b.Fatalf("%d rows", s.Rows())
	}
	for _, workers := range []int{1, runtime.GOMAXPROCS(0)} {
		b.Run(fmt.Sprintf("j=%d", workers), func(b *testing.B) {
			for b.Loop() {
				failed, err := s.Sweep(p, Config{Workers: workers, Options: solver.Options{}}, func(Row) error { return nil })
				if err != nil || failed != 0 {
					b.Fatalf("%d failed, %v", failed, err)
				}
			}
		})
	}
}
