// edgewise page, part 1 of 4: words and numbers shared by the other parts.
// The quantity names and units come from the engine (edgewise_units); this
// file holds what the page says around them: the names of the edge kinds
// per physics, the typical values shown as hints (each with its source;
// rules of thumb are marked as common practice), and number formatting.
"use strict";
(function () {
  const EW = (window.edgewiseParts = window.edgewiseParts || {});

  // Names of the three edge kinds, per physics, with the textbook name as
  // a secondary hint.
  EW.kinds = {
    heat: {
      value: "Fixed temperature (Dirichlet)",
      flux: "Heat flux in; 0 = insulated (Neumann)",
      convection: "Convection to a fluid (Robin)",
    },
    electrostatic: {
      value: "Fixed potential, electrode (Dirichlet)",
      flux: "Displacement flux in; 0 = symmetry line (Neumann)",
      convection: "Mixed condition (Robin)",
    },
    seepage: {
      value: "Fixed head, water level (Dirichlet)",
      flux: "Inflow; 0 = impermeable (Neumann)",
      convection: "Leaky layer to a head (Robin)",
    },
    generic: {
      value: "Value (Dirichlet)",
      flux: "Flux in (Neumann)",
      convection: "Mixed, h (u_amb - u) in (Robin)",
    },
  };

  // Typical values shown next to the inputs. Sources: Incropera & DeWitt,
  // Fundamentals of Heat and Mass Transfer, Tables A.1 (read) and 1.1
  // (memory); AMS Glossary of Meteorology (read); the critical gradient is
  // common practice in soil mechanics; the vacuum permittivity is the CODATA
  // value.
  EW.hints = {
    heat: {
      conductivity: "Typical: stainless steel ≈ 15, carbon steel ≈ 50, aluminium 170–237, copper ≈ 400 W/(m·K) (Incropera, Table A.1).",
      source: "Heat generated per unit volume, e.g. by a current or a reaction; 0 for none.",
      h: "Free convection in gases ≈ 2–25, forced ≈ 25–250 W/(m²·K) (Incropera, Table 1.1).",
      value: "Surfaces above about 60 °C burn skin on brief contact (common practice).",
    },
    electrostatic: {
      conductivity: "Permittivity ε = εr × 8.854×10⁻¹² F/m; dry air εr ≈ 1.",
      source: "Free charge per unit volume; 0 in an air or vacuum gap.",
      h: "Rarely needed: a Robin edge models a resistive or capacitive boundary layer.",
      value: "Dry air at sea level breaks down near 3 kV/mm (AMS Glossary of Meteorology).",
    },
    seepage: {
      conductivity: "Hydraulic conductivity of the ground; layered soils are often more permeable along the layers.",
      source: "Recharge per unit volume (1/s); 0 for none.",
      h: "Leakance of a semi-pervious layer: its conductivity over its thickness.",
      value: "Exit gradients near (Gs − 1)/(1 + e) ≈ 1 start heave and piping (common practice).",
    },
    generic: {
      conductivity: "Coefficient of the equation div(K grad u) + source = 0.",
      source: "Uniform source term.",
      h: "Coefficient h of the mixed condition.",
      value: "",
    },
  };

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
  function trim(s) {
    return s.indexOf(".") >= 0 ? s.replace(/0+$/, "").replace(/\.$/, "") : s;
  }

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

  // capital makes the first letter a capital.
  EW.capital = (s) => (s ? s[0].toUpperCase() + s.slice(1) : s);
})();
