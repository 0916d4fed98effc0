// Package jsonlite reads and writes the JSON of edgewise project and result
// files without encoding/json, whose reflection-driven code would add about
// half a megabyte to the WebAssembly engine.
//
// Parse reads strict JSON (RFC 8259) into a generic tree:
//
//	object  -> map[string]any   (a repeated key is an error)
//	array   -> []any
//	number  -> Number           (the text, so nothing is lost or rounded)
//	string  -> string
//	true, false -> bool
//	null    -> nil
//
// Errors carry the line and column. Nesting is capped at MaxDepth.
//
// Writer builds JSON text: the caller writes keys and values in order and
// the writer puts the commas.
package jsonlite

import (
	"fmt"
	"math"
	"sort"
	"strconv"
	"unicode/utf16"
	"unicode/utf8"
)

// MaxDepth caps the nesting of arrays and objects.
const MaxDepth = 64

// Number is a JSON number kept as its text.
type Number string

// Float64 returns the number's value.
func (n Number) Float64() (float64, error) { return strconv.ParseFloat(string(n), 64) }

// SyntaxError is a JSON syntax error at a 1-based line and column.
type SyntaxError struct {
	Line, Col int
	Msg       string
}

func (e *SyntaxError) Error() string {
	return fmt.Sprintf("JSON syntax error at line %d, col %d: %s", e.Line, e.Col, e.Msg)
}

type parser struct {
	s     []byte
	i     int
	depth int
}

type bailout struct{ err *SyntaxError }

// Parse reads one JSON value that fills all of data (white space aside).
func Parse(data []byte) (v any, err error) {
	p := &parser{s: data}
	defer func() {
		if r := recover(); r != nil {
			b, ok := r.(bailout)
			if !ok {
				panic(r)
			}
			v, err = nil, b.err
		}
	}()
	p.space()
	v = p.value()
	p.space()
	if p.i < len(p.s) {
		p.fail("text after the end of the JSON value")
	}
	return v, nil
}

//go:noinline
func (p *parser) fail(format string, args ...any) {
	line, col := 1, 1
	for _, b := range p.s[:min(p.i, len(p.s))] {
		if b == '\n' {
			line, col = line+1, 1
		} else if b&0xC0 != 0x80 { // count characters, not continuation bytes
			col++
		}
	}
	panic(bailout{&SyntaxError{Line: line, Col: col, Msg: fmt.Sprintf(format, args...)}})
}

func (p *parser) space() {
	for p.i < len(p.s) {
		switch p.s[p.i] {
		case ' ', '\t', '\n', '\r':
			p.i++
		default:
			return
		}
	}
}

func (p *parser) value() any {
	if p.i >= len(p.s) {
		p.fail("unexpected end of text")
	}
	switch c := p.s[p.i]; {
	case c == '{':
		return p.object()
	case c == '[':
		return p.array()
	case c == '"':
		return p.str()
	case c == '-' || (c >= '0' && c <= '9'):
		return p.number()
	case p.word("true"):
		return true
	case p.word("false"):
		return false
	case p.word("null"):
		return nil
	default:
		p.fail("unexpected character %q", rune(c))
	}
	return nil
}

func (p *parser) word(w string) bool {
	if len(p.s)-p.i >= len(w) && string(p.s[p.i:p.i+len(w)]) == w {
		p.i += len(w)
		return true
	}
	return false
}

func (p *parser) enter() {
	p.depth++
	if p.depth > MaxDepth {
		p.fail("nested more than %d levels deep", MaxDepth)
	}
}

func (p *parser) object() map[string]any {
	p.enter()
	p.i++ // {
	m := map[string]any{}
	p.space()
	if p.i < len(p.s) && p.s[p.i] == '}' {
		p.i++
		p.depth--
		return m
	}
	for {
		p.space()
		if p.i >= len(p.s) || p.s[p.i] != '"' {
			p.fail("expected a key in double quotes")
		}
		at := p.i
		k := p.str()
		if _, dup := m[k]; dup {
			p.i = at
			p.fail("the key %q appears twice", k)
		}
		p.space()
		if p.i >= len(p.s) || p.s[p.i] != ':' {
			p.fail("expected ':' after the key %q", k)
		}
		p.i++
		p.space()
		m[k] = p.value()
		p.space()
		if p.i < len(p.s) && p.s[p.i] == ',' {
			p.i++
			continue
		}
		if p.i < len(p.s) && p.s[p.i] == '}' {
			p.i++
			p.depth--
			return m
		}
		p.fail("expected ',' or '}'")
	}
}

func (p *parser) array() []any {
	p.enter()
	p.i++ // [
	a := []any{}
	p.space()
	if p.i < len(p.s) && p.s[p.i] == ']' {
		p.i++
		p.depth--
		return a
	}
	for {
		p.space()
		a = append(a, p.value())
		p.space()
		if p.i < len(p.s) && p.s[p.i] == ',' {
			p.i++
			continue
		}
		if p.i < len(p.s) && p.s[p.i] == ']' {
			p.i++
			p.depth--
			return a
		}
		p.fail("expected ',' or ']'")
	}
}

func (p *parser) number() Number {
	start := p.i
	digits := func() int {
		n := 0
		for p.i < len(p.s) && p.s[p.i] >= '0' && p.s[p.i] <= '9' {
			p.i++
			n++
		}
		return n
	}
	if p.s[p.i] == '-' {
		p.i++
	}
	if p.i < len(p.s) && p.s[p.i] == '0' {
		p.i++
		if p.i < len(p.s) && p.s[p.i] >= '0' && p.s[p.i] <= '9' {
			p.fail("a number may not start with 0")
		}
	} else if digits() == 0 {
		p.fail("expected a digit")
	}
	if p.i < len(p.s) && p.s[p.i] == '.' {
		p.i++
		if digits() == 0 {
			p.fail("expected a digit after the decimal point")
		}
	}
	if p.i < len(p.s) && (p.s[p.i] == 'e' || p.s[p.i] == 'E') {
		p.i++
		if p.i < len(p.s) && (p.s[p.i] == '+' || p.s[p.i] == '-') {
			p.i++
		}
		if digits() == 0 {
			p.fail("expected a digit in the exponent")
		}
	}
	return Number(p.s[start:p.i])
}

func (p *parser) str() string {
	p.i++ // opening quote
	var out []byte
	for p.i < len(p.s) {
		c := p.s[p.i]
		switch {
		case c == '"':
			p.i++
			return string(out)
		case c >= 0x20 && c != '\\' && c < utf8.RuneSelf:
			out = append(out, c)
			p.i++
		default:
			out = p.strSpecial(out, c)
		}
	}
	p.fail("text in quotes is not closed")
	return ""
}

// strSpecial reads for str the character at p.i that is not plain ASCII
// (an escape, a control character or a multi-byte one), appends it to out
// and returns out. It is a function of its own to keep the loop of str
// small (see the package doc of edgewise/solver, Loops in functions of
// their own).
//
//go:noinline
func (p *parser) strSpecial(out []byte, c byte) []byte {
	switch {
	case c < 0x20:
		p.fail("control character in text (write \\n or \\t)")
	case c == '\\':
		p.i++
		if p.i >= len(p.s) {
			p.fail("text in quotes is not closed")
		}
		e := p.s[p.i]
		p.i++
		switch e {
		case '"', '\\', '/':
			out = append(out, e)
		case 'b':
			out = append(out, '\b')
		case 'f':
			out = append(out, '\f')
		case 'n':
			out = append(out, '\n')
		case 'r':
			out = append(out, '\r')
		case 't':
			out = append(out, '\t')
		case 'u':
			r := p.hex4()
			if utf16.IsSurrogate(r) {
				// a pair makes one character; a lone half is U+FFFD and
				// what follows it is read on its own
				pair := utf8.RuneError
				if p.i+1 < len(p.s) && p.s[p.i] == '\\' && p.s[p.i+1] == 'u' {
					at := p.i
					p.i += 2
					if pair = utf16.DecodeRune(r, p.hex4()); pair == utf8.RuneError {
						p.i = at
					}
				}
				r = pair
			}
			out = utf8.AppendRune(out, r)
		default:
			p.i -= 2
			p.fail("unknown escape %q after a backslash", rune(e))
		}
	default:
		r, size := utf8.DecodeRune(p.s[p.i:])
		if r == utf8.RuneError && size == 1 {
			p.fail("text is not valid UTF-8")
		}
		out = append(out, p.s[p.i:p.i+size]...)
		p.i += size
	}
	return out
}

func (p *parser) hex4() rune {
	if len(p.s)-p.i < 4 {
		p.fail("\\u needs four hex digits")
	}
	v, err := strconv.ParseUint(string(p.s[p.i:p.i+4]), 16, 32)
	if err != nil {
		p.fail("\\u needs four hex digits")
	}
	p.i += 4
	return rune(v)
}

// Writer builds JSON text. Values written after Key or inside an array
// get their separators automatically.
//
// Its methods are marked //go:noinline, as are the error helpers of the
// parsers: inlined at the hundreds of calls of the result, report and
// project writers they made the WebAssembly engine about 0.17 MB larger,
// for no speed that matters there.
type Writer struct {
	b     []byte
	first []bool // per open container: nothing written yet
	key   bool   // a key was just written
}

// Bytes returns the text written so far.
func (w *Writer) Bytes() []byte { return w.b }

//go:noinline
func (w *Writer) sep() {
	if w.key {
		w.key = false
		return
	}
	if n := len(w.first); n > 0 {
		if !w.first[n-1] {
			w.b = append(w.b, ',')
		}
		w.first[n-1] = false
	}
}

// Open starts an object ('{') or an array ('[').
//
//go:noinline
func (w *Writer) Open(c byte) *Writer {
	w.sep()
	w.b = append(w.b, c)
	w.first = append(w.first, true)
	return w
}

// Close ends the innermost object ('}') or array (']').
//
//go:noinline
func (w *Writer) Close(c byte) *Writer {
	w.b = append(w.b, c)
	w.first = w.first[:len(w.first)-1]
	return w
}

// Key writes an object key; the next value belongs to it.
//
//go:noinline
func (w *Writer) Key(k string) *Writer {
	w.sep()
	w.b = appendString(w.b, k)
	w.b = append(w.b, ':')
	w.key = true
	return w
}

// Num writes a number in the shortest form that reads back exactly; NaN
// and infinities, which JSON cannot hold, are written as null.
//
//go:noinline
func (w *Writer) Num(v float64) *Writer {
	w.sep()
	if math.IsNaN(v) || math.IsInf(v, 0) {
		w.b = append(w.b, "null"...)
		return w
	}
	if v == 0 {
		v = 0 // no "-0"
	}
	w.b = strconv.AppendFloat(w.b, v, 'g', -1, 64)
	return w
}

// Int writes an integer.
//
//go:noinline
func (w *Writer) Int(v int) *Writer {
	w.sep()
	w.b = strconv.AppendInt(w.b, int64(v), 10)
	return w
}

// Str writes a string.
//
//go:noinline
func (w *Writer) Str(s string) *Writer {
	w.sep()
	w.b = appendString(w.b, s)
	return w
}

// Bool writes true or false.
//
//go:noinline
func (w *Writer) Bool(v bool) *Writer {
	w.sep()
	w.b = strconv.AppendBool(w.b, v)
	return w
}

// Null writes null.
//
//go:noinline
func (w *Writer) Null() *Writer {
	w.sep()
	w.b = append(w.b, "null"...)
	return w
}

const hexDigits = "0123456789abcdef"

// appendString writes s in quotes, escaping what JSON requires and also
// <, > and & (so the text is safe inside an HTML script element) and the
// line separators U+2028 and U+2029.
func appendString(b []byte, s string) []byte {
	b = append(b, '"')
	for i := 0; i < len(s); {
		if c := s[i]; c >= 0x20 && c < utf8.RuneSelf && c != '"' && c != '\\' && c != '<' && c != '>' && c != '&' {
			b = append(b, c)
			i++
			continue
		}
		b, i = appendSpecial(b, s, i)
	}
	return append(b, '"')
}

// appendSpecial writes for appendString the character at s[i] that needs
// care (escaped, or more than one byte) and returns b and the index after
// it. It is a function of its own to keep the loop of appendString small
// (see the package doc of edgewise/solver, Loops in functions of their
// own).
//
//go:noinline
func appendSpecial(b []byte, s string, i int) ([]byte, int) {
	c := s[i]
	if c < utf8.RuneSelf {
		switch {
		case c == '"' || c == '\\':
			b = append(b, '\\', c)
		case c == '\n':
			b = append(b, '\\', 'n')
		case c == '\r':
			b = append(b, '\\', 'r')
		case c == '\t':
			b = append(b, '\\', 't')
		case c < 0x20 || c == '<' || c == '>' || c == '&':
			b = append(b, '\\', 'u', '0', '0', hexDigits[c>>4], hexDigits[c&0xF])
		default:
			b = append(b, c)
		}
		return b, i + 1
	}
	r, size := utf8.DecodeRuneInString(s[i:])
	switch {
	case r == utf8.RuneError && size == 1:
		b = append(b, `\ufffd`...)
	case r == '\u2028' || r == '\u2029':
		b = append(b, '\\', 'u', '2', '0', '2', hexDigits[r&0xF])
	default:
		b = append(b, s[i:i+size]...)
	}
	return b, i + size
}

// Value writes a tree that Parse returned (objects, arrays, strings,
// Numbers, booleans and nil), object keys in sorted order, so that the
// same tree always gives the same text. It returns an error for a Number
// that float64 cannot hold (it would not read back the same) and for a
// value Parse never returns.
func (w *Writer) Value(v any) error {
	switch x := v.(type) {
	case nil:
		w.Null()
	case bool:
		w.Bool(x)
	case string:
		w.Str(x)
	case Number:
		f, err := x.Float64()
		if err != nil {
			return fmt.Errorf("number %s: %v", x, err)
		}
		w.Num(f)
	case []any:
		w.Open('[')
		for _, e := range x {
			if err := w.Value(e); err != nil {
				return err
			}
		}
		w.Close(']')
	case map[string]any:
		keys := make([]string, 0, len(x))
		for k := range x {
			keys = append(keys, k)
		}
		sort.Strings(keys)
		w.Open('{')
		for _, k := range keys {
			w.Key(k)
			if err := w.Value(x[k]); err != nil {
				return err
			}
		}
		w.Close('}')
	default:
		return fmt.Errorf("jsonlite: a value of type %T is not a JSON value", v)
	}
	return nil
}
