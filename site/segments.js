// edgewise page: edges made of parts (the project file's segments). Each
// edge block offers "Split into parts"; a split edge shows one row per
// part: where it ends (a distance s along the edge), its condition and
// that condition's data, with buttons to split the part in two or remove
// it (the part before takes over its stretch; back to one part gives the
// one-condition form). The other scripts reach it through
//
//   EW.parts = {count(side), read(side, num) -> edge, fill(side, segments | null), relabel(),
//               sample(project, side, n) -> Promise<{ok, parts}>, draw(side, sampled),
//               mark(ctx, project, X, Y), flowRows(add, side, edge, units)}
//
// form.js reads and fills through it, physics.js relabels it, solving.js
// draws a split edge's preview with it, field.js marks the parts along the
// picture's outline and results.js lists each part's flow and mean.
"use strict";
(function () {
  const EW = (window.edgewiseParts = window.edgewiseParts || {});
  const { byId, el } = EW.dom;
  const SIDES = ["top", "bottom", "left", "right"];
  const KINDS = ["value", "flux", "convection"];
  const ALONG = { top: "from the left end", bottom: "from the left end", left: "from the bottom end", right: "from the bottom end" };
  const INK = "#1b2029";

  const id = (side, i, f) => "part-" + side + "-" + i + "-" + f;
  const pathOf = (side, i) => "edges." + side + ".segments[" + i + "]";
  const boxOf = (side) => byId("parts-" + side);
  const rows = (side) => [...boxOf(side).querySelectorAll(":scope > .part")];

  // ---- the controls of one edge ----

  // The whole-edge controls (form.js) sit in .whole; the parts and the
  // button that splits a one-condition edge are added after them.
  for (const side of SIDES) {
    const block = document.querySelector('fieldset.edge[data-side="' + side + '"]');
    const whole = block.querySelector(".whole");
    const split = el("button", { type: "button", class: "split-edge", id: "split-" + side, text: "Split into parts",
      title: "Give parts of this edge conditions of their own", onclick: () => splitWhole(side) });
    const parts = el("div", { class: "parts", id: "parts-" + side, hidden: true, role: "group", "aria-label": EW.capital(side) + " edge in parts" });
    whole.after(split, parts);
  }

  // a new width or height moves the end of every edge's last part
  for (const f of ["in-width", "in-height"]) byId(f).addEventListener("input", () => SIDES.forEach(froms));

  // lengthOf is the edge's length as typed (NaN when it is not a number).
  function lengthOf(side) {
    const r = EW.number(byId(side === "top" || side === "bottom" ? "in-width" : "in-height").value, "");
    return typeof r.v === "number" ? r.v : NaN;
  }
  const tidy = (v) => (Number.isFinite(v) ? String(Number(v.toPrecision(4))) : "");

  // current returns the parts as typed: [{to, kind, expr, h, ambient}] (text).
  function current(side) {
    return rows(side).map((r, i) => ({
      to: byId(id(side, i, "to")).value, kind: byId(id(side, i, "kind")).value,
      expr: byId(id(side, i, "expr")).value, h: byId(id(side, i, "h")).value, ambient: byId(id(side, i, "ambient")).value,
    }));
  }

  // render shows the parts (two or more) of an edge, or the one-condition
  // controls when list has fewer than two.
  function render(side, list) {
    const box = boxOf(side);
    const block = box.closest("fieldset");
    box.replaceChildren();
    const many = list.length > 1;
    block.querySelector(".whole").hidden = many;
    byId("split-" + side).hidden = many;
    box.hidden = !many;
    block.classList.toggle("in-parts", many);
    if (!many) return;
    box.append(el("p", { class: "hint", id: "parts-hint-" + side,
      text: "Each part ends at a distance s along the edge, " + ALONG[side] + "; the last part runs to the end. Formulas use the same s." }));
    list.forEach((p, i) => box.append(partRow(side, i, list.length, p)));
    relabel();
    froms(side);
  }

  function partRow(side, i, n, p) {
    const path = pathOf(side, i);
    const last = i === n - 1;
    const input = (f, formula) => el("input", {
      id: id(side, i, f), type: "text", class: formula ? "formula" : null, inputmode: formula ? null : "decimal",
      spellcheck: "false", autocapitalize: "off", "data-path": path + "." + f, "aria-describedby": "err-" + id(side, i, "x") + " parts-hint-" + side,
    });
    const to = input("to", false);
    to.value = last ? "" : p.to;
    to.addEventListener("input", () => froms(side));
    const kind = el("select", { id: id(side, i, "kind"), "data-path": path + ".kind" });
    for (const k of KINDS) kind.append(el("option", { value: k, text: k }));
    kind.value = KINDS.includes(p.kind) ? p.kind : "value";
    kind.dataset.was = kind.value;
    // a new kind takes the numbers of the old one (the form then relabels and solves)
    kind.addEventListener("change", () => {
      const ex = byId(id(side, i, "expr")), h = byId(id(side, i, "h")), amb = byId(id(side, i, "ambient"));
      if (kind.value === "convection") {
        if (!h.value.trim()) h.value = EW.physicsOf(byId("in-physics").value).default_h || "1";
        if (!amb.value.trim()) amb.value = kind.dataset.was === "value" ? ex.value : "";
      } else if (!ex.value.trim() || kind.value === "flux" || kind.dataset.was === "flux") {
        ex.value = kind.value === "flux" ? "0" : amb.value.trim() || ex.value || "0";
      }
      kind.dataset.was = kind.value;
    });
    const expr = input("expr", true), h = input("h", false), amb = input("ambient", true);
    expr.value = p.expr || "";
    h.value = p.h || "";
    amb.value = p.ambient || "";
    const name = "Part " + (i + 1);
    const row = el("div", { class: "part", id: id(side, i, "row"), "data-kind": kind.value },
      el("div", { class: "part-head" },
        el("b", { text: name }), el("span", { class: "part-from", id: id(side, i, "from") }),
        el("button", { type: "button", class: "mini", id: id(side, i, "split"), text: "Split",
          title: "Split " + name.toLowerCase() + " in two at its middle", onclick: () => splitPart(side, i) }),
        el("button", { type: "button", class: "mini", id: id(side, i, "remove"), text: "Remove",
          title: "Remove " + name.toLowerCase() + (i > 0 ? "; part " + i + " takes over its stretch" : "; part 2 takes over its stretch"), onclick: () => removePart(side, i) })),
      el("div", { class: "pair" },
        last ? el("p", { class: "part-end", id: id(side, i, "end") })
          : el("label", { class: "row" }, el("span", {}, name + " ends at s ", el("i", { class: "u", "data-unit": "length" })), to),
        el("label", { class: "row" }, el("span", { text: name + " condition" }), kind)),
      el("div", { class: "f-expr" }, el("label", { class: "row" }, el("span", { class: "lbl-expr" }), expr)),
      el("div", { class: "f-conv pair" },
        el("label", { class: "row" }, el("span", { class: "lbl-h" }), h),
        el("label", { class: "row" }, el("span", { class: "lbl-amb" }), amb)),
      el("div", { class: "err", id: "err-" + id(side, i, "x"), "data-err": path }));
    if (last) row.append(to); // kept (hidden) so that every part has the same fields
    to.hidden = last;
    return row;
  }

  // froms writes where each part starts (the end of the one before) and
  // where the last one ends.
  function froms(side) {
    const list = current(side);
    const L = lengthOf(side);
    list.forEach((p, i) => {
      const from = i === 0 ? "0" : list[i - 1].to.trim() || "?";
      const f = byId(id(side, i, "from"));
      if (f) f.textContent = "from s = " + from;
    });
    const end = byId(id(side, list.length - 1, "end"));
    if (end) end.textContent = "runs to the end, s = " + (Number.isFinite(L) ? tidy(L) : "?");
  }

  // relabel names the parts' fields for the physics on the form and shows
  // the fields of each part's kind.
  function relabel() {
    const P = EW.physicsOf(byId("in-physics").value);
    const u = P.units || {}, kinds = P.kinds || {}, labels = P.labels || {};
    // a part's end and h are read and shown in the display units, like the
    // one-condition edge's (measure.js); formulas stay SI
    const d = EW.shownUnits ? EW.shownUnits(u) : u;
    const unit = (x) => (x ? " [" + x + "]" : "");
    for (const side of SIDES) {
      rows(side).forEach((r, i) => {
        const name = "Part " + (i + 1) + " ";
        const k = byId(id(side, i, "kind"));
        for (const o of k.options) o.textContent = kinds[o.value] || o.value;
        r.dataset.kind = k.value;
        const conv = k.value === "convection";
        r.querySelector(".f-expr").hidden = conv;
        r.querySelector(".f-conv").hidden = !conv;
        r.querySelector(".lbl-expr").textContent = name + (k.value === "value"
          ? (u.value || "value") + unit(u.value_unit)
          : (labels.flux_in || (u.flux || "flux") + " in").toLowerCase() + unit(u.flux_unit));
        r.querySelector(".lbl-h").textContent = name + (u.coefficient || "h") + unit(d.coefficient_unit);
        r.querySelector(".lbl-amb").textContent = name + (labels.ambient || "ambient " + (u.value || "value")).toLowerCase() + unit(u.value_unit);
        for (const i2 of r.querySelectorAll("[data-unit=length]")) i2.textContent = "[" + (d.length_unit || "m") + "]";
      });
      froms(side);
    }
    drawKey(P);
  }

  // ---- splitting and removing ----

  function wholePart(side) {
    return {
      to: "", kind: byId("in-" + side + "-kind").value, expr: byId("in-" + side + "-expr").value,
      h: byId("in-" + side + "-h").value, ambient: byId("in-" + side + "-ambient").value,
    };
  }

  function changed(side, focus) {
    const f = byId(focus);
    if (f) f.focus();
    EW.edited && EW.edited(f || byId("split-" + side));
  }

  function splitWhole(side) {
    const p = wholePart(side);
    const L = lengthOf(side);
    render(side, [Object.assign({}, p, { to: tidy(L / 2) }), Object.assign({}, p)]);
    changed(side, id(side, 0, "to"));
  }

  // splitPart cuts part i in two at its middle; both halves keep its
  // condition.
  function splitPart(side, i) {
    const list = current(side);
    const L = lengthOf(side);
    const from = i === 0 ? 0 : Number(list[i - 1].to);
    const to = i === list.length - 1 ? L : Number(list[i].to);
    const mid = tidy((from + to) / 2);
    list.splice(i, 0, Object.assign({}, list[i], { to: mid }));
    render(side, list);
    changed(side, id(side, i, "to"));
  }

  // removePart drops part i: the part before it runs on to where it ended
  // (the first part's stretch goes to the next). One part left is the
  // one-condition form.
  function removePart(side, i) {
    const list = current(side);
    if (i > 0) list[i - 1].to = list[i].to;
    list.splice(i, 1);
    if (list.length === 1) {
      const p = list[0];
      byId("in-" + side + "-kind").value = p.kind;
      byId("in-" + side + "-expr").value = p.kind === "convection" ? "" : p.expr;
      byId("in-" + side + "-h").value = p.kind === "convection" ? p.h : "";
      byId("in-" + side + "-ambient").value = p.kind === "convection" ? p.ambient : "";
      render(side, []);
      EW.relabel();
      changed(side, "in-" + side + "-kind");
      return;
    }
    render(side, list);
    changed(side, id(side, Math.max(0, i - 1), "kind"));
  }

  // ---- reading and filling ----

  // read returns the edge as typed: {segments: [..]}, "to" on every part
  // but the last. num(inputId, path, what) reads a number field (form.js).
  function read(side, num) {
    const list = current(side);
    return {
      segments: list.map((p, i) => {
        const path = pathOf(side, i);
        const s = {};
        if (i < list.length - 1) s.to = num(id(side, i, "to"), path + ".to", "the end of part " + (i + 1));
        s.kind = p.kind;
        if (p.kind === "convection") {
          s.h = num(id(side, i, "h"), path + ".h", "h");
          s.ambient = p.ambient;
        } else {
          s.expr = p.expr;
        }
        return s;
      }),
    };
  }

  const text = (v) => (v === undefined || v === null ? "" : String(v));

  // fill shows an edge's segments (two or more), or the one-condition form
  // (null or one segment: form.js fills its fields).
  function fill(side, segments) {
    if (!Array.isArray(segments) || segments.length < 2) {
      render(side, []);
      return;
    }
    render(side, segments.map((s) => ({
      to: text(s.to), kind: s.kind, expr: s.kind === "convection" ? "" : text(s.expr),
      h: s.kind === "convection" ? text(s.h) : "", ambient: s.kind === "convection" ? text(s.ambient) : "",
    })));
  }

  // ---- the preview of a split edge ----

  // bounds returns [from, to] of every segment of an edge of length L.
  function bounds(segments, L) {
    return segments.map((s, i) => [i === 0 ? 0 : Number(segments[i - 1].to), i === segments.length - 1 ? L : Number(s.to)]);
  }

  // sample samples each part's data (its value, entering flux or ambient)
  // along its stretch: the engine's preview of the edge with that part's
  // condition from end to end, cut to the part.
  async function sample(project, side, n) {
    const segs = project.edges[side].segments;
    const L = side === "top" || side === "bottom" ? project.width : project.height;
    if (!(typeof L === "number" && L > 0)) return { value: { ok: false, parts: [] } };
    const b = bounds(segs, L);
    const parts = [];
    for (let i = 0; i < segs.length; i++) {
      const one = Object.assign({}, segs[i]);
      delete one.to;
      const edges = Object.assign({}, project.edges, { [side]: one });
      const m = await EW.engine.call("preview", JSON.stringify(Object.assign({}, project, { edges, probes: [] })), side, n);
      const r = m.value;
      const part = { from: b[i][0], to: b[i][1], kind: one.kind, ok: !!r.ok, s: [], v: [] };
      if (r.ok) {
        for (let k = 0; k < r.s.length; k++) {
          if (r.s[k] >= part.from - 1e-12 * L && r.s[k] <= part.to + 1e-12 * L) { part.s.push(r.s[k]); part.v.push(r.v[k]); }
        }
      }
      parts.push(part);
    }
    return { value: { ok: parts.every((p) => p.ok), parts, L } };
  }

  // draw draws a split edge's preview: each part's stretch with the kind's
  // own line (solid for a value, dashed for a flux, dotted for an
  // ambient), flux parts on a scale of their own, and the boundaries.
  function draw(side, r) {
    const c = byId("pv-" + side);
    const cssW = Math.max(120, c.parentElement.clientWidth - 2), cssH = 46;
    const ctx = EW.sizeCanvas(c, cssW, cssH);
    ctx.fillStyle = "#f1eee6";
    ctx.fillRect(0, 0, cssW, cssH);
    ctx.font = "11px system-ui, sans-serif";
    ctx.fillStyle = "#5b5f68";
    ctx.textBaseline = "middle";
    if (!r.ok || !r.parts.length) {
      ctx.fillText("no preview until every part reads", 6, cssH / 2);
      c.setAttribute("aria-label", "No preview of the " + side + " edge");
      return;
    }
    const m = { l: 50, r: 6, t: 11, b: 5 };
    const L = r.L;
    const X = (t) => m.l + (t / L) * (cssW - m.l - m.r);
    const range = (ps) => {
      let lo = Infinity, hi = -Infinity;
      for (const p of ps) for (const v of p.v) { if (v < lo) lo = v; if (v > hi) hi = v; }
      if (!(hi - lo > 1e-12 * Math.max(1, Math.abs(hi)))) return [lo - 1, hi + 1, lo, true];
      return [lo, hi, lo, false];
    };
    const field = r.parts.filter((p) => p.kind !== "flux"), flux = r.parts.filter((p) => p.kind === "flux");
    const fr = field.length ? range(field) : null, qr = flux.length ? range(flux) : null;
    const Yof = (rg) => (t) => m.t + (1 - (t - rg[0]) / (rg[1] - rg[0])) * (cssH - m.t - m.b);
    ctx.textAlign = "right";
    if (fr) {
      const Y = Yof(fr);
      if (fr[3]) ctx.fillText(EW.num(fr[2], 4), m.l - 5, Y(fr[2]));
      else { ctx.fillText(EW.num(fr[1], 4), m.l - 5, Y(fr[1])); ctx.fillText(EW.num(fr[0], 4), m.l - 5, Y(fr[0])); }
    }
    // where the parts meet, in the display length unit (as their fields)
    const U = EW.physicsOf(byId("in-physics").value).units || {};
    const at = (s) => (EW.dv ? EW.dv(U, "length", s) : s);
    const said = [];
    r.parts.forEach((p, i) => {
      const x0 = X(p.from), x1 = X(p.to);
      if (p.kind === "flux") { // the wall's hatching behind a flux part
        ctx.save();
        ctx.beginPath(); ctx.rect(x0, m.t, x1 - x0, cssH - m.t - m.b); ctx.clip();
        ctx.strokeStyle = "rgba(91,95,104,0.22)"; ctx.lineWidth = 1;
        ctx.beginPath();
        for (let x = x0 - cssH; x < x1; x += 6) { ctx.moveTo(x, cssH); ctx.lineTo(x + cssH, 0); }
        ctx.stroke();
        ctx.restore();
      }
      const Y = Yof(p.kind === "flux" ? qr : fr);
      ctx.strokeStyle = p.kind === "convection" ? "#2b4f6e" : INK;
      ctx.lineWidth = p.kind === "value" ? 1.8 : 1.4;
      ctx.setLineDash(p.kind === "flux" ? [5, 3] : p.kind === "convection" ? [1.5, 2.5] : []);
      ctx.beginPath();
      p.s.forEach((s, k) => (k ? ctx.lineTo(X(s), Y(p.v[k])) : ctx.moveTo(X(s), Y(p.v[k]))));
      ctx.stroke();
      ctx.setLineDash([]);
      if (p.kind === "flux" && p.v.length) { // its numbers beside it (they are on a scale of their own)
        const lo = Math.min(...p.v), hi = Math.max(...p.v);
        ctx.fillStyle = "#5b5f68"; ctx.textAlign = "left";
        ctx.fillText("q " + EW.num(lo, 3) + (hi > lo ? "…" + EW.num(hi, 3) : ""), x0 + 3, m.t + 4);
      }
      if (i > 0) { // the boundary and where it is
        ctx.strokeStyle = INK; ctx.lineWidth = 1;
        ctx.beginPath(); ctx.moveTo(x0, 0); ctx.lineTo(x0, cssH); ctx.stroke();
        ctx.fillStyle = INK; ctx.textAlign = "center";
        ctx.fillText(EW.num(at(p.from), 3), x0, 5);
      }
      said.push("part " + (i + 1) + ", " + p.kind + " from s = " + EW.num(at(p.from)) + " to " + EW.num(at(p.to)) +
        (p.v.length ? " (" + EW.num(Math.min(...p.v)) + (Math.max(...p.v) > Math.min(...p.v) ? " to " + EW.num(Math.max(...p.v)) : "") + ")" : ""));
    });
    c.setAttribute("aria-label", "The " + side + " edge in " + r.parts.length + " parts: " + said.join("; "));
    c.dataset.parts = r.parts.map((p) => p.kind + ":" + p.from + "-" + p.to).join(" ");
  }

  // ---- marks along the picture's outline ----
  //
  // Our own code, readable without colour: a value part is a heavy bar on
  // the outline, a flux part a thin line hatched outwards (a wall), a
  // convection part a dashed line standing off the outline; a short
  // cross-stroke marks where one part meets the next.

  function strokePart(ctx, kind, ax, ay, bx, by, nx, ny) {
    const len = Math.hypot(bx - ax, by - ay);
    const tx = (bx - ax) / (len || 1), ty = (by - ay) / (len || 1);
    ctx.save();
    ctx.lineCap = "butt";
    if (kind === "value") {
      ctx.strokeStyle = INK; ctx.lineWidth = 4;
      ctx.beginPath(); ctx.moveTo(ax + 1.2 * nx, ay + 1.2 * ny); ctx.lineTo(bx + 1.2 * nx, by + 1.2 * ny); ctx.stroke();
    } else if (kind === "flux") {
      ctx.strokeStyle = INK; ctx.lineWidth = 1;
      ctx.beginPath(); ctx.moveTo(ax, ay); ctx.lineTo(bx, by);
      for (let d = 3; d < len; d += 6) {
        const px = ax + tx * d, py = ay + ty * d;
        ctx.moveTo(px, py); ctx.lineTo(px + 5 * nx - 3 * tx, py + 5 * ny - 3 * ty);
      }
      ctx.stroke();
    } else {
      ctx.strokeStyle = "#2b4f6e"; ctx.lineWidth = 2; ctx.setLineDash([5, 3]);
      ctx.beginPath(); ctx.moveTo(ax + 4 * nx, ay + 4 * ny); ctx.lineTo(bx + 4 * nx, by + 4 * ny); ctx.stroke();
      ctx.setLineDash([]); ctx.lineWidth = 1;
      ctx.beginPath(); ctx.moveTo(ax, ay); ctx.lineTo(bx, by); ctx.stroke();
    }
    ctx.restore();
  }

  const NORMAL = { bottom: [0, 1], top: [0, -1], left: [-1, 0], right: [1, 0] };

  // mark draws every edge's parts along the outline (X, Y map field
  // coordinates to the canvas).
  function mark(ctx, project, X, Y) {
    const W = project.width, H = project.height;
    if (!(W > 0 && H > 0)) return;
    for (const side of SIDES) {
      const e = (project.edges || {})[side];
      if (!e) continue;
      const segs = Array.isArray(e.segments) ? e.segments : [e];
      const L = side === "top" || side === "bottom" ? W : H;
      const at = (s) => (side === "bottom" ? [X(s), Y(0)] : side === "top" ? [X(s), Y(H)] : side === "left" ? [X(0), Y(s)] : [X(W), Y(s)]);
      const [nx, ny] = NORMAL[side];
      bounds(segs, L).forEach(([a, b], i) => {
        const [ax, ay] = at(a), [bx, by] = at(b);
        strokePart(ctx, segs[i].kind, ax, ay, bx, by, nx, ny);
        if (i > 0) {
          ctx.save(); ctx.strokeStyle = INK; ctx.lineWidth = 1.5;
          ctx.beginPath(); ctx.moveTo(ax - 6 * nx, ay - 6 * ny); ctx.lineTo(ax + 9 * nx, ay + 9 * ny); ctx.stroke();
          ctx.restore();
        }
      });
    }
  }

  // drawKey explains the marks under the picture, in the physics' words.
  function drawKey(P) {
    let key = byId("edge-key");
    if (!key) {
      const stage = document.querySelector(".stage");
      if (!stage) return;
      key = el("ul", { class: "edge-key", id: "edge-key", "aria-label": "Marks along the outline" });
      stage.after(key);
    }
    const kinds = P.kinds || {};
    key.replaceChildren(...KINDS.concat(["boundary"]).map((k) => {
      const c = el("canvas", { width: "34", height: "14", "aria-hidden": "true" });
      const ctx = EW.sizeCanvas(c, 34, 14);
      if (k === "boundary") {
        strokePart(ctx, "flux", 2, 4, 32, 4, 0, 1);
        ctx.strokeStyle = INK; ctx.lineWidth = 1.5;
        ctx.beginPath(); ctx.moveTo(17, 0); ctx.lineTo(17, 14); ctx.stroke();
      } else {
        strokePart(ctx, k, 2, 4, 32, 4, 0, 1);
      }
      const what = k === "boundary" ? "where one part of an edge meets the next" : (kinds[k] || k);
      return el("li", { "data-kind": k }, c, el("span", { text: what }));
    }));
  }

  // ---- results: each part's flow and mean ----

  // flowRows adds a row per segment under an edge's row of the flow
  // table, when the result lists more than one (add(name, text, cls)
  // appends a row and returns it).
  function flowRows(add, side, e, u) {
    const segs = e && Array.isArray(e.segments) ? e.segments : null;
    if (!segs || segs.length < 2) return;
    const vu = EW.conv ? EW.withUnit("", EW.conv(u, "value").unit) : u.value_unit ? " " + u.value_unit : "";
    segs.forEach((g, i) => {
      const name = "  part " + (i + 1) + " (" + g.kind + ", s " + EW.num(g.from, 3) + "–" + EW.num(g.to, 3) + ")";
      const finite = g.finite !== false && typeof g.flow === "number";
      const tr = add(name, finite ? EW.flow(g.flow, 5, u) : "∞ infinite", "seg" + (finite ? "" : " inf"));
      tr.classList.add("part-row");
      tr.dataset.edge = side;
      tr.dataset.part = String(i);
      tr.dataset.kind = g.kind;
      if (typeof g.mean === "number") tr.lastChild.append(el("span", { class: "mean", text: "mean " + EW.value(g.mean, 5, u) + vu }));
    });
  }

  EW.parts = {
    count: (side) => (boxOf(side).hidden ? 1 : rows(side).length),
    read, fill, relabel, sample, draw, mark, flowRows,
  };
})();
