package main

import (
	"os"
	"path/filepath"
	"strings"
	"testing"
)

// Every Go file of the bridge touches JavaScript and so must build only for
// js/wasm; this test (built for the host) fails when one lacks the tag.
func TestEveryFileIsTagged(t *testing.T) {
	files, err := filepath.Glob("*.go")
	if err != nil {
		t.Fatal(err)
	}
	checked := 0
	for _, f := range files {
		if f == "tags_test.go" {
			continue
		}
		b, err := os.ReadFile(f)
		if err != nil {
			t.Fatal(err)
		}
		if !strings.HasPrefix(string(b), "//go:build js && wasm\n") {
			t.Errorf("%s does not start with //go:build js && wasm", f)
		}
		checked++
	}
	if checked < 2 {
		t.Errorf("checked %d files, expected the bridge's sources", checked)
	}
}
