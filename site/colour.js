// edgewise page: colours. The colour scale of the picture is the engine's
// (result.colour: which map and over what range, from the Go rule
// colour.Choose, the same for the SVG, the PNG and the report), drawn with
// the engine's colour tables (EW.colours, from edgewise_colours). Entry
// point: EW.colour = {scale(result, mode), paint(canvas, S, scale),
// legend(canvas, scale, box, horizontal, units)}.
"use strict";
(function () {
  const EW = (window.edgewiseParts = window.edgewiseParts || {});
  const INK = "#1b2029";
  const PAPER = "#fbfaf6";
  EW.colours = null; // {sequential, diverging: Uint8Array(3n), n, names: {sequential, diverging}}

  // table returns the engine's table of the map with this name, or of
  // this kind ("sequential", "diverging").
  function table(name) {
    const c = EW.colours;
    if (c) {
      for (const kind of ["sequential", "diverging"]) {
        if (kind === name || (c.names && c.names[kind] === name)) return c[kind];
      }
    }
    return null;
  }

  // scale returns the colours of a result: the engine's choice (mode
  // "auto"), or the map the user asked for over the engine's range
  // ("sequential": lowest to highest; "diverging": about zero).
  function scale(result, mode) {
    let c = result.colour || { map: "sequential", from: result.min.value, to: result.max.value };
    if (mode === "sequential" || mode === "diverging") {
      const lo = result.min.value, hi = result.max.value;
      const m = Math.max(Math.abs(lo), Math.abs(hi));
      c = mode === "sequential" ? { map: mode, from: lo, to: hi } : { map: mode, from: -m, to: m };
    }
    const names = (EW.colours && EW.colours.names) || {};
    let tab = table(c.map);
    if (!tab || !tab.length) {
      // no tables from the engine: a plain grey ramp, still readable
      tab = new Uint8Array(3 * 256);
      for (let k = 0; k < 256; k++) tab[3 * k] = tab[3 * k + 1] = tab[3 * k + 2] = 40 + Math.round((k * 200) / 255);
    }
    const n = tab.length / 3;
    const a = c.from, b = c.to;
    // as the engine's colour.Scale.Index: clamp, then the nearest of n
    const index = (v) => Math.round((b > a ? Math.min(1, Math.max(0, (v - a) / (b - a))) : 0.5) * (n - 1));
    const diverging = c.map === "diverging" || c.map === names.diverging;
    return {
      mode: diverging ? "diverging" : "sequential", map: c.map, table: tab, lo: a, hi: b, n, index,
      rgb: (v) => { const k = 3 * index(v); return "rgb(" + tab[k] + "," + tab[k + 1] + "," + tab[k + 2] + ")"; },
    };
  }

  // paint draws the field into canvas, one pixel per grid node, y up.
  function paint(canvas, S, sc) {
    const { nx, ny, u } = S;
    canvas.width = nx + 1;
    canvas.height = ny + 1;
    const ctx = canvas.getContext("2d");
    const img = ctx.createImageData(nx + 1, ny + 1);
    const d = img.data, tab = sc.table;
    for (let j = 0; j <= ny; j++) {
      const row = (ny - j) * (nx + 1);
      for (let i = 0; i <= nx; i++) {
        const c = 3 * sc.index(u[j * (nx + 1) + i]);
        const k = 4 * (row + i);
        d[k] = tab[c]; d[k + 1] = tab[c + 1]; d[k + 2] = tab[c + 2]; d[k + 3] = 255;
      }
    }
    ctx.putImageData(img, 0, 0);
  }

  // legend draws the colour bar beside the picture (box: the plot area in
  // CSS pixels), or under it on a narrow screen.
  function legend(canvas, sc, box, horizontal, units) {
    const u = units || {};
    if (horizontal) return legendBelow(canvas, sc, box, u);
    const w = 96;
    const ctx = EW.sizeCanvas(canvas, w, box.cssH);
    canvas.style.width = w + "px";
    ctx.fillStyle = PAPER;
    ctx.fillRect(0, 0, w, box.cssH);
    const top = box.y0, h = box.h, x = 6, bw = 16;
    for (let py = 0; py < h; py++) {
      ctx.fillStyle = sc.rgb(sc.hi - ((py + 0.5) / h) * (sc.hi - sc.lo));
      ctx.fillRect(x, top + py, bw, 1.5);
    }
    ctx.strokeStyle = INK;
    ctx.strokeRect(x, top, bw, h);
    ctx.fillStyle = INK;
    ctx.textAlign = "left";
    ctx.textBaseline = "middle";
    const yOf = (t) => top + ((sc.hi - t) / (sc.hi - sc.lo || 1)) * h;
    for (const [t, end] of marks(sc, yOf, Math.max(3, Math.floor(h / 34)), 13)) {
      const py = yOf(t);
      ctx.beginPath(); ctx.moveTo(x + bw, py); ctx.lineTo(x + bw + 4, py); ctx.stroke();
      ctx.font = (end ? "600 " : "") + "11px system-ui, sans-serif";
      ctx.fillText(EW.num(t, end ? 4 : 3), x + bw + 6, py);
    }
    ctx.textBaseline = "top";
    ctx.font = "600 11px system-ui, sans-serif";
    ctx.fillText(u.value_unit ? "[" + u.value_unit + "]" : "", x, top + h + 8);
    ctx.font = "11px system-ui, sans-serif";
    ctx.fillText(u.value || "", x, top + h + 22);
  }

  function legendBelow(canvas, sc, box, u) {
    const w = box.cssW, hh = 40;
    const ctx = EW.sizeCanvas(canvas, w, hh);
    canvas.style.width = w + "px";
    ctx.fillStyle = PAPER;
    ctx.fillRect(0, 0, w, hh);
    const x0 = box.x0, bw = box.w, y = 4, bh = 12;
    for (let px = 0; px < bw; px++) {
      ctx.fillStyle = sc.rgb(sc.lo + ((px + 0.5) / bw) * (sc.hi - sc.lo));
      ctx.fillRect(x0 + px, y, 1.5, bh);
    }
    ctx.strokeStyle = INK;
    ctx.strokeRect(x0, y, bw, bh);
    ctx.fillStyle = INK;
    ctx.textBaseline = "top";
    const xOf = (t) => x0 + ((t - sc.lo) / (sc.hi - sc.lo || 1)) * bw;
    for (const [t, end] of marks(sc, xOf, Math.max(3, Math.floor(bw / 70)), 34)) {
      const px = xOf(t);
      ctx.beginPath(); ctx.moveTo(px, y + bh); ctx.lineTo(px, y + bh + 4); ctx.stroke();
      ctx.font = (end ? "600 " : "") + "11px system-ui, sans-serif";
      ctx.textAlign = t === sc.lo ? "left" : t === sc.hi ? "right" : "center";
      ctx.fillText(EW.num(t, end ? 4 : 3), t === sc.lo ? px - 2 : t === sc.hi ? px + 2 : px, y + bh + 6);
    }
    ctx.textAlign = "right";
    ctx.font = "600 11px system-ui, sans-serif";
    ctx.fillText(u.value_unit ? "[" + u.value_unit + "]" : "", x0 - 6, y);
  }

  // marks returns the ends, labelled always, and round ticks at least gap
  // pixels from them.
  function marks(sc, pos, n, gap) {
    const list = [[sc.hi, true], [sc.lo, true]];
    for (const t of EW.niceTicks(sc.lo, sc.hi, n)) {
      if (Math.abs(pos(t) - pos(sc.hi)) > gap && Math.abs(pos(t) - pos(sc.lo)) > gap) list.push([t, false]);
    }
    return list;
  }

  EW.colour = { scale, paint, legend };
})();
