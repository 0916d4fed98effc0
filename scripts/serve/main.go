// Command serve is the development server for the edgewise page: a small
// static file server for one folder (site/ by default) that sends the right
// content type for WebAssembly, forbids caching (so a rebuilt app.wasm is
// always picked up) and sends the page's Content-Security-Policy
// (edgewise/solver/csp) as a header, which alone can say who may frame the
// page: nobody, except for the embed view (page?embed#...), which any page
// may frame unless -embed-from names the hosts that may.
//
// Usage:
//
//	go run ./scripts/serve [-addr 127.0.0.1:8080] [-dir site] [-embed-from "https://wiki.example.org"]
//
// It listens on localhost unless told otherwise and prints the URL to open.
package main

import (
	"flag"
	"fmt"
	"log"
	"mime"
	"net"
	"net/http"
	"os"
	"path/filepath"
	"strings"

	"edgewise/solver/csp"
)

func main() {
	addr := flag.String("addr", "127.0.0.1:8080", "listen address (host:port; port 0 picks a free one)")
	dir := flag.String("dir", "site", "folder to serve")
	embedFrom := flag.String("embed-from", "", "who may frame the embed view, as CSP frame-ancestors sources (empty: any page)")
	flag.Parse()

	if fi, err := os.Stat(filepath.Join(*dir, "index.html")); err != nil || fi.IsDir() {
		fmt.Fprintf(os.Stderr, "serve: %s has no index.html (run make build first)\n", *dir)
		os.Exit(1)
	}
	if _, err := os.Stat(filepath.Join(*dir, "app.wasm")); err != nil {
		fmt.Fprintf(os.Stderr, "serve: warning: %s has no app.wasm (run make build)\n", *dir)
	}
	ln, err := net.Listen("tcp", *addr)
	if err != nil {
		fmt.Fprintf(os.Stderr, "serve: %v\n", err)
		os.Exit(1)
	}
	fmt.Printf("edgewise: serving %s at http://%s/\n", *dir, displayAddr(ln.Addr().String()))
	log.Fatal(http.Serve(ln, Handler(*dir, *embedFrom)))
}

// Handler serves the files of dir with the headers the page needs;
// embedFrom is who may frame the embed view (see csp.Header).
func Handler(dir, embedFrom string) http.Handler {
	_ = mime.AddExtensionType(".wasm", "application/wasm")
	_ = mime.AddExtensionType(".mjs", "text/javascript")
	files := http.FileServer(http.Dir(dir))
	return http.HandlerFunc(func(w http.ResponseWriter, r *http.Request) {
		if strings.HasSuffix(r.URL.Path, ".go") {
			http.NotFound(w, r)
			return
		}
		h := w.Header()
		h.Set("Cache-Control", "no-store")
		h.Set("X-Content-Type-Options", "nosniff")
		h.Set("Content-Security-Policy", csp.Header(r.URL.Query().Has(csp.EmbedQuery), embedFrom))
		files.ServeHTTP(w, r)
	})
}

func displayAddr(a string) string {
	host, port, err := net.SplitHostPort(a)
	if err != nil {
		return a
	}
	if host == "127.0.0.1" || host == "::1" || host == "" || host == "0.0.0.0" || host == "::" {
		host = "localhost"
	}
	return net.JoinHostPort(host, port)
}
