package study

import (
	"fmt"
	"math"
	"runtime"
	"strconv"
	"sync"

	"edgewise/solver"
	"edgewise/solver/project"
)

// Rows returns the number of rows of a vary: the product of the axes'
// lengths (0 for a seek).
func (s *Study) Rows() int {
	if len(s.Vary) == 0 {
		return 0
	}
	n := 1
	for _, a := range s.Vary {
		n *= len(a.Values)
	}
	return n
}

// Values returns the parameter values of row i (0 <= i < Rows()), in the
// order of Vary. Rows run through every combination like nested loops, the
// first axis outermost and the last one changing fastest:
//
//	row = ((i0*n1 + i1)*n2 + i2)...   with ik the index into Vary[k].Values
func (s *Study) Values(i int) []float64 {
	if i < 0 || i >= s.Rows() {
		panic(fmt.Sprintf("study: row %d out of range [0, %d)", i, s.Rows()))
	}
	vals := make([]float64, len(s.Vary))
	for k := len(s.Vary) - 1; k >= 0; k-- {
		n := len(s.Vary[k].Values)
		vals[k] = s.Vary[k].Values[i%n]
		i /= n
	}
	return vals
}

// Header is the CSV header of a vary: "row", the varied parameters' names,
// the report paths, "error".
func (s *Study) Header() []string {
	h := []string{"row"}
	for _, a := range s.Vary {
		h = append(h, a.Name)
	}
	h = append(h, s.Report...)
	return append(h, "error")
}

// Row is one run of a study.
type Row struct {
	Index   int
	Params  []float64 // the varied parameters' values, in the order of Vary
	Outputs []float64 // the report paths' values; NaN where the result has no number
	Err     error     // the solve failed: Outputs is nil
}

// Record is the row as CSV fields under Header: numbers in the shortest
// form that reads back to the same float64; an output the result does not
// have (an infinite flow) is an empty field; a failed row has empty
// outputs and the one-line error in the last field.
func (r Row) Record(s *Study) []string {
	rec := []string{strconv.Itoa(r.Index)}
	for _, v := range r.Params {
		rec = append(rec, Format(v))
	}
	for i := range s.Report {
		if r.Err != nil {
			rec = append(rec, "")
		} else {
			rec = append(rec, Format(r.Outputs[i]))
		}
	}
	if r.Err != nil {
		return append(rec, r.Err.Error())
	}
	return append(rec, "")
}

// Format writes a number in the shortest form that reads back to the same
// float64; NaN (no number) is the empty string.
func Format(v float64) string {
	if math.IsNaN(v) {
		return ""
	}
	return strconv.FormatFloat(v, 'g', -1, 64)
}

// Options returns the solver options for the study's rows: those of opt,
// without the cross-check when no reported output needs it (it changes no
// other number).
func (s *Study) Options(opt solver.Options) solver.Options {
	opt.NoCrossCheck = opt.NoCrossCheck || !s.crossNeed
	return opt
}

// Set returns the project with the varied parameters set to vals, in the
// order of Vary.
func (s *Study) Set(p *project.Project, vals []float64) (*project.Project, error) {
	m := make(map[string]float64, len(vals))
	for i, v := range vals {
		m[s.Vary[i].Name] = v
	}
	return p.With(m)
}

// Run solves row i of a vary with sv and collects its outputs. It is a
// pure function of p, s, i and opt: the same row gives the same numbers
// whichever Solver runs it and in whatever order. A failed solve is the
// row's Err, never a panic.
func (s *Study) Run(p *project.Project, i int, sv *solver.Solver, opt solver.Options) Row {
	r := Row{Index: i, Params: s.Values(i)}
	q, err := s.Set(p, r.Params)
	if err != nil {
		r.Err = err
		return r
	}
	out, err := sv.Solve(q, s.Options(opt))
	if err == nil {
		err = unconverged(&out.Result)
	}
	if err != nil {
		r.Err = err
		return r
	}
	r.Outputs = s.collect(&out.Result)
	return r
}

// unconverged is the error of a result the engine cannot stand behind
// (accuracy.converged false): a study prints no number from it.
func unconverged(r *solver.Result) error {
	if r.Accuracy.Converged {
		return nil
	}
	return fmt.Errorf("not converged: the engine could not meet its tolerance (estimated error %.3g); no number is given", r.Accuracy.Estimate)
}

func (s *Study) collect(res *solver.Result) []float64 {
	vals := make([]float64, len(s.outs))
	for k, o := range s.outs {
		v, ok := o(res)
		if !ok {
			v = math.NaN()
		}
		vals[k] = v
	}
	return vals
}

// Config says which rows a Sweep runs and with how many workers.
type Config struct {
	Options solver.Options
	// Workers solve rows at once (each with its own Solver); 0 means one
	// per CPU.
	Workers int
	// Shard and Shards pick the rows whose index modulo Shards is Shard;
	// Shards 0 means every row.
	Shard, Shards int
}

// Sweep runs the rows of a vary that cfg picks and hands them to emit in
// row order, whatever the number of workers. It returns the number of
// failed rows, or emit's first error (the sweep then stops).
func (s *Study) Sweep(p *project.Project, cfg Config, emit func(Row) error) (failed int, err error) {
	if s.Seek != nil || len(s.Vary) == 0 {
		panic("study: Sweep of a study without vary")
	}
	shards := max(cfg.Shards, 1)
	if cfg.Shard < 0 || cfg.Shard >= shards {
		panic(fmt.Sprintf("study: shard %d of %d", cfg.Shard, shards))
	}
	workers := cfg.Workers
	if workers <= 0 {
		workers = runtime.GOMAXPROCS(0)
	}
	// the shard's k-th row is row cfg.Shard + k*shards
	count := (s.Rows() - cfg.Shard + shards - 1) / shards
	row := func(k int) int { return cfg.Shard + k*shards }
	jobs := make(chan int)
	done := make(chan struct{})
	results := make(chan Row, workers)
	var wg sync.WaitGroup
	for range workers {
		wg.Add(1)
		go func() {
			defer wg.Done()
			var sv solver.Solver
			for k := range jobs {
				select {
				case results <- s.safeRun(p, row(k), &sv, cfg.Options):
				case <-done:
					return
				}
			}
		}()
	}
	go func() {
		defer close(jobs)
		for k := range count {
			select {
			case jobs <- k:
			case <-done:
				return
			}
		}
	}()
	go func() { wg.Wait(); close(results) }()

	pending := map[int]Row{}
	next := 0 // the shard's next row to emit is row(next)
	for r := range results {
		pending[r.Index] = r
		for next < count && err == nil {
			r, ok := pending[row(next)]
			if !ok {
				break
			}
			delete(pending, row(next))
			next++
			if r.Err != nil {
				failed++
			}
			if err = emit(r); err != nil {
				close(done)
			}
		}
	}
	return failed, err
}

// safeRun is Run for a worker goroutine: a panic in the engine becomes the
// row's error instead of ending the process with a trace.
func (s *Study) safeRun(p *project.Project, i int, sv *solver.Solver, opt solver.Options) (r Row) {
	defer func() {
		if e := recover(); e != nil {
			*sv = solver.Solver{}
			r = Row{Index: i, Params: s.Values(i), Err: fmt.Errorf("internal error: %v (please report this case)", e)}
		}
	}()
	return s.Run(p, i, sv, opt)
}
