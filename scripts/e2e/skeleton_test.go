package e2e

import (
	"context"
	"path/filepath"
	"strings"
	"testing"

	"github.com/chromedp/cdproto/cdp"
	"github.com/chromedp/cdproto/emulation"
	"github.com/chromedp/chromedp"
)

// The served page opens with the demo project solved and drawn, and asks
// nothing of any other origin.
func TestDemoIsDrawn(t *testing.T) {
	tb := newTab(t)
	tb.open(t, siteURL)
	if n := eval[int](t, tb, canvasColours); n < 20 {
		t.Errorf("the field canvas shows %d colours; a drawn field has many", n)
	}
	p := eval[map[string]any](t, tb, `window.edgewise.project()`)
	if p["schema"] != "edgewise/1" || p["title"] == "" {
		t.Errorf("project() = %v, want the demo project", p)
	}
	tb.shot(t, "demo")
	if bad := outsideRequests(tb.requests(), siteURL); len(bad) > 0 {
		t.Errorf("requests outside the page's origin: %v", bad)
	}
}

// window.edgewise.load answers with the result JSON of the contract, and
// rejects a bad project with a one-line error naming the field while the
// last good picture stays.
func TestLoadAPI(t *testing.T) {
	tb := newTab(t)
	tb.open(t, siteURL)
	// Exact identity: a unit square with one edge at 1 and three at 0 has
	// the value 1/4 at its centre (the four rotations add up to 1).
	r := eval[map[string]any](t, tb, `window.edgewise.load({schema: "edgewise/1", physics: "generic",
	  width: 1, height: 1, conductivity: 1,
	  edges: {bottom: {kind: "value", expr: "0"}, top: {kind: "value", expr: "1"},
	          left: {kind: "value", expr: "0"}, right: {kind: "value", expr: "0"}},
	  probes: [{x: 0.5, y: 0.5, label: "centre"}]})`)
	if r["schema"] != "edgewise-result/1" {
		t.Fatalf("result schema = %v", r["schema"])
	}
	probes, _ := r["probes"].([]any)
	if len(probes) != 1 {
		t.Fatalf("probes = %v", r["probes"])
	}
	if v, _ := probes[0].(map[string]any)["value"].(float64); v < 0.25-1e-6 || v > 0.25+1e-6 {
		t.Errorf("centre value = %v, want 0.25", v)
	}
	before := eval[string](t, tb, `document.getElementById("field").toDataURL()`)
	msg := eval[string](t, tb, `window.edgewise.load({schema: "edgewise/1", physics: "generic",
	  width: -2, height: 1, conductivity: 1, edges: {}}).then(() => "resolved", e => e.message)`)
	if !strings.HasPrefix(msg, "width: ") || strings.Contains(msg, "\n") {
		t.Errorf("bad project rejected with %q, want one line starting with \"width: \"", msg)
	}
	after := eval[string](t, tb, `document.getElementById("field").toDataURL()`)
	if before != after {
		t.Errorf("the picture changed after a rejected project; the last good one must stay")
	}
}

// The single offline file, opened from disk, solves and draws the demo and
// requests nothing outside itself.
func TestOfflineFile(t *testing.T) {
	tb := newTab(t)
	tb.open(t, "file://"+filepath.Join(root, "dist", "edgewise.html"))
	if n := eval[int](t, tb, canvasColours); n < 20 {
		t.Errorf("the offline file's canvas shows %d colours; a drawn field has many", n)
	}
	tb.shot(t, "offline")
	if bad := outsideRequests(tb.requests(), "file"); len(bad) > 0 {
		t.Errorf("the offline file made requests outside itself: %v", bad)
	}
	reqs := tb.requests()
	if len(reqs) == 0 {
		t.Errorf("no requests recorded at all: the request log does not work")
	}
}

// With JavaScript off the page shows its inputs and a note that says why
// nothing is solved (the body is otherwise hidden until the last script
// shows it); with JavaScript on there is no such note.
func TestWithoutJavaScript(t *testing.T) {
	bothPages(t, func(t *testing.T, url string) {
		tb := newTab(t)
		if err := chromedp.Do(tb.ctx, chromedp.Func(func(ctx context.Context, tg *chromedp.Target) error {
			_, err := cdp.Call(ctx, tg, emulation.SetScriptExecutionDisabled, emulation.SetScriptExecutionDisabledParams{Value: true})
			return err
		})); err != nil {
			t.Fatal(err)
		}
		if err := chromedp.Do(tb.ctx, chromedp.Navigate(url)); err != nil {
			t.Fatal(err)
		}
		got := eval[[]any](t, tb, `(() => {
		  const note = document.querySelector("p.noscript");
		  const form = document.getElementById("inputs");
		  return [getComputedStyle(document.body).display, note ? note.textContent : "", note ? note.getBoundingClientRect().height : 0,
		    form ? form.getBoundingClientRect().height : 0, document.documentElement.dataset.solved || ""];
		})()`)
		if got[0] == "none" {
			t.Errorf("with JavaScript off the page is blank (body display none)")
		}
		if note, _ := got[1].(string); !strings.Contains(note, "JavaScript") {
			t.Errorf("with JavaScript off the page says %q, want a note about JavaScript", note)
		}
		if h, _ := got[2].(float64); h <= 0 {
			t.Errorf("the note about JavaScript takes no room: %v", got[2])
		}
		if h, _ := got[3].(float64); h <= 0 {
			t.Errorf("the inputs are not shown with JavaScript off: %v", got[3])
		}
		if got[4] != "" {
			t.Errorf("something solved with JavaScript off: %v", got[4])
		}
		tb.shot(t, "no-javascript-"+pageName(url))

		on := newTab(t)
		on.open(t, url)
		if n := eval[int](t, on, `document.querySelectorAll("p.noscript").length`); n != 0 {
			t.Errorf("with JavaScript on the page shows %d notes about JavaScript", n)
		}
	})
}
