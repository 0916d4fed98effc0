package export

import (
	"strings"
	"unicode"
	"unicode/utf8"
)

// appendText appends user text as one CSV cell: guarded against formula
// injection (see guard), then quoted as RFC 4180 asks when it holds a
// comma, a quote, a line break or leading space, or when the guard changed
// it. Inside quotes a quote is doubled and a line feed is written CRLF, as
// in the rest of the file (a lone carriage return is dropped).
func appendText(b []byte, s string) []byte {
	g, guarded := guard(s)
	if !guarded && !needsQuotes(g) {
		return append(b, g...)
	}
	b = append(b, '"')
	for i := 0; i < len(g); i++ {
		switch c := g[i]; c {
		case '"':
			b = append(b, '"', '"')
		case '\r':
		case '\n':
			b = append(b, '\r', '\n')
		default:
			b = append(b, c)
		}
	}
	return append(b, '"')
}

// needsQuotes reports whether a cell must be quoted to read back unchanged.
func needsQuotes(s string) bool {
	if s == "" {
		return false
	}
	if strings.ContainsAny(s, ",\"\r\n") {
		return true
	}
	r, _ := utf8.DecodeRuneInString(s)
	return unicode.IsSpace(r)
}

// guard neutralises text that a spreadsheet could run as a formula,
// whatever separator the spreadsheet splits lines on. The text is cut into
// pieces at every comma, semicolon, tab, carriage return and line feed
// (the separators spreadsheets offer or split rows on); a piece whose first
// character after any spaces (Unicode spaces too, such as the no-break
// space U+00A0 and the ideographic space U+3000, and the invisible U+200B
// and U+FEFF) is a formula starter gets an apostrophe in front, the usual
// rule: the spreadsheet then shows the text instead of running it. Formula
// starters are = + - @, their full-width forms U+FF1D U+FF0B U+FF0D U+FF20,
// the minus sign U+2212, and tab, carriage return and line feed (a cell
// that starts a new line). The result reports whether anything changed.
func guard(s string) (string, bool) {
	var b []byte // nil until the first apostrophe
	start := 0   // byte offset of the current piece
	last := 0    // bytes of s already copied to b
	for start <= len(s) {
		if starter(s[start:]) {
			if b == nil {
				b = make([]byte, 0, len(s)+4)
			}
			b = append(b, s[last:start]...)
			b = append(b, '\'')
			last = start
		}
		// the next piece starts after the next separator
		k := strings.IndexAny(s[start:], ",;\t\r\n")
		if k < 0 {
			break
		}
		start += k + 1
	}
	if b == nil {
		return s, false
	}
	return string(append(b, s[last:]...)), true
}

// starter reports whether the piece s, after its leading spaces, starts
// with a formula starter (see guard).
func starter(s string) bool {
	for _, r := range s {
		switch r {
		case '=', '+', '-', '@', '\uFF1D', '\uFF0B', '\uFF0D', '\uFF20', '\u2212', '\t', '\r', '\n':
			return true
		case '\u200B', '\uFEFF':
			continue
		}
		if !unicode.IsSpace(r) {
			return false
		}
	}
	return false
}
