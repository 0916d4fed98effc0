// edgewise page: the answers each trade asks for. The engine computes them
// (solver/answers.go; the result's edges[..].mean and per_length,
// "conductance" or "conductance_none", and "answers"); this file shows
// them under the results, draws the flow net on the picture (the hook
// EW.drawFlowNet, called by field.js), offers the inputs they need (flow
// channels; the dielectric and its breakdown strength; the soil's unit
// weights; the relative permittivity εr) and the line-profile CSV.
//
// The inputs travel in the project as "answers" (project/answers.go);
// form.js keeps them through EW.setAnswers.
"use strict";
(function () {
  const EW = (window.edgewiseParts = window.edgewiseParts || {});
  const { byId, el, kvRow, save } = EW.dom;
  const { act, call } = EW.notice;
  const EPS0 = 8.8541878128e-12; // F/m, CODATA 2018 (also in the physics table)
  const NET = "#0d4f4a";
  const PAPER = "rgba(251, 250, 246, 0.85)";

  let showNet = false;

  const termsOf = (physics) => (EW.physicsOf(physics) || {}).terms || {};
  const unitsOf = (physics) => (EW.unitsets || {})[physics] || {};
  const n = (v, d) => (typeof v === "number" && isFinite(v) ? EW.num(v, d || 5) : "—");
  const withU = (name, unit) => (unit ? name + " [" + unit + "]" : name);

  // ---- inputs ----

  const num = (id, label, hint) => el("label", { class: "row" }, el("span", { text: label }),
    el("input", { id, type: "text", inputmode: "decimal", "data-path": "answers." + hint, "aria-describedby": "err-answers" }));
  const dielectric = el("select", { id: "ans-dielectric", "aria-describedby": "hint-dielectric" });
  const box = el("fieldset", { class: "group", id: "answers-inputs" },
    el("legend", { text: "Answers asked for" }),
    num("ans-channels", "Flow channels in the flow net", "channels"),
    el("div", { id: "ans-electro", hidden: true },
      el("label", { class: "row" }, el("span", { text: "Dielectric for the breakdown check" }), dielectric),
      num("ans-breakdown", "its breakdown strength [kV/mm]", "breakdown_strength"),
      el("p", { class: "hint", id: "hint-dielectric" })),
    el("div", { id: "ans-seepage", hidden: true },
      el("div", { class: "pair" },
        num("ans-gsat", "saturated unit weight γsat [kN/m³]", "saturated_unit_weight"),
        num("ans-gw", "unit weight of water γw [kN/m³]", "water_unit_weight")),
      el("div", { class: "pair" },
        num("ans-gs", "specific gravity of solids Gs", "specific_gravity"),
        num("ans-e", "void ratio e", "void_ratio")),
      num("ans-datum", "elevation datum: height y where z = 0 [m]", "datum"),
      el("p", { class: "hint", text: "Critical hydraulic gradient: (γsat − γw)/γw when γsat is given (γw 9.81 kN/m³ unless given), else (Gs − 1)/(1 + e) when both are given, else about 1 (common practice). Uplift under an impervious base (a no-flow part of the top edge): pore pressure u = γw (h − z), the heads measured from the datum (by default the bottom edge)." })),
    el("p", { class: "err", id: "err-answers", "data-err": "answers" }));
  const form = byId("inputs");
  form.insertBefore(box, byId("err-other"));

  // εr beside the permittivity: ε = εr × ε0 (the file keeps ε)
  const epsr = el("input", { id: "in-epsr", type: "text", inputmode: "decimal", "aria-describedby": "hint-epsr" });
  const epsrRow = el("div", { id: "epsr-row", hidden: true },
    el("label", { class: "row" }, el("span", { text: "Relative permittivity εr" }), epsr),
    el("p", { class: "hint", id: "hint-epsr", text: "Permittivity ε = εr × ε0, with the vacuum permittivity ε0 = 8.8541878128 × 10⁻¹² F/m (CODATA 2018)." }));
  byId("k-iso").after(epsrRow);

  // recharge as a rate with its unit spelt out (the form's unit reads 1/s)
  const rechargeHint = el("p", { class: "hint", id: "hint-recharge", hidden: true });
  byId("hint-source").after(rechargeHint);

  function fillDielectrics(physics) {
    const list = termsOf(physics).dielectrics || [];
    const was = dielectric.value;
    dielectric.replaceChildren();
    for (const d of list) dielectric.append(el("option", { value: d.name, text: d.name + " (" + d.source + ")" }));
    dielectric.append(el("option", { value: "", text: "other: name it in the project title, give the strength" }));
    if ([...dielectric.options].some((o) => o.value === was)) dielectric.value = was;
  }

  function dielectricHint() {
    const d = (termsOf("electrostatic").dielectrics || []).find((x) => x.name === dielectric.value);
    byId("hint-dielectric").textContent = d
      ? "Typical: " + d.name + " breaks down near " + EW.num(d.strength / 1e6, 3) + " kV/mm, εr ≈ " + d.rel_perm + " (" + d.source + "). Leave the strength empty to use it."
      : "Give the breakdown strength of the dielectric from its datasheet.";
  }

  // readAnswers builds the project's "answers" from the inputs: only what
  // was given, and only for the chosen physics. A number that does not
  // read goes as text, so that the engine names the field.
  function readAnswers() {
    const physics = byId("in-physics").value;
    const a = {};
    const put = (key, id, scale) => {
      const t = byId(id).value.trim();
      if (t === "") return;
      const v = /^[+-]?(\d+\.?\d*|\.\d+)([eE][+-]?\d+)?$/.test(t) ? Number(t) * (scale || 1) : t;
      a[key] = v;
    };
    put("channels", "ans-channels");
    if (physics === "electrostatic") {
      const d = (termsOf(physics).dielectrics || []).find((x) => x.name === dielectric.value);
      if (dielectric.value) a.dielectric = dielectric.value;
      put("breakdown_strength", "ans-breakdown", 1e6);
      if (a.breakdown_strength === undefined && d && d.name !== "dry air at sea level") a.breakdown_strength = d.strength;
      if (a.breakdown_strength === undefined) delete a.dielectric; // the engine's default: dry air
    }
    if (physics === "seepage") {
      put("saturated_unit_weight", "ans-gsat");
      put("water_unit_weight", "ans-gw");
      put("specific_gravity", "ans-gs");
      put("void_ratio", "ans-e");
      put("datum", "ans-datum");
    }
    return a;
  }

  function fillAnswers(a) {
    a = a || {};
    const set = (id, v, scale) => { byId(id).value = typeof v === "number" ? String(Number((v / (scale || 1)).toPrecision(10))) : ""; };
    set("ans-channels", a.channels);
    set("ans-breakdown", a.breakdown_strength, 1e6);
    set("ans-gsat", a.saturated_unit_weight);
    set("ans-gw", a.water_unit_weight);
    set("ans-gs", a.specific_gravity);
    set("ans-e", a.void_ratio);
    set("ans-datum", a.datum);
    fillDielectrics("electrostatic");
    if (!a.dielectric) dielectric.selectedIndex = 0; // the engine's default: the first, dry air
    else if ([...dielectric.options].some((o) => o.value === a.dielectric)) dielectric.value = a.dielectric;
    else dielectric.value = "";
    dielectricHint();
  }

  function relabel(p) {
    const physics = (p && p.physics) || byId("in-physics").value;
    byId("ans-electro").hidden = physics !== "electrostatic";
    byId("ans-seepage").hidden = physics !== "seepage";
    const iso = p ? typeof p.conductivity !== "object" : !byId("in-ortho").checked;
    epsrRow.hidden = physics !== "electrostatic" || !iso;
    rechargeHint.hidden = physics !== "seepage";
    if (physics === "seepage") {
      const tm = termsOf(physics);
      const q = p && typeof p.source === "number" && typeof p.width === "number" && typeof p.height === "number" ? p.source * p.width * p.height : null;
      rechargeHint.textContent = EW.capital(tm.source_rate || "recharge rate") + " in " + (tm.source_rate_unit || "1/s") + " (1/s)" +
        (q ? ": over this section " + n(q * 86400, 4) + " m³/day per metre of depth." : ".");
    }
    if (!epsrRow.hidden && document.activeElement !== epsr && p && typeof p.conductivity === "number") {
      epsr.value = String(Number((p.conductivity / EPS0).toPrecision(8)));
    }
  }

  for (const input of box.querySelectorAll("input, select")) {
    input.addEventListener("input", (ev) => {
      ev.stopPropagation(); // the form's own listener would read the project without these
      if (input === dielectric) dielectricHint();
      EW.setAnswers(readAnswers());
      EW.edited(input);
    });
  }
  epsr.addEventListener("input", (ev) => {
    ev.stopPropagation();
    const t = epsr.value.trim();
    if (!/^[+-]?(\d+\.?\d*|\.\d+)([eE][+-]?\d+)?$/.test(t) || !(Number(t) > 0)) return;
    byId("in-k").value = String(Number((Number(t) * EPS0).toPrecision(12)));
    EW.edited(byId("in-k"));
  });

  const fill0 = EW.fill;
  EW.fill = function (p) {
    fill0(p);
    fillAnswers(p && p.answers);
    relabel(p);
  };
  EW.store.on("edited", (d) => relabel(d.project));

  // ---- the profile line ----

  // profileLine is the line on screen [x0, y0, x1, y1], or null.
  EW.profileLine = function () {
    const v = ["pf-x0", "pf-y0", "pf-x1", "pf-y1"].map((id) => Number(byId(id).value.trim().replace("−", "-")));
    if (v.some((x) => !isFinite(x)) || ["pf-x0", "pf-y0", "pf-x1", "pf-y1"].some((id) => byId(id).value.trim() === "")) return null;
    if (v[0] === v[2] && v[1] === v[3]) return null;
    return v;
  };
  byId("profile").after(el("p", {},
    el("button", {
      type: "button", id: "ew-dl-profile", text: "Profile CSV", title: "The field along the line, 101 places, from the series",
      onclick: () => act(async () => {
        const p = EW.store.project();
        if (!p) throw new Error("there is no project yet");
        if (!EW.profileLine()) throw new Error("draw a profile line first");
        const r = await call("export", "profile-csv", JSON.stringify(p), EW.report.options(p));
        save(r.name, r.mime, r.text);
        return r.name;
      }),
    })));

  // ---- the flow net on the picture ----

  const toggle = el("input", { id: "opt-flownet", type: "checkbox" });
  byId("opt-iso").closest("label").after(el("label", { class: "check" }, toggle, " Flow net"));
  toggle.addEventListener("change", () => {
    showNet = toggle.checked;
    const S = EW.store.last();
    if (S) EW.show(S);
  });

  EW.drawFlowNet = function (ctx, S, X, Y) {
    if (!showNet || !S.flowsegs) return;
    const strokeSegs = (segs) => {
      ctx.beginPath();
      for (let k = 0; k < segs.length; k += 4) {
        ctx.moveTo(X(segs[k]), Y(segs[k + 1]));
        ctx.lineTo(X(segs[k + 2]), Y(segs[k + 3]));
      }
      ctx.stroke();
    };
    ctx.save();
    for (const [style, width] of [[PAPER, 3], [NET, 1.4]]) {
      ctx.strokeStyle = style;
      ctx.lineWidth = width;
      strokeSegs(S.flowsegs);
    }
    if (S.equisegs) {
      ctx.setLineDash([5, 3]);
      ctx.strokeStyle = NET;
      ctx.lineWidth = 1;
      strokeSegs(S.equisegs);
    }
    ctx.restore();
  };

  // ---- the answers under the results ----

  function table(id, head, rows) {
    const t = el("table", { class: "flows", id });
    const tr = el("tr");
    for (const h of head) tr.append(el("th", { scope: "col", text: h }));
    t.append(el("thead", {}, tr));
    const body = el("tbody");
    for (const row of rows) {
      const r = el("tr", { "data-key": row[0] });
      row.forEach((c, i) => r.append(i === 0 ? el("th", { scope: "row", text: c }) : el("td", { class: "num", text: c })));
      body.append(r);
    }
    t.append(body);
    return t;
  }

  // linePlot draws values v along places s on a small canvas with a zero
  // line: stroke colour, and fill (or null) for the area under the curve.
  function linePlot(id, s, v, stroke, fill, label) {
    const c = el("canvas", { id, width: "280", height: "70", role: "img" });
    const ctx = EW.sizeCanvas(c, 280, 70);
    ctx.fillStyle = "#fbfaf6";
    ctx.fillRect(0, 0, 280, 70);
    let lo = Math.min(0, ...v), hi = Math.max(0, ...v);
    if (!(hi > lo)) hi = lo + 1;
    const px = (x) => 4 + ((x - s[0]) / ((s[s.length - 1] - s[0]) || 1)) * 272;
    const py = (y) => 62 - ((y - lo) / (hi - lo)) * 56;
    ctx.strokeStyle = "#d8d3c7";
    ctx.beginPath(); ctx.moveTo(4, py(0)); ctx.lineTo(276, py(0)); ctx.stroke();
    if (fill) {
      ctx.fillStyle = fill;
      ctx.beginPath(); ctx.moveTo(px(s[0]), py(0));
      v.forEach((y, i) => ctx.lineTo(px(s[i]), py(y)));
      ctx.lineTo(px(s[s.length - 1]), py(0)); ctx.closePath(); ctx.fill();
    }
    ctx.strokeStyle = stroke;
    ctx.lineWidth = 1.6;
    ctx.beginPath();
    v.forEach((y, i) => (i ? ctx.lineTo(px(s[i]), py(y)) : ctx.moveTo(px(s[i]), py(y))));
    ctx.stroke();
    c.setAttribute("aria-label", label);
    return c;
  }

  // sigmaPlot draws a surface charge density along an electrode part.
  function sigmaPlot(e, L, ls) {
    const s = e.s || [], v = e.sigma || [];
    return linePlot("ans-sigma-" + e.part.replace(/\W/g, ""), s, v, "#7a1f4d", null,
      "Surface charge density along " + e.part + " from s = " + n(s[0] * ls, 3) + " to " + n(s[s.length - 1] * ls, 3) + " " + L +
      ": least " + n(Math.min(...v), 4) + ", greatest " + n(Math.max(...v), 4) + " C/m².");
  }

  // pressurePlot draws the pore pressure along an impervious base.
  function pressurePlot(up, L, ls) {
    const s = up.s || [], v = up.pressure || [];
    return linePlot("ans-pressure-" + up.part.replace(/\W/g, ""), s, v, "#2e5e6e", "rgba(46, 94, 110, 0.25)",
      "Pore pressure under " + up.part + " from x = " + n(s[0] * ls, 3) + " to " + n(s[s.length - 1] * ls, 3) + " " + L +
      ": " + n(v[0], 4) + " kPa at its start, " + n(v[v.length - 1], 4) + " kPa at its end, least " + n(Math.min(...v), 4) + ", greatest " + n(Math.max(...v), 4) + " kPa.");
  }

  function render(S) {
    const r = S.result, p = S.project;
    const old = byId("answers");
    if (old) old.remove();
    const a = r.answers;
    if (!a) return;
    const u = unitsOf(p.physics), tm = termsOf(p.physics);
    // in the display units (measure.js): values with their offset, steps
    // and differences without, lengths, flows, fluxes and conductances
    const vu = EW.conv(u, "value").unit, L = EW.conv(u, "length").unit;
    const nv = (v, d) => n(EW.dv(u, "value", v), d), nd = (v, d) => n(EW.dd(u, "value", v), d);
    const nl = (v, d) => n(EW.dv(u, "length", v), d), nf = (v, d) => n(EW.dd(u, "flow", v), d);
    const fu = EW.conv(u, "flow").unit;
    // the conductance per metre converts like the material constant (heat, electrostatics)
    const cc = p.physics === "seepage" ? { unit: tm.conductance_unit, scale: 1 } : EW.conv(u, "conductivity");
    const cu = cc.unit === tm.conductance_unit || !cc.unit ? tm.conductance_unit : cc.unit;
    const ru = cu === tm.conductance_unit ? tm.resistance_unit : cu === "Btu/(h·ft·°F)" ? "h·ft·°F/Btu" : "1/(" + cu + ")";
    const pl = p.physics === "electrostatic" ? { unit: tm.per_length_unit, scale: 1 } : EW.conv(u, "flux");
    const sec = el("section", { id: "answers", "aria-label": "Answers" }, el("h3", { text: "Answers" }));

    const rows = ["top", "bottom", "left", "right"].map((side) => {
      const e = r.edges[side];
      const L = side === "top" || side === "bottom" ? p.width : p.height;
      // a net flow below the accuracy (a pool at each end of one edge) is noise: 0
      const noise = Math.abs((e.per_length || 0) * L) < EW.floors().flow;
      return [EW.capital(side), nv(e.mean), e.per_length === null || e.per_length === undefined ? "∞ infinite" : noise ? "0" : n(e.per_length * pl.scale)];
    });
    sec.append(table("ans-edges", ["Edge", withU("mean " + (u.value || "value"), vu), withU(tm.per_length || "flow per length", pl.unit || tm.per_length_unit)], rows));

    const dl = el("dl", { class: "kv" });
    sec.append(dl);
    const c = r.conductance;
    if (c) {
      kvRow(dl, EW.capital(tm.conductance || "conductance"), EW.withUnit(n(c.per_difference * cc.scale), cu),
        "per metre of depth, between " + c.high.parts.join(", ") + " at " + nv(c.high.value) + " " + vu + " and " + c.low.parts.join(", ") + " at " + nv(c.low.value) + " " + vu).id = "ans-conductance";
      if (tm.resistance) kvRow(dl, EW.capital(tm.resistance), EW.withUnit(n(1 / (c.per_difference * cc.scale)), ru), "per metre of depth").id = "ans-resistance";
      kvRow(dl, "Shape factor Q/(k ΔU)", n(c.shape_factor)).id = "ans-shape";
    } else {
      kvRow(dl, EW.capital(tm.conductance || "conductance"), r.conductance_none || "not defined").id = "ans-conductance";
    }
    const net = a.flow_net || {};
    if (net.reason) {
      kvRow(dl, "Flow net", net.reason).id = "ans-net";
    } else if (net.square === false) {
      kvRow(dl, "Flow net", net.channels + " channels, not square", net.note + "; " + nf(net.flow_step, 4) + " " + fu + " of outflow per channel").id = "ans-net";
    } else {
      kvRow(dl, "Flow net", net.channels + " channels, " + n(net.drops, 4) + " drops",
        "channels/drops = " + n(net.ratio, 4) + " = Q/(k ΔU); " + nf(net.flow_step, 4) + " " + fu + " per channel, " + nd(net.potential_step, 4) + " " + vu + " per drop; cells are squares" +
        (S.kx !== S.ky ? " in the mapped coordinates y' = y √(kx/ky)" : "")).id = "ans-net";
    }

    if (a.heat) {
      const h = a.heat;
      if (h.convection.length) {
        sec.append(el("h3", { text: "Heat lost to the fluid" }),
          table("ans-heat-loss", ["Part", "heat lost [" + fu + "]", "Biot h L/k", "reading"],
            h.convection.map((x) => [x.part, nf(x.loss), n(x.biot, 3) + " (L = " + nl(x.length, 3) + " " + L + ")", x.reading])));
      }
      if (h.surfaces.length) {
        sec.append(el("h3", { text: "Mean surface temperature" }),
          table("ans-surfaces", ["Part", "kind", withU("mean temperature", vu)], h.surfaces.map((x) => [x.part, x.kind, nv(x.mean)])));
      }
    }
    if (a.electrostatic) {
      const e = a.electrostatic;
      sec.append(el("h3", { text: "Electrodes" }),
        table("ans-charge", ["Part", withU("potential", vu), "charge [C/m]"], e.electrodes.map((x) => [x.part, nv(x.potential), x.charge === null ? "∞ infinite" : n(x.charge)])));
      for (const x of e.electrodes) {
        sec.append(el("figure", { class: "sigma" }, sigmaPlot(x, L, EW.conv(u, "length").scale),
          el("figcaption", { text: "Surface charge density along " + x.part + " [C/m²], the displacement flux into the gap" })));
      }
      const pk = el("dl", { class: "kv" });
      kvRow(pk, "Peak field strength", n(e.peak.value / 1e6, 4) + " kV/mm",
        "at (" + nl(e.peak.x, 4) + ", " + nl(e.peak.y, 4) + ") " + L + (a.singular.length ? ", at least " + nl(a.near, 3) + " " + L + " from where two potentials meet: the ideal field is unbounded there; real edges are rounded and that value is not a design number" : "")).id = "ans-peak";
      kvRow(pk, "Against breakdown", n(e.ratio, 3) + " of " + n(e.breakdown / 1e6, 4) + " kV/mm", e.dielectric + " (" + e.breakdown_source + ")").id = "ans-breakdown-ratio";
      sec.append(pk, el("p", { class: "hint", text: "Permittivity ε = εr × ε0, ε0 = 8.8541878128 × 10⁻¹² F/m (CODATA 2018)." }));
    }
    if (a.seepage) {
      const s = a.seepage;
      const sd = el("dl", { class: "kv" });
      kvRow(sd, "Discharge per metre", n(s.discharge, 4) + " m³/s = " + n(s.per_day, 4) + " m³/day", "per metre of section depth").id = "ans-discharge";
      if (s.per_head !== null) kvRow(sd, EW.capital(tm.conductance), EW.withUnit(n(s.per_head, 4), tm.conductance_unit)).id = "ans-per-head";
      if (s.recharge) kvRow(sd, "Recharge into the section", n(s.recharge * 86400, 4) + " m³/day per metre", "from the " + tm.source_rate + " [" + tm.source_rate_unit + "]").id = "ans-recharge";
      kvRow(sd, "Critical hydraulic gradient", n(s.critical_gradient, 3), s.critical_rule).id = "ans-critical";
      sec.append(sd);
      if (s.exits.length) {
        sec.append(table("ans-exit", ["Exit part", "exit gradient", "where", "factor of safety against heave"],
          s.exits.map((x) => [x.part, n(x.gradient, 3), "(" + nl(x.x, 4) + ", " + nl(x.y, 4) + ") " + L, n(x.factor_of_safety, 3)])));
        if (a.singular.length) sec.append(el("p", { class: "hint", text: "Exit gradients are taken at least " + nl(a.near, 3) + " " + L + " from where two heads meet; the gradient is unbounded there in the ideal model." }));
      }
      for (const up of s.uplift || []) {
        const ud = el("dl", { class: "kv", id: "ans-uplift-" + up.part.replace(/\W/g, "") });
        kvRow(ud, "Uplift under " + up.part, n(up.force, 4) + " kN/m", "per metre of depth, " + (up.force >= 0 ? "upward" : "downward (the pressure is below atmospheric)"));
        if (up.line !== null) kvRow(ud, "acting at", "x = " + nl(up.line, 4) + " " + L, "the line of action of the resultant");
        kvRow(ud, "mean head under it", nl(up.mean_head, 4) + " m", "base elevation z = " + n(up.elevation, 4) + " m, γw = " + n(s.water_unit_weight, 4) + " kN/m³, datum y = " + n(s.datum, 4) + " m");
        sec.append(ud, pressurePlot(up, L, EW.dv(u, "length", 1)));
      }
    }
    byId("results").append(sec);
  }

  EW.store.on("solved", () => {
    const S = EW.store.last();
    if (S) render(S);
  });
})();
