"""The data-quality page (sitebuild.pages.quality) and the place read shown beside each source link."""

import functools
import os
import re

import pytest

from sitebuild import pages
from sitebuild.dataset import load_project_bundle
from sitebuild.pages.cite import where_text
from sitebuild.pages.quality import QUALITY_PAGE, quality_summary, record_link, tally
from sitebuild.validate.where import each_flag

ROOT = os.path.dirname(os.path.dirname(os.path.abspath(__file__)))
HOSTILE = '<script>alert("x")</script> *bold* | pipe'


@functools.lru_cache(maxsize=1)
def _bundle():
    return load_project_bundle()


@functools.lru_cache(maxsize=1)
def _pages():
    return pages.generate_pages(_bundle(), raw_html=False)


def _table(text, heading):
    """The rows of the Markdown table under a heading, as lists of cells."""
    part = text.split(heading, 1)[1].split("\n## ", 1)[0]
    rows = [ln for ln in part.splitlines() if ln.startswith("|")]
    return [[c.strip() for c in r.strip("|").split(" | ")] for r in rows[2:]]


def test_the_page_is_generated_and_in_the_nav():
    assert QUALITY_PAGE in _pages()
    with open(os.path.join(ROOT, "mkdocs.yml"), encoding="utf-8") as fh:
        assert "Data quality: reference/data-quality.md" in fh.read()


def test_the_file_table_counts_every_flag_of_every_file():
    rows = _table(_pages()[QUALITY_PAGE], "## By file")
    by_file, _, total, _ = quality_summary(_bundle())
    assert [r[0].strip("`") for r in rows[:-1]] == [name for name, _ in by_file]
    assert rows[-1][1] == str(total["total"])
    flags = list(each_flag(_bundle(), [k for k in _bundle() if isinstance(_bundle()[k], list) and k != "sources"]))
    assert total["total"] == len(flags)
    for (name, t), row in zip(by_file, rows):
        assert row[1] == str(t["total"]) and row[2].startswith(f"{t['read']} (")
        assert row[3].startswith(f"{t['recalled']} (")
        assert t["read"] + t["recalled"] + t["computed"] + t["other"] == t["total"]


def test_the_share_marks_the_files_that_meet_the_aim():
    rows = _table(_pages()[QUALITY_PAGE], "## By file")
    for row in rows[:-1]:
        n, recalled = int(row[1]), int(row[3].split(" ")[0])
        assert ("✔" in row[3]) == (recalled <= 0.20 * n), row


def test_the_work_list_holds_every_recalled_value_with_its_field_and_source():
    text = _pages()[QUALITY_PAGE]
    rows = _table(text, "## Values still recalled")
    _, _, total, recalled = quality_summary(_bundle())
    assert len(rows) == total["recalled"] == len(recalled) > 0
    # the CRC figure of Li+/Li is kept although the reproduction read prints fewer digits
    li = [r for r in rows if "Li+/Li" in r[1]]
    assert li and li[0][2] == "`E0_V`" and "crc-vanysek" in li[0][3] and "series.md#hr-lip-li" in li[0][1]


def test_record_links_point_to_the_record_pages():
    assert record_link("half_reactions", "Zn2+/Zn") == "reference/series.md#hr-zn2p-zn"
    assert record_link("materials", "zinc") == "reference/materials/zinc.md"
    assert record_link("gibbs_energies", "Zn2+(aq)") == "reference/gibbs-energies.md#dg-zn2p-aq"
    assert record_link("cp_coatings", "x") is None


def test_tally_of_no_flags():
    assert tally([]) == {"read": 0, "recalled": 0, "computed": 0, "other": 0, "total": 0, "recalled_share": 0.0}


def test_where_text_is_escaped_and_empty_when_absent():
    out = str(where_text(HOSTILE))
    assert "<script>" not in out and "&#60;script&#62;" in out and out.startswith(' <span class="cw-where"')
    assert str(where_text(None)) == "" and str(where_text("  ")) == ""


@pytest.mark.parametrize("kind, doc", [("half_reactions", "reference/series.md"),
                                       ("reference_electrodes", "reference/electrodes.md"),
                                       ("ions", "reference/ions.md"),
                                       ("gibbs_energies", "reference/gibbs-energies.md"),
                                       ("environments", "reference/environments.md"),
                                       ("cp_criteria", "reference/cp-criteria.md")])
def test_each_record_page_shows_where_every_read_value_was_read(kind, doc):
    text = _pages()[doc]
    missing = []
    for flag in each_flag(_bundle(), [kind]):
        if flag.confidence == "read" and str(where_text(flag.where)) not in text:
            missing.append((flag.record, flag.field, flag.where))
    assert not missing, missing[:5]


def test_each_material_page_shows_where_its_read_values_were_read():
    out = _pages()
    missing = []
    for flag in each_flag(_bundle(), ["materials"]):
        doc = record_link("materials", flag.record)
        if flag.confidence == "read" and str(where_text(flag.where)) not in out[doc]:
            missing.append((flag.record, flag.field))
    assert not missing, missing[:5]


def test_the_page_names_no_recalled_value_as_read():
    rows = _table(_pages()[QUALITY_PAGE], "## Values still recalled")
    read_places = {(f.record, f.field) for f in each_flag(_bundle()) if f.confidence == "read"}
    assert not [r for r in rows if (re.sub(r"^\[(.*)\]\(.*\)$", r"\1", r[1]), r[2].strip("`")) in read_places]
