// Command wasmsize says what a WebAssembly engine built by Go is made of:
// the code of each part (from the function names in the binary's "name"
// section, so the build must keep it: no -ldflags=-s) and the data
// section. `make size-parts` runs it on a build made for the purpose.
//
// Usage:
//
//	go run ./scripts/wasmsize [-funcs N] FILE.wasm
//
// It prints one line per part, largest first, in KiB, then the data
// section and the total; -funcs N also lists the N largest functions.
package main

import (
	"errors"
	"flag"
	"fmt"
	"io"
	"os"
	"sort"
	"strings"
)

func main() {
	funcs := flag.Int("funcs", 0, "also list the `N` largest functions")
	flag.Parse()
	if flag.NArg() != 1 {
		fmt.Fprintln(os.Stderr, "usage: wasmsize [-funcs N] FILE.wasm")
		os.Exit(1)
	}
	data, err := os.ReadFile(flag.Arg(0))
	if err == nil {
		var m *module
		if m, err = parse(data); err == nil {
			err = m.report(os.Stdout, *funcs)
		}
	}
	if err != nil {
		fmt.Fprintln(os.Stderr, "wasmsize:", err)
		os.Exit(1)
	}
}

// module is what wasmsize reads of a binary: the size of each section
// by id (custom sections by name) and each defined function's body size
// and name.
type module struct {
	sections map[string]int
	bodies   []int
	names    map[int]string // by function index (imports first)
	imported int            // functions imported: the index of body 0
}

// reader reads the binary format's integers and names.
type reader struct {
	b   []byte
	p   int
	err error
}

func (r *reader) byte() byte {
	if r.p >= len(r.b) {
		r.err = errors.New("unexpected end of the binary")
		return 0
	}
	r.p++
	return r.b[r.p-1]
}

// uleb reads an unsigned LEB128 number.
func (r *reader) uleb() int {
	x, s := 0, 0
	for r.err == nil {
		c := r.byte()
		x |= int(c&0x7f) << s
		if c < 0x80 {
			break
		}
		if s += 7; s > 35 {
			r.err = errors.New("number too long")
		}
	}
	return x
}

func (r *reader) name() string {
	n := r.uleb()
	if r.err != nil || n > len(r.b)-r.p {
		r.err = errors.New("name past the end")
		return ""
	}
	r.p += n
	return string(r.b[r.p-n : r.p])
}

// limits skips a table's or a memory's limits.
func (r *reader) limits() {
	if r.byte()&1 != 0 {
		r.uleb()
	}
	r.uleb()
}

func parse(b []byte) (*module, error) {
	if len(b) < 8 || string(b[:4]) != "\x00asm" {
		return nil, errors.New("not a WebAssembly binary")
	}
	m := &module{sections: map[string]int{}, names: map[int]string{}}
	r := &reader{b: b, p: 8}
	for r.p < len(b) && r.err == nil {
		id := r.byte()
		size := r.uleb()
		if r.err != nil || size > len(b)-r.p {
			return nil, errors.New("section past the end")
		}
		s := &reader{b: b[:r.p+size], p: r.p}
		key := fmt.Sprintf("section %d", id)
		switch id {
		case 0:
			name := s.name()
			key = "custom " + name
			if name == "name" {
				m.readNames(s)
			}
		case 2:
			m.readImports(s)
		case 10:
			for range s.uleb() {
				n := s.uleb()
				m.bodies = append(m.bodies, n)
				s.p += n
			}
		case 11:
			key = "data"
		}
		if s.err != nil {
			return nil, fmt.Errorf("%s: %v", key, s.err)
		}
		m.sections[key] += size
		r.p += size
	}
	return m, r.err
}

func (m *module) readImports(s *reader) {
	for range s.uleb() {
		s.name()
		s.name()
		switch s.byte() {
		case 0: // function
			s.uleb()
			m.imported++
		case 1: // table
			s.byte()
			s.limits()
		case 2: // memory
			s.limits()
		case 3: // global
			s.byte()
			s.byte()
		}
	}
}

// readNames reads the function names (subsection 1) of a "name" section.
func (m *module) readNames(s *reader) {
	for s.p < len(s.b) && s.err == nil {
		sub := s.byte()
		n := s.uleb()
		end := s.p + n
		if sub == 1 {
			for range s.uleb() {
				i := s.uleb()
				m.names[i] = s.name()
			}
		}
		s.p = end
	}
}

// parts groups functions by the package their name starts with (Go
// writes "edgewise/solver/series.f" as "edgewise_solver_series.f"); the
// first prefix that matches names the part.
var parts = []struct{ name, prefixes string }{
	{"Go runtime (scheduler, garbage collector, maps, type support, sync)", "runtime. internal_runtime internal_abi internal_cpu internal_bytealg internal_chacha8rand gcWriteBarrier callRet memchr wasm_export _rt0 type_. internal_sync sync. sync_atomic internal_godebug internal_bisect internal_synctest"},
	{"fmt and reflect", "fmt. reflect. internal_reflectlite internal_fmtsort"},
	{"the engine (series, cross-check, corner fits, Gauss-Legendre rules, problem, linear algebra)", "edgewise_solver_series edgewise_solver_fdcheck edgewise_solver_gauss edgewise_solver_problem edgewise_solver_linalg edgewise_solver_internal"},
	{"results, answers, cautions, flow net, trades (package solver)", "edgewise_solver."},
	{"report and published checks", "edgewise_solver_report edgewise_solver_verify"},
	{"project files, parameters, physics table", "edgewise_solver_project edgewise_solver_physics edgewise_solver_csp"},
	{"studies", "edgewise_solver_study"},
	{"WebAssembly bridge (main, syscall/js, safejs)", "main. syscall_js github.com_hack-pad github.com_hack_pad"},
	{"formula language", "edgewise_solver_expr"},
	{"CSV, SVG, isolines, colour maps", "edgewise_solver_export edgewise_solver_contour edgewise_solver_colour"},
	{"JSON reader and writer", "edgewise_solver_jsonlite"},
	{"gonum BLAS and LAPACK", "gonum.org_v1_gonum_blas gonum.org_v1_gonum_lapack gonum.org_v1_gonum_internal_asm"},
	{"gonum DST (fftpack)", "gonum.org_v1_gonum_dsp"},
	{"generic sorts and slice functions (slices)", "slices."},
}

func partOf(name string) string {
	for _, p := range parts {
		for _, pre := range strings.Fields(p.prefixes) {
			if strings.HasPrefix(name, pre) {
				return p.name
			}
		}
	}
	return "standard library (strconv, math, strings, os, ...)"
}

func (m *module) report(w io.Writer, nfuncs int) error {
	if len(m.names) == 0 {
		return errors.New("no function names: build without -ldflags=-s")
	}
	type size struct {
		name  string
		bytes int
	}
	byPart := map[string]int{}
	var fns []size
	code := 0
	for i, n := range m.bodies {
		name := m.names[m.imported+i]
		byPart[partOf(name)] += n
		fns = append(fns, size{name, n})
		code += n
	}
	var list []size
	for k, v := range byPart {
		list = append(list, size{k, v})
	}
	order := func(l []size) {
		sort.Slice(l, func(a, b int) bool {
			if l[a].bytes != l[b].bytes {
				return l[a].bytes > l[b].bytes
			}
			return l[a].name < l[b].name
		})
	}
	order(list)
	total := 8
	for _, v := range m.sections {
		total += v
	}
	kib := func(n int) string { return fmt.Sprintf("%6.0f KiB", float64(n)/1024) }
	for _, p := range list {
		fmt.Fprintf(w, "%s  %s\n", kib(p.bytes), p.name)
	}
	fmt.Fprintf(w, "%s  code, all parts\n", kib(code))
	fmt.Fprintf(w, "%s  data section (the runtime's tables of types and function positions, constant data)\n", kib(m.sections["data"]))
	fmt.Fprintf(w, "%s  function names (left out of the engine the page loads: -ldflags=-s)\n", kib(m.sections["custom name"]))
	fmt.Fprintf(w, "%s  the whole file (%d bytes)\n", kib(total), total)
	if nfuncs > 0 {
		order(fns)
		for _, f := range fns[:min(nfuncs, len(fns))] {
			fmt.Fprintf(w, "%8d  %s\n", f.bytes, f.name)
		}
	}
	return nil
}
