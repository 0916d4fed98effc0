// edgewise page: display units. The project file is SI; the page shows
// numbers in the units the user chose (the project's optional "display"
// object, e.g. {"length": "mm", "temperature": "degF"}; the kinds and
// names are solver/project/display.go's) and reads number fields in them.
//
//   EW.conv(units, role) -> {unit, scale, offset}: shown = SI * scale + offset
//   EW.dv(units, role, v)  an absolute value as shown (a temperature gets its offset)
//   EW.dd(units, role, v)  a difference as shown (range, error estimate: scale only)
//   EW.shownUnits(units)   the physics' units object with the shown unit names
//   EW.display()           the choice, as the file writes it
//
// units is a physics' units object (physics.json); role is one of value,
// gradient, conductivity, flux, flow, source, coefficient, length.
//
// Number fields (sizes, conductivity, source, h) read a plain number in
// the shown unit, a number with a unit ("200 mm", "1.5 in"), or an
// arithmetic expression of constants ("4.4*8.854e-12", "2*pi"), and say
// beside the field what they understood ("= 0.2 m"). Text with a
// parameter's name is a formula in SI units, worked out by the engine, as
// the file holds it. Formula fields stay SI (their labels say so); a
// constant with a unit typed there ("68 °F", "20 degC") is turned into
// the SI number.
"use strict";
(function () {
  const EW = (window.edgewiseParts = window.edgewiseParts || {});
  const { byId, el } = EW.dom;

  // ---- conversion factors ----
  // Exact by definition: 1 in = 0.0254 m and 1 ft = 0.3048 m (international
  // yard and pound, 1959); T/°F = 1.8 T/°C + 32 and T/K = T/°C + 273.15
  // (so a difference of 1 K is 1.8 °F); 1 Btu_IT = 1055.05585262 J (the
  // International Table Btu, from 1 cal_IT = 4.1868 J exactly); 1 h = 3600 s,
  // 1 day = 86400 s. All as listed in NIST SP 811 (2008), Appendix B.
  const IN = 0.0254, FT = 0.3048, DAY = 86400;
  const BTU_H = 1055.05585262 / 3600; // W in one Btu_IT/h
  const F_PER_K = 1.8;

  // KINDS: each kind's units, SI first: name (as in the file), shown
  // label, scale (shown per SI) and offset.
  const KINDS = {
    length: [["m", "m", 1], ["mm", "mm", 1e3], ["cm", "cm", 100], ["in", "in", 1 / IN], ["ft", "ft", 1 / FT]],
    temperature: [["degC", "°C", 1], ["K", "K", 1, 273.15], ["degF", "°F", F_PER_K, 32]],
    heat: [["W", "W (SI)", 1], ["BTU/h", "Btu/h (US customary)", 1]],
    potential: [["V", "V", 1], ["mV", "mV", 1e3], ["kV", "kV", 1e-3]],
    field: [["V/m", "V/m", 1], ["V/mm", "V/mm", 1e-3], ["kV/m", "kV/m", 1e-3], ["kV/mm", "kV/mm", 1e-6]],
    permittivity: [["F/m", "F/m", 1], ["pF/m", "pF/m", 1e12]],
    head: [["m", "m", 1], ["cm", "cm", 100], ["ft", "ft", 1 / FT]],
    darcy: [["m/s", "m/s", 1], ["cm/s", "cm/s", 100], ["m/day", "m/day", DAY], ["ft/day", "ft/day", DAY / FT]],
    discharge: [["m3/s", "m³/s per m", 1], ["L/s", "L/s per m", 1e3], ["m3/day", "m³/day per m", DAY], ["ft3/day", "ft³/day per ft", DAY / (FT * FT)]],
    rate: [["1/s", "1/s", 1], ["1/day", "1/day", DAY]],
  };
  const KIND_NAMES = {
    length: "Lengths", temperature: "Temperature", heat: "Heat", potential: "Potential", field: "Field strength",
    permittivity: "Permittivity", head: "Head", darcy: "Hydraulic conductivity, Darcy flux", discharge: "Discharge", rate: "Recharge, leakance",
  };
  // the kinds each physics offers (lengths always)
  const OFFERED = {
    heat: ["length", "temperature", "heat"],
    electrostatic: ["length", "potential", "field", "permittivity"],
    seepage: ["length", "head", "darcy", "discharge", "rate"],
  };
  // US customary heat units: W-based SI unit -> [label, shown per SI]
  const BTU = {
    "W/m": ["Btu/(h·ft)", FT / BTU_H],
    "W/m²": ["Btu/(h·ft²)", (FT * FT) / BTU_H],
    "W/m³": ["Btu/(h·ft³)", (FT * FT * FT) / BTU_H],
    "W/(m·K)": ["Btu/(h·ft·°F)", FT / (BTU_H * F_PER_K)],
    "W/(m²·K)": ["Btu/(h·ft²·°F)", (FT * FT) / (BTU_H * F_PER_K)],
  };

  let choice = {}; // kind -> unit name; a kind left out is SI

  function unitOf(kind) {
    const list = KINDS[kind];
    return list.find((x) => x[0] === choice[kind]) || list[0];
  }
  const make = (unit, scale, offset) => ({ unit, scale, offset: offset || 0 });
  const SAME = (u) => make(u || "", 1, 0);

  // conv gives how a quantity of a physics is shown (role: see the top).
  EW.conv = function (units, role) {
    const u = units || {}, phys = u.physics;
    const si = role === "length" ? u.length_unit || "m" : u[role + "_unit"];
    const L = unitOf("length");
    if (role === "length") return make(L[1], L[2]);
    if (phys === "heat") {
      const T = unitOf("temperature");
      if (role === "value") return make(T[1], T[2], T[3]);
      if (role === "gradient") return make((T[0] === "degF" ? "°F" : "K") + "/" + L[1], T[2] / L[2]);
      if (choice.heat === "BTU/h" && BTU[si]) return make(BTU[si][0], BTU[si][1]);
      return SAME(si);
    }
    if (phys === "electrostatic") {
      const k = { value: "potential", gradient: "field", conductivity: "permittivity" }[role];
      if (!k || !choice[k]) return SAME(si); // not chosen: the physics table's own SI unit
      const x = unitOf(k);
      return make(x[1], x[2]);
    }
    if (phys === "seepage") {
      const k = { value: "head", conductivity: "darcy", flux: "darcy", flow: "discharge", source: "rate", coefficient: "rate" }[role];
      if (!k || !choice[k]) return SAME(si);
      const x = unitOf(k);
      return make(x[1], x[2]);
    }
    // generic: only lengths have a unit; a gradient is per length
    if (role === "gradient" && L[0] !== "m") return make("per " + L[1], 1 / L[2]);
    return SAME(si);
  };
  // convWith is conv under another choice d (the browser tests compare the
  // page's table with the report's, solver/report/shown.go).
  EW.convWith = function (units, role, d) {
    const keep = choice;
    choice = Object.assign({}, d);
    try { return EW.conv(units, role); } finally { choice = keep; }
  };
  EW.dv = (units, role, v) => { const c = EW.conv(units, role); return typeof v === "number" ? v * c.scale + c.offset : v; };
  EW.dd = (units, role, v) => (typeof v === "number" ? v * EW.conv(units, role).scale : v);
  EW.shownUnits = function (units) {
    const out = Object.assign({}, units);
    for (const r of ["value", "gradient", "conductivity", "flux", "flow", "source", "coefficient"]) {
      if (out[r + "_unit"] !== undefined || r === "gradient") out[r + "_unit"] = EW.conv(units, r).unit;
    }
    out.length_unit = EW.conv(units, "length").unit;
    return out;
  };
  EW.display = function () {
    const out = {};
    for (const k of Object.keys(KINDS)) if (choice[k]) out[k] = choice[k]; // an SI choice stays as chosen
    return out;
  };
  function setChoice(d) {
    choice = {};
    for (const [k, v] of Object.entries(d || {})) if (KINDS[k] && KINDS[k].some((x) => x[0] === v)) choice[k] = v;
    syncPanel();
  }

  // ---- reading what is typed ----

  // evaluate reads the longest leading arithmetic expression of text
  // (numbers, + - * / ^, brackets, pi, e, sqrt, and the parameters in
  // names) and returns {v, rest, names} or {err, col}. No eval: a small
  // precedence-climbing reader.
  function evaluate(text, names) {
    const src = text;
    let i = 0, used = [];
    const ws = () => { while (i < src.length && /\s/.test(src[i])) i++; };
    const fail = (msg) => { throw { msg, col: i + 1 }; };
    function primary() {
      ws();
      const m = /^(\d+\.?\d*|\.\d+)([eE][+-]?\d+)?/.exec(src.slice(i));
      if (m) { i += m[0].length; return Number(m[0]); }
      if (src[i] === "(") {
        i++;
        const v = sum();
        ws();
        if (src[i] !== ")") fail("a ) is missing");
        i++;
        return v;
      }
      if (src[i] === "-" || src[i] === "+") { const s = src[i++]; const v = power(); return s === "-" ? -v : v; }
      const n = /^[A-Za-z_][A-Za-z0-9_]*/.exec(src.slice(i));
      if (n) {
        const w = n[0];
        if (w === "sqrt" && /^\s*\(/.test(src.slice(i + 4))) { i += 4; return Math.sqrt(primary()); }
        if (w === "pi") { i += 2; return Math.PI; }
        if (w === "e" && !/^e\s*[A-Za-z(]/.test(src.slice(i))) { i += 1; return Math.E; }
        if (names && Object.prototype.hasOwnProperty.call(names, w)) { i += w.length; used.push(w); return names[w]; }
      }
      fail("expected a number");
    }
    function power() {
      const b = primary();
      ws();
      if (src[i] === "^") { i++; return Math.pow(b, power()); }
      return b;
    }
    function product() {
      let v = power();
      for (;;) {
        ws();
        if (src[i] !== "*" && src[i] !== "/") return v;
        const op = src[i++];
        v = op === "*" ? v * power() : v / power();
      }
    }
    function sum() {
      let v = product();
      for (;;) {
        ws();
        if (src[i] === "+" || src[i] === "-") {
          const op = src[i++];
          v = op === "+" ? v + product() : v - product();
        } else return v;
      }
    }
    try {
      const v = sum();
      ws();
      return { v, rest: src.slice(i).trim(), names: used };
    } catch (e) {
      if (e && e.msg) return { err: e.msg, col: e.col };
      throw e;
    }
  }

  // norm makes unit spellings comparable: "W/(m*K)", "W/(m·K)" and
  // "W/(m.K)" agree, as do "°F", "degF" and "F" after a number.
  const norm = (s) => s.replace(/[\s()]+/g, "").replace(/[·*.]/g, "").replace(/°|deg/g, "").replace(/\^?2/g, "²").replace(/\^?3/g, "³");

  // unitsFor lists the units a role of a physics may be typed in (every
  // unit it can be shown in), by their normalised spelling.
  function unitsFor(units, role) {
    const keep = choice;
    const kinds = OFFERED[units && units.physics] || ["length"];
    let combos = [{}];
    for (const k of kinds) combos = combos.flatMap((c) => KINDS[k].map((x) => Object.assign({}, c, { [k]: x[0] })));
    const seen = new Map();
    try {
      for (const c of combos) {
        choice = c;
        const x = EW.conv(units, role);
        if (x.unit && !seen.has(norm(x.unit))) seen.set(norm(x.unit), x);
      }
    } finally {
      choice = keep;
    }
    return seen;
  }

  // understand reads a field's text for a role: {v} (the SI number, or the
  // text for the engine) with what was understood (note), or {err}.
  function understand(text, units, role, formula) {
    const t = text.trim();
    const siConv = { unit: (units && units[role + "_unit"]) || (role === "length" ? "m" : ""), scale: 1, offset: 0 };
    if (formula && !/\d/.test(t)) return { v: text, note: "" };
    if (t === "") return { err: "a value is required" };
    const comma = /^([+-]?\d+),(\d+)(\s*[^\d,].*)?$/.exec(t);
    if (comma && !formula) return { err: "use a point for decimals: " + comma[1] + "." + comma[2] + (comma[3] || "") + ", not " + t };
    const params = {};
    for (const q of (EW.params ? EW.params.list() : [])) if (q.name && /^[+-]?(\d+\.?\d*|\.\d+)([eE][+-]?\d+)?$/.test(q.value)) params[q.name] = Number(q.value);
    const r = evaluate(t, params);
    const shown = EW.conv(units, role);
    const isSI = shown.scale === 1 && !shown.offset;
    if (r.err || !Number.isFinite(r.v)) {
      // not arithmetic this page reads (a function, a name): the engine
      // reads it as a formula in SI units and reports its errors
      if (formula) return { v: text, note: "" };
      // the engine's formulas are SI: in another display unit the text
      // would be misread, so only what this page reads is accepted there
      if (/[A-Za-z_]/.test(t) && !isSI) {
        return { err: "shown in " + shown.unit + ", this field reads numbers, units, + - * / ^, ( ), sqrt, pi, e and parameters (" + (r.err || "not finite") + " at col " + (r.col || 1) + ")" };
      }
      if (/[A-Za-z_]/.test(t)) return { v: t, note: "a formula in SI units (" + siConv.unit + "), worked out by the engine" };
      return { err: "not a number: " + JSON.stringify(t) };
    }
    let c = null;
    if (r.rest) {
      c = unitsFor(units, role).get(norm(r.rest));
      if (!c && formula) return { v: text, note: "" }; // a formula: the engine reads it
      if (!c) {
        const known = [...unitsFor(units, role).values()].map((x) => x.unit).join(", ");
        return { err: "unknown unit " + JSON.stringify(r.rest) + (known ? " here (use " + known + ")" : " (this field has no unit)") };
      }
    }
    const plain = /^[+-]?(\d+\.?\d*|\.\d+)([eE][+-]?\d+)?$/.test(t);
    if (r.names.length) {
      // a formula of parameters stays text, in SI units
      if (c && norm(c.unit) !== norm(siConv.unit)) return { err: "a formula of parameters is in SI units (" + siConv.unit + "): write it without a unit" };
      const not = shown.unit !== siConv.unit ? ", not " + shown.unit : "";
      return { v: c ? t.slice(0, t.length - r.rest.length).trim() : t, note: "= " + EW.num(r.v, 6) + " " + siConv.unit + ": a formula of parameters is in SI units (" + siConv.unit + not + ")" };
    }
    const from = c || (formula ? siConv : shown);
    // to 15 significant digits: a typed number has no more, and the
    // conversion's rounding (0.864 1/day is 9.999999999999999e-6 1/s)
    // stays out of the file
    const si = from === siConv ? r.v : Number(((r.v - from.offset) / from.scale).toPrecision(15));
    if (formula && c) return { v: String(Number(si.toPrecision(15))), note: "= " + EW.num(si, 6) + " " + siConv.unit };
    // a constant in SI, shown in the display unit too (100 °C = 212 °F)
    if (formula) return { v: text, note: shown.unit !== siConv.unit ? "= " + EW.num(r.v * shown.scale + shown.offset, 6) + " " + shown.unit : "" };
    if (!c && plain) return { v: si, note: isSI ? "" : "= " + EW.num(si, 6) + " " + siConv.unit };
    // an expression in SI units stays text: the engine works it out and
    // the file keeps it as written
    if (!c && isSI) return { v: t, note: "= " + EW.num(si, 6) + " " + siConv.unit };
    return { v: si, note: "= " + EW.num(si, 6) + " " + siConv.unit };
  }
  EW.understand = understand;

  // ---- the fields ----

  // the number fields: input id, project path, role
  function numberFields() {
    const list = [["in-width", "width", "length"], ["in-height", "height", "length"], ["in-source", "source", "source"]];
    if (byId("in-ortho").checked) list.push(["in-kx", "conductivity.x", "conductivity"], ["in-ky", "conductivity.y", "conductivity"]);
    else list.push(["in-k", "conductivity", "conductivity"]);
    const edge = (id, path, kind) => {
      if (kind === "convection") list.push([id + "-h", path + ".h", "coefficient"], [id + "-ambient", path + ".ambient", "value", true]);
      else list.push([id + "-expr", path + ".expr", kind === "value" ? "value" : "flux", true]);
    };
    for (const side of EW.SIDES) {
      const n = EW.parts ? EW.parts.count(side) : 0;
      if (n < 2) {
        edge("in-" + side, "edges." + side, byId("in-" + side + "-kind").value);
        continue;
      }
      // an edge in parts (segments.js): each part's end and data, read
      // and shown like the one-condition edge's
      for (let i = 0; i < n; i++) {
        const id = "part-" + side + "-" + i, path = "edges." + side + ".segments[" + i + "]";
        if (i < n - 1) list.push([id + "-to", path + ".to", "length"]);
        edge(id, path, byId(id + "-kind").value);
      }
    }
    return list;
  }
  // keys of a project path: "edges.top.segments[1].h" -> edges, top, segments, 1, h
  const keys = (path) => path.replace(/\[(\d+)\]/g, ".$1").split(".");
  const getAt = (p, path) => keys(path).reduce((o, k) => (o && typeof o === "object" ? o[k] : undefined), p);
  function setAt(p, path, v) {
    const ks = keys(path);
    let o = p;
    for (const k of ks.slice(0, -1)) { if (!o[k] || typeof o[k] !== "object") return; o = o[k]; }
    o[ks[ks.length - 1]] = v;
  }

  // noteFor returns the line under a field that says what it understood.
  function noteFor(input) {
    let n = input.nextElementSibling && input.nextElementSibling.matches("output.understood") ? input.nextElementSibling : null;
    if (!n) {
      n = el("output", { class: "understood", for: input.id, "aria-live": "polite" });
      n.hidden = true;
      input.after(n);
    }
    return n;
  }

  const read = EW.read;
  EW.read = function () {
    const out = read();
    const units = (EW.unitsets || {})[out.project.physics] || EW.physicsOf(out.project.physics).units || {};
    for (const [id, path, role, formula] of numberFields()) {
      const input = byId(id);
      if (!input) continue;
      if (getAt(out.project, path) === undefined) continue; // not a field of this edge's form
      if (!formula) out.errors = out.errors.filter((e) => e.path !== path);
      // a field as fill wrote it reads back as the exact SI number (15.7480314961 in is not exactly 0.4 m)
      const f = filled.get(input);
      const r = f && f.text === input.value && f.role === role && (f.physics === units.physics || role === "length") ? { v: f.v, note: "" } : understand(input.value, units, role, formula);
      const note = noteFor(input);
      note.textContent = r.note || "";
      note.hidden = !r.note;
      if (r.err) {
        out.errors.push({ path, msg: r.err });
        setAt(out.project, path, input.value); // the text stays as typed
        continue;
      }
      setAt(out.project, path, r.v);
    }
    const d = EW.display();
    if (Object.keys(d).length) out.project.display = d;
    return out;
  };

  // filled remembers what fill wrote in each number field: input -> {text, v, role, physics}
  const filled = new WeakMap();

  // toField writes an SI number as the field shows it.
  const toField = (v) => String(Number(v.toPrecision(12)));

  const fill = EW.fill;
  EW.fill = function (p) {
    setChoice(p && p.display);
    fill(p);
    const units = EW.physicsOf(p.physics).units || {};
    for (const [id, path, role, formula] of numberFields()) {
      const input = byId(id);
      if (input) { const note = noteFor(input); note.textContent = ""; note.hidden = true; }
      if (formula || !input) continue;
      let v = getAt(p, path);
      if (path === "conductivity" && v && typeof v === "object") v = v.x;
      filled.delete(input);
      if (typeof v === "number") {
        input.value = toField(EW.dv(units, role, v));
        filled.set(input, { text: input.value, v, role, physics: units.physics });
      }
    }
    if (!byId("in-ortho").checked && typeof p.conductivity === "number") {
      for (const id of ["in-kx", "in-ky"]) {
        byId(id).value = byId("in-k").value;
        filled.set(byId(id), { text: byId(id).value, v: p.conductivity, role: "conductivity", physics: units.physics });
      }
    }
  };

  // ---- the panel ----

  const box = el("fieldset", { class: "group", id: "display-units" },
    el("legend", { text: "Display units" }),
    el("p", { class: "hint", text: "How numbers are shown and how number fields are read. The project file stays SI. " +
      "Formulas and parameters are in SI units, as their labels say." }));
  const rows = el("div", { class: "pair display-rows" });
  box.append(rows);
  byId("in-physics").closest("fieldset").after(box);
  const selects = {};
  for (const [k, list] of Object.entries(KINDS)) {
    const s = el("select", { id: "du-" + k, "data-kind": k });
    for (const x of list) s.append(el("option", { value: x[0], text: x[1] }));
    // before the form's own input handler: the fields are shown again in
    // the new unit first, then the edit is taken as usual
    s.addEventListener("input", () => {
      const p = EW.read().project; // in the old units
      choice[k] = s.value;
      const d = EW.display();
      if (Object.keys(d).length) p.display = d; else delete p.display;
      EW.fill(p);
    });
    selects[k] = s;
    rows.append(el("label", { class: "row", "data-kind": k }, el("span", { text: KIND_NAMES[k] }), s));
  }
  function syncPanel() {
    const phys = byId("in-physics").value;
    const offered = OFFERED[phys] || ["length"];
    for (const [k, s] of Object.entries(selects)) {
      s.value = unitOf(k)[0];
      s.closest("label").hidden = !offered.includes(k);
    }
    const xy = document.querySelector("#probes thead th:nth-child(2)");
    if (xy) xy.textContent = "x, y [" + unitOf("length")[1] + "]";
  }
  const relabel = EW.relabel;
  EW.relabel = function () {
    relabel();
    syncPanel();
  };
})();
