// edgewise page: the printable report. Its content comes from the engine
// (solver/report); the page lays it out as an overlay to print or save as
// PDF, and as a standalone HTML file under its own strict policy.
//
//   EW.report = {open(), close(), options(project, extra)}
"use strict";
(function () {
  const EW = (window.edgewiseParts = window.edgewiseParts || {});
  const { el, save, slug } = EW.dom;
  const { act, call } = EW.notice;
  const share = EW.share;
  const api = window.edgewise;
  const root = document.documentElement;

  // options asks the engine for the grid of the picture on screen when it
  // shows this project (the page's detail choice), else the project's own.
  function options(p, extra) {
    // the profile line on screen goes along (profile-csv, the report's profile table)
    const line = EW.profileLine ? EW.profileLine() : null;
    return JSON.stringify(Object.assign({}, extra || {}, EW.store.grid(p) || {}, line ? { profile: line } : {}));
  }


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
    ".ew-report table.ew-sheet{width:100%;margin:0 0 .6rem}",
    ".ew-report table.ew-sheet th{width:9rem;background:#f4f1ea;font-weight:600}",
    "@media print{.ew-report{padding:0;max-width:none}.ew-report table,.ew-report figure{break-inside:avoid}" +
      ".ew-report h1,.ew-report h2,.ew-report caption{break-after:avoid}.ew-report p,.ew-report li{orphans:3;widows:3}}",
    "@page{margin:16mm 14mm 18mm;@bottom-right{content:\"Page \" counter(page) \" of \" counter(pages);font:9pt system-ui,sans-serif;color:#444}}",
  ].join("\n");

  // ---- the calculation sheet's title block (the project's "sheet") ----

  const SHEET = [
    ["project", "Project"], ["number", "Calculation no."], ["prepared_by", "Prepared by"],
    ["checked_by", "Checked by"], ["date", "Date"], ["revision", "Revision"],
  ];

  // sheetTable is the title block as printed; an empty field prints as a
  // line to fill in by hand.
  function sheetTable(s) {
    const tb = el("table", { class: "ew-sheet", id: "ew-sheet-block" }, el("caption", { text: "Calculation sheet" }));
    const body = el("tbody");
    for (let i = 0; i < SHEET.length; i += 2) {
      const tr = el("tr");
      for (const [k, label] of SHEET.slice(i, i + 2)) {
        tr.append(el("th", { scope: "row", text: label }), el("td", { "data-sheet": k, text: (s && s[k]) || "" }));
      }
      body.append(tr);
    }
    tb.append(body);
    return tb;
  }

  // sheetForm is the small form in the report panel that fills the title
  // block; what is typed goes into the project (kept, saved, shared).
  function sheetForm(s) {
    const form = el("form", { class: "ew-noprint ew-sheet-form", id: "ew-sheet-form", "aria-label": "Calculation sheet title block" });
    for (const [k, label] of SHEET) {
      form.append(el("label", {}, el("span", { text: label }),
        el("input", { type: "text", id: "ew-sheet-" + k, name: k, maxlength: "200", value: (s && s[k]) || "", spellcheck: "false" })));
    }
    form.addEventListener("submit", (e) => e.preventDefault());
    form.addEventListener("change", () => {
      const next = {};
      for (const [k] of SHEET) {
        const v = form.elements[k].value.trim();
        if (v) next[k] = v;
      }
      EW.setSheet(Object.keys(next).length ? next : null);
      EW.edited();
      const block = reportEl && reportEl.querySelector("#ew-sheet-block");
      if (block) block.replaceWith(sheetTable(next));
    });
    return form;
  }

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
    return share.shareBase() + share.fragmentFor(JSON.stringify(p));
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
    await share.refresh(p).catch(() => {});
    const r = await call("report", JSON.stringify(EW.solving.forEngine(p)), options(p, { date }));
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
      sheetForm(p.sheet),
      el("h1", { text: rep.title }),
      sheetTable(p.sheet),
      el("p", { class: "ew-meta", text: "Date: " + rep.date + " · edgewise " + rep.version + " · physics: " + rep.physics }),
      el("h2", { text: "Inputs" }), table(rep.inputs), table(rep.edges),
      el("h2", { text: "Picture" }), el("figure", {}, img, p.display && Object.keys(p.display).length
        ? el("figcaption", { class: "ew-si-note", text: "The picture's colour bar and axes are in SI units, as in the downloads; the tables are in the display units." }) : null),
      el("h2", { text: "Results" }), table(rep.extremes), table(rep.flows), table(rep.probes), table(rep.accuracy),
      (rep.answers || []).length ? el("h2", { text: "Answers" }) : null, ...(rep.answers || []).map(table),
      rep.profile ? table(rep.profile) : null,
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
    if (img) img.setAttribute("src", "data:image/svg+xml;base64," + share.toBase64(new TextEncoder().encode(reportData.svg)));
    const title = el("title", { text: reportData.rep.title });
    const style = el("style", { text: REPORT_CSS });
    // the report's own policy comes from the engine (solver/csp): no script, its style and picture only
    if (typeof reportData.rep.csp !== "string" || !reportData.rep.csp) throw new Error("the engine gave no policy for the report");
    const meta = el("meta", { "http-equiv": "Content-Security-Policy", content: reportData.rep.csp });
    const html = "<!doctype html>\n<html lang=\"en\"><head><meta charset=\"utf-8\">" +
      meta.outerHTML + title.outerHTML + style.outerHTML + "</head><body>" + clone.outerHTML + "</body></html>\n";
    save(slug(reportData.rep.title) + "-report.html", "text/html", html);
  }

  document.addEventListener("keydown", (ev) => {
    if (ev.key === "Escape" && reportEl) closeReport();
  });

  EW.report = { open: openReport, close: closeReport, options };
})();
