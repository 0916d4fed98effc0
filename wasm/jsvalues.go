//go:build js && wasm

package main

// Values between Go and JavaScript: arguments in, typed arrays out.

import (
	"fmt"
	"unsafe"

	"github.com/hack-pad/safejs"
)

// stringArg reads argument i as a string; optional arguments may be
// missing, undefined or null and then give "".
func stringArg(args []safejs.Value, i int, what string, optional bool) (string, error) {
	if i >= len(args) || args[i].IsUndefined() || args[i].IsNull() {
		if optional {
			return "", nil
		}
		return "", fmt.Errorf("missing %s", what)
	}
	s, err := args[i].String()
	if err != nil {
		return "", fmt.Errorf("%s must be text: %w", what, err)
	}
	return s, nil
}

// float64Array copies s into a new JavaScript Float64Array in one block copy.
func float64Array(s []float64) (safejs.Value, error) {
	ctor, err := safejs.Global().Get("Float64Array")
	if err != nil {
		return safejs.Value{}, err
	}
	arr, err := ctor.New(len(s))
	if err != nil {
		return safejs.Value{}, err
	}
	if len(s) == 0 {
		return arr, nil
	}
	buf, err := arr.Get("buffer")
	if err != nil {
		return safejs.Value{}, err
	}
	u8ctor, err := safejs.Global().Get("Uint8Array")
	if err != nil {
		return safejs.Value{}, err
	}
	view, err := u8ctor.New(buf)
	if err != nil {
		return safejs.Value{}, err
	}
	raw := unsafe.Slice((*byte)(unsafe.Pointer(unsafe.SliceData(s))), len(s)*8)
	if _, err := safejs.CopyBytesToJS(view, raw); err != nil {
		return safejs.Value{}, err
	}
	return arr, nil
}
