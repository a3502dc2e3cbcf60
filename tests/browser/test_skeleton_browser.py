"""The walking skeleton end to end: the built site computes a couple in the browser, offline."""

import os
from urllib.parse import urlencode

import pytest

pytestmark = pytest.mark.browser

RUNTIME_TIMEOUT_MS = 120_000


def test_site_build_contains_runtime_and_wheel(built_site):
    for name in ("pyodide.mjs", "pyodide.asm.mjs", "pyodide.asm.wasm", "python_stdlib.zip", "pyodide-lock.json"):
        assert os.path.isfile(os.path.join(built_site, "pyodide", name)), name
    wheels = [f for _, _, fs in os.walk(os.path.join(built_site, "wheels")) for f in fs if f.endswith(".whl")]
    assert len(wheels) == 1
    assert os.path.isfile(os.path.join(built_site, "assets", "data", "dataset.json"))
    assert os.path.isfile(os.path.join(built_site, "reference", "series", "index.html"))


def test_site_ships_nothing_it_never_loads(built_site):
    files = [os.path.relpath(os.path.join(d, f), built_site) for d, _, fs in os.walk(built_site) for f in fs]
    assert not [f for f in files if f.endswith(".map")], "source maps are for developer tools only"
    assert not [f for f in files if "lunr" in f], "this English-only site's search loads no language files"
    assert not [f for f in files if "screens" in f], "the README's screenshots are not part of the site"
    # ...while the search itself is there (its worker and index)
    assert [f for f in files if f.startswith(os.path.join("assets", "javascripts", "workers", "search."))]
    assert os.path.isfile(os.path.join(built_site, "search", "search_index.json"))


def test_served_mime_types(served):
    import urllib.request

    for path, mime in (("pyodide/pyodide.asm.wasm", "application/wasm"), ("pyodide/pyodide.mjs", "text/javascript")):
        with urllib.request.urlopen(served.url(path)) as resp:
            assert resp.headers["Content-Type"].startswith(mime)


def test_couple_non_standard_case_in_browser(served, guarded):
    # Daniell cell with a(Zn2+) = 0.1 and a(Cu2+) = 0.001 at 25 °C:
    # E = [0.3419 − (−0.7618)] − (0.0591593/2)·log10(0.1/0.001) = 1.1037 − 0.05916 = 1.0445 V
    # (E° from the CRC Handbook electrochemical series, Vanýsek; Nernst equation.)
    page, guard = guarded
    query = urlencode({"a": "Zn2+/Zn", "b": "Cu2+/Cu", "t": "25", "a.Zn2+": "0.1", "a.Cu2+": "0.001"})
    page.goto(served.url("calculators/couple/?" + query))
    value = page.locator(".cw-big-value")
    value.wait_for(timeout=RUNTIME_TIMEOUT_MS)
    assert value.inner_text().strip() == "+1.0445"
    direction = page.locator(".cw-direction").inner_text()
    assert "Zn2+/Zn is oxidised" in direction and "Cu2+/Cu is reduced" in direction

    # The user changes an input: the result follows without any button.
    page.fill("#cw-sp-Cu2_", "1")
    page.wait_for_function("() => document.querySelector('.cw-big-value').textContent.trim() === '+1.1333'",
                           timeout=30_000)  # 1.1037 − (0.0591593/2)·log10(0.1/1) = 1.1333 V
    os.makedirs("tests/artifacts", exist_ok=True)
    page.screenshot(path="tests/artifacts/couple-1280.png", full_page=True)
