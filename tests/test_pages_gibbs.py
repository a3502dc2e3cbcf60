"""The Gibbs-energy reference page (sitebuild.pages.gibbs) and the ΔG°f-derived E° on the series page.

Checks against published numbers: ΔG°f of OpenStax Chemistry 2e (2019), Appendix G, which
reproduces the NBS tables (D. D. Wagman et al., J. Phys. Chem. Ref. Data 11, Suppl. 2, 1982):
Zn2+(aq) -147.1 and Fe2+(aq) -78.90 kJ/mol; Faraday constant 96 485.332 C/mol (CODATA 2018);
E° of Vanýsek, CRC Handbook 92nd ed. (2011), as reproduced in OpenStax Appendix L
(Zn2+/Zn -0.7618 V, Fe2+/Fe -0.447 V).
"""

import functools
import os

from sitebuild import pages
from sitebuild.dataset import load_project_bundle
from sitebuild.pages.gibbs import GIBBS_PAGE, gibbs_anchor, gibbs_derived

ROOT = os.path.dirname(os.path.dirname(os.path.abspath(__file__)))
F = 96485.332  # C/mol, CODATA 2018


@functools.lru_cache(maxsize=1)
def _bundle():
    return load_project_bundle()


@functools.lru_cache(maxsize=1)
def _pages():
    return pages.generate_pages(_bundle(), raw_html=False)


def _table(text, heading):
    part = text.split(heading, 1)[1].split("\n## ", 1)[0]
    rows = [ln for ln in part.splitlines() if ln.startswith("|")]
    return [[c.strip() for c in r.strip("|").split(" | ")] for r in rows[2:]]


def test_the_page_is_generated_and_in_the_nav():
    assert GIBBS_PAGE in _pages()
    with open(os.path.join(ROOT, "mkdocs.yml"), encoding="utf-8") as fh:
        assert "Gibbs energies of formation: reference/gibbs-energies.md" in fh.read()


def test_every_stored_species_is_listed_with_its_source_and_where_read():
    text = _pages()[GIBBS_PAGE]
    rows = _table(text, "## Species")
    assert len(rows) == len(_bundle()["gibbs_energies"]) > 30
    for rec in _bundle()["gibbs_energies"]:
        row = [r for r in rows if f'id="{gibbs_anchor(rec["id"])}"' in r[0]]
        assert row, rec["id"]
        assert rec["source"] in row[0][1]
        if rec["confidence"] == "read":
            assert rec["where"].split(",")[0] in row[0][1]


def test_zinc_line_matches_the_published_numbers():
    # E° = -ΔrG°/(nF) = -(0 - (-147.1 kJ/mol)) / (2 × 96 485.332 C/mol) = -0.76228 V (hand computation)
    derived = gibbs_derived(_bundle())
    assert abs(derived["Zn2+/Zn"] - (-147.1e3 / (2 * F)) * 1) < 1e-9
    assert round(derived["Zn2+/Zn"], 4) == -0.7623
    row = [r for r in _table(_pages()[GIBBS_PAGE], "## Half-reactions") if "Zn2+/Zn]" in r[0]][0]
    assert row[2].startswith("-0.7618") and row[3] == "-0.7623" and row[4] == "+0.5" and "within 10 mV" in row[5]


def test_a_couple_beyond_the_tolerance_shows_both_and_links_its_note():
    # Fe2+/Fe: CRC -0.447 V against -(78.90e3)/(2F) = -0.4089 V from the NBS ΔG°f: 38 mV apart
    row = [r for r in _table(_pages()[GIBBS_PAGE], "## Half-reactions") if "Fe2+/Fe]" in r[0]][0]
    assert row[2].startswith("-0.447") and row[3] == "-0.4089" and row[4] == "-38.1"
    assert "differs" in row[5] and "series.md#note-hr-fe2p-fe" in row[5]


def test_series_page_shows_the_gibbs_value_beside_the_handbook_value_where_they_differ():
    text = _pages()["reference/series.md"]
    rows = _table(text, "vs SHE")
    with_note = {r["id"] for r in _bundle()["half_reactions"] if r.get("gibbs_note")}
    shown = {r[0].split("**")[1] for r in rows if "from ΔG°f" in r[3]}
    assert with_note and shown == with_note
    fe = [r for r in rows if "**Fe2+/Fe**" in r[0]][0]
    assert "-0.447" in fe[3] and "from ΔG°f: -0.409" in fe[3]


def test_no_couple_without_a_gibbs_value_is_listed():
    names = {r[0].split("]")[0].lstrip("[") for r in _table(_pages()[GIBBS_PAGE], "## Half-reactions")}
    assert "Ti2+/Ti" not in names and "Zn2+/Zn" in names
    assert names == set(gibbs_derived(_bundle()))
