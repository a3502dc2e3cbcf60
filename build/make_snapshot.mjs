// Make a Pyodide memory snapshot with calc already imported and its dataset already loaded, so
// the page's worker starts Python by restoring memory instead of booting the interpreter,
// compiling and importing ~140 standard-library modules and reading the dataset.
//   node build/make_snapshot.mjs PYODIDE_DIR STDLIB_ZIP CALC_WHEEL DATA_VERSION OUT.gz
//
// Private Pyodide API (`_makeSnapshot`, `makeMemorySnapshot`, `_loadSnapshot`): the page keeps a
// tested fallback (bytecode stdlib alone, then the stock start). A snapshot only restores with
// the exact runtime build it was made with and the exact standard-library zip given here (the
// zip importer's index of that file lives in the snapshot), so the site ships both together.
// Files written to the in-memory file system are not part of a snapshot: everything calc needs
// is imported (and the dataset parsed) before the snapshot is taken.
import { readFileSync, writeFileSync } from "node:fs";
import { resolve } from "node:path";
import { pathToFileURL } from "node:url";
import { gzipSync } from "node:zlib";

const [dir, stdlib, wheel, dataVersion, out] = process.argv.slice(2);
if (!out) {
  process.stderr.write("usage: node build/make_snapshot.mjs PYODIDE_DIR STDLIB_ZIP CALC_WHEEL DATA_VERSION OUT.gz\n");
  process.exit(2);
}
const { loadPyodide } = await import(pathToFileURL(resolve(dir, "pyodide.mjs")).href);
const py = await loadPyodide({
  indexURL: resolve(dir) + "/",
  stdLibURL: resolve(stdlib),
  _makeSnapshot: true,
  stdout: () => {},
  stderr: (s) => process.stderr.write(s + "\n"),
});
py.FS.writeFile("/tmp/calc.whl", readFileSync(resolve(wheel)));
py.globals.set("expected_version", dataVersion);
const report = py.runPython(`
import importlib, json, os, pkgutil, site, sys, zipfile
with zipfile.ZipFile("/tmp/calc.whl") as whl:
    whl.extractall(site.getsitepackages()[0])
os.remove("/tmp/calc.whl")
import calc, calc.api, calc.dataset
# every module, those of the sub-packages too: files on the in-memory file system are not part
# of a snapshot, so a module not imported now could not be imported after the restore
modules = [m.name for m in pkgutil.walk_packages(calc.__path__, "calc.")]
for name in modules:
    if name not in ("calc.cli", "calc.clitext", "calc.__main__"):  # the command line is not used in the page
        importlib.import_module(name)
ds = calc.dataset.current()
if ds.version != expected_version:
    raise SystemExit(f"the wheel carries data version {ds.version}, expected {expected_version}")
# One call per entry point, so lazily imported standard-library modules are in memory too.
probe = {
    "electrode": {"id": "Zn2+/Zn"},
    "couple": {"a": "Zn2+/Zn", "b": "Cu2+/Cu"},
    "convert": {"value_V": 0, "from": "SCE", "to": "SHE"},
    "activity": {"species": "Zn2+", "ionic_strength": 0.01},
    "joint": {"a": "zinc", "b": "copper", "env": "seawater-flowing"},
    "matrix": {"env": "seawater-flowing", "csv": True},
    "eph": {"lines": [{"id": "O2/H2O"}]},
    "rate": {},
    "no-such-entry": {},
}
seen = {}
for name, req in probe.items():
    json.loads(calc.api.call_json(name, json.dumps(req)))
    seen[name] = True
del probe, seen, whl
# What the probes left behind is garbage: collect it before the memory is saved.
import gc
gc.collect()
f"{len(sys.modules)} modules imported, data version {ds.version}"
`);
py.globals.delete("expected_version");
const snap = py.makeMemorySnapshot();
// Level 6: within 1 % of level 9 in size (5.57 against 5.53 MB) at a quarter of the time.
const gz = gzipSync(snap, { level: 6 });
writeFileSync(out, gz);
process.stderr.write(`snapshot: ${report}; ${(snap.length / 1e6).toFixed(1)} MB raw, ${(gz.length / 1e6).toFixed(1)} MB gzip\n`);
