package expr

import (
	"errors"
	"fmt"
	"strings"
)

// Error is a compile error at byte column Col (1-based) of the source.
// Col is at most len(src)+1 (one past the end, for "the formula ends here").
type Error struct {
	Col int
	Msg string
}

func (e *Error) Error() string { return fmt.Sprintf("col %d: %s", e.Col, e.Msg) }

// bailout is the parser's private panic value. Only the exported entry
// points recover it, and they recover nothing else.
type bailout struct{ err *Error }

// failAt stops compilation with an error at byte offset off (0-based).
//
//go:noinline
func failAt(off int, format string, args ...any) {
	panic(bailout{&Error{Col: off + 1, Msg: fmt.Sprintf(format, args...)}})
}

// catch turns a bailout into an error; any other panic keeps going.
func catch(err *error) {
	if r := recover(); r != nil {
		b, ok := r.(bailout)
		if !ok {
			panic(r)
		}
		*err = b.err
	}
}

// Caret returns the two lines a page shows for an error from Compile: the
// source line holding the error column, and a line with a caret under that
// column. Tabs before the column are kept in the caret line so that it lines
// up under any tab width; every other character (a multi-byte one counts
// once) becomes one space. If err is not an *Error, Caret returns the first
// line of src and an empty caret.
func Caret(src string, err error) (line, caret string) {
	var e *Error
	if !errors.As(err, &e) {
		line, _, _ = strings.Cut(src, "\n")
		return strings.TrimSuffix(line, "\r"), ""
	}
	off := min(max(e.Col-1, 0), len(src))
	start := strings.LastIndexByte(src[:off], '\n') + 1
	end := strings.IndexByte(src[off:], '\n')
	if end < 0 {
		end = len(src)
	} else {
		end += off
	}
	line = strings.TrimSuffix(src[start:end], "\r")
	var b strings.Builder
	for _, r := range src[start:off] {
		if r == '\t' {
			b.WriteByte('\t')
		} else {
			b.WriteByte(' ')
		}
	}
	b.WriteByte('^')
	return line, b.String()
}

// suggest returns the known name closest to name, or "" if none is close
// enough to be a likely typo: the same letters in another case, or one edit
// away for names of three or more letters, or two edits away for names of
// five or more. Ties prefer a candidate of the same length, then the first
// in alphabetical order.
func suggest(name string, known []string) string {
	best, bestD := "", 1<<30
	for _, k := range known {
		d := editDistance(name, k)
		if strings.EqualFold(name, k) {
			d = 0
		}
		switch {
		case d == 0:
		case d == 1 && len(name) >= 3:
		case d == 2 && len(name) >= 5:
		default:
			continue
		}
		better := d < bestD ||
			d == bestD && (len(k) == len(name)) && len(best) != len(name) ||
			d == bestD && (len(k) == len(name)) == (len(best) == len(name)) && k < best
		if better {
			best, bestD = k, d
		}
	}
	return best
}

// editDistance is the Levenshtein distance between two short ASCII names.
func editDistance(a, b string) int {
	prev := make([]int, len(b)+1)
	cur := make([]int, len(b)+1)
	for j := range prev {
		prev[j] = j
	}
	for i := 1; i <= len(a); i++ {
		cur[0] = i
		for j := 1; j <= len(b); j++ {
			cost := 1
			if a[i-1] == b[j-1] {
				cost = 0
			}
			cur[j] = min(prev[j]+1, cur[j-1]+1, prev[j-1]+cost)
		}
		prev, cur = cur, prev
	}
	return prev[len(b)]
}
