// Couplewise calculation worker: owns the Pyodide runtime so the page never freezes.
// Everything is loaded from the site's own files; no other host is contacted.
//
// Start-up takes the fastest path that works, and falls back so a failure costs time, never
// the answer (see docs/performance.md):
//   1. "snapshot": restore a memory image made at build time with calc already imported
//      (private Pyodide API; it pairs with the bytecode standard library it was made with);
//   2. "bytecode": the standard library precompiled to .pyc at build time, then the calc wheel;
//   3. "stock":    Pyodide's own standard library, then the calc wheel.
const siteRoot = new URL("../../", import.meta.url);

function status(stage, detail) {
  self.postMessage({ type: "status", stage, detail });
}

function message(err) {
  return String(err && err.message ? err.message : err);
}

// The snapshot is shipped gzip-compressed; it is inflated in the worker as it arrives. A server
// that labels the file Content-Encoding: gzip has the browser inflate it already: then the bytes
// do not start with the gzip signature and are used as they are.
async function fetchSnapshot(url) {
  const resp = await fetch(url);
  if (!resp.ok) throw new Error("snapshot: HTTP " + resp.status);
  const reader = resp.body.getReader();
  let first = await reader.read();
  while (!first.done && first.value.length < 2) { // the signature may straddle two chunks
    const more = await reader.read();
    if (more.done) break;
    const joined = new Uint8Array(first.value.length + more.value.length);
    joined.set(first.value);
    joined.set(more.value, first.value.length);
    first = { done: false, value: joined };
  }
  const body = new ReadableStream({
    start(controller) { if (!first.done) controller.enqueue(first.value); },
    async pull(controller) {
      const { done, value } = await reader.read();
      if (done) controller.close(); else controller.enqueue(value);
    },
    cancel(reason) { return reader.cancel(reason); },
  });
  const gzipped = !first.done && first.value[0] === 0x1f && first.value[1] === 0x8b;
  const stream = gzipped ? body.pipeThrough(new DecompressionStream("gzip")) : body;
  return new Uint8Array(await new Response(stream).arrayBuffer());
}

// Milliseconds since the worker started, per stage (read by the benchmark through self.cwStart).
const timings = {};
function stamp(name) { timings[name] = Math.round(performance.now()); }

async function boot() {
  status("loading", "runtime description");
  const info = await (await fetch(new URL("assets/runtime.json", siteRoot))).json();
  const indexURL = new URL(info.indexURL, siteRoot).href;
  const stdLibURL = info.stdLibURL ? new URL(info.stdLibURL, siteRoot).href : null;
  // Start the downloads at once: the runtime's large script (loadPyodide imports it later and
  // then finds it loaded) and the snapshot, while the runtime's small entry script loads.
  import(new URL("pyodide.asm.mjs", indexURL).href).catch(() => {}); // a failure shows in loadPyodide
  const snapshot = info.snapshot && stdLibURL ? fetchSnapshot(new URL(info.snapshot, siteRoot).href) : null;
  if (snapshot) snapshot.then(() => stamp("snapshot inflated"), () => {}); // failures: handled below
  stamp("runtime.json");
  status("loading", "Python runtime");
  const { loadPyodide } = await import(new URL("pyodide.mjs", indexURL).href);
  stamp("pyodide.mjs");
  const quiet = { indexURL, stdout: () => {}, stderr: () => {} };
  const failures = [];
  let pyodide = null;
  let api = null;
  let path = null;

  if (snapshot) {
    try {
      pyodide = await loadPyodide({ ...quiet, stdLibURL, _loadSnapshot: snapshot });
      stamp("python started");
      api = pyodide.pyimport("calc.api");
      const version = pyodide.runPython("import calc.dataset; calc.dataset.current().version");
      if (version !== info.data_version) throw new Error("snapshot holds data version " + version + ", the site " + info.data_version);
      path = "snapshot";
    } catch (err) {
      failures.push("snapshot: " + message(err));
      pyodide = api = null;
    }
  }
  for (const [name, opts] of [["bytecode", stdLibURL ? { stdLibURL } : null], ["stock", {}]]) {
    if (path || !opts) continue;
    try {
      if (name === "stock" && failures.length) status("loading", "Python runtime (plain standard library)");
      pyodide = await loadPyodide({ ...quiet, ...opts });
      stamp("python started");
      status("loading", "calculation package");
      await pyodide.loadPackage(new URL(info.wheel, siteRoot).href, { messageCallback: () => {}, errorCallback: () => {} });
      api = pyodide.pyimport("calc.api");
      path = name;
    } catch (err) {
      failures.push(name + ": " + message(err));
      pyodide = api = null;
    }
  }
  if (!path) throw new Error(failures.join("; "));
  // For tests and the benchmark (read through the worker's global scope): which path started.
  stamp("ready");
  self.cwStart = { path, failures, timings };
  const callJson = api.call_json;
  status("ready", info.data_version);
  return { callJson, info };
}

const ready = boot().catch((err) => {
  status("failed", message(err));
  throw err;
});

self.onmessage = async (event) => {
  const { id, name, request } = event.data || {};
  try {
    const { callJson } = await ready;
    const out = JSON.parse(callJson(name, JSON.stringify(request)));
    self.postMessage({ type: "result", id, out });
  } catch (err) {
    self.postMessage({ type: "result", id, out: { ok: false, error: { field: "runtime", message: "The calculation runtime could not run: " + message(err) } } });
  }
};
