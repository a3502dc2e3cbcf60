// Precompile Pyodide's standard library to bytecode, inside Pyodide itself (so the bytecode
// matches the runtime's Python exactly), and write it as a new zip for `stdLibURL`.
// Start-up then skips compiling ~140 modules from source (see docs/performance.md).
//   node build/make_pyc_stdlib.mjs node_modules/pyodide OUT.zip
import { readFileSync, writeFileSync } from "node:fs";
import { resolve } from "node:path";
import { pathToFileURL } from "node:url";

const [dir, out] = process.argv.slice(2);
const { loadPyodide } = await import(pathToFileURL(resolve(dir, "pyodide.mjs")).href);
const py = await loadPyodide({ indexURL: resolve(dir) + "/", stdout: () => {}, stderr: (s) => process.stderr.write(s + "\n") });
py.FS.writeFile("/tmp/stdlib_src.zip", readFileSync(resolve(dir, "python_stdlib.zip")));
const report = py.runPython(`
import importlib.util, marshal, zipfile
from importlib._bootstrap_external import _code_to_hash_pyc
src = zipfile.ZipFile("/tmp/stdlib_src.zip")
n_pyc = n_kept = n_fail = 0
with zipfile.ZipFile("/tmp/stdlib_pyc.zip", "w", zipfile.ZIP_DEFLATED) as dst:
    for info in src.infolist():
        data = src.read(info.filename)
        if info.filename.endswith(".py"):
            try:
                code = compile(data, info.filename, "exec", dont_inherit=True, optimize=0)
            except SyntaxError:
                dst.writestr(info.filename, data); n_fail += 1
                continue
            # unchecked hash-based pyc: zipimport loads it without looking for the source
            pyc = _code_to_hash_pyc(code, importlib.util.source_hash(data), checked=False)
            dst.writestr(info.filename + "c", bytes(pyc)); n_pyc += 1
        else:
            dst.writestr(info, data); n_kept += 1
f"{n_pyc} modules compiled, {n_kept} other files kept, {n_fail} left as source"
`);
writeFileSync(out, py.FS.readFile("/tmp/stdlib_pyc.zip"));
process.stderr.write(`stdlib bytecode zip: ${report}\n`);
