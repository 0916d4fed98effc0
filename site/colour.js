// edgewise page: colours. The colour scale of the picture is the engine's
// (result.colour: which map and over what range, from the Go rule
// colour.Choose, the same for the SVG, the PNG and the report), drawn with
// the engine's colour tables (EW.colours: colours.json, which the build
// writes from the engine's colour package, inline in the single file).
// Entry points: EW.loadColours() -> Promise (once, before the first
// picture), EW.colour = {scale(result, mode), paint(canvas, S, scale),
// legend(canvas, scale, box, horizontal, units, levels)}, and EW.tag, the
// boxed value label the picture and the colour bar share.
"use strict";
(function () {
  const EW = (window.edgewiseParts = window.edgewiseParts || {});
  const INK = "#1b2029";
  const PAPER = "#fbfaf6";
  EW.colours = null; // {sequential, diverging: Uint8Array(3n), n, names: {sequential, diverging}}

  // loadColours reads the tables: inline in the single file, else
  // fetched. When they do not read, it rejects with why (the boot shows
  // it) and EW.colours stays null (scale then draws a grey ramp).
  let loadingColours = null;
  EW.loadColours = function () {
    if (!loadingColours) {
      loadingColours = (async () => {
        const inline = document.getElementById("ew-colours");
        let doc;
        if (inline) doc = JSON.parse(inline.textContent);
        else {
          const resp = await fetch("colours.json");
          if (!resp.ok) throw new Error("the colour tables (colours.json) could not be read: " + resp.status);
          doc = await resp.json();
        }
        const n = doc && doc.n;
        const ok = (t) => Array.isArray(t) && t.length === 3 * n;
        if (!(n >= 2) || !ok(doc.sequential) || !ok(doc.diverging)) throw new Error("the colour tables (colours.json) are not whole");
        EW.colours = { n, sequential: Uint8Array.from(doc.sequential), diverging: Uint8Array.from(doc.diverging), names: doc.names || {} };
      })();
    }
    return loadingColours;
  };

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

  // ---- tags: the page's own label look ----
  // A value label is a small upright box in paper colour with a thin ink
  // edge, never rotated and never bold: isoline labels on the picture and
  // the end values of the colour bar share it.
  const TAG_FONT = "11px system-ui, sans-serif";
  const TAG_H = 15;

  // tagSize returns the box a tag of this text takes: {w, h}.
  function tagSize(ctx, text) {
    ctx.font = TAG_FONT;
    return { w: Math.ceil(ctx.measureText(text).width) + 8, h: TAG_H };
  }

  // tag draws text in a tag centred on (cx, cy) and returns its box
  // {x, y, w, h}.
  function tag(ctx, text, cx, cy) {
    const { w, h } = tagSize(ctx, text);
    const x = Math.round(cx - w / 2) + 0.5, y = Math.round(cy - h / 2) + 0.5;
    ctx.save();
    ctx.beginPath();
    if (ctx.roundRect) ctx.roundRect(x, y, w, h, 2); else ctx.rect(x, y, w, h);
    ctx.fillStyle = "rgba(251, 250, 246, 0.93)";
    ctx.fill();
    ctx.lineWidth = 0.8;
    ctx.strokeStyle = "rgba(27, 32, 41, 0.55)";
    ctx.stroke();
    ctx.fillStyle = INK;
    ctx.font = TAG_FONT;
    ctx.textAlign = "center";
    ctx.textBaseline = "middle";
    ctx.fillText(text, x + w / 2, y + h / 2 + 0.5);
    ctx.restore();
    return { x, y, w, h };
  }

  // power returns the power of ten the bar's labels leave out (written once
  // beside the unit), or 0 when plain numbers read well.
  function power(sc) {
    const m = Math.max(Math.abs(sc.lo), Math.abs(sc.hi));
    if (!(m > 0) || (m >= 1e-3 && m < 1e5)) return 0;
    return Math.floor(Math.log10(m));
  }

  // legend draws the colour bar beside the picture (box: the plot area in
  // CSS pixels), or under it on a narrow screen. The bar's look: thin
  // lines across it at the isoline levels (levels, when the picture shows
  // isolines), round values on short ticks outside it, and the two ends in
  // tags like the isoline labels. A power of ten too large or small for
  // plain numbers is written once, with the unit.
  function legend(canvas, sc, box, horizontal, units, levels) {
    const u = units || {};
    const p = power(sc), f = Math.pow(10, -p);
    // below the accuracy of the solve an end is 0, not rounding noise
    const label = (t, d) => (EW.floors && Math.abs(t) < EW.floors().value ? "0" : EW.num(t * f, d));
    const unitText = (p ? "×10" + EW.superscript(p) + (u.value_unit ? " " : "") : "") + (u.value_unit || "");
    if (horizontal) return legendBelow(canvas, sc, box, u, levels, label, unitText);
    const probe = canvas.getContext("2d");
    probe.font = TAG_FONT;
    const widest = Math.max(tagSize(probe, label(sc.hi, 4)).w, tagSize(probe, label(sc.lo, 4)).w,
      probe.measureText(unitText ? "[" + unitText + "]" : "").width + 4);
    const x = 8, bw = 14;
    const w = Math.max(96, Math.ceil(x + bw + 10 + widest + 4));
    const ctx = EW.sizeCanvas(canvas, w, box.cssH);
    canvas.style.width = w + "px";
    ctx.fillStyle = PAPER;
    ctx.fillRect(0, 0, w, box.cssH);
    const top = box.y0, h = box.h;
    for (let py = 0; py < h; py++) {
      ctx.fillStyle = sc.rgb(sc.hi - ((py + 0.5) / h) * (sc.hi - sc.lo));
      ctx.fillRect(x, top + py, bw, 1.5);
    }
    const yOf = (t) => top + ((sc.hi - t) / (sc.hi - sc.lo || 1)) * h;
    across(ctx, sc, levels, (t) => { const py = Math.round(yOf(t)) + 0.5; ctx.moveTo(x, py); ctx.lineTo(x + bw, py); });
    ctx.strokeStyle = INK;
    ctx.lineWidth = 1;
    ctx.strokeRect(x + 0.5, top + 0.5, bw - 1, h - 1);
    ctx.fillStyle = INK;
    ctx.font = "11px system-ui, sans-serif";
    ctx.textAlign = "left";
    ctx.textBaseline = "middle";
    for (const [t, end] of marks(sc, yOf, Math.max(3, Math.floor(h / 34)), 16)) {
      const py = yOf(t);
      ctx.beginPath(); ctx.moveTo(x + bw, py); ctx.lineTo(x + bw + (end ? 6 : 4), py); ctx.stroke();
      if (end) {
        const tw = tagSize(ctx, label(t, 4)).w;
        // the tag sits beside its end, inside the bar's height
        tag(ctx, label(t, 4), x + bw + 6 + tw / 2, Math.min(Math.max(py, top + TAG_H / 2), top + h - TAG_H / 2));
        ctx.font = "11px system-ui, sans-serif";
        ctx.textAlign = "left";
        ctx.textBaseline = "middle";
        ctx.fillStyle = INK;
      } else {
        ctx.fillText(label(t, 3), x + bw + 7, py);
      }
    }
    ctx.textBaseline = "top";
    ctx.font = "11px system-ui, sans-serif";
    ctx.fillText(unitText ? "[" + unitText + "]" : "", x, top + h + 8);
    ctx.fillStyle = "#5b5f68";
    ctx.fillText(u.value || "", x, top + h + 22);
    canvas.dataset.power = String(p);
  }

  // across strokes a thin line across the bar at every level inside the
  // scale (the isolines of the picture); line(t) adds one to the path.
  function across(ctx, sc, levels, line) {
    if (!levels || !levels.length) return;
    ctx.beginPath();
    for (const t of levels) if (t > Math.min(sc.lo, sc.hi) && t < Math.max(sc.lo, sc.hi)) line(t);
    ctx.lineWidth = 1;
    ctx.strokeStyle = "rgba(20, 24, 32, 0.5)";
    ctx.stroke();
  }

  function legendBelow(canvas, sc, box, u, levels, label, unitText) {
    const w = box.cssW, hh = 44;
    const ctx = EW.sizeCanvas(canvas, w, hh);
    canvas.style.width = w + "px";
    ctx.fillStyle = PAPER;
    ctx.fillRect(0, 0, w, hh);
    const x0 = box.x0, bw = box.w, y = 4, bh = 12;
    for (let px = 0; px < bw; px++) {
      ctx.fillStyle = sc.rgb(sc.lo + ((px + 0.5) / bw) * (sc.hi - sc.lo));
      ctx.fillRect(x0 + px, y, 1.5, bh);
    }
    const xOf = (t) => x0 + ((t - sc.lo) / (sc.hi - sc.lo || 1)) * bw;
    across(ctx, sc, levels, (t) => { const px = Math.round(xOf(t)) + 0.5; ctx.moveTo(px, y); ctx.lineTo(px, y + bh); });
    ctx.strokeStyle = INK;
    ctx.lineWidth = 1;
    ctx.strokeRect(x0 + 0.5, y + 0.5, bw - 1, bh - 1);
    ctx.fillStyle = INK;
    ctx.textBaseline = "top";
    for (const [t, end] of marks(sc, xOf, Math.max(3, Math.floor(bw / 70)), 40)) {
      const px = xOf(t);
      ctx.beginPath(); ctx.moveTo(px, y + bh); ctx.lineTo(px, y + bh + 4); ctx.stroke();
      if (end) {
        const tw = tagSize(ctx, label(t, 4)).w;
        tag(ctx, label(t, 4), t === sc.lo ? px + tw / 2 : px - tw / 2, y + bh + 4 + TAG_H / 2);
        ctx.fillStyle = INK;
        ctx.textBaseline = "top";
      } else {
        ctx.font = "11px system-ui, sans-serif";
        ctx.textAlign = "center";
        ctx.fillText(label(t, 3), px, y + bh + 6);
      }
    }
    ctx.textAlign = "right";
    ctx.textBaseline = "top";
    ctx.font = "11px system-ui, sans-serif";
    ctx.fillText(unitText ? "[" + unitText + "]" : "", x0 - 6, y);
  }

  // marks returns the ends, labelled always, and round ticks at least gap
  // pixels from them.
  function marks(sc, pos, n, gap) {
    const list = [[sc.hi, true], [sc.lo, true]];
    if (!(sc.hi > sc.lo)) return [[sc.hi, true]];
    for (const t of EW.niceTicks(sc.lo, sc.hi, n)) {
      if (Math.abs(pos(t) - pos(sc.hi)) > gap && Math.abs(pos(t) - pos(sc.lo)) > gap) list.push([t, false]);
    }
    return list;
  }

  EW.tag = tag;
  EW.tagSize = tagSize;
  EW.colour = { scale, paint, legend };
})();
