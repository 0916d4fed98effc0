package study

import (
	"fmt"
	"runtime"
	"strings"
	"testing"

	"edgewise/solver"
	"edgewise/solver/project"
)

// BenchmarkStudy1000 runs a 1,000-case study (40 convection coefficients on
// a log scale times 25 conductivities) of the plate project at the default
// output grid (200 x 67, the project's own grid taken out), with one worker and with one per core. One op is
// the whole study.
func BenchmarkStudy1000(b *testing.B) {
	p, s := benchStudy(b, 40, 25)
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

// BenchmarkStudy50 is the page's target case: 50 cases (10 x 5) at the
// default grid, one after the other on one Solver as the page's worker
// would run them with Study.Run. Run it as WebAssembly under Node to
// measure what the page can expect:
//
//	GOOS=js GOARCH=wasm go test -run XXX -bench Study50 -exec "$(go env GOROOT)/lib/wasm/go_js_wasm_exec" ./solver/study
func BenchmarkStudy50(b *testing.B) {
	p, s := benchStudy(b, 10, 5)
	var sv solver.Solver
	for b.Loop() {
		for i := range s.Rows() {
			if r := s.Run(p, i, &sv, solver.Options{}); r.Err != nil {
				b.Fatal(r.Err)
			}
		}
	}
}

// benchStudy is the plate of testdata/study at the default grid (200 x 67)
// with nh convection coefficients on a log scale times nk conductivities.
func benchStudy(b *testing.B, nh, nk int) (*project.Project, *Study) {
	proj := strings.Replace(string(load(b, "plate.json")), `"grid": {"nx": 60, "ny": 20}, `, ``, 1)
	proj = strings.Replace(proj, `,
  "grid": {"nx": 60, "ny": 20}`, ``, 1)
	p, s := decodeBoth(b, []byte(proj), []byte(fmt.Sprintf(`{"schema": "edgewise-study/1",
	  "vary": [{"name": "h_top", "from": 5, "to": 500, "steps": %d, "scale": "log"},
	           {"name": "k_plate", "from": 20, "to": 400, "steps": %d}],
	  "report": ["max.value", "probes.T1.value", "edges.top.flow", "balance"]}`, nh, nk)))
	if p.Grid != nil || s.Rows() != nh*nk {
		b.Fatalf("grid %v, %d rows", p.Grid, s.Rows())
	}
	return p, s
}
