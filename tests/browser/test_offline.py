"""Offline and intranet use of the built site in a real browser (issue 7).

1. After one visit over HTTP, with the server stopped and the browser offline, every page of the
   nav, the search, every calculator (also from a link with its inputs in the query) and the
   printed version line still work, all answered by the service worker's precache.
2. A rebuild with one changed data value, served on the same origin, is offered with the update
   notice; until accepted the page keeps its version, after it the calculator and the reference
   page both use the new value. A server that mixes two builds cannot fill the cache.
3. The same build works under a sub-path (/tools/couplewise/), online and offline.
4. The web app manifest is valid and Chromium itself finds the site installable.
5. ``python -m sitebuild.dist`` packs the zip and its checksum; the unpacked folder opened from
   the file system (file://) has working links and search, and the calculators say how to serve it.

Every request to a host other than the local server is aborted and fails the test that made it.
"""

import hashlib
import json
import os
import shutil
import struct
import subprocess
import sys
import threading
import zipfile
from urllib.parse import urlencode, urlparse

import pytest

pytestmark = pytest.mark.browser

ROOT = os.path.dirname(os.path.dirname(os.path.dirname(os.path.abspath(__file__))))
RUNTIME_MS = 120_000   # first start of the Python runtime on a busy machine
INSTALL_MS = 180_000   # the first visit precaches the whole site (about 30 MB)
ART = os.path.join("tests", "artifacts")
CALC_RESULT = {  # the selector that shows a calculator produced its result
    "couple": ".cw-result .cw-big", "electrode": ".cw-result .cw-big", "convert": ".cw-result .cw-big",
    "activity": ".cw-result .cw-big", "joint": ".cw-result .cw-big", "matrix": ".cw-result .cw-matrix",
}
# The couple used to compare the calculator with the reference page: nickel against copper at
# 25 °C and unit activities, where E_cell = E°(Cu2+/Cu) − E°(Ni2+/Ni) (the standard cell
# potential; common practice). The E° values are read from the build's own dataset.
NI_CU = {"a": "Ni2+/Ni", "b": "Cu2+/Cu", "t": "25", "a.Ni2+": "1", "a.Cu2+": "1"}


class Server:
    """The site served by sitebuild.serve on 127.0.0.1. A fixed port keeps the origin, and so the
    service worker, across a restart with another build."""

    def __init__(self, directory, port=0, prefix="/"):
        if ROOT not in sys.path:
            sys.path.insert(0, ROOT)
        from sitebuild.serve import make_server

        self.server = make_server(directory, "127.0.0.1", port, prefix, quiet=True)
        self.port = self.server.server_address[1]
        self.prefix = "/" + prefix.strip("/") + "/" if prefix.strip("/") else "/"
        self.thread = threading.Thread(target=self.server.serve_forever, daemon=True)
        self.thread.start()
        self.running = True

    def url(self, path=""):
        return f"http://127.0.0.1:{self.port}{self.prefix}{path.lstrip('/')}"

    def stop(self):
        if self.running:
            self.running = False
            self.server.shutdown()
            self.server.server_close()


class Network:
    """Records what the context fetched: responses (with whether the service worker answered),
    failed requests (navigations that abort their predecessor's requests aside) and requests to
    any other host, including those a service worker makes, when Playwright reports them."""

    def __init__(self, ctx):
        self.responses, self.failed, self.outside = [], [], []
        ctx.on("response", lambda r: self.responses.append((r.url, r.from_service_worker)))
        ctx.on("requestfailed", self._failed)
        ctx.on("request", self._request)

    def _failed(self, request):
        if "ERR_ABORTED" not in (request.failure or ""):
            self.failed.append((request.url, request.failure))

    def _request(self, request):
        url = urlparse(request.url)
        if url.scheme in ("http", "https", "ws", "wss") and url.hostname != "127.0.0.1":
            self.outside.append(request.url)

    def clear(self):
        self.responses.clear()
        self.failed.clear()


def guarded_context(browser):
    from browserkit import new_guarded_page

    ctx, page, guard = new_guarded_page(browser)
    return ctx, page, guard, Network(ctx)


def check_guard(guard, net):
    assert guard.outside == [] and net.outside == [], f"requests to other hosts: {guard.outside + net.outside}"
    assert guard.page_errors == [], f"uncaught page errors: {guard.page_errors}"


# Predicates are passed as functions: the pages' Content-Security-Policy forbids eval, which
# Playwright would use for a bare expression.


def wait_controlled(page):
    """Wait until the service worker has precached the site and controls the page."""
    page.wait_for_function("() => navigator.serviceWorker.controller !== null", timeout=INSTALL_MS)


def cache_state(page):
    return page.evaluate("""async () => {
        const names = (await caches.keys()).filter((n) => n.startsWith('couplewise:'));
        const counts = [];
        for (const n of names) counts.push((await (await caches.open(n)).keys()).length);
        return { names, counts };
    }""")


def runtime_info(site):
    with open(os.path.join(site, "assets", "runtime.json"), encoding="utf-8") as fh:
        return json.load(fh)


def calc_files(info, prefix):
    """URL paths of the files that bring calc and its data into the worker: the wheel, and the
    memory snapshot where the build made one (it holds calc already imported)."""
    return {prefix + info[k] for k in ("wheel", "snapshot") if info.get(k)}


def sw_meta(site):
    with open(os.path.join(site, "sw.js"), encoding="utf-8") as fh:
        for line in fh:
            if line.startswith("const META = "):
                return json.loads(line[len("const META = "):].split("; //")[0])
    raise AssertionError("sw.js has no META line")


def e0(site, hid):
    with open(os.path.join(site, "assets", "data", "dataset.json"), encoding="utf-8") as fh:
        data = json.load(fh)
    return next(r["E0_V"] for r in data["half_reactions"] if r["id"] == hid)


def number(text):
    return float(text.strip().replace("−", "-").replace("+", "").split()[0])


def series_e0(page, anchor):
    """E° (V) in the row of the electrochemical-series page whose couple has this anchor."""
    row = page.locator(f"tr:has(#{anchor})")
    return number(row.locator("td").nth(3).inner_text())


def open_calculator(page, url, name):
    """Open a calculator page and wait for the runtime's own answer (not the build-time one)."""
    page.goto(url)
    page.locator(f'[data-cw-calc="{name}"] {CALC_RESULT[name]}').first.wait_for(timeout=RUNTIME_MS)
    page.wait_for_function("() => !document.querySelector('.cw-result').hasAttribute('aria-busy')",
                           timeout=RUNTIME_MS)
    assert page.locator(".cw-runtime").get_attribute("data-stage") == "ready", page.locator(".cw-runtime").inner_text()
    assert "cw-early" not in (page.locator(".cw-result").get_attribute("class") or "")


def printed_text(page):
    """The page's text as printed (print media; the calculators fill their print header on
    beforeprint)."""
    page.evaluate("window.dispatchEvent(new Event('beforeprint'))")
    page.emulate_media(media="print")
    try:
        return page.evaluate("document.body.innerText")
    finally:
        page.emulate_media(media="screen")
        page.evaluate("window.dispatchEvent(new Event('afterprint'))")


def nav_pages_from_config():
    """The nav of mkdocs.yml as site URLs (folder URLs), the pages every test must reach."""
    import yaml

    with open(os.path.join(ROOT, "mkdocs.yml"), encoding="utf-8") as fh:
        config = yaml.load(fh, Loader=yaml.BaseLoader)  # BaseLoader: no tags to resolve

    def walk(items):
        for item in items:
            for value in item.values():
                if isinstance(value, list):
                    yield from walk(value)
                elif value == "index.md":
                    yield ""
                else:
                    yield value[: -len("index.md")] if value.endswith("/index.md") else value[: -len(".md")] + "/"

    return list(walk(config["nav"]))


# ---------------------------------------------------------------------------------------------
# 1. Offline after one visit


def test_everything_works_offline_after_one_visit(built_site, browser):
    if ROOT not in sys.path:
        sys.path.insert(0, ROOT)
    from sitebuild.offline import site_files

    info = runtime_info(built_site)
    srv = Server(built_site)
    ctx, page, guard, net = guarded_context(browser)
    try:
        page.goto(srv.url())
        wait_controlled(page)
        state = cache_state(page)
        # One cache for this version, holding every file of the site.
        assert state["names"] == ["couplewise:/:" + sw_meta(built_site)["version"]]
        assert state["counts"] == [len(site_files(built_site))]
        nav = page.evaluate("""() => [...new Set([...document.querySelectorAll(
            'nav.md-nav--primary a.md-nav__link[href]')].map((a) => a.href.split('#')[0]))]""")
        missing = [p for p in nav_pages_from_config() if srv.url(p) not in nav]
        assert missing == [], f"nav pages of mkdocs.yml not in the page's nav: {missing}"

        srv.stop()
        ctx.set_offline(True)
        net.clear()
        calculated = set()
        for url in nav:
            name = url[len(srv.url("calculators/")):].strip("/") if url.startswith(srv.url("calculators/")) else None
            if name in CALC_RESULT:  # the calculators with one result each: the runtime answers
                open_calculator(page, url, name)
                calculated.add(name)
            else:
                page.goto(url, wait_until="domcontentloaded")
            assert page.locator("h1").first.inner_text().strip(), url
            assert page.locator(".cw-data-version").inner_text().strip() == info["data_version"], url

        assert calculated == set(CALC_RESULT), f"calculators missing from the nav: {set(CALC_RESULT) - calculated}"

        # A calculator link with its inputs in the query string.
        open_calculator(page, srv.url("calculators/couple/?" + urlencode(NI_CU)), "couple")
        expected = e0(built_site, "Cu2+/Cu") - e0(built_site, "Ni2+/Ni")
        assert number(page.locator(".cw-big-value").inner_text()) == pytest.approx(expected, abs=6e-5)
        # The printed record carries the data version and the build.
        printed = printed_text(page)
        assert info["data_version"] in printed and info["build"] in printed

        # The search: a material name finds its page.
        page.goto(srv.url("reference/series/"), wait_until="domcontentloaded")
        printed = printed_text(page)
        assert info["data_version"] in printed and info["build"] in printed
        page.locator("input.md-search__input").click()
        page.keyboard.type("titanium", delay=20)
        hit = page.locator(".md-search-result__item", has_text="Titanium").first
        hit.wait_for(timeout=30_000)
        hit.locator("a").first.click()
        page.wait_for_url("**/reference/materials/titanium/**")
        assert "Titanium" in page.locator("h1").first.inner_text()

        # Everything, the calculation worker's runtime and wheel included, came from the
        # service worker; nothing failed.
        assert net.failed == [], f"requests failed offline: {net.failed}"
        not_sw = [u for u, from_sw in net.responses if not from_sw]
        assert not_sw == [], f"answered by something else than the service worker: {not_sw[:10]}"
        fetched = {urlparse(u).path for u, _ in net.responses}
        for path in ("/assets/runtime.json", "/pyodide/pyodide.mjs", "/pyodide/pyodide.asm.wasm",
                     "/search/search_index.json"):
            assert path in fetched, path
        assert fetched & calc_files(info, "/"), "the worker loaded neither the calc wheel nor the snapshot"

        # An address the site does not have gets a plain page, not a browser error.
        page.goto(srv.url("no/such/page/"))
        assert "Not in the offline copy" in page.locator("h1").inner_text()
    finally:
        ctx.close()
        srv.stop()
    check_guard(guard, net)


# ---------------------------------------------------------------------------------------------
# 2. A new version: offered, accepted, used everywhere


@pytest.fixture(scope="module")
def changed_site(tmp_path_factory):
    """The site built from a copy of data/ where E°(Ni2+/Ni) is −0.250 V instead of −0.257 V
    (−0.25 V is the value of older tables, quoted in the record's own spread note)."""
    from browserkit import build_site

    tmp = tmp_path_factory.mktemp("changed")
    data = tmp / "data"
    # The same data the session's site was built from (COUPLEWISE_DATA_DIR, as in the build).
    shutil.copytree(os.environ.get("COUPLEWISE_DATA_DIR") or os.path.join(ROOT, "data"), data)
    path = data / "half_reactions.yaml"
    text = path.read_text(encoding="utf-8")
    block = "  - id: Ni2+/Ni\n    name: Nickel(II)/nickel\n"
    start = text.index(block)
    old = "    E0_V: -0.257\n"
    at = text.index(old, start)
    assert at - start < 300, "the Ni2+/Ni record changed shape: update this test's edit"
    path.write_text(text[:at] + "    E0_V: -0.250\n" + text[at + len(old):], encoding="utf-8")
    dest = str(tmp / "site")
    proc = build_site(dest, {"COUPLEWISE_DATA_DIR": str(data)})
    assert proc.returncode == 0, "the build with the changed value failed:\n" + proc.stdout[-3000:] + proc.stderr[-3000:]
    return dest


def test_new_version_is_offered_and_then_used_everywhere(built_site, changed_site, browser):
    old, new = runtime_info(built_site), runtime_info(changed_site)
    assert new["data_version"] != old["data_version"]
    assert e0(changed_site, "Ni2+/Ni") == -0.250 and e0(built_site, "Ni2+/Ni") == -0.257
    couple_url = "calculators/couple/?" + urlencode(NI_CU)

    srv = Server(built_site)
    ctx, page, guard, net = guarded_context(browser)
    try:
        open_calculator(page, srv.url(couple_url), "couple")
        wait_controlled(page)
        before = number(page.locator(".cw-big-value").inner_text())
        assert before == pytest.approx(e0(built_site, "Cu2+/Cu") - e0(built_site, "Ni2+/Ni"), abs=6e-5)

        # The new build on the same origin.
        port = srv.port
        srv.stop()
        srv = Server(changed_site, port=port)
        page.goto(srv.url("reference/series/"))
        notice = page.locator(".cw-update")
        notice.wait_for(timeout=INSTALL_MS)
        text = notice.inner_text()
        assert new["data_version"] in text and old["data_version"] in text, text
        os.makedirs(ART, exist_ok=True)
        page.screenshot(path=os.path.join(ART, "offline-update-notice.png"))
        # Not accepted yet: the page still shows the version it was loaded with.
        assert page.locator(".cw-data-version").inner_text().strip() == old["data_version"]
        assert series_e0(page, "hr-ni2p-ni") == e0(built_site, "Ni2+/Ni")

        net.clear()
        page.locator(".cw-update-accept").click()
        page.wait_for_function("(v) => document.querySelector('.cw-data-version')?.textContent.trim() === v",
                               arg=new["data_version"], timeout=60_000)
        ni_page = series_e0(page, "hr-ni2p-ni")
        cu_page = series_e0(page, "hr-cu2p-cu")
        assert ni_page == e0(changed_site, "Ni2+/Ni")
        state = cache_state(page)
        assert state["names"] == ["couplewise:/:" + sw_meta(changed_site)["version"]], state

        open_calculator(page, srv.url(couple_url), "couple")
        after = number(page.locator(".cw-big-value").inner_text())
        # The calculator and the reference page agree on the new value.
        assert after == pytest.approx(cu_page - ni_page, abs=6e-5)
        assert after != pytest.approx(before, abs=1e-3)
        # The worker loaded calc (wheel or snapshot) of the new version only.
        fetched = {urlparse(u).path for u, _ in net.responses}
        new_files, old_files = calc_files(new, "/"), calc_files(old, "/")
        assert fetched & new_files and not fetched & (old_files - new_files), sorted(fetched)
    finally:
        ctx.close()
        srv.stop()
    check_guard(guard, net)


def test_a_server_mixing_two_builds_cannot_fill_the_cache(built_site, browser, tmp_path):
    """Every file is precached with its build-time SHA-256: one file that is not this build's
    (here the dataset, as on a server caught half-way through an upload) fails the install, and
    no cache is left behind."""
    mixed = str(tmp_path / "site")
    shutil.copytree(built_site, mixed)
    with open(os.path.join(mixed, "assets", "data", "dataset.json"), "a", encoding="utf-8") as fh:
        fh.write(" ")  # still valid JSON, other bytes
    srv = Server(mixed)
    ctx, page, guard, net = guarded_context(browser)
    try:
        page.goto(srv.url("reference/sources/"))
        outcome = page.evaluate("""async (url) => {
            const reg = await navigator.serviceWorker.register(url);
            const worker = reg.installing || reg.waiting || reg.active;
            if (worker.state === 'activated' || worker.state === 'redundant') return worker.state;
            return new Promise((done) => worker.addEventListener('statechange', () => {
                if (worker.state === 'activated' || worker.state === 'redundant') done(worker.state);
            }));
        }""", srv.url("sw.js"))
        assert outcome == "redundant"
        assert cache_state(page)["names"] == []
        assert page.evaluate("navigator.serviceWorker.controller") is None
    finally:
        ctx.close()
        srv.stop()
    check_guard(guard, net)


# ---------------------------------------------------------------------------------------------
# 3. Under a sub-path


def test_same_build_under_a_sub_path(built_site, browser):
    info = runtime_info(built_site)
    prefix = "/tools/couplewise/"
    srv = Server(built_site, prefix=prefix)
    ctx, page, guard, net = guarded_context(browser)
    try:
        page.goto(srv.url())
        wait_controlled(page)
        scope = page.evaluate("navigator.serviceWorker.getRegistration().then((r) => r.scope)")
        assert scope == srv.url()
        assert cache_state(page)["names"] == [f"couplewise:{prefix}:" + sw_meta(built_site)["version"]]
        page.goto(srv.url("reference/electrodes/"))
        assert "Reference electrodes" in page.locator("h1").first.inner_text()
        joint = "calculators/joint/?" + urlencode({"a": "zinc", "b": "copper", "env": "seawater-flowing", "ar": "1"})
        open_calculator(page, srv.url(joint), "joint")
        paths = [urlparse(u).path for u, _ in net.responses]
        assert prefix + "assets/runtime.json" in paths and set(paths) & calc_files(info, prefix)
        outside_prefix = [p for p in paths if not p.startswith(prefix)]
        assert outside_prefix == [], f"requests outside the sub-path: {outside_prefix}"
        verdict = page.locator(".cw-result .cw-big").inner_text()

        srv.stop()
        ctx.set_offline(True)
        open_calculator(page, srv.url(joint), "joint")
        assert page.locator(".cw-result .cw-big").inner_text() == verdict
    finally:
        ctx.close()
        srv.stop()
    check_guard(guard, net)


def test_readme_nginx_block_matches_the_build(built_site):
    """The README's nginx block names a type for every kind of file in the site, and its
    Content-Security-Policy header is the build's csp.txt (when the build writes one)."""
    import re

    with open(os.path.join(ROOT, "README.md"), encoding="utf-8") as fh:
        readme = fh.read()
    block = readme[readme.index("```nginx\n"):]
    block = block[: block.index("\n```\n")]
    types = block[block.index("types {"):]
    types = types[: types.index("}")]
    listed = set(re.findall(r"\s([a-z0-9]+)(?=[\s;])", types.split("{", 1)[1]))
    exts = {name.rsplit(".", 1)[1] for _, _, fs in os.walk(built_site) for name in fs if "." in name}
    assert exts - listed == set(), f"file types of the site missing from the README's nginx types: {exts - listed}"
    header = re.search(r'add_header Content-Security-Policy "([^"]*)" always;', block)
    csp = os.path.join(built_site, "csp.txt")
    if os.path.exists(csp):
        with open(csp, encoding="utf-8") as fh:
            policy = fh.read().strip()
        assert header and header.group(1) == policy, "README's Content-Security-Policy differs from the build's csp.txt"
    else:
        assert header is None


# ---------------------------------------------------------------------------------------------
# 4. Installable


def png_size(path):
    with open(path, "rb") as fh:
        head = fh.read(24)
    assert head[:8] == b"\x89PNG\r\n\x1a\n" and head[12:16] == b"IHDR", f"{path} is not a PNG"
    return struct.unpack(">II", head[16:24])


def test_manifest_is_valid_and_chromium_finds_the_site_installable(built_site, browser, tmp_path):
    with open(os.path.join(built_site, "manifest.webmanifest"), encoding="utf-8") as fh:
        manifest = json.load(fh)
    # Relative start_url and scope: the same manifest works under any sub-path.
    assert manifest["start_url"] == "./" and manifest["scope"] == "./"
    assert manifest["display"] in ("standalone", "fullscreen", "minimal-ui") and manifest["name"]
    sizes = set()
    for icon in manifest["icons"]:
        w, h = png_size(os.path.join(built_site, *icon["src"].split("/")))
        assert icon["sizes"] == f"{w}x{h}" and icon["type"] == "image/png", icon
        if "any" in icon.get("purpose", "any").split():
            sizes.add(w)
    assert {192, 512} <= sizes  # Chromium's installability needs both (common practice)

    # Chromium's own verdict (it asks for no service worker any more; the other tests cover that).
    # A normal, not incognito, profile is needed for it.
    from browserkit import CHROMIUM, CHROMIUM_ARGS, Guard

    srv = Server(built_site)
    guard = Guard()
    ctx = browser.browser_type.launch_persistent_context(
        str(tmp_path / "profile"), executable_path=CHROMIUM, headless=True, args=CHROMIUM_ARGS,
        service_workers="allow")
    try:
        ctx.route("**/*", guard.route)
        net = Network(ctx)
        page = ctx.pages[0] if ctx.pages else ctx.new_page()
        page.goto(srv.url())
        cdp = ctx.new_cdp_session(page)
        parsed = cdp.send("Page.getAppManifest")
        assert parsed.get("errors") == [], parsed.get("errors")
        errors = cdp.send("Page.getInstallabilityErrors")["installabilityErrors"]
        assert errors == [], errors
    finally:
        ctx.close()
        srv.stop()
    assert guard.outside == [] and net.outside == [], guard.outside + net.outside


# ---------------------------------------------------------------------------------------------
# 5. The zip, and its pages opened from the file system


def test_dist_zip_and_its_pages_from_the_file_system(built_site, browser, tmp_path):
    info = runtime_info(built_site)
    dist = tmp_path / "dist"
    proc = subprocess.run([sys.executable, "-m", "sitebuild.dist", built_site, str(dist)],
                          cwd=ROOT, capture_output=True, text=True)
    assert proc.returncode == 0, proc.stderr
    name = f"couplewise-{info['data_version']}"
    zip_path = dist / (name + ".zip")
    digest = hashlib.sha256(zip_path.read_bytes()).hexdigest()
    assert (dist / (name + ".zip.sha256")).read_text(encoding="utf-8") == f"{digest}  {name}.zip\n"
    if shutil.which("sha256sum"):
        check = subprocess.run(["sha256sum", "-c", name + ".zip.sha256"], cwd=dist, capture_output=True, text=True)
        assert check.returncode == 0, check.stdout + check.stderr
    with zipfile.ZipFile(zip_path) as zf:
        names = sorted(n[len(name) + 1:] for n in zf.namelist())
        assert all(n.startswith(name + "/") for n in zf.namelist())
        on_disk = sorted(os.path.relpath(os.path.join(d, f), built_site).replace(os.sep, "/")
                         for d, _, fs in os.walk(built_site) for f in fs)
        assert names == on_disk
        zf.extractall(tmp_path / "unpacked")
    root = (tmp_path / "unpacked" / name).as_uri() + "/"

    outside = []

    def route(r):
        if r.request.url.startswith(root):
            r.continue_()
        else:
            outside.append(r.request.url)
            r.abort()

    ctx = browser.new_context(viewport={"width": 1280, "height": 800})
    ctx.route("**/*", route)
    page = ctx.new_page()
    errors = []
    page.on("pageerror", lambda e: errors.append(str(e)))
    try:
        page.goto(root + "index.html")
        # A link to a folder opens the folder's page (not a folder listing).
        page.locator(".md-tabs").get_by_role("link", name="Reference", exact=True).click()
        page.wait_for_url(root + "reference/series/index.html")
        assert "Electrochemical series" in page.locator("h1").first.inner_text()
        # The search works from the file, and its results can be followed.
        page.locator("input.md-search__input").click()
        page.keyboard.type("titanium", delay=20)
        hit = page.locator(".md-search-result__item", has_text="Titanium").first
        hit.wait_for(timeout=30_000)
        hit.locator("a").first.click()
        page.wait_for_url("**/reference/materials/titanium/index.html*")
        assert "Titanium" in page.locator("h1").first.inner_text()
        # A calculator says plainly why it cannot run and gives the one command that serves it.
        page.goto(root + "calculators/couple/index.html")
        notice = page.locator('[data-cw-calc="couple"] .cw-file-notice')
        notice.wait_for(timeout=10_000)
        text = notice.inner_text()
        folder = str(tmp_path / "unpacked" / name)
        assert "cannot run from a file" in text
        assert f'python3 -m http.server --bind 127.0.0.1 8000 --directory "{folder}"' in text
        assert "http://127.0.0.1:8000/calculators/couple/" in text
        os.makedirs(ART, exist_ok=True)
        page.screenshot(path=os.path.join(ART, "file-url-calculator.png"))
    finally:
        ctx.close()
    assert outside == [], f"requests outside the unpacked folder: {outside}"
    assert errors == [], errors
