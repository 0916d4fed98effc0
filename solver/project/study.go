package project

import (
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
		d.fail("study", "expected a study object {\"schema\": \"edgewise-study/1\", ...}, got %s", Describe(v))
		return ""
	}
	var w jsonlite.Writer
	if w.Value(v) != nil {
		d.fail("study", "holds a number JSON cannot keep exactly")
		return ""
	}
	return string(w.Bytes())
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
	if err := w.Value(v); err != nil {
		panic("project: study text: " + err.Error())
	}
}
