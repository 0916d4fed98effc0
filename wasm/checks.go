//go:build js && wasm

package main

// The checks functions run the published check cases (package verify) for
// the page's checks panel:
//
//	edgewise_checks(checksJSON) -> {ok, cases: "[{id, title, source, basis}, ...]"}
//	edgewise_check(checksJSON, id) -> {ok, outcome: "<verify.Outcome JSON>"}
//
// The file is parsed (strictly) on every call; a case is solved on the
// bridge's one Solver.

import (
	"fmt"

	"edgewise/solver/jsonlite"
	"edgewise/solver/verify"

	"github.com/hack-pad/safejs"
)

func checksCall(args []safejs.Value) (map[string]any, error) {
	text, err := stringArg(args, 0, "the checks file", false)
	if err != nil {
		return nil, err
	}
	return checksText(text)
}

// checksText lists the cases of a checks file.
func checksText(text string) (map[string]any, error) {
	f, err := verify.Parse([]byte(text))
	if err != nil {
		return nil, err
	}
	var w jsonlite.Writer
	w.Open('[')
	for _, c := range f.Cases {
		w.Open('{').Key("id").Str(c.ID).Key("title").Str(c.Title).Key("source").Str(c.Source).Key("basis").Str(c.Basis).Key("kind").Str(c.Kind).Close('}')
	}
	w.Close(']')
	return map[string]any{"ok": true, "cases": string(w.Bytes())}, nil
}

func checkCall(args []safejs.Value) (map[string]any, error) {
	text, err := stringArg(args, 0, "the checks file", false)
	if err != nil {
		return nil, err
	}
	id, err := stringArg(args, 1, "the case id", false)
	if err != nil {
		return nil, err
	}
	return checkText(text, id)
}

// checkText runs one case of a checks file.
func checkText(text, id string) (map[string]any, error) {
	f, err := verify.Parse([]byte(text))
	if err != nil {
		return nil, err
	}
	c := f.Find(id)
	if c == nil {
		return nil, fmt.Errorf("checks: no case %q", id)
	}
	o := c.Run(&engine)
	return map[string]any{"ok": true, "outcome": string(o.JSON())}, nil
}
