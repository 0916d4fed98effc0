package expr

import (
	"errors"
	"math"
	"strings"
	"testing"
)

// fuzzSeeds are the seed corpus of both fuzz targets; plain `go test` runs
// them as ordinary tests.
var fuzzSeeds = []string{
	"180 - 40*(2*s/W - 1)^2", "-2^2", "2^3^2", "2*-3", "2^-1^2", "--x", "(-x)^2",
	"when(0.1 < s <= 0.3, sin(pi*s/W), -1)", "when(s < 0.1, 1, s < 0.2, x, 3)",
	"rise(s, W/2)", "rise(s, W/2, 0.01)", "readings(s, 0, 20, 0.1, 35, 0.2, 31)",
	"min(x, y, s)", "max(1, 2)", "atan2(y, x)", "ln(x) + log10(y) + exp(-s)",
	"1e308*10", "1e-320", ".5 + 5.", "0,5", "max(0,5)", "1.2.3", "2x", "sinn(x)", "(((",
	")))", "", "\t", "π", "1 ≤ 2", "x <", "when(", "readings(s, 0, 1, 0, 1)", "rise(s, 0, -1)",
	"sqrt(-1)", "1/0", "0/0", "abs(floor(ceil(tanh(cosh(sinh(acos(asin(atan(tan(cos(sin(x))))))))))))",
}

// FuzzParse: Compile never panics; an error is an *Error with a column in
// 1..len+1 that Caret can show; a compiled formula prints to a form that
// compiles to the same print and the same values.
func FuzzParse(f *testing.F) {
	for _, s := range fuzzSeeds {
		f.Add(s)
	}
	f.Fuzz(func(t *testing.T, src string) {
		e, err := Compile(src, edgeVars...)
		if err != nil {
			var ce *Error
			if !errors.As(err, &ce) {
				t.Fatalf("Compile(%q): error of type %T", src, err)
			}
			if ce.Col < 1 || ce.Col > len(src)+1 {
				t.Fatalf("Compile(%q): col %d outside 1..%d", src, ce.Col, len(src)+1)
			}
			if !strings.HasPrefix(err.Error(), "col ") {
				t.Fatalf("Compile(%q): message %q", src, err)
			}
			_, caret := Caret(src, err)
			if !strings.HasSuffix(caret, "^") {
				t.Fatalf("Caret(%q): %q", src, caret)
			}
			return
		}
		printed := e.String()
		e2, err := Compile(printed, edgeVars...)
		if err != nil {
			t.Fatalf("Compile(%q) printed %q which fails: %v", src, printed, err)
		}
		if p2 := e2.String(); p2 != printed {
			t.Fatalf("print of %q is not stable: %q then %q", src, printed, p2)
		}
		for _, vals := range [][]float64{at, {-1, 2, 0.5, 1, 3}} {
			a, b := e.Eval(vals), e2.Eval(vals)
			if !same(a, b) {
				t.Fatalf("%q = %v but its print %q = %v", src, a, printed, b)
			}
		}
	})
}

// FuzzEval: evaluation never panics, agrees bit for bit with the reference
// interpreter refEval, agrees with Const for constant formulas, and does not change when a variable that Uses says is unused
// changes.
func FuzzEval(f *testing.F) {
	for i, s := range fuzzSeeds {
		f.Add(s, float64(i)/10, 0.2, 0.3, 0.4, 0.15)
	}
	f.Add("x/y", 0.0, 0.0, 0.0, 0.0, 0.0)
	f.Add("when(x < y, 1, 2)", math.NaN(), 0.0, 0.0, 0.0, 0.0)
	f.Fuzz(func(t *testing.T, src string, x, y, s, w, h float64) {
		e, err := Compile(src, edgeVars...)
		if err != nil {
			return
		}
		vals := []float64{x, y, s, w, h}
		v := e.Eval(vals)
		if want := refEval(e.root, vals); !same(v, want) {
			t.Fatalf("%q at %v: compiled %v, reference %v", src, vals, v, want)
		}
		if c, ok := e.Const(); ok && !same(c, v) {
			t.Fatalf("%q: Const %v but Eval %v", src, c, v)
		}
		for i, name := range edgeVars {
			if e.Uses(name) {
				continue
			}
			moved := append([]float64(nil), vals...)
			moved[i] = moved[i]*3 + 1
			if v2 := e.Eval(moved); !same(v, v2) {
				t.Fatalf("%q does not use %s, yet changing it changed %v to %v", src, name, v, v2)
			}
		}
	})
}

// same is equality that treats NaN as equal to NaN.
func same(a, b float64) bool { return a == b || a != a && b != b }
