// edgewise page: autosave and the first project.
//
// localStorage keeps {saved, project, solved, failure}: the project as last
// edited, the last project that solved, and why the edited one did not
// solve (when it did not). A reload always comes back with the last
// project that solved and says what happened to a newer edit, which stays
// recoverable (restore it into the form, or download it). Stored text
// that cannot be read is kept under a key of its own and offered as a
// download; the page then starts from the demo and says so.
//
// EW.boot(demo) chooses the first project: the share link, else the
// autosave, else the demo.
"use strict";
(function () {
  const EW = (window.edgewiseParts = window.edgewiseParts || {});
  const { save } = EW.dom;
  const notice = EW.notice;
  let bootSaid = null; // what the start had to say, repeated in the status line

  // tell speaks in the notice line; at the start it is also remembered for
  // the status line beside the picture, which the first solve overwrites.
  function tell(text, kind, ...actions) {
    notice.tell(text, kind, ...actions);
    if (booting && kind !== "info") bootSaid = text;
  }
  let booting = false;
  const share = EW.share;
  const api = window.edgewise;
  const KEY = "edgewise.autosave.1";
  const KEY_UNREADABLE = KEY + ".unreadable"; // stored text that could not be read
  const KEY_UNSOLVED = KEY + ".unsolved"; // a newer edit that did not solve, kept at boot
  const embed = share.embed;

  let record = { project: null, solved: null, failure: null };
  let storageOK = true;
  let quiet = false; // a failed link's notice stays on show

  function write() {
    if (embed) return;
    try {
      localStorage.setItem(KEY, JSON.stringify(Object.assign({ saved: new Date().toISOString() }, record)));
      storageOK = true;
    } catch (e) {
      if (storageOK) tell("Autosave is not available here (" + (e.name || "storage blocked") + "); download the project to keep it.", "warn");
      storageOK = false;
    }
  }
  function keep(key, text) {
    try {
      localStorage.setItem(key, text);
    } catch (e) { /* the notice still offers the download */ }
  }

  EW.store.on("edited", (d) => {
    if (!d.project) return;
    record.project = d.project;
    record.failure = null;
    write();
  });
  // the last project the user meant (store.js), not every solved keystroke
  EW.store.on("meant", (d) => {
    record = { project: EW.store.project() || d.project, solved: d.project, failure: null };
    write();
  });
  EW.store.on("failed", (d) => {
    if (d.project !== record.project) return;
    record.failure = String(d.error && d.error.message);
    write();
  });

  // stored reads the autosave: {record} or {bad: reason, text} or null.
  function stored() {
    let text;
    try {
      text = localStorage.getItem(KEY);
    } catch (e) {
      return null;
    }
    if (text === null || text === "") return null;
    let v;
    try {
      v = JSON.parse(text);
    } catch (e) {
      return { bad: e instanceof RangeError ? "it is nested too deeply" : "it is not JSON", text };
    }
    if (v === null || typeof v !== "object" || Array.isArray(v)) return { bad: "it is " + (v === null ? "null" : Array.isArray(v) ? "a list" : "a " + typeof v) + ", not a saved project", text };
    const obj = (x) => x !== null && typeof x === "object" && !Array.isArray(x);
    if (!obj(v.project) && !obj(v.solved)) return { bad: "it holds no project", text };
    return { record: { project: obj(v.project) ? v.project : null, solved: obj(v.solved) ? v.solved : null, failure: typeof v.failure === "string" ? v.failure : null }, text };
  }

  const downloadAction = (id, text, name, data) => ({ id, text, run: () => save(name, "application/json", data) });

  // unreadable keeps text that could not be restored and says so.
  function unreadable(why, text, then) {
    keep(KEY_UNREADABLE, text);
    if (!quiet) tell("The autosaved project could not be restored (" + why + "); " + then + " Its text is kept.", "warn",
      downloadAction("ew-autosave-download", "Download the autosaved text", "edgewise-autosave-unreadable.json", text));
  }

  // tryLoad loads a project object through the strict check; it returns
  // null when it loaded, else the reason.
  async function tryLoad(p) {
    try {
      await api.load(await EW.solving.check(JSON.stringify(p)));
      return null;
    } catch (e) {
      if (e.cancelled) throw e;
      return e.message;
    }
  }

  // newer tells what became of an edit newer than the project restored.
  async function newer(edit, failure) {
    const text = JSON.stringify(edit);
    keep(KEY_UNSOLVED, text);
    let why = failure;
    if (!why) {
      try {
        await EW.solving.check(text);
      } catch (e) {
        why = e.message;
      }
    }
    if (quiet) return;
    const what = why ? "Your newest edit did not solve (" + why + ")" : "Your newest edit had not been solved when the page was closed";
    tell(what + "; this is the last project that solved.", "warn",
      { id: "ew-restore-unsolved", text: "Restore the unsolved edit", run: () => { EW.solving.edit(edit); tell("Restored your newest edit into the inputs.", "info"); } },
      downloadAction("ew-unsolved-download", "Download it", "edgewise-unsolved-edit.json", JSON.stringify(edit, null, 2) + "\n"));
  }

  // fromLink opens the share link's project; false when there is none or
  // it did not open (the notice says why).
  async function fromLink(fallback) {
    if (!share.first.key) return false;
    let p;
    try {
      p = await share.fromFragment(share.first);
    } catch (e) {
      tell("This link's project could not be opened: " + e.message + ". " + fallback, "error");
      document.documentElement.dataset.linkError = "1";
      return false;
    }
    const prev = record.project || record.solved; // the load below replaces the record
    try {
      await api.load(p);
    } catch (e) {
      if (e.cancelled) throw e;
      tell("This link's project did not solve: " + e.message + ". " + fallback, "error",
        { id: "ew-link-edit", text: "Put the link's project in the inputs", run: () => EW.solving.edit(p) });
      document.documentElement.dataset.linkError = "1";
      return false;
    }
    if (!embed && prev && JSON.stringify(prev) !== JSON.stringify(p)) {
      tell("Opened the project from the link.", "info", {
        id: "ew-restore-previous",
        text: "Go back to your previous project" + (prev.title ? " (" + String(prev.title).slice(0, 60) + ")" : ""),
        run: async () => { await api.load(prev); tell("Restored your previous project.", "info"); },
      });
    } else if (!embed) {
      tell("Opened the project from the link.", "info");
    }
    if (!embed && storageOK) share.clearFragment();
    return true;
  }

  EW.boot = async function (demo) {
    booting = true;
    try {
      await start(demo);
    } finally {
      booting = false;
      if (bootSaid) EW.solving.setStatus(bootSaid + " (See the note under Share.)", "error");
    }
  };

  async function start(demo) {
    const s = embed ? null : stored();
    if (s && s.record) record = s.record;
    const fallback = s && s.record ? "Showing your last project instead." : "Showing the demo instead.";
    if (await fromLink(fallback)) return;
    quiet = Boolean(share.first.key);
    if (s && s.bad) {
      unreadable(s.bad, s.text, "showing the demo.");
    } else if (s && s.record) {
      const { project, solved, failure } = s.record;
      const edit = project && (!solved || JSON.stringify(project) !== JSON.stringify(solved)) ? project : null;
      if (solved) {
        const why = await tryLoad(solved);
        if (!why) {
          if (edit) await newer(edit, failure);
          return;
        }
        if (!edit) {
          unreadable(why, s.text, "showing the demo.");
          return api.load(await demo());
        }
      }
      // no project that solved: the edit as saved
      const why = await tryLoad(edit);
      if (!why) return;
      unreadable(why, s.text, "showing the demo.");
    }
    await api.load(await demo());
  }

  // firstGuess is the project the page will most likely show first, read
  // without the engine (the boot checks and solves it): the link's, else
  // the autosave's last good one, else null.
  EW.firstGuess = async function () {
    if (share.first.key) {
      try {
        return JSON.parse(await share.peek(share.first));
      } catch (e) {
        return null;
      }
    }
    const s = embed ? null : stored();
    return (s && s.record && (s.record.solved || s.record.project)) || null;
  };

  EW.autosave = { key: KEY, unreadableKey: KEY_UNREADABLE, unsolvedKey: KEY_UNSOLVED };
})();
