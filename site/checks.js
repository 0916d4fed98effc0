// edgewise page: the published checks, run in the browser: each case the
// test suite checks the engine with, its computed and published values,
// and a verification record to download. The cases run one by one, each
// a call of its own to the worker, so edits solve between them; a bar
// shows how far the run is.
//
//   EW.checks = {box, run()}
"use strict";
(function () {
  const EW = (window.edgewiseParts = window.edgewiseParts || {});
  const { el, save } = EW.dom;
  const { act, call } = EW.notice;
  const VERIFY_SCHEMA = "edgewise-verification/1";


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
    const cases = JSON.parse((await call("checks", text)).cases);
    const tbody = el("tbody");
    const summary = el("p", { class: "ew-checks-summary", role: "status" });
    const bar = el("progress", { id: "ew-checks-progress", max: String(cases.length), value: "0", "aria-label": "Published checks run so far" });
    const head = el("tr");
    for (const h of ["Case", "Computed", "Published or exact", "Difference", "Tolerance", "Result", "Source"]) head.append(el("th", { scope: "col", text: h }));
    out.replaceChildren(bar, summary, el("div", { class: "ew-scroll" }, el("table", { class: "ew-checks-table" }, el("thead", {}, head), tbody)));
    const outcomes = [];
    let passed = 0, failed = 0;
    for (const c of cases) {
      const tr = el("tr", { "data-id": c.id });
      const cells = {
        computed: el("td", { text: "…" }), expected: el("td"), diff: el("td"), tol: el("td"), result: el("td", { text: "running" }),
      };
      tr.append(el("th", { scope: "row" }, el("span", { text: c.title }), el("br"), el("code", { text: c.id })),
        cells.computed, cells.expected, cells.diff, cells.tol, cells.result,
        el("td", { class: "ew-source", text: c.source + " [" + c.kind + "; " + c.basis + "]" }));
      tbody.append(tr);
      summary.textContent = "Running case " + (outcomes.length + 1) + " of " + cases.length + "…";
      await new Promise((go) => setTimeout(go, 0)); // let the page draw and take input between cases
      let o;
      try {
        o = JSON.parse((await call("check", text, c.id)).outcome);
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
      bar.value = outcomes.length;
    }
    // how many of each kind ran: identities, closed forms, table values
    // (and how many of those were recalled from memory)
    const kinds = {};
    for (const c of cases) kinds[c.kind] = (kinds[c.kind] || 0) + 1;
    const fromMemory = cases.filter((c) => c.basis === "memory").length;
    const kindText = Object.keys(kinds).map((k) => kinds[k] + " " + k).join(", ") + "; " + fromMemory + " of them from memory";
    summary.textContent = passed + " of " + cases.length + " published checks passed" + (failed ? "; " + failed + " did not" : "") + " (" + kindText + ").";
    let version = "";
    try { version = (await call("version")).version; } catch (e) { version = "unknown"; }
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
      kinds, // how many cases of each kind: identity, closed form, table
      from_memory: fromMemory,
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

  const checksBox = el("details", { id: "ew-checks-panel", class: "ew-checks" },
    el("summary", { text: "Published checks" }),
    el("p", { class: "ew-hint", text: "Runs, in this browser, the cases the test suite checks the engine with: exact identities and values from handbooks and textbook tables, each with its source. Keep the record with your calculation." }),
    el("p", {}, el("button", { type: "button", id: "ew-checks-run", text: "Run the published checks", onclick: () => act(runChecks, checksBox) })),
    el("div", { class: "ew-checks-out" }));

  EW.checks = { box: checksBox, run: () => runChecks(checksBox) };
})();
