package expr

import (
	"math"
	"strconv"
	"unicode/utf8"
)

// tokKind is the kind of a token.
type tokKind int

const (
	tEOF    tokKind = iota // end of the formula
	tNum                   // number literal: 12, 0.5, 1.5e-3, .5
	tName                  // name: letters, digits and _, starting with a letter or _
	tPlus                  // +
	tMinus                 // -
	tStar                  // *
	tSlash                 // /
	tCaret                 // ^
	tLParen                // (
	tRParen                // )
	tComma                 // ,
	tLT                    // <
	tLE                    // <=
	tGT                    // >
	tGE                    // >=
)

var tokText = [...]string{
	tEOF: "end of formula", tNum: "number", tName: "name",
	tPlus: "+", tMinus: "-", tStar: "*", tSlash: "/", tCaret: "^",
	tLParen: "(", tRParen: ")", tComma: ",",
	tLT: "<", tLE: "<=", tGT: ">", tGE: ">=",
}

// token is one lexical token; pos is its byte offset in the source.
type token struct {
	kind tokKind
	pos  int
	text string  // source text of the token
	val  float64 // value of a tNum
}

// describe names a token for an error message.
func (t token) describe() string {
	switch t.kind {
	case tEOF:
		return "the end of the formula"
	case tNum:
		return "number " + strconv.Quote(t.text)
	case tName:
		return "name " + strconv.Quote(t.text)
	}
	return strconv.Quote(tokText[t.kind])
}

// scanner splits a formula into tokens. It keeps only a byte offset; the
// column is worked out when an error is reported.
type scanner struct {
	src string
	off int
}

func isDigit(c byte) bool  { return '0' <= c && c <= '9' }
func isLetter(c byte) bool { return 'a' <= c && c <= 'z' || 'A' <= c && c <= 'Z' || c == '_' }

// lookalikes are characters that are easy to paste from a word processor,
// with what to write instead.
var lookalikes = map[rune]string{
	'π': "pi", '−': "-", '–': "-", '×': "*", '·': "*", '÷': "/",
	'≤': "<=", '≥': ">=", '²': "^2", '³': "^3",
}

// next returns the next token. Malformed input stops compilation with an
// error at the offending byte.
func (s *scanner) next() token {
	src := s.src
	for s.off < len(src) {
		c := src[s.off]
		if c != ' ' && c != '\t' && c != '\n' && c != '\r' {
			break
		}
		s.off++
	}
	start := s.off
	if start >= len(src) {
		return token{kind: tEOF, pos: start}
	}
	c := src[start]
	one := func(k tokKind) token {
		s.off++
		return token{kind: k, pos: start, text: src[start:s.off]}
	}
	switch {
	case isDigit(c) || c == '.' && start+1 < len(src) && isDigit(src[start+1]):
		return s.number()
	case isLetter(c):
		for s.off < len(src) && (isLetter(src[s.off]) || isDigit(src[s.off])) {
			s.off++
		}
		return token{kind: tName, pos: start, text: src[start:s.off]}
	}
	switch c {
	case '+':
		return one(tPlus)
	case '-':
		return one(tMinus)
	case '*':
		if start+1 < len(src) && src[start+1] == '*' {
			failAt(start, `"**" is not an operator: write ^ for powers`)
		}
		return one(tStar)
	case '/':
		return one(tSlash)
	case '^':
		return one(tCaret)
	case '(':
		return one(tLParen)
	case ')':
		return one(tRParen)
	case ',':
		if start > 0 && isDigit(src[start-1]) && start+1 < len(src) && isDigit(src[start+1]) {
			a, b := start-1, start+2
			for a > 0 && isDigit(src[a-1]) {
				a--
			}
			for b < len(src) && isDigit(src[b]) {
				b++
			}
			failAt(start, `decimal comma in %q: write %s.%s with a point (to separate arguments, put a space after the comma)`,
				src[a:b], src[a:start], src[start+1:b])
		}
		return one(tComma)
	case '<', '>':
		k := tLT
		if c == '>' {
			k = tGT
		}
		if start+1 < len(src) && src[start+1] == '=' {
			s.off += 2
			return token{kind: k + 1, pos: start, text: src[start:s.off]}
		}
		return one(k)
	case '=':
		if start+1 < len(src) && (src[start+1] == '<' || src[start+1] == '>') {
			failAt(start, "write %c= instead of =%c", src[start+1], src[start+1])
		}
		failAt(start, `"=" is not an operator: inside when(...) compare with <, <=, > or >= (computed numbers are rarely exactly equal)`)
	case '!':
		failAt(start, `"!" is not an operator: inside when(...) compare with <, <=, > or >=`)
	case ';':
		failAt(start, `";" is not a separator: separate arguments with ","`)
	}
	r, size := utf8.DecodeRuneInString(src[start:])
	if r == utf8.RuneError && size <= 1 {
		failAt(start, "unexpected byte 0x%02x (not UTF-8 text)", c)
	}
	if alt, ok := lookalikes[r]; ok {
		failAt(start, "unexpected character %q: write %s", r, alt)
	}
	failAt(start, "unexpected character %q", r)
	panic("unreachable")
}

// number scans a number literal: digits [. digits] [(e|E) [+|-] digits],
// or one starting with a point (.5).
func (s *scanner) number() token {
	src, start := s.src, s.off
	digits := func() {
		for s.off < len(src) && isDigit(src[s.off]) {
			s.off++
		}
	}
	digits()
	if s.off < len(src) && src[s.off] == '.' {
		s.off++
		digits()
	}
	if s.off < len(src) && src[s.off] == '.' {
		end := s.off + 1
		for end < len(src) && (isDigit(src[end]) || src[end] == '.') {
			end++
		}
		failAt(s.off, "malformed number %q: a second decimal point", src[start:end])
	}
	if s.off < len(src) && (src[s.off] == 'e' || src[s.off] == 'E') {
		e := s.off
		s.off++
		if s.off < len(src) && (src[s.off] == '+' || src[s.off] == '-') {
			s.off++
		}
		if s.off >= len(src) || !isDigit(src[s.off]) {
			failAt(e, "malformed number %q: the exponent has no digits (write %s*e to multiply by e)",
				src[start:s.off], src[start:e])
		}
		digits()
	}
	text := src[start:s.off]
	v, err := strconv.ParseFloat(text, 64)
	if err != nil && !math.IsInf(v, 0) && v != 0 {
		failAt(start, "malformed number %q", text) // not reached: the scan above only passes valid literals
	}
	if math.IsInf(v, 0) {
		failAt(start, "number %s is too large", text)
	}
	return token{kind: tNum, pos: start, text: text, val: v}
}
