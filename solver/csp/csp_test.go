package csp

import (
	"os"
	"strings"
	"testing"
)

// The served page's meta tag is Page(), written out: index.html is a
// static file, so this test keeps it equal to the one source.
func TestIndexMetaIsPage(t *testing.T) {
	html, err := os.ReadFile("../../site/index.html")
	if err != nil {
		t.Fatal(err)
	}
	if !strings.Contains(string(html), Meta(Page())) {
		t.Errorf("site/index.html's policy meta tag differs from csp.Page(); want the line\n%s", Meta(Page()))
	}
}

func TestPolicies(t *testing.T) {
	for _, c := range []struct {
		name, policy string
		want, not    []string
	}{
		{"page", Page(), []string{"default-src 'self'", "object-src 'none'"}, []string{"unsafe-inline", "http", "frame-ancestors"}},
		{"header", Header(false, "https://wiki.example.org"), []string{"frame-ancestors 'none'"}, []string{"frame-ancestors *", "wiki"}},
		{"embed header", Header(true, ""), []string{"frame-ancestors *"}, nil},
		{"embed header for one host", Header(true, "https://wiki.example.org"), []string{"frame-ancestors https://wiki.example.org"}, []string{"*"}},
		{"offline", Offline([]string{"'sha256-a'"}, []string{"'sha256-b'"}), []string{"default-src 'none'", "script-src 'sha256-a' 'wasm-unsafe-eval'", "style-src 'sha256-b'"}, []string{"'self'", "unsafe-inline", "http"}},
		{"report", Report(), []string{"default-src 'none'", "img-src data:"}, []string{"script", "'self'"}},
	} {
		for _, w := range c.want {
			if !strings.Contains(c.policy, w) {
				t.Errorf("%s policy %q lacks %q", c.name, c.policy, w)
			}
		}
		for _, w := range c.not {
			if strings.Contains(c.policy, w) {
				t.Errorf("%s policy %q has %q", c.name, c.policy, w)
			}
		}
	}
}
