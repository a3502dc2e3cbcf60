// What every page of the site shares: the calculation worker (started once, on any page), the
// site's generated data fetched once, and the DOM builder. Imported by the page entry
// (couplewise.mjs) and by the calculators' modules; it imports nothing.
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

export function startWorker() {
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

// This module is the first script of every page (an async module script in <head>,
// sitebuild/theme/main.html): evaluated as soon as it arrives, before the theme's bundle and the
// page entry, so the runtime's start overlaps the page's own loading.
if (typeof document !== "undefined") startWorker();

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

// The site's generated data, each fetched once per page: the dataset, calc's spec (the bounds
// of every input and each calculator's opening request) and the build-time answers.
const fetched = new Map();
function fetchOnce(path, required) {
  if (!fetched.has(path)) {
    const p = fetch(new URL(path, siteRoot)).then((r) => {
      if (!r.ok) throw new Error(path.split("/").pop() + ": HTTP " + r.status);
      return r.json();
    });
    fetched.set(path, required ? p : p.catch(() => null));
  }
  return fetched.get(path);
}

export function dataset() { return fetchOnce("assets/data/dataset.json", true); }
export function spec() { return fetchOnce("assets/data/spec.json", true); }
// Answers to each calculator's opening request, computed at build time (sitebuild/precompute.py),
// keyed by calculator name and canonical request JSON; null when unavailable.
export function precomputedAnswers() { return fetchOnce("assets/data/precomputed.json", false); }

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

// The runtime's status line of a calculator: made as soon as the page binds the calculator
// (before its module has loaded), then taken over by the calculator's frame (ui.mjs). It speaks
// only while it matters to the user: while the calculator is still loading, or when it could not
// start; once ready it is empty and hidden (its state stays in data-stage, and in full words on
// the About page, runtimeWords()).
export function runtimeStatus() {
  const status = h("div", { class: "cw-runtime", role: "status", "aria-live": "polite" });
  onRuntime((rt) => {
    status.dataset.stage = rt.stage;
    if (rt.stage === "loading") {
      status.replaceChildren("Loading the calculator… Changes to the inputs are calculated as soon as it is ready.");
    } else if (rt.stage === "failed") {
      status.replaceChildren("The calculator could not start (" + rt.detail + "). Reloading the page tries again; ",
        h("a", { href: new URL("about/", siteRoot).href, text: "About this copy" }), " says what this browser holds.");
    } else status.replaceChildren();
    status.hidden = !status.firstChild;
  });
  return status;
}

// The runtime's state in full words, for the About page.
export function runtimeWords(rt) {
  return {
    idle: "Not started on this page.",
    loading: "Loading (" + rt.detail + ")…",
    ready: "Ready: the calculations run in this browser, on data version " + rt.detail + ".",
    failed: "Could not start: " + rt.detail + ".",
  }[rt.stage] || rt.stage;
}

// The version a service worker serves, {version, data_version, data_date, build, files, bytes},
// or null when it does not answer within 3 s.
export function askVersion(sw) {
  return new Promise((resolve) => {
    if (!sw) { resolve(null); return; }
    const channel = new MessageChannel();
    const timer = setTimeout(() => resolve(null), 3000);
    channel.port1.onmessage = (event) => { clearTimeout(timer); resolve(event.data || null); };
    sw.postMessage({ type: "version" }, [channel.port2]);
  });
}
