"""3. Matrix and 4. throughput: the same calculations in CPython and in Pyodide.

- CPython: calc from this checkout, with the built site's dataset.json installed, in this process.
- Pyodide, raw: bench/pages/bench-pyodide.html runs the same Python timing code on the main
  thread (bytecode standard library, calc wheel): the runtime's own speed.
- Pyodide, in the page: the site's calculation worker through ``calculate()`` of couplewise.mjs,
  as the calculators call it (JSON in and out, one message per calculation).
"""

import json
import os

from .common import (CHROMIUM, CHROMIUM_ARGS, Guard, fms, fr, heading, line, median, ratio)

MATRIX_ENV = "seawater-quiescent"
REPEATS = 7

# Timing code shared by CPython and Pyodide (one string, run in both).
PY_TIMING = r'''
def _bench_matrix(request_json, repeats):
    import time
    from calc.api import call_json
    call_json("matrix", request_json)  # warm-up
    out = []
    for _ in range(repeats):
        t0 = time.perf_counter()
        text = call_json("matrix", request_json)
        out.append((time.perf_counter() - t0) * 1000)
    return out, len(text)

def _electrode_requests(n):
    from calc.dataset import current
    ids = [i for i in ("Zn2+/Zn", "Cu2+/Cu", "Fe2+/Fe", "Ni2+/Ni", "Ag+/Ag", "Pb2+/Pb", "Sn2+/Sn", "Cd2+/Cd")
           if i in {r["id"] for r in current().bundle["half_reactions"]}]
    return [{"id": ids[i % len(ids)], "temp_C": 5.0 + (i % 80),
             "molalities": {ids[i % len(ids)].split("/")[0]: 10.0 ** (-7 + i % 6)},
             "model": "davies", "ionic_strength": 0.005 + 0.01 * (i % 40)} for i in range(n)]

def _bench_electrodes(n, repeats):
    import time
    from calc.electrode import electrode_entry
    reqs = _electrode_requests(n)
    for r in reqs[:20]:
        electrode_entry(r)  # warm-up
    rates = []
    for _ in range(repeats):
        t0 = time.perf_counter()
        for r in reqs:
            electrode_entry(r)
        rates.append(n / (time.perf_counter() - t0))
    return rates
'''


def _cpython(site_dir):
    import calc.dataset

    with open(os.path.join(site_dir, "assets", "data", "dataset.json"), encoding="utf-8") as fh:
        calc.dataset.set_dataset(fh.read())
    ns = {}
    exec(PY_TIMING, ns)  # noqa: S102 - our own benchmark code
    return ns


def _pages(pw, server, guard):
    br = pw.chromium.launch(executable_path=CHROMIUM, headless=True, args=CHROMIUM_ARGS)
    ctx = br.new_context(viewport={"width": 1280, "height": 800})
    ctx.route("**/*", guard.route)
    raw = ctx.new_page()
    raw.goto(server.url("bench-pyodide.html"))
    raw.wait_for_function("() => !!window.benchPyodide", timeout=180_000)
    raw.evaluate("(code) => window.benchPyodide.runPython(code)", PY_TIMING)
    page = ctx.new_page()
    page.goto(server.url("calculators/couple/"))
    page.wait_for_function("() => performance.getEntriesByName('cw-result-painted').length > 0", timeout=180_000)
    return br, raw, page


def call_json_text(req_json):
    from calc.api import call_json

    return call_json("matrix", req_json)


def _raw(raw, expr):
    return raw.evaluate("(e) => window.benchPyodide.runPython(e).toJs({create_proxies: false})", expr)


WORKER_MATRIX = """async ([req, repeats]) => {
  const { calculate } = await import(new URL("assets/js/couplewise.mjs", location.origin + "/").href);
  await calculate("matrix", req);
  const out = [];
  for (let i = 0; i < repeats; i++) {
    const t0 = performance.now();
    const r = await calculate("matrix", req);
    out.push(performance.now() - t0);
    if (!r.ok) throw new Error(JSON.stringify(r.error));
  }
  return out;
}"""

WORKER_ELECTRODES = """async (reqs) => {
  const { calculate } = await import(new URL("assets/js/couplewise.mjs", location.origin + "/").href);
  const t0 = performance.now();
  const outs = await Promise.all(reqs.map((r) => calculate("electrode", r)));
  const dt = performance.now() - t0;
  const bad = outs.filter((o) => !o.ok);
  if (bad.length) throw new Error(JSON.stringify(bad[0].error));
  return reqs.length / (dt / 1000);
}"""


def _matrix_page(pw_page, server):
    """The matrix calculator with every material: environment change to painted, ms."""
    page = pw_page
    page.goto(server.url(f"calculators/matrix/?env={MATRIX_ENV}&m="))
    page.wait_for_function("() => performance.getEntriesByName('cw-result-painted').length > 0", timeout=180_000)
    page.evaluate("""() => document.addEventListener("change", () => performance.mark("bench-input"), true)""")
    out = []
    for k in range(REPEATS):
        n = page.evaluate("performance.getEntriesByName('cw-result-painted').length")
        page.select_option("#cw-env", "seawater-flowing" if k % 2 == 0 else MATRIX_ENV)
        page.wait_for_function(f"() => performance.getEntriesByName('cw-result-painted').length > {n}", timeout=60_000)
        out.append(page.evaluate("performance.measure('bench-m', 'bench-input', 'cw-result-painted').duration"))
    cells = page.evaluate("document.querySelectorAll('table.cw-matrix td').length")
    return out, cells



def _ratios(d, unit, words):
    """Pyodide against CPython for one row of figures (raw and in the page), added to d and printed."""
    d["ratio_raw"] = ratio(d[f"pyodide_raw_{unit}"], d[f"cpython_{unit}"])
    d["ratio_page"] = ratio(d[f"page_worker_{unit}"], d[f"cpython_{unit}"])
    line(f"ratio Pyodide/CPython{words}: raw {fr(d['ratio_raw'])}, in the page {fr(d['ratio_page'])}")

def run(server, site_dir, n_electrodes=1000):
    """Rounds alternate CPython, Pyodide raw and the page, so the three see the same machine load."""
    from playwright.sync_api import sync_playwright

    ns = _cpython(site_dir)
    req = {"env": MATRIX_ENV}
    req_json = json.dumps(req)
    import calc.dataset
    from calc.api import call

    n_materials = len(call("matrix", dict(req))["result"]["materials"])
    n_all = len(calc.dataset.current().bundle["materials"])
    reqs = json.loads(json.dumps(ns["_electrode_requests"](n_electrodes)))
    cpy_mx, raw_mx, page_mx, cpy_el, raw_el, page_el = [], [], [], [], [], []
    guard = Guard()
    with sync_playwright() as pw:
        br, raw, page = _pages(pw, server, guard)
        try:
            for i in range(REPEATS):
                cpy_mx += ns["_bench_matrix"](req_json, 1)[0]
                raw_mx += _raw(raw, f"_bench_matrix({req_json!r}, 1)")[0]
                page_mx += page.evaluate(WORKER_MATRIX, [req, 1])
            for i in range(3):
                cpy_el += ns["_bench_electrodes"](n_electrodes, 1)
                raw_el += _raw(raw, f"_bench_electrodes({n_electrodes}, 1)")
                page_el.append(page.evaluate(WORKER_ELECTRODES, reqs))
            ui_mx, cells = _matrix_page(page, server)
        finally:
            br.close()
    guard.check()
    size = len(call_json_text(req_json))

    heading(f"3. Matrix: every pair of the {n_materials} materials with data in {MATRIX_ENV} "
            f"({n_all} shipped; medians of {REPEATS} alternating rounds)")
    m = {"cpython_ms": median(cpy_mx), "pyodide_raw_ms": median(raw_mx), "page_worker_ms": median(page_mx),
         "page_ui_ms": median(ui_mx), "materials": n_materials, "result_bytes": size, "cells_painted": cells}
    line(f"CPython (calc.api.call_json 'matrix', JSON out): {fms(m['cpython_ms'])}   result {size / 1000:.0f} kB of JSON")
    line(f"Pyodide, raw (same code, main thread):          {fms(m['pyodide_raw_ms'])}")
    line(f"Pyodide, in the page (worker round trip):       {fms(m['page_worker_ms'])}")
    line(f"matrix calculator page, change to painted:      {fms(m['page_ui_ms'])} ({cells} cells)")
    _ratios(m, "ms", "")

    heading(f"4. Throughput: electrode potentials per second, molalities through the Davies model "
            f"({n_electrodes} requests, best of 3 alternating rounds)")
    t = {"cpython_per_s": max(cpy_el), "pyodide_raw_per_s": max(raw_el), "page_worker_per_s": max(page_el)}
    line(f"CPython:                               {t['cpython_per_s']:.0f} /s")
    line(f"Pyodide, raw (same code, main thread): {t['pyodide_raw_per_s']:.0f} /s")
    line(f"Pyodide, in the page (worker, JSON):   {t['page_worker_per_s']:.0f} /s")
    _ratios(t, "per_s", " (rate)")
    return {"matrix": m, "throughput": t}
