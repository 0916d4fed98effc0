package main

// A small assembler for the WebAssembly text format, enough for unpack.wat:
// a module of i32 and i64 functions, mutable i32 globals, one memory and
// data segments, with function bodies in the flat (unfolded) form, one
// instruction after another:
//
//	module = "(" "module" field* ")"
//	field  = "(" "memory" export? NUM ")"
//	       | "(" "global" $id "(" "mut" "i32" ")" "(" "i32.const" NUM ")" ")"
//	       | "(" "data" "(" "i32.const" NUM ")" STRING ")"
//	       | "(" "func" $id export? param* result? local* instr* ")"
//	export = "(" "export" STRING ")"
//	param  = "(" "param" $id TYPE ")"     result = "(" "result" TYPE ")"
//	local  = "(" "local" $id TYPE ")"     TYPE = "i32" | "i64"
//	instr  = OP immediate*
//
// Labels are names: "block $out" ... "br_if $out". A block, loop or if
// yields nothing. Numbers are decimal or 0x hexadecimal, with an optional
// sign; strings take \xx hex escapes and \\ \" \n \t. Comments run from ;;
// to the end of the line. The bundler assembles the file at build time, so
// no WebAssembly tool is needed and no binary is kept in the repository.

import (
	"fmt"
	"strconv"
	"strings"
)

// watError is an assembly error at a byte offset of the source.
type watError struct {
	pos int
	msg string
}

func (e *watError) Error() string { return fmt.Sprintf("offset %d: %s", e.pos, e.msg) }

// sexp is an atom (list == nil, text set) or a list.
type sexp struct {
	pos    int
	text   string // atom: its text; a string atom keeps its quotes
	list   []sexp
	isList bool
}

func parseSexps(src string) ([]sexp, error) {
	var stack [][]sexp
	var starts []int
	var top []sexp
	for i := 0; i < len(src); {
		c := src[i]
		switch {
		case c == ' ' || c == '\t' || c == '\n' || c == '\r':
			i++
		case c == ';' && i+1 < len(src) && src[i+1] == ';':
			for i < len(src) && src[i] != '\n' {
				i++
			}
		case c == '(':
			stack = append(stack, top)
			starts = append(starts, i)
			top = nil
			i++
		case c == ')':
			if len(stack) == 0 {
				return nil, &watError{i, "unbalanced )"}
			}
			l := sexp{pos: starts[len(starts)-1], list: top, isList: true}
			top = append(stack[len(stack)-1], l)
			stack, starts = stack[:len(stack)-1], starts[:len(starts)-1]
			i++
		case c == '"':
			j := i + 1
			for j < len(src) && src[j] != '"' {
				if src[j] == '\\' {
					j++
				}
				j++
			}
			if j >= len(src) {
				return nil, &watError{i, "unterminated string"}
			}
			top = append(top, sexp{pos: i, text: src[i : j+1]})
			i = j + 1
		default:
			j := i
			for j < len(src) && !strings.ContainsRune(" \t\n\r()\";", rune(src[j])) {
				j++
			}
			top = append(top, sexp{pos: i, text: src[i:j]})
			i = j
		}
	}
	if len(stack) != 0 {
		return nil, &watError{starts[len(starts)-1], "unclosed ("}
	}
	return top, nil
}

func (s sexp) head() string {
	if !s.isList || len(s.list) == 0 || s.list[0].isList {
		return ""
	}
	return s.list[0].text
}

func watString(a sexp) ([]byte, error) {
	t := a.text
	if a.isList || len(t) < 2 || t[0] != '"' {
		return nil, &watError{a.pos, "want a string"}
	}
	var out []byte
	for i := 1; i < len(t)-1; i++ {
		if t[i] != '\\' {
			out = append(out, t[i])
			continue
		}
		i++
		switch t[i] {
		case 'n':
			out = append(out, '\n')
		case 't':
			out = append(out, '\t')
		case '\\', '"':
			out = append(out, t[i])
		default:
			v, err := strconv.ParseUint(t[i:min(i+2, len(t)-1)], 16, 8)
			if err != nil || i+2 > len(t)-1 {
				return nil, &watError{a.pos + i, "bad escape in string"}
			}
			out = append(out, byte(v))
			i++
		}
	}
	return out, nil
}

func watInt(a sexp, bits int) (int64, error) {
	if a.isList {
		return 0, &watError{a.pos, "want a number"}
	}
	// signed, or the unsigned range of the width (0xffffffff is -1 in 32 bits)
	if v, err := strconv.ParseInt(a.text, 0, bits); err == nil {
		return v, nil
	}
	u, err := strconv.ParseUint(a.text, 0, bits)
	if err != nil {
		return 0, &watError{a.pos, fmt.Sprintf("bad number %q", a.text)}
	}
	if bits == 32 {
		return int64(int32(uint32(u))), nil
	}
	return int64(u), nil
}

const (
	valI32 = 0x7f
	valI64 = 0x7e
)

func watType(a sexp) (byte, error) {
	switch a.text {
	case "i32":
		return valI32, nil
	case "i64":
		return valI64, nil
	}
	return 0, &watError{a.pos, fmt.Sprintf("unknown type %q", a.text)}
}

// immediate kinds of the instructions
const (
	immNone   = iota // no immediate
	immBlock         // block, loop, if: an optional label to define
	immLabel         // br, br_if: a label
	immLocal         // local.get/set/tee: a local's name
	immGlobal        // global.get/set: a global's name
	immFunc          // call: a function's name
	immI32           // i32.const
	immI64           // i64.const
	immMem           // loads and stores: offset=N, align=N (natural by default)
	immZero          // memory.size, memory.grow: a zero byte
	immEnd           // end: closes a label
	immElse          // else
)

type watOp struct {
	code  byte
	imm   int
	align int // log2 of the natural alignment of a load or store
}

var watOps = map[string]watOp{
	"unreachable": {0x00, immNone, 0}, "nop": {0x01, immNone, 0},
	"block": {0x02, immBlock, 0}, "loop": {0x03, immBlock, 0}, "if": {0x04, immBlock, 0},
	"else": {0x05, immElse, 0}, "end": {0x0b, immEnd, 0},
	"br": {0x0c, immLabel, 0}, "br_if": {0x0d, immLabel, 0}, "return": {0x0f, immNone, 0},
	"call": {0x10, immFunc, 0}, "drop": {0x1a, immNone, 0}, "select": {0x1b, immNone, 0},
	"local.get": {0x20, immLocal, 0}, "local.set": {0x21, immLocal, 0}, "local.tee": {0x22, immLocal, 0},
	"global.get": {0x23, immGlobal, 0}, "global.set": {0x24, immGlobal, 0},
	"i32.load": {0x28, immMem, 2}, "i64.load": {0x29, immMem, 3},
	"i32.load8_u": {0x2d, immMem, 0}, "i32.load16_u": {0x2f, immMem, 1},
	"i32.store": {0x36, immMem, 2}, "i64.store": {0x37, immMem, 3},
	"i32.store8": {0x3a, immMem, 0}, "i32.store16": {0x3b, immMem, 1},
	"memory.size": {0x3f, immZero, 0}, "memory.grow": {0x40, immZero, 0},
	"i32.const": {0x41, immI32, 0}, "i64.const": {0x42, immI64, 0},
	"i32.eqz": {0x45, immNone, 0}, "i32.eq": {0x46, immNone, 0}, "i32.ne": {0x47, immNone, 0},
	"i32.lt_s": {0x48, immNone, 0}, "i32.lt_u": {0x49, immNone, 0}, "i32.gt_s": {0x4a, immNone, 0},
	"i32.gt_u": {0x4b, immNone, 0}, "i32.le_s": {0x4c, immNone, 0}, "i32.le_u": {0x4d, immNone, 0},
	"i32.ge_s": {0x4e, immNone, 0}, "i32.ge_u": {0x4f, immNone, 0},
	"i64.eqz": {0x50, immNone, 0}, "i64.ne": {0x52, immNone, 0}, "i64.gt_u": {0x56, immNone, 0},
	"i32.add": {0x6a, immNone, 0}, "i32.sub": {0x6b, immNone, 0}, "i32.mul": {0x6c, immNone, 0},
	"i32.div_u": {0x6e, immNone, 0}, "i32.rem_u": {0x70, immNone, 0},
	"i32.and": {0x71, immNone, 0}, "i32.or": {0x72, immNone, 0}, "i32.xor": {0x73, immNone, 0},
	"i32.shl": {0x74, immNone, 0}, "i32.shr_s": {0x75, immNone, 0}, "i32.shr_u": {0x76, immNone, 0},
	"i64.add": {0x7c, immNone, 0}, "i64.mul": {0x7e, immNone, 0}, "i64.or": {0x84, immNone, 0},
	"i64.shl": {0x86, immNone, 0}, "i64.shr_u": {0x88, immNone, 0},
	"i32.wrap_i64": {0xa7, immNone, 0}, "i64.extend_i32_u": {0xad, immNone, 0},
}

func uleb(b []byte, v uint64) []byte {
	for {
		c := byte(v & 0x7f)
		v >>= 7
		if v == 0 {
			return append(b, c)
		}
		b = append(b, c|0x80)
	}
}

func sleb(b []byte, v int64) []byte {
	for {
		c := byte(v & 0x7f)
		v >>= 7
		if (v == 0 && c&0x40 == 0) || (v == -1 && c&0x40 != 0) {
			return append(b, c)
		}
		b = append(b, c|0x80)
	}
}

func watName(b []byte, s string) []byte { return append(uleb(b, uint64(len(s))), s...) }

func section(out []byte, id byte, body []byte) []byte {
	return append(uleb(append(out, id), uint64(len(body))), body...)
}

type watFunc struct {
	name    string
	export  string
	params  []byte
	result  []byte
	locals  []byte
	names   map[string]int // params then locals
	body    []sexp
	typeIdx int
}

type watModule struct {
	memPages  int64
	memExport string
	globals   []int64
	globalIdx map[string]int
	data      [][]byte
	dataAt    []int64
	funcs     []*watFunc
	funcIdx   map[string]int
}

// assembleWAT turns the text of a module into its binary form.
func assembleWAT(src string) ([]byte, error) {
	top, err := parseSexps(src)
	if err != nil {
		return nil, err
	}
	if len(top) != 1 || top[0].head() != "module" {
		return nil, &watError{0, "want one (module ...)"}
	}
	m := &watModule{globalIdx: map[string]int{}, funcIdx: map[string]int{}, memPages: -1}
	for _, f := range top[0].list[1:] {
		if err := m.field(f); err != nil {
			return nil, err
		}
	}
	return m.encode()
}

func (m *watModule) field(f sexp) error {
	l := f.list
	switch f.head() {
	case "memory":
		i := 1
		if i < len(l) && l[i].head() == "export" && len(l[i].list) == 2 {
			name, err := watString(l[i].list[1])
			if err != nil {
				return err
			}
			m.memExport = string(name)
			i++
		}
		if i != len(l)-1 || m.memPages >= 0 {
			return &watError{f.pos, "want one (memory (export \"name\")? pages)"}
		}
		n, err := watInt(l[i], 32)
		if err != nil {
			return err
		}
		m.memPages = n
	case "global":
		if len(l) != 4 || l[2].head() != "mut" || l[3].head() != "i32.const" || len(l[3].list) != 2 {
			return &watError{f.pos, "want (global $name (mut i32) (i32.const N))"}
		}
		v, err := watInt(l[3].list[1], 32)
		if err != nil {
			return err
		}
		m.globalIdx[l[1].text] = len(m.globals)
		m.globals = append(m.globals, v)
	case "data":
		if len(l) != 3 || l[1].head() != "i32.const" || len(l[1].list) != 2 {
			return &watError{f.pos, "want (data (i32.const N) \"bytes\")"}
		}
		at, err := watInt(l[1].list[1], 32)
		if err != nil {
			return err
		}
		b, err := watString(l[2])
		if err != nil {
			return err
		}
		m.dataAt = append(m.dataAt, at)
		m.data = append(m.data, b)
	case "func":
		return m.function(f)
	default:
		return &watError{f.pos, fmt.Sprintf("unknown field %q", f.head())}
	}
	return nil
}

func (m *watModule) function(f sexp) error {
	l := f.list
	if len(l) < 2 || l[1].isList || !strings.HasPrefix(l[1].text, "$") {
		return &watError{f.pos, "a function needs a $name"}
	}
	fn := &watFunc{name: l[1].text, names: map[string]int{}}
	i := 2
	for ; i < len(l) && l[i].isList; i++ {
		d := l[i]
		switch d.head() {
		case "export":
			if len(d.list) != 2 {
				return &watError{d.pos, "want (export \"name\")"}
			}
			name, err := watString(d.list[1])
			if err != nil {
				return err
			}
			fn.export = string(name)
		case "param", "local":
			if len(d.list) != 3 {
				return &watError{d.pos, fmt.Sprintf("want (%s $name type)", d.head())}
			}
			t, err := watType(d.list[2])
			if err != nil {
				return err
			}
			if _, dup := fn.names[d.list[1].text]; dup {
				return &watError{d.pos, "a second " + d.list[1].text}
			}
			fn.names[d.list[1].text] = len(fn.params) + len(fn.locals)
			if d.head() == "param" {
				if len(fn.locals) > 0 {
					return &watError{d.pos, "a param after a local"}
				}
				fn.params = append(fn.params, t)
			} else {
				fn.locals = append(fn.locals, t)
			}
		case "result":
			if len(d.list) != 2 || fn.result != nil {
				return &watError{d.pos, "want one (result type)"}
			}
			t, err := watType(d.list[1])
			if err != nil {
				return err
			}
			fn.result = []byte{t}
		default:
			return &watError{d.pos, "the body is written flat: no ( ) in it"}
		}
	}
	fn.body = l[i:]
	if _, dup := m.funcIdx[fn.name]; dup {
		return &watError{f.pos, "a second " + fn.name}
	}
	m.funcIdx[fn.name] = len(m.funcs)
	m.funcs = append(m.funcs, fn)
	return nil
}

// code assembles a function's body.
func (m *watModule) code(fn *watFunc) ([]byte, error) {
	var b []byte
	var labels []string // innermost last; "" for an unnamed one
	body := fn.body
	for i := 0; i < len(body); i++ {
		a := body[i]
		if a.isList {
			return nil, &watError{a.pos, "the body is written flat: no ( ) in it"}
		}
		op, ok := watOps[a.text]
		if !ok {
			return nil, &watError{a.pos, fmt.Sprintf("unknown instruction %q", a.text)}
		}
		b = append(b, op.code)
		next := func() (sexp, error) {
			if i+1 >= len(body) || body[i+1].isList {
				return sexp{}, &watError{a.pos, a.text + " needs an operand"}
			}
			i++
			return body[i], nil
		}
		switch op.imm {
		case immBlock:
			name := ""
			if i+1 < len(body) && strings.HasPrefix(body[i+1].text, "$") {
				i++
				name = body[i].text
			}
			labels = append(labels, name)
			b = append(b, 0x40)
		case immElse:
			if len(labels) == 0 {
				return nil, &watError{a.pos, "else outside if"}
			}
		case immEnd:
			if len(labels) == 0 {
				return nil, &watError{a.pos, "end with no block open"}
			}
			labels = labels[:len(labels)-1]
		case immLabel:
			t, err := next()
			if err != nil {
				return nil, err
			}
			depth := -1
			for j := len(labels) - 1; j >= 0; j-- {
				if labels[j] == t.text {
					depth = len(labels) - 1 - j
					break
				}
			}
			if depth < 0 {
				return nil, &watError{t.pos, "no enclosing label " + t.text}
			}
			b = uleb(b, uint64(depth))
		case immLocal, immGlobal, immFunc:
			// a name: of a local (or parameter), a global or a function
			names, what := fn.names, "local"
			if op.imm == immGlobal {
				names, what = m.globalIdx, "global"
			} else if op.imm == immFunc {
				names, what = m.funcIdx, "function"
			}
			t, err := next()
			if err != nil {
				return nil, err
			}
			k, ok := names[t.text]
			if !ok {
				return nil, &watError{t.pos, "no " + what + " " + t.text}
			}
			b = uleb(b, uint64(k))
		case immI32, immI64:
			t, err := next()
			if err != nil {
				return nil, err
			}
			bits := 32
			if op.imm == immI64 {
				bits = 64
			}
			v, err := watInt(t, bits)
			if err != nil {
				return nil, err
			}
			b = sleb(b, v)
		case immMem:
			align, offset := int64(op.align), int64(0)
			for i+1 < len(body) && !body[i+1].isList && strings.ContainsRune(body[i+1].text, '=') {
				i++
				k, v, _ := strings.Cut(body[i].text, "=")
				n, err := watInt(sexp{pos: body[i].pos, text: v}, 32)
				if err != nil || n < 0 {
					return nil, &watError{body[i].pos, "bad " + k}
				}
				switch k {
				case "offset":
					offset = n
				case "align":
					if n&(n-1) != 0 || n == 0 {
						return nil, &watError{body[i].pos, "align must be a power of 2"}
					}
					align = 0
					for n > 1 {
						n >>= 1
						align++
					}
				default:
					return nil, &watError{body[i].pos, "unknown " + k}
				}
			}
			b = uleb(uleb(b, uint64(align)), uint64(offset))
		case immZero:
			b = append(b, 0)
		}
	}
	if len(labels) != 0 {
		return nil, &watError{0, fmt.Sprintf("%s: %d blocks left open", fn.name, len(labels))}
	}
	return append(b, 0x0b), nil
}

func (m *watModule) encode() ([]byte, error) {
	out := []byte{0, 'a', 's', 'm', 1, 0, 0, 0}
	// types: one per distinct signature
	var types [][]byte
	for _, fn := range m.funcs {
		sig := []byte{0x60}
		sig = append(uleb(sig, uint64(len(fn.params))), fn.params...)
		sig = append(uleb(sig, uint64(len(fn.result))), fn.result...)
		fn.typeIdx = -1
		for k, t := range types {
			if string(t) == string(sig) {
				fn.typeIdx = k
			}
		}
		if fn.typeIdx < 0 {
			fn.typeIdx = len(types)
			types = append(types, sig)
		}
	}
	body := uleb(nil, uint64(len(types)))
	for _, t := range types {
		body = append(body, t...)
	}
	out = section(out, 1, body)

	body = uleb(nil, uint64(len(m.funcs)))
	for _, fn := range m.funcs {
		body = uleb(body, uint64(fn.typeIdx))
	}
	out = section(out, 3, body)

	if m.memPages >= 0 {
		out = section(out, 5, uleb([]byte{1, 0}, uint64(m.memPages)))
	}
	if len(m.globals) > 0 {
		body = uleb(nil, uint64(len(m.globals)))
		for _, v := range m.globals {
			body = append(sleb(append(body, valI32, 1, 0x41), v), 0x0b)
		}
		out = section(out, 6, body)
	}

	var exports [][]byte
	if m.memExport != "" {
		exports = append(exports, append(watName(nil, m.memExport), 2, 0))
	}
	for k, fn := range m.funcs {
		if fn.export != "" {
			exports = append(exports, uleb(append(watName(nil, fn.export), 0), uint64(k)))
		}
	}
	body = uleb(nil, uint64(len(exports)))
	for _, e := range exports {
		body = append(body, e...)
	}
	out = section(out, 7, body)

	body = uleb(nil, uint64(len(m.funcs)))
	for _, fn := range m.funcs {
		code, err := m.code(fn)
		if err != nil {
			return nil, err
		}
		// locals in runs of one type
		var runs []byte
		nruns := 0
		for j := 0; j < len(fn.locals); {
			k := j
			for k < len(fn.locals) && fn.locals[k] == fn.locals[j] {
				k++
			}
			runs = append(uleb(runs, uint64(k-j)), fn.locals[j])
			nruns++
			j = k
		}
		f := append(uleb(nil, uint64(nruns)), runs...)
		f = append(f, code...)
		body = append(uleb(body, uint64(len(f))), f...)
	}
	out = section(out, 10, body)

	if len(m.data) > 0 {
		body = uleb(nil, uint64(len(m.data)))
		for k, d := range m.data {
			body = append(sleb(append(body, 0, 0x41), m.dataAt[k]), 0x0b)
			body = append(uleb(body, uint64(len(d))), d...)
		}
		out = section(out, 11, body)
	}
	return out, nil
}
