package expr

import (
	"fmt"
	"slices"
)

// Expr is a compiled formula. It is immutable and safe for concurrent use.
type Expr struct {
	root  *node    // syntax tree as written (before folding), for String
	prog  []instr  // flat stack program
	tabs  []table  // point lists of readings calls
	vars  []string // variable names, in the order Eval takes their values
	uses  []bool   // uses[i]: the program reads vars[i]
	small bool     // the program fits in smallStack
}

// Compile parses and compiles src. vars lists the variable names this
// formula may use, in the order their values will be passed to Eval (the
// engine passes "x", "y", "s", "W", "H"). pi and e are constants, always
// available. A name not in vars and not a function or constant is an error
// `col N: unknown name "q"` (with a did-you-mean suggestion when one is close).
//
// Errors are *Error values with the byte column of the problem. A var that
// is not a name, repeats, or is the name of a function or constant is a bug
// in the caller and panics.
func Compile(src string, vars ...string) (x *Expr, err error) {
	checkVars(vars)
	if len(src) > MaxLen {
		return nil, &Error{Col: MaxLen + 1, Msg: fmt.Sprintf("formula longer than %d bytes", MaxLen)}
	}
	defer catch(&err)
	p := &parser{sc: scanner{src: src}, vars: vars}
	root := p.parseFormula()
	c := &compiler{}
	prog := c.gen(root)
	need := stackNeed(prog)
	if need > maxStack {
		failAt(root.start, "formula too complex (needs more than %d intermediate values)", maxStack)
	}
	e := &Expr{root: root, prog: prog, tabs: c.tabs, vars: slices.Clone(vars),
		uses: make([]bool, len(vars)), small: need <= smallStack}
	for _, in := range prog {
		if in.readsVar() {
			e.uses[in.n] = true
		}
	}
	return e, nil
}

func checkVars(vars []string) {
	for i, v := range vars {
		ok := v != "" && isLetter(v[0])
		for j := 0; j < len(v); j++ {
			ok = ok && (isLetter(v[j]) || isDigit(v[j]))
		}
		if !ok {
			panic(fmt.Sprintf("expr: variable name %q is not a name", v))
		}
		if _, c := constants[v]; c {
			panic(fmt.Sprintf("expr: variable name %q is a constant", v))
		}
		if _, f := functions[v]; f {
			panic(fmt.Sprintf("expr: variable name %q is a function", v))
		}
		if slices.Contains(vars[:i], v) {
			panic(fmt.Sprintf("expr: variable name %q given twice", v))
		}
	}
}

// Eval evaluates with vals[i] the value of vars[i]. It is safe for
// concurrent use and does not allocate. A NaN or infinity is returned as
// it is: the caller reports it with the place where it happened. Passing
// fewer values than Compile had variables is a caller bug and panics.
func (e *Expr) Eval(vals []float64) float64 {
	if len(vals) < len(e.vars) {
		panic(fmt.Sprintf("expr: Eval got %d values for %d variables", len(vals), len(e.vars)))
	}
	if e.small {
		var st [smallStack]float64
		return run(e.prog, e.tabs, vals, st[:])
	}
	var st [maxStack]float64
	return run(e.prog, e.tabs, vals, st[:])
}

// Const reports whether the formula does not depend on any variable, and
// its value if so.
func (e *Expr) Const() (float64, bool) { return constOf(e.prog) }

// Uses reports whether the formula refers to the named variable. A
// reference that constant folding removed (a branch of when that can never
// be taken) does not count.
func (e *Expr) Uses(name string) bool {
	i := slices.Index(e.vars, name)
	return i >= 0 && e.uses[i]
}

// String returns the formula in a standard form: as written, with single
// spaces around + - * / and comparisons, none around ^, ", " between
// arguments, and only the parentheses the meaning needs. Compiling it
// gives the same formula.
func (e *Expr) String() string { return e.root.String() }
