// edgewise page: a JavaScript value handed to window.edgewise.load() turned
// into JSON text, strictly. JSON.stringify would turn NaN and Infinity into
// null, drop undefined, call toJSON blindly and throw raw, sometimes
// multi-line, errors on a BigInt or a circular object; here every such
// value is refused with one line that names where it is:
//
//   EW.jsonText(value) -> text   (throws Error("not a project: ..."))
"use strict";
(function () {
  const EW = (window.edgewiseParts = window.edgewiseParts || {});
  const MAX_DEPTH = 64; // deeper than any project; the engine refuses far less deep

  function refuse(path, what) {
    return new Error("not a project: " + (path ? path + ": " : "") + what);
  }

  // firstLine keeps an error message to one short line.
  function firstLine(e) {
    const s = String((e && e.message) || e).split("\n")[0];
    return s.length > 120 ? s.slice(0, 117) + "…" : s;
  }

  function walk(v, path, depth, open) {
    if (depth > MAX_DEPTH) throw refuse(path, "nested more than " + MAX_DEPTH + " levels deep");
    if (v !== null && (typeof v === "object" || typeof v === "bigint") && typeof v.toJSON === "function") {
      let j;
      try {
        j = v.toJSON(path.split(".").pop() || "");
      } catch (e) {
        throw refuse(path, "its toJSON failed (" + firstLine(e) + ")");
      }
      if (j === undefined) throw refuse(path, "its toJSON gave no value");
      if (j !== v) return walk(j, path, depth + 1, open);
    }
    switch (typeof v) {
      case "string":
        return JSON.stringify(v);
      case "boolean":
        return v ? "true" : "false";
      case "number":
        if (!Number.isFinite(v)) throw refuse(path, String(v) + " is not a number JSON can hold");
        return JSON.stringify(v);
      case "bigint":
        throw refuse(path, "a BigInt (" + (String(v).length > 20 ? String(v).slice(0, 20) + "…" : String(v)) + "n) is not a JSON number; pass a Number");
      case "undefined":
        throw refuse(path, "undefined is not a JSON value");
      case "function":
      case "symbol":
        throw refuse(path, "a " + typeof v + " is not a JSON value");
    }
    if (v === null) return "null";
    if (open.has(v)) throw refuse(path, "it contains itself (a circular structure)");
    open.add(v);
    try {
      let out;
      if (Array.isArray(v)) {
        const parts = [];
        for (let i = 0; i < v.length; i++) parts.push(walk(v[i], path + "[" + i + "]", depth + 1, open));
        out = "[" + parts.join(",") + "]";
      } else {
        const parts = [];
        for (const k of Object.keys(v)) {
          const item = v[k];
          if (item === undefined) continue; // as JSON: an absent key
          parts.push(JSON.stringify(k) + ":" + walk(item, path ? path + "." + k : k, depth + 1, open));
        }
        out = "{" + parts.join(",") + "}";
      }
      return out;
    } finally {
      open.delete(v);
    }
  }

  EW.jsonText = function (value) {
    try {
      return walk(value, "", 0, new Set());
    } catch (e) {
      if (e instanceof Error && e.message.startsWith("not a project: ")) throw e;
      // a throwing getter, a Proxy trap, a stack overflow
      throw refuse("", "reading it failed (" + firstLine(e) + ")");
    }
  };
})();
