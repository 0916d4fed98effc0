package main

import (
	"bytes"
	"strings"
	"testing"
)

// The smallest module with a function, byte for byte as the WebAssembly
// binary format lays it out (the core specification, chapter 5: the type,
// function, export and code sections, LEB128 numbers).
func TestAssembleBytes(t *testing.T) {
	got, err := assembleWAT(`(module (func $f (export "f") (result i32) i32.const 42))`)
	if err != nil {
		t.Fatal(err)
	}
	want := []byte{
		0x00, 0x61, 0x73, 0x6d, 0x01, 0x00, 0x00, 0x00, // magic, version 1
		0x01, 0x05, 0x01, 0x60, 0x00, 0x01, 0x7f, // types: () -> i32
		0x03, 0x02, 0x01, 0x00, // functions: type 0
		0x07, 0x05, 0x01, 0x01, 'f', 0x00, 0x00, // exports: "f", function 0
		0x0a, 0x06, 0x01, 0x04, 0x00, 0x41, 0x2a, 0x0b, // code: no locals, i32.const 42, end
	}
	if !bytes.Equal(got, want) {
		t.Errorf("got  % x\nwant % x", got, want)
	}
}

// Immediates: signed LEB128 in both directions of the 32-bit range
// (0xedb88320 is a negative i32), label depths counted outward, memory
// arguments with their natural alignment.
func TestAssembleImmediates(t *testing.T) {
	cases := []struct {
		name, body string
		want       []byte // the body's code, before the final end
	}{
		{"small", "i32.const -1 drop", []byte{0x41, 0x7f, 0x1a}},
		{"64", "i32.const 64 drop", []byte{0x41, 0xc0, 0x00, 0x1a}},
		{"unsigned top bit", "i32.const 0xedb88320 drop", []byte{0x41, 0xa0, 0x86, 0xe2, 0xed, 0x7e, 0x1a}},
		{"label depth", "block $out loop $again br $out end end", []byte{0x02, 0x40, 0x03, 0x40, 0x0c, 0x01, 0x0b, 0x0b}},
		{"inner label", "block $out loop $again i32.const 0 br_if $again end end", []byte{0x02, 0x40, 0x03, 0x40, 0x41, 0x00, 0x0d, 0x00, 0x0b, 0x0b}},
		{"load", "i32.const 0 i32.load offset=1280 drop", []byte{0x41, 0x00, 0x28, 0x02, 0x80, 0x0a, 0x1a}},
		{"unaligned", "i32.const 0 i32.load16_u align=1 drop", []byte{0x41, 0x00, 0x2f, 0x00, 0x00, 0x1a}},
	}
	for _, c := range cases {
		got, err := assembleWAT(`(module (memory 1) (func $f ` + c.body + `))`)
		if err != nil {
			t.Errorf("%s: %v", c.name, err)
			continue
		}
		code := append(append([]byte{}, c.want...), 0x0b)
		if !bytes.HasSuffix(got, code) {
			t.Errorf("%s: % x does not end in % x", c.name, got, code)
		}
	}
}

func TestAssembleErrors(t *testing.T) {
	cases := []struct{ src, want string }{
		{`(module (func $f i32.cons 1))`, `unknown instruction "i32.cons"`},
		{`(module (func $f br $nowhere))`, "no enclosing label $nowhere"},
		{`(module (func $f local.get $x drop))`, "no local $x"},
		{`(module (func $f call $g))`, "no function $g"},
		{`(module (func $f block))`, "1 blocks left open"},
		{`(module (func $f end))`, "end with no block open"},
		{`(module (func $f i32.const 1x drop))`, `bad number "1x"`},
		{`(module (func $f i32.const 0x1ffffffff drop))`, `bad number "0x1ffffffff"`},
		{`(module (func $f i32.const))`, "i32.const needs an operand"},
		{`(module (func $f (i32.const 1)))`, "written flat"},
		{`(module (func $f)`, "unclosed ("},
		{`(module))`, "unbalanced )"},
		{`(module (data (i32.const 0) "\zz"))`, "bad escape"},
		{`(module (table 1))`, `unknown field "table"`},
		{`(module (func $f) (func $f))`, "a second $f"},
	}
	for _, c := range cases {
		_, err := assembleWAT(c.src)
		if err == nil || !strings.Contains(err.Error(), c.want) {
			t.Errorf("%s: %v, want an error with %q", c.src, err, c.want)
		}
	}
}
