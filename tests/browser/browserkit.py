"""Shared browser-test helpers and fixtures (re-exported by conftest.py; imported by tests and tools).

The module has its own name so that nothing imports a module called ``conftest`` (the two
conftest files of the test session would clash).

Every request to a host other than the local server is aborted and fails the test that made it.
Playwright's own browser download is never used: chromium comes from Debian (/usr/bin/chromium).
"""

import os
import subprocess
import sys
import threading
from urllib.parse import urlparse

import pytest

ROOT = os.path.dirname(os.path.dirname(os.path.dirname(os.path.abspath(__file__))))
CHROMIUM = os.environ.get("COUPLEWISE_CHROMIUM", "/usr/bin/chromium")
CHROMIUM_ARGS = ["--no-sandbox", "--disable-gpu", "--disable-quic", "--no-first-run",
                 "--disable-background-networking", "--disable-component-update", "--disable-sync",
                 "--disable-dev-shm-usage"]


def build_site(dest, env_extra=None):
    """mkdocs build --strict into dest; returns the completed process."""
    env = dict(os.environ, **(env_extra or {}))
    return subprocess.run([sys.executable, "-m", "mkdocs", "build", "--strict", "-d", dest],
                          cwd=ROOT, capture_output=True, text=True, env=env)


@pytest.fixture(scope="session")
def built_site(tmp_path_factory):
    dest = str(tmp_path_factory.mktemp("site") / "site")
    proc = build_site(dest)
    assert proc.returncode == 0, "mkdocs build --strict failed:\n" + proc.stdout[-3000:] + proc.stderr[-3000:]
    return dest


class Served:
    def __init__(self, directory, prefix="/"):
        sys.path.insert(0, ROOT)
        from sitebuild.serve import make_server

        self.server = make_server(directory, "127.0.0.1", 0, prefix, quiet=True)
        self.port = self.server.server_address[1]
        self.prefix = "/" + prefix.strip("/") + "/" if prefix.strip("/") else "/"
        self.thread = threading.Thread(target=self.server.serve_forever, daemon=True)
        self.thread.start()

    def url(self, path=""):
        return f"http://127.0.0.1:{self.port}{self.prefix}{path.lstrip('/')}"

    def stop(self):
        self.server.shutdown()
        self.server.server_close()


@pytest.fixture(scope="session")
def served(built_site):
    srv = Served(built_site)
    yield srv
    srv.stop()


@pytest.fixture(scope="session")
def browser():
    if not os.path.exists(CHROMIUM):
        pytest.fail(f"chromium not found at {CHROMIUM}: run 'make test' (it installs Debian's chromium) "
                    "or 'sudo apt-get install chromium'")
    from playwright.sync_api import sync_playwright

    with sync_playwright() as pw:
        br = pw.chromium.launch(executable_path=CHROMIUM, headless=True, args=CHROMIUM_ARGS)
        yield br
        br.close()


class Guard:
    """Aborts and records every request that leaves 127.0.0.1; records console errors."""

    def __init__(self):
        self.outside = []
        self.console_errors = []
        self.page_errors = []

    def route(self, route):
        host = urlparse(route.request.url).hostname
        if route.request.url.startswith(("data:", "blob:")) or host == "127.0.0.1":
            route.continue_()
        else:
            self.outside.append(route.request.url)
            route.abort()


def new_guarded_page(browser, viewport=None, color_scheme="light", bypass_csp=True):
    """A page whose requests off 127.0.0.1 are aborted and recorded, with console errors recorded.

    ``bypass_csp``: Playwright's ``wait_for_function`` compiles its predicate with eval, which the
    site's Content-Security-Policy forbids, so these pages ignore the policy by default; the
    policy itself is tested, not bypassed, in test_csp.py (and test_hostile.py checks escaping
    with it bypassed, so an escaping fault cannot hide behind the policy)."""
    guard = Guard()
    ctx = browser.new_context(viewport=viewport or {"width": 1280, "height": 800}, color_scheme=color_scheme,
                              service_workers="allow", bypass_csp=bypass_csp)
    ctx.route("**/*", guard.route)
    page = ctx.new_page()
    page.on("console", lambda m: guard.console_errors.append(m.text) if m.type == "error" else None)
    page.on("pageerror", lambda e: guard.page_errors.append(str(e)))
    return ctx, page, guard


@pytest.fixture
def guarded(browser):
    ctx, page, guard = new_guarded_page(browser)
    yield page, guard
    ctx.close()
    assert guard.outside == [], f"requests to other hosts were attempted: {guard.outside}"
    assert guard.page_errors == [], f"uncaught page errors: {guard.page_errors}"


def search(page, text, attempts=3):
    """Type into the theme's search box as a user does (focus, then keys) until results show: a
    query typed while the theme is still starting can be missed, as for a user who types fast."""
    from playwright.sync_api import TimeoutError as Timeout

    box = page.locator("input.md-search__input")
    for _ in range(attempts):
        box.click()
        box.fill("")
        box.press_sequentially(text, delay=30)
        try:
            page.locator(".md-search-result__item").first.wait_for(timeout=20_000)
            return
        except Timeout:
            page.keyboard.press("Escape")
    pytest.fail(f"no search result for {text!r}: " + page.locator(".md-search-result__meta").inner_text())
