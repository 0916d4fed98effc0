package project

import (
	"fmt"
	"sort"
	"strings"

	"edgewise/solver/jsonlite"
)

// The strict reading of JSON objects that the project file and the files
// kept with it (study files) share: one rule for unknown and missing keys,
// one way of naming what was found instead.

// Object returns v as an object whose keys are all required or optional,
// or the error naming the first unknown key (in sorted order) or missing
// key under path.
func Object(v any, path string, required []string, optional ...string) (map[string]any, *Error) {
	m, ok := v.(map[string]any)
	if !ok {
		return nil, Errorf(path, "expected an object {...}, got %s", Describe(v))
	}
	allowed := append(append([]string{}, required...), optional...)
	var unknown []string
	for k := range m {
		if !contains(allowed, k) {
			unknown = append(unknown, k)
		}
	}
	if len(unknown) > 0 {
		sort.Strings(unknown)
		return nil, Errorf(Join(path, unknown[0]), "unknown key (allowed here: %s)", strings.Join(allowed, ", "))
	}
	for _, k := range required {
		if _, ok := m[k]; !ok {
			return nil, Errorf(Join(path, k), "missing")
		}
	}
	return m, nil
}

// Describe names a JSON value for an error message: "the number 12",
// "the text \"abc\"", "a list", "an object", "null".
func Describe(v any) string {
	switch t := v.(type) {
	case nil:
		return "null"
	case bool:
		return fmt.Sprint(t)
	case jsonlite.Number:
		return "the number " + string(t)
	case string:
		return fmt.Sprintf("the text %q", Clip(t))
	case []any:
		return "a list"
	case map[string]any:
		return "an object"
	}
	return fmt.Sprintf("%T", v)
}

// Clip shortens a text from a file that an error message repeats, so that
// the message stays one readable line: "1234567890123456...(5000 bytes)".
func Clip(s string) string {
	const keep = 32
	if len(s) <= keep+8 {
		return s
	}
	i := keep
	for i > 0 && s[i]&0xC0 == 0x80 { // not inside a UTF-8 sequence
		i--
	}
	return fmt.Sprintf("%s...(%d bytes)", s[:i], len(s))
}

// Join appends a key to a field path.
func Join(path, key string) string {
	if path == "" {
		return key
	}
	return path + "." + key
}

func contains(list []string, s string) bool {
	for _, x := range list {
		if x == s {
			return true
		}
	}
	return false
}
