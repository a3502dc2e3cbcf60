// Couplewise page glue, the page's entry script: starts the calculation worker on any page, binds
// calculator pages (each loads only its own calculator's module, see calculators.mjs) and keeps
// the site offline-ready (service worker). Nothing imports this module; it imports site.mjs.
// Small and framework-free: the logic lives in calc (Python, run by Pyodide in the worker).
// Data text is only ever inserted as text (textContent), never as HTML.
import { loadCalculator } from "./calculators.mjs";
import { askVersion, dataset, h, onRuntime, precomputedAnswers, runtimeStatus, servedOverHttp, siteRoot, spec, startWorker } from "./site.mjs";

// For tests and benchmarks that drive the worker from a page (the same worker the page uses).
export { calculate } from "./site.mjs";

function initPage() {
  startWorker();
  for (const root of document.querySelectorAll("[data-cw-calc]")) {
    if (root.dataset.cwBound) continue;
    root.dataset.cwBound = "1";
    if (!servedOverHttp()) continue; // file://: file-pages.js (a classic script) shows the notice
    const name = root.dataset.cwCalc;
    const setup = loadCalculator(name);
    if (!setup) {
      root.replaceChildren(h("p", { class: "cw-error", text: "Unknown calculator: " + name }));
      continue;
    }
    root.prepend(runtimeStatus());
    dataset().catch(() => {}); // fetched while the calculator's module loads; errors show below
    spec().catch(() => {});
    precomputedAnswers(); // the build-time answer, asked for at once (shown even if the runtime fails first)
    setup.then((run) => run(root)).catch((err) => {
      root.append(h("p", { class: "cw-error", role: "alert", text: "This calculator could not start: " + String(err && err.message ? err.message : err) }));
    });
  }
}

// Offline: a service worker precaches the whole site, one cache per version. A new version found
// on a later online visit waits until the user accepts it in a non-blocking notice; then every
// open page reloads on it, so no page ever mixes the data or calc of two versions.
let swRegistration = null;

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
