// edgewise page: the one line where the save, share and open features
// speak to the user, with optional action buttons.
//
//   EW.notice = {el, tell(text, kind, ...actions), act(fn, ...args), call(fn, ...args)}
//
// kind is "info", "warn" or "error"; an action is {id, text, run} and
// becomes a button after the text. act runs a button's work and reports a
// failure in the line; call runs an engine function and throws its error.
"use strict";
(function () {
  const EW = (window.edgewiseParts = window.edgewiseParts || {});
  const { el } = EW.dom;
  const root = document.documentElement;

  const line = el("p", { id: "ew-notice", class: "ew-notice", role: "status", "aria-live": "polite" });

  function tell(text, kind, ...actions) {
    line.replaceChildren(text);
    line.className = "ew-notice" + (kind ? " " + kind : "");
    line.dataset.kind = kind || "info";
    for (const a of actions) {
      line.append(" ", el("button", { type: "button", class: "ew-link-button", id: a.id, text: a.text, onclick: () => act(a.run) }));
    }
  }

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

  async function call(fn, ...args) {
    const m = await EW.engine.call(fn, ...args);
    const v = m.value;
    if (!v || !v.ok) throw Object.assign(new Error((v && v.error) || "the engine gave no answer"), { path: v && v.path });
    return v;
  }

  EW.notice = { el: line, tell, act, call };
})();
