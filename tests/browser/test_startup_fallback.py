"""The runtime's start-up paths and their fallbacks, and the build-time answers.

The worker starts from the memory snapshot when the site has one, else from the bytecode
standard library, else from Pyodide's own; each failure must cost time, never the answer. The
calculators show a build-time answer for their opening inputs while the runtime starts, marked
as such, and only when the page's request is exactly the precomputed one.
"""

import json
import math
import os

import pytest

pytestmark = pytest.mark.browser

RUNTIME_MS = 180_000
COUPLE = "calculators/couple/"
# A request away from the demo inputs, so only the runtime can answer it.
PROBES = [
    ("couple", {"a": "Fe2+/Fe", "b": "O2/H2O", "temp_C": 60, "pH": 5.5, "activities": {"Fe2+": 1e-4}, "pressures": {"O2": 0.21}}),
    ("electrode", {"id": "Ni2+/Ni", "temp_C": 45, "molalities": {"Ni2+": 0.002}, "model": "davies", "ionic_strength": 0.05}),
    ("joint", {"a": "zinc", "b": "copper", "env": "fresh-water", "area_ratio": 3}),
]

CALCULATE = """async (probes) => {
  const { calculate } = await import(new URL("assets/js/couplewise.mjs", location.origin + "/").href);
  const out = [];
  for (const [name, req] of probes) out.push(await calculate(name, req));
  return out;
}"""


def _runtime(built_site):
    with open(os.path.join(built_site, "assets", "runtime.json"), encoding="utf-8") as fh:
        return json.load(fh)


def _open(page, served, path=COUPLE):
    page.goto(served.url(path))
    page.wait_for_function("() => performance.getEntriesByName('cw-result-painted').length > 0", timeout=RUNTIME_MS)
    start = None
    for w in page.workers:
        if w.url.endswith("calc-worker.mjs"):
            start = w.evaluate("self.cwStart || null")
    value = page.locator(".cw-result .cw-big-value").first.inner_text().strip()
    return start, value, page.evaluate(CALCULATE, PROBES)


def _same(outs):
    """The answers as comparable text (compared whole: numbers, steps, warnings, sources)."""
    return json.dumps(outs, sort_keys=True)


@pytest.fixture(scope="module")
def reference(browser, served, built_site):
    """The answers on the normal start path."""
    from browserkit import new_guarded_page

    ctx, page, guard = new_guarded_page(browser)
    try:
        start, value, outs = _open(page, served)
    finally:
        ctx.close()
    assert guard.outside == []
    assert all(o["ok"] for o in outs), outs
    return {"start": start, "value": value, "outs": outs, "runtime": _runtime(built_site)}


def test_normal_start_uses_the_fastest_path(reference):
    rt = reference["runtime"]
    expected = "snapshot" if rt.get("snapshot") else "bytecode" if rt.get("stdLibURL") else "stock"
    assert reference["start"]["path"] == expected, reference["start"]
    assert reference["start"]["failures"] == []


def _route_404(ctx, *fragments):
    def handler(route):
        if any(f in route.request.url for f in fragments):
            route.fulfill(status=404, body="not here")
        else:
            route.fallback()
    ctx.route("**/*", handler)


@pytest.mark.parametrize("missing,expected_path", [
    (("/pyodide/snapshot-",), "bytecode"),
    (("/pyodide/snapshot-", "/pyodide/python_stdlib_pyc.zip"), "stock"),
], ids=["snapshot-404", "snapshot-and-bytecode-404"])
def test_fallback_gives_the_same_answers(browser, served, reference, missing, expected_path):
    from browserkit import new_guarded_page

    if not reference["runtime"].get("stdLibURL"):
        pytest.skip("this build has no bytecode standard library (no Node.js at build time)")
    ctx, page, guard = new_guarded_page(browser)
    _route_404(ctx, *missing)  # registered last: runs before the guard's route
    try:
        start, value, outs = _open(page, served)
    finally:
        ctx.close()
    assert guard.outside == []
    # Pyodide reports a file it could not fetch (an abandoned start leaves that report unhandled):
    # expected for the files removed here, nothing else.
    assert [e for e in guard.page_errors if not any(m in e for m in missing)] == []
    assert start["path"] == expected_path, start
    if reference["runtime"].get("snapshot"):
        assert any(f.startswith("snapshot:") for f in start["failures"]), start
    assert value == reference["value"]
    assert _same(outs) == _same(reference["outs"])


def test_corrupt_snapshot_falls_back(browser, served, reference):
    """Bytes that look like gzip but are not: inflating fails, the next path answers."""
    from browserkit import new_guarded_page

    if not reference["runtime"].get("snapshot"):
        pytest.skip("this build has no snapshot")
    ctx, page, guard = new_guarded_page(browser)

    def handler(route):
        if "/pyodide/snapshot-" in route.request.url:
            route.fulfill(status=200, body=b"\x1f\x8b\x08\x00" + b"not a snapshot" * 100,
                          headers={"Content-Type": "application/octet-stream"})
        else:
            route.fallback()
    ctx.route("**/*", handler)
    try:
        start, value, outs = _open(page, served)
    finally:
        ctx.close()
    assert start["path"] == "bytecode", start
    assert value == reference["value"]
    assert _same(outs) == _same(reference["outs"])


CALCULATORS = ["couple", "electrode", "convert", "activity", "joint", "matrix"]


@pytest.mark.parametrize("name", CALCULATORS)
def test_build_time_answer_shows_while_the_runtime_is_away(browser, served, name):
    """With the runtime's script unreachable, each calculator still shows the build-time answer
    for its opening inputs, marked as such (proves its request is the precomputed one)."""
    from browserkit import new_guarded_page

    ctx, page, guard = new_guarded_page(browser)

    def handler(route):
        if route.request.url.endswith("/pyodide/pyodide.mjs"):
            route.fulfill(status=404, body="not here")
        else:
            route.fallback()
    ctx.route("**/*", handler)
    try:
        page.goto(served.url(f"calculators/{name}/"))
        page.wait_for_function("() => performance.getEntriesByName('cw-early-painted').length > 0", timeout=60_000)
        note = page.locator(".cw-result .cw-early-note")
        note.wait_for(timeout=10_000)
        # marked as worked out in advance (the wording of runner.mjs, EARLY_LOADING / EARLY_FAILED)
        assert "worked out in advance" in note.inner_text().lower()
        page.wait_for_function("() => document.querySelector('.cw-runtime').dataset.stage === 'failed'", timeout=60_000)
        page.wait_for_function("() => /could not start/.test(document.querySelector('.cw-early-note').textContent)",
                               timeout=60_000)
        assert page.locator(".cw-result.cw-early").count() == 1
        assert page.locator(".cw-result.cw-stale").count() == 0
    finally:
        ctx.close()
    assert guard.outside == []


def test_build_time_answer_shows_when_the_runtime_fails_before_it_loads(browser, served):
    """The runtime can fail before the build-time answers have arrived (a missing runtime file
    fails fast): the answer is still shown when it arrives, with the note that the runtime could
    not start. The answers' file is held back until the runtime has failed."""
    from browserkit import new_guarded_page

    ctx, page, guard = new_guarded_page(browser)
    held = []

    def handler(route):
        if route.request.url.endswith("/pyodide/pyodide.mjs"):
            route.fulfill(status=404, body="not here")
        elif route.request.url.endswith("/assets/data/precomputed.json") and not held:
            held.append(route)  # answered below, once the runtime has failed
        else:
            route.fallback()
    ctx.route("**/*", handler)
    try:
        page.goto(served.url(COUPLE))
        page.wait_for_function("() => document.querySelector('.cw-runtime').dataset.stage === 'failed'", timeout=60_000)
        assert page.evaluate("() => performance.getEntriesByName('cw-early-painted').length") == 0
        assert held, "the page did not ask for the build-time answers"
        held[0].fallback()
        page.wait_for_function("() => performance.getEntriesByName('cw-early-painted').length > 0", timeout=60_000)
        page.wait_for_function("() => /could not start/.test(document.querySelector('.cw-early-note').textContent)",
                               timeout=60_000)
        assert page.locator(".cw-result.cw-stale").count() == 0
    finally:
        ctx.close()
    assert guard.outside == []


def test_build_time_answer_is_replaced_by_the_runtime(guarded, served, reference):
    page, guard = guarded
    page.goto(served.url(COUPLE))
    page.wait_for_function("() => performance.getEntriesByName('cw-result-painted').length > 0", timeout=RUNTIME_MS)
    marks = page.evaluate("performance.getEntriesByType('mark').map(m => m.name)")
    assert "cw-early-painted" in marks and marks.index("cw-early-painted") < marks.index("cw-result-painted")
    assert page.locator(".cw-result .cw-early-note").count() == 0
    assert page.locator(".cw-result.cw-early").count() == 0
    assert page.locator(".cw-result .cw-big-value").first.inner_text().strip() == reference["value"]


def test_no_build_time_answer_for_other_inputs(guarded, served):
    page, guard = guarded
    page.goto(served.url(COUPLE + "?a=Zn2%2B%2FZn&b=Cu2%2B%2FCu&t=36&a.Zn2%2B=1e-5&a.Cu2%2B=1e-6"))
    page.wait_for_function("() => performance.getEntriesByName('cw-result-painted').length > 0", timeout=RUNTIME_MS)
    marks = page.evaluate("performance.getEntriesByType('mark').map(m => m.name)")
    assert "cw-early-painted" not in marks


def test_canonical_request_json_agrees_with_the_build(guarded, served):
    """The page and sitebuild/precompute.py write the same canonical JSON for a request."""
    from sitebuild.precompute import canonical

    page, guard = guarded
    page.goto(served.url(COUPLE))
    values = [{"b": [35.0, "Zn2+/Zn"], "a": {"Zn2+": 1e-05, "Cu2+": 1e-06}},
              {"t": 0.1, "x": 1e21, "y": 1.5e-7, "z": -0.93, "big": 123456789012.0, "n": None, "ok": True},
              {"v": 2.5e-6, "w": 0.000123, "u": 100.0, "s": "Ag/AgCl seawater", "e": {}, "l": []}]
    got = page.evaluate("""async (values) => {
      const { canonical } = await import(new URL("assets/js/runner.mjs", location.origin + "/").href);
      return values.map(canonical);
    }""", values)
    assert got == [canonical(v) for v in values]


def test_build_time_answers_equal_the_runtime_answers(guarded, served):
    """Every precomputed answer (CPython at build time) is what the runtime computes (Pyodide)."""
    page, guard = guarded
    page.goto(served.url(COUPLE))
    page.wait_for_function("() => performance.getEntriesByName('cw-result-painted').length > 0", timeout=RUNTIME_MS)
    out = page.evaluate("""async () => {
      const data = await (await fetch(new URL("assets/data/precomputed.json", location.origin + "/"))).json();
      const { calculate } = await import(new URL("assets/js/couplewise.mjs", location.origin + "/").href);
      const rows = [];
      for (const [name, answers] of Object.entries(data.answers)) {
        for (const [key, result] of Object.entries(answers)) {
          const live = await calculate(name, JSON.parse(key));
          rows.push([name, live.ok, live.result, result]);
        }
      }
      return rows;
    }""")
    # every calculator checked above has its build-time answers here (others may have some too)
    assert set(CALCULATORS) <= {name for name, _, _, _ in out}
    # the same answer: texts exactly, numbers to 1e-12 relative (CPython's and the runtime's maths
    # libraries may differ in the last bit of a power or logarithm, e.g. in the mixed-potential solver)
    assert [(name, _differ(live, built)[:3]) for name, ok, live, built in out if not ok or _differ(live, built)] == []


def _differ(a, b, path="result"):
    """Where two JSON values differ (floats to 1e-12 relative): a list of 'path: a != b'."""
    if isinstance(a, float) or isinstance(b, float):
        same = (isinstance(a, (int, float)) and isinstance(b, (int, float)) and not isinstance(a, bool)
                and math.isclose(a, b, rel_tol=1e-12, abs_tol=1e-300))
        return [] if same else [f"{path}: {a!r} != {b!r}"]
    if isinstance(a, dict) and isinstance(b, dict) and a.keys() == b.keys():
        return [d for k in a for d in _differ(a[k], b[k], f"{path}.{k}")]
    if isinstance(a, list) and isinstance(b, list) and len(a) == len(b):
        return [d for i, (x, y) in enumerate(zip(a, b)) for d in _differ(x, y, f"{path}[{i}]")]
    return [] if a == b else [f"{path}: {str(a)[:80]} != {str(b)[:80]}"]
