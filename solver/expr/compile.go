package expr

import (
	"fmt"
	"math"
)

// op is one instruction of the compiled stack program.
type op uint8

const (
	opConst    op = iota // push k
	opVar                // push vals[n]
	opNeg                // x -> -x
	opAdd                // a b -> a+b
	opSub                // a b -> a-b
	opMul                // a b -> a*b
	opDiv                // a b -> a/b
	opPow                // a b -> a^b
	opAddK               // x -> x+k
	opSubK               // x -> x-k
	opRSubK              // x -> k-x
	opMulK               // x -> x*k
	opDivK               // x -> x/k
	opRDivK              // x -> k/x
	opPowK               // x -> x^k
	opRPowK              // x -> k^x
	opAddV               // a -> a+vals[n]
	opSubV               // a -> a-vals[n]
	opMulV               // a -> a*vals[n]
	opDivV               // a -> a/vals[n]
	opSquare             // x -> x*x
	opFn1                // x -> fn1[n](x)
	opAtan2              // y x -> atan2(y, x)
	opMin                // a b -> min(a, b)
	opMax                // a b -> max(a, b)
	opLT                 // a b -> 1, 0 or NaN
	opLE                 // a b -> 1, 0 or NaN
	opGT                 // a b -> 1, 0 or NaN
	opGE                 // a b -> 1, 0 or NaN
	opSelect             // c a b -> a if c is 1, b if c is 0, NaN if c is NaN
	opRise               // t at width -> rise(t, at, width)
	opReadings           // x -> tabs[n].at(x)
)

// instr is one instruction; n and k are its integer and number arguments.
type instr struct {
	op op
	n  int32
	k  float64
}

// readsVar reports whether the instruction reads vals[n].
func (in instr) readsVar() bool {
	return in.op == opVar || in.op >= opAddV && in.op <= opDivV
}

// effect is the change in stack height caused by each instruction.
var effect = [...]int{
	opConst: 1, opVar: 1, opNeg: 0,
	opAdd: -1, opSub: -1, opMul: -1, opDiv: -1, opPow: -1,
	opAddK: 0, opSubK: 0, opRSubK: 0, opMulK: 0, opDivK: 0, opRDivK: 0, opPowK: 0, opRPowK: 0,
	opAddV: 0, opSubV: 0, opMulV: 0, opDivV: 0,
	opSquare: 0, opFn1: 0, opAtan2: -1, opMin: -1, opMax: -1,
	opLT: -1, opLE: -1, opGT: -1, opGE: -1, opSelect: -2, opRise: -2, opReadings: 0,
}

// maxStack bounds the evaluator's stack; deeper programs are a compile error.
const maxStack = 128

// smallStack is the stack used by Eval when the program fits in it (the
// common case), so that Eval clears only a few words per call.
const smallStack = 16

// compiler turns the syntax tree into a flat program, folding every part
// that depends on no variable into one constant.
type compiler struct {
	tabs []table
}

// stackNeed returns the largest stack height prog reaches.
func stackNeed(prog []instr) int {
	h, most := 0, 0
	for _, in := range prog {
		h += effect[in.op]
		most = max(most, h)
	}
	return most
}

// fold replaces code that uses no variable by the constant it computes.
func (c *compiler) fold(n *node, code []instr) []instr {
	for _, in := range code {
		if in.readsVar() {
			return code
		}
	}
	if len(code) == 1 {
		return code
	}
	if stackNeed(code) > maxStack {
		failAt(n.start, "formula too complex (needs more than %d intermediate values)", maxStack)
	}
	var buf [maxStack]float64
	return []instr{{op: opConst, k: run(code, c.tabs, nil, buf[:])}}
}

func constOf(code []instr) (float64, bool) {
	if len(code) == 1 && code[0].op == opConst {
		return code[0].k, true
	}
	return 0, false
}

var binOps = map[tokKind][4]op{ // plain, constant right, constant left, variable right
	tPlus:  {opAdd, opAddK, opAddK, opAddV},
	tMinus: {opSub, opSubK, opRSubK, opSubV},
	tStar:  {opMul, opMulK, opMulK, opMulV},
	tSlash: {opDiv, opDivK, opRDivK, opDivV},
	tCaret: {opPow, opPowK, opRPowK, opPow},
}

var cmpOps = map[tokKind]op{tLT: opLT, tLE: opLE, tGT: opGT, tGE: opGE}

// gen compiles a node that must yield a number.
func (c *compiler) gen(n *node) []instr {
	switch n.kind {
	case nNum:
		return []instr{{op: opConst, k: n.val}}
	case nVar:
		return []instr{{op: opVar, n: int32(n.idx)}}
	case nNeg:
		return c.fold(n, append(c.gen(n.args[0]), instr{op: opNeg}))
	case nBinary:
		return c.fold(n, c.binary(n.op, c.gen(n.args[0]), c.gen(n.args[1])))
	case nCmp:
		failAt(n.pos, "a comparison (%s) can only be the condition of when(...)", tokText[n.cmps[0]])
	case nCall:
		return c.fold(n, c.call(n))
	}
	panic(fmt.Sprintf("expr: bad node kind %d", n.kind))
}

func (c *compiler) binary(k tokKind, l, r []instr) []instr {
	ops := binOps[k]
	if b, ok := constOf(r); ok {
		if k == tCaret && b == 2 {
			return append(l, instr{op: opSquare})
		}
		return append(l, instr{op: ops[1], k: b})
	}
	if a, ok := constOf(l); ok {
		return append(r, instr{op: ops[2], k: a})
	}
	if len(r) == 1 && r[0].op == opVar && ops[3] != opPow {
		return append(l, instr{op: ops[3], n: r[0].n})
	}
	return append(append(l, r...), instr{op: ops[0]})
}

// cond compiles the condition of when: a comparison chain, the product of
// its links (1 when all hold, 0 when one fails, NaN when one sees a NaN).
func (c *compiler) cond(n *node) []instr {
	if n.kind != nCmp {
		failAt(n.start, "the condition of when must be a comparison such as s < 0.1")
	}
	var code []instr
	for i, k := range n.cmps {
		link := append(append(c.gen(n.args[i]), c.gen(n.args[i+1])...), instr{op: cmpOps[k]})
		code = append(code, link...)
		if i > 0 {
			code = append(code, instr{op: opMul})
		}
	}
	return c.fold(n, code)
}

func (c *compiler) call(n *node) []instr {
	args := n.args
	switch n.fn.op {
	case opFn1:
		return append(c.gen(args[0]), instr{op: opFn1, n: n.fn.fn1})
	case opAtan2:
		return append(append(c.gen(args[0]), c.gen(args[1])...), instr{op: opAtan2})
	case opMin, opMax:
		code := c.gen(args[0])
		for _, a := range args[1:] {
			code = append(append(code, c.gen(a)...), instr{op: n.fn.op})
		}
		return code
	case opSelect:
		return c.when(n, args)
	case opRise:
		code := append(c.gen(args[0]), c.gen(args[1])...)
		w := []instr{{op: opConst, k: 0}}
		if len(args) == 3 {
			w = c.gen(args[2])
			if v, ok := constOf(w); ok && !(v > 0) {
				failAt(args[2].start, "the width of rise must be positive, got %g (for a sharp step use rise(t, at))", v)
			}
		}
		return append(append(code, w...), instr{op: opRise})
	case opReadings:
		return append(c.gen(args[0]), instr{op: opReadings, n: int32(c.readings(args[1:]))})
	}
	panic("expr: no code for function " + n.name)
}

// when compiles when(c1, a1, c2, a2, ..., b) as when(c1, a1, when(c2, a2, ... b)).
// A constant condition picks its branch at compile time.
func (c *compiler) when(n *node, args []*node) []instr {
	if len(args) == 1 {
		return c.gen(args[0])
	}
	cond := c.cond(args[0])
	if v, ok := constOf(cond); ok {
		// Compile the branch not taken too, so that its mistakes are still reported.
		switch v {
		case 1:
			c.when(n, args[2:])
			return c.gen(args[1])
		case 0:
			c.gen(args[1])
			return c.when(n, args[2:])
		}
		return []instr{{op: opConst, k: math.NaN()}}
	}
	code := append(append(cond, c.gen(args[1])...), c.when(n, args[2:])...)
	return append(code, instr{op: opSelect})
}

// readings checks the points of a readings call and stores them as a table.
func (c *compiler) readings(args []*node) int {
	var t table
	for i := 0; i < len(args); i += 2 {
		var v [2]float64
		for j := range 2 {
			a := args[i+j]
			x, ok := constOf(c.gen(a))
			if !ok {
				failAt(a.start, "the points of readings must be constant numbers (they may use pi and e, not variables)")
			}
			if math.IsNaN(x) || math.IsInf(x, 0) {
				failAt(a.start, "the points of readings must be finite numbers, got %g", x)
			}
			v[j] = x
		}
		if k := len(t.xs); k > 0 && !(v[0] > t.xs[k-1]) {
			failAt(args[i].start, "the positions in readings must increase: %g comes after %g", v[0], t.xs[k-1])
		}
		t.xs = append(t.xs, v[0])
		t.ys = append(t.ys, v[1])
	}
	c.tabs = append(c.tabs, t)
	return len(c.tabs) - 1
}

// run executes prog with the stack st and returns the value it leaves.
// Folding and Eval share it, so a folded constant is exactly what Eval
// would have computed. The top of the stack lives in top; st[1:sp] hold
// the values below it (st[0] takes the empty top of the first push), so
// the stack needs as many slots as the program's height.
//
// The loop and the most frequent instructions stay small (readings too:
// a table look-up is short, and a call more made it a fifth slower); the
// others run in runRest, runLogic and runMore, so that the browser
// optimizes little code when a formula is evaluated at many points (see
// the package doc of edgewise/solver, Loops in functions of their own).
func run(prog []instr, tabs []table, vals []float64, st []float64) float64 {
	sp, top := 0, 0.0
	for i := range prog {
		in := &prog[i]
		switch in.op {
		case opConst, opVar:
			st[sp] = top
			sp++
			if in.op == opConst {
				top = in.k
			} else {
				top = vals[in.n]
			}
		case opNeg:
			top = -top
		case opAdd, opSub, opMul, opDiv:
			sp--
			switch a := st[sp]; in.op {
			case opAdd:
				top = a + top
			case opSub:
				top = a - top
			case opMul:
				top = a * top
			default:
				top = a / top
			}
		case opAddK:
			top += in.k
		case opSubK:
			top -= in.k
		case opRSubK:
			top = in.k - top
		case opMulK:
			top *= in.k
		case opDivK:
			top /= in.k
		case opRDivK:
			top = in.k / top
		case opSquare:
			top *= top
		case opReadings:
			top = tabs[in.n].at(top)
		default:
			sp, top = runRest(in, vals, st, sp, top)
		}
	}
	return top
}

// runRest executes for run a function of one argument, a power or an
// operation with a variable, on the stack st[1:sp] and top, and returns
// the new sp and top; the other instructions go on to runLogic. It and
// the functions after it are not inlined, to keep each small (see run).
//
//go:noinline
func runRest(in *instr, vals []float64, st []float64, sp int, top float64) (int, float64) {
	switch in.op {
	case opFn1:
		top = fn1[in.n](top)
	case opAddV, opSubV, opMulV, opDivV:
		switch b := vals[in.n]; in.op {
		case opAddV:
			top += b
		case opSubV:
			top -= b
		case opMulV:
			top *= b
		default:
			top /= b
		}
	case opPow, opPowK, opRPowK:
		a, b := top, in.k // opPowK
		switch in.op {
		case opPow:
			sp--
			a, b = st[sp], top
		case opRPowK:
			a, b = in.k, top
		}
		top = math.Pow(a, b)
	default:
		return runLogic(in, st, sp, top)
	}
	return sp, top
}

// runLogic executes for runRest the comparisons and when; the other
// instructions go on to runMore.
//
//go:noinline
func runLogic(in *instr, st []float64, sp int, top float64) (int, float64) {
	switch in.op {
	case opLT, opLE, opGT, opGE:
		sp--
		top = cmp(in.op, st[sp], top)
	case opSelect:
		sp -= 2
		switch st[sp] {
		case 1:
			top = st[sp+1]
		case 0:
			// top is the value otherwise
		default:
			top = math.NaN()
		}
	default:
		return runMore(in, st, sp, top)
	}
	return sp, top
}

// runMore executes for runLogic min, max, atan2 and rise.
//
//go:noinline
func runMore(in *instr, st []float64, sp int, top float64) (int, float64) {
	switch in.op {
	case opMin, opMax, opAtan2:
		sp--
		switch a := st[sp]; in.op {
		case opMin:
			top = min(a, top) // NaN if either is NaN
		case opMax:
			top = max(a, top)
		default:
			top = math.Atan2(a, top)
		}
	case opRise:
		sp -= 2
		top = rise(st[sp], st[sp+1], top)
	default:
		badInstr(in.op)
	}
	return sp, top
}

// badInstr panics on an instruction that does not exist (a bug).
func badInstr(o op) {
	panic(fmt.Sprintf("expr: bad instruction %d", o))
}
