// edgewise page: share links. The whole project travels in the URL
// fragment, never the query:
//
//   #z=<base64url of deflate-raw(project JSON)>   the share link
//   #j=<base64url of the project JSON>            the same, uncompressed
//   #p=<percent-encoded project JSON>             the page's first form
//   &embed                                        embed mode (also alone: #embed; the
//                                                 snippet asks for it as page?embed#z=...)
//
// A link's project goes through the same strict check as a project file
// (EW.solving.check); a link that inflates past the size limit is refused
// as soon as the limit is passed, not after inflating all of it.
//
// Opened from a file (the offline copy), a link to the page itself opens
// only on this computer: the page says so, and links use the address of
// the hosted copy (an organisation's wiki or file server) once the user
// gives it; it is kept in the browser's storage (HOSTED_KEY).
//
// The embed snippet's frame takes its size from the project's aspect.
//
//   EW.share = {readFragment, fromFragment, peek, fragmentFor, pageURL, shareBase, setHosted(address),
//               embedSize(project), clearFragment, refresh(project), embed, toBase64, controls}
// window.edgewise.link() and linkReady() come from here.
"use strict";
(function () {
  const EW = (window.edgewiseParts = window.edgewiseParts || {});
  const { el } = EW.dom;
  const { tell } = EW.notice;
  const api = window.edgewise;
  const MAX_TEXT = 1 << 20; // bytes of a decompressed link
  const HOSTED_KEY = "edgewise.hosted.1"; // the hosted copy's address, for links made from a file
  const FEED = 1024; // compressed bytes fed to the inflater at a time

  // ---- base64url and compression ----

  function toBase64(bytes) {
    let bin = "";
    for (let i = 0; i < bytes.length; i += 0x8000) bin += String.fromCharCode.apply(null, bytes.subarray(i, i + 0x8000));
    return btoa(bin);
  }
  const toBase64url = (bytes) => toBase64(bytes).replace(/\+/g, "-").replace(/\//g, "_").replace(/=+$/, "");

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

  async function deflate(text) {
    const stream = new Blob([new TextEncoder().encode(text)]).stream().pipeThrough(new CompressionStream("deflate-raw"));
    return new Uint8Array(await new Response(stream).arrayBuffer());
  }

  // inflate undoes deflate-raw, feeding the inflater a little at a time
  // (one input chunk can inflate to a thousand times its size) and
  // stopping as soon as the output passes limit bytes.
  async function inflate(bytes, limit) {
    const ds = new DecompressionStream("deflate-raw");
    const writer = ds.writable.getWriter();
    const reader = ds.readable.getReader();
    const parts = [];
    let n = 0;
    let over = false;
    const reading = (async () => {
      for (;;) {
        const { done, value } = await reader.read();
        if (done) return;
        n += value.length;
        if (n > limit) {
          over = true;
          reader.cancel().catch(() => {});
          return;
        }
        parts.push(value);
      }
    })();
    const damaged = () => new Error("the link's data is damaged (it does not decompress)");
    try {
      for (let i = 0; i < bytes.length && !over; i += FEED) await writer.write(bytes.subarray(i, i + FEED));
      if (!over) await writer.close();
      await reading;
    } catch (e) {
      if (!over) throw damaged();
    }
    if (over) throw new Error("the link's project is larger than " + limit + " bytes");
    const out = new Uint8Array(n);
    let k = 0;
    for (const p of parts) { out.set(p, k); k += p.length; }
    try {
      return new TextDecoder("utf-8", { fatal: true }).decode(out);
    } catch (e) {
      throw new Error("the link's text is not UTF-8");
    }
  }

  // ---- the fragment ----

  function readFragment(hash) {
    const out = { embed: false, key: "", data: "" };
    for (const part of (hash || "").replace(/^#/, "").split("&")) {
      if (!part) continue;
      const i = part.indexOf("=");
      const k = i < 0 ? part : part.slice(0, i);
      const v = i < 0 ? "" : part.slice(i + 1);
      if (k === "embed") out.embed = v === "" || v === "1";
      else if ((k === "z" || k === "j" || k === "p") && !out.key) { out.key = k; out.data = v; }
    }
    return out;
  }

  // fromFragment returns the checked project object a fragment holds, or
  // throws a one-line reason.
  async function fromFragment(f) {
    return EW.solving.check(await peek(f));
  }

  // peek returns the project text a fragment holds, not yet checked.
  async function peek(f) {
    let text;
    if (f.key === "z") text = await inflate(fromBase64url(f.data), MAX_TEXT);
    else if (f.key === "j") {
      try {
        text = new TextDecoder("utf-8", { fatal: true }).decode(fromBase64url(f.data));
      } catch (e) {
        throw new Error(/base64url/.test(e.message) ? e.message : "the link's text is not UTF-8");
      }
    } else {
      try { text = decodeURIComponent(f.data); } catch (e) { throw new Error("the link's text is not correctly percent-encoded"); }
    }
    if (text.length > MAX_TEXT) throw new Error("the link's project is too large");
    return text;
  }

  // pageURL is the page's address without query or fragment (a link made
  // in the embed view is a plain link)
  const pageURL = () => location.href.split(/[?#]/)[0];

  const fromFile = location.protocol === "file:";
  function hosted() {
    try {
      return localStorage.getItem(HOSTED_KEY) || "";
    } catch (e) {
      return "";
    }
  }
  // shareBase is the address links are made for: the page's own, or from
  // a file the hosted copy's when one is set
  const shareBase = () => (fromFile && hosted()) || pageURL();

  // setHosted checks and keeps the hosted copy's address (empty: forget
  // it); it returns the address kept or throws a one-line reason.
  function setHosted(text) {
    const t = String(text || "").trim();
    let v = "";
    if (t) {
      let u;
      try {
        u = new URL(t);
      } catch (e) {
        throw new Error("the hosted copy's address is not a web address: " + JSON.stringify(t.slice(0, 80)));
      }
      if (u.protocol !== "https:" && u.protocol !== "http:") throw new Error("the hosted copy's address must be an https or http address");
      v = u.href.split(/[?#]/)[0];
    }
    try {
      if (v) localStorage.setItem(HOSTED_KEY, v);
      else localStorage.removeItem(HOSTED_KEY);
    } catch (e) {
      throw new Error("this browser does not let the page keep the address (" + (e.name || "storage blocked") + ")");
    }
    showLink();
    return v;
  }

  function clearFragment() {
    try {
      history.replaceState(history.state, "", pageURL());
    } catch (e) { /* some contexts refuse; the fragment then stays */ }
  }

  // The link for the project on screen. link() must answer at once, so the
  // compressed form is made after every solve and edit and kept; until it
  // is ready the uncompressed (still exact) form is returned.
  const cache = { text: null, frag: null };
  function fragmentFor(text) {
    if (cache.text === text) return "#z=" + cache.frag;
    return "#j=" + toBase64url(new TextEncoder().encode(text));
  }
  let job = 0;
  async function refresh(project) {
    const text = JSON.stringify(project);
    if (cache.text === text) return;
    const mine = ++job;
    const frag = toBase64url(await deflate(text));
    if (mine !== job && cache.text !== null) return; // a newer project is being compressed
    cache.text = text;
    cache.frag = frag;
    showLink();
  }
  // the project shared is the last one the user meant (store.js), not a
  // half-typed one
  const shared = () => EW.store.good() || api.project();
  function link() {
    const p = shared();
    return p ? shareBase() + fragmentFor(JSON.stringify(p)) : shareBase();
  }
  api.link = link;
  // linkReady resolves with the compressed link once it is made.
  api.linkReady = async () => {
    const p = shared();
    if (p) await refresh(p);
    return link();
  };

  // The embed view is asked for in the query (page?embed#z=...), which the
  // server sees and answers with a policy that lets a wiki page frame it
  // (solver/csp); the older #...&embed form still shows it.
  const first = readFragment(location.hash);
  const embed = first.embed || new URLSearchParams(location.search).has("embed");
  if (embed) document.documentElement.classList.add("ew-embed");

  // ---- a pasted link in the same tab ----

  window.addEventListener("hashchange", async () => {
    const f = readFragment(location.hash);
    if (!f.key) return;
    const before = api.project();
    const failed = (text) => {
      tell(text + " Your current project is unchanged.", "error");
      document.documentElement.dataset.linkError = "1";
    };
    let p;
    try {
      p = await fromFragment(f);
    } catch (e) {
      failed("This link's project could not be opened: " + e.message + ".");
      return;
    }
    try {
      await api.load(p);
    } catch (e) {
      // it passes the checks but does not solve: the last good picture stays
      if (!e.cancelled) failed("This link's project did not solve: " + e.message + ".");
      return;
    }
    const undo = before && JSON.stringify(before) !== JSON.stringify(p)
      ? [{ id: "ew-restore-previous", text: "Undo", run: async () => { await api.load(before); tell("Restored the previous project.", "info"); } }]
      : [];
    tell("Opened the project from the link.", "info", ...undo);
    if (!embed) clearFragment();
  });

  // ---- the controls ----

  const linkBox = el("input", { id: "ew-link", type: "text", readonly: true, "aria-label": "Share link", spellcheck: "false" });
  const embedBox = el("textarea", { id: "ew-embed", readonly: true, rows: "3", "aria-label": "Embed snippet for a wiki page", spellcheck: "false" });
  // embedSize is the frame for a project: 760 px wide at most, as tall as
  // the picture at the project's aspect plus the legend's and the results
  // line's room (the embedded page gives the picture at most 58 % of the
  // frame's height), so a wide plate leaves no empty half.
  function embedSize(p) {
    const W = p && p.width, H = p && p.height;
    if (!(W > 0 && H > 0 && Number.isFinite(W / H))) return { width: 760, height: 460 };
    const r = H / W;
    let fw = 572; // the picture's width in a 760 px frame
    let fh = fw * r;
    if (fh > 300) { fh = 300; fw = fh / r; }
    fh = Math.max(fh, 48);
    return { width: Math.min(760, Math.max(400, Math.ceil(fw + 188))), height: Math.ceil(Math.max(fh / 0.58, fh + 130)) };
  }

  function showLink() {
    const l = link();
    linkBox.value = l;
    const i = l.indexOf("#");
    const src = i < 0 ? l + "?embed" : l.slice(0, i) + "?embed" + l.slice(i);
    const p = shared() || {};
    const t = p.title || "edgewise field";
    const size = embedSize(p);
    embedBox.value = el("iframe", { src, width: String(size.width), height: String(size.height), title: t, loading: "lazy" }).outerHTML;
    hostedNote.hidden = !fromFile;
    hostedNote.firstChild.textContent = hosted()
      ? "This copy is a file on your computer; links point to the hosted copy at " + hosted() + ". "
      : "This copy is a file on your computer: a link to it opens only here, for no one else. Give the address of the hosted copy (your organisation's wiki or file server) to make links others can open. ";
    if (document.activeElement !== hostedBox) hostedBox.value = hosted();
  }

  const hostedBox = el("input", { id: "ew-hosted", type: "url", spellcheck: "false", placeholder: "the hosted copy's address (https or http)", "aria-label": "Address of the hosted copy" });
  const hostedNote = el("p", { id: "ew-hosted-note", class: "ew-hint", hidden: true }, el("span"), hostedBox, " ",
    el("button", {
      type: "button", id: "ew-hosted-save", text: "Use for links",
      onclick: () => EW.notice.act(() => {
        const v = setHosted(hostedBox.value);
        tell(v ? "Links now open the hosted copy at " + v + "." : "Links point to this file again (they open only on this computer).", "info");
      }),
    }));

  async function copyLink() {
    await api.linkReady();
    showLink();
    const local = fromFile && !hosted();
    try {
      await navigator.clipboard.writeText(linkBox.value);
      if (local) tell("Link copied, but it opens only on this computer: this page is a file here. Give the address of the hosted copy (under Share) for links others can open.", "warn");
      else tell("Link copied. Anyone who opens it sees this project exactly; it holds the whole project, nothing is stored anywhere.", "info");
    } catch (e) {
      linkBox.focus();
      linkBox.select();
      tell("Select the link and copy it (the browser did not allow copying from here).", "warn");
    }
  }

  EW.store.on("meant", (d) => { refresh(d.project).catch(() => {}); });

  EW.share = {
    first, embed, readFragment, fromFragment, peek, fragmentFor, pageURL, shareBase, setHosted, embedSize, clearFragment, refresh, toBase64,
    controls: { linkBox, embedBox, hostedNote, showLink, copyLink },
  };
})();
