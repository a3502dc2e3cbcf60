// Bench only (never shipped): Pyodide's default start in a module worker, then `1 + 1`.
const { loadPyodide } = await import(new URL("./pyodide/pyodide.mjs", self.location.href).href);
const pyodide = await loadPyodide({ indexURL: new URL("./pyodide/", self.location.href).href });
self.postMessage(pyodide.runPython("1 + 1"));
