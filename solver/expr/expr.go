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
	named []string // the named constants (CompileWith) the source refers to, in order of first use
	small bool     // the program fits in smallStack
}

// Const is a named constant that a formula may use like pi, such as a
// parameter of a project: CompileWith folds it into the program, so a
// formula that uses it evaluates exactly as fast as one with the number
// written out.
type Const struct {
	Name  string
	Value float64
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
	return CompileWith(src, nil, vars...)
}

// CompileWith is Compile with named constants besides pi and e. A name is
// looked up among vars first, then pi and e, then consts. The names of
// consts must pass CheckName and differ from vars and from one another;
// anything else is a bug in the caller and panics.
func CompileWith(src string, consts []Const, vars ...string) (x *Expr, err error) {
	checkVars(vars)
	checkConsts(consts, vars)
	if len(src) > MaxLen {
		return nil, &Error{Col: MaxLen + 1, Msg: fmt.Sprintf("formula longer than %d bytes", MaxLen)}
	}
	defer catch(&err)
	p := &parser{sc: scanner{src: src}, vars: vars, consts: consts}
	root := p.parseFormula()
	c := &compiler{}
	prog := c.gen(root)
	need := stackNeed(prog)
	if need > maxStack {
		failAt(root.start, "formula too complex (needs more than %d intermediate values)", maxStack)
	}
	e := &Expr{root: root, prog: prog, tabs: c.tabs, vars: slices.Clone(vars),
		uses: make([]bool, len(vars)), named: p.named, small: need <= smallStack}
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

// CheckName returns nil when name can name a constant of CompileWith: a
// name of the language (a letter or _, then letters, digits and _) that is
// not a function, pi, e or one of the variables x, y, s, W, H. The error
// says why not, without a position.
func CheckName(name string) error {
	ok := name != "" && isLetter(name[0])
	for j := 0; j < len(name); j++ {
		ok = ok && (isLetter(name[j]) || isDigit(name[j]))
	}
	switch _, c := constants[name]; {
	case !ok:
		return fmt.Errorf("%q is not a name (a letter or _, then letters, digits or _)", name)
	case len(name) > maxNameLen:
		return fmt.Errorf("a name may be at most %d characters long", maxNameLen)
	case c:
		return fmt.Errorf("%q is a built-in constant", name)
	case slices.Contains(standardVars, name):
		return fmt.Errorf("%q is a variable of the formulas (x, y, s, W, H)", name)
	}
	if _, f := functions[name]; f {
		return fmt.Errorf("%q is a built-in function", name)
	}
	return nil
}

// maxNameLen bounds the length of a constant's name.
const maxNameLen = 64

func checkConsts(consts []Const, vars []string) {
	for i, c := range consts {
		if err := CheckName(c.Name); err != nil {
			panic("expr: constant: " + err.Error())
		}
		if slices.Contains(vars, c.Name) {
			panic(fmt.Sprintf("expr: constant %q is also a variable", c.Name))
		}
		for _, d := range consts[:i] {
			if d.Name == c.Name {
				panic(fmt.Sprintf("expr: constant %q given twice", c.Name))
			}
		}
	}
}

// Named returns the named constants of CompileWith that the source refers
// to, in the order of their first use (also those in a branch of when that
// can never be taken: the user wrote them).
func (e *Expr) Named() []string { return slices.Clone(e.named) }

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
