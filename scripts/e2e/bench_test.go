package e2e

import (
	"fmt"
	"path/filepath"
	"sort"
	"testing"
	"time"

	"github.com/chromedp/chromedp"
)

// BenchmarkEditToPicture types one-key edits into the right edge's formula
// of the demo project (default grid) and measures, inside the page, the
// time from the key going down to the redrawn picture (the page's
// "edgewise:solved" event, sent after the canvas is drawn). It reports the
// median over the edits; the target is 100 ms or less. `make
// bench-browser` runs it with 20 edits.
func BenchmarkEditToPicture(b *testing.B) {
	tb := newTab(b)
	tb.open(b, siteURL)
	eval[bool](b, tb, `(() => {
	  window.benchTimes = []; window.benchEngine = []; window.benchT0 = 0;
	  const inp = document.getElementById("in-right-expr");
	  inp.addEventListener("keydown", () => { window.benchT0 = performance.now(); }, true);
	  document.addEventListener("edgewise:solved", () => {
	    if (!window.benchT0) return;
	    window.benchTimes.push(performance.now() - window.benchT0);
	    window.benchT0 = 0;
	  });
	  return true; })()`)
	base := eval[string](b, tb, `document.getElementById("in-right-expr").value`)
	if err := chromedp.Do(tb.ctx, chromedp.Focus(chromedp.ID("in-right-expr"))); err != nil {
		b.Fatal(err)
	}
	b.ResetTimer()
	for i := 0; i < b.N; i++ {
		// one key replaces the last character: a single edit, e.g. 25 -> 21 -> 22
		eval[bool](b, tb, `(() => { const e = document.getElementById("in-right-expr");
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
	sort.Float64s(times)
	median := times[len(times)/2]
	if len(times)%2 == 0 {
		median = (times[len(times)/2-1] + times[len(times)/2]) / 2
	}
	b.ReportMetric(median, "ms/edit-median")
	b.ReportMetric(times[len(times)-1], "ms/edit-max")
	status := eval[string](b, tb, `document.getElementById("status").textContent`)
	b.Logf("demo right edge %q, %d edits: median %.1f ms, min %.1f, max %.1f; last: %s", base, len(times), median, times[0], times[len(times)-1], status)
}

// BenchmarkFirstPicture opens the offline file (dist/edgewise.html, the
// demo) and measures, inside the page, the time from the page's start to
// the inputs filled, to the engine's first answer (decoded, compiled,
// started) and to the first picture on screen (the demo solved and drawn). It reports the medians; the
// target for the picture is 1 s. `make bench-browser` runs it 5 times.
func BenchmarkFirstPicture(b *testing.B) {
	file := "file://" + filepath.Join(root, "dist", "edgewise.html")
	tb := newTab(b)
	var form, up, pic []float64
	b.ResetTimer()
	for i := 0; i < b.N; i++ {
		if err := chromedp.Do(tb.ctx, chromedp.Navigate("about:blank")); err != nil {
			b.Fatal(err)
		}
		if err := chromedp.Do(tb.ctx, chromedp.Navigate(file)); err != nil {
			b.Fatal(err)
		}
		tb.waitSolved(b, 1)
		d := `document.documentElement.dataset`
		t := eval[[]float64](b, tb, `[Number(`+d+`.formAt || NaN), Number(`+d+`.engineAt || NaN), Number(`+d+`.firstPictureAt)]`)
		form = append(form, t[0])
		up = append(up, t[1])
		pic = append(pic, t[2])
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
	b.Logf("offline file, %d opens: inputs filled at %v ms, engine answering at %v ms, first picture at %v ms", len(pic), form, up, pic)
}
