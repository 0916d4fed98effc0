//go:build js && wasm

package main

// The outputs functions: downloads, the printable report's content, a
// project check for share links and opened files, and the build's version.
// They take the project JSON, solve it again on the bridge's one Solver and
// return text (see the package comment for their arguments and replies).

import (
	"errors"
	"fmt"

	"edgewise/solver"
	"edgewise/solver/jsonlite"
	"edgewise/solver/project"
	"edgewise/solver/report"
	"edgewise/solver/study"

	"github.com/hack-pad/safejs"
)

func versionCall([]safejs.Value) (map[string]any, error) {
	return map[string]any{"ok": true, "version": report.Version()}, nil
}

// callOptions are the options the outputs functions understand.
type callOptions struct {
	Nx, Ny     int
	PixelWidth int
	Levels     int
	Date       string
	// Profile is a line profile [x0, y0, x1, y1] (profile-csv, report).
	Profile *report.ProfileLine
}

func readOptions(args []safejs.Value, i int) (callOptions, error) {
	var o callOptions
	text, err := stringArg(args, i, "options", true)
	if err != nil || text == "" {
		return o, err
	}
	return parseOptions(text)
}

// parseOptions reads the options object strictly: unknown keys and wrong
// types are errors.
func parseOptions(text string) (callOptions, error) {
	var o callOptions
	tree, err := jsonlite.Parse([]byte(text))
	if err != nil {
		return o, fmt.Errorf("options: %v", err)
	}
	m, ok := tree.(map[string]any)
	if !ok {
		return o, errors.New("options: expected an object")
	}
	ints := map[string]*int{"nx": &o.Nx, "ny": &o.Ny, "pixel_width": &o.PixelWidth, "levels": &o.Levels}
	for k, v := range m {
		if k == "profile" {
			line, err := profileOption(v)
			if err != nil {
				return o, err
			}
			o.Profile = line
			continue
		}
		if k == "date" {
			s, ok := v.(string)
			if !ok || len(s) > 100 {
				return o, errors.New("options: date must be text of at most 100 bytes")
			}
			o.Date = s
			continue
		}
		dst, known := ints[k]
		if !known {
			return o, fmt.Errorf("options: unknown option %q", k)
		}
		n, ok := v.(jsonlite.Number)
		f, err := n.Float64()
		if !ok || err != nil || f != float64(int(f)) || f < -1 || f > 8000 {
			return o, fmt.Errorf("options: %s must be a whole number from -1 to 8000", k)
		}
		*dst = int(f)
	}
	if o.PixelWidth < 0 {
		return o, errors.New("options: pixel_width must not be negative")
	}
	if o.Nx > project.MaxGrid || o.Ny > project.MaxGrid {
		return o, fmt.Errorf("options: at most %d grid intervals per side", project.MaxGrid)
	}
	return o, nil
}

// profileOption reads the profile option: [x0, y0, x1, y1], finite numbers.
func profileOption(v any) (*report.ProfileLine, error) {
	list, ok := v.([]any)
	if !ok || len(list) != 4 {
		return nil, errors.New("options: profile must be a list [x0, y0, x1, y1]")
	}
	var f [4]float64
	for i, x := range list {
		n, ok := x.(jsonlite.Number)
		if !ok {
			return nil, errors.New("options: profile must hold four numbers")
		}
		v, err := n.Float64()
		if err != nil || v-v != 0 {
			return nil, errors.New("options: profile must hold four finite numbers")
		}
		f[i] = v
	}
	return &report.ProfileLine{X0: f[0], Y0: f[1], X1: f[2], Y1: f[3]}, nil
}

// solveProject decodes and solves a project for an output.
func solveProject(text string, o callOptions, crossCheck bool) (*project.Project, *solver.Output, error) {
	p, err := project.Decode([]byte(text))
	if err != nil {
		return nil, nil, err
	}
	opt := solver.Options{NoCrossCheck: !crossCheck}
	if o.Nx > 0 && o.Ny > 0 {
		opt.Nx, opt.Ny = o.Nx, o.Ny
	}
	out, err := engine.Solve(p, opt)
	if err != nil {
		return nil, nil, err
	}
	return p, out, nil
}

func exportCall(args []safejs.Value) (map[string]any, error) {
	kind, err := stringArg(args, 0, "the kind of download", false)
	if err != nil {
		return nil, err
	}
	text, err := stringArg(args, 1, "the project JSON", false)
	if err != nil {
		return nil, err
	}
	o, err := readOptions(args, 2)
	if err != nil {
		return nil, err
	}
	return exportText(kind, text, o)
}

// exportText is the part of edgewise_export that does not read JavaScript.
func exportText(kind, text string, o callOptions) (map[string]any, error) {
	p, out, err := solveProject(text, o, false)
	if err != nil {
		return nil, err
	}
	d, err := report.Make(kind, p, out, report.PictureOptions{PixelW: o.PixelWidth, Levels: o.Levels, Profile: o.Profile})
	if err != nil {
		return nil, err
	}
	return map[string]any{"ok": true, "text": string(d.Data), "name": d.Name, "mime": d.MIME}, nil
}

func reportCall(args []safejs.Value) (map[string]any, error) {
	text, err := stringArg(args, 0, "the project JSON", false)
	if err != nil {
		return nil, err
	}
	o, err := readOptions(args, 1)
	if err != nil {
		return nil, err
	}
	return reportText(text, o)
}

// reportText is the part of edgewise_report that does not read JavaScript.
func reportText(text string, o callOptions) (map[string]any, error) {
	p, out, err := solveProject(text, o, true)
	if err != nil {
		return nil, err
	}
	rep := report.Build(p, out, o.Date, report.Version())
	if o.Profile != nil {
		rep.SetProfile(p, out, *o.Profile)
	}
	pw := o.PixelWidth
	if pw == 0 {
		pw = 560
	}
	d, err := report.Make(report.Picture, p, out, report.PictureOptions{PixelW: pw})
	if err != nil {
		return nil, err
	}
	return map[string]any{"ok": true, "report": string(rep.JSON()), "svg": string(d.Data)}, nil
}

func validateCall(args []safejs.Value) (map[string]any, error) {
	text, err := stringArg(args, 0, "the project JSON", false)
	if err != nil {
		return nil, err
	}
	return validateText(text)
}

// validateText checks a project as a solve would, without solving.
func validateText(text string) (map[string]any, error) {
	p, err := project.Decode([]byte(text))
	if err != nil {
		return nil, err
	}
	if _, err := study.FromProject(p); err != nil {
		return nil, err // a study the project keeps must fit it
	}
	if _, err := project.Compile(p); err != nil {
		return nil, err
	}
	return map[string]any{"ok": true}, nil
}
