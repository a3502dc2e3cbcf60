// The live parts of the About page (docs/about.md): the state of the calculation runtime in this
// browser, and what the service worker keeps of the site for offline use. A page entry script
// (mkdocs.yml); it does something only on a page with [data-cw-about] elements. The runtime is
// started by the page entry (couplewise.mjs) on every page; its state is shared through site.mjs.
import { askVersion, h, onRuntime, runtimeWords, servedOverHttp } from "./site.mjs";

const megabytes = (n) => (n / 1e6).toFixed(1) + " MB";

function runtimePart(el) {
  if (!servedOverHttp()) {
    el.textContent = "Not available: this page was opened from a file, where browsers do not let the Python runtime start.";
    return;
  }
  const off = onRuntime((rt) => {
    if (!el.isConnected) { queueMicrotask(() => off()); return; }
    el.textContent = runtimeWords(rt);
    el.dataset.stage = rt.stage;
  });
}

async function offlinePart(el) {
  if (!servedOverHttp() || !("serviceWorker" in navigator)) {
    el.textContent = "Not kept: this browser, or a page opened from a file, cannot keep an offline copy.";
    return;
  }
  const meta = await askVersion(navigator.serviceWorker.controller);
  if (!meta) {
    el.textContent = "Not kept yet: the copy is downloaded in the background once the calculator has loaded " +
      "on a first visit (a private window does not keep it). Reload this page later to see it here.";
    el.dataset.state = "none";
    return;
  }
  el.replaceChildren(
    "Kept on this device: ", h("strong", { text: meta.files ? meta.files + " files, " + megabytes(meta.bytes) : "the whole site" }),
    " (copy " + meta.version + ": data version " + meta.data_version + " of " + meta.data_date + ", build " + meta.build + ")." +
    " The pages, the search, the calculators with the Python runtime and their data, and the fonts of the formulas all work without a network.");
  el.dataset.state = "kept";
}

function init() {
  for (const el of document.querySelectorAll("[data-cw-about]")) {
    if (el.dataset.cwBound) continue;
    el.dataset.cwBound = "1";
    if (el.dataset.cwAbout === "runtime") runtimePart(el);
    else if (el.dataset.cwAbout === "offline") offlinePart(el);
  }
}

if (window.document$ && typeof window.document$.subscribe === "function") window.document$.subscribe(() => init());
else init();
