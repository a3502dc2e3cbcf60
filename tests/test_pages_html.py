"""The generated pages' tables, lists and "Cited for" lines are written as raw HTML blocks
(sitebuild/pages/templates/_blocks.md.j2; Python-Markdown passes them through instead of running
its inline patterns over every cell). The site must not change by it: built with mkdocs and the
Material theme, every generated page shows the same HTML (links included, which mkdocs rewrites in
Markdown but not in raw HTML) and gives the same search entries as the plain Markdown form.
"""

import copy
import json
import os
import re
import subprocess
import sys

import pytest

from sitebuild import pages
from sitebuild.pages import kit
from sitebuild.pages.text import Md
from sitebuild.dataset import bundle_from_raw, load_project_bundle, read_folder

from pagekit import write_docs

ROOT = os.path.dirname(os.path.dirname(os.path.abspath(__file__)))
MINIMAL = os.path.join(ROOT, "tests", "fixtures", "minimal")
#: the Markdown extensions of mkdocs.yml
EXTENSIONS = ["admonition", "attr_list", "md_in_html", "tables", "toc", "pymdownx.details"]
HOSTILE = '<script>alert("x")</script> *bold* _it_ | pipe [link](http://example.invalid) {#id} `code` --x &amp;'


@pytest.fixture(scope="module")
def shipped():
    return load_project_bundle()


def hostile_bundle():
    raw, _ = read_folder(MINIMAL)
    raw = copy.deepcopy(raw)
    raw["materials"][2]["note"] = HOSTILE
    raw["materials"][2]["name"] = "Zinc </td><script>alert(1)</script> | x"
    raw["materials"][2]["id"] = "zinc`</code><b>x"
    raw["half_reactions"][0]["note"] = HOSTILE
    raw["half_reactions"][0]["name"] = "**x** [y](z.md) </table>"
    raw["environments"][0]["name"] = "Sea </a><script>alert(3)</script>"
    raw["sources"][0]["title"] = HOSTILE
    raw["ions"][0]["note"] = "- not a list item | </ul>"
    return bundle_from_raw(raw)


def _build(tmp, out, bundle):
    """Build the generated pages with mkdocs (Material theme, search): {page url: article html}, search docs."""
    write_docs(os.path.join(tmp, "docs"), out, bundle)
    with open(os.path.join(tmp, "mkdocs.yml"), "w", encoding="utf-8") as fh:
        fh.write("site_name: t\nuse_directory_urls: true\ntheme:\n  name: material\n  font: false\n"
                 "plugins: [search]\nvalidation:\n  anchors: warn\nmarkdown_extensions:\n"
                 + "".join(f"  - {e}\n" for e in EXTENSIONS[:-2])
                 + "  - toc:\n      permalink: true\n  - pymdownx.details\n")
    mkdocs = os.path.join(os.path.dirname(sys.executable), "mkdocs")
    proc = subprocess.run([mkdocs, "build", "--strict"], cwd=tmp, capture_output=True, text=True,
                          timeout=300, env={**os.environ, "NO_MKDOCS_2_WARNING": "1"})
    assert proc.returncode == 0, proc.stderr[-3000:]
    site = os.path.join(tmp, "site")
    articles = {}
    for path in out:
        with open(os.path.join(site, pages.page_url(path), "index.html"), encoding="utf-8") as fh:
            text = fh.read()
        article = re.search(r"<article[^>]*>(.*?)</article>", text, re.S).group(1)
        articles[path] = re.sub(r"\s+", " ", re.sub(r">\s+<", "><", article)).strip()
    with open(os.path.join(site, "search", "search_index.json"), encoding="utf-8") as fh:
        search = [(d["location"], d["title"], re.sub(r"\s+", " ", d["text"]).strip())
                  for d in json.load(fh)["docs"]]
    return articles, search


@pytest.mark.parametrize("which", ["shipped", "hostile"])
def test_html_blocks_change_nothing_the_site_shows(tmp_path, which):
    bundle = load_project_bundle() if which == "shipped" else hostile_bundle()
    html_form = pages.generate_pages(bundle)
    markdown_form = pages.generate_pages(bundle, raw_html=False)
    assert html_form.keys() == markdown_form.keys()
    assert any("<table>" in t for t in html_form.values())
    assert not any("<table>" in t for t in markdown_form.values())
    a_articles, a_search = _build(str(tmp_path / "html"), html_form, bundle)
    b_articles, b_search = _build(str(tmp_path / "markdown"), markdown_form, bundle)
    for path in html_form:
        assert a_articles[path] == b_articles[path], path
    assert a_search == b_search
    if which == "hostile":
        for article in a_articles.values():
            assert "<script>alert" not in article and "<b>x" not in article


def test_the_site_uses_directory_urls():
    """The HTML blocks carry the built site's URLs for ``use_directory_urls: true``."""
    with open(os.path.join(ROOT, "mkdocs.yml"), encoding="utf-8") as fh:
        text = fh.read()
    assert re.search(r"^use_directory_urls:\s*true\s*$", text, re.M)


def test_href_as_mkdocs_writes_it():
    assert pages.href("../sources.md#src-a", "reference/materials/zinc.md") == "../../sources/#src-a"
    assert pages.href("index.md", "reference/materials/zinc.md") == "../"
    assert pages.href("zinc.md", "reference/materials/index.md") == "zinc/"
    assert pages.href("materials/zinc.md", "reference/galvanic-series.md") == "../materials/zinc/"
    assert pages.href("series.md#hr-x", "reference/sources.md") == "../series/#hr-x"
    assert pages.href("#note-x", "reference/series.md") == "#note-x"
    assert pages.href("galvanic-series.svg", "reference/galvanic-series.md") == "../galvanic-series.svg"
    assert pages.href("https://example.invalid/a.md", "reference/series.md") == "https://example.invalid/a.md"


def test_inline_html_escapes_code_and_keeps_escaped_text():
    """A cell's code span, strong text and link as the site writes them, and as Markdown."""
    def cell(html):
        page = kit.Site({}, html=html).page("reference/series.md")
        return " ".join([page.code("a<b>&c"), page.strong("x*y [z](w.md) </td>"), page.a("s", "sources.md#src-a")])

    assert cell(True) == (
        "<code>a&lt;b&gt;&amp;c</code> <strong>x&#42;y &#91;z&#93;(w.md) &#60;/td&#62;</strong> "
        '<a href="../sources/#src-a">s</a>')
    assert cell(False) == "`a<b>&c` **" + pages.esc("x*y [z](w.md) </td>") + "** [s](sources.md#src-a)"


BLOCKS = ('{% import "_blocks.md.j2" as b with context %}# T\n\nintro\n\n{{ b.table(["A", "B"], rows) }}\n\n'
          '{{ b.list(["one", "two"]) }}\n\n{{ b.paragraph(cited) }}\n\nmore')


def blocks(html):
    """The blocks of _blocks.md.j2 (a table, a list, a "Cited for" line) on a page, without its front matter."""
    page = kit.Site({}, html=html).page("reference/p.md")
    text = page.render(kit.ENV.from_string(BLOCKS), rows=[["1", page.a("x", "a.md")]],
                       cited=Md("Cited for: ") + page.a("y", "b.md") + Md("."))
    return text.split("\n---\n\n", 1)[1]


def test_html_blocks_shapes():
    assert blocks(True) == (
        "# T\n\nintro\n\n<table>\n<thead>\n<tr>\n<th>A</th>\n<th>B</th>\n</tr>\n</thead>\n<tbody>\n"
        '<tr>\n<td>1</td>\n<td><a href="../a/">x</a></td>\n</tr>\n</tbody>\n</table>\n\n'
        '<ul>\n<li>one</li>\n<li>two</li>\n</ul>\n\n<p>Cited for: <a href="../b/">y</a>.</p>\n\nmore\n')
    assert blocks(False) == ("# T\n\nintro\n\n| A | B |\n|---|---|\n| 1 | [x](a.md) |\n\n- one\n- two\n\n"
                             "Cited for: [y](b.md).\n\nmore\n")


def test_cited_for_lines_stand_alone(shipped):
    """A "Cited for" line is its own paragraph: a raw <p> block in the site's form, a line between
    blank lines in the Markdown form (so it never runs on into the next paragraph)."""
    html_form = pages.generate_pages(shipped)["reference/sources.md"].split("\n")
    markdown_form = pages.generate_pages(shipped, raw_html=False)["reference/sources.md"].split("\n")
    cited = [i for i, line in enumerate(markdown_form) if line.startswith("Cited for: ")]
    assert cited and all(markdown_form[i - 1] == "" and markdown_form[i + 1] == "" for i in cited)
    html_cited = [line for line in html_form if "Cited for: " in line]
    assert len(html_cited) == len(cited)
    assert all(line.startswith("<p>Cited for: ") and line.endswith(".</p>") for line in html_cited)


def test_no_tags_but_the_generators_own():
    """Data text never reaches the raw HTML blocks as markup: every tag is one the generators write."""
    bundle = hostile_bundle()
    for path, text in pages.generate_pages(bundle).items():
        for tag in re.findall(r"<(/?[a-zA-Z][a-zA-Z0-9]*)", text):
            assert tag.lstrip("/") in {"table", "thead", "tbody", "tr", "th", "td", "a", "strong", "code", "br",
                                       "span", "abbr", "sub", "sup", "cite", "ul", "li", "p"}, (path, tag)


def test_mkdocs_still_sees_the_anchors_in_the_html_blocks(tmp_path):
    """A hand-written page may link to a row of a generated table (the anchors sit in the HTML
    blocks): mkdocs' strict link check must still find them, and still refuse a wrong one."""
    raw, _ = read_folder(MINIMAL)
    bundle = bundle_from_raw(copy.deepcopy(raw))
    out = pages.generate_pages(bundle)
    rows = {"series": pages.couple_anchor("Fe3+/Fe2+"), "electrodes": pages.electrode_anchor("SCE")}
    assert all(f'<span id="{a}"></span>' in out[f"reference/{p}.md"] for p, a in rows.items())
    links = " ".join(f"[{p}](reference/{p}.md#{a})" for p, a in rows.items())
    _build(str(tmp_path / "ok"), {**out, "linker.md": f"# Links\n\n{links}\n"}, bundle)
    with pytest.raises(AssertionError, match="does not contain an anchor '#hr-no-such-couple'"):
        _build(str(tmp_path / "bad"), {**out, "linker.md": "# Links\n\n[x](reference/series.md#hr-no-such-couple)\n"},
               bundle)
