// edgewise page: studies. A sweep varies one or two parameters of the
// project (linear or logarithmic steps, or a list of values) and collects
// chosen outputs of the result; a seek finds the value of one parameter at
// which an output meets a target. Both run in the engine's worker
// (edgewise_study_rows, edgewise_study_seek; see wasm/study.go): the rows
// go a small batch at a time, so that the page shows progress with the
// time left and can stop between batches (a batch still running when the
// user cancels is stopped by restarting the worker).
//
// The sweep shows as a plot (one parameter: a line per output; two: a
// family of lines, one per value of the second) and a table; hovering a
// point gives its exact values and clicking it (or its row of the table)
// loads that case into the main view. The CSV download is the runner's output for the same project
// and study (header and rows formatted by the engine). The last study run
// is kept in the project (its "study" key), so that a saved file, a share
// link and autosave carry it.
//
//   EW.study = {run(), cancel(), seek(), csv() -> text, rows() -> [...], kept()}
"use strict";
(function () {
  const EW = (window.edgewiseParts = window.edgewiseParts || {});
  const { byId, el } = EW.dom;
  const { store, engine } = EW;
  const SCHEMA = "edgewise-study/1";
  const NUMBER = /^[+-]?(\d+\.?\d*|\.\d+)([eE][+-]?\d+)?$/;
  const BATCH_MS = 200; // aim of one batch's time in the worker
  const MAX_BATCH = 50;
  const CANCEL_WAIT_MS = 300; // a batch still running this long after cancel: restart the worker
  const SVGNS = "http://www.w3.org/2000/svg";
  const LINE_COLOURS = ["#1f5f8b", "#b4541e", "#3f7f3a", "#7a3f8f", "#8a6d1a", "#2f7f7f", "#9b2f4f", "#4f4f4f"];

  let kept = null; // the study the project keeps (object), or null
  let paths = []; // report paths of the project on show
  let job = null; // the sweep running: {cancelled, inFlight, started}
  let last = null; // the last sweep: {project, study, header, rows, csv, headerCSV, total}

  // ---- the panel ----

  const num = (id, label, value) => el("label", { class: "row" }, el("span", { text: label }),
    el("input", { id, type: "text", inputmode: "decimal", value: value === undefined ? "" : String(value) }));
  const select = (id, label, options) => el("label", { class: "row" }, el("span", { text: label }),
    el("select", { id }, ...(options || []).map(([v, t]) => el("option", { value: v, text: t }))));

  function axisBlock(k) {
    const p = "st-a" + k + "-";
    return el("div", { class: "st-axis", id: p + "box" },
      el("div", { class: "pair four" },
        select(p + "name", k === 1 ? "Vary" : "and vary"),
        select(p + "scale", "Steps", [["linear", "equal steps"], ["log", "equal ratios (log)"], ["list", "list of values"]]),
        num(p + "from", "from"),
        num(p + "to", "to")),
      el("div", { class: "pair" },
        num(p + "steps", "number of values", k === 1 ? 10 : 3),
        num(p + "values", "values (comma and space between)")));
  }

  const section = byId("study");
  const outputsBox = el("div", { id: "st-outputs", class: "st-outputs", role: "group", "aria-label": "Outputs to collect" });
  section.append(
    el("h2", { text: "Studies" }),
    el("p", { class: "hint", text: "Run the project many times with other values of its parameters, or find the value of one parameter that makes an output meet a target. Define parameters in the Parameters panel first." }),
    el("h3", { text: "Sweep" }),
    axisBlock(1),
    el("label", { class: "check" }, el("input", { id: "st-two", type: "checkbox" }), " Vary a second parameter"),
    axisBlock(2),
    el("p", { class: "hint", text: "Outputs to collect:" }),
    outputsBox,
    el("div", { class: "st-buttons" },
      el("button", { type: "button", id: "st-run", text: "Run study" }),
      el("button", { type: "button", id: "st-cancel", text: "Cancel", hidden: true }),
      el("button", { type: "button", id: "st-csv", text: "Download study (CSV)", disabled: true })),
    el("div", { class: "st-progress" },
      el("progress", { id: "st-progress", max: 1, value: 0, hidden: true }),
      el("span", { id: "st-progress-text", role: "status", "aria-live": "polite" })),
    el("p", { class: "err", id: "st-error" }),
    el("div", { class: "row" }, select("st-plot-output", "Plot")),
    el("div", { id: "st-plot-box" }),
    el("p", { id: "st-hover", class: "readout", text: "" }),
    el("div", { class: "st-table-box" }, el("table", { id: "st-table", class: "probes" })),
    el("h3", { text: "Find a value (seek)" }),
    el("div", { class: "pair four" },
      select("sk-name", "Parameter"),
      num("sk-from", "from"),
      num("sk-to", "to"),
      select("sk-output", "so that")),
    el("div", { class: "pair" },
      num("sk-target", "equals (target)"),
      num("sk-tol", "within (optional)")),
    el("div", { class: "st-buttons" },
      el("button", { type: "button", id: "sk-run", text: "Find" }),
      el("button", { type: "button", id: "sk-cancel", text: "Cancel", hidden: true })),
    el("p", { id: "sk-answer", class: "st-answer", role: "status", "aria-live": "polite" }));

  const $ = byId;
  $("st-a2-box").hidden = true;
  $("st-two").addEventListener("change", () => { $("st-a2-box").hidden = !$("st-two").checked; });
  for (const k of [1, 2]) $("st-a" + k + "-scale").addEventListener("change", () => scaleShown(k));
  function scaleShown(k) {
    const list = $("st-a" + k + "-scale").value === "list";
    for (const f of ["from", "to", "steps"]) $("st-a" + k + "-" + f).closest("label").hidden = list;
    $("st-a" + k + "-values").closest("label").hidden = !list;
  }
  scaleShown(1);
  scaleShown(2);

  // ---- choices from the project ----

  function setOptions(sel, values, keep) {
    const was = keep !== undefined ? keep : sel.value;
    sel.replaceChildren(...values.map((v) => el("option", { value: v, text: v })));
    if (values.includes(was)) sel.value = was;
  }

  function paramNames(p) {
    return Object.keys((p && p.parameters) || {}).sort();
  }

  function checkedOutputs() {
    return [...outputsBox.querySelectorAll("input:checked")].map((i) => i.value);
  }

  function showOutputs(list, chosen) {
    const want = new Set(chosen);
    outputsBox.replaceChildren(...list.map((path) => el("label", { class: "check" },
      el("input", { type: "checkbox", value: path, checked: want.has(path) }), " " + path)));
    setOptions($("sk-output"), list);
  }

  let pathsFor = "";
  async function refresh(project) {
    const names = paramNames(project);
    for (const id of ["st-a1-name", "st-a2-name", "sk-name"]) setOptions($(id), names);
    const probeKey = JSON.stringify((project.probes || []).map((q) => q.label));
    if (probeKey === pathsFor) return;
    const text = JSON.stringify(withoutStudy(project));
    try {
      const m = await engine.call("study_paths", text);
      if (!m.value.ok) return;
      pathsFor = probeKey;
      paths = JSON.parse(m.value.paths);
      const chosen = checkedOutputs();
      showOutputs(paths, chosen.length ? chosen : (kept && kept.report) || ["max.value"]);
    } catch (e) {
      // the worker was restarted; the next solve asks again
    }
  }
  store.on("solved", (d) => refresh(d.project));

  // ---- the study as the panel stands ----

  const value = (id) => {
    const t = $(id).value.trim();
    return NUMBER.test(t) ? Number(t) : t; // text: the engine names the field
  };

  function axis(k) {
    const p = "st-a" + k + "-";
    const a = { name: $(p + "name").value };
    if ($(p + "scale").value === "list") {
      a.values = $(p + "values").value.split(/,\s*|\s+/).filter((t) => t !== "").map((t) => (NUMBER.test(t) ? Number(t) : t));
      return a;
    }
    a.from = value(p + "from");
    a.to = value(p + "to");
    a.steps = value(p + "steps");
    a.scale = $(p + "scale").value;
    return a;
  }

  function sweepStudy() {
    const vary = [axis(1)];
    if ($("st-two").checked) vary.push(axis(2));
    return { schema: SCHEMA, vary, report: checkedOutputs() };
  }

  function seekStudy() {
    const s = { name: $("sk-name").value, from: value("sk-from"), to: value("sk-to"), target: { [$("sk-output").value]: value("sk-target") } };
    if ($("sk-tol").value.trim()) s.tolerance = value("sk-tol");
    const st = { schema: SCHEMA, seek: s };
    const report = checkedOutputs();
    if (report.length) st.report = report;
    return st;
  }

  // showStudy puts a kept study into the panel.
  function showStudy(st) {
    if (!st) return;
    if (st.vary) {
      st.vary.forEach((a, i) => {
        const p = "st-a" + (i + 1) + "-";
        if (!$(p + "name")) return;
        setOptions($(p + "name"), [...new Set([...[...$(p + "name").options].map((o) => o.value), a.name])], a.name);
        $(p + "scale").value = a.values ? "list" : a.scale || "linear";
        if (a.values) $(p + "values").value = a.values.join(", ");
        else {
          $(p + "from").value = String(a.from);
          $(p + "to").value = String(a.to);
          $(p + "steps").value = String(a.steps);
        }
        scaleShown(i + 1);
      });
      $("st-two").checked = st.vary.length > 1;
      $("st-a2-box").hidden = st.vary.length < 2;
    }
    if (st.seek) {
      const s = st.seek;
      setOptions($("sk-name"), [s.name], s.name);
      $("sk-from").value = String(s.from);
      $("sk-to").value = String(s.to);
      const [out, target] = Object.entries(s.target || {})[0] || ["", ""];
      setOptions($("sk-output"), [...new Set([...paths, out])], out);
      $("sk-target").value = String(target);
      $("sk-tol").value = s.tolerance === undefined ? "" : String(s.tolerance);
    }
    if (st.report) showOutputs(paths.length ? paths : st.report, st.report);
  }

  // ---- the project keeps the study ----

  const withoutStudy = (p) => {
    const q = JSON.parse(JSON.stringify(p));
    delete q.study;
    return q;
  };

  // fits says whether a study still fits the project: its parameters are
  // all defined and its probes there (a study naming a removed parameter
  // or probe would make the file unreadable, so it is not kept).
  function fits(st, project) {
    const names = new Set(paramNames(project));
    const used = [...(st.vary || []).map((a) => a.name), ...(st.seek ? [st.seek.name] : [])];
    const labels = new Set((project.probes || []).map((q) => q.label));
    const outs = [...(st.report || []), ...(st.seek ? Object.keys(st.seek.target || {}) : [])];
    const probeOK = (path) => !path.startsWith("probes.") || [...labels].some((l) => path.startsWith("probes." + l + ".") &&
      /^(value|gradient\.[xy]|flux\.[xy])$/.test(path.slice(("probes." + l + ".").length)));
    return used.every((n) => names.has(n)) && outs.every(probeOK);
  }

  const read = EW.read;
  EW.read = function () {
    const out = read();
    if (kept && fits(kept, out.project)) out.project.study = kept;
    return out;
  };
  const fill = EW.fill;
  EW.fill = function (p) {
    fill(p);
    kept = p && p.study ? JSON.parse(JSON.stringify(p.study)) : null;
    showStudy(kept);
  };

  // a renamed parameter keeps its place in the study and the panel
  document.addEventListener("edgewise:renamed", (ev) => {
    const { from, to } = ev.detail;
    for (const a of (kept && kept.vary) || []) if (a.name === from) a.name = to;
    if (kept && kept.seek && kept.seek.name === from) kept.seek.name = to;
    for (const id of ["st-a1-name", "st-a2-name", "sk-name"]) {
      const sel = $(id);
      for (const o of sel.options) if (o.value === from) { o.value = to; o.textContent = to; }
    }
  });

  function keep(st) {
    kept = st;
    EW.edited && EW.edited(); // saved with the project (autosave, links)
  }

  // ---- running a sweep ----

  function setProgress(done, total, t0) {
    const bar = $("st-progress");
    bar.hidden = false;
    bar.max = Math.max(total, 1);
    bar.value = done;
    const elapsed = performance.now() - t0;
    let text = done + " of " + total + " cases";
    if (done > 0 && done < total) text += ", about " + Math.max(1, Math.round(((elapsed / done) * (total - done)) / 1000)) + " s left";
    if (done === total) text += " in " + (elapsed / 1000).toFixed(1) + " s";
    $("st-progress-text").textContent = text;
  }

  function showError(msg) {
    $("st-error").replaceChildren(msg ? el("p", { class: "err-msg", text: msg }) : "");
  }

  async function run() {
    const good = store.good();
    if (!good || job) return null;
    const study = sweepStudy();
    const ptext = JSON.stringify(withoutStudy(good));
    const stext = JSON.stringify(study);
    showError("");
    const me = { cancelled: false, inFlight: false, started: 0 };
    job = me;
    $("st-run").disabled = true;
    $("st-cancel").hidden = false;
    const run = { project: withoutStudy(good), study, header: null, rows: [], csv: [], headerCSV: "", total: 0, done: false };
    const t0 = performance.now();
    let batch = 1;
    let outcome = "done";
    try {
      while (!me.cancelled && (run.header === null || run.rows.length < run.total)) {
        me.inFlight = true;
        me.started = performance.now();
        const m = await engine.call("study_rows", ptext, stext, run.rows.length, batch, 0);
        me.inFlight = false;
        const r = m.value;
        if (!r.ok) {
          showError((r.path ? r.path + ": " : "") + r.error.replace(r.path + ": ", ""));
          outcome = "failed";
          break;
        }
        if (run.header === null) {
          run.header = JSON.parse(r.header);
          run.headerCSV = r.header_csv;
          run.total = r.total;
          last = run;
          keep(study);
        }
        const rows = JSON.parse(r.rows);
        run.rows.push(...rows);
        run.csv.push(r.csv);
        setProgress(run.rows.length, run.total, t0);
        draw();
        const perRow = (performance.now() - me.started) / Math.max(rows.length, 1);
        batch = Math.max(1, Math.min(MAX_BATCH, Math.round(BATCH_MS / Math.max(perRow, 1))));
      }
      if (me.cancelled) outcome = "cancelled";
    } catch (e) {
      outcome = e.cancelled ? "cancelled" : "failed";
      if (!e.cancelled) showError(e.message);
    } finally {
      job = null;
      $("st-run").disabled = false;
      $("st-cancel").hidden = true;
      $("st-csv").disabled = !(last && last.rows.length);
    }
    run.done = outcome === "done";
    if (outcome === "cancelled") {
      $("st-progress-text").textContent = run.header ? "Cancelled after " + run.rows.length + " of " + run.total + " cases." : "Cancelled before the first case came back.";
    }
    section.dataset.studyState = outcome;
    section.dataset.studyRuns = String(Number(section.dataset.studyRuns || 0) + 1);
    return outcome;
  }

  function cancel() {
    const me = job;
    if (!me) return;
    me.cancelled = true;
    if (!me.inFlight) return;
    setTimeout(() => {
      if (job === me && me.inFlight) engine.restart("study cancelled by the user");
    }, Math.max(0, CANCEL_WAIT_MS - (performance.now() - me.started)));
  }

  // ---- plot and table ----

  function svg(tag, attrs, ...children) {
    const e = document.createElementNS(SVGNS, tag);
    for (const [k, v] of Object.entries(attrs || {})) e.setAttribute(k, String(v));
    for (const c of children) e.append(c);
    return e;
  }

  const fmt = (v) => (v === null || v === undefined ? "" : String(v)); // exact: the shortest form that reads back

  function draw() {
    const run = last;
    if (!run || !run.header) return;
    const nv = run.study.vary.length;
    const report = run.study.report;
    setOptions($("st-plot-output"), report);
    drawTable(run);
    drawPlot(run, nv, report.indexOf($("st-plot-output").value));
  }
  $("st-plot-output").addEventListener("change", draw);

  function drawTable(run) {
    const t = $("st-table");
    const head = el("tr", null, ...run.header.map((h) => el("th", { scope: "col", text: h })));
    const body = run.rows.map((r) => el("tr", { "data-row": r.row, class: "st-row", tabindex: 0, title: "Click to load this case",
      onclick: () => loadCase(r.row), onkeydown: (e) => { if (e.key === "Enter") loadCase(r.row); } },
      el("td", { text: String(r.row) }),
      ...r.params.map((v) => el("td", { text: fmt(v) })),
      ...r.outputs.map((v) => el("td", { text: v === null ? "" : EW.num(v, 6), title: fmt(v) })),
      ...(r.outputs.length ? [] : run.study.report.map(() => el("td"))),
      el("td", { text: r.error })));
    t.replaceChildren(el("thead", null, head), el("tbody", null, ...body));
  }

  function drawPlot(run, nv, k) {
    const box = $("st-plot-box");
    if (k < 0) return box.replaceChildren();
    const W = 560, H = 280, m = { l: 64, r: 120, t: 12, b: 40 };
    const a1 = run.study.vary[0];
    const logX = a1.scale === "log";
    const pts = run.rows.filter((r) => !r.error && r.outputs[k] !== null);
    const xs = run.rows.map((r) => r.params[0]);
    let x0 = Math.min(...xs), x1 = Math.max(...xs);
    const ys = pts.map((r) => r.outputs[k]);
    let y0 = ys.length ? Math.min(...ys) : 0, y1 = ys.length ? Math.max(...ys) : 1;
    if (y1 - y0 <= 1e-9 * Math.max(Math.abs(y0), Math.abs(y1))) {
      // flat to rounding: show it flat, not its last digits magnified
      const mid = (y0 + y1) / 2;
      y0 = mid - (Math.abs(mid) * 0.01 || 1);
      y1 = mid + (Math.abs(mid) * 0.01 || 1);
    }
    if (x1 === x0) { x0 -= 1; x1 += 1; }
    const tx = (v) => (logX ? Math.log(v) : v);
    const X = (v) => m.l + ((tx(v) - tx(x0)) / (tx(x1) - tx(x0))) * (W - m.l - m.r);
    const Y = (v) => H - m.b - ((v - y0) / (y1 - y0)) * (H - m.t - m.b);
    const plot = svg("svg", { id: "st-plot", viewBox: "0 0 " + W + " " + H, width: W, height: H, role: "img",
      "aria-label": run.study.report[k] + " against " + a1.name });
    plot.append(svg("rect", { x: m.l, y: m.t, width: W - m.l - m.r, height: H - m.t - m.b, fill: "none", stroke: "#888" }));
    const label = (x, y, text, anchor) => svg("text", { x, y, "font-size": 11, "text-anchor": anchor || "middle" }, document.createTextNode(text));
    plot.append(label(m.l, H - m.b + 14, EW.num(x0, 4), "start"), label(W - m.r, H - m.b + 14, EW.num(x1, 4), "end"),
      label((m.l + W - m.r) / 2, H - 8, a1.name + (logX ? " (log scale)" : "")),
      label(m.l - 4, H - m.b, EW.num(y0, 5), "end"), label(m.l - 4, m.t + 10, EW.num(y1, 5), "end"),
      label(m.l - 4, (H - m.b + m.t) / 2, run.study.report[k], "end"));
    // one line per value of the second parameter (or one line)
    const groups = new Map();
    for (const r of run.rows) {
      const key = nv > 1 ? r.params[1] : "";
      if (!groups.has(key)) groups.set(key, []);
      groups.get(key).push(r);
    }
    let g = 0;
    for (const [key, rows] of groups) {
      const colour = LINE_COLOURS[g % LINE_COLOURS.length];
      const good = rows.filter((r) => !r.error && r.outputs[k] !== null);
      if (good.length > 1) {
        plot.append(svg("polyline", { fill: "none", stroke: colour, "stroke-width": 1.5,
          points: good.map((r) => X(r.params[0]).toFixed(1) + "," + Y(r.outputs[k]).toFixed(1)).join(" ") }));
      }
      for (const r of good) {
        const c = svg("circle", { cx: X(r.params[0]).toFixed(1), cy: Y(r.outputs[k]).toFixed(1), r: 4, fill: colour,
          class: "st-pt", "data-row": r.row, tabindex: 0 }, svg("title", null, document.createTextNode(pointText(run, r))));
        c.addEventListener("mouseenter", () => { $("st-hover").textContent = pointText(run, r); });
        c.addEventListener("focus", () => { $("st-hover").textContent = pointText(run, r); });
        c.addEventListener("click", () => loadCase(r.row));
        c.addEventListener("keydown", (e) => { if (e.key === "Enter") loadCase(r.row); });
        plot.append(c);
      }
      if (nv > 1) {
        const y = m.t + 14 + 14 * g;
        plot.append(svg("line", { x1: W - m.r + 8, x2: W - m.r + 24, y1: y - 4, y2: y - 4, stroke: colour, "stroke-width": 2 }),
          label(W - m.r + 28, y, run.study.vary[1].name + " = " + fmt(key), "start"));
      }
      g++;
    }
    box.replaceChildren(plot);
  }

  function pointText(run, r) {
    const parts = run.study.vary.map((a, i) => a.name + " = " + fmt(r.params[i]));
    const outs = run.study.report.map((p, i) => p + " = " + (r.outputs[i] === null ? "no number" : fmt(r.outputs[i])));
    return "Case " + r.row + ": " + parts.join(", ") + "; " + outs.join(", ") + " (click to load this case)";
  }

  // loadCase loads row i of the last sweep into the main view: the
  // project with that row's parameter values.
  function loadCase(i) {
    const run = last;
    const r = run && run.rows.find((q) => q.row === i);
    if (!r) return Promise.reject(new Error("no case " + i));
    const p = JSON.parse(JSON.stringify(run.project));
    run.study.vary.forEach((a, k) => { p.parameters[a.name] = r.params[k]; });
    if (kept) p.study = kept;
    section.dataset.loadedCase = String(i);
    return window.edgewise.load(p);
  }

  function csv() {
    if (!last || !last.header) return "";
    return last.headerCSV + last.csv.join("");
  }

  $("st-run").addEventListener("click", run);
  $("st-cancel").addEventListener("click", cancel);
  $("st-csv").addEventListener("click", () => {
    const p = store.project() || {};
    EW.dom.save(EW.dom.slug(p.title) + "-study.csv", "text/csv", csv());
  });

  // ---- seek ----

  let seeking = null;
  async function seek() {
    const good = store.good();
    if (!good || seeking) return null;
    const study = seekStudy();
    const answer = $("sk-answer");
    answer.classList.remove("error");
    answer.textContent = "Searching…";
    const me = {};
    seeking = me;
    $("sk-run").disabled = true;
    $("sk-cancel").hidden = false;
    engine.onProgress = (m) => {
      if (seeking === me) answer.textContent = "Solve " + m.solves + ": " + study.seek.name + " = " + EW.num(m.value, 8) + " gives " + EW.num(m.output, 8);
    };
    let outcome = "found";
    try {
      const m = await engine.call("study_seek", JSON.stringify(withoutStudy(good)), JSON.stringify(study), 0);
      const r = m.value;
      if (!r.ok) {
        outcome = "failed";
        answer.classList.add("error");
        answer.textContent = (r.path && !r.error.startsWith(r.path) ? r.path + ": " : "") + r.error;
      } else if (!r.found) {
        outcome = "none";
        answer.classList.add("error");
        answer.textContent = "No answer: " + r.reason;
      } else {
        const s = JSON.parse(r.seek);
        me.result = s;
        keep(study);
        answer.replaceChildren(
          el("b", { text: s.name + " = " + fmt(s.value) }),
          " (known to within " + EW.num(s.bracket, 3) + "): " + s.output + " = " + fmt(s.achieved) +
          ", target " + fmt(s.target) + " ± " + EW.num(s.tolerance, 3) + "; the solve's error estimate there is " +
          EW.num(s.estimate, 3) + "; " + s.solves + " solves. ",
          el("button", { type: "button", id: "sk-load", text: "Load this value",
            onclick: () => {
              const p = withoutStudy(good);
              p.parameters[s.name] = s.value;
              if (kept) p.study = kept;
              return window.edgewise.load(p);
            } }));
      }
    } catch (e) {
      outcome = e.cancelled ? "cancelled" : "failed";
      answer.textContent = e.cancelled ? "Cancelled." : e.message;
    } finally {
      seeking = null;
      engine.onProgress = null;
      $("sk-run").disabled = false;
      $("sk-cancel").hidden = true;
    }
    section.dataset.seekState = outcome;
    return outcome;
  }
  $("sk-run").addEventListener("click", seek);
  $("sk-cancel").addEventListener("click", () => { if (seeking) engine.restart("seek cancelled by the user"); });

  EW.study = { run, cancel, seek, csv, rows: () => (last ? last.rows.slice() : []), kept: () => kept, loadCase };
})();
