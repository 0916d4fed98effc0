package main

import (
	"net/http"
	"net/http/httptest"
	"os"
	"path/filepath"
	"strings"
	"testing"
)

func TestHandler(t *testing.T) {
	dir := t.TempDir()
	for name, body := range map[string]string{"index.html": "<!doctype html>", "app.wasm": "\x00asm", "x.go": "package x"} {
		if err := os.WriteFile(filepath.Join(dir, name), []byte(body), 0o644); err != nil {
			t.Fatal(err)
		}
	}
	srv := httptest.NewServer(Handler(dir, ""))
	defer srv.Close()
	get := func(path string) *http.Response {
		t.Helper()
		resp, err := http.Get(srv.URL + path)
		if err != nil {
			t.Fatal(err)
		}
		resp.Body.Close()
		return resp
	}
	// WebAssembly must come as application/wasm for instantiateStreaming
	// (WebAssembly JavaScript Interface, "compile a potential WebAssembly response")
	if r := get("/app.wasm"); r.Header.Get("Content-Type") != "application/wasm" {
		t.Errorf("app.wasm content type %q", r.Header.Get("Content-Type"))
	}
	r := get("/")
	if r.StatusCode != 200 || !strings.Contains(r.Header.Get("Content-Security-Policy"), "default-src 'self'") ||
		r.Header.Get("Cache-Control") != "no-store" {
		t.Errorf("index: status %d, headers %v", r.StatusCode, r.Header)
	}
	// only the embed view may be framed (issue: frame-ancestors * for every view)
	if p := r.Header.Get("Content-Security-Policy"); !strings.HasSuffix(p, "; frame-ancestors 'none'") {
		t.Errorf("the page's policy %q lets other pages frame it", p)
	}
	if p := get("/?embed").Header.Get("Content-Security-Policy"); !strings.HasSuffix(p, "; frame-ancestors *") {
		t.Errorf("the embed view's policy %q does not let a wiki page frame it", p)
	}
	if r := get("/x.go"); r.StatusCode != 404 {
		t.Errorf("a Go source file was served (status %d)", r.StatusCode)
	}
}

func TestDisplayAddr(t *testing.T) {
	for in, want := range map[string]string{"127.0.0.1:8080": "localhost:8080", "[::1]:99": "localhost:99", "10.1.2.3:80": "10.1.2.3:80"} {
		if got := displayAddr(in); got != want {
			t.Errorf("displayAddr(%q) = %q, want %q", in, got, want)
		}
	}
}

// A host that names who may embed narrows framing to them.
func TestEmbedFrom(t *testing.T) {
	dir := t.TempDir()
	if err := os.WriteFile(filepath.Join(dir, "index.html"), []byte("<!doctype html>"), 0o644); err != nil {
		t.Fatal(err)
	}
	srv := httptest.NewServer(Handler(dir, "https://wiki.example.org"))
	defer srv.Close()
	resp, err := http.Get(srv.URL + "/?embed")
	if err != nil {
		t.Fatal(err)
	}
	resp.Body.Close()
	if p := resp.Header.Get("Content-Security-Policy"); !strings.HasSuffix(p, "; frame-ancestors https://wiki.example.org") {
		t.Errorf("embed view policy %q, want framing by the wiki only", p)
	}
}
