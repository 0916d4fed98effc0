// Package csp is the one source of the Content-Security-Policy of every
// page edgewise makes. The policies share one rule: nothing is loaded from
// any other address, no inline script runs unless named by its hash, and
// no user text becomes code. They differ where their use needs it:
//
//   - Page: the served page (site/index.html's meta tag, and the
//     development server's header): its own origin only; WebAssembly; the
//     worker from its own origin or a blob: URL (the single file's way).
//   - Header: Page plus frame-ancestors, which only a header can carry
//     (browsers ignore it in a meta tag): 'none' for every view except the
//     embed view, which a wiki page frames; there the host lists who may
//     frame it ("*" by default).
//   - Offline: the single file opened from disk has no origin to name, so
//     'self' becomes nothing: its inline scripts and styles are allowed by
//     their SHA-256 hashes, the worker and the engine's bytes by blob: and
//     data: URLs.
//   - Report: the downloaded report is a document with no script at all:
//     only its inline style and its data: picture.
package csp

import "strings"

// directive is one policy directive and its sources.
type directive struct {
	name    string
	sources []string
}

func join(ds []directive) string {
	parts := make([]string, len(ds))
	for i, d := range ds {
		parts[i] = strings.TrimSpace(d.name + " " + strings.Join(d.sources, " "))
	}
	return strings.Join(parts, "; ")
}

// closed are the directives every page shares: no plugins, no <base>, no
// form submissions.
var closed = []directive{{"object-src", []string{"'none'"}}, {"base-uri", []string{"'none'"}}, {"form-action", []string{"'none'"}}}

// Page is the policy of the served page.
func Page() string {
	return join(append([]directive{
		{"default-src", []string{"'self'"}},
		{"script-src", []string{"'self'", "'wasm-unsafe-eval'"}},
		{"worker-src", []string{"'self'", "blob:"}},
		{"style-src", []string{"'self'"}},
		{"img-src", []string{"'self'", "data:", "blob:"}},
		{"connect-src", []string{"'self'"}},
	}, closed...))
}

// EmbedQuery is the query word that asks for the embed view
// (page?embed#z=...): the server sees the query, never the fragment, so
// the view that may be framed is named there.
const EmbedQuery = "embed"

// Header is the policy header of the served page. embedFrom lists who may
// frame the embed view (for example "https://wiki.example.org"); it
// applies only when embed is true; empty means any page ("*").
func Header(embed bool, embedFrom string) string {
	from := "'none'"
	if embed {
		from = "*"
		if f := strings.TrimSpace(embedFrom); f != "" {
			from = f
		}
	}
	return Page() + "; frame-ancestors " + from
}

// Offline is the policy of the single offline file: scripts and styles
// are the given hash sources ('sha256-...').
func Offline(scriptHashes, styleHashes []string) string {
	return join(append([]directive{
		{"default-src", []string{"'none'"}},
		{"script-src", append(append([]string{}, scriptHashes...), "'wasm-unsafe-eval'")},
		{"worker-src", []string{"blob:"}},
		{"style-src", styleHashes},
		{"img-src", []string{"data:", "blob:"}},
		{"connect-src", []string{"blob:", "data:"}},
	}, closed...))
}

// Report is the policy of the downloaded report.
func Report() string {
	return join(append([]directive{
		{"default-src", []string{"'none'"}},
		{"img-src", []string{"data:"}},
		{"style-src", []string{"'unsafe-inline'"}},
	}, closed...))
}

// Meta is the meta tag that carries policy in a page.
func Meta(policy string) string {
	return `<meta http-equiv="Content-Security-Policy" content="` + policy + `">`
}
