package expr

import "math"

// constants are always available; a variable of the same name is a caller bug.
var constants = map[string]float64{
	"pi": math.Pi,
	"e":  math.E,
}

// function describes one built-in function.
type function struct {
	name     string
	min, max int    // argument counts; max < 0 means no upper limit
	fn1      int32  // opFn1: index into fn1
	op       op     // everything else: compiled specially
	odd      bool   // the count must be odd: a first argument, then pairs
	counts   string // what checkCount says when the count is wrong
}

// math1 lists the one-argument functions and their Go math equivalents.
var math1 = []struct {
	name string
	f    func(float64) float64
}{
	{"sin", math.Sin}, {"cos", math.Cos}, {"tan", math.Tan},
	{"asin", math.Asin}, {"acos", math.Acos}, {"atan", math.Atan},
	{"sinh", math.Sinh}, {"cosh", math.Cosh}, {"tanh", math.Tanh},
	{"exp", math.Exp}, {"ln", math.Log}, {"log10", math.Log10},
	{"sqrt", math.Sqrt}, {"abs", math.Abs}, {"floor", math.Floor}, {"ceil", math.Ceil},
}

// fn1 is indexed by the instruction argument of opFn1.
var fn1 []func(float64) float64

var functions = map[string]*function{}

func init() {
	for i, m := range math1 {
		functions[m.name] = &function{name: m.name, min: 1, max: 1, fn1: int32(i), op: opFn1, counts: "takes 1 argument"}
		fn1 = append(fn1, m.f)
	}
	for _, f := range []*function{
		{name: "atan2", min: 2, max: 2, op: opAtan2, counts: "takes 2 arguments (y, x)"},
		{name: "min", min: 2, max: -1, op: opMin, counts: "needs at least 2 arguments"},
		{name: "max", min: 2, max: -1, op: opMax, counts: "needs at least 2 arguments"},
		{name: "when", min: 3, max: -1, odd: true, op: opSelect,
			counts: "takes conditions and their values in pairs, then the value otherwise: when(c, a, b) or when(c1, a1, c2, a2, b)"},
		{name: "rise", min: 2, max: 3, op: opRise,
			counts: "takes 2 or 3 arguments: rise(t, at) or rise(t, at, width)"},
		{name: "readings", min: 5, max: -1, odd: true, op: opReadings,
			counts: "takes the position, then two or more points as pairs of numbers: readings(s, s1, v1, s2, v2, ...)"},
	} {
		functions[f.name] = f
	}
}

// checkCount reports a wrong number of arguments at the function name.
func (f *function) checkCount(n *node) {
	k := len(n.args)
	if k >= f.min && (f.max < 0 || k <= f.max) && (!f.odd || k%2 == 1) {
		return
	}
	if f.max < 0 && !f.odd { // "needs at least 2 arguments" says it all
		failAt(n.pos, "%s %s", f.name, f.counts)
	}
	failAt(n.pos, "%s %s, got %d", f.name, f.counts, k)
}

// rise is the step from 0 to 1 at t = at: sharp (width 0) or smooth over
// [at - width/2, at + width/2] with the cubic 3u^2 - 2u^3 (continuous value
// and slope). A sharp step is 1 from t = at on. NaN in, NaN out.
func rise(t, at, width float64) float64 {
	if t != t || at != at || width != width {
		return math.NaN()
	}
	if !(width > 0) {
		if t >= at {
			return 1
		}
		return 0
	}
	u := (t-at)/width + 0.5
	switch {
	case u <= 0:
		return 0
	case u >= 1:
		return 1
	}
	return u * u * (3 - 2*u)
}

// table is the point list of one readings call; xs strictly increasing.
type table struct{ xs, ys []float64 }

// at interpolates linearly between the points and holds the end values
// outside them. NaN in, NaN out.
func (t *table) at(x float64) float64 {
	xs, ys := t.xs, t.ys
	n := len(xs)
	switch {
	case x != x:
		return x
	case x <= xs[0]:
		return ys[0]
	case x >= xs[n-1]:
		return ys[n-1]
	}
	lo, hi := 0, n-1 // xs[lo] < x < xs[hi]
	for hi-lo > 1 {
		m := int(uint(lo+hi) >> 1)
		if xs[m] <= x {
			lo = m
		} else {
			hi = m
		}
	}
	return ys[lo] + (ys[hi]-ys[lo])*((x-xs[lo])/(xs[hi]-xs[lo]))
}

// cmp evaluates one comparison as 1 or 0, and NaN if either side is NaN, so
// that a NaN reaching a condition is never hidden by picking a branch.
func cmp(k op, a, b float64) float64 {
	if a != a || b != b {
		return math.NaN()
	}
	var r bool
	switch k {
	case opLT:
		r = a < b
	case opLE:
		r = a <= b
	case opGT:
		r = a > b
	default:
		r = a >= b
	}
	if r {
		return 1
	}
	return 0
}
