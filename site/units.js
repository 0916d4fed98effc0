// edgewise page: number formatting shared by the other parts (the names,
// units and hints of each physics come from the engine's physics table:
// physics.js).
"use strict";
(function () {
  const EW = (window.edgewiseParts = window.edgewiseParts || {});

  const sup = { "-": "⁻", "0": "⁰", "1": "¹", "2": "²", "3": "³", "4": "⁴", "5": "⁵", "6": "⁶", "7": "⁷", "8": "⁸", "9": "⁹" };

  // num formats a number for people: p significant digits, trailing zeros
  // removed, powers of ten written out for very large or small values.
  EW.num = function (v, p) {
    p = p || 4;
    if (v === null || v === undefined || Number.isNaN(v)) return "–";
    if (!Number.isFinite(v)) return v > 0 ? "∞" : "−∞";
    if (v === 0) return "0";
    const a = Math.abs(v);
    let s;
    if (a >= 1e5 || a < 1e-3) {
      const [m, e] = v.toExponential(p - 1).split("e");
      s = trim(m) + "×10" + String(Number(e)).split("").map((c) => sup[c]).join("");
    } else {
      // through Number: toPrecision writes 17730 to 4 digits as 1.773e+4
      s = String(Number(v.toPrecision(p)));
    }
    return s.replace(/^-/, "−");
  };
  // superscript writes an integer as superscript digits: -11 -> ⁻¹¹.
  EW.superscript = (n) => String(n).split("").map((c) => sup[c]).join("");
  function trim(s) {
    return s.indexOf(".") >= 0 ? s.replace(/0+$/, "").replace(/\.$/, "") : s;
  }

  // ---- numbers of a result, to the accuracy of the solve ----
  // A solve is accurate to about accuracy.estimate in the field (the
  // engine's estimate of its largest error). A field value smaller than
  // that, or a flow smaller than the same share of the largest flow (of an
  // edge or of a part of one), is
  // rounding noise: it shows as 0, and other numbers show only the digits
  // the accuracy supports (at most the digits asked for).
  let floors = { value: 0, flow: 0 };

  // setAccuracy takes the noise floors from the result on screen.
  EW.setAccuracy = function (r) {
    const est = Math.abs(((r && r.accuracy) || {}).estimate || 0);
    const lo = r.min.value, hi = r.max.value;
    const scale = Math.max(Math.abs(lo), Math.abs(hi));
    // below 1e-12 of the field's size, float64 arithmetic itself is noise
    const value = Math.max(est, 1e-12 * scale);
    let big = Math.abs(r.source_total || 0);
    for (const e of Object.values(r.edges || {})) {
      if (e && e.finite && typeof e.flow === "number") big = Math.max(big, Math.abs(e.flow));
      // an edge made of parts may carry flow in and out and none in sum
      for (const g of (e && e.segments) || []) if (g.finite && typeof g.flow === "number") big = Math.max(big, Math.abs(g.flow));
    }
    const range = Math.abs(hi - lo);
    const rel = Math.max(range > 0 ? est / range : 0, 1e-12);
    floors = { value, flow: rel * big };
  };
  EW.floors = () => Object.assign({}, floors);

  // toAccuracy formats v (SI) to the accuracy floor (SI); with c, a
  // conversion {scale, offset} (measure.js), as shown in the display unit.
  function toAccuracy(v, p, floor, c) {
    const scale = c ? Math.abs(c.scale) : 1, offset = c ? c.offset : 0;
    if (typeof v !== "number" || !Number.isFinite(v) || !(floor > 0)) return EW.num(typeof v === "number" && c ? v * c.scale + offset : v, p);
    if (Math.abs(v) < floor) v = 0; // noise: 0 in SI (32 °F for 0 °C)
    const w = v * (c ? c.scale : 1) + offset;
    if (w === 0) return "0";
    const supported = Math.floor(Math.log10(Math.abs(w) / (floor * scale))) + 1;
    return EW.num(w, Math.max(1, Math.min(p || 4, supported)));
  }
  // value formats a field value of the result on screen; flow a flow
  // through an edge (or the source total, or the balance). With units
  // (a physics' units object) they are converted to the display units.
  EW.value = (v, p, units) => toAccuracy(v, p, floors.value, units && EW.conv ? EW.conv(units, "value") : null);
  EW.flow = (v, p, units) => toAccuracy(v, p, floors.flow, units && EW.conv ? EW.conv(units, "flow") : null);

  // withUnit appends a unit when there is one.
  EW.withUnit = (text, unit) => (unit ? text + " " + unit : text);

  // niceTicks returns round tick values covering [lo, hi], about n of them.
  EW.niceTicks = function (lo, hi, n) {
    if (!(hi > lo)) return [lo];
    const raw = (hi - lo) / Math.max(1, n);
    const mag = Math.pow(10, Math.floor(Math.log10(raw)));
    const f = raw / mag;
    const step = (f < 1.5 ? 1 : f < 3 ? 2 : f < 7 ? 5 : 10) * mag;
    const out = [];
    for (let t = Math.ceil(lo / step - 1e-9) * step; t <= hi + step * 1e-9; t += step) {
      out.push(Math.abs(t) < step * 1e-9 ? 0 : t);
    }
    return out;
  };

  // sizeCanvas sizes a canvas to w x h CSS pixels at the screen's pixel
  // ratio and returns its context, drawing in CSS pixels.
  EW.sizeCanvas = function (c, w, h) {
    const dpr = window.devicePixelRatio || 1;
    c.width = Math.round(w * dpr);
    c.height = Math.round(h * dpr);
    c.style.height = h + "px";
    const ctx = c.getContext("2d");
    ctx.setTransform(dpr, 0, 0, dpr, 0, 0);
    return ctx;
  };

  // capital makes the first letter a capital.
  EW.capital = (s) => (s ? s[0].toUpperCase() + s.slice(1) : s);
})();
