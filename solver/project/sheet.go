package project

import "edgewise/solver/jsonlite"

// Sheet is the title block of a calculation sheet: what the printed report
// heads its pages with. Every field is optional free text; the object
// itself is optional ("sheet" in the project file).
type Sheet struct {
	Project    string `json:"project,omitempty"`
	Number     string `json:"number,omitempty"`
	PreparedBy string `json:"prepared_by,omitempty"`
	CheckedBy  string `json:"checked_by,omitempty"`
	Date       string `json:"date,omitempty"`
	Revision   string `json:"revision,omitempty"`
}

// sheetKeys are the title block's keys in the file, in the order written.
var sheetKeys = []string{"project", "number", "prepared_by", "checked_by", "date", "revision"}

// fields returns pointers to the fields in the order of sheetKeys.
func (s *Sheet) fields() []*string {
	return []*string{&s.Project, &s.Number, &s.PreparedBy, &s.CheckedBy, &s.Date, &s.Revision}
}

// sheet reads the optional title block: an object of optional texts, no
// other keys.
func (d *decoder) sheet(v any) *Sheet {
	m := d.object(v, "sheet", nil, sheetKeys...)
	if m == nil {
		return nil
	}
	s := &Sheet{}
	for i, f := range s.fields() {
		if t, ok := m[sheetKeys[i]]; ok {
			*f = d.text(t, "sheet."+sheetKeys[i])
		}
	}
	return s
}

// write puts the title block's non-empty fields into w as an object.
func (s *Sheet) write(w *jsonlite.Writer) {
	w.Open('{')
	for i, f := range s.fields() {
		if *f != "" {
			w.Key(sheetKeys[i]).Str(*f)
		}
	}
	w.Close('}')
}
