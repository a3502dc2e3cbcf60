"""What a user reads of the cathodic-protection design: plain words, the cautions, the page's bounds.

Every warning, derivation step and refusal of calc/cpdesign names things by their names, never by
a request key (``anode.final``, ``current_mean_A``) or a catalogue id (``high-strength-steel``);
the key stays in the warning's or error's ``field`` (project convention: the page maps it to a
form field). The openings are those of calc/spec.py; the variants walk every warning and message
path of the entries.
"""

import copy
import re

import pytest

from calc.cpdesign import (anode_resistance_entry, anodes_entry, buried_entry, groundbed_entry, tank_entry,
                           wenner_entry)
from calc.cpdesign import limits
from calc.cpdesign.anodes import SHAPES
from calc.errors import InputError
from calc.spec import OPENINGS, page_spec

ENTRIES = {"anodes": anodes_entry, "buried": buried_entry, "groundbed": groundbed_entry, "wenner": wenner_entry,
           "anode-resistance": anode_resistance_entry, "tank": tank_entry}
#: a request key: snake case with an underscore (life_years, net_mass_kg), or a dotted path (anode.final);
#: a symbol with a subscript (t_f, I_a, R_N) starts with one letter and is not one
KEY = re.compile(r"\b[a-z]{2,}(?:_[a-zA-Z0-9]+)+\b|\banode\.[a-z_]+")


def _variant(name, **change):
    req = copy.deepcopy(OPENINGS[name])
    for key, value in change.items():
        if value is None:
            req.pop(key, None)
        else:
            req[key] = value
    return req


def _anodes(**anode):
    req = _variant("anodes")
    req["anode"] = {k: v for k, v in dict(req["anode"], **anode).items() if v is not None}
    return req


#: (entry, request): the openings and the variants that reach every warning
REQUESTS = [(name, copy.deepcopy(OPENINGS[name])) for name in ("anodes", "buried", "groundbed", "wenner")] + [
    ("anodes", _variant("anodes", structure="high-strength-steel")),
    ("anodes", _variant("anodes", anode_type="long-flush", anode={"net_mass_kg": 100, "length_m": 0.5, "width_m": 0.2})),
    ("anodes", _variant("anodes", anode_type="bracelet-half-shell", anode={"net_mass_kg": 100, "area_m2": 0.5})),
    ("anodes", _anodes(length_m=0.3)),
    ("anodes", _anodes(standoff_m=0.2)),
    ("anodes", _variant("anodes", anode=None)),
    ("anodes", _variant("anodes", region=None, water_temp_C=9.0)),
    ("anodes", {"current_mean_A": 20, "life_years": 20, "capacity_Ah_per_kg": 2000, "utilisation": 0.9}),
    ("anode-resistance", {"shape": "flush", "resistivity_ohm_m": 0.25, "length_m": 0.5, "width_m": 0.2}),
    ("anode-resistance", {"shape": "bracelet", "resistivity_ohm_m": 0.25, "area_m2": 0.3}),
    ("buried", _variant("buried", alloy="zinc")),
    ("buried", _variant("buried", coating="bare")),
    ("buried", _variant("buried", resistivity_ohm_m=2.0)),
    ("buried", _variant("buried", output_constant=150000)),
    ("groundbed", _variant("groundbed", orientation="horizontal", depth_m=1.5)),
    ("groundbed", _variant("groundbed", paralleling="sunde")),
    ("groundbed", _variant("groundbed", anode_material="mixed-metal-oxide")),
    ("groundbed", _variant("groundbed", count=1, anode_mass_kg=2.0)),
    ("groundbed", _variant("groundbed", current_A=None)),
    ("groundbed", _variant("groundbed", margin=None, back_emf_V=None)),
    ("tank", {"resistivity_ohm_m": 40, "tank_diameter_m": 17, "arrangement": "centre", "anode_length_m": 1.5,
              "anode_diameter_m": 0.05, "life_years": 10}),
]

#: (entry, request) refused: every message path named in the review of issue 16
REFUSED = [
    ("anodes", _variant("anodes", alloy="magnesium")),
    ("anodes", _variant("anodes", alloy="no-such-alloy")),
    ("anodes", _variant("anodes", zones=[{"area_m2": 10, "coating": "category-ix"}])),
    ("anodes", _variant("anodes", alloy=None)),
    ("anodes", _variant("anodes", anode_type=None)),
    ("anodes", _variant("anodes", utilisation=0.9)),
    ("anodes", _variant("anodes", capacity_Ah_per_kg=2000)),
    ("anodes", _variant("anodes", zones=None)),
    ("anodes", _variant("anodes", zones=[])),
    ("anodes", _variant("anodes", region=None)),
    ("anodes", _variant("anodes", water_temp_C=9.0)),
    ("anodes", _anodes(radius_m=None)),
    ("anode-resistance", {"shape": "ring", "resistivity_ohm_m": 0.25, "length_m": 1.0}),
    ("buried", _variant("buried", anode=None)),
    ("buried", _variant("buried", anode="no-such-anode")),
    ("buried", _variant("buried", size_factor=1.0)),
    ("buried", _variant("buried", area_m2=None)),
    ("buried", _variant("buried", current_A=1.0)),
    ("buried", _variant("buried", alloy="al-zn-in")),
    ("groundbed", _variant("groundbed", paralleling="sideways")),
    ("groundbed", _variant("groundbed", count=40)),
    ("groundbed", _variant("groundbed", anode_material=None, consumption_kg_per_A_yr=None)),
    ("groundbed", _variant("groundbed", anode_material="graphite")),
    ("tank", {"resistivity_ohm_m": 40, "tank_diameter_m": 17, "arrangement": "rod-circle", "anode_length_m": 0.2,
              "equivalent_diameter_factor": 0.07}),
    ("tank", {"resistivity_ohm_m": 40, "tank_diameter_m": 17, "arrangement": "hoop", "hoop_diameter_m": 8,
              "wire_diameter_m": 0.003, "depth_m": 3, "circle_radius_m": 2}),
]


def _ids(ds):
    """The catalogue ids a message could leak: those written with a hyphen (names are written in words)."""
    kinds = ("cp_anode_alloys", "cp_anode_types", "cp_coatings", "cp_structures", "cp_current_densities", "cp_criteria")
    return {r["id"] for k in kinds for r in ds.records(k) if "-" in r["id"]}


def _leaks(text, ids):
    return KEY.findall(text) + [i for i in ids if re.search(r"(?<![\w-])" + re.escape(i) + r"(?![\w-])", text)]


@pytest.mark.parametrize("name,request_", REQUESTS)
def test_warnings_and_steps_are_in_words(shipped, name, request_):
    # Project convention (issue 16 review): a user reads names and plain words; keys only in `field`.
    r = ENTRIES[name](request_)
    texts = [w["message"] for w in r["warnings"]] + [s[k] for s in r["steps"] for k in ("title", "substituted",
                                                                                         "result")]
    texts += [c["words"] for c in r.get("checks") or []] + list(r["cautions"])
    ids = _ids(shipped)
    assert [(t, _leaks(t, ids)) for t in texts if _leaks(t, ids)] == []


def test_the_variants_reach_the_warnings_they_are_for(shipped):
    # the list above must keep exercising the messages the review named (not a vacuous walk)
    words = " ".join(w["message"] for name, req in REQUESTS for w in ENTRIES[name](req)["warnings"])
    for part in ("consumed (final) anode dimensions", "for high-strength steel", "net mass and the dimensions",
                 "no rectifier margin given", "no back voltage given", "output constant C is given",
                 "short flush-mounted anode"):
        assert part in words


@pytest.mark.parametrize("name,request_", REFUSED)
def test_refusals_say_what_is_allowed_in_words(shipped, name, request_):
    # The field keeps the key (the page puts the message at that field); what is allowed is in words.
    with pytest.raises(InputError) as err:
        ENTRIES[name](request_)
    words = err.value.allowed + " " + err.value.hint
    # the shapes of anode-resistance are the words its --shape takes, each listed with its name
    typed = set(SHAPES) if name == "anode-resistance" else set()
    assert err.value.field and _leaks(words, _ids(shipped) - typed) == []


def test_unknown_names_get_the_closest_by_name(shipped):
    with pytest.raises(InputError) as err:
        anodes_entry(_variant("anodes", zones=[{"area_m2": 10, "coating": "category-ix"}]))
    assert err.value.field == "zones[0].coating" and "Category II" in err.value.hint


@pytest.mark.parametrize("name,request_", [(n, r) for n, r in REQUESTS if n != "wenner"])
def test_every_design_result_carries_the_three_cautions(shipped, name, request_):
    # Issue 16: beside every result, design under the governing standard by a qualified CP engineer;
    # hydrogen embrittlement of high-strength steels and over-protection of coatings; interference
    # with other buried or immersed structures (49 CFR 192 Subpart I names interference currents as a
    # topic of its own, §192.473, read in its table of contents).
    text = " ".join(ENTRIES[name](request_)["cautions"])
    assert "governing standard" in text and "qualified cathodic-protection engineer" in text
    assert "hydrogen" in text and "high-strength steels" in text and "coatings" in text
    assert "Interference" in text and "other metal in the same soil or water" in text


def test_page_spec_ships_the_design_bounds_once():
    # One rule in one place: the page's copy of the design bounds is calc/cpdesign/limits.py itself.
    cp = page_spec()["cp_bounds"]
    assert set(cp) == set(limits.BOUNDS)
    for key, b in limits.BOUNDS.items():
        assert (cp[key]["low"], cp[key]["high"], cp[key]["unit"], cp[key]["text"]) == (b.low, b.high, b.unit, b.text)
        assert "allowed" not in cp[key]
    assert cp["life_years"]["text"] == "0.01 to 100 years"
