// edgewise page: the Parameters panel. A project may name numbers
// ("parameters": {"h_top": 25}) that every formula and every number field
// written as text may use ("h": "2*h_top"). The panel adds, renames and
// removes them; the engine's errors (a name that clashes with a built-in
// one, a parameter no field uses, a name used but not defined) appear at
// the parameter's row, as every field's errors do (their path is
// parameters.<name>).
//
// It joins the form's reading and filling: EW.read() gives the project
// with its parameters, EW.fill(project) shows them.
//
//   EW.params = {list() -> [{name, value}], add(name, value), rename(from, to)}
//
// Renaming a parameter (when its name field is left) renames it in every
// field that uses it.
"use strict";
(function () {
  const EW = (window.edgewiseParts = window.edgewiseParts || {});
  const { byId, el } = EW.dom;
  const NUMBER = /^[+-]?(\d+\.?\d*|\.\d+)([eE][+-]?\d+)?$/;

  const box = el("fieldset", { class: "group", id: "params" },
    el("legend", { text: "Parameters" }),
    el("p", { class: "hint", text: "Named numbers: any formula, and any number field, may use them (for example h = 2*h_top)." }),
    el("p", { class: "err", "data-err": "parameters" }));
  const rows = el("div", { class: "param-rows" });
  const addBtn = el("button", { type: "button", id: "param-add", text: "Add parameter", onclick: () => add() });
  box.append(rows, addBtn);
  byId("inputs").insertBefore(box, byId("edges"));

  function row(name, value) {
    const err = el("p", { class: "err", "data-err": name ? "parameters." + name : "parameters" });
    const nameIn = el("input", { type: "text", class: "param-name", spellcheck: "false", value: name, "aria-label": "Parameter name" });
    const valueIn = el("input", { type: "text", class: "param-value", inputmode: "decimal", value: String(value), "aria-label": "Parameter value" });
    nameIn.dataset.was = name;
    nameIn.addEventListener("change", () => {
      const to = nameIn.value.trim();
      rename(nameIn.dataset.was, to);
      nameIn.dataset.was = to;
    });
    const r = el("div", { class: "param-row" },
      el("div", { class: "pair" },
        el("label", { class: "row" }, el("span", { text: "Name" }), nameIn),
        el("label", { class: "row" }, el("span", { text: "Value" }), valueIn)),
      el("button", { type: "button", class: "param-remove", text: "Remove", "aria-label": "Remove this parameter",
        onclick: () => { r.remove(); EW.edited && EW.edited(); } }),
      err);
    return r;
  }

  // rename carries a new name into every field that uses the old one (a
  // whole name, not part of a longer one) and tells the other panels
  // (study.js keeps its study's names in step).
  function rename(from, to) {
    if (!from || !to || from === to || !/^[A-Za-z_][A-Za-z0-9_]*$/.test(to)) return;
    const esc = from.replace(/[^A-Za-z0-9_]/g, "");
    const word = new RegExp("(^|[^A-Za-z0-9_])" + esc + "(?![A-Za-z0-9_])", "g");
    for (const i of byId("inputs").querySelectorAll("input[type=text]")) {
      if (i.classList.contains("param-name") || i.classList.contains("param-value")) continue;
      const v = i.value.replace(word, (m, pre) => pre + to);
      if (v !== i.value) i.value = v;
    }
    document.dispatchEvent(new CustomEvent("edgewise:renamed", { detail: { from, to } }));
    EW.edited && EW.edited();
  }

  function add(name, value) {
    const taken = new Set(list().map((q) => q.name));
    let n = name;
    if (!n) for (let k = 1; taken.has((n = "p" + k)); k++);
    rows.append(row(n, value === undefined ? 1 : value));
    EW.edited && EW.edited();
    rows.lastChild.querySelector(".param-name").focus();
  }

  function list() {
    return [...rows.children].map((r) => ({
      name: r.querySelector(".param-name").value.trim(),
      value: r.querySelector(".param-value").value.trim(),
      row: r,
    }));
  }

  const read = EW.read;
  EW.read = function () {
    const out = read();
    const ps = list();
    if (!ps.length) return out;
    const obj = {};
    for (const q of ps) {
      const path = "parameters." + q.name;
      q.row.querySelector(".err").dataset.err = q.name ? path : "parameters";
      q.row.querySelector(".param-name").dataset.path = path;
      if (!q.name) {
        out.errors.push({ path: "parameters", msg: "a parameter needs a name" });
        continue;
      }
      if (Object.prototype.hasOwnProperty.call(obj, q.name)) {
        out.errors.push({ path, msg: "defined twice" });
        continue;
      }
      if (!NUMBER.test(q.value)) {
        out.errors.push({ path, msg: q.value === "" ? "a value is required" : "not a number: " + JSON.stringify(q.value) });
        obj[q.name] = q.value;
        continue;
      }
      obj[q.name] = Number(q.value);
    }
    out.project.parameters = obj;
    return out;
  };

  const fill = EW.fill;
  EW.fill = function (p) {
    fill(p);
    rows.replaceChildren();
    for (const [name, value] of Object.entries((p && p.parameters) || {})) rows.append(row(name, value));
  };

  EW.params = { list: () => list().map(({ name, value }) => ({ name, value })), add, rename };
})();
