package e2e

import (
	"math"
	"path/filepath"
	"strings"
	"testing"
	"time"

	"github.com/chromedp/chromedp"
)

// recordFirstSolve keeps, for every page the tab opens, what the results
// said about the cross-check when the first picture was drawn, when the
// picture was drawn and when its frame was (the marks as they stood when
// the store said the solve was in), and what each worker's "init" message
// brought (the engine's text, a compiled module, or nothing: fetch
// app.wasm).
const recordFirstSolve = `(() => {
  try { localStorage.removeItem("edgewise.autosave.1"); } catch (e) {}
  window.bootSeen = { inits: [] };
  document.addEventListener("edgewise:solved", () => {
    if (window.bootSeen.firstCheck !== undefined) return;
    const row = document.getElementById("res-check");
    window.bootSeen.firstCheck = row ? row.textContent : "(no row)";
    window.bootSeen.statement = (document.getElementById("res-accuracy") || {}).textContent || "";
    window.bootSeen.pending = window.edgewiseInternal.last().checkPending === true;
    // by then the picture was drawn, and its frame too
    const drawn = performance.getEntriesByName("ew:picture-drawn")[0];
    const shown = performance.getEntriesByName("ew:first-picture")[0];
    window.bootSeen.drawn = drawn ? drawn.startTime : -1;
    window.bootSeen.shown = shown ? shown.startTime : -1;
    window.bootSeen.at = document.documentElement.dataset.firstPictureAt || "";
  });
  const W = window.Worker;
  window.Worker = class extends W {
    postMessage(m, t) {
      if (m && m.type === "init") window.bootSeen.inits.push(m.module ? "module" : typeof m.text === "string" ? "text" : "fetch");
      super.postMessage(m, t);
    }
  };
})()`

// The first picture is drawn before its cross-check, from the solve asked
// for before the engine was up: the results say the cross-check is pending
// (never a difference not yet measured), and then show the difference that
// the full solve of the same project gives. The picture goes on screen
// before the page lays out the rest of the reply (results, probes, notes):
// its frame is drawn, and marked, by the time the store says the solve is
// in (a new browser process took 0.15-0.35 s to lay those out, and the
// picture waited for them before).
func TestFirstPictureBeforeCrossCheck(t *testing.T) {
	bothPages(t, func(t *testing.T, url string) {
		tb := newTab(t)
		tb.beforeScripts(t, recordFirstSolve)
		tb.open(t, url)
		first := eval[map[string]any](t, tb, `window.bootSeen`)
		text, _ := first["firstCheck"].(string)
		if !strings.HasPrefix(text, "pending") || first["pending"] != true {
			t.Errorf("with the first picture the cross-check row says %q (pending %v), want pending", text, first["pending"])
		}
		// the statement too: the check is running, not "was not run"
		if st, _ := first["statement"].(string); !strings.Contains(st, "is running") || strings.Contains(st, "No independent check") {
			t.Errorf("with the first picture the accuracy statement says %q, want that the check is running", st)
		}
		// the first solve was asked for once: the page's first request took
		// the reply of the one sent as soon as the form was filled
		// (solving.js, askEarly), none was sent again
		drawn, _ := first["drawn"].(float64)
		shown, _ := first["shown"].(float64)
		if drawn <= 0 || shown < drawn || first["at"] == "" {
			t.Errorf("when the results came in: picture drawn at %v ms, its frame at %v ms, firstPictureAt %q; want both before, the frame after the drawing", first["drawn"], first["shown"], first["at"])
		}
		if n := eval[int](t, tb, `performance.getEntriesByName("ew:solve-asked").length`); n != 1 {
			t.Errorf("the first picture asked for %d first solves, want 1 (the early one taken)", n)
		}
		tb.waitFor(t, `document.documentElement.dataset.firstCheckAt !== undefined`, "the first picture's cross-check")
		got := eval[[]any](t, tb, `(async () => {
		  const S = window.edgewiseInternal.last();
		  const m = await window.edgewiseInternal.call("solve", JSON.stringify(S.project), 0, 0, 0, false);
		  return [document.getElementById("res-check").textContent, S.checkPending, S.result.accuracy.crosscheck,
		    JSON.parse(m.value.result).accuracy.crosscheck, S.result.accuracy.crosscheck_grid || ""]; })()`)
		row, _ := got[0].(string)
		shown, ok1 := got[2].(float64)
		want, ok2 := got[3].(float64)
		if got[1] != false || !ok1 || !ok2 || math.Abs(shown-want) > 1e-12*math.Max(1, math.Abs(want)) {
			t.Errorf("after the cross-check: pending %v, difference %v, want %v from the full solve", got[1], got[2], got[3])
		}
		if strings.Contains(row, "pending") || strings.Contains(row, "not done") || got[4] == "" {
			t.Errorf("the cross-check row says %q after the check", row)
		}
		// the results written again with the check keep the trades'
		// answers the first picture showed (they were lost once)
		if a := eval[string](t, tb, `(document.getElementById("answers") || {}).textContent || ""`); !strings.Contains(a, "Flow net") {
			t.Errorf("after the cross-check the answers say %.80q, want the demo's (its flow net among them)", a)
		}
		tb.noErrors(t)
	})
}

// A restarted worker (Stop, or a stale solve cancelled) starts from the
// engine the first worker compiled, not from the text again; the offline
// file's first worker gets the engine's text, the served page's fetches it.
func TestWorkerRestartReusesEngine(t *testing.T) {
	bothPages(t, func(t *testing.T, url string) {
		tb := newTab(t)
		tb.beforeScripts(t, recordFirstSolve)
		tb.open(t, url)
		n := tb.solved(t)
		eval[bool](t, tb, `(window.edgewiseInternal.hold({fn: "solve"}), true)`)
		tb.pasteInto(t, "#in-right-expr", "31")
		tb.waitFor(t, `window.edgewiseInternal.engineState().held === 1`, "the solve of 31 held")
		eval[bool](t, tb, `(document.getElementById("btn-stop").click(), true)`)
		tb.waitFor(t, `window.edgewiseInternal.engineState().restarts === 1`, "the worker restarted")
		tb.pasteInto(t, "#in-right-expr", "32")
		tb.waitSolved(t, n+1)
		inits := eval[[]string](t, tb, `window.bootSeen.inits`)
		firstInit := "fetch"
		if pageName(url) == "offline-file" {
			firstInit = "text"
		}
		if len(inits) != 2 || inits[0] != firstInit || inits[1] != "module" {
			t.Errorf("the workers' init messages brought %v, want [%s module]", inits, firstInit)
		}
		if v := eval[string](t, tb, `window.edgewiseInternal.last().project.edges.right.expr`); v != "32" {
			t.Errorf("after the restart the picture shows right edge %q, want 32", v)
		}
		tb.noErrors(t)
	})
}

// alterFullCheck makes the first full solve with its cross-check (the
// second solve of a page, which follows the first picture) answer with
// other cautions, as a check that finds the numbers unreliable does (it
// withholds them): the page must then show that full solve, not keep the
// first picture's result with only the accuracy replaced.
const alterFullCheck = `(() => {
  try { localStorage.removeItem("edgewise.autosave.1"); } catch (e) {}
  const W = window.Worker;
  let solves = 0;
  window.Worker = class extends W {
    set onmessage(fn) {
      super.onmessage = (ev) => {
        const m = ev.data;
        if (m && m.type === "reply" && m.value && m.value.ok && typeof m.value.result === "string" && ++solves === 2) {
          const r = JSON.parse(m.value.result);
          r.cautions = ["altered by the test"];
          const value = Object.assign({}, m.value, { result: JSON.stringify(r) });
          return fn({ data: Object.assign({}, m, { value }) });
        }
        return fn(ev);
      };
    }
  };
})()`

// When the full solve differs from the first picture's in more than the
// cross-check, the page shows the full solve.
func TestFullCheckReplacesFirstPicture(t *testing.T) {
	tb := newTab(t)
	tb.beforeScripts(t, alterFullCheck)
	tb.open(t, "file://"+filepath.Join(root, "dist", "edgewise.html"))
	tb.waitFor(t, `document.documentElement.dataset.firstCheckAt !== undefined`, "the first picture's cross-check")
	tb.waitFor(t, `document.getElementById("cautions").textContent.includes("altered by the test")`, "the full solve's cautions on screen")
	got := eval[[]any](t, tb, `[window.edgewiseInternal.last().result.cautions[0], window.edgewiseInternal.last().checkPending === true,
	  window.edgewiseInternal.last().result.accuracy.crosscheck, document.getElementById("res-check").textContent]`)
	if got[0] != "altered by the test" || got[1] != false || got[2] == nil || strings.Contains(got[3].(string), "pending") {
		t.Errorf("after a full solve that differs: cautions %v, pending %v, cross-check %v, row %q", got[0], got[1], got[2], got[3])
	}
	tb.noErrors(t)
}

// The page's text keeps to its type scale (style.css: four sizes, two
// weights, no italics). Each size, weight or face is a font the browser
// looks up in a new process; 34 of them cost the first picture about
// 0.3 s on this machine.
func TestTypeScale(t *testing.T) {
	tb := newTab(t)
	tb.beforeScripts(t, `try { localStorage.removeItem("edgewise.autosave.1"); } catch (e) {}`)
	tb.open(t, "file://"+filepath.Join(root, "dist", "edgewise.html"))
	tb.waitFor(t, `document.documentElement.dataset.firstCheckAt !== undefined`, "the first picture's cross-check")
	odd := eval[[]string](t, tb, `(() => {
	  const sizes = new Set(["12px", "14px", "16px", "20px"]), weights = new Set(["400", "600"]), out = new Set();
	  for (const el of document.querySelectorAll("body *")) {
	    if (!el.getClientRects().length) continue; // not shown
	    let text = ["INPUT", "SELECT", "TEXTAREA", "BUTTON"].includes(el.tagName);
	    for (const n of el.childNodes) if (n.nodeType === 3 && n.textContent.trim()) text = true;
	    if (!text) continue;
	    const cs = getComputedStyle(el);
	    if (!sizes.has(cs.fontSize) || !weights.has(cs.fontWeight) || cs.fontStyle !== "normal")
	      out.add(el.tagName.toLowerCase() + (el.className ? "." + String(el.className).replace(/ /g, ".") : "") + ": " + cs.fontSize + " " + cs.fontWeight + " " + cs.fontStyle);
	  }
	  return [...out]; })()`)
	if len(odd) > 0 {
		t.Errorf("text outside the type scale (sizes 12, 14, 16, 20 px; weights 400, 600; no italics):\n  %s", strings.Join(odd, "\n  "))
	}
}

// A page the browser does not draw (a tab in the background has no frames)
// still takes its first project whole: the first load waits a while for
// the picture's frame, then writes the results anyway; the first picture
// is counted on screen only when a frame shows it.
func TestFirstLoadWithoutFrames(t *testing.T) {
	tb := newTab(t)
	tb.beforeScripts(t, `(() => {
	  try { localStorage.removeItem("edgewise.autosave.1"); } catch (e) {}
	  window.requestAnimationFrame = () => 0; // no frame ever comes
	})()`)
	if _, err := chromedp.Run(tb.ctx, chromedp.Navigate("file://"+filepath.Join(root, "dist", "edgewise.html"))); err != nil {
		t.Fatal(err)
	}
	// polled by time: the usual polling waits for frames
	if _, err := chromedp.Run(tb.ctx, chromedp.Poll[bool](`document.getElementById("res-max") !== null && Number(document.documentElement.dataset.solved || 0) >= 1`,
		chromedp.WithPollingInterval(50*time.Millisecond), chromedp.WithPollingTimeout(60*time.Second))); err != nil {
		t.Fatalf("without frames the first project's results did not come: %v", err)
	}
	got := eval[[]any](t, tb, `[document.documentElement.dataset.firstPictureAt || "", performance.getEntriesByName("ew:picture-drawn").length,
	  window.edgewiseInternal.last() ? window.edgewiseInternal.last().project.title : ""]`)
	if got[0] != "" || got[1] != float64(1) || got[2] == "" {
		t.Errorf("without frames: firstPictureAt %q (want none), picture drawn %v times (want 1), solve in the store %q", got[0], got[1], got[2])
	}
	tb.noErrors(t)
}
