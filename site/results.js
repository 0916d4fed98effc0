// edgewise page: the numbers of a solve. On every solve in the store it
// draws the picture (field.js) and writes the results panel (extremes,
// flows through the edges with the balance, accuracy, the engine's notes)
// and the cautions. Entry point: the store's "solved" notification.
//
// The engine's warnings are {code, edges, text} (codes in
// solver/problem/warning.go). The page branches on code and edges only,
// never on the wording; it shows text. A plain string (an engine from
// before structured warnings) is shown as text with no code.
"use strict";
(function () {
  const EW = (window.edgewiseParts = window.edgewiseParts || {});
  const { byId, el, kvRow } = EW.dom;

  // the reason shown beside an infinite edge flow, by warning code
  const JUMP_REASONS = {
    "corner-jump": "the prescribed value jumps at a corner",
    "step-jump": "the prescribed value jumps inside this edge",
  };

  // the engine's last sentence of the accuracy statement for a solve run
  // without its check (solver/crosscheck.go, noCheck)
  const NO_CHECK = " No independent check was run for this solve.";

  function warningsOf(r) {
    return (Array.isArray(r.warnings) ? r.warnings : []).map((w) =>
      typeof w === "string"
        ? { code: "", edges: [], text: w }
        : {
          code: w && typeof w.code === "string" ? w.code : "",
          edges: w && Array.isArray(w.edges) ? w.edges.map(String) : [],
          text: String((w && (w.text || w.code)) || ""),
        });
  }

  // whyInfinite explains infinite flows for the causes found (warning codes).
  function whyInfinite(causes, value) {
    const where = [];
    if (causes.has("corner-jump")) where.push("at a corner");
    if (causes.has("step-jump")) where.push("inside an edge");
    const at = where.length ? where.join(" or ") : "at a corner or inside an edge";
    return "Why infinite: where the prescribed " + value + " jumps " + at + ", the gradient grows like 1/r " +
      "towards the jump and the flow through the edges that carry it has no finite total. Real parts have a small gap or a " +
      "rounded transition; formulas that meet at the corners, and steps given a width (rise(s, where, width)), give finite " +
      "flows. Values away from the jump are not affected.";
  }

  function flowsTable(S, warnings, box) {
    const r = S.result, u = S.units || {};
    const fu = EW.conv(u, "flow").unit;
    const t = el("table", { class: "flows", id: "res-flows" });
    const add = (name, text, cls) => {
      const tr = el("tr", {}, el("th", { scope: "row", text: name }), el("td", { class: "num" + (cls ? " " + cls : ""), text }));
      t.append(tr);
      return tr;
    };
    const infinite = [];
    const causes = new Set(); // codes of the jumps that make a flow infinite
    let largest = Math.abs(r.source_total || 0);
    for (const side of ["top", "bottom", "left", "right"]) {
      const e = r.edges[side];
      if (e.finite && e.flow !== null) {
        largest = Math.max(largest, Math.abs(e.flow));
        add(EW.capital(side), EW.flow(e.flow, 5, u));
        if (EW.parts) EW.parts.flowRows(add, side, e, u); // each segment's flow and mean (segments.js)
        continue;
      }
      infinite.push(side);
      const tr = add(EW.capital(side), "∞ infinite", "inf");
      // the engine's reason: a warning with a jump's code naming this edge
      const seen = new Set();
      for (const w of warnings) {
        const why = JUMP_REASONS[w.code];
        if (!why || !w.edges.includes(side) || seen.has(w.code)) continue;
        seen.add(w.code);
        causes.add(w.code);
        tr.lastChild.append(el("span", { class: "reason", "data-code": w.code, text: why }));
      }
      if (EW.parts) EW.parts.flowRows(add, side, e, u);
    }
    if (r.source_total) add("Source", EW.flow(r.source_total, 5, u));
    let balanceText;
    if (r.balance === null || infinite.length) {
      balanceText = "not defined (an edge flow is infinite)";
    } else {
      // against the largest flow or, when every flow is near zero (which
      // would give a meaningless 100 %), the flow a unit-aspect block with
      // the field's range across it would carry
      const kdu = Math.sqrt(S.kx * S.ky) * (r.max.value - r.min.value);
      const scale = largest > 1e-6 * kdu ? largest : kdu;
      balanceText = EW.flow(r.balance, 3, u) + (scale > 0 ? "  (" + EW.num((100 * Math.abs(r.balance)) / scale, 2) + (scale === largest ? " % of the largest flow)" : " % of conductivity × range)") : "");
    }
    add("Balance", balanceText, "balance").id = "res-balance";
    box.append(el("h3", { text: "Flow through the edges" + (fu ? " [" + fu + "]" : "") }),
      el("p", { class: "hint", text: "Positive into the rectangle, per metre of depth." }), t);
    if (infinite.length) box.append(el("p", { class: "why", text: whyInfinite(causes, u.value || "value") }));
  }

  function render(S) {
    const r = S.result, u = S.units || {};
    const box = byId("results");
    // the trades' answers (answers.js) sit in this box too: a new solve
    // writes them again after this, but the first picture's cross-check
    // writes only this part again, and they must stay
    const answers = byId("answers");
    box.replaceChildren();
    const vu = EW.conv(u, "value").unit, L = EW.conv(u, "length").unit;
    const len = (v) => EW.num(EW.dv(u, "length", v), 4);
    const at = (e) => "at x = " + len(e.x) + ", y = " + len(e.y) + " " + L;
    const dl = el("dl", { class: "kv" });
    // A result the engine cannot stand behind (accuracy.converged false)
    // says so first and does not headline its extremes.
    const unreliable = (r.accuracy || {}).converged === false;
    if (unreliable) {
      box.append(el("p", { class: "unconverged", id: "res-unconverged", role: "alert",
        text: "Not converged: the engine could not meet its tolerance for this project (see the notes from the engine). " +
          "The extremes, derived answers and cautions are withheld and the picture is for orientation only; do not use these numbers." }));
    }
    const headline = (v) => (unreliable ? "not reliable" : EW.withUnit(EW.value(v, 5, u), vu));
    kvRow(dl, "Highest " + (u.value || "value"), headline(r.max.value), unreliable ? "" : at(r.max)).id = "res-max";
    kvRow(dl, "Lowest " + (u.value || "value"), headline(r.min.value), unreliable ? "" : at(r.min)).id = "res-min";
    kvRow(dl, "Mean " + (u.value || "value"), headline(r.mean), "over the rectangle").id = "res-mean";
    box.append(dl);
    const warnings = warningsOf(r);
    flowsTable(S, warnings, box);

    const da = el("dl", { class: "kv" });
    const acc = r.accuracy || {};
    // differences: a kelvin is 1.8 °F, whatever the offset
    const diff = (v) => (v === null || v === undefined ? "–" : EW.withUnit(EW.num(EW.dd(u, "value", v), 2), vu));
    // the engine's one statement, its numbers written in the page's units;
    // while the first picture's check runs (solving.js), its last sentence
    // (the engine's for a solve without the check) says so instead
    let said = acc.statement || "";
    if (S.checkPending) said = said.replace(NO_CHECK, " An independent check is running; what it shows follows here.");
    else if (S.checkFailed) said = said.replace(NO_CHECK, " The independent check was not done: " + S.checkFailed + ".");
    const statement = said.replace(/\{(estimate|difference|resolution)\}/g, (_, k) =>
      diff({ estimate: acc.estimate, difference: acc.crosscheck, resolution: acc.crosscheck_resolution }[k]));
    box.append(el("h3", { text: "Accuracy" }),
      el("p", { id: "res-accuracy", class: "accuracy " + (S.checkPending ? "pending" : acc.crosscheck_verdict || "unchecked"), text: statement }), da);
    kvRow(da, "Series terms", String(acc.terms));
    kvRow(da, "Error estimate", diff(acc.estimate), "largest, away from singular points: rely on this");
    let check;
    if (S.checkPending) {
      // the first picture comes before its cross-check (solving.js)
      check = kvRow(da, "Cross-check", "pending", "the independent check is running; its difference shows here when it is done");
    } else if (S.checkFailed) {
      check = kvRow(da, "Cross-check", "not done", S.checkFailed);
    } else if (acc.crosscheck !== null && acc.crosscheck !== undefined) {
      check = kvRow(da, "Cross-check", diff(acc.crosscheck), "largest difference from an independent solution (" + (acc.crosscheck_grid || "") + ")");
      kvRow(da, "Check resolves to", diff(acc.crosscheck_resolution), "how far the independent solution resolves this problem itself");
    } else {
      check = kvRow(da, "Cross-check", "skipped", acc.crosscheck_skipped || "");
    }
    check.id = "res-check";
    kvRow(da, "Output grid", r.grid.nx + " × " + r.grid.ny + " intervals");
    if (warnings.length) {
      const ul = el("ul", { class: "warnings" });
      for (const w of warnings) ul.append(el("li", { "data-code": w.code || null, text: w.text }));
      box.append(el("h3", { text: "Notes from the engine" }), ul);
    }
    if (answers) box.append(answers);
  }

  function renderCautions(r) {
    const ul = byId("cautions");
    ul.replaceChildren();
    const list = r.cautions || [];
    list.forEach((c, i) => ul.append(el("li", { class: i === list.length - 1 ? "deferral" : null, text: c })));
  }

  // render(S) writes the panel again (the cross-check that follows the
  // first picture)
  EW.results = { render: (S) => render(S) };

  EW.store.on("solved", () => {
    const S = EW.store.last();
    if (S.drawn) S.drawn = false; // the first picture, drawn ahead (solving.js load)
    else EW.show(S);
    render(S);
    renderCautions(S.result);
  });
})();
