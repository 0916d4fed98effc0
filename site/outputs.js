// edgewise outputs: everything that gets results and projects out of the
// page and back in, with no server. This file has the downloads (project
// JSON, field CSV, probes CSV, SVG and PNG pictures), opening a project
// file (picker or drop), a new project from the demo, embed mode's one
// line of results, and the panel that holds them with the parts in
//
//   share.js     share links and embed mode (#z=<text>, &embed)
//   autosave.js  autosave and the choice of the first project
//   report.js    the printable report
//   checks.js    the published checks run in the browser
//   notice.js    the line where these speak to the user
//
// Security: no user text ever becomes markup or code. Every element is
// built with createElement and textContent; the engine's SVG is shown only
// as an image (blob: URL). All errors from storage, clipboard and streams
// are caught: the page keeps working without them.
"use strict";
(function () {
  const EW = (window.edgewiseParts = window.edgewiseParts || {});
  const api = window.edgewise;
  if (!api || !EW.share) return; // the page did not start; nothing to add
  const { el, save, slug } = EW.dom;
  const { tell, act, call } = EW.notice;
  const share = EW.share;
  const { embed, controls } = share;
  const root = document.documentElement;
  const panel = document.getElementById("outputs");
  const MAX_FILE = 1 << 20; // bytes of a project file

  // ---- downloads ----

  async function download(kind, options) {
    const p = api.project();
    if (!p) throw new Error("there is no project yet");
    const r = await call("export", kind, JSON.stringify(EW.solving.forEngine(p)), EW.report.options(p, options));
    save(r.name, r.mime, r.text);
    return r.name;
  }

  function downloadProject() {
    const p = api.project();
    if (!p) throw new Error("there is no project yet");
    save(slug(p.title) + ".edgewise.json", "application/json", JSON.stringify(p, null, 2) + "\n");
  }

  async function svgImage(svgText) {
    const url = URL.createObjectURL(new Blob([svgText], { type: "image/svg+xml" }));
    try {
      const img = new Image();
      img.decoding = "sync";
      await new Promise((resolve, reject) => {
        img.onload = resolve;
        img.onerror = () => reject(new Error("the picture could not be drawn"));
        img.src = url;
      });
      return img;
    } finally {
      setTimeout(() => URL.revokeObjectURL(url), 1000);
    }
  }

  // PNG: the engine's SVG drawn onto a canvas of the chosen width.
  async function downloadPNG(width) {
    const p = api.project();
    if (!p) throw new Error("there is no project yet");
    const r = await call("export", "svg", JSON.stringify(EW.solving.forEngine(p)), EW.report.options(p, { pixel_width: 640 }));
    const img = await svgImage(r.text);
    const w0 = img.naturalWidth || img.width, h0 = img.naturalHeight || img.height;
    const scale = width / w0;
    const c = document.createElement("canvas");
    c.width = Math.round(w0 * scale);
    c.height = Math.round(h0 * scale);
    const ctx = c.getContext("2d");
    ctx.fillStyle = "#fff";
    ctx.fillRect(0, 0, c.width, c.height);
    ctx.drawImage(img, 0, 0, c.width, c.height);
    const blob = await new Promise((resolve, reject) => {
      try {
        c.toBlob((b) => (b ? resolve(b) : reject(new Error("the browser could not make the PNG"))), "image/png");
      } catch (e) {
        reject(e);
      }
    });
    const name = r.name.replace(/\.svg$/, "-" + c.width + "px.png");
    save(name, "image/png", blob);
    return name;
  }

  // ---- opening a project file ----

  async function openFile(file) {
    if (!file) return;
    const name = file.name || "the file";
    let p;
    try {
      if (file.size > MAX_FILE) throw new Error("it is larger than 1 MB; a project file is a few kB");
      p = await EW.solving.check(await file.text());
    } catch (e) {
      tell("Not opened: " + name + ": " + e.message + ". Your current project is unchanged.", "error");
      return;
    }
    try {
      await api.load(p);
    } catch (e) {
      if (!e.cancelled) tell("Not opened: " + name + " did not solve: " + e.message + ". Your current project is unchanged.", "error");
      return;
    }
    tell("Opened " + name + ".", "info");
    share.clearFragment();
  }

  document.addEventListener("dragover", (ev) => {
    if (embed || !ev.dataTransfer || ![...ev.dataTransfer.types].includes("Files")) return;
    ev.preventDefault();
    ev.dataTransfer.dropEffect = "copy";
    root.classList.add("ew-dragging");
  });
  document.addEventListener("dragleave", (ev) => {
    if (ev.target === document.documentElement || !ev.relatedTarget) root.classList.remove("ew-dragging");
  });
  document.addEventListener("drop", (ev) => {
    root.classList.remove("ew-dragging");
    if (embed || !ev.dataTransfer || !ev.dataTransfer.files.length) return;
    ev.preventDefault();
    openFile(ev.dataTransfer.files[0]);
  });

  // ---- a new project from the demo ----

  async function startFromDemo() {
    const before = api.project();
    const demo = await window.edgewiseInternal.demo();
    await api.load(demo);
    share.clearFragment();
    if (before) {
      tell("Started a new project from the demo.", "info", {
        id: "ew-undo-demo", text: "Undo",
        run: async () => {
          try {
            await api.load(before);
            tell("Restored the previous project.", "info");
          } catch (e) {
            tell("Could not restore: " + e.message, "error");
          }
        },
      });
    }
  }

  // ---- the compact results line (embed mode) ----

  const compactEl = el("p", { id: "ew-compact", class: "ew-compact" });
  function compactLine(d) {
    if (!d || !d.result) return;
    const r = d.result;
    const u = (EW.unitsets || {})[d.project && d.project.physics] || {};
    const unit = EW.conv(u, "value").unit ? " " + EW.conv(u, "value").unit : ""; // display units (measure.js)
    const n = (v) => (typeof v === "number" && isFinite(v) ? Number(EW.dv(u, "value", v).toPrecision(4)).toString() : "—");
    const parts = [
      "min " + n(r.min.value) + unit,
      "max " + n(r.max.value) + unit,
      "mean " + n(r.mean) + unit,
    ];
    for (const p of (r.probes || []).slice(0, 4)) parts.push(p.label + " " + n(p.value) + unit);
    const title = d.project && d.project.title ? d.project.title + ": " : "";
    compactEl.replaceChildren(title + parts.join(" · ") + " ");
    if (embed) {
      compactEl.append(el("a", { href: share.pageURL() + share.fragmentFor(JSON.stringify(d.project)), target: "_blank", rel: "noopener", text: "open in edgewise" }));
    }
  }

  // ---- the panel ----

  const button = (id, text, fn, title) => el("button", { type: "button", id, text, title, onclick: () => act(fn) });
  const fileInput = el("input", { id: "ew-open-input", type: "file", accept: ".json,application/json", class: "ew-file" });
  fileInput.addEventListener("change", () => {
    const f = fileInput.files && fileInput.files[0];
    fileInput.value = "";
    if (f) openFile(f);
  });
  const pngWidth = el("select", { id: "ew-png-width", "aria-label": "PNG width in pixels" },
    el("option", { value: "800", text: "800 px" }),
    el("option", { value: "1600", text: "1600 px", selected: true }),
    el("option", { value: "3200", text: "3200 px" }));

  panel.replaceChildren(
    el("h2", { text: "Save, share and check" }),
    el("div", { class: "ew-row", role: "group", "aria-label": "Project file" },
      el("span", { class: "ew-label", text: "Project" }),
      button("ew-dl-project", "Download project", downloadProject, "The project as an edgewise JSON file"),
      el("label", { class: "ew-button", for: "ew-open-input", tabindex: "0", text: "Open project…" }), fileInput,
      button("ew-new", "New from demo", startFromDemo, "Replace the project with the demo (you can undo)")),
    el("div", { class: "ew-row", role: "group", "aria-label": "Result downloads" },
      el("span", { class: "ew-label", text: "Results" }),
      button("ew-dl-field", "Field CSV", () => download("field-csv"), "Every grid point: x, y, value, gradient and flux"),
      button("ew-dl-probes", "Probes CSV", () => download("probes-csv"), "Value, gradient and flux at the probes"),
      button("ew-dl-edges", "Edges CSV", () => download("edges-csv"), "Each edge's parts: where they run, their kind, flow and mean"),
      button("ew-dl-svg", "SVG picture", () => download("svg", { pixel_width: 800 }), "Vector isolines and legend"),
      button("ew-dl-png", "PNG picture", () => downloadPNG(Number(pngWidth.value)), "A raster picture at the chosen width"), pngWidth,
      button("ew-report-btn", "Report…", EW.report.open, "A printable report: print it or save it as PDF")),
    el("div", { class: "ew-row", role: "group", "aria-label": "Share" },
      el("span", { class: "ew-label", text: "Share" }),
      controls.linkBox,
      button("ew-copy-link", "Copy link", controls.copyLink, "The whole project travels in the link")),
    controls.hostedNote,
    el("details", { class: "ew-embed-snippet" },
      el("summary", { text: "Embed in a wiki page" }),
      el("p", { class: "ew-hint", text: "Paste this into a page that allows iframes. It shows only the field, the legend and one line of results." }),
      controls.embedBox),
    EW.notice.el,
    EW.checks.box,
    compactEl);
  const labelButton = panel.querySelector("label.ew-button");
  labelButton.addEventListener("keydown", (ev) => {
    if (ev.key === "Enter" || ev.key === " ") { ev.preventDefault(); fileInput.click(); }
  });
  controls.showLink();
  if (embed) document.title = "edgewise (embedded)";

  EW.store.on("solved", compactLine);

  // For scripts and tests.
  window.edgewiseOutputs = {
    readFragment: share.readFragment, openReport: EW.report.open, closeReport: EW.report.close, runChecks: EW.checks.run,
    autosaveKey: EW.autosave.key, unreadableKey: EW.autosave.unreadableKey, unsolvedKey: EW.autosave.unsolvedKey,
  };
})();
