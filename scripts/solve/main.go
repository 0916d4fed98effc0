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
//	-profile FILE -line X0,Y0,X1,Y1
//	           also write the field along the line as CSV (101 places:
//	           distance, x, y, value, gradient and flux; the page's
//	           line-profile download)
//	-cpuprofile FILE
//	           write a processor profile of the run (go tool pprof)
//
// PROJECT.json may be "-" for standard input; either is read only up to
// the size limit of a project file (1 MiB). On bad input it exits with
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
	"errors"
	"flag"
	"fmt"
	"io"
	"os"
	"path/filepath"
	"runtime/pprof"
	"strconv"
	"strings"

	"edgewise/solver"
	"edgewise/solver/export"
	"edgewise/solver/problem"
	"edgewise/solver/project"
	"edgewise/solver/report"
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
	var gridText string // checked below, so that a bad value gives one line, not the usage
	fs.StringVar(&gridText, "grid", "", "output grid: `N` intervals along the longer side")
	csvPath := fs.String("csv", "", "write the field on the output grid as CSV to `FILE`")
	profilePath := fs.String("profile", "", "write the field along the -line as CSV to `FILE`")
	lineText := fs.String("line", "", "the profile's line: `X0,Y0,X1,Y1`")
	studyPath := fs.String("study", "", "run the study in `STUDY.json` on the project and print CSV")
	shard := fs.String("shard", "", "with -study: run only the rows whose index modulo N is I (`I/N`)")
	jobs := fs.Int("j", 0, "with -study: solve `N` rows at once (0: one per core)")
	cpuProfile := fs.String("cpuprofile", "", "write a processor profile of the run to `FILE` (for go tool pprof)")
	fs.Usage = func() {
		fmt.Fprintln(stderr, "usage: solve [-grid N] [-csv FILE] [-profile FILE -line X0,Y0,X1,Y1] PROJECT.json\n       solve -study STUDY.json [-shard I/N] [-j N] [-grid N] PROJECT.json")
		fs.PrintDefaults()
	}
	if err := fs.Parse(args); err != nil {
		return 1
	}
	if fs.NArg() != 1 {
		fs.Usage()
		return 1
	}
	if *cpuProfile != "" {
		stop, err := startProfile(*cpuProfile)
		if err != nil {
			fmt.Fprintln(stderr, project.Shorten(err.Error()))
			return 1
		}
		defer stop()
	}
	grid, err := gridFlag(gridText)
	if err != nil {
		fmt.Fprintln(stderr, project.Shorten(err.Error()))
		return 1
	}
	data, err := readProject(fs.Arg(0), stdin)
	if err != nil {
		fmt.Fprintln(stderr, project.Shorten(err.Error()))
		return 1
	}
	p, err := project.Decode(data)
	if err != nil {
		fmt.Fprintln(stderr, project.Shorten(err.Error()))
		return 1
	}
	opt := solver.Options{}
	if grid > 0 {
		opt.Nx, opt.Ny = problem.Proportional(p.Width, p.Height, grid)
	}
	if *studyPath != "" || *shard != "" || *jobs != 0 {
		return runStudy(*studyPath, *shard, *jobs, p, opt, stdout, stderr)
	}
	line, err := lineFlag(*profilePath, *lineText, p)
	if err != nil {
		fmt.Fprintln(stderr, project.Shorten(err.Error()))
		return 1
	}
	defer prepareMemory(p, opt)()
	var s solver.Solver
	out, err := s.Solve(p, opt)
	if err != nil {
		fmt.Fprintln(stderr, project.Shorten(err.Error()))
		return 1
	}
	if *csvPath != "" {
		if err := writeCSV(*csvPath, p, out); err != nil {
			fmt.Fprintln(stderr, project.Shorten(err.Error()))
			return 1
		}
	}
	if line != nil {
		d, err := report.Make(report.ProfileCSV, p, out, report.PictureOptions{Profile: line})
		if err == nil {
			err = os.WriteFile(*profilePath, d.Data, 0o644)
		}
		if err != nil {
			fmt.Fprintln(stderr, project.Shorten(err.Error()))
			return 1
		}
	}
	if _, err := stdout.Write(append(out.Result.JSON(), '\n')); err != nil {
		fmt.Fprintln(stderr, project.Shorten(err.Error()))
		return 1
	}
	return 0
}

// lineFlag reads -profile and -line: both or neither; the line is four
// numbers X0,Y0,X1,Y1 inside the rectangle, its ends apart.
func lineFlag(path, text string, p *project.Project) (*report.ProfileLine, error) {
	switch {
	case path == "" && text == "":
		return nil, nil
	case path == "":
		return nil, errors.New("-line: give -profile FILE too (where to write the profile)")
	case text == "":
		return nil, errors.New("-profile: give -line X0,Y0,X1,Y1 too (the profile's line)")
	}
	parts := strings.Split(text, ",")
	if len(parts) != 4 {
		return nil, fmt.Errorf("-line: four numbers X0,Y0,X1,Y1 separated by commas, got %d", len(parts))
	}
	var v [4]float64
	for i, t := range parts {
		x, err := strconv.ParseFloat(strings.TrimSpace(t), 64)
		if err != nil || x-x != 0 {
			return nil, fmt.Errorf("-line: %q is not a number", strings.TrimSpace(t))
		}
		lim := p.Width
		if i%2 == 1 {
			lim = p.Height
		}
		if x < 0 || x > lim {
			return nil, fmt.Errorf("-line: %g is outside the rectangle (0 to %g)", x, lim)
		}
		v[i] = x
	}
	if v[0] == v[2] && v[1] == v[3] {
		return nil, errors.New("-line: the two ends are the same point")
	}
	return &report.ProfileLine{X0: v[0], Y0: v[1], X1: v[2], Y1: v[3]}, nil
}

// gridFlag reads the -grid value: empty or 0 for the project's own grid,
// else a whole number from 2 to project.MaxGrid. A bad value is one line
// naming the flag and the range.
func gridFlag(text string) (int, error) {
	if text == "" {
		return 0, nil
	}
	n, err := strconv.Atoi(strings.TrimSpace(text))
	if err != nil && !errors.Is(err, strconv.ErrRange) {
		if len(text) > 40 {
			text = text[:32] + "..."
		}
		return 0, fmt.Errorf("-grid: must be a whole number from 2 to %d, got %q", project.MaxGrid, text)
	}
	if n == 0 && err == nil {
		return 0, nil // as if not given, as before
	}
	if err != nil || n < 2 || n > project.MaxGrid {
		return 0, fmt.Errorf("-grid: must be from 2 to %d, got %s", project.MaxGrid, strings.TrimSpace(text))
	}
	return n, nil
}

// readProject reads the project file, or standard input for "-", through
// a limit: it reads at most project.MaxFileBytes + 1 bytes, so that a huge
// or endless input (a pipe from /dev/zero) is refused in bounded time and
// memory.
func readProject(name string, stdin io.Reader) ([]byte, error) {
	r := stdin
	if name != "-" {
		f, err := os.Open(name)
		if err != nil {
			return nil, err
		}
		defer f.Close()
		r = f
	}
	data, err := io.ReadAll(io.LimitReader(r, project.MaxFileBytes+1))
	if err != nil {
		return nil, err
	}
	if len(data) > project.MaxFileBytes {
		return nil, fmt.Errorf("project file is larger than %d bytes", project.MaxFileBytes)
	}
	return data, nil
}

// startProfile starts a processor profile into the named file; the
// returned function stops it and closes the file.
func startProfile(path string) (stop func(), err error) {
	f, err := os.Create(path)
	if err != nil {
		return nil, fmt.Errorf("-cpuprofile: %v", err)
	}
	if err := pprof.StartCPUProfile(f); err != nil {
		f.Close()
		return nil, fmt.Errorf("-cpuprofile: %v", err)
	}
	return func() { pprof.StopCPUProfile(); f.Close() }, nil
}

// writeCSV writes the field CSV to path, so that the name never holds a
// half-written field: the text is written under a temporary name beside
// it, which takes the name when it is whole. A run that stops half way
// (killed, a full disk) leaves no file of that name (and says so), never
// the new numbers' head over the old ones' tail. An existing regular file is
// first moved to the temporary name and written over in place, then cut
// to the new length: its pages are used again instead of freed and found
// anew (15 MB: 0.6 ms against 3 to 7 on this machine). A pipe or a device
// is written straight.
func writeCSV(path string, p *project.Project, out *solver.Output) error {
	st, err := os.Stat(path)
	if err == nil && !st.Mode().IsRegular() {
		f, err := os.OpenFile(path, os.O_WRONLY, 0)
		if err != nil {
			return err
		}
		err = fieldCSV(f, p, out)
		if cerr := f.Close(); err == nil {
			err = cerr
		}
		return err
	}
	var f *os.File
	var tmp string
	if err == nil {
		tmp = filepath.Join(filepath.Dir(path), "."+filepath.Base(path)+"."+strconv.Itoa(os.Getpid())+".part")
		if err = os.Rename(path, tmp); err == nil {
			f, err = os.OpenFile(tmp, os.O_WRONLY, 0)
		}
	} else {
		f, err = os.CreateTemp(filepath.Dir(path), "."+filepath.Base(path)+".*.part")
		if err == nil {
			tmp = f.Name()
			err = f.Chmod(0o644)
		}
	}
	if err != nil {
		if f != nil {
			f.Close()
			os.Remove(tmp)
		}
		return err
	}
	w := &countingWriter{w: csvSink(f)}
	err = fieldCSV(w, p, out)
	if err == nil {
		err = f.Truncate(w.n) // the old text after the new ends
	}
	if cerr := f.Close(); err == nil {
		err = cerr
	}
	if err == nil {
		err = os.Rename(tmp, path)
	}
	if err != nil {
		os.Remove(tmp)
	}
	return err
}

// csvSink is where writeCSV's text goes (a test makes it fail half way).
var csvSink = func(f *os.File) io.Writer { return f }

// countingWriter counts the bytes written through it.
type countingWriter struct {
	w io.Writer
	n int64
}

func (c *countingWriter) Write(b []byte) (int, error) {
	n, err := c.w.Write(b)
	c.n += int64(n)
	return n, err
}

// fieldCSV writes the field of out as CSV to w.
func fieldCSV(w io.Writer, p *project.Project, out *solver.Output) error {
	u := solver.Units(p.Physics)
	return export.FieldCSV(w, &export.Field{
		Nx: out.Nx, Ny: out.Ny, W: out.W, H: out.H, U: out.U, Ux: out.Ux, Uy: out.Uy,
		Kx: p.Conductivity.X, Ky: p.Conductivity.Y,
		Units: export.Units{Quantity: u.Value, Unit: u.ValueUnit, FluxUnit: u.FluxUnit, LengthUnit: u.Length},
	})
}

// prepareMemory is oneSolveMemory; the in-process benchmark leaves it
// out (see BenchmarkRunner).
var prepareMemory = oneSolveMemory
