//go:build js && wasm

package main

// The study functions run studies (package study) for the page's study
// panel, a few rows per call so that the page can show progress and stop
// between calls:
//
//	edgewise_study_paths(projectJSON) -> {ok, paths: "[report paths of this project]"}
//	edgewise_study_rows(projectJSON, studyJSON, from, count, n) ->
//	    {ok, total, header: "[names]", header_csv, rows: "[{row, params, outputs, error}]", csv}
//	edgewise_study_seek(projectJSON, studyJSON, n) ->
//	    {ok, found, reason, seek: "{name, value, bracket, output, achieved, target, tolerance, estimate, solves, outputs}", csv}
//
// n is the grid's intervals along the longer side (0: the project's grid
// or the default, as the runner without -grid). rows holds rows from ..
// from+count-1 (outputs null where the result has no number; error "" or
// the row's one-line error); csv is those rows exactly as the runner
// prints them (header_csv is its header line), so the page's download is
// the runner's output. A seek posts {type: "progress", solves, value,
// output} to the page (postMessage) after every solve; a seek that finds
// no value answers found false with the engine's reason.

import (
	"errors"
	"fmt"
	"math"
	"strings"

	"edgewise/solver"
	"edgewise/solver/jsonlite"
	"edgewise/solver/problem"
	"edgewise/solver/project"
	"edgewise/solver/study"

	"github.com/hack-pad/safejs"
)

// maxBatch bounds the rows of one study_rows call.
const maxBatch = 1000

func studyPathsCall(args []safejs.Value) (map[string]any, error) {
	text, err := stringArg(args, 0, "the project JSON", false)
	if err != nil {
		return nil, err
	}
	p, err := project.Decode([]byte(text))
	if err != nil {
		return nil, err
	}
	var w jsonlite.Writer
	w.Open('[')
	for _, path := range strings.Split(study.Paths(), ", ") {
		switch {
		case strings.Contains(path, "<side>"):
			for _, s := range problem.Sides {
				w.Str(strings.Replace(path, "<side>", s.String(), 1))
			}
		case strings.Contains(path, "<label>"):
			for _, q := range p.Probes {
				w.Str(strings.Replace(path, "<label>", q.Label, 1))
			}
		default:
			w.Str(path)
		}
	}
	w.Close(']')
	return map[string]any{"ok": true, "paths": string(w.Bytes())}, nil
}

// studyArgs reads the project, the study and the grid argument at index
// gridArg.
func studyArgs(args []safejs.Value, gridArg int) (*project.Project, *study.Study, solver.Options, error) {
	var opt solver.Options
	ptext, err := stringArg(args, 0, "the project JSON", false)
	if err != nil {
		return nil, nil, opt, err
	}
	stext, err := stringArg(args, 1, "the study JSON", false)
	if err != nil {
		return nil, nil, opt, err
	}
	p, err := project.Decode([]byte(ptext))
	if err != nil {
		return nil, nil, opt, err
	}
	p.Study = stext
	s, err := study.FromProject(p)
	if err != nil {
		return nil, nil, opt, err
	}
	p.Study = ""
	if n := intArg(args, gridArg); n > 0 {
		opt.Nx, opt.Ny = problem.Proportional(p.Width, p.Height, min(n, project.MaxGrid))
	}
	return p, s, opt, nil
}

// intArg reads argument i as a whole number, 0 when missing or not one.
func intArg(args []safejs.Value, i int) int {
	if i >= len(args) {
		return 0
	}
	n, err := args[i].Int()
	if err != nil {
		return 0
	}
	return n
}

// csvLines formats records as the runner does (encoding/csv's format).
func csvLines(records ...[]string) (string, error) {
	var b []byte
	for _, r := range records {
		b = study.AppendCSV(b, r)
	}
	return string(b), nil
}

func numOrNull(w *jsonlite.Writer, v float64) {
	if math.IsNaN(v) {
		w.Null()
		return
	}
	w.Num(v)
}

func studyRowsCall(args []safejs.Value) (map[string]any, error) {
	p, s, opt, err := studyArgs(args, 4)
	if err != nil {
		return nil, err
	}
	if s.Seek != nil {
		return nil, project.Errorf("study", "this study is a seek: run it with study_seek")
	}
	total := s.Rows()
	from := max(intArg(args, 2), 0)
	to := min(from+min(max(intArg(args, 3), 0), maxBatch), total)
	head := s.Header()
	var hw jsonlite.Writer
	hw.Open('[')
	for _, h := range head {
		hw.Str(h)
	}
	hw.Close(']')
	headCSV, err := csvLines(head)
	if err != nil {
		return nil, err
	}
	var w jsonlite.Writer
	var records [][]string
	w.Open('[')
	for i := from; i < to; i++ {
		r := s.Run(p, i, &engine, opt)
		records = append(records, r.Record(s))
		w.Open('{').Key("row").Int(r.Index).Key("params").Open('[')
		for _, v := range r.Params {
			w.Num(v)
		}
		w.Close(']').Key("outputs").Open('[')
		for _, v := range r.Outputs {
			numOrNull(&w, v)
		}
		w.Close(']').Key("error")
		if r.Err != nil {
			w.Str(r.Err.Error())
		} else {
			w.Str("")
		}
		w.Close('}')
	}
	w.Close(']')
	lines, err := csvLines(records...)
	if err != nil {
		return nil, err
	}
	return map[string]any{"ok": true, "total": total, "header": string(hw.Bytes()), "header_csv": headCSV,
		"rows": string(w.Bytes()), "csv": lines}, nil
}

func studySeekCall(args []safejs.Value) (map[string]any, error) {
	p, s, opt, err := studyArgs(args, 2)
	if err != nil {
		return nil, err
	}
	if s.Seek == nil {
		return nil, project.Errorf("study.seek", "missing: this study has no seek")
	}
	progress := func(solves int, value, output float64) bool {
		post(map[string]any{"type": "progress", "solves": solves, "value": value, "output": output})
		return true
	}
	res, err := s.Find(p, &engine, opt, progress)
	var se *study.SeekError
	if errors.As(err, &se) {
		return map[string]any{"ok": true, "found": false, "reason": err.Error()}, nil
	}
	if err != nil {
		return nil, err
	}
	var w jsonlite.Writer
	w.Open('{').Key("name").Str(res.Name).Key("value").Num(res.Value).Key("bracket").Num(res.Bracket).
		Key("output").Str(res.Output).Key("achieved").Num(res.Achieved).Key("target").Num(res.Target).
		Key("tolerance").Num(res.Tolerance).Key("estimate").Num(res.Estimate).Key("solves").Int(res.Solves).
		Key("outputs").Open('[')
	for _, v := range res.Outputs {
		numOrNull(&w, v)
	}
	w.Close(']').Close('}')
	lines, err := csvLines(res.Header(s), res.Record())
	if err != nil {
		return nil, err
	}
	return map[string]any{"ok": true, "found": true, "reason": "", "seek": string(w.Bytes()), "csv": lines}, nil
}

// post sends a message to the page from inside a call (the worker's
// postMessage); a failure to post is not the call's failure.
func post(m map[string]any) {
	_, err := safejs.Global().Call("postMessage", m)
	if err != nil {
		fmt.Println("edgewise: progress not posted:", err)
	}
}
