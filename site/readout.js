// edgewise page: the pointer readout under the picture: where the pointer
// is and the field there, named and in the units of the physics (from the
// physics table). Entry point: EW.readout(el, S, x, y, g), with S the
// shown solve and g = {u, ux, uy} the field at (x, y); g null clears it.
"use strict";
(function () {
  const EW = (window.edgewiseParts = window.edgewiseParts || {});
  const IDLE = "Point at the picture to read the field; click (or press Enter) to pin a probe.";

  EW.readout = function (el, S, x, y, g) {
    if (!g) {
      el.textContent = IDLE;
      return;
    }
    el.replaceChildren();
    const u = S.units || {};
    const P = EW.physicsOf(S.project.physics);
    const d = EW.shownUnits(u), L = d.length_unit;
    const len = (v) => EW.num(EW.dv(u, "length", v), 4);
    const gm = Math.hypot(g.ux, g.uy);
    const qx = -S.kx * g.ux, qy = -S.ky * g.uy;
    const also = P.also && P.also.unit !== d.gradient_unit ? " (" + EW.num(gm / P.also.scale, 3) + " " + P.also.unit + ")" : "";
    const parts = [
      ["x, y", len(x) + ", " + len(y) + " " + L],
      [u.value || "value", EW.withUnit(EW.value(g.u, 5, u), d.value_unit)],
      [P.readout || "gradient |∇|", EW.withUnit(EW.num(EW.dd(u, "gradient", gm), 4), d.gradient_unit) + also],
      [u.flux || "flux", EW.withUnit(EW.num(EW.dd(u, "flux", Math.hypot(qx, qy)), 4), d.flux_unit) + " " + arrow(qx, qy)],
    ];
    for (const [k, v] of parts) {
      const part = document.createElement("span");
      part.className = "part";
      const b = document.createElement("b");
      b.textContent = k + " ";
      part.append(b, v);
      el.append(part, " ");
    }
  };

  // probeCells returns a probe's gradient and flux cells for its row in
  // the probes table: the size of the gradient, as the column heading
  // says; the flux as its components x, y; and for a probe on an edge the
  // normal flux INTO the region there, the convention of the edge flows.
  EW.probeCells = function (p, S, gx, gy, qx, qy, why) {
    const td = (text, cls) => { const c = document.createElement("td"); c.className = cls; c.textContent = text; return c; };
    const u = S.units || {};
    if (typeof gx !== "number" || typeof gy !== "number" || !Number.isFinite(gx) || !Number.isFinite(gy)) {
      // no value there (null in the result): say so, and why, never a number
      const g = td("unbounded", "num unbounded");
      g.title = why || "the gradient has no value at this point";
      const f = td("–", "num flux");
      f.append(Object.assign(document.createElement("span"), { className: "why", textContent: why || "" }));
      return [g, f];
    }
    const grad = td(EW.num(EW.dd(u, "gradient", Math.hypot(gx, gy)), 4), "num");
    const q = Math.hypot(qx, qy);
    // a component below 1e-9 of the flux is rounding noise
    const comp = (v) => (Math.abs(v) <= 1e-9 * q ? "0" : EW.num(EW.dd(u, "flux", v), 4));
    const flux = td(comp(qx) + ", " + comp(qy), "num flux");
    for (const [side, qin] of normals(p, S, qx, qy)) {
      const n = document.createElement("span");
      n.className = "normal";
      n.dataset.side = side;
      n.textContent = "in through " + side + ": " + comp(qin);
      flux.append(n);
    }
    return [grad, flux];
  };

  // normals lists, for a probe on the boundary, each edge it lies on with
  // the flux entering the region there (inward normal: +y at the bottom,
  // -y at the top, +x at the left, -x at the right).
  function normals(p, S, qx, qy) {
    const on = (a, b, span) => Math.abs(a - b) <= 1e-9 * span;
    const out = [];
    if (on(p.y, 0, S.h)) out.push(["bottom", qy]);
    if (on(p.y, S.h, S.h)) out.push(["top", -qy]);
    if (on(p.x, 0, S.w)) out.push(["left", qx]);
    if (on(p.x, S.w, S.w)) out.push(["right", -qx]);
    return out;
  }

  // arrow points the way the flux goes, to the nearest of eight directions.
  function arrow(qx, qy) {
    if (!(Math.hypot(qx, qy) > 0)) return "";
    const a = (Math.atan2(qy, qx) * 180) / Math.PI;
    const dirs = ["→", "↗", "↑", "↖", "←", "↙", "↓", "↘"];
    return dirs[((Math.round(a / 45) % 8) + 8) % 8];
  }
})();
