// edgewise page: probes. Pinning one (a click or Enter on the picture,
// field.js) adds it to the project's probe list, which the form keeps,
// and solves the project as an edit; the store's notifications then
// redraw the markers and this table. Entry point: EW.pin(x, y).
"use strict";
(function () {
  const EW = (window.edgewiseParts = window.edgewiseParts || {});
  const { byId, el } = EW.dom;
  const store = EW.store;

  // pin adds a probe at (x, y), rounded to 5 significant places of the
  // rectangle's size.
  EW.pin = function (x, y) {
    const S = store.last();
    if (!S) return;
    const list = EW.probes();
    const used = new Set(list.map((p) => p.label));
    let n = 1;
    while (used.has("P" + n)) n++;
    const round = (v, span) => {
      const q = Math.pow(10, Math.floor(Math.log10(span)) - 4);
      return Number((Math.round(v / q) * q).toPrecision(12));
    };
    list.push({ x: round(x, S.w), y: round(y, S.h), label: "P" + n });
    EW.setProbes(list);
    EW.edited();
  };

  function remove(label) {
    EW.setProbes(EW.probes().filter((p) => p.label !== label));
    EW.edited();
  }

  // render writes the table for the probes as typed: values from the last
  // solve where it computed them, else read from the picture (marked ≈).
  function render() {
    const S = store.last();
    const list = EW.probes();
    if (S && JSON.stringify(S.project.probes || []) !== JSON.stringify(list)) EW.showProbes(list);
    const body = byId("probes").tBodies[0];
    body.replaceChildren();
    byId("probes-hint").textContent = list.length
      ? "Values from the series at each point; ≈ marks a value read from the picture until the next solve."
      : "Click the picture (or focus it and press Enter) to pin a probe.";
    if (!S) return;
    for (const p of list) {
      if (EW.outsideProbe(p)) { body.append(outsideRow(p)); continue; }
      const hit = (S.result.probes || []).find((q) => q.label === p.label && q.x === p.x && q.y === p.y);
      let v, gx, gy, qx, qy, approx = false;
      if (hit) {
        v = hit.value; gx = hit.gradient[0]; gy = hit.gradient[1]; qx = hit.flux[0]; qy = hit.flux[1];
      } else {
        const g = EW.sample(p.x, p.y);
        v = g.u; gx = g.ux; gy = g.uy; qx = -S.kx * g.ux; qy = -S.ky * g.uy; approx = true;
      }
      const value = el("td", { class: "num probe-value", "data-value": String(v), text: (approx ? "≈ " : "") + EW.num(EW.dv(S.units, "value", v), 6) });
      const button = el("button", {
        type: "button", class: "remove", text: "×", "aria-label": "Remove probe " + p.label, onclick: () => remove(p.label),
      });
      body.append(el("tr", { "data-label": p.label },
        el("th", { scope: "row", text: p.label }),
        el("td", { text: at(S, p) }),
        value,
        ...EW.probeCells(p, S, gx, gy, qx, qy, hit && hit.gradient_none),
        el("td", {}, button)));
    }
  }

  // outsideRow marks a probe outside the rectangle (left out of the
  // solves, kept in the project) and offers to move it inside or drop it.
  function outsideRow(p) {
    const P = store.project();
    const clamp = (v, hi) => Math.min(Math.max(v, 0), hi);
    const move = () => {
      EW.setProbes(EW.probes().map((q) => (q.label === p.label ? Object.assign({}, q, { x: clamp(q.x, P.width), y: clamp(q.y, P.height) }) : q)));
      EW.edited();
    };
    return el("tr", { "data-label": p.label, class: "outside" },
      el("th", { scope: "row", text: p.label }),
      el("td", { text: at(store.last(), p) }),
      el("td", { colspan: "3", class: "probe-outside" }, "outside the rectangle, left out ",
        el("button", { type: "button", class: "probe-move", text: "Move inside", onclick: move }), " ",
        el("button", { type: "button", class: "probe-drop", text: "Drop", onclick: () => remove(p.label) })),
      el("td", {}));
  }

  // at writes a probe's place in the display length unit.
  function at(S, p) {
    const u = (S && S.units) || {}, f = (v) => EW.num(EW.dv(u, "length", v), 4);
    return f(p.x) + ", " + f(p.y);
  }

  store.on("solved", render);
  store.on("edited", render);
})();
