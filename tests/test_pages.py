"""Generated reference pages and the galvanic-series chart.

Every record has its page or row, every value links to an anchor that exists on the bibliography
page, values recalled rather than read carry the recalled badge, and data text is rendered as
text: a hostile note shows literally and never becomes HTML.
"""

import copy
import html
import html.parser
import json
import os
import posixpath
import re
import subprocess
import sys
import xml.etree.ElementTree as ET

import markdown
import pytest

from sitebuild import charts, pages
from sitebuild.dataset import bundle_from_raw, load_project_bundle, read_folder

from pagekit import write_docs

ROOT = os.path.dirname(os.path.dirname(os.path.abspath(__file__)))
MINIMAL = os.path.join(ROOT, "tests", "fixtures", "minimal")
SVG_NS = "{http://www.w3.org/2000/svg}"
HOSTILE = '<script>alert("x")</script> *bold* _it_ | pipe [link](http://example.invalid) {#id} `code` # &amp;'
#: the Markdown extensions of mkdocs.yml (the pages must render with these)
EXTENSIONS = ["admonition", "attr_list", "md_in_html", "tables", "toc"]


def minimal_bundle():
    raw, problems = read_folder(MINIMAL)
    assert problems == []
    return bundle_from_raw(copy.deepcopy(raw))


@pytest.fixture(scope="module")
def shipped():
    return load_project_bundle()


@pytest.fixture(scope="module", params=["minimal", "shipped"])
def bundle(request):
    return minimal_bundle() if request.param == "minimal" else load_project_bundle()


def body(text):
    """A page without its front matter."""
    if text.startswith("---\n"):
        return text.split("\n---\n", 1)[1]
    return text


def anchors_of(text):
    ids = set(re.findall(r'\bid="([^"]+)"', text))
    ids |= set(re.findall(r"\{#([A-Za-z0-9_-]+)\}", text))
    return ids


def links_of(text):
    """Markdown link targets and the hrefs of the HTML blocks (see sitebuild/pages/kit.py)."""
    return re.findall(r"\]\(([^)\s]+)\)", body(text)) + [html.unescape(h) for h in re.findall(r'href="([^"]*)"', body(text))]


def doc_of(link, path, out):
    """The generated page (or file) a link on ``path`` points at: a relative .md path as written in
    Markdown, or a URL of the built site (use_directory_urls) as written in the HTML blocks."""
    target = link.partition("#")[0]
    if not target:
        return path
    if target.endswith(".md") or "." in posixpath.basename(target):
        return posixpath.normpath(posixpath.join(posixpath.dirname(path), target))
    url = posixpath.normpath(posixpath.join(pages.page_url(path), target))
    for candidate in (url + ".md", url + "/index.md"):
        if candidate in out:
            return candidate
    return url


def rows_of(text):
    """The rows of the page's HTML tables, each as one string (cells joined)."""
    return [re.sub(r"\n", "", r) for r in re.findall(r"<tr>\n(.*?)\n</tr>", text, re.S)]


def cells_of(row):
    return re.findall(r"<t[dh]>(.*?)</t[dh]>", row)


def row_with(text, needle):
    """The one table row that contains ``needle``."""
    rows = [r for r in rows_of(text) if needle in r]
    assert len(rows) == 1, (needle, rows)
    return rows[0]


def href_to(to, on):
    """What a link from the page ``on`` to the doc path/anchor ``to`` (relative .md) looks like."""
    return f'href="{pages.href(to, on)}"'


# --- every record has its page or row ----------------------------------------------------------------
def test_page_set(bundle):
    out = pages.generate_pages(bundle)
    for path in ("reference/series.md", "reference/materials/index.md", "reference/electrodes.md",
                 "reference/environments.md", "reference/sources.md", "reference/galvanic-series.md",
                 "reference/ions.md"):
        assert path in out, path
    for m in bundle["materials"]:
        page = out[f"reference/materials/{pages.material_file(m['id'])}"]
        assert pages.esc(m["name"]) in page
        for u in m.get("uns") or []:
            assert u in page.split("\n")[1]  # the title carries the UNS numbers (search finds them)
        assert href_to(pages.material_file(m["id"]), "reference/materials/index.md") in out["reference/materials/index.md"]
    assert len([p for p in out if p.startswith("reference/materials/")]) == len(bundle["materials"]) + 1


def test_every_record_has_a_row(bundle):
    out = pages.generate_pages(bundle)
    series = out["reference/series.md"]
    for hr in bundle["half_reactions"]:
        row = row_with(series, f'id="{pages.couple_anchor(hr["id"])}"')
        assert f"<strong>{pages.esc(hr['id'])}</strong>" in row, hr["id"]
    for r in bundle["reference_electrodes"]:
        assert f'id="{pages.electrode_anchor(r["id"])}"' in out["reference/electrodes.md"], r["id"]
    for e in bundle["environments"]:
        assert "{#" + pages.environment_anchor(e["id"]) + "}" in out["reference/environments.md"], e["id"]
    for s in bundle["sources"]:
        assert "{#" + pages.source_anchor(s["id"]) + "}" in out["reference/sources.md"], s["id"]
    assert len(re.findall(r'id="ion-', out["reference/ions.md"])) == len(bundle["ions"])
    gs = out["reference/galvanic-series.md"]
    with_range = [m for m in bundle["materials"] if m.get("seawater_range_V_SCE")]
    assert all(href_to(f"materials/{pages.material_file(m['id'])}", "reference/galvanic-series.md") in gs
               for m in with_range)


def test_anchors_are_unique(bundle):
    out = pages.generate_pages(bundle)
    for path, text in out.items():
        ids = re.findall(r'\bid="([^"]+)"', text) + re.findall(r"\{#([A-Za-z0-9_-]+)\}", text)
        assert len(ids) == len(set(ids)), (path, sorted(i for i in ids if ids.count(i) > 1))


def test_series_is_sorted_by_potential(bundle):
    series = pages.generate_pages(bundle)["reference/series.md"]
    order = re.findall(r'<span id="(hr-[^"]+)"></span>', series)
    expected = [pages.couple_anchor(h["id"]) for h in
                sorted(bundle["half_reactions"], key=lambda h: (-h["E0_V"], h["id"]))]
    assert order == expected


# --- links and sources --------------------------------------------------------------------------------
def test_every_link_resolves(bundle):
    """Relative links point at generated pages (or the chart) and at anchors that exist there."""
    out = pages.generate_pages(bundle)
    extra_files = {charts.CHART_PATH}
    for path, text in out.items():
        for link in links_of(text):
            if link.startswith(("http:", "https:", "mailto:")):
                continue
            anchor = link.partition("#")[2]
            resolved = doc_of(link, path, out)
            assert resolved in out or resolved in extra_files, (path, link)
            if anchor:
                assert anchor in anchors_of(out[resolved]), (path, link)


def test_every_value_links_its_source(bundle):
    out = pages.generate_pages(bundle)
    series = out["reference/series.md"]
    on = "reference/series.md"
    for hr in bundle["half_reactions"]:
        row = row_with(series, f'id="{pages.couple_anchor(hr["id"])}"')
        assert href_to(f"sources.md#{pages.source_anchor(hr['E0_source'])}", on) in row, hr["id"]
        if hr.get("dEdT_mV_per_K") is not None:
            assert href_to(f"sources.md#{pages.source_anchor(hr['dEdT_source'])}", on) in row, hr["id"]
    for m in bundle["materials"]:
        page = out[f"reference/materials/{pages.material_file(m['id'])}"]
        for prefix, label in (("seawater", "Flowing seawater range"), ("density", "Density"),
                              ("anodic_index", "Anodic index"), ("equivalent_weight", "Equivalent weight")):
            if m.get(f"{prefix}_source") is None:
                continue
            row = next(r for r in rows_of(page) if r.startswith(f"<td>{label}"))
            on = f"reference/materials/{pages.material_file(m['id'])}"
            assert href_to(f"../sources.md#{pages.source_anchor(m[prefix + '_source'])}", on) in row, (m["id"], prefix)
    electrodes = out["reference/electrodes.md"]
    for r in bundle["reference_electrodes"]:
        row = row_with(electrodes, f'id="{pages.electrode_anchor(r["id"])}"')
        assert href_to(f"sources.md#{pages.source_anchor(r['source'])}", "reference/electrodes.md") in row
        assert href_to(f"sources.md#{pages.source_anchor(r['temperature']['source'])}", "reference/electrodes.md") in row
    envs = out["reference/environments.md"]
    for e in bundle["environments"]:
        assert href_to(f"sources.md#{pages.source_anchor(e['allowable_source'])}", "reference/environments.md") in envs


def test_sources_page_lists_what_each_source_is_cited_for():
    out = pages.generate_pages(minimal_bundle())
    src = out["reference/sources.md"]
    section = src.split("{#src-bratsch-1989}", 1)[1].split("\n## ", 1)[0]
    # the fixture cites Bratsch (1989) for E° of Fe2+/Fe only
    assert '<p>Cited for: <a href="../series/#hr-fe2p-fe">E° of Fe2+/Fe</a>.</p>' in section


def test_recalled_values_carry_the_badge():
    out = pages.generate_pages(minimal_bundle())
    series = out["reference/series.md"]
    row = {h: row_with(series, f'id="{pages.couple_anchor(h)}"') for h in ("Fe2+/Fe", "Zn2+/Zn")}
    assert pages.RECALLED in row["Fe2+/Fe"]  # E0_confidence: recalled in the fixture
    assert pages.RECALLED not in row["Zn2+/Zn"]  # E0_confidence: read
    zinc = out["reference/materials/zinc.md"]
    seawater = next(r for r in rows_of(zinc) if r.startswith("<td>Flowing seawater range"))
    density = next(r for r in rows_of(zinc) if r.startswith("<td>Density"))
    assert pages.RECALLED not in seawater and pages.RECALLED in density
    # the badge is defined once and explained on every page
    assert all(pages.RECALLED in text for text in out.values())


def test_recalled_badges_in_the_shipped_data(shipped):
    out = pages.generate_pages(shipped)
    series = out["reference/series.md"]
    for hr in shipped["half_reactions"]:
        row = row_with(series, f'id="{pages.couple_anchor(hr["id"])}"')
        e0_cell = cells_of(row)[3]
        assert (pages.RECALLED in e0_cell) == (hr["E0_confidence"] == "recalled"), hr["id"]
        if hr.get("hypothetical"):
            assert pages.HYPOTHETICAL in row


def test_titles_carry_names_uns_and_couple_ids(shipped):
    out = pages.generate_pages(shipped)
    for m in shipped["materials"]:
        text = out[f"reference/materials/{pages.material_file(m['id'])}"]
        title = json.loads(re.search(r'^title: (".*")$', text, re.M).group(1))
        assert title.startswith(m["name"].translate(pages._TITLE_SAFE))
        for u in m.get("uns") or []:
            assert u in title
    assert all(h["id"] in out["reference/series.md"] or pages.esc(h["id"]) in out["reference/series.md"]
               for h in shipped["half_reactions"])


# --- escaping -------------------------------------------------------------------------------------------
class _Text(html.parser.HTMLParser):
    def __init__(self):
        super().__init__()
        self.tags, self.text = [], []

    img_attrs = ()

    def handle_starttag(self, tag, attrs):
        self.tags.append(tag)
        if tag == "img":
            self.img_attrs = list(self.img_attrs) + [attrs]

    def handle_data(self, data):
        self.text.append(data)


def hostile_bundle():
    raw, _ = read_folder(MINIMAL)
    raw = copy.deepcopy(raw)
    raw["materials"][2]["note"] = HOSTILE
    raw["materials"][2]["name"] = "Zinc </title><script>alert(1)</script>"
    raw["half_reactions"][0]["note"] = HOSTILE
    raw["half_reactions"][0]["spread"] = "<img src=x onerror=alert(2)>"
    raw["environments"][0]["name"] = "Sea </a><script>alert(3)</script>"
    raw["sources"][0]["title"] = HOSTILE
    raw["reference_electrodes"][1]["note"] = HOSTILE
    raw["ions"][0]["note"] = HOSTILE
    return bundle_from_raw(raw)


def test_hostile_text_renders_literally():
    out = pages.generate_pages(hostile_bundle())
    for path, text in out.items():
        rendered = markdown.markdown(body(text), extensions=EXTENSIONS)
        parser = _Text()
        parser.feed(rendered)
        assert "script" not in parser.tags, path
        assert not any(dict(a).get("src") == "x" for a in parser.img_attrs), path
        shown = "".join(parser.text)
        if HOSTILE.split()[0] in html.unescape(text):
            # the whole string shows as text, Markdown characters included
            assert HOSTILE in re.sub(r"\s+", " ", shown), path
    zinc = out["reference/materials/zinc.md"]
    title = re.search(r"^title: (.*)$", zinc, re.M).group(1)
    assert "<" not in title and ">" not in title


def test_hostile_text_in_a_material_build():
    """Build the generated pages with mkdocs and the Material theme: no script from the data."""
    import shutil
    import tempfile

    out = pages.generate_pages(hostile_bundle())
    with tempfile.TemporaryDirectory() as tmp:
        write_docs(os.path.join(tmp, "docs"), out, hostile_bundle())
        with open(os.path.join(tmp, "mkdocs.yml"), "w", encoding="utf-8") as fh:
            fh.write("site_name: t\nuse_directory_urls: true\ntheme:\n  name: material\n  font: false\n"
                     "plugins: []\nvalidation:\n  anchors: warn\nmarkdown_extensions:\n"
                     + "".join(f"  - {e}\n" for e in EXTENSIONS))
        mkdocs = os.path.join(os.path.dirname(sys.executable), "mkdocs")
        proc = subprocess.run([mkdocs, "build", "--strict"], cwd=tmp, capture_output=True, text=True,
                              timeout=300, env={**os.environ, "NO_MKDOCS_2_WARNING": "1"})
        assert proc.returncode == 0, proc.stderr[-3000:]
        site = os.path.join(tmp, "site", "reference")
        for folder, _, names in os.walk(site):
            for name in names:
                if name.endswith(".html"):
                    with open(os.path.join(folder, name), encoding="utf-8") as fh:
                        page = fh.read()
                    assert "<script>alert" not in page and "<img src=x" not in page, name
        shutil.rmtree(os.path.join(tmp, "site"))


def test_esc_covers_markdown_and_html():
    for ch in "<>&*_`[]|#\\{}~^=:$\"'-+!.()":
        text = f"a {ch}{ch}x{ch} b"
        rendered = markdown.markdown("Note: " + pages.esc(text), extensions=EXTENSIONS)
        parser = _Text()
        parser.feed(rendered)
        assert parser.tags == ["p"] and "".join(parser.text) == "Note: " + text, (ch, rendered)
    assert pages.esc("a\nb\tc") == "a b c"
    assert pages.esc(None) == ""


# --- the chart --------------------------------------------------------------------------------------------
def parse_svg(text):
    return ET.fromstring(text)


def test_chart_is_valid_svg_with_title_and_desc(bundle):
    svg = charts.galvanic_series_svg(bundle)
    root = parse_svg(svg)
    assert root.tag == SVG_NS + "svg"
    assert re.match(r"^0 0 \d+ \d+$", root.get("viewBox"))
    assert root.get("role") == "img" and root.get("aria-labelledby")
    title, desc = root.find(SVG_NS + "title"), root.find(SVG_NS + "desc")
    assert title is not None and "Galvanic series" in title.text
    assert desc is not None and "2.4 to 4 m/s" in desc.text and "10 to 27 °C" in desc.text
    texts = " ".join("".join(t.itertext()) for t in root.iter(SVG_NS + "text"))
    assert "V vs SCE" in texts
    for m in bundle["materials"]:
        if m.get("seawater_range_V_SCE"):
            assert charts._short(m["name"]) in texts, m["name"]


def test_chart_bars_and_order(bundle):
    root = parse_svg(charts.galvanic_series_svg(bundle))
    bars = [g for g in root.iter(SVG_NS + "g") if g.get("class") == "cw-bar"]
    with_range = [m for m in bundle["materials"] if m.get("seawater_range_V_SCE")]
    assert len(bars) == len(with_range)
    # noble at the top: the noble ends never rise going down the rows
    ys, nobles = [], []
    for g in bars:
        rect = g.find(SVG_NS + "rect")
        ys.append(float(rect.get("y")))
        nobles.append(float(rect.get("x")) + float(rect.get("width")))
    assert ys == sorted(ys) and all(a >= b - 3.01 for a, b in zip(nobles, nobles[1:]))
    # states differ by pattern and outline, not by colour alone
    by_state = {}
    for g, m in zip(bars, sorted(with_range, key=lambda m: (-max(m["seawater_range_V_SCE"]),
                                                            -min(m["seawater_range_V_SCE"]), m["name"]))):
        rect = g.find(SVG_NS + "rect")
        by_state.setdefault(m.get("state"), set()).add((rect.get("fill"), rect.get("stroke-dasharray"),
                                                        rect.get("stroke-width")))
        assert m["name"] in g.find(SVG_NS + "title").text
    if "active" in by_state:
        assert all(fill == "url(#cwgs-hatch)" and dash for fill, dash, _ in by_state["active"])
    if "passive" in by_state and None in by_state:
        assert by_state["passive"].isdisjoint(by_state[None])


def test_chart_axis_ticks_every_tenth_of_a_volt(shipped):
    svg = charts.galvanic_series_svg(shipped)
    root = parse_svg(svg)
    grid = [ln for ln in root.iter(SVG_NS + "line") if ln.get("class") == "cw-gs-grid"]
    xs = sorted(float(ln.get("x1")) for ln in grid)
    steps = [b - a for a, b in zip(xs, xs[1:])]
    assert max(steps) - min(steps) < 0.2  # evenly spaced (coordinates rounded to 0.1 px)
    lows = [m["seawater_range_V_SCE"][0] for m in shipped["materials"] if m.get("seawater_range_V_SCE")]
    highs = [m["seawater_range_V_SCE"][1] for m in shipped["materials"] if m.get("seawater_range_V_SCE")]
    ticks = [t for t in root.iter(SVG_NS + "text") if t.get("font-size") == "11" and t.get("text-anchor") == "middle"]
    values = sorted({float("".join(t.itertext()).replace("\u2212", "-")) for t in ticks})
    assert values[0] <= min(lows) < values[0] + 0.2 and values[-1] - 0.2 < max(highs) <= values[-1]
    assert len(grid) == round((values[-1] - values[0]) / 0.1) + 1
    assert all(abs(b - a - 0.2) < 1e-9 for a, b in zip(values, values[1:]))
    labels = ["".join(t.itertext()) for t in root.iter(SVG_NS + "text")]
    assert "0.0" in labels and "\u22121.0" in labels


def test_chart_highlight_and_escaping():
    bundle = hostile_bundle()
    svg = charts.galvanic_series_svg(bundle, highlight=["zinc", "stainless-316-passive"])
    root = parse_svg(svg)  # parses: the hostile name is escaped
    bold = ["".join(t.itertext()) for t in root.iter(SVG_NS + "text") if t.get("font-weight") == "700"
            and t.get("text-anchor") == "end"]
    assert any(b.startswith("Zinc </title><script>") for b in bold)
    assert any("316/317 (passive)" in b for b in bold)
    assert not any(el.tag == SVG_NS + "script" for el in root.iter())
    dimmed = [g for g in root.iter(SVG_NS + "g") if g.get("opacity")]
    assert len(dimmed) == 1  # the third material, stainless 316 active
    assert "Highlighted:" in root.find(SVG_NS + "desc").text


def test_chart_without_materials():
    root = parse_svg(charts.galvanic_series_svg({"materials": []}))
    assert "no material" in " ".join("".join(t.itertext()) for t in root.iter(SVG_NS + "text"))
