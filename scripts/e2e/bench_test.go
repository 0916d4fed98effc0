package e2e

import (
	"context"
	"fmt"
	"os"
	"path/filepath"
	"sort"
	"strconv"
	"strings"
	"testing"
	"time"

	"github.com/chromedp/chromedp"
)

// BenchmarkEditToPicture types one-key edits into the right edge's formula
// of the demo project (default grid) and measures, inside the page, the
// time from the key going down to the redrawn picture on screen: the page's
// "edgewise:solved" event, sent after the canvas is drawn, and then the
// frame that shows it drawn by the browser (a task posted in that frame's
// callback runs after its layout and paint). It reports the median over
// the edits, on screen (the target is 100 ms or less) and drawn. `make
// bench-browser` runs it with 20 edits.
func BenchmarkEditToPicture(b *testing.B) {
	tb := newTab(b)
	tb.open(b, siteURL)
	editBench(b, tb, "in-right-expr", "demo right edge")
}

// BenchmarkEditToPictureSegments is BenchmarkEditToPicture on an edge made
// of parts: the seepage section with two pools over a floor (the three
// parts of its top edge solved by the mixed fit), one-key edits to the
// upstream pool's head.
func BenchmarkEditToPictureSegments(b *testing.B) {
	tb := newTab(b)
	tb.open(b, siteURL)
	tb.loadProject(b, `{"schema":"edgewise/1","title":"weir","physics":"seepage","width":40,"height":12,"conductivity":2e-5,
	  "edges":{"bottom":{"kind":"flux","expr":"0"},"left":{"kind":"flux","expr":"0"},"right":{"kind":"flux","expr":"0"},
	  "top":{"segments":[{"to":15,"kind":"value","expr":"9"},{"to":25,"kind":"flux","expr":"0"},{"kind":"value","expr":"2"}]}}}`)
	editBench(b, tb, "part-top-0-expr", "upstream pool's head")
}

// editBench types b.N one-key edits into the input with the given id and
// reports the median and largest time from the key to the redrawn picture.
func editBench(b *testing.B, tb *tab, id, what string) {
	eval[bool](b, tb, `(() => {
	  window.benchTimes = []; window.benchDrawn = []; window.benchT0 = 0;
	  const inp = document.getElementById(`+strconv.Quote(id)+`);
	  inp.addEventListener("keydown", () => { window.benchT0 = performance.now(); }, true);
	  document.addEventListener("edgewise:solved", () => {
	    const t0 = window.benchT0;
	    if (!t0) return;
	    window.benchT0 = 0;
	    window.benchDrawn.push(performance.now() - t0);
	    requestAnimationFrame(() => setTimeout(() => window.benchTimes.push(performance.now() - t0), 0));
	  });
	  return true; })()`)
	base := eval[string](b, tb, `document.getElementById(`+strconv.Quote(id)+`).value`)
	if err := chromedp.Do(tb.ctx, chromedp.Focus(chromedp.ID(id))); err != nil {
		b.Fatal(err)
	}
	b.ResetTimer()
	for i := 0; i < b.N; i++ {
		// one key replaces the last character: a single edit, e.g. 25 -> 21 -> 22
		eval[bool](b, tb, `(() => { const e = document.getElementById(`+strconv.Quote(id)+`);
		  e.setSelectionRange(e.value.length - 1, e.value.length); return true; })()`)
		key := fmt.Sprint(1 + i%9)
		if err := chromedp.Do(tb.ctx, chromedp.KeyEvent(key)); err != nil {
			b.Fatal(err)
		}
		expr := fmt.Sprintf(`window.benchTimes.length >= %d`, i+1)
		if _, err := chromedp.Run(tb.ctx, chromedp.Poll[bool](expr, chromedp.WithPollingTimeout(60*time.Second))); err != nil {
			b.Fatalf("edit %d (%s) was not redrawn: %v", i, key, err)
		}
	}
	b.StopTimer()
	times := eval[[]float64](b, tb, `window.benchTimes`)
	drawn := eval[[]float64](b, tb, `window.benchDrawn`)
	median := func(v []float64) float64 {
		sort.Float64s(v)
		if len(v)%2 == 0 {
			return (v[len(v)/2-1] + v[len(v)/2]) / 2
		}
		return v[len(v)/2]
	}
	m, md := median(times), median(drawn)
	b.ReportMetric(m, "ms/edit-median")
	b.ReportMetric(times[len(times)-1], "ms/edit-max")
	b.ReportMetric(md, "ms/edit-drawn-median")
	status := eval[string](b, tb, `document.getElementById("status").textContent`)
	b.Logf("%s %q, %d edits: on screen median %.1f ms, min %.1f, max %.1f; drawn median %.1f ms; last: %s", what, base, len(times), m, times[0], times[len(times)-1], md, status)
}

// BenchmarkFirstPicture opens the offline file (dist/edgewise.html, the
// demo) and measures, inside the page, the time from the page's start to
// the inputs filled, to the engine up (unpacked, compiled, started) and to
// the first picture on screen (the demo solved and drawn, and the frame
// that shows it drawn by the browser: the page marks it from a task posted
// in that frame's callback, which runs after the frame's layout and
// paint), and when the first picture's cross-check came in. It reports the
// medians; the target for the picture is 1 s. Each open is a first open: a
// fresh browser context, so a new renderer process with nothing compiled
// and nothing stored (in one process the browser keeps the engine's
// compiled code from one open to the next, and the numbers would be those
// of a second open); the browser runs without the page of its own it would
// load into each new window (browser_test.go, EDGEWISE_OMNIBOX_POPUP).
// `make bench-browser` runs it 5 times; it logs the
// median of every step of the start (the page's performance marks).
// EDGEWISE_OFFLINE_FILE names another build of the file to measure (an
// absolute path), for a comparison run by run.
func BenchmarkFirstPicture(b *testing.B) {
	file := "file://" + filepath.Join(root, "dist", "edgewise.html")
	if f := os.Getenv("EDGEWISE_OFFLINE_FILE"); f != "" {
		file = "file://" + f // another build of the file, to compare with
	}
	var form, up, pic, check []float64
	steps := map[string][]float64{}
	b.ResetTimer()
	for i := 0; i < b.N; i++ {
		ctx, cancel := chromedp.NewContext(allocCtx, chromedp.WithNewBrowserContext())
		ctx, cancel2 := context.WithTimeout(ctx, 2*time.Minute)
		tb := &tab{ctx: ctx}
		if _, err := chromedp.Run(ctx, chromedp.Navigate(file)); err != nil {
			b.Fatal(err)
		}
		tb.waitSolved(b, 1)
		if _, err := chromedp.Run(ctx, chromedp.Poll[bool](`document.documentElement.dataset.firstCheckAt !== undefined`, chromedp.WithPollingTimeout(60*time.Second))); err != nil {
			b.Fatalf("the first picture's cross-check did not come: %v", err)
		}
		d := `document.documentElement.dataset`
		t := eval[[]float64](b, tb, `[Number(`+d+`.formAt || NaN), Number(`+d+`.engineAt || NaN), Number(`+d+`.firstPictureAt), Number(`+d+`.firstCheckAt)]`)
		// the steps of the start: the page's performance marks "ew:..."
		// (the worker's own marked on the page's timeline) and the
		// document's parse
		for name, at := range eval[map[string]float64](b, tb, `(() => {
		  const o = {};
		  for (const m of performance.getEntriesByType("mark")) if (m.name.startsWith("ew:") && !(m.name in o)) o[m.name] = m.startTime;
		  const nav = performance.getEntriesByType("navigation")[0];
		  if (nav) { o["doc:response-end"] = nav.responseEnd; o["doc:interactive"] = nav.domInteractive; o["doc:loaded"] = nav.domContentLoadedEventEnd; }
		  const solved = performance.getEntriesByName("ew:solve-answered")[0];
		  if (solved && typeof solved.detail === "number") o["worker solve (ms)"] = solved.detail;
		  return o; })()`) {
			steps[name] = append(steps[name], at)
		}
		form = append(form, t[0])
		up = append(up, t[1])
		pic = append(pic, t[2])
		check = append(check, t[3])
		cancel2()
		cancel()
	}
	b.StopTimer()
	mid := func(v []float64) float64 {
		v = append([]float64{}, v...)
		sort.Float64s(v)
		return v[len(v)/2]
	}
	b.ReportMetric(mid(form), "ms/form-median")
	b.ReportMetric(mid(up), "ms/engine-up-median")
	b.ReportMetric(mid(pic), "ms/first-picture-median")
	b.ReportMetric(mid(check), "ms/first-check-median")
	names := make([]string, 0, len(steps))
	for name := range steps {
		names = append(names, name)
	}
	sort.Slice(names, func(i, j int) bool { return mid(steps[names[i]]) < mid(steps[names[j]]) })
	var lines strings.Builder // to standard error: a benchmark's log keeps only its first ten lines
	for _, name := range names {
		fmt.Fprintf(&lines, "\n  %-24s median %7.1f ms  %.0f", name, mid(steps[name]), steps[name])
	}
	fmt.Fprintf(os.Stderr, "%s, %d opens, the start's steps:%s\n", b.Name(), len(pic), lines.String())
	b.Logf("offline file, %d opens: inputs filled at %v ms, engine answering at %v ms, first picture at %v ms, its cross-check at %v ms", len(pic), form, up, pic, check)
}
