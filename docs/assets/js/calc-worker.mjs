// Couplewise calculation worker: owns the Pyodide runtime so the page never freezes.
// Everything is loaded from the site's own files; no other host is contacted.
const siteRoot = new URL("../../", import.meta.url);

function status(stage, detail) {
  self.postMessage({ type: "status", stage, detail });
}

async function boot() {
  status("loading", "runtime description");
  const info = await (await fetch(new URL("assets/runtime.json", siteRoot))).json();
  const indexURL = new URL(info.indexURL, siteRoot).href;
  status("loading", "Python runtime");
  const { loadPyodide } = await import(new URL("pyodide.mjs", indexURL).href);
  const quiet = { indexURL, stdout: () => {}, stderr: () => {} };
  let pyodide;
  if (info.stdLibURL) {
    // Standard library precompiled to bytecode at build time: much faster start.
    try {
      pyodide = await loadPyodide({ ...quiet, stdLibURL: new URL(info.stdLibURL, siteRoot).href });
    } catch (err) {
      status("loading", "Python runtime (plain standard library)");
    }
  }
  if (!pyodide) pyodide = await loadPyodide(quiet);
  status("loading", "calculation package");
  await pyodide.loadPackage(new URL(info.wheel, siteRoot).href, { messageCallback: () => {} });
  const api = pyodide.pyimport("calc.api");
  const callJson = api.call_json;
  status("ready", info.data_version);
  return { callJson, info };
}

const ready = boot().catch((err) => {
  status("failed", String(err && err.message ? err.message : err));
  throw err;
});

self.onmessage = async (event) => {
  const { id, name, request } = event.data || {};
  try {
    const { callJson } = await ready;
    const out = JSON.parse(callJson(name, JSON.stringify(request)));
    self.postMessage({ type: "result", id, out });
  } catch (err) {
    self.postMessage({ type: "result", id, out: { ok: false, error: { field: "runtime", message: "The calculation runtime could not run: " + String(err && err.message ? err.message : err) } } });
  }
};
