// edgewise page: compare two designs. "Pin as A" keeps the case on show;
// every later solve is B, shown beside A: both fields on one colour scale,
// the difference B - A on a common grid when the rectangles match (the
// diverging map, symmetric about zero, painted by EW.colour), and a table
// of outputs with their differences. When the rectangles differ the panel
// says why no difference map is shown.
//
//   EW.compare = {pin(), clear(), state() -> {pinned, diff, note, maxDiff}}
"use strict";
(function () {
  const EW = (window.edgewiseParts = window.edgewiseParts || {});
  const { byId, el } = EW.dom;
  const store = EW.store;
  const $ = byId;

  let A = null; // {project, result, u, nx, ny, w, h}
  let diffMax = null; // largest |B - A| on the common grid, or null

  const figure = (id, caption) => el("figure", { class: "cmp-fig" },
    el("canvas", { id, width: 2, height: 2, class: "cmp-canvas", role: "img", "aria-label": caption }),
    el("figcaption", { id: id + "-cap", text: caption }));

  const section = $("compare");
  section.append(
    el("h2", { text: "Compare two designs" }),
    el("p", { class: "hint", text: "Pin the case on show as A, change anything, and see the new case B beside it." }),
    el("div", { class: "st-buttons" },
      el("button", { type: "button", id: "cmp-pin", text: "Pin this case as A", onclick: () => pin() }),
      el("button", { type: "button", id: "cmp-clear", text: "Unpin A", hidden: true, onclick: () => clear() })),
    el("div", { id: "cmp-body", class: "cmp-body", hidden: true },
      el("div", { class: "cmp-figs" }, figure("cmp-a", "A"), figure("cmp-b", "B"), figure("cmp-diff", "B − A")),
      el("p", { id: "cmp-note", class: "hint", role: "status" }),
      el("table", { id: "cmp-table", class: "probes" })));

  function snapshot(S) {
    return { project: JSON.parse(JSON.stringify(S.project)), result: S.result, u: S.u.slice(), nx: S.nx, ny: S.ny, w: S.w, h: S.h };
  }

  function pin() {
    const S = store.last();
    if (!S) return false;
    A = snapshot(S);
    $("cmp-clear").hidden = false;
    $("cmp-body").hidden = false;
    show(S);
    return true;
  }

  function clear() {
    A = null;
    diffMax = null;
    $("cmp-clear").hidden = true;
    $("cmp-body").hidden = true;
  }

  // at samples a field bilinearly at (x, y) of its rectangle.
  function at(F, x, y) {
    const fx = Math.min(Math.max((x / F.w) * F.nx, 0), F.nx), fy = Math.min(Math.max((y / F.h) * F.ny, 0), F.ny);
    const i = Math.min(Math.floor(fx), F.nx - 1), j = Math.min(Math.floor(fy), F.ny - 1);
    const s = fx - i, t = fy - j, n = F.nx + 1;
    const u = F.u;
    return (1 - t) * ((1 - s) * u[j * n + i] + s * u[j * n + i + 1]) + t * ((1 - s) * u[(j + 1) * n + i] + s * u[(j + 1) * n + i + 1]);
  }

  const same = (a, b) => Math.abs(a - b) <= 1e-12 * Math.max(Math.abs(a), Math.abs(b));

  function show(S) {
    if (!A || !S) return;
    const B = S;
    // A and B on one scale: the diverging one when either field changes sign in the engine's view
    const lo = Math.min(A.result.min.value, B.result.min.value), hi = Math.max(A.result.max.value, B.result.max.value);
    const signed = [A.result, B.result].some((r) => r.colour && EW.colours && EW.colours.names && r.colour.map === EW.colours.names.diverging);
    const sc = EW.colour.scale({ min: { value: lo }, max: { value: hi } }, signed ? "diverging" : "sequential");
    EW.colour.paint($("cmp-a"), A, sc);
    EW.colour.paint($("cmp-b"), B, sc);
    // in the display units (measure.js); the differences without a temperature's offset
    const U = B.units || {}, L = EW.conv(U, "length"), V = EW.conv(U, "value");
    const len = (v, p) => EW.num(v * L.scale, p) + " " + L.unit, dif = (v, p) => EW.num(v * V.scale, p) + (V.unit ? " " + V.unit : "");
    $("cmp-a-cap").textContent = "A: " + (A.project.title || "pinned case") + " (" + len(A.w) + " × " + len(A.h) + ")";
    $("cmp-b-cap").textContent = "B: the case on show (" + len(B.w) + " × " + len(B.h) + ")";
    const note = $("cmp-note");
    const dfig = $("cmp-diff").closest("figure");
    if (!same(A.w, B.w) || !same(A.h, B.h)) {
      diffMax = null;
      dfig.hidden = true;
      note.textContent = "No difference map: A is " + len(A.w, 6) + " × " + len(A.h, 6) + " and B is " + len(B.w, 6) + " × " +
        len(B.h, 6) + "; the fields can be subtracted point by point only on the same rectangle.";
    } else {
      // the common grid is B's; A is sampled on it when its grid differs
      const n = (B.nx + 1) * (B.ny + 1);
      const d = new Float64Array(n);
      const sameGrid = A.nx === B.nx && A.ny === B.ny;
      let m = 0;
      for (let j = 0; j <= B.ny; j++) {
        for (let i = 0; i <= B.nx; i++) {
          const k = j * (B.nx + 1) + i;
          const a = sameGrid ? A.u[k] : at(A, (i / B.nx) * B.w, (j / B.ny) * B.h);
          d[k] = B.u[k] - a;
          m = Math.max(m, Math.abs(d[k]));
        }
      }
      diffMax = m;
      dfig.hidden = false;
      const dsc = EW.colour.scale({ min: { value: -(m || 1) }, max: { value: m || 1 } }, "diverging");
      EW.colour.paint($("cmp-diff"), { u: d, nx: B.nx, ny: B.ny }, dsc);
      $("cmp-diff-cap").textContent = "B − A, from −" + dif(m) + " (one end of the map) to +" + dif(m) + ", zero in the middle";
      note.textContent = m === 0 ? "The two fields are the same on the common grid." :
        "Largest difference " + dif(m, 4) + (sameGrid ? "" : " (A sampled on B's grid)") + ".";
    }
    table(A.result, B.result, U);
    section.dataset.compared = String(Number(section.dataset.compared || 0) + 1);
  }

  function rowsOf(r) {
    const out = [["max.value", r.max.value], ["min.value", r.min.value], ["mean", r.mean]];
    for (const [side, e] of Object.entries(r.edges || {})) out.push(["edges." + side + ".flow", e.flow]);
    for (const p of r.probes || []) out.push(["probes." + p.label + ".value", p.value]);
    return out;
  }

  function table(ra, rb, U) {
    const a = new Map(rowsOf(ra)), b = new Map(rowsOf(rb));
    const names = [...new Set([...a.keys(), ...b.keys()])];
    const role = (n) => (n.endsWith(".flow") ? "flow" : "value");
    const unit = (n) => { const x = EW.conv(U, role(n)).unit; return x ? " [" + x + "]" : ""; };
    const v = (x, n, diff) => (x === null || x === undefined ? "–" : EW.num(diff ? EW.dd(U, role(n), x) : EW.dv(U, role(n), x), 6));
    $("cmp-table").replaceChildren(
      el("thead", null, el("tr", null, ...["Output", "A", "B", "B − A"].map((t) => el("th", { scope: "col", text: t })))),
      el("tbody", null, ...names.map((n) => {
        const x = a.get(n), y = b.get(n);
        const d = typeof x === "number" && typeof y === "number" ? y - x : null;
        return el("tr", { "data-output": n }, el("th", { scope: "row", text: n + unit(n) }), el("td", { text: v(x, n) }), el("td", { text: v(y, n) }), el("td", { text: v(d, n, true) }));
      })));
  }

  store.on("solved", () => show(store.last()));

  EW.compare = {
    pin,
    clear,
    state: () => ({ pinned: !!A, diff: diffMax !== null, maxDiff: diffMax, note: $("cmp-note").textContent }),
  };
})();
