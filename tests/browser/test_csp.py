"""Content-Security-Policy of the built site (sitebuild/csp.py) and the service worker's reach.

The pages carry the policy in a <meta>; here the server also sends ``site/csp.txt`` as the
header, as an intranet server would, so the calculation worker (which takes its policy from
its own response, never from the page) runs under it too. Every page and every calculator is
opened with a listener for ``securitypolicyviolation`` events installed before any script of
the page runs; any violation, and any console error naming the policy, fails the test. The
policy has no ``'unsafe-eval'``: the runtime starting and computing under it shows that Pyodide
needs only ``'wasm-unsafe-eval'`` for what the site uses.
"""

import base64
import functools
import hashlib
import json
import os
import re
import sys
import threading
import time

import pytest

from browserkit import search

pytestmark = pytest.mark.browser

ROOT = os.path.dirname(os.path.dirname(os.path.dirname(os.path.abspath(__file__))))
if ROOT not in sys.path:
    sys.path.insert(0, ROOT)

RUNTIME_MS = 240_000
COLLECT = """
window.__cspViolations = [];
document.addEventListener("securitypolicyviolation", (e) => {
  window.__cspViolations.push({directive: e.violatedDirective, blocked: e.blockedURI,
                               source: e.sourceFile + ":" + e.lineNumber, sample: e.sample});
});
"""
META_RE = re.compile(r'<meta http-equiv="Content-Security-Policy" content="([^"]*)">')


def policy_files(site):
    with open(os.path.join(site, "csp.txt"), encoding="utf-8") as fh:
        header = fh.read().strip()
    return header


def html_pages(site):
    out = []
    for dirpath, _, files in os.walk(site):
        for name in files:
            if name.endswith(".html"):
                out.append(os.path.relpath(os.path.join(dirpath, name), site).replace(os.sep, "/"))
    return sorted(out)


def calculator_pages(site):
    """Every page with a calculator on it (data-cw-calc), as URL paths."""
    out = []
    for rel in html_pages(site):
        with open(os.path.join(site, rel), encoding="utf-8") as fh:
            if "data-cw-calc=" in fh.read():
                out.append(rel[: -len("index.html")] if rel.endswith("index.html") else rel)
    return out


class HeaderServed:
    """The built site on 127.0.0.1 with the policy of csp.txt also sent as a header."""

    def __init__(self, directory, prefix="/"):
        from sitebuild.serve import make_server

        policy = policy_files(directory)
        self.server = make_server(directory, "127.0.0.1", 0, prefix, quiet=True)
        base = self.server.RequestHandlerClass

        class WithPolicy(base.func):
            def end_headers(self):
                self.send_header("Content-Security-Policy", policy)
                super().end_headers()

        self.server.RequestHandlerClass = functools.partial(WithPolicy, *base.args, **base.keywords)
        self.port = self.server.server_address[1]
        self.prefix = "/" + prefix.strip("/") + "/" if prefix.strip("/") else "/"
        threading.Thread(target=self.server.serve_forever, daemon=True).start()

    def url(self, path=""):
        return f"http://127.0.0.1:{self.port}{self.prefix}{path.lstrip('/')}"

    def stop(self):
        self.server.shutdown()
        self.server.server_close()


@pytest.fixture(scope="module")
def csp_served(built_site):
    srv = HeaderServed(built_site)
    yield srv
    srv.stop()


def watched_page(browser):
    """A guarded page (requests off 127.0.0.1 are aborted and recorded) that records policy
    violations, console errors and dialogs (dismissed). Service workers are off here: their
    precache would only slow these pages down (they have a test of their own below)."""
    from browserkit import Guard

    guard = Guard()
    ctx = browser.new_context(viewport={"width": 1280, "height": 800}, service_workers="block")
    ctx.route("**/*", guard.route)
    ctx.add_init_script(COLLECT)
    page = ctx.new_page()
    page.on("console", lambda m: guard.console_errors.append(m.text) if m.type == "error" else None)
    page.on("pageerror", lambda e: guard.page_errors.append(str(e)))
    guard.dialogs = []
    page.on("dialog", lambda d: (guard.dialogs.append(d.message), d.dismiss()))
    return ctx, page, guard


def wait_js(page, expression, timeout_ms=RUNTIME_MS):
    """Poll a JavaScript expression until it is truthy (page.wait_for_function compiles its
    predicate with eval, which the policy under test forbids; page.evaluate does not)."""
    deadline = time.monotonic() + timeout_ms / 1000
    while not page.evaluate(expression):
        if time.monotonic() > deadline:
            raise AssertionError(f"timed out waiting for {expression}")
        page.wait_for_timeout(250)


def violations(page):
    return page.evaluate("window.__cspViolations || []")


def policy_console_errors(guard):
    return [m for m in guard.console_errors if "Content Security Policy" in m or "Content-Security-Policy" in m]


def assert_clean(page, guard, where, tolerate=None):
    v = violations(page)
    if tolerate:
        guard.page_errors[:] = [e for e in guard.page_errors if tolerate not in e]
    assert v == [], f"{where}: policy violations {v}"
    assert policy_console_errors(guard) == [], f"{where}: {policy_console_errors(guard)}"
    assert guard.outside == [], f"{where}: requests to other hosts {guard.outside}"
    assert guard.page_errors == [], f"{where}: page errors {guard.page_errors}"


# --------------------------------------------------------------------------- the policy as built

def test_policy_is_strict(built_site):
    header = policy_files(built_site)
    directives = dict((d.split(" ", 1) + [""])[:2] for d in header.split("; "))
    assert directives["default-src"] == "'self'"
    script = directives["script-src"].split()
    assert script[:2] == ["'self'", "'wasm-unsafe-eval'"]
    assert all(re.fullmatch(r"'sha256-[A-Za-z0-9+/]{43}='", s) for s in script[2:]), script
    assert directives["style-src"] == "'self'"
    assert directives["img-src"] == "'self' data:"
    assert directives["object-src"] == "'none'" and directives["form-action"] == "'none'"
    assert directives["base-uri"] == "'self'" and directives["frame-ancestors"] == "'self'"
    for d in ("connect-src", "worker-src", "font-src", "manifest-src"):
        assert directives[d] == "'self'", d
    assert "unsafe-inline" not in header and "unsafe-eval'" not in header.replace("wasm-unsafe-eval", "")
    assert "http:" not in header and "https:" not in header and "*" not in header


def test_every_page_carries_the_policy_before_any_script(built_site):
    from sitebuild.csp import inline_scripts, script_hash

    header = policy_files(built_site)
    meta_policy = header.replace("; frame-ancestors 'self'", "")
    pages = html_pages(built_site)
    assert len(pages) > 20
    for rel in pages:
        with open(os.path.join(built_site, rel), encoding="utf-8") as fh:
            text = fh.read()
        metas = META_RE.findall(text)
        assert len(metas) == 1, f"{rel}: {len(metas)} policy tags"
        content = metas[0].replace("&#39;", "'").replace("&quot;", '"').replace("&amp;", "&")
        assert content == meta_policy, rel
        meta_at = text.index(metas[0])
        first_script = text.find("<script")
        assert first_script == -1 or meta_at < first_script, f"{rel}: a script comes before the policy"
        assert meta_at < 1024, f"{rel}: the policy should sit right after <meta charset>"
        for s in inline_scripts(text):
            assert script_hash(s) in content, f"{rel}: inline script not admitted by the policy: {s[:80]}"
        # nothing the policy would block: no style attributes or elements, no handler attributes
        assert not re.search(r"<[a-zA-Z][^>]*\sstyle\s*=", text), f"{rel}: style attribute"
        assert "<style" not in text.lower(), f"{rel}: <style> element"
        assert not re.search(r"<[a-zA-Z][^>]*\son[a-z]+\s*=", text), f"{rel}: inline event handler"
        assert "javascript:" not in text.lower(), f"{rel}: javascript: URL"


def test_hash_of_an_inline_script():
    """The hash form of CSP Level 2 §4.2: base64 of the SHA-256 of the script's UTF-8 text
    (W3C, Content Security Policy Level 2, 2016, §4.2 "hash-source"; common practice)."""
    from sitebuild.csp import script_hash

    text = "__md_scope=new URL(\".\",location)"
    expected = "'sha256-" + base64.b64encode(hashlib.sha256(text.encode()).digest()).decode() + "'"
    assert script_hash(text) == expected


def test_apply_csp_is_idempotent_and_refuses_a_page_without_head(tmp_path):
    from sitebuild.csp import CSPError, apply_csp

    (tmp_path / "a.html").write_text('<html><head><meta charset="utf-8"><script>x=1</script></head></html>',
                                     encoding="utf-8")
    first = apply_csp(str(tmp_path))
    once = (tmp_path / "a.html").read_text(encoding="utf-8")
    assert apply_csp(str(tmp_path)) == first
    assert (tmp_path / "a.html").read_text(encoding="utf-8") == once and once.count("Content-Security-Policy") == 1
    (tmp_path / "b.html").write_text("<p>no head</p>", encoding="utf-8")
    with pytest.raises(CSPError, match="b.html"):
        apply_csp(str(tmp_path))


# --------------------------------------------------------------------------- in the browser

def test_no_violation_on_any_page(built_site, csp_served, browser):
    """Every HTML page of the site, with the header and the meta policy: no violation. (Each page
    starts the calculation worker; its runtime download is cut short here, the calculator tests
    below run it whole.)"""
    ctx, page, guard = watched_page(browser)
    ctx.route("**/pyodide/**", lambda r: r.abort())
    try:
        for rel in html_pages(built_site):
            url = csp_served.url(rel[: -len("index.html")] if rel.endswith("index.html") else rel)
            page.goto(url, wait_until="load")
            page.wait_for_timeout(150)
            # the worker reports the runtime download cut short above: expected here, nothing else
            assert_clean(page, guard, rel, tolerate="/pyodide/pyodide.mjs")
        # the theme's search (a worker of its own) and its instant navigation, on a home page
        page.goto(csp_served.url(""), wait_until="load")
        search(page, "zinc")
        page.keyboard.press("Enter")  # the search form must not submit anywhere (form-action 'none')
        page.wait_for_timeout(300)
        assert_clean(page, guard, "search", tolerate="/pyodide/pyodide.mjs")
        page.goto(csp_served.url(""), wait_until="load")
        page.locator("nav.md-tabs a", has_text="Reference").first.click()
        page.wait_for_load_state("load")
        page.wait_for_timeout(300)
        assert "reference" in page.url
        assert_clean(page, guard, "instant navigation", tolerate="/pyodide/pyodide.mjs")
        assert guard.dialogs == []
    finally:
        ctx.close()


def _worker_start(page):
    for w in page.workers:
        if w.url.endswith("calc-worker.mjs"):
            return w.evaluate("self.cwStart || null")
    return None


@pytest.mark.parametrize("path", ["calculators/couple/", "calculators/electrode/", "calculators/convert/",
                                  "calculators/activity/", "calculators/joint/", "calculators/matrix/"])
def test_calculator_runs_under_the_policy(built_site, csp_served, browser, path, tmp_path):
    """The runtime starts (on its fastest path, without a failure) and answers under the header
    policy, which has no 'unsafe-eval'; the page shows the answer without any violation."""
    ctx, page, guard = watched_page(browser)
    try:
        page.goto(csp_served.url(path))
        wait_js(page, "performance.getEntriesByName('cw-result-painted').length > 0")
        start = _worker_start(page)
        assert start is not None and start["failures"] == [], start
        with open(os.path.join(built_site, "assets", "runtime.json"), encoding="utf-8") as fh:
            rt = json.load(fh)
        assert start["path"] == ("snapshot" if rt.get("snapshot") else "bytecode" if rt.get("stdLibURL") else "stock")
        if path.endswith("matrix/"):
            # the heat map shades are classes (no style attributes); the CSV download is a data: link
            assert page.locator(".cw-matrix td[class*='cw-heat-']").count() > 0
            assert page.locator(".cw-matrix td[style]").count() == 0
            with page.expect_download() as dl:
                page.locator("a[download]").first.click()
            saved = tmp_path / "m.csv"
            dl.value.save_as(saved)
            assert saved.read_text(encoding="utf-8").splitlines()[1] == "a,b,anode,delta_E_V,verdict"
        page.wait_for_timeout(500)
        assert_clean(page, guard, path)
    finally:
        ctx.close()


def test_every_calculator_page_is_covered(built_site):
    """The parametrised list above names every calculator page of the build that uses the runtime
    at start (a new calculator page must be added there)."""
    covered = {"calculators/couple/", "calculators/electrode/", "calculators/convert/", "calculators/activity/",
               "calculators/joint/", "calculators/matrix/"}
    found = set(calculator_pages(built_site))
    assert covered <= found, covered - found


def test_other_calculator_pages_have_no_violation(built_site, csp_served, browser):
    """Calculator pages beyond the six above (site readings, survey log, ...): opened and used
    for a moment, no violation."""
    others = [p for p in calculator_pages(built_site) if p not in {
        "calculators/couple/", "calculators/electrode/", "calculators/convert/", "calculators/activity/",
        "calculators/joint/", "calculators/matrix/"}]
    ctx, page, guard = watched_page(browser)
    try:
        for path in others:
            page.goto(csp_served.url(path), wait_until="load")
            page.wait_for_timeout(1500)
            assert_clean(page, guard, path)
    finally:
        ctx.close()


def test_runtime_without_its_snapshot_under_the_policy(built_site, csp_served, browser):
    """With the memory snapshot unavailable, the runtime loads the calc wheel itself
    (pyodide.loadPackage) under the same policy: still no 'unsafe-eval' needed."""
    with open(os.path.join(built_site, "assets", "runtime.json"), encoding="utf-8") as fh:
        rt = json.load(fh)
    if not rt.get("snapshot"):
        pytest.skip("this build has no snapshot: the calculator test above already used the wheel path")
    ctx, page, guard = watched_page(browser)
    snap = rt["snapshot"]

    def route(r):
        if snap in r.request.url:
            r.fulfill(status=404, body="not here")
        else:
            guard.route(r)

    ctx.unroute("**/*")
    ctx.route("**/*", route)
    try:
        page.goto(csp_served.url("calculators/couple/"))
        wait_js(page, "performance.getEntriesByName('cw-result-painted').length > 0")
        start = _worker_start(page)
        assert start["path"] == "bytecode" and len(start["failures"]) == 1, start
        assert "snapshot" in start["failures"][0] and "EvalError" not in start["failures"][0]
        assert_clean(page, guard, "couple without snapshot")
    finally:
        ctx.close()


def test_pages_from_the_file_system_keep_working_under_the_policy(built_site, browser):
    """Opened from a file manager (file://): the reference pages and the search work, and the
    policy blocks nothing there either."""
    ctx = browser.new_context()
    ctx.add_init_script(COLLECT)
    errors = []
    try:
        page = ctx.new_page()
        page.on("console", lambda m: errors.append(m.text) if m.type == "error" else None)
        for rel in ("index.html", "reference/series/index.html", "calculators/couple/index.html"):
            page.goto("file://" + os.path.join(built_site, rel))
            page.wait_for_timeout(500)
            assert violations(page) == [], rel
        page.goto("file://" + os.path.join(built_site, "index.html"))
        search(page, "zinc")
        assert violations(page) == []
        assert [e for e in errors if "Content Security Policy" in e] == []
    finally:
        ctx.close()


# --------------------------------------------------------------------------- the service worker

def test_service_worker_stays_inside_the_site_and_caches_only_its_own_get_responses(built_site):
    """Read from the generated sw.js: its scope is the folder it is served from (the site's own
    path), it answers only same-origin GET requests inside that scope, it stores only the
    precache list (paths inside the site) and never what it fetches at run time."""
    with open(os.path.join(built_site, "sw.js"), encoding="utf-8") as fh:
        sw = fh.read()
    assert 'const SCOPE = new URL("./", self.location).href;' in sw
    handler = sw[sw.index('self.addEventListener("fetch"'):]
    assert 'if (request.method !== "GET") return;' in handler
    assert "url.origin !== self.location.origin || !url.href.startsWith(SCOPE)" in handler
    # cache writes happen in the install step only, for precache entries resolved against SCOPE
    puts = [m.start() for m in re.finditer(r"\.put\(", sw)]
    install = sw.index("async function precache()"), sw.index('self.addEventListener("install"')
    assert puts and all(install[0] < p < install[1] for p in puts), "cache.put outside the precache step"
    assert "new URL(path, SCOPE)" in sw[install[0]:install[1]]
    entries = json.loads(re.search(r"const PRECACHE = (\[.*?\]);", sw, re.S).group(1))
    assert entries
    for url, integrity in entries:
        assert not re.match(r"^[a-z]+:|^//|^/", url) and "../" not in url, url
    # the page registers it with the site's own path as its scope
    with open(os.path.join(ROOT, "docs", "assets", "js", "couplewise.mjs"), encoding="utf-8") as fh:
        glue = fh.read()
    assert re.search(r'register\(new URL\("sw\.js", siteRoot\)\.href,\s*\{ scope: siteRoot\.pathname\b', glue)


def test_service_worker_scope_and_cache_in_the_browser(built_site, browser):
    """Under a sub-path: the registration's scope is the site's path; after requests outside the
    site, outside the precache list and with other methods, the cache holds exactly the
    precache list."""
    from browserkit import Served, new_guarded_page

    srv = Served(built_site, prefix="/tools/couplewise/")
    ctx, page, guard = new_guarded_page(browser, bypass_csp=False)
    try:
        page.goto(srv.url(""))
        wait_js(page, "navigator.serviceWorker.controller !== null")
        scope = page.evaluate("navigator.serviceWorker.getRegistration().then(r => r.scope)")
        assert scope == srv.url("")
        page.evaluate("""async () => {
          await fetch('/elsewhere/', {cache: 'no-store'}).catch(() => null);
          await fetch('assets/data/dataset.json?probe=1', {method: 'POST'}).catch(() => null);
          await fetch('no-such-page/', {cache: 'no-store'}).catch(() => null);
          await fetch('assets/runtime.json?probe=2').catch(() => null);
        }""")
        keys = page.evaluate("""async () => {
          const out = [];
          for (const name of await caches.keys()) {
            const c = await caches.open(name);
            for (const r of await c.keys()) out.push([name, r.url, r.method]);
          }
          return out;
        }""")
        with open(os.path.join(built_site, "sw.js"), encoding="utf-8") as fh:
            entries = json.loads(re.search(r"const PRECACHE = (\[.*?\]);", fh.read(), re.S).group(1))
        expected = sorted(srv.url("") + (u if u != "./" else "") for u, _ in entries)
        assert sorted(k[1] for k in keys) == expected
        assert {k[2] for k in keys} == {"GET"}
        assert all(k[0].startswith("couplewise:/tools/couplewise/:") for k in keys)
        assert guard.outside == []
    finally:
        ctx.close()
        srv.stop()
