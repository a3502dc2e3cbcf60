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

function fileNotice(root) {
  root.replaceChildren(
    h("div", { class: "admonition warning cw-file-notice", role: "alert" },
      h("p", { class: "admonition-title", text: "This calculator cannot run from a file" }),
      h("p", { text: "Browsers do not let the Python runtime start on a page opened from the file manager. Serve the site from its folder with one command, then open the address it prints:" }),
      h("pre", {}, h("code", { text: "python3 -m http.server --bind 127.0.0.1 8000" })),
      h("p", { text: "Or, in a checkout of the project: make serve. The reference pages work without it." })));
}

function initPage() {
  startWorker();
  for (const root of document.querySelectorAll("[data-cw-calc]")) {
    if (root.dataset.cwBound) continue;
    root.dataset.cwBound = "1";
    if (!servedOverHttp()) { fileNotice(root); continue; }
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

// Offline: a service worker precaches the whole site. A new version found on a later online
// visit waits until the user accepts it in a non-blocking notice; then every page reloads on it.
let swRegistered = false;
function offerUpdate(reg) {
  if (document.querySelector(".cw-update")) return;
  const accept = h("button", { type: "button", class: "md-button md-button--primary", text: "Use the new version" });
  const later = h("button", { type: "button", class: "md-button", text: "Later" });
  const bar = h("div", { class: "cw-update", role: "status" },
    h("span", { text: "A new version of Couplewise (data or calculations) is ready. " }), accept, later);
  accept.addEventListener("click", () => {
    accept.disabled = true;
    if (reg.waiting) reg.waiting.postMessage({ type: "activate-new-version" });
  });
  later.addEventListener("click", () => bar.remove());
  document.body.append(bar);
}

function registerServiceWorker() {
  if (swRegistered || !servedOverHttp() || !("serviceWorker" in navigator)) return;
  swRegistered = true;
  let reloading = false;
  const hadController = !!navigator.serviceWorker.controller;
  navigator.serviceWorker.addEventListener("controllerchange", () => {
    if (!hadController || reloading) return;
    reloading = true;
    location.reload();
  });
  navigator.serviceWorker.register(new URL("sw.js", siteRoot).href, { scope: siteRoot.pathname }).then((reg) => {
    if (reg.waiting && navigator.serviceWorker.controller) offerUpdate(reg);
    reg.addEventListener("updatefound", () => {
      const nw = reg.installing;
      if (!nw) return;
      nw.addEventListener("statechange", () => {
        if (nw.state === "installed" && navigator.serviceWorker.controller) offerUpdate(reg);
      });
    });
  }).catch(() => { /* offline use is unavailable (e.g. private mode); the site still works online */ });
}

registerServiceWorker();

if (window.document$ && typeof window.document$.subscribe === "function") {
  window.document$.subscribe(() => initPage());
} else {
  initPage();
}
