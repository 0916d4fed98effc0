package main

import (
	"encoding/csv"
	"fmt"
	"io"
	"os"
	"strconv"
	"strings"

	"edgewise/solver"
	"edgewise/solver/project"
	"edgewise/solver/study"
)

// runStudy runs the study file at path on project p and prints its CSV
// (see the package comment); it returns the exit status: 0 when every row
// solved, 1 when a row failed or the study or a flag is bad.
func runStudy(path, shard string, jobs int, p *project.Project, opt solver.Options, stdout, stderr io.Writer) int {
	if path == "" {
		fmt.Fprintln(stderr, "-shard and -j need -study STUDY.json")
		return 1
	}
	if jobs < 0 {
		fmt.Fprintf(stderr, "-j: must be 1 or more (0: one worker per core), got %d\n", jobs)
		return 1
	}
	data, err := os.ReadFile(path)
	if err != nil {
		fmt.Fprintln(stderr, project.Shorten(err.Error()))
		return 1
	}
	st, err := study.Decode(data, p)
	if err != nil {
		fmt.Fprintln(stderr, project.Shorten(fmt.Sprintf("%s: %v", path, err)))
		return 1
	}
	w := csv.NewWriter(stdout)
	if st.Seek != nil {
		if shard != "" {
			fmt.Fprintln(stderr, "-shard: a seek runs as one job and cannot be split")
			return 1
		}
		var sv solver.Solver
		res, err := st.Find(p, &sv, opt, nil)
		if err != nil {
			fmt.Fprintln(stderr, project.Shorten(err.Error()))
			return 1
		}
		_ = w.Write(res.Header(st))
		_ = w.Write(res.Record())
		w.Flush()
		if err := w.Error(); err != nil {
			fmt.Fprintln(stderr, project.Shorten(err.Error()))
			return 1
		}
		return 0
	}
	cfg := study.Config{Options: opt, Workers: jobs}
	if shard != "" {
		if cfg.Shard, cfg.Shards, err = parseShard(shard); err != nil {
			fmt.Fprintln(stderr, project.Shorten(err.Error()))
			return 1
		}
	}
	_ = w.Write(st.Header())
	failed, err := st.Sweep(p, cfg, func(r study.Row) error {
		_ = w.Write(r.Record(st))
		w.Flush()
		return w.Error()
	})
	if err != nil {
		fmt.Fprintln(stderr, project.Shorten(err.Error()))
		return 1
	}
	if failed > 0 {
		fmt.Fprintf(stderr, "%d rows failed (their error is in the last column)\n", failed)
		return 1
	}
	return 0
}

// parseShard reads "I/N" with 0 <= I < N.
func parseShard(s string) (i, n int, err error) {
	a, b, ok := strings.Cut(s, "/")
	i, err1 := strconv.Atoi(a)
	n, err2 := strconv.Atoi(b)
	if !ok || err1 != nil || err2 != nil {
		return 0, 0, fmt.Errorf("-shard: expected I/N such as 0/4 (job I of N), got %q", s)
	}
	if n < 1 {
		return 0, 0, fmt.Errorf("-shard: the number of shards must be 1 or more, got %d", n)
	}
	if i < 0 || i >= n {
		return 0, 0, fmt.Errorf("-shard: index %d is out of range for %d shards (0 <= I < %d)", i, n, n)
	}
	return i, n, nil
}
