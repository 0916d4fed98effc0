package study

import (
	"bytes"
	"encoding/csv"
	"testing"
)

// AppendCSV writes what encoding/csv writes, field for field.
func TestAppendCSV(t *testing.T) {
	records := [][]string{
		{"row", "h_top", "max.value", "error"},
		{"0", "5", "120.00000000000566", ""},
		{"1", "", "", `edges.top.h: must be at least 0, got -1 (a "negative" value)`},
		{" lead", "\ttab", `\.`, "a\nb", "c\r\nd", "é", "\u00a0nbsp", `"`, ","},
		{""},
	}
	var want bytes.Buffer
	w := csv.NewWriter(&want)
	if err := w.WriteAll(records); err != nil {
		t.Fatal(err)
	}
	var got []byte
	for _, r := range records {
		got = AppendCSV(got, r)
	}
	if string(got) != want.String() {
		t.Errorf("AppendCSV:\n%q\nencoding/csv:\n%q", got, want.String())
	}
}
