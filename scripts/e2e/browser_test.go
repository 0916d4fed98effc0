package e2e

import (
	"context"
	"fmt"
	"net/http"
	"net/http/httptest"
	"net/url"
	"os"
	"os/exec"
	"path/filepath"
	"strings"
	"sync"
	"testing"
	"time"

	"github.com/chromedp/cdproto/cdp"
	"github.com/chromedp/cdproto/network"
	"github.com/chromedp/cdproto/runtime"
	"github.com/chromedp/chromedp"
)

var (
	allocCtx context.Context
	siteURL  string // the served site, ending in "/"
	root     string // the repository root
)

func TestMain(m *testing.M) {
	mode := os.Getenv("EDGEWISE_E2E")
	if mode == "" {
		fmt.Println("e2e: EDGEWISE_E2E is not set; browser tests skipped (make test runs them)")
		os.Exit(0)
	}
	var err error
	root, err = filepath.Abs("../..")
	if err != nil {
		panic(err)
	}
	browser := os.Getenv("EDGEWISE_CHROMIUM")
	if browser == "" {
		browser, _ = exec.LookPath("chromium")
	}
	if _, err := os.Stat(browser); browser == "" || err != nil {
		fmt.Println("e2e: chromium not found; install it with: apt-get update && apt-get install -y chromium")
		os.Exit(1)
	}
	for _, f := range []string{"site/app.wasm", "site/wasm_exec.js", "dist/edgewise.html"} {
		if _, err := os.Stat(filepath.Join(root, f)); err != nil {
			fmt.Printf("e2e: %s is missing: run make build dist first\n", f)
			os.Exit(1)
		}
	}
	srv := httptest.NewServer(noStore(http.FileServer(http.Dir(filepath.Join(root, "site")))))
	siteURL = srv.URL + "/"

	opts := append(chromedp.DefaultExecAllocatorOptions[:],
		chromedp.ExecPath(browser),
		chromedp.NoSandbox,
		chromedp.DisableGPU,
		chromedp.Flag("disable-quic", true),
		chromedp.Flag("disable-component-update", true),
		chromedp.Flag("disable-sync", true),
		chromedp.Flag("allow-file-access-from-files", false),
		chromedp.WindowSize(1280, 860),
	)
	if os.Getenv("EDGEWISE_OMNIBOX_POPUP") == "" {
		// Chromium loads a page of its own, the omnibox popup (a WebUI
		// page), into every new window. The tests and BenchmarkFirstPicture
		// open each page in a new window (a fresh browser context: a new
		// renderer process with nothing compiled or stored), and that page
		// then took 0.7 s of processor time during every open, on one of
		// this machine's two cores, the first picture coming 0.4-0.5 s
		// later. A file a user opens goes into a tab of a browser already
		// running, whose window loaded its popup long before; so it is off
		// here. EDGEWISE_OMNIBOX_POPUP=1 keeps it (to measure an open that
		// comes with a new window). The first two features are
		// chromedp's default list, which this flag replaces.
		opts = append(opts, chromedp.Flag("disable-features", "Translate,BlinkGenPropertyTrees,WebUIOmniboxPopup,WebUIOmniboxAimPopup,WebUIOmniboxFullPopup"))
	}
	if f := os.Getenv("EDGEWISE_JS_FLAGS"); f != "" {
		// an experiment with the browser's JavaScript engine (benchmarks
		// only: a page cannot set these)
		opts = append(opts, chromedp.Flag("js-flags", f))
	}
	var cancel context.CancelFunc
	allocCtx, cancel = chromedp.NewExecAllocator(context.Background(), opts...)
	// start the browser once, with a generous timeout for the first start
	// (the first Do ties the browser to bctx: no timeout context here, its
	// cancel would close the browser)
	bctx, bcancel := chromedp.NewContext(allocCtx)
	if err := chromedp.Do(bctx); err != nil {
		fmt.Println("e2e: chromium did not start:", err)
		os.Exit(1)
	}
	allocCtx = bctx // tabs open in this browser
	code := m.Run()
	bcancel()
	cancel()
	srv.Close()
	os.Exit(code)
}

func noStore(h http.Handler) http.Handler {
	return http.HandlerFunc(func(w http.ResponseWriter, r *http.Request) {
		w.Header().Set("Cache-Control", "no-store")
		h.ServeHTTP(w, r)
	})
}

// tab is one browser tab with a record of every request it made.
type tab struct {
	ctx  context.Context
	mu   sync.Mutex
	reqs []string
	errs []string // console errors and exceptions
}

func newTab(t testing.TB) *tab {
	t.Helper()
	ctx, cancel := chromedp.NewContext(allocCtx)
	ctx, cancel2 := context.WithTimeout(ctx, 2*time.Minute)
	t.Cleanup(func() { cancel2(); cancel() })
	tb := &tab{ctx: ctx}
	if err := chromedp.Listen(ctx, func(ev any) {
		switch e := ev.(type) {
		case *network.EventRequestWillBeSent:
			if e.Request != nil {
				tb.mu.Lock()
				tb.reqs = append(tb.reqs, e.Request.URL)
				tb.mu.Unlock()
			}
		case *runtime.EventExceptionThrown:
			if e.ExceptionDetails != nil {
				msg := e.ExceptionDetails.Text
				if e.ExceptionDetails.Exception != nil {
					msg += " " + e.ExceptionDetails.Exception.Description
				}
				tb.mu.Lock()
				tb.errs = append(tb.errs, msg)
				tb.mu.Unlock()
			}
		}
	}); err != nil {
		t.Fatal(err)
	}
	if err := chromedp.Do(ctx, chromedp.Func(func(ctx context.Context, tg *chromedp.Target) error {
		_, err := cdp.Call(ctx, tg, network.Enable, network.EnableParams{})
		return err
	})); err != nil {
		t.Fatal(err)
	}
	return tb
}

// noErrors fails the test when the page threw an uncaught exception.
func (tb *tab) noErrors(t testing.TB) {
	t.Helper()
	tb.mu.Lock()
	defer tb.mu.Unlock()
	for _, e := range tb.errs {
		t.Errorf("page exception: %s", e)
	}
}

func (tb *tab) requests() []string {
	tb.mu.Lock()
	defer tb.mu.Unlock()
	return append([]string{}, tb.reqs...)
}

// open navigates and waits until the page has solved at least once.
func (tb *tab) open(t testing.TB, u string) {
	t.Helper()
	if err := chromedp.Do(tb.ctx, chromedp.Navigate(u)); err != nil {
		t.Fatalf("open %s: %v", u, err)
	}
	tb.waitSolved(t, 1)
	// and settled: the first picture's cross-check follows it, and the
	// results written again then move what stands below them (a click
	// aimed at a button there before that could land elsewhere)
	settled := `(() => { const S = window.edgewiseInternal && window.edgewiseInternal.last(); return !S || S.checkPending !== true; })()`
	if _, err := chromedp.Run(tb.ctx, chromedp.Poll[bool](settled, chromedp.WithPollingTimeout(60*time.Second))); err != nil {
		t.Fatalf("open %s: the first picture's cross-check did not come: %v", u, err)
	}
}

// waitSolved waits until the page reports n solves (data-solved on <html>).
func (tb *tab) waitSolved(t testing.TB, n int) {
	t.Helper()
	expr := fmt.Sprintf(`Number(document.documentElement.dataset.solved || 0) >= %d`, n)
	if _, err := chromedp.Run(tb.ctx, chromedp.Poll[bool](expr, chromedp.WithPollingTimeout(60*time.Second))); err != nil {
		status, _ := chromedp.Run(tb.ctx, chromedp.Evaluate[string](`(document.getElementById("status")||{}).textContent || ""`))
		t.Fatalf("page did not solve (%d): %v; status: %q", n, err, status)
	}
}

func eval[T any](t testing.TB, tb *tab, js string) T {
	t.Helper()
	v, err := chromedp.Run(tb.ctx, chromedp.Evaluate[T](js, chromedp.EvalAwaitPromise))
	if err != nil {
		t.Fatalf("evaluate %.60q: %v", js, err)
	}
	return v
}

// shot saves a screenshot for people to look at.
func (tb *tab) shot(t testing.TB, name string) {
	t.Helper()
	png, err := chromedp.Run(tb.ctx, chromedp.CaptureScreenshot())
	if err != nil {
		t.Fatalf("screenshot: %v", err)
	}
	dir := filepath.Join(root, "scripts", "e2e", "screens")
	_ = os.MkdirAll(dir, 0o755)
	if err := os.WriteFile(filepath.Join(dir, name+".png"), png, 0o644); err != nil {
		t.Fatal(err)
	}
}

// outsideRequests lists requests that leave the page's own origin (for the
// served site) or the file itself (for the offline file).
func outsideRequests(reqs []string, own string) []string {
	var bad []string
	for _, r := range reqs {
		u, err := url.Parse(r)
		if err != nil {
			bad = append(bad, r)
			continue
		}
		switch u.Scheme {
		case "data", "blob":
			continue
		case "file":
			if own == "file" {
				continue
			}
		case "http", "https":
			if own != "file" && strings.HasPrefix(r, own) {
				continue
			}
		}
		bad = append(bad, r)
	}
	return bad
}

// canvasColours counts the distinct colours on the field canvas: a drawn
// field has many, a blank or failed one has one or two.
const canvasColours = `(() => {
  const c = document.getElementById("field");
  const d = c.getContext("2d").getImageData(0, 0, c.width, c.height).data;
  const seen = new Set();
  for (let i = 0; i < d.length; i += 4 * 7) seen.add((d[i] << 16) | (d[i+1] << 8) | d[i+2]);
  return seen.size;
})()`

// bothPages runs f as subtests on the served site and on the single
// offline file opened from disk.
func bothPages(t *testing.T, f func(t *testing.T, url string)) {
	for _, c := range []struct{ name, url string }{
		{"served", siteURL},
		{"offline file", "file://" + filepath.Join(root, "dist", "edgewise.html")},
	} {
		t.Run(c.name, func(t *testing.T) { f(t, c.url) })
	}
}

// pageName names the page a URL opens, for screenshots.
func pageName(url string) string {
	if strings.HasPrefix(url, "file:") {
		return "offline-file"
	}
	return "served"
}
