// edgewise outputs: everything that gets results and projects out of the
// page and back in, with no server.
//
//   downloads   project JSON, field CSV, probes CSV, SVG and PNG pictures, a
//               printable report (its content made by the engine in Go)
//   opening     a project file from the file picker or dropped on the page;
//               a bad or foreign file is refused and nothing changes
//   share link  the whole project in the URL fragment, deflate-raw
//               compressed and base64url encoded: #z=<text>; window.edgewise.link()
//   embed mode  #z=<text>&embed shows only the field, legend and one line of
//               results, for a wiki iframe
//   autosave    the current project kept in localStorage; a reload restores it
//   checks      the published check cases run in the browser, with a
//               verification record to download
//
// Security: no user text ever becomes markup or code. Every element is
// built with createElement and textContent; the engine's SVG is shown only
// as an image (blob: URL). All errors from storage, clipboard and streams
// are caught: the page keeps working without them.
"use strict";
(function () {
  const internal = window.edgewiseInternal;
  const api = window.edgewise;
  if (!internal || !api) return; // the page did not start; nothing to add
  const root = document.documentElement;
  const panel = document.getElementById("outputs");
  const STORE_KEY = "edgewise.autosave.1";
  const MAX_FILE = 1 << 20; // bytes of a project file or a decompressed link
  const VERIFY_SCHEMA = "edgewise-verification/1";

  // ---- small helpers ----

  function el(tag, props, ...children) {
    const e = document.createElement(tag);
    for (const [k, v] of Object.entries(props || {})) {
      if (v === undefined || v === null || v === false) continue;
      if (k === "text") e.textContent = v;
      else if (k === "class") e.className = v;
      else if (k.startsWith("on")) e.addEventListener(k.slice(2), v);
      else e.setAttribute(k, v === true ? "" : String(v));
    }
    for (const c of children) if (c !== null && c !== undefined) e.append(c);
    return e;
  }

  function slug(title) {
    const s = String(title || "").toLowerCase().replace(/[^\p{L}\p{N}]+/gu, "-").replace(/^-+|-+$/g, "").slice(0, 40);
    return s || "edgewise";
  }

  function projectText(p) {
    return JSON.stringify(p);
  }

  // engine calls a function of the Go engine and throws its error message.
  async function engine(fn, ...args) {
    const m = await internal.call(fn, ...args);
    const v = m.value;
    if (!v || !v.ok) {
      const e = new Error((v && v.error) || "the engine gave no answer");
      e.path = v && v.path;
      throw e;
    }
    return v;
  }

  // save hands a file to the browser's download mechanism.
  function save(name, mime, data) {
    const blob = data instanceof Blob ? data : new Blob([data], { type: mime });
    const url = URL.createObjectURL(blob);
    const a = el("a", { href: url, download: name, class: "ew-hidden" });
    document.body.append(a);
    a.click();
    a.remove();
    setTimeout(() => URL.revokeObjectURL(url), 60000);
  }

  // ---- messages ----

  const notice = el("p", { id: "ew-notice", class: "ew-notice", role: "status", "aria-live": "polite" });
  function tell(text, kind) {
    notice.replaceChildren(text);
    notice.className = "ew-notice" + (kind ? " " + kind : "");
    notice.dataset.kind = kind || "info";
  }
  function tellWithUndo(text, undo) {
    tell(text, "info");
    const b = el("button", { type: "button", class: "ew-link-button", text: "Undo", onclick: () => { undo(); } });
    notice.append(" ", b);
  }

  // ---- base64url and compression ----

  function toBase64(bytes) {
    let bin = "";
    for (let i = 0; i < bytes.length; i += 0x8000) {
      bin += String.fromCharCode.apply(null, bytes.subarray(i, i + 0x8000));
    }
    return btoa(bin);
  }
  function toBase64url(bytes) {
    return toBase64(bytes).replace(/\+/g, "-").replace(/\//g, "_").replace(/=+$/, "");
  }

  function fromBase64url(s) {
    if (!/^[A-Za-z0-9_-]*$/.test(s)) throw new Error("the link holds characters that are not base64url");
    const b64 = s.replace(/-/g, "+").replace(/_/g, "/") + "===".slice((s.length + 3) % 4);
    let bin;
    try {
      bin = atob(b64);
    } catch (e) {
      throw new Error("the link's text is not valid base64url");
    }
    return Uint8Array.from(bin, (c) => c.charCodeAt(0));
  }

  async function readLimited(stream, limit) {
    const reader = stream.getReader();
    const parts = [];
    let n = 0;
    for (;;) {
      const { done, value } = await reader.read();
      if (done) break;
      n += value.length;
      if (n > limit) {
        reader.cancel().catch(() => {});
        throw new Error("the link's project is larger than " + limit + " bytes");
      }
      parts.push(value);
    }
    const out = new Uint8Array(n);
    let k = 0;
    for (const p of parts) { out.set(p, k); k += p.length; }
    return out;
  }

  async function deflate(text) {
    const stream = new Blob([new TextEncoder().encode(text)]).stream().pipeThrough(new CompressionStream("deflate-raw"));
    return new Uint8Array(await new Response(stream).arrayBuffer());
  }

  async function inflate(bytes) {
    const stream = new Blob([bytes]).stream().pipeThrough(new DecompressionStream("deflate-raw"));
    try {
      return new TextDecoder("utf-8", { fatal: true }).decode(await readLimited(stream, MAX_FILE));
    } catch (e) {
      if (/larger than/.test(e.message)) throw e;
      throw new Error("the link's data is damaged (it does not decompress)");
    }
  }

  // ---- the fragment ----
  //
  //   #z=<base64url of deflate-raw(project JSON)>   the share link
  //   #j=<base64url of the project JSON>            the same, uncompressed
  //   #p=<percent-encoded project JSON>             the page's first form
  //   &embed                                        embed mode (also alone: #embed)

  function readFragment(hash) {
    const out = { embed: false, key: "", data: "" };
    const h = (hash || "").replace(/^#/, "");
    for (const part of h.split("&")) {
      if (!part) continue;
      const i = part.indexOf("=");
      const k = i < 0 ? part : part.slice(0, i);
      const v = i < 0 ? "" : part.slice(i + 1);
      if (k === "embed") out.embed = v === "" || v === "1";
      else if ((k === "z" || k === "j" || k === "p") && !out.key) { out.key = k; out.data = v; }
    }
    return out;
  }

  async function fragmentProject(f) {
    let text;
    if (f.key === "z") text = await inflate(fromBase64url(f.data));
    else if (f.key === "j") {
      try {
        text = new TextDecoder("utf-8", { fatal: true }).decode(fromBase64url(f.data));
      } catch (e) {
        throw new Error(/base64url/.test(e.message) ? e.message : "the link's text is not UTF-8");
      }
    } else {
      try { text = decodeURIComponent(f.data); } catch (e) { throw new Error("the link's text is not correctly percent-encoded"); }
    }
    if (text.length > MAX_FILE) throw new Error("the link's project is too large");
    return checkedProject(text);
  }

  // checkedProject parses and checks a project text with the engine (as a
  // solve would) and returns the object, or throws a one-line message.
  async function checkedProject(text) {
    let obj;
    try {
      obj = JSON.parse(text);
    } catch (e) {
      throw new Error("not a project file (not JSON: " + e.message + ")");
    }
    if (!obj || typeof obj !== "object" || Array.isArray(obj)) throw new Error("not a project file (no JSON object)");
    if (obj.schema !== "edgewise/1") {
      throw new Error("not an edgewise project (its schema is " + (typeof obj.schema === "string" ? JSON.stringify(obj.schema.slice(0, 40)) : "missing") + ", expected \"edgewise/1\")");
    }
    await engine("validate", text);
    return obj;
  }

  function pageURL() {
    return location.href.split("#")[0];
  }

  // The link for the project on screen. link() must answer at once, so the
  // compressed form is made after every solve and edit and kept; until it
  // is ready the uncompressed (still exact) form is returned.
  const linkCache = { text: null, frag: null };
  function fragmentFor(text) {
    if (linkCache.text === text) return "#z=" + linkCache.frag;
    return "#j=" + toBase64url(new TextEncoder().encode(text));
  }
  let linkJob = 0;
  async function refreshLink(project) {
    const text = projectText(project);
    if (linkCache.text === text) return;
    const job = ++linkJob;
    const frag = toBase64url(await deflate(text));
    if (job !== linkJob && linkCache.text !== null) return; // a newer project is being compressed
    linkCache.text = text;
    linkCache.frag = frag;
    showLink();
  }
  function link() {
    const p = api.project();
    if (!p) return pageURL();
    return pageURL() + fragmentFor(projectText(p));
  }
  api.link = link;
  // linkReady resolves with the compressed link once it is made.
  api.linkReady = async () => {
    const p = api.project();
    if (p) await refreshLink(p);
    return link();
  };

  // ---- autosave ----

  // The store keeps the project as last edited and the last one that
  // solved: {saved, project, solved}. A reload restores the edited one when
  // it checks, else the one that solved.
  let storageOK = true;
  let lastSolved = null;
  function autosave(project, solved) {
    if (embedMode || !project) return;
    if (solved) lastSolved = project;
    try {
      localStorage.setItem(STORE_KEY, JSON.stringify({ saved: new Date().toISOString(), project, solved: lastSolved }));
      storageOK = true;
    } catch (e) {
      if (storageOK) tell("Autosave is not available here (" + (e.name || "storage blocked") + "); download the project to keep it.", "warn");
      storageOK = false;
    }
  }
  function autosaved() {
    try {
      const raw = localStorage.getItem(STORE_KEY);
      if (!raw) return null;
      const v = JSON.parse(raw);
      return v && typeof v === "object" && (v.project || v.solved) ? v : null;
    } catch (e) {
      return null;
    }
  }

  function clearFragment() {
    try {
      history.replaceState(history.state, "", pageURL());
    } catch (e) { /* some contexts refuse; the fragment then stays */ }
  }

  // ---- boot: share link first, then autosave, else the demo ----

  const first = readFragment(location.hash);
  const embedMode = first.embed;
  if (embedMode) root.classList.add("ew-embed");
  let bootFromLink = false;

  // keepPrevious offers the autosaved project back when a link replaces it
  // (opening a link must not lose the work the autosave held).
  function keepPrevious(linked) {
    const saved = autosaved();
    const prev = saved && (saved.project || saved.solved);
    if (embedMode || !prev || projectText(prev) === projectText(linked)) return;
    tell("Opened the project from the link. ", "info");
    notice.append(el("button", {
      type: "button", class: "ew-link-button", id: "ew-restore-previous",
      text: "Go back to your previous project" + (prev.title ? " (" + String(prev.title).slice(0, 60) + ")" : ""),
      onclick: () => act(async () => {
        await api.load(prev);
        tell("Restored your previous project.", "info");
      }),
    }));
  }

  window.edgewiseBoot = async function () {
    if (first.key) {
      try {
        const p = await fragmentProject(first);
        bootFromLink = true;
        keepPrevious(p);
        return p;
      } catch (e) {
        tell("This link's project could not be opened: " + e.message + ". " +
          (autosaved() ? "Showing your last project instead." : "Showing the demo instead."), "error");
        root.dataset.linkError = "1";
      }
    }
    const saved = autosaved();
    if (saved && saved.project) {
      try {
        return await checkedProject(JSON.stringify(saved.project));
      } catch (e) {
        if (saved.solved) {
          try {
            const p = await checkedProject(JSON.stringify(saved.solved));
            tell("Your last edit did not solve (" + e.message + "); restored the last project that did.", "warn");
            return p;
          } catch (_) { /* fall through to the demo */ }
        }
        tell("The autosaved project could not be restored (" + e.message + "); showing the demo.", "warn");
      }
    } else if (saved && saved.solved) {
      try { return await checkedProject(JSON.stringify(saved.solved)); } catch (_) { /* the demo */ }
    }
    return null;
  };

  // A new fragment in the same tab (a pasted link) loads that project.
  window.addEventListener("hashchange", async () => {
    const f = readFragment(location.hash);
    if (!f.key) return;
    try {
      const p = await fragmentProject(f);
      const before = api.project();
      await api.load(p);
      tell("Opened the project from the link.", "info");
      if (before && projectText(before) !== projectText(p)) {
        notice.append(" ", el("button", {
          type: "button", class: "ew-link-button", id: "ew-restore-previous", text: "Undo",
          onclick: () => act(async () => { await api.load(before); tell("Restored the previous project.", "info"); }),
        }));
      }
      if (!embedMode && storageOK) clearFragment();
    } catch (e) {
      tell("This link's project could not be opened: " + e.message + ". Your current project is unchanged.", "error");
      root.dataset.linkError = "1";
    }
  });

  let solvedOnce = false;
  document.addEventListener("edgewise:solved", (ev) => {
    const d = ev.detail || {};
    autosave(d.project, true);
    if (!solvedOnce) {
      solvedOnce = true;
      if (bootFromLink && !embedMode && storageOK) clearFragment();
    }
    refreshLink(d.project).catch(() => {});
    compactLine(d);
  });
  document.addEventListener("edgewise:edited", (ev) => {
    const p = ev.detail && ev.detail.project;
    autosave(p, false);
    if (p) refreshLink(p).catch(() => {});
  });

  // ---- downloads ----

  // gridOptions asks for the output grid of the picture on screen when it
  // shows this project (the page's detail choice), else the project's own.
  function gridOptions(p, extra) {
    const o = Object.assign({}, extra || {});
    const last = internal.last && internal.last();
    if (last && last.project && projectText(last.project) === projectText(p) && last.nx > 0 && last.ny > 0) {
      o.nx = last.nx;
      o.ny = last.ny;
    }
    return JSON.stringify(o);
  }

  async function download(kind, options) {
    const p = api.project();
    if (!p) throw new Error("there is no project yet");
    const r = await engine("export", kind, projectText(p), gridOptions(p, options));
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
    const r = await engine("export", "svg", projectText(p), gridOptions(p, { pixel_width: 640 }));
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
    try {
      if (file.size > MAX_FILE) throw new Error("it is larger than 1 MB; a project file is a few kB");
      const text = await file.text();
      const p = await checkedProject(text);
      await api.load(p);
      tell("Opened " + name + ".", "info");
      clearFragment();
    } catch (e) {
      tell("Not opened: " + name + ": " + e.message + ". Your current project is unchanged.", "error");
    }
  }

  document.addEventListener("dragover", (ev) => {
    if (embedMode || !ev.dataTransfer || ![...ev.dataTransfer.types].includes("Files")) return;
    ev.preventDefault();
    ev.dataTransfer.dropEffect = "copy";
    root.classList.add("ew-dragging");
  });
  document.addEventListener("dragleave", (ev) => {
    if (ev.target === document.documentElement || !ev.relatedTarget) root.classList.remove("ew-dragging");
  });
  document.addEventListener("drop", (ev) => {
    root.classList.remove("ew-dragging");
    if (embedMode || !ev.dataTransfer || !ev.dataTransfer.files.length) return;
    ev.preventDefault();
    openFile(ev.dataTransfer.files[0]);
  });

  // ---- a new project from the demo ----

  async function startFromDemo() {
    const before = api.project();
    const demo = await internal.demo();
    await api.load(demo);
    clearFragment();
    if (before) {
      tellWithUndo("Started a new project from the demo.", async () => {
        try {
          await api.load(before);
          tell("Restored the previous project.", "info");
        } catch (e) {
          tell("Could not restore: " + e.message, "error");
        }
      });
    }
  }

  // ---- the report ----

  const REPORT_CSS = [
    "body{margin:0;font:11pt/1.4 system-ui,sans-serif;color:#1d2330;background:#fff}",
    ".ew-report{max-width:52rem;margin:0 auto;padding:1.5rem}",
    ".ew-report h1{font-size:1.5rem;margin:0 0 .2rem}",
    ".ew-report h2{font-size:1.1rem;margin:1.2rem 0 .4rem;border-bottom:1px solid #c9c3b6}",
    ".ew-report .ew-meta{color:#444;margin:0 0 .8rem}",
    ".ew-report table{border-collapse:collapse;margin:.3rem 0 .8rem;font-variant-numeric:tabular-nums}",
    ".ew-report caption{text-align:left;font-weight:600;padding:.2rem 0}",
    ".ew-report th,.ew-report td{border:1px solid #c9c3b6;padding:.15rem .45rem;text-align:left;vertical-align:top}",
    ".ew-report figure{margin:.5rem 0}",
    ".ew-report img{max-width:100%;height:auto}",
    ".ew-report footer{margin-top:1.5rem;color:#555;font-size:.9em}",
    ".ew-report-link{font-family:ui-monospace,monospace;font-size:.75em;word-break:break-all}",
    "@media print{.ew-report{padding:0;max-width:none}.ew-report table,.ew-report figure{break-inside:avoid}}",
  ].join("\n");

  let reportEl = null;
  let reportData = null;

  function table(t) {
    const tb = el("table", {}, el("caption", { text: t.caption }));
    if (t.head && t.head.length) {
      const tr = el("tr");
      for (const h of t.head) tr.append(el("th", { scope: "col", text: h }));
      tb.append(el("thead", {}, tr));
    }
    const body = el("tbody");
    for (const row of t.rows || []) {
      const tr = el("tr");
      row.forEach((c, i) => tr.append(i === 0 ? el("th", { scope: "row", text: c }) : el("td", { text: c })));
      body.append(tr);
    }
    if (!(t.rows || []).length) body.append(el("tr", {}, el("td", { colspan: String((t.head || [""]).length), text: "none" })));
    tb.append(body);
    return tb;
  }

  function list(tag, items, empty) {
    if (!items || !items.length) return el("p", { text: empty });
    const l = el(tag);
    for (const s of items) l.append(el("li", { text: s }));
    return l;
  }

  // reproduceLink is the share link of p (compressed when it is ready).
  function reproduceLink(p) {
    return pageURL() + fragmentFor(projectText(p));
  }

  function closeReport() {
    if (reportEl) {
      for (const img of reportEl.querySelectorAll("img")) if (img.src.startsWith("blob:")) URL.revokeObjectURL(img.src);
      reportEl.remove();
    }
    reportEl = null;
    root.classList.remove("ew-report-open");
  }

  async function openReport() {
    const p = api.project();
    if (!p) throw new Error("there is no project yet");
    const date = new Date().toISOString().slice(0, 16).replace("T", " ") + " UTC";
    await refreshLink(p).catch(() => {});
    const r = await engine("report", projectText(p), gridOptions(p, { date }));
    const rep = JSON.parse(r.report);
    reportData = { rep, svg: r.svg };
    closeReport();
    const img = el("img", { alt: "Field picture with isolines and legend: " + rep.extremes.rows.map((x) => x[0] + " " + x[1]).join(", ") });
    img.src = URL.createObjectURL(new Blob([r.svg], { type: "image/svg+xml" }));
    const tools = el("div", { class: "ew-noprint ew-report-tools" },
      el("button", { type: "button", id: "ew-report-print", text: "Print or save as PDF", onclick: () => window.print() }),
      el("button", { type: "button", id: "ew-report-html", text: "Download the report (HTML)", onclick: () => act(downloadReportHTML) }),
      el("button", { type: "button", id: "ew-report-close", text: "Close the report", onclick: closeReport }));
    reportEl = el("article", { id: "ew-report", class: "ew-report", "aria-label": "Report" },
      tools,
      el("h1", { text: rep.title }),
      el("p", { class: "ew-meta", text: "Date: " + rep.date + " · edgewise " + rep.version + " · physics: " + rep.physics }),
      el("h2", { text: "Inputs" }), table(rep.inputs), table(rep.edges),
      el("h2", { text: "Picture" }), el("figure", {}, img),
      el("h2", { text: "Results" }), table(rep.extremes), table(rep.flows), table(rep.probes), table(rep.accuracy),
      el("h2", { text: "Cautions" }), list("ul", rep.cautions, "No cautions for this project."),
      rep.warnings && rep.warnings.length ? el("h2", { text: "Notes from the engine" }) : null,
      rep.warnings && rep.warnings.length ? list("ul", rep.warnings.map((w) => (typeof w === "string" ? w : String((w && w.text) || ""))), "") : null,
      el("h2", { text: "Methods used" }), list("ol", rep.methods, ""),
      el("h2", { text: "Reproduce" }),
      el("p", {}, "This link holds the whole project; opening it in a browser shows the same project: ",
        el("a", { class: "ew-report-link", href: reproduceLink(p), text: reproduceLink(p) })),
      el("footer", { text: "Computed with edgewise, entirely in the browser; nothing was sent to a server." }));
    document.body.append(reportEl);
    root.classList.add("ew-report-open");
    reportEl.querySelector("#ew-report-print").focus();
    return reportEl;
  }

  function downloadReportHTML() {
    if (!reportEl || !reportData) throw new Error("open the report first");
    const clone = reportEl.cloneNode(true);
    for (const n of clone.querySelectorAll(".ew-noprint")) n.remove();
    const img = clone.querySelector("img");
    if (img) img.setAttribute("src", "data:image/svg+xml;base64," + toBase64(new TextEncoder().encode(reportData.svg)));
    const title = el("title", { text: reportData.rep.title });
    const style = el("style", { text: REPORT_CSS });
    const html = "<!doctype html>\n<html lang=\"en\"><head><meta charset=\"utf-8\">" +
      "<meta http-equiv=\"Content-Security-Policy\" content=\"default-src 'none'; img-src data:; style-src 'unsafe-inline'\">" +
      title.outerHTML + style.outerHTML + "</head><body>" + clone.outerHTML + "</body></html>\n";
    save(slug(reportData.rep.title) + "-report.html", "text/html", html);
  }

  document.addEventListener("keydown", (ev) => {
    if (ev.key === "Escape" && reportEl) closeReport();
  });

  // ---- the checks panel ----

  async function checksText() {
    const inline = document.getElementById("ew-checks");
    if (inline) return inline.textContent;
    const resp = await fetch("checks.json");
    if (!resp.ok) throw new Error("the checks file could not be read (" + resp.status + ")");
    return resp.text();
  }

  let record = null;
  const fmt = (v) => (v === null || v === undefined ? "—" : Number(v).toPrecision(8).replace(/(\.\d*?)0+(e|$)/, "$1$2").replace(/\.(e|$)/, "$1"));

  async function runChecks(box) {
    const out = box.querySelector(".ew-checks-out");
    box.dataset.state = "running";
    out.replaceChildren(el("p", { text: "Reading the published cases…" }));
    const text = await checksText();
    const cases = JSON.parse((await engine("checks", text)).cases);
    const tbody = el("tbody");
    const summary = el("p", { class: "ew-checks-summary", role: "status" });
    const head = el("tr");
    for (const h of ["Case", "Computed", "Published or exact", "Difference", "Tolerance", "Result", "Source"]) head.append(el("th", { scope: "col", text: h }));
    out.replaceChildren(summary, el("div", { class: "ew-scroll" }, el("table", { class: "ew-checks-table" }, el("thead", {}, head), tbody)));
    const outcomes = [];
    let passed = 0, failed = 0;
    for (const c of cases) {
      const tr = el("tr", { "data-id": c.id });
      const cells = {
        computed: el("td", { text: "…" }), expected: el("td"), diff: el("td"), tol: el("td"), result: el("td", { text: "running" }),
      };
      tr.append(el("th", { scope: "row" }, el("span", { text: c.title }), el("br"), el("code", { text: c.id })),
        cells.computed, cells.expected, cells.diff, cells.tol, cells.result,
        el("td", { class: "ew-source", text: c.source + " [" + c.basis + "]" }));
      tbody.append(tr);
      summary.textContent = "Running case " + (outcomes.length + 1) + " of " + cases.length + "…";
      let o;
      try {
        o = JSON.parse((await engine("check", text, c.id)).outcome);
      } catch (e) {
        o = { id: c.id, title: c.title, source: c.source, basis: c.basis, computed: null, expected: null, difference: null, pass: false, error: e.message };
      }
      outcomes.push(o);
      cells.computed.textContent = fmt(o.computed);
      cells.expected.textContent = fmt(o.expected);
      cells.diff.textContent = o.difference === null || o.difference === undefined ? "—" : Number(o.difference).toExponential(2);
      cells.tol.textContent = o.tol !== undefined ? String(o.tol) : "";
      if (o.tol_reason) cells.tol.title = o.tol_reason;
      cells.result.textContent = o.pass ? "pass" : o.error ? "not computed: " + o.error : "FAIL";
      tr.className = o.pass ? "ew-pass" : "ew-fail";
      if (o.pass) passed++; else failed++;
    }
    summary.textContent = passed + " of " + cases.length + " published checks passed" + (failed ? "; " + failed + " did not." : ".");
    let version = "";
    try { version = (await engine("version")).version; } catch (e) { version = "unknown"; }
    let digest = null;
    try {
      if (crypto.subtle) {
        const h = new Uint8Array(await crypto.subtle.digest("SHA-256", new TextEncoder().encode(text)));
        digest = [...h].map((b) => b.toString(16).padStart(2, "0")).join("");
      }
    } catch (e) { digest = null; }
    record = {
      schema: VERIFY_SCHEMA,
      created: new Date().toISOString(),
      edgewise_version: version,
      browser: navigator.userAgent,
      checks_file_sha256: digest,
      total: cases.length,
      passed,
      failed,
      outcomes,
    };
    const dl = el("button", { type: "button", id: "ew-checks-download", text: "Download the verification record (JSON)", onclick: () => act(downloadRecord) });
    out.append(el("p", {}, dl));
    box.dataset.passed = String(passed);
    box.dataset.failed = String(failed);
    box.dataset.state = "done";
    return record;
  }

  function downloadRecord() {
    if (!record) throw new Error("run the checks first");
    save("edgewise-verification-" + record.created.slice(0, 10) + ".json", "application/json", JSON.stringify(record, null, 2) + "\n");
  }

  // ---- the compact results line (embed mode) ----

  const compact = el("p", { id: "ew-compact", class: "ew-compact" });
  function compactLine(d) {
    if (!d || !d.result) return;
    const r = d.result;
    const u = (internal.units && internal.units(d.project && d.project.physics)) || {};
    const unit = u.value_unit ? " " + u.value_unit : "";
    const n = (v) => (typeof v === "number" && isFinite(v) ? Number(v.toPrecision(4)).toString() : "—");
    const parts = [
      "min " + n(r.min.value) + unit,
      "max " + n(r.max.value) + unit,
      "mean " + n(r.mean) + unit,
    ];
    for (const p of (r.probes || []).slice(0, 4)) parts.push(p.label + " " + n(p.value) + unit);
    const title = d.project && d.project.title ? d.project.title + ": " : "";
    compact.replaceChildren(title + parts.join(" · ") + " ");
    if (embedMode) {
      compact.append(el("a", { href: pageURL() + fragmentFor(projectText(d.project)), target: "_blank", rel: "noopener", text: "open in edgewise" }));
    }
  }

  // ---- the panel ----

  const linkBox = el("input", { id: "ew-link", type: "text", readonly: true, "aria-label": "Share link", spellcheck: "false" });
  const embedBox = el("textarea", { id: "ew-embed", readonly: true, rows: "3", "aria-label": "Embed snippet for a wiki page", spellcheck: "false" });
  function showLink() {
    const l = link();
    linkBox.value = l;
    const src = l.includes("#") ? l + "&embed" : l + "#embed";
    const t = (api.project() || {}).title || "edgewise field";
    const ifr = el("iframe", { src, width: "760", height: "460", title: t, loading: "lazy" });
    embedBox.value = ifr.outerHTML;
  }

  async function copyLink() {
    await api.linkReady();
    showLink();
    const l = linkBox.value;
    try {
      await navigator.clipboard.writeText(l);
      tell("Link copied. Anyone who opens it sees this project exactly; it holds the whole project, nothing is stored anywhere.", "info");
    } catch (e) {
      linkBox.focus();
      linkBox.select();
      tell("Select the link and copy it (the browser did not allow copying from here).", "warn");
    }
  }

  // act runs a button's work and reports failures in the notice line.
  async function act(fn, ...args) {
    try {
      root.classList.add("ew-working");
      return await fn(...args);
    } catch (e) {
      tell("That did not work: " + e.message, "error");
    } finally {
      root.classList.remove("ew-working");
    }
  }

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

  const checksBox = el("details", { id: "ew-checks-panel", class: "ew-checks" },
    el("summary", { text: "Published checks" }),
    el("p", { class: "ew-hint", text: "Runs, in this browser, the cases the test suite checks the engine with: exact identities and values from handbooks and textbook tables, each with its source. Keep the record with your calculation." }),
    el("p", {}, el("button", { type: "button", id: "ew-checks-run", text: "Run the published checks", onclick: () => act(runChecks, checksBox) })),
    el("div", { class: "ew-checks-out" }));

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
      button("ew-dl-svg", "SVG picture", () => download("svg", { pixel_width: 800 }), "Vector isolines and legend"),
      button("ew-dl-png", "PNG picture", () => downloadPNG(Number(pngWidth.value)), "A raster picture at the chosen width"), pngWidth,
      button("ew-report-btn", "Report…", openReport, "A printable report: print it or save it as PDF")),
    el("div", { class: "ew-row", role: "group", "aria-label": "Share" },
      el("span", { class: "ew-label", text: "Share" }),
      linkBox,
      button("ew-copy-link", "Copy link", copyLink, "The whole project travels in the link")),
    el("details", { class: "ew-embed-snippet" },
      el("summary", { text: "Embed in a wiki page" }),
      el("p", { class: "ew-hint", text: "Paste this into a page that allows iframes. It shows only the field, the legend and one line of results." }),
      embedBox),
    notice,
    checksBox,
    compact);
  const labelButton = panel.querySelector("label.ew-button");
  labelButton.addEventListener("keydown", (ev) => {
    if (ev.key === "Enter" || ev.key === " ") { ev.preventDefault(); fileInput.click(); }
  });
  showLink();
  if (embedMode) document.title = "edgewise (embedded)";

  // For scripts and tests.
  window.edgewiseOutputs = { readFragment, openReport, closeReport, runChecks: () => runChecks(checksBox), autosaveKey: STORE_KEY };
})();
