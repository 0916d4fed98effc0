// Command solve is the native batch runner of edgewise: it solves one
// project file and prints the result JSON (schema "edgewise-result/1") on
// standard output, the same result the page computes.
//
// Usage:
//
//	go run ./scripts/solve [-grid N] [-csv FILE] PROJECT.json
//
//	-grid N    output grid: N intervals along the longer side, the other
//	           side in proportion (default: the project's grid, else 200)
//	-csv FILE  also write the field on that grid as CSV (x, y, value,
//	           gradient and flux, with units in the header)
//
// PROJECT.json may be "-" for standard input. On bad input it exits with
// status 1 and one line on standard error that names the field and, for a
// formula, the column:
//
//	edges.top.ambient: col 4: unknown name "tt"
//
// With -study it runs a study instead (see study.go and the README):
//
//	go run ./scripts/solve -study STUDY.json [-shard I/N] [-j N] PROJECT.json
package main

import (
	"bufio"
	"flag"
	"fmt"
	"io"
	"os"

	"edgewise/solver"
	"edgewise/solver/export"
	"edgewise/solver/problem"
	"edgewise/solver/project"
)

func main() {
	os.Exit(run(os.Args[1:], os.Stdin, os.Stdout, os.Stderr))
}

// run is the whole command; it returns the exit status.
func run(args []string, stdin io.Reader, stdout, stderr io.Writer) (status int) {
	defer func() {
		if r := recover(); r != nil {
			fmt.Fprintf(stderr, "edgewise: internal error: %v (please report this project)\n", r)
			status = 2
		}
	}()
	fs := flag.NewFlagSet("solve", flag.ContinueOnError)
	fs.SetOutput(stderr)
	grid := fs.Int("grid", 0, "output grid: `N` intervals along the longer side")
	csvPath := fs.String("csv", "", "write the field on the output grid as CSV to `FILE`")
	studyPath := fs.String("study", "", "run the study in `STUDY.json` on the project and print CSV")
	shard := fs.String("shard", "", "with -study: run only the rows whose index modulo N is I (`I/N`)")
	jobs := fs.Int("j", 0, "with -study: solve `N` rows at once (0: one per core)")
	fs.Usage = func() {
		fmt.Fprintln(stderr, "usage: solve [-grid N] [-csv FILE] PROJECT.json\n       solve -study STUDY.json [-shard I/N] [-j N] [-grid N] PROJECT.json")
		fs.PrintDefaults()
	}
	if err := fs.Parse(args); err != nil {
		return 1
	}
	if fs.NArg() != 1 {
		fs.Usage()
		return 1
	}
	if *grid != 0 && (*grid < 2 || *grid > project.MaxGrid) {
		fmt.Fprintf(stderr, "-grid: must be from 2 to %d, got %d\n", project.MaxGrid, *grid)
		return 1
	}
	var data []byte
	var err error
	if name := fs.Arg(0); name == "-" {
		data, err = io.ReadAll(stdin)
	} else {
		data, err = os.ReadFile(name)
	}
	if err != nil {
		fmt.Fprintln(stderr, err)
		return 1
	}
	p, err := project.Decode(data)
	if err != nil {
		fmt.Fprintln(stderr, err)
		return 1
	}
	opt := solver.Options{}
	if *grid > 0 {
		opt.Nx, opt.Ny = problem.Proportional(p.Width, p.Height, *grid)
	}
	if *studyPath != "" || *shard != "" || *jobs != 0 {
		return runStudy(*studyPath, *shard, *jobs, p, opt, stdout, stderr)
	}
	var s solver.Solver
	out, err := s.Solve(p, opt)
	if err != nil {
		fmt.Fprintln(stderr, err)
		return 1
	}
	if *csvPath != "" {
		if err := writeCSV(*csvPath, p, out); err != nil {
			fmt.Fprintln(stderr, err)
			return 1
		}
	}
	if _, err := stdout.Write(append(out.Result.JSON(), '\n')); err != nil {
		fmt.Fprintln(stderr, err)
		return 1
	}
	return 0
}

func writeCSV(path string, p *project.Project, out *solver.Output) error {
	f, err := os.Create(path)
	if err != nil {
		return err
	}
	w := bufio.NewWriter(f)
	u := solver.Units(p.Physics)
	err = export.FieldCSV(w, &export.Field{
		Nx: out.Nx, Ny: out.Ny, W: out.W, H: out.H, U: out.U, Ux: out.Ux, Uy: out.Uy,
		Kx: p.Conductivity.X, Ky: p.Conductivity.Y,
		Units: export.Units{Quantity: u.Value, Unit: u.ValueUnit, FluxUnit: u.FluxUnit, LengthUnit: u.Length},
	})
	if err == nil {
		err = w.Flush()
	}
	if cerr := f.Close(); err == nil {
		err = cerr
	}
	return err
}
