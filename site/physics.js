// edgewise page: the physics. Reads the engine's physics table
// (physics.json, written from the Go package solver/physics; inline in the
// single offline file) and labels the page from it: the choice of physics,
// quantity names and units, edge-kind names and the hints beside the
// inputs. Nothing here names a physics: a new one needs no change here.
// Entry points: EW.loadPhysics() -> Promise (once, before the first
// project is shown), then EW.relabel() whenever the physics or an edge kind
// changes, and EW.physicsOf(id) for the entry of one physics.
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
    const u = P.units || {}, hints = P.hints || {}, kinds = P.kinds || {};
    const unit = (x) => (x ? "[" + x + "]" : "");
    for (const i of document.querySelectorAll("[data-unit]")) {
      const k = i.dataset.unit;
      i.textContent = unit(k === "length" ? u.length_unit || "m" : k === "cond" ? u.conductivity_unit : k === "source" ? u.source_unit : "");
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
        : EW.capital(u.flux || "flux") + " in " + unit(u.flux_unit);
      block.querySelector(".lbl-h").textContent = EW.capital(u.coefficient || "h") + " " + unit(u.coefficient_unit);
      block.querySelector(".lbl-amb").textContent = "Ambient " + (u.value || "value") + " " + unit(u.value_unit);
    }
    $("probe-head-v").textContent = EW.capital(u.value || "value") + " " + unit(u.value_unit);
    $("probe-head-g").textContent = EW.capital(P.magnitude || u.gradient || "gradient") + " " + unit(u.gradient_unit);
    $("probe-head-q").textContent = EW.capital(u.flux || "flux") + " " + unit(u.flux_unit);
    document.documentElement.dataset.physics = P.id;
  }
  EW.relabel = relabel;
})();
