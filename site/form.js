// edgewise page: the inputs. Builds the four edge blocks, reads the form
// into a project and fills it from one, shows errors beside the field they
// name (with a caret under the column for formulas) and draws the small
// edge previews. The labels for the chosen physics come from physics.js.
"use strict";
(function () {
  const EW = (window.edgewiseParts = window.edgewiseParts || {});
  const $ = (id) => document.getElementById(id);
  const form = $("inputs");
  const SIDES = ["top", "bottom", "left", "right"];
  const WHERE = { top: "y = H", bottom: "y = 0", left: "x = 0", right: "x = W" };
  const ALONG = { top: "s = x", bottom: "s = x", left: "s = y", right: "s = y" };
  let extra = {}; // parts of a loaded project the form does not show (grid)
  let probes = [];
  const el = (tag, attrs, ...kids) => {
    const e = document.createElement(tag);
    for (const [k, v] of Object.entries(attrs || {})) {
      if (k === "text") e.textContent = v;
      else if (k === "class") e.className = v;
      else e.setAttribute(k, v);
    }
    e.append(...kids);
    return e;
  };

  // ---- the edge blocks ----

  function edgeBlock(side) {
    const id = (f) => "in-" + side + "-" + f;
    const kind = el("select", { id: id("kind"), "data-path": "edges." + side + ".kind" });
    for (const k of ["value", "flux", "convection"]) kind.append(el("option", { value: k, text: k }));
    const exprLabel = el("span", { class: "lbl-expr", id: id("expr-label"), text: "Value" });
    const expr = el("input", {
      id: id("expr"), type: "text", class: "formula", spellcheck: "false", autocapitalize: "off",
      "data-path": "edges." + side + ".expr", "aria-describedby": "err-" + side,
    });
    const h = el("input", { id: id("h"), type: "text", inputmode: "decimal", "data-path": "edges." + side + ".h", "aria-describedby": "err-" + side + " hint-h-" + side });
    const amb = el("input", {
      id: id("ambient"), type: "text", class: "formula", spellcheck: "false", autocapitalize: "off",
      "data-path": "edges." + side + ".ambient", "aria-describedby": "err-" + side,
    });
    const preview = el("canvas", { class: "preview", id: "pv-" + side, width: "300", height: "46", role: "img", "aria-label": "Profile along the " + side + " edge" });
    return el("fieldset", { class: "edge", "data-side": side },
      el("legend", {}, el("span", { class: "glyph g-" + side, "aria-hidden": "true" }), side[0].toUpperCase() + side.slice(1) + " edge",
        el("small", { text: "  " + WHERE[side] + ", " + ALONG[side] })),
      el("div", { class: "whole" }, // the one-condition controls (segments.js adds the parts after them)
        el("label", { class: "row" }, el("span", { text: "Condition" }), kind),
        el("div", { class: "f-expr" }, el("label", { class: "row" }, exprLabel, expr)),
        el("div", { class: "f-conv pair", hidden: "" },
          el("label", { class: "row" }, el("span", { class: "lbl-h", text: "h" }), h),
          el("label", { class: "row" }, el("span", { class: "lbl-amb", text: "Ambient" }), amb)),
        el("p", { class: "hint", id: "hint-h-" + side, hidden: "" })),
      el("div", { class: "err", id: "err-" + side, "data-err": "edges." + side }),
      preview);
  }
  const edgesBox = $("edges");
  for (const side of SIDES) edgesBox.append(edgeBlock(side));

  // ---- numbers ----

  // number reads a decimal number; a comma as decimal mark is refused
  // clearly rather than misread.
  function number(text, what) {
    const t = text.trim();
    if (t === "") return { err: what + " is required" };
    if (/^[+-]?\d+,\d+$/.test(t)) return { err: "use a point for decimals: " + t.replace(",", ".") + ", not " + t };
    // text with a name is a formula of the parameters: the engine reads it
    // (and reports its errors at the field)
    if (/[A-Za-z_]/.test(t) && !/^[+-]?(\d+\.?\d*|\.\d+)[eE]/.test(t)) return { v: t };
    if (!/^[+-]?(\d+\.?\d*|\.\d+)([eE][+-]?\d+)?$/.test(t)) return { err: "not a number: " + JSON.stringify(t) };
    return { v: Number(t) };
  }
  EW.number = number;
  function show(v) {
    if (typeof v !== "number") return v === undefined || v === null ? "" : String(v);
    return String(v);
  }

  // ---- reading and filling ----

  // read returns {project, errors}: the project as typed, and the local
  // errors (numbers that are not numbers) as [{path, msg}].
  EW.read = function () {
    const errors = [];
    const num = (inputId, path, what) => {
      const r = number($(inputId).value, what);
      if (r.err) {
        errors.push({ path, msg: r.err });
        return $(inputId).value;
      }
      return r.v;
    };
    const p = { schema: "edgewise/1" };
    const title = $("in-title").value.trim();
    if (title) p.title = title;
    p.physics = $("in-physics").value;
    p.width = num("in-width", "width", "width");
    p.height = num("in-height", "height", "height");
    if ($("in-ortho").checked) {
      p.conductivity = { x: num("in-kx", "conductivity.x", "conductivity along x"), y: num("in-ky", "conductivity.y", "conductivity along y") };
    } else {
      p.conductivity = num("in-k", "conductivity", "conductivity");
    }
    p.source = num("in-source", "source", "source");
    p.edges = {};
    for (const side of ["bottom", "top", "left", "right"]) {
      if (EW.parts && EW.parts.count(side) > 1) { // an edge in parts (segments.js)
        p.edges[side] = EW.parts.read(side, num);
        continue;
      }
      const kind = $("in-" + side + "-kind").value;
      const e = { kind };
      if (kind === "convection") {
        e.h = num("in-" + side + "-h", "edges." + side + ".h", "h");
        e.ambient = $("in-" + side + "-ambient").value;
      } else {
        e.expr = $("in-" + side + "-expr").value;
      }
      p.edges[side] = e;
    }
    p.probes = probes.map((q) => Object.assign({}, q));
    Object.assign(p, extra);
    return { project: p, errors };
  };

  // fill puts a project into the form.
  EW.fill = function (p) {
    $("in-title").value = p.title || "";
    $("in-physics").value = EW.physicsOf(p.physics).id;
    $("in-width").value = show(p.width);
    $("in-height").value = show(p.height);
    const k = p.conductivity;
    const ortho = k !== null && typeof k === "object";
    $("in-ortho").checked = ortho;
    if (ortho) {
      $("in-kx").value = show(k.x);
      $("in-ky").value = show(k.y);
      $("in-k").value = show(k.x);
    } else {
      $("in-k").value = show(k);
      $("in-kx").value = show(k);
      $("in-ky").value = show(k);
    }
    $("in-source").value = show(p.source || 0);
    const edges = p.edges || {};
    for (const side of SIDES) {
      let e = edges[side] || { kind: "flux", expr: "0" };
      const segs = Array.isArray(e.segments) ? e.segments : null;
      if (EW.parts) EW.parts.fill(side, segs);
      if (segs) e = segs[0] || { kind: "flux", expr: "0" }; // an edge in parts: its first part behind the parts
      $("in-" + side + "-kind").value = e.kind;
      $("in-" + side + "-expr").value = e.kind === "convection" ? "" : show(e.expr);
      $("in-" + side + "-h").value = e.kind === "convection" ? show(e.h) : "";
      $("in-" + side + "-ambient").value = e.kind === "convection" ? show(e.ambient) : "";
    }
    probes = (p.probes || []).map((q) => Object.assign({}, q));
    extra = {};
    if (p.grid) extra.grid = p.grid;
    if (p.sheet) extra.sheet = Object.assign({}, p.sheet); // the report's title block (report.js)
    if (p.answers) extra.answers = p.answers;
    $("k-iso").hidden = ortho;
    $("k-ortho").hidden = !ortho;
    EW.relabel();
    clearErrors();
  };

  EW.setSheet = (s) => { if (s) extra.sheet = s; else delete extra.sheet; };
  // setAnswers keeps the inputs of the derived answers (answers.js)
  EW.setAnswers = (a) => { if (a && Object.keys(a).length) extra.answers = a; else delete extra.answers; };
  EW.probes = () => probes.map((q) => Object.assign({}, q));
  EW.setProbes = (list) => { probes = list.map((q) => Object.assign({}, q)); };

  // ---- errors ----

  function clearErrors() {
    for (const e of form.querySelectorAll("[data-err]")) e.replaceChildren();
    for (const i of form.querySelectorAll("[aria-invalid]")) i.removeAttribute("aria-invalid");
    for (const r of document.querySelectorAll("#probes tr.invalid")) r.classList.remove("invalid");
    $("err-other").replaceChildren();
  }
  EW.clearErrors = clearErrors;

  // byteToChar converts a 1-based UTF-8 byte column into a 0-based index
  // into the JavaScript string.
  function byteToChar(text, col) {
    const enc = new TextEncoder();
    let bytes = 0;
    let i = 0;
    for (const ch of text) {
      if (bytes >= col - 1) break;
      bytes += enc.encode(ch).length;
      i += ch.length;
    }
    return i;
  }

  // onScreen names a project path as the page shows it: "edges.bottom.expr"
  // becomes "Bottom edge, heat flux in" (the label beside the input, in the
  // physics' own words, without its unit), "probes[0].y" "Probe T1, y".
  // The runner and window.edgewise.load keep the paths.
  function onScreen(path) {
    if (!path) return "Project";
    const input = form.querySelector('[data-path="' + CSS.escape(path) + '"]');
    const side = (/^edges\.(\w+)/.exec(path) || [])[1];
    const edge = side && EW.SIDES.includes(side) ? EW.capital(side) + " edge" : "";
    if (input) {
      const span = input.closest("label") && input.closest("label").querySelector("span");
      let name = span ? span.textContent.replace(/\[[^\]]*\]/g, "").replace(/\s+/g, " ").trim() : path;
      if (path.startsWith("conductivity.")) {
        name = ($("in-k").closest("label").querySelector("span").textContent.replace(/\[[^\]]*\]/g, "").trim()) + " " + name;
      }
      if (edge) name = edge + ", " + name[0].toLowerCase() + name.slice(1);
      return name;
    }
    if (edge) {
      const rest = path.slice(("edges." + side).length).replace(/^\./, "").replace(/segments\[(\d+)\]\.?/, (_, i) => "part " + (Number(i) + 1) + (path.endsWith("]") ? "" : ", "));
      return edge + (rest ? ", " + rest : "");
    }
    const pr = /^probes\[(\d+)\](?:\.(\w+))?/.exec(path);
    if (pr) {
      const q = probes[Number(pr[1])];
      return "Probe " + (q && q.label ? q.label : Number(pr[1]) + 1) + (pr[2] ? ", " + pr[2] : "");
    }
    if (path.startsWith("grid")) return "Detail (output grid)";
    return path;
  }
  EW.onScreen = onScreen;

  // onScreenMessage rewrites an error that starts with its path so that it
  // starts with the on-screen name instead.
  EW.onScreenMessage = (path, message) =>
    path && message.startsWith(path + ": ") ? onScreen(path) + ": " + message.slice(path.length + 2) : message;

  // showError puts one error beside the field its path names: message,
  // and for formulas the formula with a caret under the column. It names
  // the field as the screen does (onScreen) and marks it (the input, or
  // the probe's row). It returns true when a place for it was found in the
  // form.
  EW.showError = function (path, col, message) {
    let best = null;
    for (const e of form.querySelectorAll("[data-err]")) {
      const p = e.dataset.err;
      if (p && (path === p || path.startsWith(p + ".")) && (!best || p.length > best.dataset.err.length)) best = e;
    }
    const input = path ? form.querySelector('[data-path="' + CSS.escape(path) + '"]') : null;
    if (input) input.setAttribute("aria-invalid", "true");
    const pr = /^probes\[(\d+)\]/.exec(path || "");
    if (pr) {
      const row = document.querySelectorAll("#probes tbody tr")[Number(pr[1])];
      if (row) row.classList.add("invalid");
    }
    const target = best || $("err-other");
    const msg = message.startsWith(path + ": ") ? message.slice(path.length + 2) : message;
    const p = el("p", { class: "err-msg" }, el("b", { text: onScreen(path) + ": " }), msg);
    target.append(p);
    if (input && col > 0 && input.classList.contains("formula")) {
      const text = input.value;
      const at = byteToChar(text, col);
      const caret = " ".repeat([...text.slice(0, at)].length) + "^";
      target.append(el("pre", { class: "caret", "aria-hidden": "true" }, el("code", { text: text + "\n" + caret })));
      if (document.activeElement !== input) input.setSelectionRange && input.setSelectionRange(at, at);
    }
    return !!best;
  };

  // ---- edge previews ----

  EW.drawPreview = function (side, s, v, failed) {
    const c = $("pv-" + side);
    const cssW = Math.max(120, c.parentElement.clientWidth - 2), cssH = 46;
    const ctx = EW.sizeCanvas(c, cssW, cssH);
    ctx.fillStyle = "#f1eee6";
    ctx.fillRect(0, 0, cssW, cssH);
    ctx.font = "11px system-ui, sans-serif";
    ctx.fillStyle = "#5b5f68";
    if (failed || !s || s.length < 2) {
      ctx.textBaseline = "middle";
      ctx.fillText("no preview until the formula reads", 6, cssH / 2);
      c.setAttribute("aria-label", "No preview of the " + side + " edge");
      return;
    }
    let lo = Infinity, hi = -Infinity;
    for (const x of v) { if (x < lo) lo = x; if (x > hi) hi = x; }
    const flat = !(hi - lo > 1e-12 * Math.max(1, Math.abs(hi)));
    const a = flat ? lo - 1 : lo, b = flat ? hi + 1 : hi;
    const L = s[s.length - 1] || 1;
    const m = { l: 50, r: 6, t: 7, b: 7 };
    const X = (t) => m.l + (t / L) * (cssW - m.l - m.r);
    const Y = (t) => m.t + (1 - (t - a) / (b - a)) * (cssH - m.t - m.b);
    ctx.textAlign = "right";
    ctx.textBaseline = "middle";
    if (flat) {
      ctx.fillText(EW.num(lo, 4), m.l - 5, Y(lo));
    } else {
      ctx.fillText(EW.num(hi, 4), m.l - 5, Y(hi));
      ctx.fillText(EW.num(lo, 4), m.l - 5, Y(lo));
    }
    ctx.strokeStyle = "#2b4f6e";
    ctx.lineWidth = 1.6;
    ctx.beginPath();
    for (let k = 0; k < s.length; k++) {
      if (k === 0) ctx.moveTo(X(s[k]), Y(v[k]));
      else ctx.lineTo(X(s[k]), Y(v[k]));
    }
    ctx.stroke();
    c.setAttribute("aria-label", "Profile along the " + side + " edge: from " + EW.num(v[0]) + " to " + EW.num(v[v.length - 1]) +
      (flat ? " (constant)" : ", between " + EW.num(lo) + " and " + EW.num(hi)));
  };

  // ---- events ----

  form.addEventListener("submit", (e) => e.preventDefault());
  form.addEventListener("input", (e) => {
    if (e.target.id === "in-physics" || e.target.id === "in-ortho" || /-kind$/.test(e.target.id)) return; // change handles these
    EW.checkPlausible && EW.checkPlausible();
    EW.edited && EW.edited(e.target);
  });
  $("in-title").addEventListener("input", () => EW.edited && EW.edited($("in-title")));
  form.addEventListener("change", (e) => {
    const t = e.target;
    if (/^in-\w+-kind$/.test(t.id)) {
      // carry the edge's numbers over to the fields the new kind shows
      const side = t.id.split("-")[1];
      const expr = $("in-" + side + "-expr"), h = $("in-" + side + "-h"), amb = $("in-" + side + "-ambient");
      if (t.value === "convection") {
        if (!h.value.trim()) h.value = EW.physicsOf($("in-physics").value).default_h || "1";
        if (!amb.value.trim()) amb.value = expr.value;
      } else if (!expr.value.trim()) {
        expr.value = amb.value.trim() || "0";
      }
    }
    if (t.id === "in-physics" || /-kind$/.test(t.id)) {
      const was = document.documentElement.dataset.physics;
      EW.relabel();
      if (t.id === "in-physics" && EW.physicsSwitched) EW.physicsSwitched(was, t.value);
      EW.edited && EW.edited(t);
    } else if (t.id === "in-ortho") {
      $("k-iso").hidden = t.checked;
      $("k-ortho").hidden = !t.checked;
      if (t.checked) { $("in-kx").value = $("in-k").value; $("in-ky").value = $("in-k").value; }
      else $("in-k").value = $("in-kx").value;
      EW.edited && EW.edited(t);
    }
  });
  EW.SIDES = SIDES;
})();
