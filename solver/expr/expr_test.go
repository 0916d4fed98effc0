package expr

import (
	"errors"
	"math"
	"math/rand/v2"
	"strconv"
	"strings"
	"sync"
	"testing"
)

// edgeVars is the variable list the engine passes.
var edgeVars = []string{"x", "y", "s", "W", "H"}

// at is a point used by the value tests: x = 0.1, y = 0.2, s = 0.3, W = 0.4, H = 0.15.
var at = []float64{0.1, 0.2, 0.3, 0.4, 0.15}

func mustCompile(t testing.TB, src string) *Expr {
	t.Helper()
	e, err := Compile(src, edgeVars...)
	if err != nil {
		t.Fatalf("Compile(%q): %v", src, err)
	}
	return e
}

// TestValues checks evaluation against values worked out by hand (exact
// arithmetic identities; no reference library needed). Tolerance 1e-12
// relative: each case is a few roundings of numbers of order 1-500.
func TestValues(t *testing.T) {
	tests := []struct {
		name, src string
		want      float64
	}{
		// precedence and associativity
		{"minus binds looser than power", "-2^2", -4},
		{"power tower reads from the top", "2^3^2", 512},
		{"sign after operator", "2*-3", -6},
		{"negative exponent", "2^-1", 0.5},
		{"negative base in parentheses", "(-2)^2", 4},
		{"minus squared variable", "-x^2", -0.01},
		{"double minus", "--3", 3},
		{"minus minus", "5 - -3", 8},
		{"unary plus", "+2 * +3", 6},
		{"left-assoc minus", "10 - 4 - 3", 3},
		{"left-assoc divide", "8 / 4 / 2", 1},
		{"product before sum", "1 + 2*3", 7},
		{"power before product", "2*3^2", 18},
		{"minus before product", "-2*3", -6},
		{"power of power in parens", "(2^3)^2", 64},
		{"exponent with minus and power", "2^-1^2", 0.5}, // 2^(-(1^2))
		{"numbers", "12 + 0.5 + 1.5e-3 + .25 + 2.", 14.7515},
		{"exponent forms", "1E2 + 1e+1 + 1e-1", 110.1},
		{"spaces and tabs", " \t1+\n2 ", 3},
		// variables and constants
		{"design example", "180 - 40*(2*s/W - 1)^2", 170}, // 2*0.3/0.4 - 1 = 0.5
		{"all variables", "x + y + s + W + H", 1.15},
		{"pi", "pi", math.Pi},
		{"e", "e", math.E},
		// conditional
		{"when true", "when(s < 0.5, 1, 2)", 1},
		{"when false", "when(s > 0.5, 1, 2)", 2},
		{"when boundary <=", "when(s <= 0.3, 1, 2)", 1},
		{"when boundary <", "when(s < 0.3, 1, 2)", 2},
		{"when boundary >=", "when(s >= 0.3, 1, 2)", 1},
		{"when chain inside", "when(0.2 < s < 0.4, 1, 2)", 1},
		{"when chain outside", "when(0.2 < s < 0.25, 1, 2)", 2},
		{"when many branches", "when(s < 0.1, 1, s < 0.35, 2, 3)", 2},
		{"when last branch", "when(s < 0.1, 1, s < 0.2, 2, 3)", 3},
		{"when in parentheses", "when((s < 1), 1, 2)", 1},
		// steps
		{"rise sharp below", "rise(s, 0.31)", 0},
		{"rise sharp at", "rise(s, 0.3)", 1},
		{"rise smooth middle", "rise(s, 0.3, 0.1)", 0.5},
		{"rise smooth quarter", "rise(s, 0.325, 0.1)", 0.15625}, // u = 0.25: 3/16 - 2/64 = 0.15625
		{"rise smooth below", "rise(s, 0.5, 0.1)", 0},
		{"rise smooth above", "rise(s, 0.1, 0.1)", 1},
		// piecewise-linear readings
		{"readings between", "readings(s, 0, 10, 0.4, 30)", 25},
		{"readings at a point", "readings(s, 0, 10, 0.3, 17, 0.4, 30)", 17},
		{"readings before first", "readings(s, 0.35, 10, 0.4, 30)", 10},
		{"readings after last", "readings(s, 0, 10, 0.2, 30)", 30},
		{"readings many points", "readings(s, 0, 0, 0.1, 1, 0.2, 2, 0.25, 5, 0.35, 10, 0.5, 0)", 7.5},
		{"readings points from constants", "readings(s, 0, 10, pi/4 - 0.5*pi/4 + 0.4 - pi/8, 30)", 25},
		// functions of two or more arguments
		{"min", "min(3, x, 2)", 0.1},
		{"max", "max(3, x, 2)", 3},
		{"atan2 quadrant", "atan2(1, -1)", 3 * math.Pi / 4},
	}
	for _, tc := range tests {
		t.Run(tc.name, func(t *testing.T) {
			got := mustCompile(t, tc.src).Eval(at)
			if math.Abs(got-tc.want) > 1e-12*max(1, math.Abs(tc.want)) {
				t.Errorf("%s = %.17g, want %.17g", tc.src, got, tc.want)
			}
		})
	}
}

// TestErrors checks the whole message, column included.
// At the limits a formula compiles: exactly MaxLen (4096) bytes, and
// exactly MaxDepth (40) levels of parentheses, of signs, of calls and of
// powers. TestErrors refuses one past each.
func TestLimitsExactlyAt(t *testing.T) {
	if MaxLen != 4096 || MaxDepth != 40 {
		t.Fatalf("MaxLen %d, MaxDepth %d: the README states 4096 bytes and 40 levels", MaxLen, MaxDepth)
	}
	for _, c := range []struct {
		name, src string
		want      float64
	}{
		{"length", "1+" + strings.Repeat(" ", MaxLen-3) + "2", 3},
		{"parentheses", strings.Repeat("(", MaxDepth) + "7" + strings.Repeat(")", MaxDepth), 7},
		{"signs", strings.Repeat("-", MaxDepth) + "7", 7},
		{"calls", strings.Repeat("abs(", MaxDepth) + "7" + strings.Repeat(")", MaxDepth), 7},
		{"powers", strings.Repeat("1^", MaxDepth) + "1", 1},
		{"mixed", strings.Repeat("-(", MaxDepth/2) + "7" + strings.Repeat(")", MaxDepth/2), 7},
	} {
		x, err := Compile(c.src, edgeVars...)
		if err != nil {
			t.Errorf("%s (%d bytes): %v", c.name, len(c.src), err)
			continue
		}
		if got := x.Eval(at); got != c.want {
			t.Errorf("%s: %v, want %v", c.name, got, c.want)
		}
	}
}

func TestErrors(t *testing.T) {
	tests := []struct{ src, want string }{
		// errors
		{"", `col 1: empty formula`},
		{"   ", `col 1: empty formula`},
		{"1 + sinn(x)", `col 5: unknown name "sinn" (did you mean sinh?)`},
		{"sinn(x)", `col 1: unknown name "sinn" (did you mean sinh?)`}, // sin and sinh are both one edit away: same length wins
		{"sinn", `col 1: unknown name "sinn" (did you mean sinh?)`},
		{"2*Sin(x)", `col 3: unknown name "Sin" (did you mean sin?)`},
		{"w", `col 1: unknown name "w" (did you mean W?)`},
		{"q", `col 1: unknown name "q"`},
		{"log(x)", `col 1: unknown name "log" (write ln for the natural logarithm or log10 for base 10)`},
		{"if(x < 1, 2, 3)", `col 1: unknown name "if" (write when(condition, value, otherwise))`},
		{"2*PI", `col 3: unknown name "PI" (write pi)`},
		{"arctan(x)", `col 1: unknown name "arctan" (did you mean atan?)`},
		{"(1+2", `col 5: missing ")" to close the "(" at col 1`},
		{"sin(x", `col 6: missing ")" to close the "(" at col 4`},
		{"(1 2)", `col 4: missing operator before number "2" (multiplication needs *)`},
		{"1+2)", `col 4: unexpected ")" with no "(" to close`},
		{"1 + 2 3", `col 7: missing operator before number "3" (multiplication needs *)`},
		{"2x", `col 2: missing operator before name "x" (multiplication needs *)`},
		{"2(x+1)", `col 2: missing operator before "(" (multiplication needs *)`},
		{"1 +", `col 4: expected a number, name or "(" but the formula ends here`},
		{"*2", `col 1: expected a number, name or "(", found "*"`},
		{"()", `col 2: expected a number, name or "(", found ")"`},
		{"1.2.3", `col 4: malformed number "1.2.3": a second decimal point`},
		{"2e", `col 2: malformed number "2e": the exponent has no digits (write 2*e to multiply by e)`},
		{"1e+", `col 2: malformed number "1e+": the exponent has no digits (write 1*e to multiply by e)`},
		{"1e999", `col 1: number 1e999 is too large`},
		{"0,5", `col 2: decimal comma in "0,5": write 0.5 with a point (to separate arguments, put a space after the comma)`},
		{"max(10,25)", `col 7: decimal comma in "10,25": write 10.25 with a point (to separate arguments, put a space after the comma)`},
		{"0, 5", `col 2: unexpected "," outside a function call`},
		{"max(1; 2)", `col 6: ";" is not a separator: separate arguments with ","`},
		{"2**3", `col 2: "**" is not an operator: write ^ for powers`},
		{"x = 1", `col 3: "=" is not an operator: inside when(...) compare with <, <=, > or >= (computed numbers are rarely exactly equal)`},
		{"when(x => 1, 1, 2)", `col 8: write >= instead of =>`},
		{"when(x != 1, 1, 2)", `col 8: "!" is not an operator: inside when(...) compare with <, <=, > or >=`},
		{"x # 2", `col 3: unexpected character '#'`},
		{"2π", `col 2: unexpected character 'π': write pi`},
		{"1 − x", `col 3: unexpected character '−': write -`},
		{"1\xff", `col 2: unexpected byte 0xff (not UTF-8 text)`},
		{"x < 1", `col 3: a comparison (<) can only be the condition of when(...)`},
		{"1 + (x < 1)", `col 8: a comparison (<) can only be the condition of when(...)`},
		{"when(x, 1, 2)", `col 6: the condition of when must be a comparison such as s < 0.1`},
		{"when(x < 1 < 2 < 3, 1, 2)", ``}, // a chain is fine: checked below to compile
		{"when((x < 1) < 2, 1, 2)", `col 14: unexpected "<" after a comparison`},
		{"sin", `col 1: sin is a function: write sin(...)`},
		{"x(2)", `col 1: x is not a function (write x*(...) to multiply)`},
		{"pi(2)", `col 1: pi is not a function (write pi*(...) to multiply)`},
		{"foo(2)", `col 1: unknown name "foo"`},
		{"1 + min(x)", `col 5: min needs at least 2 arguments`},
		{"max()", `col 1: max needs at least 2 arguments`},
		{"sin(1, 2)", `col 1: sin takes 1 argument, got 2`},
		{"atan2(1)", `col 1: atan2 takes 2 arguments (y, x), got 1`},
		{"when(x < 1, 2)", `col 1: when takes conditions and their values in pairs, then the value otherwise: when(c, a, b) or when(c1, a1, c2, a2, b), got 2`},
		{"when(x < 1, 2, 3, 4)", `col 1: when takes conditions and their values in pairs, then the value otherwise: when(c, a, b) or when(c1, a1, c2, a2, b), got 4`},
		{"rise(x)", `col 1: rise takes 2 or 3 arguments: rise(t, at) or rise(t, at, width), got 1`},
		{"rise(x, 1, 0)", `col 12: the width of rise must be positive, got 0 (for a sharp step use rise(t, at))`},
		{"readings(s, 0, 1, 1)", `col 1: readings takes the position, then two or more points as pairs of numbers: readings(s, s1, v1, s2, v2, ...), got 4`},
		{"readings(s, 0, 1)", `col 1: readings takes the position, then two or more points as pairs of numbers: readings(s, s1, v1, s2, v2, ...), got 3`},
		{"readings(s, 0, 1, 0.5, 2, 0.5, 3)", `col 27: the positions in readings must increase: 0.5 comes after 0.5`},
		{"readings(s, 0, 1, -1, 2)", `col 19: the positions in readings must increase: -1 comes after 0`},
		{"readings(s, 0, 1, s, 2)", `col 19: the points of readings must be constant numbers (they may use pi and e, not variables)`},
		{"readings(s, 0, 1, 1, 1/0)", `col 22: the points of readings must be finite numbers, got +Inf`},
		// one past each limit (TestLimitsExactlyAt passes at them); fixed
		// bug: 40 levels were refused although 40 are allowed
		{strings.Repeat("(", MaxDepth+1) + "1" + strings.Repeat(")", MaxDepth+1), `col 42: formula nested too deeply (more than 40 levels)`},
		{strings.Repeat("-", MaxDepth+1) + "1", `col 42: formula nested too deeply (more than 40 levels)`},
		{strings.Repeat("-", 100) + "1", `col 42: formula nested too deeply (more than 40 levels)`},
		{"1" + strings.Repeat(" ", MaxLen), `col 4097: formula longer than 4096 bytes`},
		{strings.Repeat("1", MaxLen+1), `col 4097: formula longer than 4096 bytes`},
		// fixed bugs
		// A constant condition folded when(...) to one branch and skipped checking the other.
		{"when(1 < 2, 1, x < 1)", `col 18: a comparison (<) can only be the condition of when(...)`},
		{"when(2 < 1, x < 1, 1)", `col 15: a comparison (<) can only be the condition of when(...)`},
	}
	for _, tc := range tests {
		_, err := Compile(tc.src, edgeVars...)
		if tc.want == "" {
			if err != nil {
				t.Errorf("Compile(%q): %v, want no error", tc.src, err)
			}
			continue
		}
		if err == nil {
			t.Errorf("Compile(%q): no error, want %s", tc.src, tc.want)
			continue
		}
		var e *Error
		if !errors.As(err, &e) {
			t.Errorf("Compile(%q): error %T, want *Error", tc.src, err)
		}
		if err.Error() != tc.want {
			t.Errorf("Compile(%q):\n got  %s\n want %s", tc.src, err, tc.want)
		}
		if e != nil && (e.Col < 1 || e.Col > len(tc.src)+1) {
			t.Errorf("Compile(%q): col %d outside 1..%d", tc.src, e.Col, len(tc.src)+1)
		}
	}
}

// TestRestrictedVars: the engine decides which variables a formula may use.
func TestRestrictedVars(t *testing.T) {
	_, err := Compile("20 + y", "s", "W", "H")
	want := `col 6: unknown name "y" (this formula may use s, W, H, pi, e)`
	if err == nil || err.Error() != want {
		t.Errorf("got %v, want %s", err, want)
	}
	e, err := Compile("a*b", "b", "a") // order of values follows vars
	if err != nil {
		t.Fatal(err)
	}
	if got := e.Eval([]float64{2, 5}); got != 10 {
		t.Errorf("a*b with a=5, b=2: got %g, want 10", got)
	}
}

// TestCallerBugsPanic: a bad variable list is a bug in the engine, not the user's.
func TestCallerBugsPanic(t *testing.T) {
	for _, vars := range [][]string{{"x", "x"}, {"pi"}, {"sin"}, {"2x"}, {""}, {"a b"}} {
		func() {
			defer func() {
				r := recover()
				if s, ok := r.(string); !ok || !strings.HasPrefix(s, "expr: ") {
					t.Errorf("vars %q: panic %v, want an expr: panic", vars, r)
				}
			}()
			Compile("1", vars...)
		}()
	}
	e := mustCompile(t, "x")
	defer func() {
		if r := recover(); r == nil {
			t.Error("Eval with too few values did not panic")
		}
	}()
	e.Eval([]float64{1})
}

// TestMathFunctions checks every one-argument function, atan2 and ^ against
// the reference library, Go's math package, at seeded random points of
// each function's domain, both evaluated (variable argument) and folded
// (constant argument, printed with 17 digits so it reads back exactly).
func TestMathFunctions(t *testing.T) {
	rng := rand.New(rand.NewPCG(1, 2))
	domain := map[string][2]float64{
		"asin": {-1, 1}, "acos": {-1, 1}, "ln": {1e-3, 1e3}, "log10": {1e-3, 1e3}, "sqrt": {0, 100},
		"exp": {-50, 50}, "sinh": {-20, 20}, "cosh": {-20, 20},
	}
	for _, m := range math1 {
		d, ok := domain[m.name]
		if !ok {
			d = [2]float64{-10, 10}
		}
		e := mustCompile(t, m.name+"(x)")
		for range 50 {
			x := d[0] + (d[1]-d[0])*rng.Float64()
			want := m.f(x) // Go math package
			if got := e.Eval([]float64{x, 0, 0, 0, 0}); got != want {
				t.Errorf("%s(%v) = %v, math package says %v", m.name, x, got, want)
			}
			src := m.name + "(" + formatExact(x) + ")"
			if v, ok := mustCompile(t, src).Const(); !ok || v != want {
				t.Errorf("%s folded to %v, %v; math package says %v", src, v, ok, want)
			}
		}
	}
	two := mustCompile(t, "atan2(y, x)")
	pow := mustCompile(t, "x^y")
	sq := mustCompile(t, "x^2")
	for range 200 {
		x, y := 20*rng.Float64()-10, 20*rng.Float64()-10
		if got, want := two.Eval([]float64{x, y, 0, 0, 0}), math.Atan2(y, x); got != want {
			t.Errorf("atan2(%v, %v) = %v, math.Atan2 says %v", y, x, got, want)
		}
		ax := math.Abs(x)
		if got, want := pow.Eval([]float64{ax, y, 0, 0, 0}), math.Pow(ax, y); got != want {
			t.Errorf("%v^%v = %v, math.Pow says %v", ax, y, got, want)
		}
		// x^2 is compiled as x*x: correctly rounded, so within 1 ulp of math.Pow.
		if got, want := sq.Eval([]float64{x, 0, 0, 0, 0}), math.Pow(x, 2); math.Abs(got-want) > 2.3e-16*want {
			t.Errorf("%v^2 = %v, math.Pow says %v", x, got, want)
		}
	}
	// Exact identities at special points (values of elementary functions).
	for src, want := range map[string]float64{
		"sin(0)": 0, "cos(0)": 1, "exp(0)": 1, "ln(1)": 0, "log10(1000)": 3, "sqrt(16)": 4,
		"abs(-2.5)": 2.5, "floor(-2.5)": -3, "ceil(-2.5)": -2, "atan2(0, -1)": math.Pi,
		"tanh(0)": 0, "cosh(0)": 1, "ln(e)": 1,
	} {
		if v, _ := mustCompile(t, src).Const(); v != want {
			t.Errorf("%s = %v, want %v", src, v, want)
		}
	}
}

// formatExact prints x so that it reads back as exactly x (shortest
// round-trip form), in parentheses when negative.
func formatExact(x float64) string {
	s := strconv.FormatFloat(x, 'g', -1, 64)
	if strings.HasPrefix(s, "-") {
		return "(" + s + ")"
	}
	return s
}

// TestNaNNotHidden: a NaN reaching any construct comes out as NaN.
func TestNaNNotHidden(t *testing.T) {
	nan := math.NaN()
	for _, src := range []string{
		"x", "sqrt(-1) + s", "when(x < 1, 1, 2)", "when(s > 1, 1, x < 1, 2, 3)", "when(s < 1, x, 2)",
		"when(1 < x < 2, 1, 2)", "min(x, 1)", "max(1, x)", "rise(x, 1)", "rise(1, x)", "rise(s, 0, x)",
		"readings(x, 0, 1, 1, 2)", "abs(x)", "floor(x)", "x^0 * x",
	} {
		if v := mustCompile(t, src).Eval([]float64{nan, 0, 0.5, 1, 1}); !math.IsNaN(v) {
			t.Errorf("%s with x = NaN: %v, want NaN", src, v)
		}
	}
	if v, ok := mustCompile(t, "sqrt(-1)").Const(); !ok || !math.IsNaN(v) {
		t.Errorf("sqrt(-1) folded to %v, %v; want NaN constant", v, ok)
	}
	if v := mustCompile(t, "1/s").Eval([]float64{0, 0, 0, 1, 1}); !math.IsInf(v, 1) {
		t.Errorf("1/s at s = 0: %v, want +Inf", v)
	}
}

func TestConstAndUses(t *testing.T) {
	tests := []struct {
		src     string
		isConst bool
		val     float64
		uses    string
	}{
		{"35", true, 35, ""},
		{"2*pi - pi", true, math.Pi, ""},
		{"sin(pi/2) + max(1, 2, 3)", true, 4, ""},
		{"when(1 < 2, 5, s)", true, 5, ""},
		{"when(2 < 1, 5, s)", false, 0, "s"},
		{"0*x", false, 0, "x"}, // not folded: 0*Inf is NaN
		{"s/W + 2*H", false, 0, "s W H"},
		{"readings(s, 0, 1, 1, 2)", false, 0, "s"},
		{"readings(0.5, 0, 1, 1, 2)", true, 1.5, ""},
	}
	for _, tc := range tests {
		e := mustCompile(t, tc.src)
		v, ok := e.Const()
		if ok != tc.isConst || ok && math.Abs(v-tc.val) > 1e-15*math.Abs(tc.val) {
			t.Errorf("%s: Const() = %v, %v; want %v, %v", tc.src, v, ok, tc.val, tc.isConst)
		}
		for _, name := range append(edgeVars, "nope") {
			if got, want := e.Uses(name), strings.Contains(" "+tc.uses+" ", " "+name+" "); got != want {
				t.Errorf("%s: Uses(%s) = %v, want %v", tc.src, name, got, want)
			}
		}
	}
}

func TestString(t *testing.T) {
	for src, want := range map[string]string{
		"-2^2":                   "-2^2",
		"(-2)^2":                 "(-2)^2",
		"2^3^2":                  "2^3^2",
		"(2^3)^2":                "(2^3)^2",
		"2*-3":                   "2 * -3",
		"1-(2-3)":                "1 - (2 - 3)",
		"(1-2)-3":                "1 - 2 - 3",
		"a/(b*c)":                "a / (b * c)",
		"-(x+1)":                 "-(x + 1)",
		"when(0<x<=1,pi,e)":      "when(0 < x <= 1, pi, e)",
		"readings(s,0, 1, 2 ,3)": "readings(s, 0, 1, 2, 3)",
		"1.50e+3":                "1500",
	} {
		e, err := Compile(src, "a", "b", "c", "x", "s")
		if err != nil {
			t.Errorf("Compile(%q): %v", src, err)
			continue
		}
		if got := e.String(); got != want {
			t.Errorf("String of %q = %q, want %q", src, got, want)
		}
	}
}

func TestCaret(t *testing.T) {
	tests := []struct{ src, line, caret string }{
		{"1 + sinn(x)", "1 + sinn(x)", "    ^"},
		{"\t1 +", "\t1 +", "\t   ^"},
		{"π + 1 +", "π + 1 +", "       ^"}, // π is two bytes but one column on screen
		{"1 +\n2 +\n 3 x", " 3 x", "   ^"},
	}
	for _, tc := range tests {
		_, err := Compile(tc.src, edgeVars...)
		if tc.src == "π + 1 +" {
			err = &Error{Col: len(tc.src) + 1} // the scanner stops at π; check the end column
		}
		line, caret := Caret(tc.src, err)
		if line != tc.line || caret != tc.caret {
			t.Errorf("Caret(%q, %v) = %q, %q; want %q, %q", tc.src, err, line, caret, tc.line, tc.caret)
		}
	}
	if line, caret := Caret("a\nb", errors.New("other")); line != "a" || caret != "" {
		t.Errorf("Caret of a foreign error = %q, %q", line, caret)
	}
}

func TestEvalDoesNotAllocate(t *testing.T) {
	for _, src := range []string{benchFormula, benchFormula2, "readings(s, 0, 1, 0.1, 3, 0.2, 2, 0.4, 5)",
		"when(s < 0.1, 1, s < 0.2, x, rise(s, 0.3, 0.05))", deepFormula(30)} {
		e := mustCompile(t, src)
		if n := testing.AllocsPerRun(100, func() { e.Eval(at) }); n != 0 {
			t.Errorf("%s: %v allocations per Eval", src, n)
		}
	}
}

// deepFormula needs a stack deeper than smallStack.
func deepFormula(n int) string {
	return strings.Repeat("x + (", n) + "x" + strings.Repeat(")", n)
}

func TestDeepStack(t *testing.T) {
	e := mustCompile(t, deepFormula(30))
	if e.small {
		t.Fatal("expected the large stack")
	}
	if got := e.Eval(at); math.Abs(got-3.1) > 1e-14 { // 31 * 0.1
		t.Errorf("got %v, want 3.1", got)
	}
}

// TestFullStack evaluates programs up to and past a full small stack (run
// keeps the top of the stack apart and st[0] takes the empty top of the
// first push): the sums are added in the same order as the program adds
// them, so the value is exact.
func TestFullStack(t *testing.T) {
	x, y, s := at[0], at[1], at[2]
	for _, inner := range []struct {
		src string
		v   float64
	}{{"x", x}, {"when(x < y, rise(x, y, s), y)", rise(x, y, s)}} {
		full := false
		for n := 1; n <= smallStack+2; n++ {
			src := strings.Repeat("x + (", n) + inner.src + strings.Repeat(")", n)
			e := mustCompile(t, src)
			need := stackNeed(e.prog)
			full = full || need == smallStack
			if e.small != (need <= smallStack) {
				t.Errorf("%s: small stack %v for a height of %d", src, e.small, need)
			}
			want := inner.v
			for range n {
				want = x + want
			}
			if got := e.Eval(at); got != want {
				t.Errorf("%s = %v, want %v", src, got, want)
			}
		}
		if !full {
			t.Errorf("no program with %s filled the small stack exactly", inner.src)
		}
	}
}

// TestConcurrentEval is meant for -race: one Expr, many goroutines.
func TestConcurrentEval(t *testing.T) {
	e := mustCompile(t, "readings(s, 0, 1, 0.5, 3) + when(x < 0.5, sin(x), cos(x))")
	var wg sync.WaitGroup
	for g := range 4 {
		wg.Go(func() {
			for i := range 1000 {
				s := float64(i%100) / 200 // 0 .. 0.495
				x := float64(g) / 4
				want := 1 + 4*s
				if x < 0.5 {
					want += math.Sin(x)
				} else {
					want += math.Cos(x)
				}
				if got := e.Eval([]float64{x, 0, s, 1, 1}); math.Abs(got-want) > 1e-14 {
					t.Errorf("s=%v x=%v: %v, want %v", s, x, got, want)
					return
				}
			}
		})
	}
	wg.Wait()
}
