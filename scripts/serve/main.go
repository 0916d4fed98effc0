// Command serve is the development server for the edgewise page: a small
// static file server for one folder (site/ by default) that sends the right
// content type for WebAssembly, forbids caching (so a rebuilt app.wasm is
// always picked up) and adds the same Content-Security-Policy that the page
// carries in its own meta tag.
//
// Usage:
//
//	go run ./scripts/serve [-addr 127.0.0.1:8080] [-dir site]
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
)

func main() {
	addr := flag.String("addr", "127.0.0.1:8080", "listen address (host:port; port 0 picks a free one)")
	dir := flag.String("dir", "site", "folder to serve")
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
	log.Fatal(http.Serve(ln, Handler(*dir)))
}

// Handler serves the files of dir with the headers the page needs.
func Handler(dir string) http.Handler {
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
		h.Set("Content-Security-Policy", CSP)
		files.ServeHTTP(w, r)
	})
}

// CSP is the policy the served page runs under: nothing from outside its
// own origin, no inline script, WebAssembly allowed.
const CSP = "default-src 'self'; script-src 'self' 'wasm-unsafe-eval'; worker-src 'self' blob:; " +
	"style-src 'self'; img-src 'self' data: blob:; connect-src 'self'; object-src 'none'; " +
	"base-uri 'none'; form-action 'none'; frame-ancestors *"

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
