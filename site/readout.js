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
    const L = u.length_unit || "m";
    const gm = Math.hypot(g.ux, g.uy);
    const qx = -S.kx * g.ux, qy = -S.ky * g.uy;
    const also = P.also ? " (" + EW.num(gm / P.also.scale, 3) + " " + P.also.unit + ")" : "";
    const parts = [
      ["x, y", EW.num(x, 4) + ", " + EW.num(y, 4) + " " + L],
      [u.value || "value", EW.withUnit(EW.value(g.u, 5), u.value_unit)],
      [P.readout || "gradient |∇|", EW.withUnit(EW.num(gm, 4), u.gradient_unit) + also],
      [u.flux || "flux", EW.withUnit(EW.num(Math.hypot(qx, qy), 4), u.flux_unit) + " " + arrow(qx, qy)],
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

  // arrow points the way the flux goes, to the nearest of eight directions.
  function arrow(qx, qy) {
    if (!(Math.hypot(qx, qy) > 0)) return "";
    const a = (Math.atan2(qy, qx) * 180) / Math.PI;
    const dirs = ["→", "↗", "↑", "↖", "←", "↙", "↓", "↘"];
    return dirs[((Math.round(a / 45) % 8) + 8) % 8];
  }
})();
