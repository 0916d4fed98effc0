package e2e

import (
	"context"
	"strings"
	"testing"

	"github.com/chromedp/cdproto/cdp"
	"github.com/chromedp/cdproto/page"
	"github.com/chromedp/chromedp"
)

// structuredWarnings makes sure the page sees the engine's warnings as
// {code, edges, text}. An engine that still sends plain strings (before
// the structured warnings are merged) has its replies translated, in this
// test only, by the wording it uses; the page itself never reads wording.
// Once the engine sends objects this does nothing.
func structuredWarnings(t *testing.T, tb *tab) {
	t.Helper()
	js := `(() => {
	  const parse = JSON.parse;
	  const side = "(bottom|top|left|right)";
	  const corner = new RegExp("^flow through the " + side + " edge is infinite: .* at the " + side + "-" + side + " corner");
	  const step = new RegExp("^The prescribed value on the " + side + " edge jumps");
	  JSON.parse = function (text, ...rest) {
	    const v = parse.call(JSON, text, ...rest);
	    if (v && v.schema === "edgewise-result/1" && Array.isArray(v.warnings)) {
	      v.warnings = v.warnings.map(w => {
	        if (typeof w !== "string") return w;
	        let m = corner.exec(w);
	        if (m) return {code: "corner-jump", edges: [m[2], m[3]], text: w};
	        m = step.exec(w);
	        if (m) return {code: "step-jump", edges: [m[1]], text: w};
	        return {code: "term-limit", edges: [], text: w};
	      });
	    }
	    return v;
	  };
	})()`
	tb.beforeScripts(t, js)
}

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
	structuredWarnings(t, tb)
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
