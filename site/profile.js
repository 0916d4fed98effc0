// edgewise page: the line-profile plot. Plots the field along the segment
// from A to B under the picture. Entry point: EW.plotProfile(canvas, S,
// profile, sample), with S the shown solve, profile {a: {x, y}, b: {x, y}}
// and sample(x, y) -> {u} the field between grid nodes.
"use strict";
(function () {
  const EW = (window.edgewiseParts = window.edgewiseParts || {});
  const INK = "#1b2029";
  const PAPER = "#fbfaf6";
  const LINE = "#7a1f4d";

  EW.plotProfile = function (canvas, S, profile, sample) {
    const cssW = Math.max(240, canvas.parentElement.clientWidth - 4);
    const cssH = 180;
    const ctx = EW.sizeCanvas(canvas, cssW, cssH);
    ctx.fillStyle = PAPER;
    ctx.fillRect(0, 0, cssW, cssH);
    if (!S || !profile) return;
    // everything in the display units (measure.js): lengths, values
    const U = S.units || {}, ls = EW.conv(U, "length").scale;
    const a = { x: profile.a.x * ls, y: profile.a.y * ls }, b = { x: profile.b.x * ls, y: profile.b.y * ls };
    const len = Math.hypot(b.x - a.x, b.y - a.y);
    const N = 200;
    const vs = [];
    let lo = Infinity, hi = -Infinity;
    for (let k = 0; k <= N; k++) {
      const t = k / N;
      const v = EW.dv(U, "value", sample((a.x + t * (b.x - a.x)) / ls, (a.y + t * (b.y - a.y)) / ls).u);
      vs.push(v);
      if (v < lo) lo = v;
      if (v > hi) hi = v;
    }
    const vlo = lo, vhi = hi; // the curve's own range, for the text alternative
    if (!(hi > lo)) { const d = Math.max(1e-9, Math.abs(lo) * 0.05) || 1; hi = lo + d; lo = lo - d; }
    // the curve keeps clear of its frame: the value axis runs 8 % beyond
    // the curve's range on each side, and the ends stand 6 px inside
    const pad = 0.08 * (hi - lo);
    lo -= pad;
    hi += pad;
    const m = { l: 58, r: 12, t: 10, b: 34 };
    const inset = 6;
    const pw = cssW - m.l - m.r, ph = cssH - m.t - m.b;
    const px = (d) => m.l + inset + (len > 0 ? d / len : 0) * (pw - 2 * inset);
    const py = (v) => m.t + (1 - (v - lo) / (hi - lo)) * ph;
    const u = EW.shownUnits(U);
    ctx.strokeStyle = "#d8d3c7";
    ctx.fillStyle = INK;
    ctx.font = "11px system-ui, sans-serif";
    ctx.lineWidth = 1;
    ctx.textAlign = "right";
    ctx.textBaseline = "middle";
    for (const t of EW.niceTicks(lo, hi, 4).filter((t) => py(t) >= m.t && py(t) <= m.t + ph)) {
      ctx.beginPath(); ctx.moveTo(m.l, py(t)); ctx.lineTo(m.l + pw, py(t)); ctx.stroke();
      ctx.fillText(EW.num(t, 4), m.l - 5, py(t));
    }
    ctx.textAlign = "center";
    ctx.textBaseline = "top";
    for (const t of EW.niceTicks(0, len, 5)) {
      ctx.beginPath(); ctx.moveTo(px(t), m.t); ctx.lineTo(px(t), m.t + ph); ctx.stroke();
      ctx.fillText(EW.num(t, 3), px(t), m.t + ph + 4);
    }
    ctx.fillText("distance from A to B [" + (u.length_unit || "m") + "]   ·   " + EW.withUnit(u.value || "value", u.value_unit ? "[" + u.value_unit + "]" : ""), m.l + pw / 2, m.t + ph + 18);
    ctx.strokeStyle = INK;
    ctx.strokeRect(m.l, m.t, pw, ph);
    ctx.strokeStyle = LINE;
    ctx.lineWidth = 2;
    ctx.beginPath();
    vs.forEach((v, k) => {
      const d = (k / N) * len;
      if (k === 0) ctx.moveTo(px(d), py(v));
      else ctx.lineTo(px(d), py(v));
    });
    ctx.stroke();
    // where the curve and its frame are, for tests: [left, top, right, bottom]
    canvas.dataset.frame = [m.l, m.t, m.l + pw, m.t + ph].join(",");
    canvas.dataset.curve = [px(0), py(vhi), px(len), py(vlo)].map((v) => v.toFixed(1)).join(",");
    canvas.setAttribute("aria-label", "Line profile from A (" + EW.num(a.x, 3) + ", " + EW.num(a.y, 3) + ") to B (" +
      EW.num(b.x, 3) + ", " + EW.num(b.y, 3) + "): " + (u.value || "value") + " from " + EW.num(vs[0]) + " to " + EW.num(vs[N]) +
      ", lowest " + EW.num(vlo) + ", highest " + EW.num(vhi) + ".");
  };
})();
