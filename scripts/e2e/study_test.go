package e2e

import (
	"bytes"
	"encoding/csv"
	"encoding/json"
	"fmt"
	"os"
	"os/exec"
	"path/filepath"
	"reflect"
	"sort"
	"strconv"
	"strings"
	"testing"
	"time"

	"github.com/chromedp/chromedp"
)

// studyPlate is testdata/study/plate.json, read once.
func studyPlate(t testing.TB) string {
	t.Helper()
	b, err := os.ReadFile(filepath.Join(root, "testdata", "study", "plate.json"))
	if err != nil {
		t.Fatal(err)
	}
	return string(b)
}

// setSelect chooses an option of a select the way a user does (the
// value, then a change event).
func (tb *tab) setSelect(t *testing.T, id, value string) {
	t.Helper()
	ok := eval[bool](t, tb, fmt.Sprintf(`(() => { const s = document.getElementById(%q);
	  if (![...s.options].some((o) => o.value === %q)) return false;
	  s.value = %q; s.dispatchEvent(new Event("change", {bubbles: true})); return true; })()`, id, value, value))
	if !ok {
		t.Fatalf("select #%s has no option %q", id, value)
	}
}

func (tb *tab) click(t *testing.T, sel string) {
	t.Helper()
	if err := chromedp.Do(tb.ctx, chromedp.Click(chromedp.CSS(sel))); err != nil {
		t.Fatalf("click %s: %v", sel, err)
	}
}

// runner runs the native study runner on a project and a study (JSON
// texts) and returns its standard output.
func runner(t *testing.T, project, study string) []byte {
	t.Helper()
	dir := t.TempDir()
	pf, sf := filepath.Join(dir, "project.json"), filepath.Join(dir, "study.json")
	if err := os.WriteFile(pf, []byte(project), 0o644); err != nil {
		t.Fatal(err)
	}
	if err := os.WriteFile(sf, []byte(study), 0o644); err != nil {
		t.Fatal(err)
	}
	cmd := exec.Command("go", "run", "./scripts/solve", "-study", sf, pf)
	cmd.Dir = root
	var stderr bytes.Buffer
	cmd.Stderr = &stderr
	out, err := cmd.Output()
	if err != nil {
		t.Fatalf("runner: %v: %s", err, stderr.String())
	}
	return out
}

// TestStudyOnPage builds a study by typing on the page, runs it, checks
// the download against the runner, clicks a point, cancels a run, seeks a
// target and compares two designs.
func TestStudyOnPage(t *testing.T) {
	tb := newTab(t)
	tb.open(t, siteURL)
	dl := tb.catchDownloads(t)
	tb.loadProject(t, studyPlate(t))

	// ---- the Parameters panel ----
	names := eval[[]string](t, tb, `[...document.querySelectorAll("#params .param-name")].map((i) => i.value)`)
	if strings.Join(names, " ") != "h_top k_plate t_heater" {
		t.Fatalf("parameters on the panel: %v", names)
	}
	// a new parameter no field uses: the engine's error at its row
	tb.click(t, "#param-add")
	tb.waitFor(t, `(document.querySelector('#params [data-err="parameters.p1"]') || {}).textContent.includes("not used")`, "the unused parameter's error at its row")
	// used: the source written as a formula of it
	n := tb.solved(t)
	tb.typeInto(t, "#in-source", "p1*0")
	tb.waitSolved(t, n+1)
	if src := eval[any](t, tb, `window.edgewise.project().source`); src != "p1*0" {
		t.Fatalf("the source as typed went to the project as %v", src)
	}
	// a name used but not defined: the error at the field that uses it
	tb.typeInto(t, "#in-source", "p2*0")
	tb.waitFor(t, `(document.getElementById("err-source") || {}).textContent.includes("p2")`, "the undefined name's error at the source")
	tb.typeInto(t, "#in-source", "0")
	eval[bool](t, tb, `(() => { const r = [...document.querySelectorAll("#params .param-row")].find((r) => r.querySelector(".param-name").value === "p1");
	  r.querySelector(".param-remove").click(); return true; })()`)
	tb.waitFor(t, `!window.edgewise.project().parameters.p1 && document.querySelector('#params [data-err="parameters.p1"]') === null`, "p1 removed")
	n = tb.solved(t)
	tb.waitFor(t, `document.querySelectorAll("#st-outputs input").length > 10`, "the outputs list")

	// ---- a sweep built by typing ----
	tb.setSelect(t, "st-a1-name", "h_top")
	tb.setSelect(t, "st-a1-scale", "log")
	tb.typeInto(t, "#st-a1-from", "5")
	tb.typeInto(t, "#st-a1-to", "500")
	tb.typeInto(t, "#st-a1-steps", "5")
	tb.click(t, "#st-two")
	tb.setSelect(t, "st-a2-name", "k_plate")
	tb.setSelect(t, "st-a2-scale", "list")
	tb.typeInto(t, "#st-a2-values", "120, 167, 200")
	for _, p := range []string{"probes.T1.value", "edges.top.flow", "edges.bottom.flow"} {
		tb.click(t, fmt.Sprintf(`#st-outputs input[value=%q]`, p))
	}
	tb.click(t, "#st-run")
	tb.waitFor(t, `document.getElementById("study").dataset.studyState === "done"`, "the study to finish")
	rows := eval[int](t, tb, `window.edgewiseParts.study.rows().length`)
	if rows != 15 {
		t.Fatalf("%d rows, want 5 x 3", rows)
	}
	if lines := eval[int](t, tb, `document.querySelectorAll("#st-plot polyline").length`); lines != 3 {
		t.Errorf("%d lines in the plot, want one per k_plate value (3)", lines)
	}
	progress := eval[string](t, tb, `document.getElementById("st-progress-text").textContent`)
	if !strings.HasPrefix(progress, "15 of 15 cases in ") {
		t.Errorf("progress after the run: %q", progress)
	}
	t.Logf("15-case study: %s", progress)
	tb.fullShot(t, "study")

	// the download is the runner's output for the same project and study
	name, got := dl.click(t, tb, "#st-csv")
	if !strings.HasSuffix(name, "-study.csv") {
		t.Errorf("download name %q", name)
	}
	proj := eval[map[string]any](t, tb, `window.edgewise.project()`)
	studyJSON, err := json.Marshal(proj["study"])
	if err != nil || proj["study"] == nil {
		t.Fatalf("the project does not keep the study: %v", proj)
	}
	projJSON, _ := json.Marshal(proj)
	want := runner(t, string(projJSON), string(studyJSON))
	if !bytes.Equal(got, want) {
		t.Fatalf("page CSV:\n%q\nrunner:\n%q", got, want)
	}
	// the share link carries the study, and the page opened from it shows it
	link := tb.shareLink(t)
	fresh := newTab(t)
	fresh.open(t, link)
	fresh.waitFor(t, `document.getElementById("st-a2-values").value === "120, 167, 200"`, "the study from the link in the panel")
	if s := eval[map[string]any](t, fresh, `window.edgewise.project().study`); !reflect.DeepEqual(s, proj["study"]) {
		t.Errorf("study from the link %v, want %v", s, proj["study"])
	}
	// a bad study: the engine's error with its path, nothing run
	tb.typeInto(t, "#st-a1-steps", "1")
	tb.click(t, "#st-run")
	tb.waitFor(t, `document.getElementById("study").dataset.studyState === "failed"`, "the bad study refused")
	if e := eval[string](t, tb, `document.getElementById("st-error").textContent`); !strings.HasPrefix(e, "study.vary[0].steps: ") {
		t.Errorf("bad study error %q", e)
	}
	tb.typeInto(t, "#st-a1-steps", "5")
	recs, err := csv.NewReader(bytes.NewReader(got)).ReadAll()
	if err != nil || len(recs) != 16 || recs[0][1] != "h_top" || recs[0][2] != "k_plate" {
		t.Fatalf("CSV: %v %v", err, recs)
	}

	// hovering shows exact values; clicking a point loads that case
	row13 := recs[14]                                    // row 13: the last h_top, the second k_plate (its point stands apart)
	tb.setSelect(t, "st-plot-output", "probes.T1.value") // max.value is flat: its points overlap
	if err := chromedp.Do(tb.ctx, chromedp.ScrollIntoView(chromedp.CSS(`#st-plot circle[data-row="13"]`))); err != nil {
		t.Fatal(err)
	}
	n = tb.solved(t)
	eval[bool](t, tb, `(() => { const c = document.querySelector('#st-plot circle[data-row="13"]');
	  c.dispatchEvent(new MouseEvent("mouseenter")); return true; })()`)
	hover := eval[string](t, tb, `document.getElementById("st-hover").textContent`)
	if !strings.Contains(hover, "h_top = "+row13[1]) || !strings.Contains(hover, "k_plate = "+row13[2]) {
		t.Errorf("hover %q does not show row 13's exact values %v", hover, row13[:3])
	}
	tb.click(t, `#st-plot circle[data-row="13"]`)
	tb.waitSolved(t, n+1)
	params := eval[map[string]float64](t, tb, `window.edgewiseInternal.last().project.parameters`)
	h13, _ := strconv.ParseFloat(row13[1], 64)
	if params["h_top"] != h13 || params["k_plate"] != 167 {
		t.Errorf("the loaded case has %v, want h_top %v and k_plate 167", params, h13)
	}
	maxv := eval[float64](t, tb, `window.edgewiseInternal.last().result.max.value`)
	if want, _ := strconv.ParseFloat(row13[3], 64); maxv != want {
		t.Errorf("the loaded case's max.value %v, the study's row %v", maxv, want)
	}
	if !strings.Contains(hover, "probes.T1.value = "+row13[6]) {
		t.Errorf("hover %q does not show row 13's exact T1 %s", hover, row13[6])
	}

	// a row of the table loads its case too (points of a flat output overlap)
	n = tb.solved(t)
	tb.click(t, `#st-table tr[data-row="4"]`)
	tb.waitSolved(t, n+1)
	params = eval[map[string]float64](t, tb, `window.edgewiseInternal.last().project.parameters`)
	if h4, _ := strconv.ParseFloat(recs[5][1], 64); params["h_top"] != h4 || params["k_plate"] != 167 {
		t.Errorf("the row's case has %v, want h_top %v and k_plate 167", params, h4)
	}

	// ---- cancel: a held batch is stopped by restarting the worker ----
	restarts := eval[int](t, tb, `window.edgewiseInternal.engineState().restarts`)
	eval[bool](t, tb, `window.edgewiseInternal.hold({fn: "study_rows", calls: 1})`)
	tb.click(t, "#st-run")
	tb.waitFor(t, `window.edgewiseInternal.engineState().held >= 1`, "the batch held")
	tb.click(t, "#st-cancel")
	tb.waitFor(t, `document.getElementById("study").dataset.studyState === "cancelled"`, "the study cancelled")
	if r := eval[int](t, tb, `window.edgewiseInternal.engineState().restarts`); r != restarts+1 {
		t.Errorf("restarts %d after the cancel, want %d", r, restarts+1)
	}
	if text := eval[string](t, tb, `document.getElementById("st-progress-text").textContent`); !strings.HasPrefix(text, "Cancelled") {
		t.Errorf("after cancel: %q", text)
	}

	// ---- seek: the value the runner finds, with the achieved output ----
	tb.setSelect(t, "sk-name", "h_top")
	tb.typeInto(t, "#sk-from", "5")
	tb.typeInto(t, "#sk-to", "500")
	tb.setSelect(t, "sk-output", "probes.T1.value")
	tb.typeInto(t, "#sk-target", "100")
	tb.click(t, "#sk-run")
	tb.waitFor(t, `["found", "none", "failed"].includes(document.getElementById("study").dataset.seekState)`, "the seek")
	answer := eval[string](t, tb, `document.getElementById("sk-answer").textContent`)
	if state := eval[string](t, tb, `document.getElementById("study").dataset.seekState`); state != "found" {
		t.Fatalf("seek %s: %s", state, answer)
	}
	proj = eval[map[string]any](t, tb, `window.edgewise.project()`)
	seekJSON, _ := json.Marshal(proj["study"])
	projJSON, _ = json.Marshal(proj)
	seekCSV, err := csv.NewReader(bytes.NewReader(runner(t, string(projJSON), string(seekJSON)))).ReadAll()
	if err != nil || len(seekCSV) != 2 {
		t.Fatalf("runner's seek: %v %v", err, seekCSV)
	}
	if !strings.HasPrefix(answer, "h_top = "+seekCSV[1][0]+" ") || !strings.Contains(answer, "probes.T1.value = "+seekCSV[1][2]+",") {
		t.Errorf("page's seek %q, runner's %v", answer, seekCSV[1])
	}
	achieved, _ := strconv.ParseFloat(seekCSV[1][2], 64)
	tol, _ := strconv.ParseFloat(seekCSV[1][4], 64)
	if d := achieved - 100; d > tol || d < -tol {
		t.Errorf("achieved %v misses 100 by more than %v", achieved, tol)
	}
	// a target out of reach: the engine's reason, no value
	tb.typeInto(t, "#sk-target", "1000")
	tb.click(t, "#sk-run")
	tb.waitFor(t, `document.getElementById("study").dataset.seekState === "none"`, "the seek with no solution")
	if a := eval[string](t, tb, `document.getElementById("sk-answer").textContent`); !strings.Contains(a, "holds no solution") {
		t.Errorf("no-solution answer: %q", a)
	}

	// ---- compare two designs ----
	tb.click(t, "#cmp-pin")
	n = tb.solved(t)
	eval[bool](t, tb, `(() => { const r = [...document.querySelectorAll("#params .param-row")].find((r) => r.querySelector(".param-name").value === "h_top");
	  r.querySelector(".param-value").focus(); r.querySelector(".param-value").select(); return true; })()`)
	if err := chromedp.Do(tb.ctx, chromedp.KeyEvent("300")); err != nil {
		t.Fatal(err)
	}
	tb.waitFor(t, `window.edgewiseInternal.last().project.parameters.h_top === 300`, "B solved with h_top 300")
	st := eval[map[string]any](t, tb, `window.edgewiseParts.compare.state()`)
	if st["diff"] != true || !(st["maxDiff"].(float64) > 0) {
		t.Errorf("compare state %v: want a difference map with a difference", st)
	}
	if rowsN := eval[int](t, tb, `document.querySelectorAll("#cmp-table tbody tr").length`); rowsN < 8 {
		t.Errorf("%d output rows in the comparison", rowsN)
	}
	tb.typeInto(t, "#in-width", "0.4")
	tb.waitFor(t, `window.edgewiseInternal.last().project.width === 0.4`, "B with another width")
	st = eval[map[string]any](t, tb, `window.edgewiseParts.compare.state()`)
	if st["diff"] != false || !strings.Contains(st["note"].(string), "No difference map") {
		t.Errorf("rectangles differ, compare state %v", st)
	}
	tb.fullShot(t, "compare")

	// renaming a parameter renames it where it is used, and in the study panel
	n = tb.solved(t)
	sel := `#params .param-row:nth-of-type(2) .param-name`
	if v := eval[string](t, tb, `document.querySelector("`+sel+`").value`); v != "k_plate" {
		t.Fatalf("second parameter %q", v)
	}
	tb.typeInto(t, sel, "k_alu")
	if err := chromedp.Do(tb.ctx, chromedp.KeyEvent("\t")); err != nil {
		t.Fatal(err)
	}
	tb.waitSolved(t, n+1)
	tb.waitFor(t, `window.edgewise.project().conductivity === "k_alu"`, "the conductivity field renamed")
	if s := eval[string](t, tb, `document.getElementById("st-a2-name").value`); s != "k_alu" {
		t.Errorf("the study panel's second parameter after the rename: %q", s)
	}
	tb.noErrors(t)
}

// BenchmarkStudy50 runs a 50-case study in the page at the default grid
// (the study plate without its grid: 200 x 67), h_top on 50 log steps with
// four outputs, as the panel runs it (batches in the worker, progress,
// plot and table), and reports the time from the click to the last row on
// screen. The target is under 5 s. `make bench-browser` runs it.
func BenchmarkStudy50(b *testing.B) {
	tb := newTab(b)
	tb.open(b, siteURL)
	plate := strings.Replace(studyPlate(b), `"grid": {"nx": 60, "ny": 20}`, `"grid": null`, 1)
	plate = strings.Replace(plate, `,
  "grid": null`, "", 1)
	n := eval[int](b, tb, `Number(document.documentElement.dataset.solved || 0)`)
	eval[map[string]any](b, tb, `window.edgewise.load(`+plate+`)`)
	tb.waitSolved(b, n+1)
	if g := eval[any](b, tb, `window.edgewise.project().grid`); g != nil {
		b.Fatalf("the benchmark project has a grid: %v", g)
	}
	if _, err := chromedp.Run(tb.ctx, chromedp.Poll[bool](`document.querySelectorAll("#st-outputs input").length > 10`, chromedp.WithPollingTimeout(60*time.Second))); err != nil {
		b.Fatalf("the outputs list: %v", err)
	}
	eval[bool](b, tb, `(() => { const $ = (id) => document.getElementById(id);
	  const set = (id, v) => { $(id).value = v; $(id).dispatchEvent(new Event("change")); };
	  set("st-a1-name", "h_top"); set("st-a1-scale", "log");
	  $("st-a1-from").value = "5"; $("st-a1-to").value = "500"; $("st-a1-steps").value = "50";
	  $("st-two").checked = false;
	  for (const i of document.querySelectorAll("#st-outputs input"))
	    i.checked = ["max.value", "probes.T1.value", "edges.top.flow", "balance"].includes(i.value);
	  return true; })()`)
	var times []float64
	b.ResetTimer()
	for i := 0; i < b.N; i++ {
		ms := eval[float64](b, tb, `(async () => { const t0 = performance.now();
		  const out = await window.edgewiseParts.study.run();
		  if (out !== "done") throw new Error("study " + out);
		  return performance.now() - t0; })()`)
		times = append(times, ms)
	}
	b.StopTimer()
	rows := eval[int](b, tb, `window.edgewiseParts.study.rows().length`)
	if rows != 50 {
		b.Fatalf("%d rows, want 50", rows)
	}
	sort.Float64s(times)
	b.ReportMetric(times[len(times)/2], "ms/study-median")
	b.ReportMetric(times[len(times)-1], "ms/study-max")
	b.Logf("50-case study, default grid: median %.0f ms, min %.0f, max %.0f over %d runs; %s", times[len(times)/2], times[0], times[len(times)-1], len(times),
		eval[string](b, tb, `document.getElementById("st-progress-text").textContent`))
}
