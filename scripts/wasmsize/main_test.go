package main

import (
	"bytes"
	"strings"
	"testing"
)

// uleb encodes n as unsigned LEB128.
func uleb(n int) []byte {
	var b []byte
	for {
		c := byte(n & 0x7f)
		if n >>= 7; n != 0 {
			b = append(b, c|0x80)
			continue
		}
		return append(b, c)
	}
}

func str(s string) []byte { return append(uleb(len(s)), s...) }

func section(id byte, body []byte) []byte {
	return append(append([]byte{id}, uleb(len(body))...), body...)
}

// tiny is a hand-made module: one imported function, three bodies of
// 200, 3 and 40 bytes named after a runtime, a series and an fmt
// function, a data section of 5 bytes, and (withNames) the name section.
func tiny(withNames bool) []byte {
	b := []byte("\x00asm\x01\x00\x00\x00")
	imp := append(uleb(1), str("go")...)
	imp = append(imp, str("debug")...)
	imp = append(imp, 0, 0) // function of type 0
	b = append(b, section(2, imp)...)
	code := uleb(3)
	for _, n := range []int{200, 3, 40} {
		code = append(code, uleb(n)...)
		code = append(code, make([]byte, n)...)
	}
	b = append(b, section(10, code)...)
	b = append(b, section(11, []byte{1, 2, 3, 4, 5})...)
	if !withNames {
		return b
	}
	names := uleb(4)
	for i, n := range []string{"go.debug", "runtime.mallocgc", "edgewise_solver_series.(*Solution).Grid", "fmt.Sprintf"} {
		names = append(names, uleb(i)...)
		names = append(names, str(n)...)
	}
	body := append(str("name"), 1)
	body = append(body, uleb(len(names))...)
	body = append(body, names...)
	return append(b, section(0, body)...)
}

func TestReport(t *testing.T) {
	m, err := parse(tiny(true))
	if err != nil {
		t.Fatal(err)
	}
	if m.imported != 1 || len(m.bodies) != 3 || m.bodies[0] != 200 || m.sections["data"] != 5 {
		t.Fatalf("read %+v", m)
	}
	var out bytes.Buffer
	if err := m.report(&out, 2); err != nil {
		t.Fatal(err)
	}
	got := out.String()
	for _, want := range []string{
		"0 KiB  Go runtime", // 200 bytes rounds to 0 KiB; its line comes first
		"code, all parts",
		"     200  runtime.mallocgc\n      40  fmt.Sprintf\n",
	} {
		if !strings.Contains(got, want) {
			t.Errorf("report lacks %q:\n%s", want, got)
		}
	}
	if i, j := strings.Index(got, "Go runtime"), strings.Index(got, "fmt and reflect"); i < 0 || j < i {
		t.Errorf("parts not largest first:\n%s", got)
	}
	if !strings.Contains(got, "the engine (series") {
		t.Errorf("series function not in the engine's part:\n%s", got)
	}
}

func TestRefuses(t *testing.T) {
	if _, err := parse([]byte("not wasm")); err == nil {
		t.Error("not wasm: no error")
	}
	b := tiny(true)
	if _, err := parse(b[:len(b)-3]); err == nil {
		t.Error("cut short: no error")
	}
	// without the name section: read, but no report
	m, err := parse(tiny(false))
	if err != nil {
		t.Fatal(err)
	}
	if err := m.report(&bytes.Buffer{}, 0); err == nil {
		t.Error("no names: no error")
	}
}
