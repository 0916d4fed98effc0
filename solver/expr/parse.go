package expr

import (
	"slices"
	"strconv"
	"strings"
)

// Limits that keep a hostile or mistaken formula from exhausting the small
// WebAssembly stack or the evaluator's fixed stack.
const (
	MaxLen   = 4096 // bytes of source, the same as any text in a project file (solver.MaxTextBytes)
	MaxDepth = 40   // levels of nesting of parentheses, calls, signs and powers: 40 pass, 41 do not
)

// nodeKind is the kind of a syntax tree node.
type nodeKind int

const (
	nNum    nodeKind = iota // number literal or the constants pi, e
	nVar                    // variable: index into the Compile vars
	nNeg                    // unary minus: args[0]
	nBinary                 // op in + - * / ^: args[0] op args[1]
	nCmp                    // comparison chain: args[0] cmps[0] args[1] cmps[1] args[2] ...
	nCall                   // function call
)

// node is a syntax tree node.
type node struct {
	kind  nodeKind
	start int     // byte offset where the node's text starts
	pos   int     // byte offset of its operator or name
	op    tokKind // nBinary: the operator
	cmps  []tokKind
	val   float64 // nNum
	name  string  // nNum constant name, nVar name, nCall function name
	idx   int     // nVar
	fn    *function
	args  []*node
}

// binPrec is the binding power of the binary operators handled by
// precedence climbing. ^ binds tighter than unary minus and is handled
// separately (right-associative); see doc.go for the whole grammar.
var binPrec = [...]int{
	tLT: 1, tLE: 1, tGT: 1, tGE: 1, // comparisons chain: a < b <= c
	tPlus: 2, tMinus: 2, // left-associative
	tStar: 3, tSlash: 3, // left-associative
	tCaret: 0, tEOF: 0,
}

func precOf(k tokKind) int {
	if int(k) < len(binPrec) {
		return binPrec[k]
	}
	return 0
}

func isCmp(k tokKind) bool { return k >= tLT && k <= tGE }

// standardVars are the variables the language defines; the engine offers
// some or all of them to each formula. Naming one it does not offer gets a
// message listing what is offered.
var standardVars = []string{"x", "y", "s", "W", "H"}

// parser builds the syntax tree with one token of look-ahead.
type parser struct {
	sc     scanner
	tok    token
	depth  int
	vars   []string
	consts []Const
	named  []string // the consts referred to, in order of first use
}

func (p *parser) next() { p.tok = p.sc.next() }

func startsOperand(k tokKind) bool { return k == tNum || k == tName || k == tLParen }

// parseFormula: formula = expr EOF.
func (p *parser) parseFormula() *node {
	p.next()
	if p.tok.kind == tEOF {
		failAt(0, "empty formula")
	}
	n := p.parseBinary(1)
	switch p.tok.kind {
	case tEOF:
		return n
	case tRParen:
		failAt(p.tok.pos, `unexpected ")" with no "(" to close`)
	case tComma:
		failAt(p.tok.pos, `unexpected "," outside a function call`)
	}
	failAt(p.tok.pos, "unexpected %s after a complete formula", p.tok.describe())
	return nil
}

// parseBinary parses by precedence climbing:
//
//	expr = unary { binop unary }     binop from binPrec, at least minPrec
//
// A run of comparisons becomes one chain node (a < b <= c means a < b and b <= c).
func (p *parser) parseBinary(minPrec int) *node {
	left := p.parseUnary()
	for {
		if startsOperand(p.tok.kind) {
			failAt(p.tok.pos, "missing operator before %s (multiplication needs *)", p.tok.describe())
		}
		op := p.tok
		prec := precOf(op.kind)
		if prec == 0 || prec < minPrec {
			return left
		}
		if isCmp(op.kind) {
			if left.kind == nCmp {
				failAt(op.pos, "unexpected %s after a comparison", op.describe())
			}
			c := &node{kind: nCmp, start: left.start, pos: op.pos, args: []*node{left}}
			for isCmp(p.tok.kind) {
				c.cmps = append(c.cmps, p.tok.kind)
				p.next()
				c.args = append(c.args, p.parseBinary(prec+1))
			}
			left = c
			continue
		}
		p.next()
		right := p.parseBinary(prec + 1)
		left = &node{kind: nBinary, start: left.start, pos: op.pos, op: op.kind, args: []*node{left, right}}
	}
}

// parseUnary: unary = ("-" | "+") unary | power.
// Every level of nesting passes through here, so the depth cap lives here.
// The formula itself is level 0, so depth counts one more than the nesting.
func (p *parser) parseUnary() *node {
	p.depth++
	if p.depth > MaxDepth+1 {
		failAt(p.tok.pos, "formula nested too deeply (more than %d levels)", MaxDepth)
	}
	defer func() { p.depth-- }()
	switch t := p.tok; t.kind {
	case tMinus:
		p.next()
		x := p.parseUnary()
		return &node{kind: nNeg, start: t.pos, pos: t.pos, args: []*node{x}}
	case tPlus:
		p.next()
		return p.parseUnary()
	}
	return p.parsePower()
}

// parsePower: power = primary [ "^" unary ]. The exponent is a unary, so
// 2^3^2 = 2^(3^2) and 2^-1 = 0.5, while -2^2 = -(2^2).
func (p *parser) parsePower() *node {
	base := p.parsePrimary()
	if p.tok.kind != tCaret {
		return base
	}
	op := p.tok
	p.next()
	exp := p.parseUnary()
	return &node{kind: nBinary, start: base.start, pos: op.pos, op: tCaret, args: []*node{base, exp}}
}

// parsePrimary: primary = number | name | name "(" [ expr { "," expr } ] ")" | "(" expr ")".
func (p *parser) parsePrimary() *node {
	t := p.tok
	switch t.kind {
	case tNum:
		p.next()
		return &node{kind: nNum, start: t.pos, pos: t.pos, val: t.val}
	case tName:
		p.next()
		if p.tok.kind == tLParen {
			return p.parseCall(t)
		}
		return p.resolve(t)
	case tLParen:
		p.next()
		x := p.parseBinary(1)
		p.expectClose(t.pos)
		return x
	case tEOF:
		failAt(t.pos, `expected a number, name or "(" but the formula ends here`)
	}
	failAt(t.pos, `expected a number, name or "(", found %s`, t.describe())
	return nil
}

func (p *parser) expectClose(open int) {
	switch p.tok.kind {
	case tRParen:
		p.next()
	case tEOF:
		failAt(p.tok.pos, `missing ")" to close the "(" at col %d`, open+1)
	default:
		failAt(p.tok.pos, `expected "," or ")" (for the "(" at col %d), found %s`, open+1, p.tok.describe())
	}
}

// resolve turns a name that is not called into a variable or a constant.
func (p *parser) resolve(t token) *node {
	for i, v := range p.vars {
		if v == t.text {
			return &node{kind: nVar, start: t.pos, pos: t.pos, name: t.text, idx: i}
		}
	}
	if v, ok := constants[t.text]; ok {
		return &node{kind: nNum, start: t.pos, pos: t.pos, name: t.text, val: v}
	}
	for _, c := range p.consts {
		if c.Name == t.text {
			if !slices.Contains(p.named, c.Name) {
				p.named = append(p.named, c.Name)
			}
			return &node{kind: nNum, start: t.pos, pos: t.pos, name: t.text, val: c.Value}
		}
	}
	if _, ok := functions[t.text]; ok {
		failAt(t.pos, "%s is a function: write %s(...)", t.text, t.text)
	}
	p.unknown(t)
	return nil
}

// hints answer names users often reach for that the language spells otherwise.
var hints = map[string]string{
	"log":  "write ln for the natural logarithm or log10 for base 10",
	"pow":  "write a^b for powers",
	"if":   "write when(condition, value, otherwise)",
	"PI":   "write pi",
	"Pi":   "write pi",
	"step": "write rise(t, at) for a step",
}

// unknown reports a name that is neither a variable, a constant nor a function.
func (p *parser) unknown(t token) {
	if h, ok := hints[t.text]; ok {
		failAt(t.pos, "unknown name %q (%s)", t.text, h)
	}
	known := append(append([]string{}, p.vars...), "pi", "e")
	for _, c := range p.consts {
		known = append(known, c.Name)
	}
	for name := range functions {
		known = append(known, name)
	}
	if s := suggest(t.text, known); s != "" {
		failAt(t.pos, "unknown name %q (did you mean %s?)", t.text, s)
	}
	if slices.Contains(standardVars, t.text) {
		failAt(t.pos, "unknown name %q (this formula may use %s)", t.text, strings.Join(p.offered(), ", "))
	}
	failAt(t.pos, "unknown name %q", t.text)
}

func (p *parser) parseCall(name token) *node {
	open := p.tok.pos
	fn, ok := functions[name.text]
	if !ok {
		if _, isConst := constants[name.text]; isConst || p.isVar(name.text) || p.isConst(name.text) {
			failAt(name.pos, "%s is not a function (write %s*(...) to multiply)", name.text, name.text)
		}
		p.unknown(name)
	}
	p.next()
	n := &node{kind: nCall, start: name.pos, pos: name.pos, name: name.text, fn: fn}
	if p.tok.kind != tRParen {
		for {
			n.args = append(n.args, p.parseBinary(1))
			if p.tok.kind != tComma {
				break
			}
			p.next()
		}
	}
	p.expectClose(open)
	fn.checkCount(n)
	return n
}

func (p *parser) isVar(name string) bool { return slices.Contains(p.vars, name) }

func (p *parser) isConst(name string) bool {
	return slices.ContainsFunc(p.consts, func(c Const) bool { return c.Name == name })
}

// offered lists the names a formula may use besides the functions.
func (p *parser) offered() []string {
	names := append(append([]string{}, p.vars...), "pi", "e")
	for _, c := range p.consts {
		names = append(names, c.Name)
	}
	return names
}

// String prints the tree with the fewest parentheses that keep its meaning.
// Compiling the printed form gives the same tree.
func (n *node) String() string {
	var b strings.Builder
	n.print(&b)
	return b.String()
}

// level is the binding level of a node when printed: higher binds tighter.
func (n *node) level() int {
	switch n.kind {
	case nCmp:
		return 1
	case nBinary:
		if n.op == tCaret {
			return 5
		}
		return precOf(n.op) // 2 or 3
	case nNeg:
		return 4
	}
	return 6
}

func (n *node) print(b *strings.Builder) {
	sub := func(c *node, need int) {
		if c.level() < need {
			b.WriteByte('(')
			c.print(b)
			b.WriteByte(')')
		} else {
			c.print(b)
		}
	}
	switch n.kind {
	case nNum:
		if n.name != "" {
			b.WriteString(n.name)
		} else {
			b.WriteString(strconv.FormatFloat(n.val, 'g', -1, 64))
		}
	case nVar:
		b.WriteString(n.name)
	case nNeg:
		b.WriteByte('-')
		sub(n.args[0], 4) // -a^b and -(-a) need no parentheses
	case nBinary:
		if n.op == tCaret {
			sub(n.args[0], 6) // (-a)^b, (a^b)^c
			b.WriteByte('^')
			sub(n.args[1], 4) // a^-b, a^b^c
			return
		}
		l := precOf(n.op)
		sub(n.args[0], l)
		b.WriteString(" " + tokText[n.op] + " ")
		sub(n.args[1], l+1)
	case nCmp:
		for i, a := range n.args {
			if i > 0 {
				b.WriteString(" " + tokText[n.cmps[i-1]] + " ")
			}
			sub(a, 2)
		}
	case nCall:
		b.WriteString(n.name)
		b.WriteByte('(')
		for i, a := range n.args {
			if i > 0 {
				b.WriteString(", ")
			}
			a.print(b)
		}
		b.WriteByte(')')
	}
}
