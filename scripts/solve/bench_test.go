package main

import (
	"fmt"
	"io"
	"os"
	"path/filepath"
	"testing"

	"edgewise/solver"
	"edgewise/solver/problem"
	"edgewise/solver/project"
)

// benchPlate is the runner's benchmark case: a 2 x 1 plate with a value on
// every edge, 1 on the top and 0 on the others (so the value jumps at the
// top corners), unit conductivity.
const benchPlate = `{"schema": "edgewise/1", "physics": "generic", "width": 2, "height": 1, "conductivity": 1,
 "edges": {"bottom": {"kind": "value", "expr": "0"}, "right": {"kind": "value", "expr": "0"},
           "top": {"kind": "value", "expr": "1"}, "left": {"kind": "value", "expr": "0"}}}`

// BenchmarkRunner is the runner's path for one solve, -grid N on the
// plate (N x N/2 intervals; 512 is the 513 x 257 nodes of the README's
// whole-process figure), in this process:
//
//   - solve: the command without -csv (read, decode, solve with the
//     cross-check, the result JSON to a discarding writer);
//   - csv-discard: the solve (with the cross-check) and the field CSV to
//     a writer that only counts, so the figure is the solve and the
//     formatting alone;
//   - csv-file: the whole command with -csv to a file written over each
//     time, as a run again on the same file does.
//
// It reports the CSV's size (as MB/s); with -cpu 1 the time is that of
// one processor. A separate process adds its start and the first touch
// of its memory, which repeated runs in one process do not show; and the
// command's memory settings for its one solve (oneSolveMemory) collect
// the whole test process's garbage on every run here, more than the
// command has.
func BenchmarkRunner(b *testing.B) {
	dir := b.TempDir()
	proj := filepath.Join(dir, "plate.json")
	if err := os.WriteFile(proj, []byte(benchPlate), 0o644); err != nil {
		b.Fatal(err)
	}
	p, err := project.Decode([]byte(benchPlate))
	if err != nil {
		b.Fatal(err)
	}
	for _, n := range []int{128, 512, 1024} {
		grid := fmt.Sprint(n)
		csvPath := filepath.Join(dir, "field.csv")
		cases := []struct {
			name string
			once func() int64 // one run; the CSV's size
		}{
			{"solve", func() int64 {
				if st := run([]string{"-grid", grid, proj}, nil, io.Discard, io.Discard); st != 0 {
					b.Fatalf("exit %d", st)
				}
				return 0
			}},
			{"csv-discard", func() int64 {
				opt := solver.Options{}
				opt.Nx, opt.Ny = problem.Proportional(p.Width, p.Height, n)
				var s solver.Solver
				out, err := s.Solve(p, opt)
				if err != nil {
					b.Fatal(err)
				}
				w := &countingWriter{w: io.Discard}
				if err := fieldCSV(w, p, out); err != nil {
					b.Fatal(err)
				}
				return w.n
			}},
			{"csv-file", func() int64 {
				if st := run([]string{"-grid", grid, "-csv", csvPath, proj}, nil, io.Discard, io.Discard); st != 0 {
					b.Fatalf("exit %d", st)
				}
				st, err := os.Stat(csvPath)
				if err != nil {
					b.Fatal(err)
				}
				return st.Size()
			}},
		}
		for _, c := range cases {
			b.Run(grid+"/"+c.name, func(b *testing.B) {
				var size int64
				for b.Loop() {
					size = c.once()
				}
				if size > 0 {
					b.SetBytes(size)
				}
			})
		}
	}
}
