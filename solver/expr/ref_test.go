package expr

import (
	"fmt"
	"math"
	"math/rand/v2"
	"strings"
	"testing"
)

// refEval is an independent tree-walking interpreter of the documented
// semantics, written directly on the syntax tree with the Go math package.
// The compiled program (folding, fused instructions, x^2 as x*x) must give
// bit for bit the same numbers.
func refEval(n *node, vals []float64) float64 {
	arg := func(i int) float64 { return refEval(n.args[i], vals) }
	switch n.kind {
	case nNum:
		return n.val
	case nVar:
		return vals[n.idx]
	case nNeg:
		return -arg(0)
	case nBinary:
		a, b := arg(0), arg(1)
		switch n.op {
		case tPlus:
			return a + b
		case tMinus:
			return a - b
		case tStar:
			return a * b
		case tSlash:
			return a / b
		}
		if b == 2 && !refUsesVar(n.args[1]) {
			return a * a // documented: a constant exponent 2 multiplies
		}
		return math.Pow(a, b)
	case nCmp:
		r := 1.0
		for i, k := range n.cmps {
			a, b := arg(i), arg(i+1)
			switch {
			case a != a || b != b:
				r *= math.NaN()
			case k == tLT && a < b, k == tLE && a <= b, k == tGT && a > b, k == tGE && a >= b:
			default:
				r *= 0
			}
		}
		return r
	}
	switch n.name {
	case "atan2":
		return math.Atan2(arg(0), arg(1))
	case "min", "max":
		v := arg(0)
		for i := 1; i < len(n.args); i++ {
			if n.name == "min" {
				v = min(v, arg(i))
			} else {
				v = max(v, arg(i))
			}
		}
		return v
	case "when":
		for i := 0; i+1 < len(n.args); i += 2 {
			switch c := arg(i); c {
			case 1:
				return arg(i + 1)
			case 0:
			default:
				return math.NaN()
			}
		}
		return arg(len(n.args) - 1)
	case "rise":
		t, at, w := arg(0), arg(1), 0.0
		if len(n.args) == 3 {
			w = arg(2)
		}
		return rise(t, at, w)
	case "readings":
		x := arg(0)
		var xs, ys []float64
		for i := 1; i < len(n.args); i += 2 {
			xs, ys = append(xs, arg(i)), append(ys, arg(i+1))
		}
		if x != x {
			return x
		}
		if x <= xs[0] {
			return ys[0]
		}
		for i := 0; i+1 < len(xs); i++ {
			if x < xs[i+1] {
				return ys[i] + (ys[i+1]-ys[i])*((x-xs[i])/(xs[i+1]-xs[i]))
			}
		}
		return ys[len(ys)-1]
	}
	for _, m := range math1 {
		if m.name == n.name {
			return m.f(arg(0))
		}
	}
	panic("refEval: " + n.name)
}

func refUsesVar(n *node) bool {
	if n.kind == nVar {
		return true
	}
	for _, a := range n.args {
		if refUsesVar(a) {
			return true
		}
	}
	return false
}

// randFormula writes a random formula of about size nodes.
func randFormula(r *rand.Rand, size int) string {
	leaf := func() string {
		switch r.IntN(4) {
		case 0:
			return edgeVars[r.IntN(len(edgeVars))]
		case 1:
			return []string{"pi", "e", "0", "1", "2", "0.5", "3", "1e-3"}[r.IntN(8)]
		}
		return fmt.Sprint(r.IntN(20) - 5)
	}
	if size <= 1 {
		return leaf()
	}
	sub := func() string { return randFormula(r, size/2) }
	switch r.IntN(12) {
	case 0, 1, 2, 3:
		return sub() + []string{" + ", " - ", " * ", " / ", "^"}[r.IntN(5)] + sub()
	case 4:
		return "(" + sub() + ")" + []string{" + ", " - ", " * ", " / ", "^"}[r.IntN(5)] + "(" + sub() + ")"
	case 5:
		return "-" + sub()
	case 6:
		return math1[r.IntN(len(math1))].name + "(" + sub() + ")"
	case 7:
		return []string{"min", "max", "atan2"}[r.IntN(3)] + "(" + sub() + ", " + sub() + ")"
	case 8:
		return "when(" + sub() + []string{" < ", " <= ", " > ", " >= "}[r.IntN(4)] + sub() + ", " + sub() + ", " + sub() + ")"
	case 9:
		if r.IntN(2) == 0 {
			return "rise(" + sub() + ", " + sub() + ")"
		}
		return "rise(" + sub() + ", " + sub() + ", " + fmt.Sprint(0.5+float64(r.IntN(3))) + ")"
	case 10:
		return "readings(" + sub() + ", -1, 2, 0, " + fmt.Sprint(r.IntN(9)-4) + ", 0.5, 3, 2, -1)"
	}
	return "(" + sub() + ")"
}

// TestAgainstReference compares compiled evaluation with refEval on seeded
// random formulas and points, and checks that printing round-trips.
func TestAgainstReference(t *testing.T) {
	r := rand.New(rand.NewPCG(3, 4))
	compiled := 0
	for range 3000 {
		src := randFormula(r, 1+r.IntN(24))
		e, err := Compile(src, edgeVars...)
		if err != nil {
			if !strings.Contains(err.Error(), "nested too deeply") {
				t.Errorf("Compile(%q): %v", src, err)
			}
			continue
		}
		compiled++
		for range 5 {
			vals := []float64{4*r.Float64() - 2, 4*r.Float64() - 2, 4*r.Float64() - 2, 0.1 + r.Float64(), 0.1 + r.Float64()}
			got, want := e.Eval(vals), refEval(e.root, vals)
			if !same(got, want) {
				t.Fatalf("%s at %v: compiled %v, reference %v", src, vals, got, want)
			}
		}
	}
	if compiled < 2500 {
		t.Errorf("only %d of 3000 random formulas compiled", compiled)
	}
}
