package e2e

import (
	"context"
	"strings"
	"testing"

	"github.com/chromedp/cdproto/cdp"
	"github.com/chromedp/cdproto/page"
	"github.com/chromedp/chromedp"
)

// beforeScripts runs js in every page the tab opens, before the page's
// own scripts.
func (tb *tab) beforeScripts(t *testing.T, js string) {
	t.Helper()
	if err := chromedp.Do(tb.ctx, chromedp.Func(func(ctx context.Context, tg *chromedp.Target) error {
		_, err := cdp.Call(ctx, tg, page.AddScriptToEvaluateOnNewDocument, page.AddScriptToEvaluateOnNewDocumentParams{Source: js})
		return err
	})); err != nil {
		t.Fatal(err)
	}
}

// An infinite flow is explained by the warning whose code and edges name
// it: a jump at a corner, or a step inside the edge.
func TestInfiniteFlowReasons(t *testing.T) {
	tb := newTab(t)
	tb.open(t, siteURL)
	n := tb.solved(t)
	// a step of value inside the bottom edge; the sides are insulated, so
	// no corner jumps
	eval[map[string]any](t, tb, `(() => { const p = `+plate+`;
	  p.edges.bottom.expr = "when(s < 0.2, 90, 30)";
	  p.edges.left = {kind: "flux", expr: "0"}; p.edges.right = {kind: "flux", expr: "0"};
	  return window.edgewise.load(p); })()`)
	tb.waitSolved(t, n+1)
	bottom := eval[string](t, tb, `[...document.querySelectorAll("#res-flows tr")].find(tr => tr.querySelector("th").textContent === "Bottom").querySelector("td").textContent`)
	if !strings.Contains(bottom, "infinite") || !strings.Contains(bottom, "jumps inside this edge") {
		t.Errorf("bottom flow shows %q, want infinite because the value jumps inside this edge", bottom)
	}
	why := eval[string](t, tb, `(document.querySelector("#results .why") || {}).textContent || ""`)
	if !strings.Contains(why, "inside an edge") || strings.Contains(why, "at a corner") {
		t.Errorf("the note on infinite flows says %q, want a jump inside an edge and nothing about corners", why)
	}
	notes := eval[[]string](t, tb, `[...document.querySelectorAll("#results ul.warnings li")].map(li => li.dataset.code || "")`)
	if len(notes) == 0 || notes[0] != "step-jump" {
		t.Errorf("notes from the engine carry codes %v, want the step-jump warning's text listed", notes)
	}
	tb.noErrors(t)
}
