// Couplewise page glue: starts the calculation worker on any page, binds calculator pages.
// Small and framework-free: the logic lives in calc (Python, run by Pyodide in the worker).
// Data text is only ever inserted as text (textContent), never as HTML.
import { CALCULATORS } from "./calculators.mjs";

export const siteRoot = new URL("../../", import.meta.url);

const runtime = { stage: "idle", detail: "", listeners: new Set() };
let worker = null;
let seq = 0;
const pending = new Map();

function setStage(stage, detail) {
  runtime.stage = stage;
  runtime.detail = detail || "";
  for (const fn of runtime.listeners) fn(runtime);
}

export function onRuntime(fn) {
  runtime.listeners.add(fn);
  fn(runtime);
  return () => runtime.listeners.delete(fn);
}

export function servedOverHttp() {
  return location.protocol === "http:" || location.protocol === "https:";
}

function startWorker() {
  if (worker || !servedOverHttp()) return worker;
  try {
    worker = new Worker(new URL("calc-worker.mjs", import.meta.url), { type: "module" });
  } catch (err) {
    setStage("failed", String(err));
    return null;
  }
  setStage("loading", "starting");
  worker.onmessage = (event) => {
    const msg = event.data || {};
    if (msg.type === "status") setStage(msg.stage, msg.detail);
    else if (msg.type === "result") {
      const done = pending.get(msg.id);
      if (done) { pending.delete(msg.id); done(msg.out); }
    }
  };
  worker.onerror = (event) => {
    event.preventDefault();
    setStage("failed", event.message || "worker error");
  };
  return worker;
}

// Run one calculation in the worker: resolves to {ok, result} or {ok: false, error}.
export function calculate(name, request) {
  const w = startWorker();
  if (!w) {
    return Promise.resolve({ ok: false, error: { field: "runtime", message: "The calculator needs the site to be served over HTTP (see the notice above)." } });
  }
  const id = ++seq;
  return new Promise((resolve) => {
    pending.set(id, resolve);
    w.postMessage({ id, name, request });
  });
}

let datasetPromise = null;
export function dataset() {
  if (!datasetPromise) {
    datasetPromise = fetch(new URL("assets/data/dataset.json", siteRoot)).then((r) => {
      if (!r.ok) throw new Error("dataset.json: HTTP " + r.status);
      return r.json();
    });
  }
  return datasetPromise;
}

// Tiny DOM builder: text children become text nodes, never HTML.
export function h(tag, attrs, ...children) {
  const el = document.createElement(tag);
  for (const [k, v] of Object.entries(attrs || {})) {
    if (v === null || v === undefined || v === false) continue;
    if (k === "class") el.className = v;
    else if (k === "text") el.textContent = v;
    else if (k.startsWith("on") && typeof v === "function") el.addEventListener(k.slice(2), v);
    else el.setAttribute(k, v === true ? "" : String(v));
  }
  for (const c of children.flat()) {
    if (c === null || c === undefined || c === false) continue;
    el.append(c instanceof Node ? c : document.createTextNode(String(c)));
  }
  return el;
}

function initPage() {
  startWorker();
  for (const root of document.querySelectorAll("[data-cw-calc]")) {
    if (root.dataset.cwBound) continue;
    root.dataset.cwBound = "1";
    if (!servedOverHttp()) continue; // file://: file-pages.js (a classic script) shows the notice
    const setup = CALCULATORS[root.dataset.cwCalc];
    if (!setup) {
      root.replaceChildren(h("p", { class: "cw-error", text: "Unknown calculator: " + root.dataset.cwCalc }));
      continue;
    }
    setup(root).catch((err) => {
      root.append(h("p", { class: "cw-error", role: "alert", text: "This calculator could not start: " + String(err && err.message ? err.message : err) }));
    });
  }
}

// Offline: a service worker precaches the whole site, one cache per version. A new version found
// on a later online visit waits until the user accepts it in a non-blocking notice; then every
// open page reloads on it, so no page ever mixes the data or calc of two versions.
let swRegistration = null;

function askVersion(sw) {
  // The version a service worker serves: {version, data_version, data_date, build}, or null.
  return new Promise((resolve) => {
    if (!sw) { resolve(null); return; }
    const channel = new MessageChannel();
    const timer = setTimeout(() => resolve(null), 3000);
    channel.port1.onmessage = (event) => { clearTimeout(timer); resolve(event.data || null); };
    sw.postMessage({ type: "version" }, [channel.port2]);
  });
}

function describe(v) {
  return v ? "data version " + v.data_version + " (" + v.data_date + "), build " + v.build : "";
}

async function offerUpdate(reg) {
  if (document.querySelector(".cw-update") || !reg.waiting) return;
  const [next, current] = await Promise.all([askVersion(reg.waiting), askVersion(navigator.serviceWorker.controller)]);
  if (document.querySelector(".cw-update")) return;
  const accept = h("button", { type: "button", class: "md-button md-button--primary cw-update-accept", text: "Use the new version" });
  const later = h("button", { type: "button", class: "md-button cw-update-later", text: "Later" });
  const text = "A new version of Couplewise is ready" + (next ? " (" + describe(next) + ")" : "") + ". " +
    "The open pages keep " + (current ? describe(current) : "their version") + " until you switch; switching reloads them.";
  const bar = h("div", { class: "cw-update md-typeset", role: "status", "aria-live": "polite" },
    h("span", { class: "cw-update-text", text }), h("span", { class: "cw-update-actions" }, accept, later));
  accept.addEventListener("click", () => {
    accept.disabled = true;
    if (reg.waiting) reg.waiting.postMessage({ type: "activate-new-version" });
    else location.reload(); // another page switched already
  });
  later.addEventListener("click", () => bar.remove());
  document.body.append(bar);
}

function watchForUpdates(reg) {
  if (reg.waiting && navigator.serviceWorker.controller) offerUpdate(reg);
  reg.addEventListener("updatefound", () => {
    const nw = reg.installing;
    if (!nw) return;
    nw.addEventListener("statechange", () => {
      if (nw.state === "installed" && navigator.serviceWorker.controller) offerUpdate(reg);
    });
  });
}

function registerServiceWorker() {
  if (swRegistration || !servedOverHttp() || !("serviceWorker" in navigator)) return;
  let reloading = false;
  let controlled = !!navigator.serviceWorker.controller;
  navigator.serviceWorker.addEventListener("controllerchange", () => {
    // The first install takes over without a reload (same files); a switch of version reloads.
    if (controlled && !reloading) {
      reloading = true;
      location.reload();
    }
    controlled = true;
  });
  swRegistration = navigator.serviceWorker.register(new URL("sw.js", siteRoot).href,
    { scope: siteRoot.pathname, updateViaCache: "none" });
  swRegistration.then((reg) => {
    watchForUpdates(reg);
    // Ask the server for a newer version now (a cheap check of sw.js), not only on navigations.
    if (navigator.serviceWorker.controller && navigator.onLine) reg.update().catch(() => {});
  }).catch(() => { /* offline use is unavailable (e.g. private mode); the site still works online */ });
}

// On a first visit the service worker's install downloads and checks every file of the site
// (about 27 MB) for offline use; begun at once, it competes with the Python runtime's start for
// the network and the two or four cores of a tablet. It is therefore registered once the runtime
// is ready (or has failed), or after 20 s at most. A page already served by the worker registers
// at once: that only asks the server whether there is a newer version.
function registerWhenRuntimeSettles() {
  if (!servedOverHttp() || !("serviceWorker" in navigator)) return;
  if (navigator.serviceWorker.controller || !startWorker()) { registerServiceWorker(); return; }
  let done = false;
  let off = null;
  let timer = null;
  const go = () => {
    if (done) return;
    done = true;
    if (off) off();
    clearTimeout(timer);
    registerServiceWorker();
  };
  timer = setTimeout(go, 20000);
  off = onRuntime((r) => { if (r.stage === "ready" || r.stage === "failed") go(); });
  if (done) off();
}

registerWhenRuntimeSettles();

if (window.document$ && typeof window.document$.subscribe === "function") {
  window.document$.subscribe(() => initPage());
} else {
  initPage();
}
