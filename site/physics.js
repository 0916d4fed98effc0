// edgewise page: the physics. Reads the engine's physics table
// (physics.json, written from the Go package solver/physics; inline in the
// single offline file) and labels the page from it: the choice of physics,
// quantity names and units, edge-kind names and the hints beside the
// inputs. Nothing here names a physics: a new one needs no change here.
// Entry points: EW.loadPhysics() -> Promise (once, before the first
// project is shown), then EW.relabel() whenever the physics or an edge kind
// changes, and EW.physicsOf(id) for the entry of one physics. On a switch
// of physics (EW.physicsSwitched) it offers that physics' example and warns
// about numbers outside the physics' usual spans (EW.plausible).
"use strict";
(function () {
  const EW = (window.edgewiseParts = window.edgewiseParts || {});
  const $ = (id) => document.getElementById(id);
  let list = []; // the table's entries, in the page's order
  let loading = null;

  // read returns the table: inline in the single file, else fetched.
  async function read() {
    const inline = document.getElementById("ew-physics");
    if (inline) return JSON.parse(inline.textContent);
    const resp = await fetch("physics.json");
    if (!resp.ok) throw new Error("the physics table (physics.json) could not be read: " + resp.status);
    return resp.json();
  }

  EW.loadPhysics = function () {
    if (!loading) {
      loading = read().then((doc) => {
        list = (doc && doc.physics) || [];
        if (!list.length) throw new Error("the physics table (physics.json) is empty");
        EW.unitsets = {};
        const select = $("in-physics");
        const was = select.value;
        select.replaceChildren();
        for (const p of list) {
          EW.unitsets[p.id] = p.units;
          const o = document.createElement("option");
          o.value = p.id;
          o.textContent = p.name;
          select.append(o);
        }
        select.value = EW.physicsOf(was).id;
        relabel();
        chooser();
      });
    }
    return loading;
  };

  // physicsOf returns the entry of a physics; an unknown id gives the
  // generic one (the last of the table when it has no "generic").
  EW.physicsOf = (id) => list.find((p) => p.id === id) || list.find((p) => p.id === "generic") || list[list.length - 1] || {
    id: "generic", units: {}, kinds: {}, hints: {}, magnitude: "gradient", readout: "gradient |∇|", default_h: "1",
  };

  // relabel names everything on the form for the chosen physics, and shows
  // the fields of each edge's kind.
  function relabel() {
    const P = EW.physicsOf($("in-physics").value);
    const u = P.units || {}, hints = P.hints || {}, kinds = P.kinds || {}, labels = P.labels || {};
    const unit = (x) => (x ? "[" + x + "]" : "");
    // number fields and results in the display units (measure.js); formulas stay SI
    const d = EW.shownUnits ? EW.shownUnits(u) : u;
    for (const i of document.querySelectorAll("[data-unit]")) {
      const k = i.dataset.unit;
      i.textContent = unit(k === "length" ? d.length_unit || "m" : k === "cond" ? d.conductivity_unit : k === "source" ? d.source_unit : "");
    }
    for (const b of document.querySelectorAll("[data-q]")) b.textContent = EW.capital(u[b.dataset.q] || b.dataset.q);
    $("hint-k").textContent = hints.conductivity || "";
    $("hint-physics").textContent = hints.physics || "";
    $("hint-source").textContent = hints.source || "";
    for (const side of EW.SIDES) {
      const kind = $("in-" + side + "-kind");
      for (const o of kind.options) o.textContent = kinds[o.value] || o.value;
      const k = kind.value;
      const conv = k === "convection";
      const block = kind.closest("fieldset");
      block.querySelector(".f-expr").hidden = conv;
      block.querySelector(".f-conv").hidden = !conv;
      const hh = $("hint-h-" + side);
      hh.hidden = !conv;
      hh.textContent = hints.h || "";
      $("in-" + side + "-expr-label").textContent = k === "value"
        ? EW.capital(u.value || "value") + " " + unit(u.value_unit)
        : EW.capital(labels.flux_in || (u.flux || "flux") + " in") + " " + unit(u.flux_unit);
      block.querySelector(".lbl-h").textContent = EW.capital(u.coefficient || "h") + " " + unit(d.coefficient_unit);
      block.querySelector(".lbl-amb").textContent = EW.capital(labels.ambient || "ambient " + (u.value || "value")) + " " + unit(u.value_unit);
    }
    $("probe-head-v").textContent = EW.capital(u.value || "value") + " " + unit(d.value_unit);
    // "Temperature gradient magnitude |∇T| [K/m]", the symbol and unit kept on one line
    const g = EW.capital(P.magnitude || u.gradient || "gradient"), bar = g.indexOf("|");
    const sym = document.createElement("span");
    sym.className = "nowrap";
    sym.textContent = (bar >= 0 ? g.slice(bar) : "") + " " + unit(d.gradient_unit);
    $("probe-head-g").replaceChildren(bar >= 0 ? g.slice(0, bar) : g + " ", sym);
    $("probe-head-q").textContent = EW.capital(u.flux || "flux") + " x, y " + unit(d.flux_unit);
    document.documentElement.dataset.physics = P.id;
    if (EW.parts) EW.parts.relabel(); // the parts of split edges (segments.js)
    checkPlausible();
  }
  EW.relabel = relabel;

  // ---- plausibility: numbers far from what this physics usually has ----

  // plausible returns a warning for each number of the project outside the
  // usual span of its physics (the table's "usual"): [{path, text}].
  EW.plausible = function (project) {
    const P = EW.physicsOf(project.physics), us = P.usual || {}, u = P.units || {};
    const out = [];
    const span = (s, unit) => EW.num(s[0], 2) + " to " + EW.num(s[1], 2) + (unit ? " " + unit : "");
    const check = (v, s, path, name, unit) => {
      if (!s || typeof v !== "number" || !Number.isFinite(v) || (v >= s[0] && v <= s[1])) return;
      out.push({ path, text: name + " " + EW.withUnit(EW.num(v), unit) + " is far " + (v < s[0] ? "below" : "above") +
        " the usual " + span(s, unit) + " (" + us.source + "): a number meant for another physics, or a slip of the exponent?" });
    };
    const k = project.conductivity, kn = EW.capital(u.conductivity || "conductivity");
    if (k !== null && typeof k === "object") {
      check(k.x, us.conductivity, "conductivity.x", kn + " along x", u.conductivity_unit);
      check(k.y, us.conductivity, "conductivity.y", kn + " along y", u.conductivity_unit);
    } else {
      check(k, us.conductivity, "conductivity", kn, u.conductivity_unit);
    }
    for (const side of EW.SIDES) {
      const e = (project.edges || {})[side];
      if (e && e.kind === "convection") {
        check(e.h, us.h, "edges." + side + ".h", EW.capital(side) + " edge, " + (u.coefficient || "h"), u.coefficient_unit);
      }
      const parts = e && Array.isArray(e.segments) ? e.segments : [];
      parts.forEach((g, i) => {
        if (g && g.kind === "convection") {
          check(g.h, us.h, "edges." + side + ".segments[" + i + "].h", EW.capital(side) + " edge, part " + (i + 1) + ", " + (u.coefficient || "h"), u.coefficient_unit);
        }
      });
    }
    return out;
  };

  // checkPlausible lists the warnings for the form as it stands.
  function checkPlausible() {
    const ul = $("plausible");
    if (!ul || !EW.read) return;
    const list = EW.plausible(EW.read().project);
    ul.replaceChildren(...list.map((w) => {
      const li = document.createElement("li");
      li.textContent = w.text;
      li.dataset.path = w.path;
      return li;
    }));
  }
  EW.checkPlausible = checkPlausible;

  // ---- switching physics: keep the numbers, or open the example ----
  // A switch keeps every number the user typed (with the warnings above)
  // and offers the new physics' example project. Opening it keeps the
  // user's project, and one click brings it back: nothing is lost without
  // a choice.

  let kept = null; // the user's project while an example is open

  function offer(children) {
    const box = $("physics-offer");
    box.replaceChildren(...children);
    box.hidden = children.length === 0;
  }
  const para = (text) => { const p = document.createElement("p"); p.textContent = text; return p; };
  function button(text, id, primary, onClick) {
    const b = document.createElement("button");
    b.type = "button";
    b.id = id;
    b.textContent = text;
    if (primary) b.className = "primary";
    b.addEventListener("click", onClick);
    return b;
  }
  const actions = (...bs) => { const d = document.createElement("div"); d.className = "actions"; d.append(...bs); return d; };

  // physicsSwitched is called by the form after the user chose another
  // physics (from, to: ids).
  EW.physicsSwitched = function (from, to) {
    if (from === to) return;
    kept = null;
    const P = EW.physicsOf(to), ex = P.example;
    const n = EW.plausible(EW.read().project).length;
    const kids = [para("Now " + P.name + ". Your numbers are kept as they were typed" +
      (n ? "; " + n + (n === 1 ? " of them is" : " of them are") + " far from what this physics usually has (see below)." : "."))];
    const bs = [];
    if (ex) {
      bs.push(button("Open the example: " + (ex.title || P.name), "offer-example", true, () => openExample(from, ex)));
    }
    (P.more_examples || []).forEach((m, i) => {
      bs.push(button("Open: " + (m.title || P.name + " " + (i + 2)), "offer-example-" + (i + 2), false, () => openExample(from, m)));
    });
    bs.push(button("Keep my numbers", "offer-keep", false, () => offer([])));
    kids.push(actions(...bs));
    offer(kids);
  };

  async function openExample(from, ex) {
    const mine = EW.read().project;
    mine.physics = from; // back means back to before the switch
    kept = mine;
    try {
      await window.edgewise.load(JSON.parse(JSON.stringify(ex)));
    } catch (e) {
      if (e.cancelled || !e.path) {
        kept = null;
        offer([para("The example did not open: " + e.message)]);
        return;
      }
      // read but not solved: it stays in the inputs with its error marked
      EW.solving.edit(JSON.parse(JSON.stringify(ex)));
      offer([para("The example is in the inputs but does not solve here: " + e.message.replace(/\.?$/, ".") + " Your own project is kept until you bring it back or leave the page."),
        actions(button("Back to my project", "offer-back", true, back), button("Stay with the example", "offer-keep", false, () => { kept = null; offer([]); }))]);
      return;
    }
    offer([para("The example is open. Your own project, as it was before the switch, is kept until you bring it back or leave the page."),
      actions(button("Back to my project", "offer-back", true, back), button("Stay with the example", "offer-keep", false, () => { kept = null; offer([]); }))]);
  }

  // the examples chooser in the physics group: every example of every
  // physics, opened as above (the user's project kept for "Back")
  function chooser() {
    const sel = $("in-example");
    if (!sel) return;
    sel.replaceChildren();
    const first = document.createElement("option");
    first.value = "";
    first.textContent = "Open an example…";
    sel.append(first);
    for (const P of list) {
      const all = (P.example ? [P.example] : []).concat(P.more_examples || []);
      if (!all.length) continue;
      const g = document.createElement("optgroup");
      g.label = P.name;
      all.forEach((ex, i) => {
        const o = document.createElement("option");
        o.value = P.id + ":" + i;
        o.textContent = ex.title || P.name;
        g.append(o);
      });
      sel.append(g);
    }
    sel.addEventListener("input", (e) => e.stopPropagation()); // not an edit of the project
    sel.addEventListener("change", (e) => {
      e.stopPropagation();
      const [pid, i] = sel.value.split(":");
      sel.value = "";
      const P = list.find((q) => q.id === pid);
      const ex = P && (P.example ? [P.example] : []).concat(P.more_examples || [])[Number(i)];
      if (ex) openExample($("in-physics").value, ex);
    });
  }

  async function back() {
    if (!kept) return;
    const p = kept;
    try {
      await window.edgewise.load(p);
    } catch (e) {
      // a project that does not solve still comes back into the form
      EW.fill(p);
      EW.edited && EW.edited();
    }
    kept = null;
    offer([]);
  }
})();
