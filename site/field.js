// edgewise page: the picture. Draws the solved field on the canvas #field
// (heat map in the engine's colours (colour.js), labelled isolines,
// optional flux arrows, axes to scale, probes, the profile line) with its
// legend, and handles the pointer and the keyboard on it: the readout
// (readout.js), pinning probes and drawing the profile line (profile.js).
// Entry point: EW.show(solve); EW.showProbes(list) moves only the probes.
"use strict";
(function () {
  const EW = (window.edgewiseParts = window.edgewiseParts || {});
  const $ = (id) => document.getElementById(id);
  const canvas = $("field");
  const legend = $("legend");
  const profileCanvas = $("profile");
  const INK = "#1b2029";
  const PAPER = "#fbfaf6";
  const PROBE_FONT = "600 11px system-ui, sans-serif";

  let S = null; // the shown solve: {project, result, units, nx, ny, w, h, u, ux, uy, levels, segs, ends, labels, kx, ky}
  let box = null; // plot area in CSS pixels {x0, y0, w, h, scaled}
  let base = null; // offscreen canvas: everything but the pointer layer
  let heat = null; // offscreen canvas: the heat map, one pixel per node
  let map = null; // the colour scale (EW.colour.scale)
  let cursor = null; // {x, y} in field coordinates (pointer or keyboard)
  let profile = null; // {a: {x, y}, b: {x, y}}
  let profileMode = false;
  let drag = null;
  const opts = { iso: true, arrows: false, colours: "auto", stretch: false };

  // ---- sampling ----

  // sample interpolates the value and gradient at (x, y) bilinearly from
  // the output grid.
  function sample(x, y) {
    const { nx, ny, w, h } = S;
    const fi = Math.min(Math.max((x / w) * nx, 0), nx);
    const fj = Math.min(Math.max((y / h) * ny, 0), ny);
    const i = Math.min(Math.floor(fi), nx - 1), j = Math.min(Math.floor(fj), ny - 1);
    const a = fi - i, b = fj - j;
    const k = j * (nx + 1) + i;
    const lerp = (arr) =>
      (1 - b) * ((1 - a) * arr[k] + a * arr[k + 1]) + b * ((1 - a) * arr[k + nx + 1] + a * arr[k + nx + 2]);
    return { u: lerp(S.u), ux: lerp(S.ux), uy: lerp(S.uy) };
  }
  EW.sample = (x, y) => (S ? sample(x, y) : null);

  // ---- colour ----

  function chooseMap() {
    map = EW.colour.scale(S.result, opts.colours);
  }
  EW.colourMap = () => map && { mode: map.mode, map: map.map, lo: map.lo, hi: map.hi, table: map.table };

  // own tells whether the picture shows the engine's own colour choice,
  // the one every download uses.
  function own(r) {
    const auto = EW.colour.scale(r, "auto");
    return map.mode === auto.mode && map.lo === auto.lo && map.hi === auto.hi;
  }

  function buildHeat() {
    heat = heat || document.createElement("canvas");
    EW.colour.paint(heat, S, map);
  }

  // ---- layout ----

  let horizontal = false; // legend under the picture (narrow screens)

  // A rectangle drawn to scale thinner than THIN px gets the offer of a
  // stretched view; stretched, its short side is drawn STRETCH of the long
  // one (at most the height the page allows), and the picture says so.
  const THIN = 110;
  const STRETCH = 0.4;

  function layout() {
    const stage = canvas.parentElement.parentElement;
    horizontal = stage.clientWidth < 560;
    stage.classList.toggle("narrow", horizontal);
    legend.style.width = horizontal ? "100%" : "96px";
    const wrap = canvas.parentElement;
    const cssW = Math.max(200, wrap.clientWidth);
    const m = { l: 54, r: 14, t: 14, b: 40 };
    const W = S.w, H = S.h;
    const availW = cssW - m.l - m.r;
    const maxH = Math.max(150, Math.min(window.innerHeight * 0.58, 540));
    let w = availW, h = (availW * H) / W, scaled = true;
    if (h > maxH) { h = maxH; w = (h * W) / H; }
    const thin = Math.min(w, h) < THIN;
    $("opt-stretch-box").hidden = !thin;
    let stretch = 1; // how much the short side is drawn longer than to scale
    if (thin && opts.stretch) {
      m.t = 30; // room for the "not to scale" note above the picture
      if (h < w) { const h2 = Math.min(maxH, Math.max(THIN, STRETCH * w)); stretch = h2 / h; h = h2; }
      else { const w2 = Math.min(availW, Math.max(THIN, STRETCH * h)); stretch = w2 / w; w = w2; }
      scaled = false;
    }
    if (h < 48) { stretch *= 48 / h; h = 48; scaled = false; }
    if (w < 48) { stretch *= 48 / w; w = 48; scaled = false; }
    const x0 = m.l + (availW - w) / 2;
    box = { x0, y0: m.t, w, h, scaled, stretch, tall: h >= w, cssW, cssH: h + m.t + m.b };
    canvas.dataset.scale = scaled ? "true" : "stretched " + stretch.toFixed(2);
  }
  const X = (x) => box.x0 + (x / S.w) * box.w;
  const Y = (y) => box.y0 + (1 - y / S.h) * box.h;
  const fromScreen = (px, py) => ({
    x: ((px - box.x0) / box.w) * S.w,
    y: (1 - (py - box.y0) / box.h) * S.h,
  });

  const size = EW.sizeCanvas;

  // ---- drawing ----

  function drawBase() {
    base = base || document.createElement("canvas");
    const ctx = size(base, box.cssW, box.cssH);
    ctx.fillStyle = PAPER;
    ctx.fillRect(0, 0, box.cssW, box.cssH);
    ctx.imageSmoothingEnabled = true;
    ctx.imageSmoothingQuality = "high";
    ctx.drawImage(heat, box.x0, box.y0, box.w, box.h);
    ctx.save();
    ctx.beginPath();
    ctx.rect(box.x0, box.y0, box.w, box.h);
    ctx.clip();
    if (opts.iso && S.levels) drawIsolines(ctx);
    if (EW.drawFlowNet) EW.drawFlowNet(ctx, S, X, Y); // answers.js
    if (opts.arrows) drawArrows(ctx);
    ctx.restore();
    ctx.strokeStyle = INK;
    ctx.lineWidth = 1.5;
    ctx.strokeRect(box.x0, box.y0, box.w, box.h);
    if (EW.parts) EW.parts.mark(ctx, S.project, X, Y); // each edge's parts along the outline (segments.js)
    drawAxes(ctx);
  }

  function levelDigits() {
    const L = S.levels;
    if (!L || L.length < 2) return 4;
    const step = Math.abs(L[1] - L[0]);
    const big = Math.max(Math.abs(L[0]), Math.abs(L[L.length - 1]));
    return Math.max(2, Math.min(6, Math.ceil(Math.log10(big / step + 1e-12)) + 1));
  }

  function drawIsolines(ctx) {
    const { segs, ends, labels, levels } = S;
    ctx.lineWidth = 1;
    ctx.strokeStyle = "rgba(20, 24, 32, 0.6)";
    ctx.beginPath();
    for (let k = 0; k < segs.length; k += 4) {
      ctx.moveTo(X(segs[k]), Y(segs[k + 1]));
      ctx.lineTo(X(segs[k + 2]), Y(segs[k + 3]));
    }
    ctx.stroke();
    if (!ends) return;
    // labels: upright tags set on the line (EW.tag), never over a probe and
    // its name, never over another label
    const digits = levelDigits();
    const keepOut = probeBoxes(ctx);
    const placed = [];
    const hit = (a, b) => a.x < b.x + b.w && b.x < a.x + a.w && a.y < b.y + b.h && b.y < a.y + a.h;
    for (let k = 0; k < labels.length; k += 4) {
      const px = X(labels[k]), py = Y(labels[k + 1]);
      const text = EW.num(EW.dv(S.units, "value", levels[labels[k + 3]]), digits);
      const { w, h } = EW.tagSize(ctx, text);
      const r = { x: px - w / 2 - 3, y: py - h / 2 - 3, w: w + 6, h: h + 6 };
      if (r.x < box.x0 + 2 || r.x + r.w > box.x0 + box.w - 2 || r.y < box.y0 + 2 || r.y + r.h > box.y0 + box.h - 2) continue;
      if (placed.some((q) => hit(q, r)) || keepOut.some((q) => hit(q, r))) continue;
      placed.push(r);
      EW.tag(ctx, text, px, py);
    }
    S.labelBoxes = placed;
  }

  // probeBoxes returns the boxes the probe markers and their names take,
  // in CSS pixels (drawTop draws them: a ring of radius 4.5 and the name
  // to its upper right).
  function probeBoxes(ctx) {
    ctx.save();
    ctx.font = PROBE_FONT;
    const out = (S.project.probes || []).map((p) => {
      const px = X(p.x), py = Y(p.y);
      const tw = ctx.measureText(p.label || "").width;
      return { x: px - 7, y: py - 17, w: tw + 16, h: 24 };
    });
    ctx.restore();
    return out;
  }

  function drawArrows(ctx) {
    const n = 16;
    const cell = Math.max(box.w, box.h) / n;
    const cols = Math.max(1, Math.round(box.w / cell)), rows = Math.max(1, Math.round(box.h / cell));
    const pts = [];
    let qmax = 0;
    for (let j = 0; j < rows; j++) {
      for (let i = 0; i < cols; i++) {
        const x = ((i + 0.5) / cols) * S.w, y = ((j + 0.5) / rows) * S.h;
        const g = sample(x, y);
        const qx = -S.kx * g.ux, qy = -S.ky * g.uy;
        const q = Math.hypot(qx, qy);
        if (q > qmax) qmax = q;
        pts.push([x, y, qx, qy, q]);
      }
    }
    if (!(qmax > 0)) return;
    // scale by the 90th percentile, so that singular corners do not shrink
    // every other arrow to nothing; larger ones are drawn at full length
    const mags = pts.map((p) => p[4]).sort((a, b) => a - b);
    const qref = mags[Math.floor(0.9 * (mags.length - 1))] || qmax;
    const len = 0.85 * Math.min(box.w / cols, box.h / rows);
    for (const [x, y, qx, qy, q] of pts) {
      const l = len * Math.min(1, q / qref);
      if (l < 2) continue;
      const dx = (qx / q) * l, dy = (-qy / q) * l; // screen y down
      const cx = X(x), cy = Y(y);
      const x1 = cx - dx / 2, y1 = cy - dy / 2, x2 = cx + dx / 2, y2 = cy + dy / 2;
      const hl = Math.min(6, l * 0.4), a = Math.atan2(dy, dx);
      for (const [style, width] of [["rgba(251,250,246,0.85)", 3], [INK, 1.2]]) {
        ctx.strokeStyle = style;
        ctx.lineWidth = width;
        ctx.beginPath();
        ctx.moveTo(x1, y1);
        ctx.lineTo(x2, y2);
        ctx.moveTo(x2 - hl * Math.cos(a - 0.45), y2 - hl * Math.sin(a - 0.45));
        ctx.lineTo(x2, y2);
        ctx.lineTo(x2 - hl * Math.cos(a + 0.45), y2 - hl * Math.sin(a + 0.45));
        ctx.stroke();
      }
    }
  }

  function drawAxes(ctx) {
    const { unit: lu, scale: ls } = EW.conv(S.units, "length"); // ticks round in the display unit
    ctx.fillStyle = INK;
    ctx.strokeStyle = INK;
    ctx.lineWidth = 1;
    ctx.font = "11px system-ui, sans-serif";
    ctx.textAlign = "center";
    ctx.textBaseline = "top";
    const xt = EW.niceTicks(0, S.w * ls, Math.max(2, Math.floor(box.w / 80)));
    for (const t of xt) {
      const px = X(t / ls);
      ctx.beginPath(); ctx.moveTo(px, box.y0 + box.h); ctx.lineTo(px, box.y0 + box.h + 4); ctx.stroke();
      ctx.fillText(EW.num(t, 3), px, box.y0 + box.h + 6);
    }
    ctx.fillText("x [" + lu + "]" + (box.scaled ? "" : "   (not to scale)"), box.x0 + box.w / 2, box.y0 + box.h + 22);
    if (!box.scaled && box.y0 >= 30) {
      // the stretched view says so above the picture, in the warning colour
      const note = "NOT TO SCALE: " + (box.w >= box.h ? "height" : "width") + " drawn " + EW.num(box.stretch, 2) + " × its true size";
      ctx.save();
      ctx.font = "600 11px system-ui, sans-serif";
      ctx.textAlign = "left";
      ctx.textBaseline = "middle";
      const tw = ctx.measureText(note).width;
      ctx.fillStyle = "#fdf3e7";
      ctx.fillRect(box.x0, 6, tw + 14, 18);
      ctx.strokeStyle = "#8a3b12";
      ctx.lineWidth = 1;
      ctx.strokeRect(box.x0 + 0.5, 6.5, tw + 13, 17);
      ctx.fillStyle = "#8a3b12";
      ctx.fillText(note, box.x0 + 7, 15.5);
      ctx.restore();
    }
    ctx.textAlign = "right";
    ctx.textBaseline = "middle";
    const yt = EW.niceTicks(0, S.h * ls, Math.max(2, Math.floor(box.h / 50)));
    for (const t of yt) {
      const py = Y(t / ls);
      ctx.beginPath(); ctx.moveTo(box.x0 - 4, py); ctx.lineTo(box.x0, py); ctx.stroke();
      ctx.fillText(EW.num(t, 3), box.x0 - 6, py);
    }
    ctx.save();
    ctx.translate(12, box.y0 + box.h / 2);
    ctx.rotate(-Math.PI / 2);
    ctx.textAlign = "center";
    ctx.fillText("y [" + lu + "]", 0, 0);
    ctx.restore();
  }

  function drawLegend() {
    // the bar in the display unit: its ends, ticks and level lines converted
    const c = EW.conv(S.units, "value"), to = (v) => v * c.scale + c.offset;
    const shown = { lo: to(map.lo), hi: to(map.hi), rgb: (t) => map.rgb((t - c.offset) / c.scale) };
    EW.colour.legend(legend, c.scale === 1 && !c.offset ? map : shown, box, horizontal, EW.shownUnits(S.units), opts.iso && S.levels ? S.levels.map(to) : null);
  }

  // drawTop copies the base and adds what follows the pointer: probes, the
  // cursor and the profile line.
  function drawTop() {
    const ctx = size(canvas, box.cssW, box.cssH);
    ctx.drawImage(base, 0, 0, box.cssW, box.cssH);
    const probes = (S.project.probes || []);
    ctx.font = PROBE_FONT;
    ctx.textAlign = "left";
    ctx.textBaseline = "bottom";
    probes.forEach((p) => {
      const px = X(p.x), py = Y(p.y);
      ctx.beginPath();
      ctx.arc(px, py, 4.5, 0, 2 * Math.PI);
      ctx.fillStyle = PAPER;
      ctx.fill();
      ctx.lineWidth = 2;
      ctx.strokeStyle = INK;
      ctx.stroke();
      ctx.lineWidth = 3;
      ctx.strokeStyle = "rgba(251,250,246,0.9)";
      ctx.strokeText(p.label || "", px + 6, py - 3);
      ctx.fillStyle = INK;
      ctx.fillText(p.label || "", px + 6, py - 3);
    });
    if (profile && $("profile-box").open) {
      const ax = X(profile.a.x), ay = Y(profile.a.y), bx = X(profile.b.x), by = Y(profile.b.y);
      for (const [style, width] of [["rgba(251,250,246,0.95)", 4], ["#7a1f4d", 2]]) {
        ctx.strokeStyle = style;
        ctx.lineWidth = width;
        ctx.setLineDash(width === 2 ? [6, 4] : []);
        ctx.beginPath(); ctx.moveTo(ax, ay); ctx.lineTo(bx, by); ctx.stroke();
      }
      ctx.setLineDash([]);
      ctx.fillStyle = "#7a1f4d";
      for (const [px, py, t] of [[ax, ay, "A"], [bx, by, "B"]]) {
        ctx.beginPath(); ctx.arc(px, py, 3.5, 0, 2 * Math.PI); ctx.fill();
        ctx.fillText(t, px + 5, py - 4);
      }
    }
    if (cursor) {
      const px = X(cursor.x), py = Y(cursor.y);
      ctx.strokeStyle = "rgba(20,24,32,0.8)";
      ctx.lineWidth = 1;
      ctx.beginPath();
      ctx.moveTo(px - 9, py); ctx.lineTo(px - 3, py);
      ctx.moveTo(px + 3, py); ctx.lineTo(px + 9, py);
      ctx.moveTo(px, py - 9); ctx.lineTo(px, py - 3);
      ctx.moveTo(px, py + 3); ctx.lineTo(px, py + 9);
      ctx.stroke();
    }
  }

  function summarise() {
    const r = S.result, u = S.units || {}, d = EW.shownUnits(u);
    const q = EW.capital(u.value || "value");
    const unit = d.value_unit ? " " + d.value_unit : "";
    const L = d.length_unit, len = (v, p) => EW.num(EW.dv(u, "length", v), p);
    const text = q + " in a " + len(S.w) + " " + L + " × " + len(S.h) + " " + L + " rectangle: from " +
      EW.value(r.min.value, 4, u) + unit + " at (" + len(r.min.x, 3) + ", " + len(r.min.y, 3) + ") to " +
      EW.value(r.max.value, 4, u) + unit + " at (" + len(r.max.x, 3) + ", " + len(r.max.y, 3) + "), mean " +
      EW.value(r.mean, 4, u) + unit + ". " + (S.levels ? S.levels.length + " isolines. " : "") +
      "Colours: " + (map.mode === "diverging" ? "two-sided about zero" : "dark for low, light for high") +
      (own(S.result) ? "" : " (chosen here; the SVG, PNG and report use the automatic colours)") + "." +
      (box.scaled ? "" : " Not to scale: the " + (box.w >= box.h ? "height" : "width") + " is drawn " + EW.num(box.stretch, 2) + " × its true size.") +
      (opts.arrows ? " Arrows: direction of the " + (u.flux || "flux") + ", length in proportion up to the 90th percentile of its size." : "");
    canvas.setAttribute("aria-label", "Picture of the field. " + text);
    $("field-summary").textContent = text;
  }

  // ---- readout ----

  function readout(x, y) {
    const on = S && x >= 0 && y >= 0 && x <= S.w && y <= S.h;
    EW.readout($("readout"), S, x, y, on ? sample(x, y) : null);
  }

  // ---- profile ----

  function drawProfile() {
    EW.plotProfile(profileCanvas, S, profile, sample);
  }

  function setProfileInputs() {
    const ls = EW.conv(S && S.units, "length").scale; // the ends in the display length unit
    $("pf-x0").value = EW.num(profile.a.x * ls, 4).replace("−", "-");
    $("pf-y0").value = EW.num(profile.a.y * ls, 4).replace("−", "-");
    $("pf-x1").value = EW.num(profile.b.x * ls, 4).replace("−", "-");
    $("pf-y1").value = EW.num(profile.b.y * ls, 4).replace("−", "-");
  }

  function readProfileInputs() {
    if (drag) return; // a blur while drawing on the picture: the drawing wins
    const ls = EW.conv(S && S.units, "length").scale;
    const v = ["pf-x0", "pf-y0", "pf-x1", "pf-y1"].map((id) => Number($(id).value.trim()) / ls);
    if (v.some((n) => !Number.isFinite(n)) || !S) return;
    const cx = (t) => Math.min(Math.max(t, 0), S.w), cy = (t) => Math.min(Math.max(t, 0), S.h);
    profile = { a: { x: cx(v[0]), y: cy(v[1]) }, b: { x: cx(v[2]), y: cy(v[3]) } };
    drawTop();
    drawProfile();
  }

  // ---- events ----

  function pointerAt(ev) {
    const r = canvas.getBoundingClientRect();
    return fromScreen(ev.clientX - r.left, ev.clientY - r.top);
  }
  const inside = (p) => S && p.x >= 0 && p.y >= 0 && p.x <= S.w && p.y <= S.h;

  canvas.addEventListener("pointermove", (ev) => {
    if (!S) return;
    const p = pointerAt(ev);
    if (drag) {
      profile.b = { x: Math.min(Math.max(p.x, 0), S.w), y: Math.min(Math.max(p.y, 0), S.h) };
      drawTop();
      drawProfile();
      return;
    }
    cursor = inside(p) ? p : null;
    readout(p.x, p.y);
    drawTop();
  });
  canvas.addEventListener("pointerleave", () => {
    if (!S || drag) return;
    cursor = null;
    drawTop();
  });
  canvas.addEventListener("pointerdown", (ev) => {
    dragged = false;
    if (!S || !profileMode) return;
    const p = pointerAt(ev);
    if (!inside(p)) return;
    canvas.setPointerCapture(ev.pointerId);
    drag = true;
    profile = { a: p, b: { x: p.x, y: p.y } };
    $("profile-box").open = true;
  });
  let dragged = false; // the click after a drawn line is not a pin
  canvas.addEventListener("pointerup", () => {
    if (!drag) return;
    drag = null;
    dragged = true;
    setProfileMode(false);
    setProfileInputs();
    drawTop();
    drawProfile();
  });
  canvas.addEventListener("click", (ev) => {
    if (dragged) {
      dragged = false;
      return;
    }
    if (!S || profileMode) return;
    const p = pointerAt(ev);
    if (inside(p) && !ev.defaultPrevented) EW.pin && EW.pin(p.x, p.y);
  });
  canvas.addEventListener("keydown", (ev) => {
    if (!S) return;
    const step = (ev.shiftKey ? 0.005 : 0.025);
    if (!cursor) cursor = { x: S.w / 2, y: S.h / 2 };
    const moves = { ArrowLeft: [-1, 0], ArrowRight: [1, 0], ArrowUp: [0, 1], ArrowDown: [0, -1] };
    if (moves[ev.key]) {
      const [dx, dy] = moves[ev.key];
      cursor = {
        x: Math.min(Math.max(cursor.x + dx * step * S.w, 0), S.w),
        y: Math.min(Math.max(cursor.y + dy * step * S.h, 0), S.h),
      };
    } else if (ev.key === "Enter" || ev.key === " ") {
      EW.pin && EW.pin(cursor.x, cursor.y);
    } else {
      return;
    }
    ev.preventDefault();
    readout(cursor.x, cursor.y);
    // keyboard users hear the reading (pointer moves stay silent)
    $("readout-live").textContent = $("readout").textContent;
    drawTop();
  });
  canvas.addEventListener("blur", () => {
    if (!S) return;
    cursor = null;
    drawTop();
  });

  function setProfileMode(on) {
    profileMode = on;
    const b = $("btn-profile");
    b.setAttribute("aria-pressed", String(on));
    b.textContent = on ? "Drag from A to B on the picture…" : "Profile line…";
    canvas.classList.toggle("picking", on);
    if (on) $("profile-box").open = true;
  }
  $("btn-profile").addEventListener("click", () => setProfileMode(!profileMode));
  document.addEventListener("keydown", (ev) => {
    if (ev.key === "Escape" && profileMode && !drag) setProfileMode(false);
  });
  for (const id of ["pf-x0", "pf-y0", "pf-x1", "pf-y1"]) $(id).addEventListener("change", readProfileInputs);
  $("profile-box").addEventListener("toggle", () => {
    if (!S) return;
    drawTop();
    if ($("profile-box").open) drawProfile();
  });

  $("opt-iso").addEventListener("change", (e) => { opts.iso = e.target.checked; redraw(); });
  $("opt-arrows").addEventListener("change", (e) => { opts.arrows = e.target.checked; redraw(); });
  $("opt-stretch").addEventListener("change", (e) => { opts.stretch = e.target.checked; redraw(); });
  $("opt-colours").addEventListener("change", (e) => { opts.colours = e.target.value; redraw(true); });
  let resizeTimer = 0;
  window.addEventListener("resize", () => {
    clearTimeout(resizeTimer);
    resizeTimer = setTimeout(() => redraw(), 80);
  });

  function redraw(recolour) {
    if (!S) return;
    if (recolour) { chooseMap(); buildHeat(); }
    layout();
    drawBase();
    drawTop();
    drawLegend();
    summarise();
    if ($("profile-box").open) drawProfile();
    document.documentElement.dataset.drawn = String(Number(document.documentElement.dataset.drawn || 0) + 1);
  }

  // show draws a new solve. Probes and profile keep their places.
  EW.show = function (solve) {
    const first = !S;
    S = solve;
    EW.setAccuracy(S.result);
    if (first || !profile) {
      profile = { a: { x: 0, y: S.h / 2 }, b: { x: S.w, y: S.h / 2 } };
    } else {
      const c = (p) => ({ x: Math.min(p.x, S.w), y: Math.min(p.y, S.h) });
      profile = { a: c(profile.a), b: c(profile.b) };
    }
    setProfileInputs();
    redraw(true);
    if (cursor) readout(cursor.x, cursor.y);
  };
  // showProbes redraws the probe markers of the project.
  EW.showProbes = function (probes) {
    if (!S) return;
    S.project = Object.assign({}, S.project, { probes });
    drawBase(); // isoline labels make room for the probes
    drawTop();
  };
  // pictureBoxes returns where the isoline labels and the probes (with
  // their names) sit on the canvas, in CSS pixels {x, y, w, h}.
  EW.pictureBoxes = () => (S && base ? { labels: S.labelBoxes || [], probes: probeBoxes(base.getContext("2d")), plot: box } : null);
  // screenOf maps field coordinates to CSS pixels on the canvas.
  EW.screenOf = (x, y) => [X(x), Y(y)];
  EW.canvases = () => ({ field: canvas, legend, profile: profileCanvas });
})();
