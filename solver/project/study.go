package project

import (
	"sort"

	"edgewise/solver/jsonlite"
)

// The optional "study" key of a project keeps a study file (schema
// "edgewise-study/1", package study) with the project, so that a saved
// project, a share link and the page's autosave carry it. This package
// checks only that it is an object and keeps it as canonical JSON text
// (keys sorted, numbers in the shortest exact form); package study, which
// knows the study format, checks it against the project (study.Decode,
// study.CheckProject).

// studyText reads the "study" value: an object, kept as canonical JSON.
func (d *decoder) studyText(v any) string {
	if _, ok := v.(map[string]any); !ok {
		d.fail("study", "expected a study object {\"schema\": \"edgewise-study/1\", ...}, got %s", describe(v))
		return ""
	}
	var w jsonlite.Writer
	if !writeValue(&w, v) {
		d.fail("study", "holds a number JSON cannot keep exactly")
		return ""
	}
	return string(w.Bytes())
}

// writeValue writes a value of jsonlite.Parse back as JSON.
func writeValue(w *jsonlite.Writer, v any) bool {
	switch x := v.(type) {
	case map[string]any:
		keys := make([]string, 0, len(x))
		for k := range x {
			keys = append(keys, k)
		}
		sort.Strings(keys)
		w.Open('{')
		for _, k := range keys {
			w.Key(k)
			if !writeValue(w, x[k]) {
				return false
			}
		}
		w.Close('}')
	case []any:
		w.Open('[')
		for _, e := range x {
			if !writeValue(w, e) {
				return false
			}
		}
		w.Close(']')
	case jsonlite.Number:
		f, err := x.Float64()
		if err != nil {
			return false
		}
		w.Num(f)
	case string:
		w.Str(x)
	case bool:
		w.Bool(x)
	case nil:
		w.Null()
	default:
		return false
	}
	return true
}

// writeStudy writes the "study" key when the project has a study.
func (p *Project) writeStudy(w *jsonlite.Writer) {
	if p.Study == "" {
		return
	}
	v, err := jsonlite.Parse([]byte(p.Study))
	if err != nil {
		panic("project: study text is not JSON: " + err.Error())
	}
	w.Key("study")
	writeValue(w, v)
}
