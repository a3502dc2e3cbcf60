"""Hostile content: text from the data and from the URL is shown as text, never run as HTML.

The site is built (through sitebuild.atomic, as ``make site`` does) from a copy of data/ in
which a material's name and note and a half-reaction's note carry script and an image with an
``onerror`` handler. The reference pages, the search and every calculator are opened, the
calculators also with the same payloads in every URL parameter they read. Nothing may run
(``window.__pwned`` stays undefined, no dialog opens), the payload shows literally where the
page shows that text, and no request leaves 127.0.0.1.

The pages are opened with the Content-Security-Policy bypassed (browserkit's default), so that
an escaping fault cannot hide behind the policy: the policy is tested in test_csp.py.
"""

import os
import shutil
from urllib.parse import urlencode

import pytest
import yaml

from browserkit import search

pytestmark = pytest.mark.browser

ROOT = os.path.dirname(os.path.dirname(os.path.dirname(os.path.abspath(__file__))))
RUNTIME_MS = 240_000
SCRIPT = "<script>window.__pwned=1</script>"
IMAGE = '<img src=x onerror="window.__pwned=1">'
MATERIAL_NOTE = "Hostile note " + SCRIPT + " and " + IMAGE
REACTION_NOTE = "Hostile note " + IMAGE + " and " + SCRIPT
MATERIAL, REACTION = "zinc", "Zn2+/Zn"
PAYLOADS = [SCRIPT, IMAGE, '"><svg onload=window.__pwned=1>', "javascript:window.__pwned=1"]
TRAP = """
window.__dialogs = 0;
for (const name of ["alert", "confirm", "prompt"]) window[name] = () => { window.__dialogs += 1; };
"""


def _edit(folder, fname, key, rid, change):
    """Change one record of a data file (the first line, the schema link, is kept)."""
    path = os.path.join(folder, fname)
    with open(path, encoding="utf-8") as fh:
        first = fh.readline()
        doc = yaml.safe_load(first + fh.read())
    rec = next(r for r in doc[key] if r.get("id") == rid)
    rec.update(change(rec))
    with open(path, "w", encoding="utf-8") as fh:
        fh.write(first + yaml.safe_dump(doc, sort_keys=False, allow_unicode=True, width=10_000))


@pytest.fixture(scope="module")
def hostile_site(tmp_path_factory):
    from sitebuild.atomic import build_site

    base = tmp_path_factory.mktemp("hostile")
    data = str(base / "data")
    shutil.copytree(os.path.join(ROOT, "data"), data)
    names = {}

    def material(rec):
        names["material"] = rec["name"] + " " + IMAGE
        return {"note": MATERIAL_NOTE, "name": names["material"]}

    _edit(data, "materials.yaml", "materials", MATERIAL, material)
    _edit(data, "half_reactions.yaml", "half_reactions", REACTION, lambda rec: {"note": REACTION_NOTE})
    dest = str(base / "site")
    saved = os.environ.get("COUPLEWISE_SNAPSHOT")
    os.environ["COUPLEWISE_SNAPSHOT"] = "0"  # a snapshot of this throw-away dataset is not worth its time
    try:
        build_site(dest, data_dir=data)
    finally:
        if saved is None:
            os.environ.pop("COUPLEWISE_SNAPSHOT", None)
        else:
            os.environ["COUPLEWISE_SNAPSHOT"] = saved
    return {"dir": dest, "material_name": names["material"]}


@pytest.fixture(scope="module")
def hostile(hostile_site):
    from browserkit import Served

    srv = Served(hostile_site["dir"])
    yield srv, hostile_site
    srv.stop()


@pytest.fixture
def page_of(browser):
    from browserkit import new_guarded_page

    made = []

    def make():
        ctx, page, guard = new_guarded_page(browser)
        ctx.add_init_script(TRAP)
        guard.dialogs = []
        page.on("dialog", lambda d: (guard.dialogs.append(d.message), d.dismiss()))
        made.append((ctx, guard))
        return page, guard

    yield make
    for ctx, guard in made:
        ctx.close()
        assert guard.outside == [], f"requests to other hosts: {guard.outside}"


def assert_inert(page, guard, where):
    assert page.evaluate("typeof window.__pwned") == "undefined", f"{where}: a payload ran"
    assert page.evaluate("window.__dialogs") == 0 and guard.dialogs == [], f"{where}: a dialog opened"
    injected = page.evaluate("""() => ({
      scripts: [...document.scripts].filter(s => s.textContent.includes('__pwned')).length,
      images: [...document.querySelectorAll('img')].filter(i => i.getAttribute('src') === 'x').length,
      handlers: [...document.querySelectorAll('*')].filter(e => [...e.attributes].some(
        a => a.name.startsWith('on') && a.value.includes('__pwned'))).length,
      links: [...document.querySelectorAll('a[href]')].filter(a => a.getAttribute('href').startsWith('javascript:')).length,
    })""")
    assert injected == {"scripts": 0, "images": 0, "handlers": 0, "links": 0}, f"{where}: {injected}"
    assert guard.page_errors == [], f"{where}: {guard.page_errors}"


def test_data_text_is_shown_as_text_on_the_reference_pages(hostile, page_of):
    srv, site = hostile
    page, guard = page_of()
    # the material's own page: name in the title and heading, note in its paragraph
    page.goto(srv.url(f"reference/materials/{MATERIAL}/"))
    page.wait_for_load_state("load")
    body = page.locator("article").inner_text()
    assert MATERIAL_NOTE in body
    assert site["material_name"] in page.locator("article h1").inner_text()
    title = page.title()  # the title is plain text: look-alikes for < > " (sitebuild/pages/kit.py)
    assert "img src=x onerror=" in title and "<" not in title
    assert_inert(page, guard, "material page")
    # the electrochemical series: the half-reaction's note in the notes list
    page.goto(srv.url("reference/series/"))
    assert REACTION_NOTE in page.locator("article").inner_text()
    assert_inert(page, guard, "series page")
    # the lists that carry the material's name, and the galvanic-series chart
    for path in ("reference/materials/", "reference/galvanic-series/"):
        page.goto(srv.url(path))
        assert site["material_name"] in page.locator("article").inner_text(), path
        assert_inert(page, guard, path)
    with open(os.path.join(site["dir"], "reference", "galvanic-series.svg"), encoding="utf-8") as fh:
        svg = fh.read()
    assert "<img" not in svg and "<script" not in svg and "&lt;img src=x onerror=" in svg.replace("&#34;", '"')


def test_search_shows_hostile_text_as_text(hostile, page_of):
    srv, site = hostile
    page, guard = page_of()
    page.goto(srv.url(""))
    search(page, "Hostile")
    page.wait_for_timeout(500)
    results = page.locator(".md-search-result").inner_text()
    assert "window.__pwned=1" in results
    assert_inert(page, guard, "search results")
    page.locator(".md-search-result__item a").first.click()
    page.wait_for_load_state("load")
    assert_inert(page, guard, "page opened from the search")


def _params_of(page):
    """The URL parameters a calculator writes for its current inputs."""
    return dict(page.evaluate("[...new URLSearchParams(location.search).entries()]"))


def _opened(page, srv, name):
    """Open a calculator with its opening inputs; the URL parameters it writes for them."""
    page.goto(srv.url(f"calculators/{name}/"))
    page.locator(".cw-form").first.wait_for(timeout=RUNTIME_MS)
    page.wait_for_function("location.search.length > 1", timeout=30_000)
    return _params_of(page)


CALCULATORS = ["couple", "electrode", "convert", "activity", "joint", "matrix", "field"]


@pytest.mark.parametrize("name", CALCULATORS)
def test_calculator_with_hostile_data_and_url(hostile, page_of, name):
    srv, site = hostile
    page, guard = page_of()
    params = _opened(page, srv, name)
    assert params, "the calculator writes its inputs into the URL"
    if name in ("joint", "matrix"):  # the hostile material in the calculation: its name shows as text
        query = {"a": MATERIAL, "b": "copper", "env": "seawater-flowing", "ar": "1"} if name == "joint" else \
            {"env": "seawater-flowing", "m": f"{MATERIAL},copper"}
        page.goto(srv.url(f"calculators/{name}/?" + urlencode(query)))
        page.wait_for_function("performance.getEntriesByName('cw-result-painted').length > 0", timeout=RUNTIME_MS)
        page.wait_for_timeout(500)
        assert site["material_name"] in page.locator(".cw-result").inner_text()
        assert_inert(page, guard, f"{name} with the hostile material")
    for payload in PAYLOADS:
        query = {k: payload for k in params}
        if name == "matrix":  # its only typed fields are the service conditions, written to the URL when given
            query.update({k: payload for k in ("sc-t", "sc-ph")})
        page.goto(srv.url(f"calculators/{name}/?" + urlencode(query)))
        page.wait_for_load_state("load")
        page.locator(".cw-form").first.wait_for(timeout=RUNTIME_MS)
        page.wait_for_timeout(800)
        # typed fields keep the text as typed, and their message quotes it as text
        shown = page.evaluate("""(p) => [...document.querySelectorAll('.cw-form input[type=text]')]
            .filter(i => !i.closest('[hidden]')).map(i => [i.id, i.value,
              (document.getElementById(i.id + '-msg') || {}).textContent || ''])""", payload)
        for fid, value, msg in shown:
            if value == payload:
                assert payload in msg or msg == "", (fid, msg)
        assert_inert(page, guard, f"{name} with {payload!r} in every parameter")
        if shown:
            assert any(v == payload for _, v, _ in shown), f"{name}: no field shows the payload as typed"
            assert any(payload in m for _, _, m in shown), f"{name}: no message quotes the payload"


#: forms the one number rule refuses (tests/fixtures/numbers.json), and echoes that must not mislead:
#: a right-to-left override and a long value (its length keeps the whole link under the server's limit)
NUMBER_FORMS = ["0x10", "1,000", "1_000", "Infinity", "NaN", "1.000,5", "12\u202e3", "9" * 2000 + "x"]
NUMBER_FIELDS = """() => [...document.querySelectorAll('.cw-form input[inputmode=decimal]')]
  .filter((i) => !i.closest('[hidden]')).map((i) => { const m = document.getElementById(i.id + '-msg');
    return { id: i.id, value: i.value, text: m.textContent, isolated: m.querySelectorAll('bdi').length,
             height: m.getBoundingClientRect().height }; })"""


@pytest.mark.parametrize("name", [c for c in CALCULATORS if c != "matrix"])
def test_refused_number_forms_in_every_url_parameter(hostile, page_of, name):
    """A shared link whose every parameter holds a form the rule refuses: each number field says
    what was read, in an isolated and cut echo; nothing is calculated and the result area says
    what was wrong; nothing runs."""
    srv, site = hostile
    page, guard = page_of()
    params = _opened(page, srv, name)
    for form in NUMBER_FORMS:
        page.goto(srv.url(f"calculators/{name}/?" + urlencode({k: form for k in params})))
        page.locator(".cw-result ul.cw-pending").first.wait_for(timeout=RUNTIME_MS)
        fields = [f for f in page.evaluate(NUMBER_FIELDS) if f["value"] == form]
        assert fields, f"{name}: no number field holds {form[:20]!r}"
        for f in fields:
            assert f["text"] and f["isolated"] == 1 and "\u202e" not in f["text"], (name, form[:20], f)
            assert len(f["text"]) < 300 and f["height"] < 200, (name, form[:20], f)
        assert page.locator(".cw-result [data-cw-value], .cw-result .cw-big").count() == 0, (name, form[:20])
        assert "\u202e" not in page.locator("article").inner_text()
        assert_inert(page, guard, f"{name} with {form[:20]!r} in every parameter")

