"""The acid/alkaline check groups half-reactions by their species other than H+, OH- and H2O
(linear in the data) instead of comparing every pair: it must still find every pair the
all-pairs comparison finds, in the same order, and still name a broken pair among many couples.

Silver oxide couples: Ag2O + 2 H+ + 2e -> 2 Ag + H2O, 1.173 V, and Ag2O + H2O + 2e -> 2 Ag + 2 OH-,
0.342 V (Vanýsek, "Electrochemical Series", CRC Handbook of Chemistry and Physics, 92nd ed.,
2011, Table 1; from memory). Through pKw they are 3 mV apart: 1.173 - 0.05916 × 13.995 = 0.345 V.
The stand-in couples of symbols that are no element (Ja, Jb, ... Qz) reuse the silver values only
to give the grouping many unrelated reactions to sort; they are not data.
"""

import copy
import os
import re
import string

import pytest

from calc.constants import T_STANDARD, nernst_slope
from sitebuild import validate
from sitebuild.validate import thermo
from sitebuild.validate.collect import Collector
from sitebuild.dataset import read_folder

ROOT = os.path.dirname(os.path.dirname(os.path.abspath(__file__)))
MINIMAL = os.path.join(ROOT, "tests", "fixtures", "minimal")
WATER = {"H+(aq)", "OH-(aq)", "H2O(l)"}
PAIR_RE = re.compile(r"acid and alkaline forms: (?:E°|dE°/dT) of (?P<b>\S+) is .*?, (?:but )?(?P<a>\S+) (?:\(|and ΔS°)")


def _couple(rid, ox, red, n, e0):
    return {"id": rid, "name": f"{rid} (test couple)", "oxidised": ox, "reduced": red, "n": n,
            "E0_V": e0, "E0_source": "crc-vanysek", "E0_confidence": "read"}


def _silver(alkaline_e0=0.342):
    return [_couple("Ag2O/Ag", ["Ag2O(s)", "2 H+(aq)"], ["2 Ag(s)", "H2O(l)"], 2, 1.173),
            _couple("Ag2O/OH-", ["Ag2O(s)", "H2O(l)"], ["2 Ag(s)", "2 OH-(aq)"], 2, alkaline_e0)]


def _stand_ins():
    """Three couples per symbol that is no element: metal ion, acid and alkaline oxide forms."""
    recs = []
    for i, sym in enumerate(a + b for a in "JQ" for b in string.ascii_lowercase):
        shift = 0.01 * i
        recs += [_couple(f"{sym}2+/{sym}", [f"{sym}2+(aq)"], [f"{sym}(s)"], 2, -0.5 + shift),
                 _couple(f"{sym}O/{sym}", [f"{sym}O(s)", "2 H+(aq)"], [f"{sym}(s)", "H2O(l)"], 2, 1.173 - shift),
                 _couple(f"{sym}O/OH-", [f"{sym}O(s)", "H2O(l)"], [f"{sym}(s)", "2 OH-(aq)"], 2, 0.342 - shift)]
    return recs


def _raw(extra):
    raw, problems = read_folder(MINIMAL)
    assert not problems
    raw = copy.deepcopy(raw)
    raw["half_reactions"] += extra
    return raw


def _acid_alkaline_lines(raw):
    out = Collector()
    thermo.check_acid_alkaline(raw, out)
    return out.lines


def _all_pairs(raw):
    """The pairs (acid label, alkaline label) the all-pairs comparison finds, in its order."""
    couples = thermo.couples(raw)
    found = []
    for la, _, _, _, va in couples:
        for lb, _, _, _, vb in couples:
            if la == lb:
                continue
            d = {k: va.get(k, 0) - vb.get(k, 0) for k in set(va) | set(vb)}
            d = {k: v for k, v in d.items() if abs(v) > 1e-12}
            if set(d) == WATER and d["H+(aq)"] > 0 and abs(d["OH-(aq)"] - d["H+(aq)"]) < 1e-9 \
                    and abs(d["H2O(l)"] + d["H+(aq)"]) < 1e-9:
                found.append((la, lb))
    return found


def test_a_broken_pair_among_many_couples_is_found():
    raw = _raw(_stand_ins() + _silver())
    assert not [ln for ln in _acid_alkaline_lines(raw) if "Ag2O" in ln]  # 3 mV apart: nothing to say
    raw = _raw(_stand_ins() + _silver(alkaline_e0=0.60))
    lines = [ln for ln in validate.validate_raw(raw, None) if "acid and alkaline" in ln]
    expected = 1.173 - nernst_slope(T_STANDARD) * thermo.PKW_25C * 2 / 2
    hits = [ln for ln in lines if ln.startswith("half_reactions.yaml:Ag2O/OH-:E0_V: ")]
    assert len(hits) == 1, lines
    assert "Ag2O/Ag (1.173 V)" in hits[0] and f"{expected:.4f} V" in hits[0] and "0.3451" in hits[0]
    assert f"{(0.60 - expected) * 1000:.1f} mV" in hits[0] and "is an error" in hits[0]


@pytest.mark.parametrize("extra", [[], "stand-ins"], ids=["minimal", "with-stand-ins"])
def test_grouped_check_finds_exactly_the_pairs_of_the_all_pairs_comparison(monkeypatch, extra):
    raw = _raw((_stand_ins() if extra else []) + _silver())
    raw["half_reactions"][-1]["dEdT_mV_per_K"] = -1.0  # both forms with a temperature coefficient
    raw["half_reactions"][-1].update(dEdT_source="crc-vanysek", dEdT_confidence="read")
    raw["half_reactions"][-2].update(dEdT_mV_per_K=-0.5, dEdT_source="crc-vanysek", dEdT_confidence="read")
    # report every pair, even one that agrees, so the lines list the pairs found
    monkeypatch.setattr(thermo, "ADDITIVITY_WARN_V", -1.0)
    monkeypatch.setattr(thermo, "ADDITIVITY_DEDT_WARN", -1.0)
    lines = _acid_alkaline_lines(raw)
    reported = []
    for ln in lines:
        m = PAIR_RE.search(ln)
        assert m, ln
        if "dE°/dT" not in ln:
            reported.append((m.group("a"), m.group("b")))
    reference = _all_pairs(raw)
    assert reported == reference
    assert ("H+/H2", "H2O/H2") in reference and ("O2/H2O", "O2/OH-") in reference and ("Ag2O/Ag", "Ag2O/OH-") in reference
    if extra:
        assert ("JaO/Ja", "JaO/OH-") in reference and len(reference) == 3 + 52  # H+/H2, O2 and Ag2O pairs, 52 stand-ins
    assert sum("dE°/dT of Ag2O/OH-" in ln for ln in lines) == 1
