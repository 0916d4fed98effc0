package study

import (
	"strings"
	"unicode"
	"unicode/utf8"
)

// AppendCSV appends record as one CSV line ending in "\n", exactly as
// encoding/csv's Writer writes it with its defaults (the runner's output),
// without that package: the WebAssembly bridge formats the page's study
// download with it and stays smaller.
func AppendCSV(b []byte, record []string) []byte {
	for i, f := range record {
		if i > 0 {
			b = append(b, ',')
		}
		if !needsQuotes(f) {
			b = append(b, f...)
			continue
		}
		b = append(b, '"')
		b = append(b, strings.ReplaceAll(f, `"`, `""`)...)
		b = append(b, '"')
	}
	return append(b, '\n')
}

// needsQuotes is encoding/csv's rule for a comma-separated field.
func needsQuotes(f string) bool {
	if f == "" {
		return false
	}
	if f == `\.` || strings.ContainsAny(f, ",\"\r\n") {
		return true
	}
	r, _ := utf8.DecodeRuneInString(f)
	return unicode.IsSpace(r)
}
