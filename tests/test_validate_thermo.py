"""Thermodynamic consistency (sitebuild.validate.thermo): free-energy additivity of linked couples
and acid/alkaline forms through pKw (the grouping of the latter: test_validate_grouping.py)."""

import copy

from sitebuild import validate
from sitebuild.dataset import read_folder
from validatekit import (
    MINIMAL, assert_names, check, edit, folder, record, run_check)  # noqa: F401 - folder is a fixture


def test_inconsistent_linked_couples_fail(folder):
    # 3 E°(Fe3+/Fe) = E°(Fe3+/Fe2+) + 2 E°(Fe2+/Fe): with +0.50 V for Fe3+/Fe the sum misses by 1.6 V
    edit(folder, "half_reactions.yaml",
         lambda doc: record(doc, "half_reactions", "Fe3+/Fe").__setitem__("E0_V", 0.50))
    status, lines = run_check(folder)
    assert status == 1
    hit = assert_names(lines, "half_reactions.yaml", "Fe3+/Fe", "E0_V", "free-energy additivity",
                       "Fe3+/Fe2+", "Fe2+/Fe")[0]
    assert "3 × 0.5 = 1.5000 V" in hit and "-0.1090 V" in hit  # 0.771 + 2 × (-0.44) = -0.109


def test_linked_couples_that_differ_by_millivolts_warn_but_pass(folder):
    # CRC 92nd ed. Table 1: Fe2+/Fe -0.447, Fe3+/Fe2+ 0.771, Fe3+/Fe -0.037: 3×(-0.037) = -0.111
    # against 0.771 - 0.894 = -0.123 V, 12 mV apart: handbooks genuinely differ (warning only)
    def change(doc):
        rec = record(doc, "half_reactions", "Fe2+/Fe")
        rec.update(E0_V=-0.447, E0_source="crc-vanysek", E0_confidence="read", E0_where="Table 1")
    edit(folder, "half_reactions.yaml", change)
    lines = validate.check_folder(folder)
    # bratsch-1989 is now cited by no value: that is the only error
    assert [ln for ln in lines if not ln.startswith("warning")] == [
        "sources.yaml:bratsch-1989:id: source 'bratsch-1989' is cited by no value: remove it or cite it"]
    warn = [ln for ln in lines if ln.startswith("warning: half_reactions.yaml:Fe3+/Fe:E0_V:")]
    assert len(warn) == 1 and "12.0 mV" in warn[0] and "-0.1110" in warn[0] and "-0.1230" in warn[0]


def test_acid_and_alkaline_forms_must_agree_through_kw(folder):
    # E°(O2/OH-) = E°(O2/H2O) - 0.05916 × pKw = 1.229 - 0.828 = 0.401 V (CRC 92nd ed. Table 1);
    # 0.60 V is 199 mV off
    edit(folder, "half_reactions.yaml",
         lambda doc: record(doc, "half_reactions", "O2/OH-").__setitem__("E0_V", 0.60))
    status, lines = check(folder)
    assert status == 1
    assert_names(lines, "half_reactions.yaml", "O2/OH-", "E0_V", "acid and alkaline", "O2/H2O", "0.4011")


def test_reactions_that_do_not_add_up_are_reported():
    raw, _ = read_folder(MINIMAL)
    raw = copy.deepcopy(raw)
    rec = record(raw, "half_reactions", "Fe3+/Fe")
    rec["reduced"] = ["Fe(l)"]  # balanced, but not the Fe(s) the other two couples end with
    lines = validate.validate_raw(raw, None)
    assert any(ln.startswith("warning: half_reactions.yaml:Fe3+/Fe:oxidised:") and "do not add up" in ln
               for ln in lines), lines


def test_triples_with_fractional_multipliers():
    """Hg2+/Hg2^2+ (2 Hg2+ + 2e -> Hg2^2+) + Hg2^2+/Hg combine with factors 1/2 into Hg2+/Hg."""
    raw, _ = read_folder(MINIMAL)
    raw = copy.deepcopy(raw)
    # Vanýsek, CRC Handbook 92nd ed. (2011), Table 1: 0.920, 0.7973, 0.851 V
    raw["half_reactions"] += [
        {"id": "Hg2+/Hg2^2+", "name": "x", "oxidised": ["2 Hg2+(aq)"], "reduced": ["Hg2^2+(aq)"], "n": 2,
         "E0_V": 0.920, "E0_source": "crc-vanysek", "E0_confidence": "read", "E0_where": "Table 1"},
        {"id": "Hg2^2+/Hg", "name": "x", "oxidised": ["Hg2^2+(aq)"], "reduced": ["2 Hg(l)"], "n": 2,
         "E0_V": 0.7973, "E0_source": "crc-vanysek", "E0_confidence": "read", "E0_where": "Table 1"},
        {"id": "Hg2+/Hg", "name": "x", "oxidised": ["Hg2+(aq)"], "reduced": ["Hg(l)"], "n": 2,
         "E0_V": 0.851, "E0_source": "crc-vanysek", "E0_confidence": "read", "E0_where": "Table 1"},
    ]
    lines = validate.validate_raw(raw, None)
    warn = [ln for ln in lines if "Hg2+/Hg:E0_V" in ln]
    # 2 × 0.851 = 1.702 against 0.920 + 0.7973 = 1.7173 V: 15.3 mV, a warning
    assert len(warn) == 1 and warn[0].startswith("warning") and "-15.3 mV" in warn[0], lines
