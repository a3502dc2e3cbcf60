"""Mathematics typeset offline, and working screens without developer words (issue 17).

1. KaTeX (npm package ``katex``, pinned) is staged into the built site and precached by the
   service worker; the methods page is typeset by it under the site's Content-Security-Policy
   sent as a header (no violation, no request to another host), over HTTP, after instant
   navigation and from the file system.
2. The text of results follows one rule (docs/assets/js/math.mjs): checked against a table, and
   in every derivation of every calculator's opening answer: no caret, no number in exponent
   form, no hyphen-minus used as a sign.
3. The About page shows the data version, the build, the runtime's version and state, and what
   is kept offline; working pages show a status only while it matters (loading, failed).

Typographic rules checked here (no published value is involved): the minus sign is U+2212
MINUS SIGN, not U+002D HYPHEN-MINUS (The Unicode Standard, Version 15.0, 2022, ch. 6.2
"Dashes" and ch. 22.7 "Mathematical Symbols"; ISO 80000-2:2019 item 2-8.1 writes a − b with the
minus sign, from memory); powers of ten written a × 10ⁿ with the exponent raised (ISO 80000-1:2009
§7.2.1, from memory; common practice).
"""

import json
import os
import re
import sys

import pytest

from test_csp import assert_clean, calculator_pages, csp_served, violations, wait_js, watched_page  # noqa: F401

pytestmark = pytest.mark.browser

ROOT = os.path.dirname(os.path.dirname(os.path.dirname(os.path.abspath(__file__))))
if ROOT not in sys.path:
    sys.path.insert(0, ROOT)
RUNTIME_MS = 240_000
TYPESET = "document.documentElement.dataset.cwMath === 'done' && !document.querySelector('.cw-math-pending')"
# a hyphen-minus used as a sign: before a number, not joined to a word, an id or a range
SIGN_HYPHEN = re.compile(r"(?<![\w])-\.?\d")
EXPONENT_FORM = re.compile(r"\d[eE][+\-−]?\d")


def _json(*parts):
    with open(os.path.join(ROOT, *parts), encoding="utf-8") as fh:
        return json.load(fh)


def _page_url(rel):
    return rel[: -len("index.html")] if rel.endswith("index.html") else rel


# --------------------------------------------------------------------------- staging, precache

def test_katex_is_pinned_staged_with_its_fonts_and_precached(built_site):
    pkg, lock = _json("package.json"), _json("package-lock.json")
    version = pkg["dependencies"]["katex"]
    assert re.fullmatch(r"\d+\.\d+\.\d+", version), "katex must be pinned to an exact version"
    assert lock["packages"]["node_modules/katex"]["version"] == version
    assert _json("node_modules", "katex", "package.json")["version"] == version
    site = os.path.join(built_site, "katex")
    css = open(os.path.join(site, "katex.min.css"), encoding="utf-8").read()
    fonts = set(re.findall(r"url\(([^)]+)\)", css))
    assert fonts and all(f.startswith("fonts/") and f.endswith(".woff2") for f in fonts), fonts
    assert {"fonts/KaTeX_Main-Regular.woff2", "fonts/KaTeX_Math-Italic.woff2"} <= fonts
    for f in fonts:
        assert os.path.isfile(os.path.join(site, f)), f
    assert sorted(os.listdir(os.path.join(site, "fonts"))) == sorted(f[len("fonts/"):] for f in fonts)
    assert os.path.isfile(os.path.join(site, "katex.min.js")) and os.path.isfile(os.path.join(site, "LICENSE"))
    with open(os.path.join(built_site, "sw.js"), encoding="utf-8") as fh:
        text = fh.read()
    precached = {item[0] for item in json.loads(re.search(r"PRECACHE\s*=\s*(\[.*?\])\s*;", text, re.S).group(1))}
    staged = {"katex/katex.min.js", "katex/katex.min.css", "katex/LICENSE"} | {"katex/" + f for f in fonts}
    assert staged <= precached, staged - precached


# --------------------------------------------------------------------------- the methods page

def _check_typeset(page, where):
    wait_js(page, TYPESET, 30_000)
    counts = page.evaluate("""() => ({
        formulas: document.querySelectorAll('article .arithmatex').length,
        typeset: document.querySelectorAll('article .arithmatex.cw-math-done > .katex, article .arithmatex.cw-math-done .katex-display').length,
        failed: document.querySelectorAll('.cw-math-failed').length,
        mathml: document.querySelectorAll('article .arithmatex math').length })""")
    assert counts["formulas"] >= 30 and counts["failed"] == 0, (where, counts)
    assert counts["typeset"] == counts["formulas"] == counts["mathml"], (where, counts)
    text = page.evaluate("document.querySelector('article').innerText")
    for raw in ("\\(", "\\[", "\\frac", "^{", "\\mathrm", "\\sqrt"):
        assert raw not in text, (where, raw)


def test_methods_page_is_typeset_by_katex_under_the_policy(csp_served, browser):
    ctx, page, guard = watched_page(browser)
    ctx.route("**/pyodide/**", lambda r: r.abort())  # the runtime is not what this test is about
    try:
        page.goto(csp_served.url("methods/"), wait_until="load")
        _check_typeset(page, "methods")
        resources = page.evaluate("performance.getEntriesByType('resource').map((e) => e.name)")
        assert any(u.endswith("/katex/katex.min.js") for u in resources)
        assert any("/katex/fonts/KaTeX_Main-Regular.woff2" in u for u in resources), "KaTeX's own font is used"
        assert page.evaluate("document.fonts.check('16px KaTeX_Main')")
        assert all(u.startswith(csp_served.url()) for u in resources), resources
        # a display formula is a typeset fraction, not text
        assert page.locator("article div.arithmatex .katex-display .mfrac").count() >= 5
        page.wait_for_timeout(300)
        assert violations(page) == []
        assert_clean(page, guard, "methods", tolerate="/pyodide/pyodide.mjs")
        # reached by the theme's instant navigation (the page content is swapped, not loaded)
        page.goto(csp_served.url(""), wait_until="load")
        page.locator("nav.md-tabs a", has_text="Methods").first.click()
        page.wait_for_url("**/methods/")
        _check_typeset(page, "methods after instant navigation")
        assert_clean(page, guard, "instant navigation", tolerate="/pyodide/pyodide.mjs")
    finally:
        ctx.close()


def test_methods_page_is_typeset_from_the_file_system(built_site, browser):
    from test_csp import COLLECT

    ctx = browser.new_context()
    ctx.add_init_script(COLLECT)
    try:
        page = ctx.new_page()
        page.goto("file://" + os.path.join(built_site, "methods", "index.html"))
        _check_typeset(page, "file://")
        assert violations(page) == []
    finally:
        ctx.close()


# --------------------------------------------------------------------------- the text rule

#: text of the engine -> (text shown, the raised parts in order); the rule of math.mjs
RULE_TABLE = [
    ("Q = 1 / 1e-05", "Q = 1 / 10−5", ["−5"]),
    ("log10 K = 36.0666, K = 1.16572e+36", "log10 K = 36.0666, K = 1.16572 × 1036", ["36"]),
    ("A = 0.52 kg^1/2 mol^-1/2 Å^-1", "A = 0.52 kg1/2 mol−1/2 Å−1", ["1/2", "−1/2", "−1"]),
    ("Q = 1^2 / [1·1e-10^14]", "Q = 12 / [1·(10−10)14]", ["2", "−10", "14"]),
    ("a(H+) = 10^(−pH), 10^(−14.7 − log10 a(H+))", "a(H+) = 10−pH, 10−14.7 − log10 a(H+)", ["−pH", "−14.7 − log10 a(H+)"]),
    ("Cr2O7^2-(aq) + NO3^- + NH4^+", "Cr2O72−(aq) + NO3− + NH4+", ["2−", "−", "+"]),
    ("E_nom = (-1.00 + -0.76) / 2; |-0.88 − (-0.05)|", "E_nom = (−1.00 + −0.76) / 2; |−0.88 − (−0.05)|", []),
    ("aluminium-5083 + cuni-90-10 in (2.4-4 m/s), 2024-05-01", "aluminium-5083 + cuni-90-10 in (2.4-4 m/s), 2024-05-01", []),
    ("−0.4989·(-2)²·√0.3", "−0.4989·(−2)²·√0.3", []),
    ("CR = 3.27e-3 × [1, 4]; Re 1e4", "CR = 3.27 × 10−3 × [1, 4]; Re 104", ["−3", "4"]),
    ("UNS B401e3, Sc^(1/3), λB^1.5, (t − t0)^i, K = 10^{nFE}", "UNS B401e3, Sc1/3, λB1.5, (t − t0)i, K = 10nFE", ["1/3", "1.5", "i", "nFE"]),
]
#: number -> as the page writes it (numberText, ui.fmt)
NUMBER_TABLE = [(-0.9135, 4, "−0.9135"), (1.16572e36, 4, "1.166 × 10³⁶"), (-2.5e-7, 4, "−2.500 × 10⁻⁷"),
                (0.25, 2, "0.25"), (0, 4, "0.0000"), (123456.0, 1, "123456.0")]


def test_the_text_rule_of_the_page(served, guarded):
    page, _ = guarded
    page.goto(served.url("methods/"))
    got = page.evaluate("""async ([url, rules, numbers]) => {
        const m = await import(url);
        const el = document.createElement("div");
        return {
          rules: rules.map(([t]) => { el.replaceChildren(...m.mathNodes(t));
            return [el.textContent, [...el.querySelectorAll("sup.cw-sup")].map((s) => s.textContent), el.innerHTML.includes("<") ? [...el.querySelectorAll("*")].map((e) => e.tagName) : []]; }),
          numbers: numbers.map(([x, d]) => m.numberText(x, d)),
          text: [m.mathText("Hg2^2+/Hg"), m.mathText("HCO3^- at 1e-05"), m.mathText("kg^1/2")],
        };
    }""", [served.url("assets/js/math.mjs"), RULE_TABLE, NUMBER_TABLE])
    for (text, shown, raised), (g_shown, g_raised, tags) in zip(RULE_TABLE, got["rules"]):
        assert (g_shown, g_raised) == (shown, raised), text
        assert set(tags) <= {"SUP"}, (text, tags)  # text nodes and <sup> only, never other markup
    assert got["numbers"] == [s for _, _, s in NUMBER_TABLE]
    assert got["text"] == ["Hg2²⁺/Hg", "HCO3⁻ at 10⁻⁵", "kg^(1/2)"]


def _opened(page, served, path):
    page.goto(served.url(path))
    page.wait_for_function("() => document.querySelector('.cw-runtime')?.dataset.stage === 'ready'", timeout=RUNTIME_MS)
    page.wait_for_function("() => [...document.querySelectorAll('.cw-result')].every((r) => !r.hasAttribute('aria-busy'))",
                           timeout=RUNTIME_MS)
    page.wait_for_timeout(500)


def test_derivations_of_every_opening_answer_follow_the_rule(built_site, served, guarded):
    page, guard = guarded
    seen = {}
    for path in calculator_pages(built_site):
        _opened(page, served, path)
        page.evaluate("document.querySelectorAll('details.cw-derivation').forEach((d) => { d.open = true; })")
        texts = page.evaluate("[...document.querySelectorAll('.cw-derivation')].map((d) => d.innerText)")
        seen[path] = len(texts)
        for text in texts:
            for line in text.splitlines():
                assert "^" not in line, (path, line)
                assert not EXPONENT_FORM.search(line), (path, line)
                assert not SIGN_HYPHEN.search(line), (path, line)
        # the big figure of a result: a true minus sign
        result = page.evaluate("[...document.querySelectorAll('.cw-result .cw-big-value')].map((e) => e.innerText).join(' ')")
        assert "-" not in result, (path, result)
    opening = {"calculators/couple/", "calculators/electrode/", "calculators/convert/", "calculators/activity/",
               "calculators/joint/", "calculators/matrix/", "calculators/field/"}
    assert all(seen.get(p) for p in opening), seen
    # the couple's opening answer has K ≈ 10^36 and Q = 10^5: set raised
    _opened(page, served, "calculators/couple/")
    sups = page.evaluate("[...document.querySelectorAll('.cw-derivation sup.cw-sup')].map((s) => s.textContent)")
    assert "36" in sups and "−5" in sups, sups
    k_row = page.locator(".cw-result tr", has_text="Equilibrium constant K").inner_text()
    assert re.search(r"\d × 10³⁶", k_row) and "10^" not in k_row, k_row
    assert guard.console_errors == [], guard.console_errors


# --------------------------------------------------------------------------- About, status words

def test_the_about_page_says_which_copy_this_is(built_site, served, guarded):
    page, guard = guarded
    with open(os.path.join(built_site, "assets", "runtime.json"), encoding="utf-8") as fh:
        rt = json.load(fh)
    pyodide = _json("node_modules", "pyodide", "package.json")["version"]
    katex = _json("node_modules", "katex", "package.json")["version"]
    page.goto(served.url("about/"))
    article = page.locator("article")
    text = article.inner_text()
    assert rt["data_version"] in text and rt["data_date"] in text and rt["build"] in text
    assert "Pyodide " + pyodide in text and "KaTeX " + katex in text
    state = page.locator("[data-cw-about=runtime]")
    page.wait_for_function("() => document.querySelector('[data-cw-about=runtime]').dataset.stage === 'ready'",
                           timeout=RUNTIME_MS)
    assert state.inner_text().startswith("Ready") and rt["data_version"] in state.inner_text()
    assert page.locator("[data-cw-about=offline]").inner_text().strip()
    link = article.locator("a", has_text="performance record").first
    assert link.get_attribute("href").rstrip("/").endswith("performance")
    # Performance sits under About in the navigation
    nav = page.evaluate("""() => [...document.querySelectorAll('nav.md-nav--primary .md-nav__item--nested')]
        .map((i) => [i.querySelector('label, a').innerText.trim(), [...i.querySelectorAll('a.md-nav__link')].map((a) => a.innerText.trim())])""")
    about = [links for name, links in nav if name == "About"]
    assert about and "Performance" in about[0] and "About this copy" in about[0], nav
    assert all("Performance" not in links for name, links in nav if name != "About"), nav
    assert guard.console_errors == []


def test_the_about_page_tells_what_is_kept_offline(built_site, browser):
    from test_offline import Server, guarded_context, sw_meta, wait_controlled

    srv = Server(built_site)
    ctx, page, guard, net = guarded_context(browser)
    try:
        page.goto(srv.url("about/"))
        wait_controlled(page)
        page.reload()
        kept = page.locator("[data-cw-about=offline]")
        page.wait_for_function("() => document.querySelector('[data-cw-about=offline]').dataset.state === 'kept'",
                               timeout=30_000)
        meta = sw_meta(built_site)
        words = kept.inner_text()
        assert f"{meta['files']} files" in words and meta["version"] in words and meta["data_version"] in words
        assert f"{meta['bytes'] / 1e6:.1f} MB" in words
    finally:
        ctx.close()
        srv.stop()
    assert guard.outside == []


DEVELOPER_WORDS = ("runtime: ready", "Calculation runtime", "build time", "Pyodide", "refining")


def test_working_pages_speak_only_when_it_matters(built_site, served, guarded, browser):
    page, guard = guarded
    for path in ("calculators/couple/", "calculators/joint/", "reference/series/"):
        if path.startswith("calculators/"):
            _opened(page, served, path)
            assert page.locator(".cw-runtime").first.is_hidden(), path
        else:
            page.goto(served.url(path))
        shown = page.evaluate("document.body.innerText")
        for words in DEVELOPER_WORDS:
            assert words.lower() not in shown.lower(), (path, words)
        footer = page.locator(".cw-footer")
        assert footer.locator("a", has_text="About this copy").count() == 1
        assert not footer.locator(".cw-build").is_visible()  # the build is for records: it prints
    # while the runtime loads, the status says so; when it cannot start, it says that
    held = []
    ctx = browser.new_context(viewport={"width": 768, "height": 1024}, service_workers="block")
    from browserkit import Guard

    g = Guard()
    ctx.route("**/*", g.route)
    ctx.route("**/pyodide/**", lambda r: held.append(r))
    try:
        p = ctx.new_page()
        p.goto(served.url("calculators/couple/"))
        status = p.locator(".cw-runtime")
        p.wait_for_function("() => document.querySelector('.cw-runtime')?.dataset.stage === 'loading'", timeout=30_000)
        assert status.is_visible() and "Loading the calculator" in status.inner_text()
        early = p.locator(".cw-early-note")
        early.wait_for(timeout=30_000)
        assert "worked out in advance" in early.inner_text()
        for r in held:
            r.abort()
        ctx.unroute("**/pyodide/**")
        ctx.route("**/pyodide/**", lambda r: r.abort())
        p.wait_for_function("() => document.querySelector('.cw-runtime')?.dataset.stage === 'failed'", timeout=60_000)
        assert status.is_visible() and "could not start" in status.inner_text()
        assert status.locator("a", has_text="About this copy").count() == 1
        shown = p.evaluate("document.body.innerText")
        assert "build time" not in shown.lower() and "runtime: ready" not in shown.lower()
    finally:
        ctx.close()
    assert g.outside == []
