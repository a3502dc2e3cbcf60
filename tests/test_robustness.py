"""Robustness: every JSON entry point and every command of the command line under arbitrary,
malformed and extreme input.

What is asserted for every generated case:

- the JSON entry points (:func:`calc.api.call`): either ``{"ok": true, "result": {...}}`` with a
  result that is plain JSON (``json.dumps(allow_nan=False)`` works: no NaN, no Infinity anywhere)
  or ``{"ok": false, "error": {"field", "message"}}``: one error whose message is one line and
  starts with the field it names; no exception ever escapes;
- the command line (:func:`calc.cli.main`, run in this process with stdout and stderr captured):
  exit 0 with output on stdout only (``--json``: one JSON object, no NaN), or exit 2 with nothing
  on stdout and exactly one line on stderr starting ``couplewise: ``, never a traceback.

Inputs: missing fields, unknown fields, wrong types, NaN, ±Infinity, huge and tiny numbers
(1e308, 5e-324, integers of hundreds of digits), negative activities, unknown ids, unicode,
empty strings, numbers written as text, and nested junk; mixed with valid values so that the
calculations themselves are reached, not only the first check.

Every test counts the cases it tried and how many were rejected with an error; the counts are
printed in a summary at the end of the run ("robustness" section). The number of cases per
entry point and per command comes from the settings profile below: 200 by default,
``COUPLEWISE_ROBUSTNESS_EXAMPLES=2000`` for a deeper run.

Values checked against published numbers (extreme but valid inputs, at the end) name their
source beside them.
"""

import contextlib
import io
import json
import math
import os
import re

import pytest
from hypothesis import HealthCheck, assume, given, settings
from hypothesis import strategies as st

from calc import api, cli
from calc.activity import VALID_I_MAX
from calc.conditions import ACTIVITY_MAX, PRESSURE_MAX_ATM
from oracles import nernst_slope_V
from calc.field.criteria import READING_KINDS, catalogue
from calc.field.onreading import NOT_CONSIDERED, ir_methods
from calc import cliservice

#: the CP structure and setting ids of the shipped data (data/cp_structures.yaml, cp_settings.yaml)
STRUCTURES = [r["id"] for r in catalogue("cp_structures")]
SETTINGS = [r["id"] for r in catalogue("cp_settings")]

# ---------------------------------------------------------------------------- the settings profile

EXAMPLES = int(os.environ.get("COUPLEWISE_ROBUSTNESS_EXAMPLES", "200"))
settings.register_profile(
    "couplewise-robustness", max_examples=EXAMPLES, deadline=None,
    suppress_health_check=[HealthCheck.too_slow, HealthCheck.data_too_large, HealthCheck.filter_too_much])
ROBUST = settings.get_profile("couplewise-robustness")

#: test label -> {"tried": n, "rejected": n}
COUNTS = {}


def _count(label, rejected):
    c = COUNTS.setdefault(label, {"tried": 0, "rejected": 0})
    c["tried"] += 1
    c["rejected"] += int(bool(rejected))


class _Summary:
    """Prints the cases tried and rejected per entry point and command at the end of the run."""

    def pytest_terminal_summary(self, terminalreporter):
        if not COUNTS:
            return
        tr = terminalreporter
        tr.write_sep("-", f"robustness: cases tried and rejected (profile: {EXAMPLES} per test)")
        total_t = total_r = 0
        for label in sorted(COUNTS):
            c = COUNTS[label]
            total_t += c["tried"]
            total_r += c["rejected"]
            tr.write_line(f"{label:<28} tried {c['tried']:>6}   rejected {c['rejected']:>6}   "
                          f"computed {c['tried'] - c['rejected']:>6}")
        tr.write_line(f"{'total':<28} tried {total_t:>6}   rejected {total_r:>6}   computed {total_t - total_r:>6}")


@pytest.fixture(scope="module", autouse=True)
def _summary(request):
    pm = request.config.pluginmanager
    if pm.get_plugin("couplewise-robustness-summary") is None:
        pm.register(_Summary(), "couplewise-robustness-summary")
    yield


@pytest.fixture(autouse=True)
def _dataset(shipped):
    """Every test runs against the shipped dataset."""
    return shipped


def _bundle():
    from sitebuild.dataset import load_project_bundle

    return load_project_bundle()


_B = _bundle()
HALF_IDS = sorted(r["id"] for r in _B["half_reactions"])
REF_IDS = sorted(r["id"] for r in _B["reference_electrodes"]) + ["RHE"]
MATERIAL_IDS = sorted(r["id"] for r in _B["materials"])
ENV_IDS = sorted(r["id"] for r in _B["environments"])
ION_NAMES = sorted(r["species"] for r in _B["ions"])

# ---------------------------------------------------------------------------- building blocks

NONFINITE = [math.nan, math.inf, -math.inf]
#: finite numbers at the edges of what a double holds, and integers no double holds
EDGE_NUMBERS = [0, 0.0, -0.0, 1e-12, -1e-12, 1e-300, 5e-324, -5e-324, 1e308, -1e308, 1.7976931348623157e308,
                2 ** 53 + 1, 10 ** 20, -(10 ** 20), -1, 1, 10, 100, 1000, 1e6, 1e9]
#: integers beyond any double (10^400), and beyond what Python turns into text by default (10^5000)
HUGE_INTS = st.sampled_from([400, -400, 5000, -5000]).map(lambda k: 10 ** k if k > 0 else -(10 ** -k))
#: numbers written as text, some valid, most not
NUMBER_TEXT = ["nan", "NaN", "inf", "-inf", "Infinity", "1e999", "-1e999", "1e-400", "", " ", "0x10", "1_000",
               "１２", "½", "1,5", "−1", "٣", "0.1", " 25 ", "1e3", "9" * 5000, "--1", "+", "e", "1e", "٫"]
WEIRD_TEXT = ["", " ", "\x00", "\n", "\t\r", "<script>window.__pwned=1</script>", "<img src=x onerror=alert(1)>",
              "𝔷𝔫", "Zn²⁺", "Ｚｎ2+", "zn2+/zn", " Zn2+/Zn ", "Zn2+ / Zn", "\u202eZn", "x" * 3000, "'; DROP TABLE",
              "${7*7}", "{{7*7}}", "../../etc/passwd", "%00", "null", "None", "true", "[]", "{}", "🧪", "e\u0301"]

BASE_JUNK = st.one_of(
    st.none(), st.booleans(), st.integers(), st.integers(min_value=-(10 ** 30), max_value=10 ** 30),
    st.floats(allow_nan=True, allow_infinity=True), st.sampled_from(NONFINITE + EDGE_NUMBERS), HUGE_INTS,
    st.text(max_size=20), st.sampled_from(NUMBER_TEXT + WEIRD_TEXT))
JUNK = st.recursive(BASE_JUNK, lambda inner: st.one_of(
    st.lists(inner, max_size=3), st.dictionaries(st.text(max_size=6), inner, max_size=3)), max_leaves=6)


class F:
    """One request field: ``good`` draws values the field accepts (often at its edges), ``bad`` draws
    values it must refuse or that may be refused (wrong type, out of range, non-finite, junk)."""

    def __init__(self, good, bad):
        self.good, self.bad = good, bad

    @property
    def any(self):
        return st.one_of(self.good, self.bad)


def number(lo, hi, edges=()):
    """A number field accepted from lo to hi; ``edges``: values at or just inside its limits."""
    ints = (math.ceil(max(lo, -10 ** 6)), math.floor(min(hi, 10 ** 6)))
    inside = st.one_of(st.floats(lo, hi, allow_nan=False),
                       st.integers(*ints) if ints[0] <= ints[1] else st.floats(lo, hi, allow_nan=False),
                       st.sampled_from([lo, hi, *edges]), st.floats(lo, hi, allow_nan=False).map(repr))
    bad = st.one_of(st.floats(allow_nan=True, allow_infinity=True), st.sampled_from(NONFINITE + EDGE_NUMBERS),
                    HUGE_INTS, st.sampled_from(NUMBER_TEXT), JUNK,
                    st.floats(hi, 1e308, exclude_min=True), st.floats(-1e308, lo, exclude_max=True))
    return F(inside, bad)


def ident(pool):
    """An id field: a real id or one written differently; bad: a near miss, weird text, junk."""
    real = st.sampled_from(pool)
    good = st.one_of(real, real, real.map(str.upper), real.map(str.lower), real.map(lambda s: f"  {s} "))
    bad = st.one_of(real.map(lambda s: s[:-1] or "x"), real.map(lambda s: s + "\u0000"), st.text(max_size=15),
                    st.sampled_from(WEIRD_TEXT), JUNK)
    return F(good, bad)


def mapping(keys, value):
    """A {species: value} field; bad: weird keys, bad values, junk instead of a mapping."""
    key = st.sampled_from(keys)
    good = st.dictionaries(key, value.good, max_size=3)
    bad_key = st.one_of(st.text(max_size=8), st.sampled_from(WEIRD_TEXT[:12]), key.map(lambda k: k + "(s)"))
    bad = st.one_of(st.dictionaries(key, value.bad, min_size=1, max_size=3),
                    st.dictionaries(bad_key, value.any, min_size=1, max_size=3), JUNK)
    return F(good, bad)


SPECIES_KEYS = ION_NAMES + ["O2", "H2", "Cl2", "H2O", "H2O2", "H2S", "Br2", "I2"]
#: a free-text label (names a part in a site reading)
LABEL = F(st.one_of(st.sampled_from(["pile", "ladder", "hull", "Flange A"]), st.text(min_size=1, max_size=30)),
          st.one_of(st.sampled_from(["", " ", "x" * 500]), JUNK))
MODEL = F(st.sampled_from(list(VALID_I_MAX) + ["Davies", "DAVIES", "dh", "extended-dh", " limiting "]),
          st.one_of(st.sampled_from(["truesdell-jones", "pitzer", "", "sit"]), JUNK))
CONDITIONS = {
    "temp_C": number(0, 100, [1e-9, 99.999999, 25]),
    "activities": mapping(SPECIES_KEYS, F(number(5e-324, ACTIVITY_MAX, [1e-12, 10, 10.000001]).good,
                                          st.one_of(st.sampled_from([0, -0.0, -1e-12, -1]), number(0, 1).bad))),
    "molalities": mapping(SPECIES_KEYS, F(number(5e-324, 50, [1e-12, 0.001, 0.5]).good,
                                          st.one_of(st.sampled_from([0, -1]), number(0, 50).bad))),
    "pressures": mapping(["O2", "H2", "Cl2", "N2"], F(number(5e-324, PRESSURE_MAX_ATM, [0.21, 10.5]).good,
                                                     st.one_of(st.just(0), number(0, 1000).bad))),
    "ionic_strength": number(0, 5, list(VALID_I_MAX.values())),
    "env": ident(ENV_IDS),
    "composition": mapping(ION_NAMES, number(0, 50, [0.1, 0.7])),
    "model": MODEL,
    "pH": number(-2, 16, [0, 14, 7]),
}
SIDE = {k: CONDITIONS[k] for k in ("activities", "molalities", "pressures", "pH")}
#: one line of an E–pH request: a half-reaction with its own conditions (no temperature, no pH)
LINE_KEYS = ("activities", "molalities", "pressures", "ionic_strength", "env", "model")
EPH_LINE = F(st.fixed_dictionaries({"id": ident(HALF_IDS).good},
                                   optional={k: CONDITIONS[k].good for k in LINE_KEYS if k != "env"}),
             st.one_of(st.fixed_dictionaries({"id": ident(HALF_IDS).any},
                                             optional={k: CONDITIONS[k].any for k in LINE_KEYS}),
                       st.fixed_dictionaries({"id": ident(HALF_IDS).good, "pH": CONDITIONS["pH"].good}),
                       st.fixed_dictionaries({}, optional={"activities": CONDITIONS["activities"].good}), JUNK))

#: one reaction and one electrode of a mixed-potential request (explicit kinetics)
REACTION = F(st.fixed_dictionaries({"name": LABEL.good, "E_eq_V": number(-3, 3, [-0.76, 0.8]).good,
                                    "i0_A_per_cm2": number(1e-12, 1e-2, [1e-7]).good},
                                   optional={"b_anodic_V": number(0.02, 0.3, [0.06]).good,
                                             "b_cathodic_V": number(0.02, 0.3, [0.12]).good,
                                             "i_lim_A_per_cm2": number(1e-8, 1e-2, [1e-5]).good}),
             st.one_of(st.fixed_dictionaries({"name": LABEL.any, "E_eq_V": number(-3, 3).any}), JUNK))
ELECTRODE = F(st.fixed_dictionaries({"name": LABEL.good, "area_cm2": number(1e-3, 1e6, [1, 100]).good,
                                     "reactions": st.lists(REACTION.good, min_size=1, max_size=3)}),
              st.one_of(st.fixed_dictionaries({"name": LABEL.any, "area_cm2": number(1e-3, 1e6).any,
                                               "reactions": st.lists(REACTION.any, max_size=3)}), JUNK))

#: the service conditions of a joint, a matrix and a measured joint (calc.service, issue 15)
SERVICE = {
    "temp_C": CONDITIONS["temp_C"], "salinity": number(0, 45, [0, 2, 35]),
    "chloride_mg_per_L": number(1e-3, 25000, [50, 19000]), "o2_mg_L": number(0, 14, [0, 8]),
    "aeration": F(st.sampled_from(["air-saturated", "deaerated", "Air saturated"]),
                  st.one_of(st.sampled_from(["aerated", ""]), JUNK)),
    "velocity_m_s": number(0, 30, [0, 3]),
    "geometry": F(st.sampled_from(["still", "pipe", "surface", "hull"]), st.one_of(st.sampled_from(["duct", ""]), JUNK)),
    "diameter_m": number(1e-3, 10, [0.1]), "length_m": number(1e-3, 1000, [1]), "pH": CONDITIONS["pH"],
    "conductivity_S_per_m": number(1e-4, 20, [0.04, 5]), "anode_area_cm2": number(0.01, 1e8, [100]),
}

#: entry point -> (required fields, optional fields), each a field name -> F
FIELDS = {
    "electrode": ({"id": ident(HALF_IDS)}, dict(CONDITIONS)),
    "couple": ({"a": ident(HALF_IDS), "b": ident(HALF_IDS)},
               {**CONDITIONS,
                "a_conditions": F(st.fixed_dictionaries({}, optional={k: f.good for k, f in SIDE.items()}),
                                  st.one_of(st.fixed_dictionaries({}, optional={k: f.any for k, f in SIDE.items()}),
                                            st.fixed_dictionaries({"temp_C": CONDITIONS["temp_C"].good}), JUNK)),
                "b_conditions": F(st.fixed_dictionaries({}, optional={k: f.good for k, f in SIDE.items()}), JUNK)}),
    "convert": ({"value_V": number(-10, 10, [-0.85, 0]), "from": ident(REF_IDS), "to": ident(REF_IDS)},
                {"temp_C": CONDITIONS["temp_C"], "pH": CONDITIONS["pH"]}),
    "activity": ({"species": ident(ION_NAMES)},
                 {"ionic_strength": CONDITIONS["ionic_strength"], "composition": CONDITIONS["composition"],
                  "env": ident(ENV_IDS), "model": MODEL, "temp_C": CONDITIONS["temp_C"],
                  "size_angstrom": number(1, 15, [3, 9]), "molality": number(5e-324, 50, [1e-12, 1])}),
    "joint": ({"a": ident(MATERIAL_IDS), "b": ident(MATERIAL_IDS), "env": ident(ENV_IDS)},
              {"area_ratio": number(5e-324, 1e6, [1e-3, 1, 1000, 1000.5]), **SERVICE}),
    "matrix": ({"env": ident(ENV_IDS)},
               {"materials": F(st.lists(ident(MATERIAL_IDS).good, min_size=1, max_size=8),
                               st.one_of(st.just([]), st.lists(ident(MATERIAL_IDS).any, min_size=1, max_size=4),
                                         JUNK)),
                "csv": F(st.booleans(), st.one_of(st.sampled_from([0, 1, "true", "yes", ""]), JUNK)),
                **{k: f for k, f in SERVICE.items() if k != "anode_area_cm2"}}),
    "eph": ({"lines": F(st.lists(EPH_LINE.good, min_size=1, max_size=4),
                        st.one_of(st.just([]), st.lists(EPH_LINE.good, min_size=9, max_size=10),
                                  st.lists(EPH_LINE.any, min_size=1, max_size=3), JUNK))},
            {"temp_C": CONDITIONS["temp_C"],
             "pH_values": F(st.lists(number(-2, 16, [0, 14]).good, min_size=2, max_size=20),
                            st.one_of(st.lists(number(-2, 16).good, max_size=1),
                                      st.lists(number(-2, 16).any, max_size=4), JUNK))}),
    "rate": ({"material": ident(MATERIAL_IDS), "current_density_uA_per_cm2": number(0, 1e6, [1e4, 1e4 + 1])}, {}),
    "measured": ({"a_name": LABEL, "a_reading_V": number(-2.5, 1.5, [-0.85, -0.7]), "b_name": LABEL,
                  "b_reading_V": number(-2.5, 1.5, [-0.2, 0]), "electrode": ident(REF_IDS), "env": ident(ENV_IDS)},
                 {"temp_C": CONDITIONS["temp_C"], "salinity": number(1e-3, 45, [2, 35]),
                  "chloride_mg_per_L": number(1e-3, 25000, [19000]), "a_material": ident(MATERIAL_IDS),
                  "b_material": ident(MATERIAL_IDS),
                  **{k: f for k, f in SERVICE.items() if k not in ("temp_C", "salinity", "chloride_mg_per_L")}}),
    "cp": ({"structure": ident(sorted(STRUCTURES)), "setting": ident(sorted(SETTINGS)),
            "reading_V": number(-2.5, 1.5, [-0.85, -1.05, -1.1]), "electrode": ident(REF_IDS),
            "reading_kind": F(st.sampled_from(list(READING_KINDS) + ["ON", "Instant-Off"]),
                              st.one_of(st.sampled_from(["off", "", "instant off"]), JUNK))},
           {"temp_C": CONDITIONS["temp_C"], "polarisation_mV": number(-500, 500, [100, 0]),
            "structure_temp_C": number(-5, 100, [40, 60]), "salinity": number(1e-3, 45, [2, 35]),
            "chloride_mg_per_L": number(1e-3, 25000, [19000]),
            # the readings of the test post and the IR-drop choice (issue 17)
            "on_V": number(-2.5, 1.5, [-1.05]), "native_V": number(-1.0, 0.5, [-0.65]),
            "ir_drop_method": F(st.sampled_from(["none", "measured", "history", "characteristics", "evidence"]),
                                st.one_of(st.sampled_from(["", "Measured ", "coupon"]), JUNK)),
            "ir_drop_mV": number(0, 5000, [0, 100]), "unit": F(st.sampled_from(["V", "mV"]), JUNK)}),
    "mixed": ({"electrodes": F(st.lists(ELECTRODE.good, min_size=1, max_size=3),
                               st.one_of(st.just([]), st.lists(ELECTRODE.any, min_size=1, max_size=3), JUNK))}, {}),
    "passivity": ({"cr": number(0, 40, [18, 22, 25]), "mo": number(0, 10, [2.5, 3.1]), "n": number(0, 1, [0.17])},
                  {"w": number(0, 5, [0.6]), "temp_C": CONDITIONS["temp_C"], "salinity": number(1e-3, 45, [2, 35]),
                   "chloride_mg_per_L": number(1e-3, 25000, [200, 19000])}),
}
# the design entry points: each field of a worked request (tests/test_cpdesign_robustness.py) kept or made junk
from test_cpdesign_robustness import CLI as _DESIGN_CLI, OPTIONAL as _DESIGN_OPTIONAL, VALID as _DESIGN  # noqa: E402

FIELDS.update({name: ({k: F(st.just(v), JUNK) for k, v in req.items()},
                      {k: F(st.just(v), JUNK) for k, v in _DESIGN_OPTIONAL[name].items()})
               for name, (_, req) in _DESIGN.items()})
assert sorted(FIELDS) == sorted(api.ENTRY_POINTS), "every entry point has a request strategy here"


#: fields of which a request may give one only (activity: exactly one source of ionic strength;
#: site readings: salinity or chloride), and whether none is allowed
ONE_SOURCE = {"electrode": (("ionic_strength", "env", "composition"), True),
              "couple": (("ionic_strength", "env", "composition"), True),
              "activity": (("ionic_strength", "env", "composition"), False),
              "measured": (("salinity", "chloride_mg_per_L"), True),
              "joint": (("salinity", "chloride_mg_per_L"), True),
              "matrix": (("salinity", "chloride_mg_per_L"), True),
              "cp": (("salinity", "chloride_mg_per_L"), True)}


@st.composite
def requests(draw, name):
    """A request for one entry point: all fields acceptable (a third of the cases), one field bad,
    a field missing, unknown or null, every field good or bad at random, or no object at all."""
    required, optional = FIELDS[name]
    mode = draw(st.integers(0, 19))
    if mode == 0:  # not an object, or an object of junk
        return draw(st.one_of(JUNK, st.dictionaries(st.text(max_size=8), JUNK, max_size=4)))
    chosen = draw(st.lists(st.sampled_from(sorted(optional)), unique=True, max_size=len(optional))) if optional else []
    if mode <= 13 and name in ONE_SOURCE:  # one source of ionic strength (activity: exactly one)
        group, at_most = ONE_SOURCE[name]
        chosen = [k for k in chosen if k not in group] + draw(st.sampled_from(
            [[k] for k in group] + ([[]] if at_most else [])))
    fields = {**required, **{k: optional[k] for k in chosen}}
    if mode <= 7:  # every field acceptable: the calculation runs (or refuses a combination)
        return {k: draw(f.good) for k, f in fields.items()}
    if mode <= 13:  # one field bad
        bad = draw(st.sampled_from(sorted(fields)))
        return {k: draw(f.bad if k == bad else f.good) for k, f in fields.items()}
    req = {k: draw(f.any) for k, f in fields.items()}
    if mode == 14 and req:  # a required field missing
        req.pop(draw(st.sampled_from(sorted(required))))
    elif mode == 15:  # an unknown field
        req[draw(st.one_of(st.text(max_size=10), st.sampled_from(["temp", "T", "Temp_C", "a\nb", "__proto__", ""])))] = \
            draw(JUNK)
    elif mode == 16:  # a field given as null
        req[draw(st.sampled_from(sorted(fields)))] = None
    return req


def check_api(name, req, label="api"):
    """One call of an entry point: a result or one clear error, plain JSON either way."""
    out = api.call(name, req)  # any exception escaping fails the test
    text = json.dumps(out, allow_nan=False, ensure_ascii=False)
    assert "Traceback" not in text
    assert isinstance(out, dict) and isinstance(out.get("ok"), bool)
    if out["ok"]:
        assert set(out) == {"ok", "result"}
        res = out["result"]
        assert isinstance(res, dict)
        for key in ("steps", "warnings", "sources", "data_version"):
            assert key in res, f"{name}: result without {key}"
        for w in res["warnings"]:
            assert isinstance(w, dict) and isinstance(w.get("message"), str) and w["message"], w
    else:
        assert set(out) == {"ok", "error"}
        err = out["error"]
        assert set(err) == {"field", "message"}
        field, msg = err["field"], err["message"]
        assert isinstance(field, str) and field.strip(), err
        assert isinstance(msg, str) and msg.strip(), err
        assert "\n" not in msg and "\r" not in msg, f"the error is not one line: {msg!r}"
        # the message names the input field it is about (never only a result that overflowed)
        assert msg.startswith(field) or field == "dataset", err
        assert not field.startswith("result"), err
        assert len(msg) <= 2000, f"error message of {len(msg)} characters"
    _count(f"{label} {name}", not out["ok"])
    return out


@pytest.mark.parametrize("name", sorted(FIELDS))
def test_entry_point_gives_a_result_or_one_clear_error(name):
    @ROBUST
    @given(requests(name))
    def run(req):
        check_api(name, req)

    run()


def test_json_text_in_json_text_out():
    """call_json (what the page's worker calls) with text that is not JSON, or is JSON of junk."""

    @ROBUST
    @given(st.one_of(st.text(max_size=40), st.sampled_from(
        ["", "{", "[1,", "NaN", "{\"a\": NaN}", "{\"value_V\": Infinity, \"from\": \"SCE\", \"to\": \"SHE\"}",
         "1" * 5000, "{\"value_V\": " + "1" * 5000 + ", \"from\": \"SCE\", \"to\": \"SHE\"}", "\ufeff{}",
         "{\"a\": \"Zn2+/Zn\", \"b\": \"Cu2+/Cu\", \"temp_C\": 1e999}", "[[[[[[[[[[]]]]]]]]]]" * 3,
         "{\"id\": \"Zn2+/Zn\", \"id\": \"Cu2+/Cu\"}", "\"Zn2+/Zn\"", "null"])),
           st.sampled_from(sorted(FIELDS)))
    def run(text, name):
        out_text = api.call_json(name, text)
        out = json.loads(out_text, parse_constant=lambda c: pytest.fail(f"{c} in the JSON text"))
        assert isinstance(out["ok"], bool)
        if not out["ok"]:
            assert out["error"]["field"] and "\n" not in out["error"]["message"]
        _count("api call_json", not out["ok"])

    run()


def test_unknown_entry_point():
    for name in ("", "nope", None, 3, "couple ", "COUPLE", "__import__"):
        out = api.call(name, {})
        assert out == {"ok": False, "error": {"field": "calculation", "message": out["error"]["message"]}}
        assert "one of" in out["error"]["message"]


# ---------------------------------------------------------------------------- the command line

def run_cli(argv):
    """cli.main(argv) in this process: (exit status, stdout, stderr)."""
    out, err = io.StringIO(), io.StringIO()
    with contextlib.redirect_stdout(out), contextlib.redirect_stderr(err):
        try:
            code = cli.main(list(argv))
        except SystemExit as exc:  # argparse's error path exits with 2
            code = exc.code
    return code, out.getvalue(), err.getvalue()


def check_cli(label, argv, json_out=False):
    code, out, err = run_cli(argv)
    assert "Traceback" not in out + err
    assert code in (0, 2), (argv, code, err)
    if code == 0:
        assert err == "", (argv, err)
        assert out.strip(), argv
        if json_out:
            res = json.loads(out, parse_constant=lambda c: pytest.fail(f"{c} in the JSON output of {argv}"))
            assert isinstance(res, dict) and "data_version" in res
    else:
        assert out == "", (argv, out)
        assert err.startswith("couplewise: ") and err.endswith("\n") and err.count("\n") == 1, (argv, err)
        assert len(err) <= 2000
    _count(f"cli {label}", code != 0)
    return code, out, err


ARG_TEXT = st.one_of(st.text(max_size=12), st.sampled_from(NUMBER_TEXT + WEIRD_TEXT))


def num_arg(lo, hi, edges=()):
    """A number argument accepted from lo to hi; bad: text, non-finite, overflowing, out of range."""
    good = st.one_of(st.floats(lo, hi, allow_nan=False).map(repr), st.integers(math.ceil(lo), math.floor(hi)).map(str),
                     st.sampled_from([lo, hi, *edges]).map(repr))
    bad = st.one_of(st.sampled_from(NUMBER_TEXT), st.sampled_from(["1e308", "-1e308", "1" + "0" * 400, "nan", "-inf"]),
                    st.text(max_size=6), st.floats(hi, 1e300, exclude_min=True).map(repr),
                    st.floats(-1e300, lo, exclude_max=True).map(repr))
    return F(good, bad)


def arg_id(pool):
    real = st.sampled_from(pool)
    return F(st.one_of(real, real, real.map(str.lower)), ARG_TEXT)


def pairs(keys, value):
    """SPECIES=VALUE arguments; bad: malformed pairs or bad values."""
    key = st.sampled_from(keys)
    return F(st.builds(lambda k, v: f"{k}={v}", key, value.good),
             st.one_of(ARG_TEXT, key.map(lambda k: f"{k}="), st.builds(lambda k, v: f"{k}={v}", key, value.bad)))


SWITCH = None
LABEL_ARG = F(LABEL.good, st.one_of(st.sampled_from(["", " ", "x" * 500]), ARG_TEXT))
MODEL_ARG = F(st.sampled_from(list(VALID_I_MAX)), ARG_TEXT)
COND_OPTS = [
    ("--temp", num_arg(0, 100, [25])), ("--activity", pairs(SPECIES_KEYS, num_arg(1e-12, 10, [1]))),
    ("--activity", pairs(SPECIES_KEYS, num_arg(1e-12, 10, [1]))), ("--molality", pairs(SPECIES_KEYS, num_arg(1e-9, 5))),
    ("--ionic-strength", num_arg(0, 5, [0.5])), ("--env", arg_id(ENV_IDS)), ("--model", MODEL_ARG),
    ("--pH", num_arg(-2, 16, [7])), ("--pressure", pairs(["O2", "H2", "Cl2"], num_arg(1e-6, 50, [0.21]))),
    ("--json", SWITCH),
]
#: the service conditions of joint, matrix and measured, and the test post's options of cp (calc.cliservice)
SERVICE_OPTS = [
    ("--temp", num_arg(0, 100)), ("--salinity", num_arg(1e-3, 45, [35])), ("--chloride", num_arg(1e-3, 25000)),
    ("--o2", num_arg(0, 14, [0])), ("--aeration", F(st.sampled_from(["air-saturated", "deaerated"]), ARG_TEXT)),
    ("--velocity", num_arg(0, 30, [0])), ("--geometry", F(st.sampled_from(["pipe", "surface", "still"]), ARG_TEXT)),
    ("--diameter", num_arg(1e-3, 10, [0.1])), ("--length", num_arg(1e-3, 1000, [1])), ("--pH", num_arg(-2, 16, [7])),
    ("--conductivity", num_arg(1e-4, 20, [5])), ("--anode-area", num_arg(0.01, 1e8, [10])),
]
POST_OPTS = [
    ("--on-reading", num_arg(-2, 1, [-1.0])), ("--native-reading", num_arg(-2, 1, [-0.6])),
    ("--ir-drop-method", F(st.sampled_from([NOT_CONSIDERED, *sorted(ir_methods())]), ARG_TEXT)),
    ("--ir-drop", num_arg(0, 5000, [50])), ("--unit", F(st.sampled_from(["V", "mV"]), ARG_TEXT)),
]
#: command -> (positional arguments, required options, optional options, options of which one only)
COMMANDS = {
    "electrode": ([arg_id(HALF_IDS)], [], COND_OPTS, ("--ionic-strength", "--env")),
    "couple": ([arg_id(HALF_IDS), arg_id(HALF_IDS)], [], COND_OPTS, ("--ionic-strength", "--env")),
    "eph": ([arg_id(HALF_IDS), arg_id(HALF_IDS)], [],
            [o for o in COND_OPTS if o[0] != "--pH"] +
            [("--pH-values", F(st.lists(num_arg(0, 16, [0, 14]).good, min_size=2, max_size=6).map(",".join),
                               st.one_of(ARG_TEXT,
                                         st.lists(num_arg(-2, 16).bad, min_size=1, max_size=3).map(",".join))))],
            ("--ionic-strength", "--env")),
    "convert": ([num_arg(-10, 10, [-0.85])], [("--from", arg_id(REF_IDS)), ("--to", arg_id(REF_IDS))],
                [("--temp", num_arg(0, 100)), ("--pH", num_arg(-2, 16, [7])), ("--json", SWITCH)], ()),
    "activity": ([arg_id(ION_NAMES)], [("--ionic-strength", num_arg(0, 5, list(VALID_I_MAX.values())))],
                 [("--model", MODEL_ARG), ("--temp", num_arg(0, 100)), ("--json", SWITCH)], ()),
    "joint": ([arg_id(MATERIAL_IDS), arg_id(MATERIAL_IDS)], [("--env", arg_id(ENV_IDS))],
              [("--area-ratio", num_arg(1e-3, 1e3, [1])), *SERVICE_OPTS, ("--json", SWITCH)], ("--salinity", "--chloride")),
    "matrix": ([], [("--env", arg_id(ENV_IDS))],
               [("--materials", F(st.lists(st.sampled_from(MATERIAL_IDS), min_size=1, max_size=5).map(",".join),
                                  st.one_of(ARG_TEXT, st.lists(arg_id(MATERIAL_IDS).any, max_size=4).map(",".join)))),
                ("--csv", SWITCH), *[o for o in SERVICE_OPTS if o[0] != "--anode-area"], ("--json", SWITCH)],
               ("--salinity", "--chloride")),
    "rate": ([], [("--material", arg_id(MATERIAL_IDS)), ("--current-density", num_arg(0, 1e5, [1]))],
             [("--json", SWITCH)], ()),
    "measured": ([], [("--a", LABEL_ARG), ("--a-reading", num_arg(-2, 1, [-0.85])), ("--b", LABEL_ARG),
                      ("--b-reading", num_arg(-2, 1, [-0.2])), ("--electrode", arg_id(REF_IDS)),
                      ("--env", arg_id(ENV_IDS))],
                 [("--temp", num_arg(0, 100)), ("--salinity", num_arg(1e-3, 45, [35])),
                  ("--chloride", num_arg(1e-3, 25000, [19000])), ("--a-material", arg_id(MATERIAL_IDS)),
                  ("--b-material", arg_id(MATERIAL_IDS)), *SERVICE_OPTS[3:], ("--json", SWITCH)],
                 ("--salinity", "--chloride")),
    "cp": ([num_arg(-2, 1, [-0.85, -1.05])],
           [("--structure", arg_id(sorted(STRUCTURES))), ("--setting", arg_id(sorted(SETTINGS))),
            ("--electrode", arg_id(REF_IDS)), ("--kind", F(st.sampled_from(READING_KINDS), ARG_TEXT))],
           [("--temp", num_arg(0, 100)), ("--structure-temp", num_arg(0, 100)), ("--polarisation", num_arg(-500, 500)),
            ("--salinity", num_arg(1e-3, 45, [35])), ("--chloride", num_arg(1e-3, 25000)), *POST_OPTS,
            ("--json", SWITCH)], ("--salinity", "--chloride")),
    "mixed": ([], [], [("--json", SWITCH)], ()),  # its request comes on standard input (none here)
    "passivity": ([], [("--cr", num_arg(0, 40, [22])), ("--mo", num_arg(0, 10, [3])), ("--n", num_arg(0, 1, [0.17]))],
                  [("--w", num_arg(0, 5)), ("--temp", num_arg(0, 100)), ("--salinity", num_arg(1e-3, 45, [35])),
                   ("--chloride", num_arg(1e-3, 25000)), ("--json", SWITCH)], ("--salinity", "--chloride")),
    "wenner": ([], [("--spacing-m", num_arg(0.1, 100, [3])), ("--resistance-ohm", num_arg(0.01, 1000, [2]))],
               [("--json", SWITCH)], ()),
    # the design commands: options with good values (a request from options), none (JSON on stdin, here none)
    **{name: ([], [], [(flag, F(st.just(v), ARG_TEXT)) for flag, v in opts] + [("--json", SWITCH)], ())
       for name, opts in _DESIGN_CLI.items()},
}
assert sorted(COMMANDS) == sorted(api.ENTRY_POINTS), "every calculation command has an argument strategy here"
assert {o[0] for o in SERVICE_OPTS + POST_OPTS} == {v[0] for v in (*cliservice.SERVICE_OPTIONS.values(),
                                                               *cliservice.POST_OPTIONS.values())}, "every option"


@st.composite
def command_lines(draw, command):
    """An argument list for one command: every argument acceptable (a third of the cases), one
    bad, a required option missing, an argument of junk added, or everything good or bad."""
    positional, required, optional, one_only = COMMANDS[command]
    mode = draw(st.integers(0, 19))
    chosen = draw(st.lists(st.sampled_from(range(len(optional))), unique=True)) if optional else []
    opts = required + [optional[i] for i in sorted(chosen)]
    if mode <= 13:  # keep one of the options that exclude each other
        seen = [i for i, (flag, _) in enumerate(opts) if flag in one_only]
        opts = [o for i, o in enumerate(opts) if i not in seen[1:]]
    args = [("", f) for f in positional] + opts
    bad = draw(st.sampled_from(range(len(args)))) if args and 8 <= mode <= 13 else None

    def value(i, f):
        if f is SWITCH:
            return None
        return draw(f.bad if i == bad else f.good if mode <= 13 else f.any)

    words = [(flag, value(i, f)) for i, (flag, f) in enumerate(args)]
    if mode == 14 and required:  # a required option missing
        drop = draw(st.sampled_from([flag for flag, _ in required]))
        words = [w for w in words if w[0] != drop]
    elif mode == 15:  # a stray argument
        words.append(("", draw(ARG_TEXT)))
    pos = [v for flag, v in words if not flag]
    flags = [a for flag, v in words if flag for a in ([flag] if v is None else [flag, v])]
    # options may come before or after the positional arguments, as a user types them
    if draw(st.booleans()) and not any(p.startswith("-") for p in pos):
        return [command] + flags + pos
    return [command] + pos + flags


@pytest.mark.parametrize("command", sorted(COMMANDS))
def test_command_exits_0_or_2_with_one_line(command):
    @ROBUST
    @given(command_lines(command))
    def run(argv):
        check_cli(command, argv, json_out="--json" in argv and "--csv" not in argv)

    run()


def test_command_line_junk():
    """Whatever the argument list, exit 0 or 2 and one line; never a traceback."""

    @ROBUST
    @given(st.lists(st.one_of(st.sampled_from(sorted(COMMANDS) + ["data", "check", "--json", "--temp", "--env",
                                                                  "--from", "--to", "--", "-", "---"]),
                              ARG_TEXT), max_size=6))
    def run(argv):
        assume(not any(a in ("-h", "--help") or a.startswith("--h") or a.startswith("-h") for a in argv))
        assume(argv[:2] != ["data", "check"])  # the data folder check has a test of its own
        code, out, err = run_cli(argv)
        assert "Traceback" not in out + err
        assert code in (0, 2), (argv, code)
        if code == 2 and err == "":
            # no command at all (e.g. only "--"): the overview of the commands, on stdout
            assert out.startswith("usage: couplewise") and not [a for a in argv if a in COMMANDS or a == "data"], \
                (argv, out)
        elif code == 2:
            assert out == "" and err.startswith("couplewise: ") and err.count("\n") == 1, (argv, out, err)
        else:
            assert err == "" and out.strip(), (argv, err)
        _count("cli junk arguments", code != 0)

    run()


def test_data_check_with_bad_folder_arguments(tmp_path):
    """``couplewise data check DIR`` with DIR missing, a file, empty, unicode: a message, exit 1 or 2."""
    afile = tmp_path / "a-file.yaml"
    afile.write_text("half_reactions: []\n", encoding="utf-8")
    empty = tmp_path / "empty"
    empty.mkdir()
    for arg in [str(tmp_path / "missing"), str(afile), str(empty), str(tmp_path / "ŋ-ünïcode"), " ",
                str(tmp_path / ("x" * 200))]:
        code, out, err = run_cli(["data", "check", arg])
        assert "Traceback" not in out + err
        assert code in (1, 2), (arg, code, out, err)
        lines = [ln for ln in out.splitlines() if ln.strip()]
        assert lines and all(ln.count(":") >= 3 for ln in lines), (arg, out)
        assert "problem(s)" in err
        _count("cli data check", True)
    for extra in (["data"], ["data", "nope"], ["data", "check", "a", "b"]):
        code, out, err = run_cli(extra)
        assert code == 2 and err.count("\n") == 1 and "Traceback" not in err, (extra, err)
        _count("cli data check", True)


# ---------------------------------------------------------------------------- extreme but valid input

def ok(name, req):
    out = check_api(name, req, "extreme")
    assert out["ok"], (req, out)
    return out["result"]


def warning_text(res, field_prefix=""):
    return " | ".join(w["message"] for w in res["warnings"] if str(w.get("field") or "").startswith(field_prefix))


@pytest.mark.parametrize("temp", [0, 0.0, 100, 100.0])
def test_ends_of_the_temperature_range(temp):
    """0 and 100 °C are accepted by every temperature-dependent entry point; just outside is refused."""
    e = ok("electrode", {"id": "Zn2+/Zn", "temp_C": temp, "activities": {"Zn2+": 1}})
    assert e["temp_C"] == temp
    c = ok("couple", {"a": "Zn2+/Zn", "b": "Cu2+/Cu", "temp_C": temp})
    assert c["temp_C"] == temp and c["anode"] == "Zn2+/Zn"
    v = ok("convert", {"value_V": -0.8, "from": "SCE", "to": "SHE", "temp_C": temp})
    assert v["temp_C"] == temp
    a = ok("activity", {"species": "Zn2+", "ionic_strength": 0.01, "temp_C": temp})
    assert 0 < a["gamma"] < 1
    # the RHE at the ends: E = −(ln10·R·T/F)·pH (Nernst equation), the slope from CODATA 2018 R and F
    # written out in tests/oracles.py: −0.379392 V at 0 °C, −0.518287 V at 100 °C (pH 7)
    r = ok("convert", {"value_V": 0.0, "from": "RHE", "to": "SHE", "temp_C": temp, "pH": 7})
    assert r["value_V"] == pytest.approx(-nernst_slope_V(temp) * 7, abs=1e-12)
    assert r["value_V"] == pytest.approx({0: -0.379392, 100: -0.518287}[temp], abs=1e-6)
    for bad in (-1e-9, 100.000001):
        for name, req in (("electrode", {"id": "Zn2+/Zn"}), ("convert", {"value_V": 0, "from": "SCE", "to": "SHE"}),
                          ("activity", {"species": "Zn2+", "ionic_strength": 0.01})):
            out = api.call(name, {**req, "temp_C": bad})
            assert not out["ok"] and out["error"]["field"] == "temp_C"
            assert "0 to 100 °C" in out["error"]["message"]


def test_temperature_outside_a_records_stated_range_is_warned():
    """Where a record states a narrower validity than 0-100 °C, the ends of the range warn by name."""
    warned = 0
    for rec in _B["reference_electrodes"]:
        valid = (rec.get("temperature") or {}).get("valid_C")
        if not valid:
            continue
        for temp in (0, 100):
            res = ok("convert", {"value_V": 0.1, "from": rec["id"], "to": "SHE", "temp_C": temp})
            text = warning_text(res, "temp_C")
            inside = valid[0] - 1e-9 <= temp <= valid[1] + 1e-9
            if inside:
                assert "outside the range" not in text, (rec["id"], temp, text)
            else:
                assert "outside the range" in text and rec["id"] in text and "extrapolated" in text, (rec["id"], text)
                warned += 1
    for rec in _B["half_reactions"]:
        valid = rec.get("valid_C")
        if not valid:
            continue
        for temp in (0, 100):
            res = ok("electrode", {"id": rec["id"], "temp_C": temp})
            text = warning_text(res, "temp_C")
            if not valid[0] - 1e-9 <= temp <= valid[1] + 1e-9:
                assert "outside the range" in text and rec["id"] in text, (rec["id"], text)
                warned += 1
    assert warned, "the dataset has no record whose stated range ends inside 0-100 °C: nothing was checked"


@pytest.mark.parametrize("a", [1e-12, 10.0])
def test_activity_at_the_ends_of_the_dilute_range(a):
    """a(Zn2+) = 1e-12 and 10 give the Nernst value; 10 is the last activity without a warning."""
    res = ok("electrode", {"id": "Zn2+/Zn", "activities": {"Zn2+": a}})
    # Nernst: E = E° − (ln10·RT/2F)·log10(1/a), the slope from CODATA 2018 R and F (tests/oracles.py)
    assert res["potential_V"] == pytest.approx(res["standard_potential_V"] + nernst_slope_V(25.0) / 2 * math.log10(a),
                                               abs=1e-12)
    assert "far outside the dilute" not in warning_text(res)
    above = ok("electrode", {"id": "Zn2+/Zn", "activities": {"Zn2+": 10.000001}})
    text = warning_text(above, "activities.Zn2+")
    assert "far outside the dilute solutions" in text and "a(Zn2+)" in text


def test_activity_limits_and_zero_or_negative_activities():
    res = ok("electrode", {"id": "Zn2+/Zn", "activities": {"Zn2+": ACTIVITY_MAX}})
    assert "far outside the dilute" in warning_text(res, "activities.Zn2+")
    for bad in (0, -1e-12, -1, ACTIVITY_MAX * 1.0001, math.nan, math.inf, -math.inf):
        out = api.call("electrode", {"id": "Zn2+/Zn", "activities": {"Zn2+": bad}})
        assert not out["ok"] and out["error"]["field"] == "activities.Zn2+", (bad, out)
        assert "an activity above 0" in out["error"]["message"]


def test_tiny_values_that_underflow_give_an_error_or_a_finite_result():
    """Molalities and water activities so small that a product underflows to 0 never reach log10(0)."""
    for req in ({"id": "Zn2+/Zn", "molalities": {"Zn2+": 5e-324}, "ionic_strength": 0.5},
                {"id": "O2/OH-", "activities": {"H2O": 5e-324}, "pH": 2},
                {"id": "O2/OH-", "activities": {"H2O": 1e-300}, "pH": 0},
                {"id": "Zn2+/Zn", "activities": {"Zn2+": 5e-324}}):
        check_api("electrode", req, "extreme")


@pytest.mark.parametrize("model", sorted(VALID_I_MAX))
def test_ionic_strength_at_each_models_limit(model):
    """At the limit of its range a model gives γ without a warning; just above, the warning names the
    model, its limit and that the value is an extrapolation.

    Ranges: Stumm & Morgan, Aquatic Chemistry, 3rd ed. (1996), Table 3.3 (from memory), as in
    calc/activity.py."""
    vmax = VALID_I_MAX[model]
    at = ok("activity", {"species": "Na+", "ionic_strength": vmax, "model": model})
    assert at["valid_I_max"] == vmax and at["ionic_strength"] == vmax
    assert "above the range" not in warning_text(at)
    assert 0 < at["gamma"] <= 1
    above = ok("activity", {"species": "Na+", "ionic_strength": vmax * 1.01, "model": model})
    text = warning_text(above, "ionic_strength")
    if model == "ideal":
        # γ = 1 at any ionic strength: the warning still says the model is out of its range
        assert above["gamma"] == 1.0
    assert f"above the range of the {model} model" in text and "extrapolation" in text, text
    # the same limit reached through a molality in an electrode calculation
    el = ok("electrode", {"id": "Na+/Na", "molalities": {"Na+": 0.001}, "ionic_strength": vmax * 1.01,
                          "model": model})
    assert f"above the range of the {model} model" in warning_text(el, "ionic_strength")


def test_highest_ionic_strength_accepted_and_refused():
    from calc.activity import I_HARD_MAX

    res = ok("activity", {"species": "Cl-", "ionic_strength": I_HARD_MAX})
    assert "Pitzer" in warning_text(res, "ionic_strength")
    out = api.call("activity", {"species": "Cl-", "ionic_strength": I_HARD_MAX * 1.0001})
    assert not out["ok"] and out["error"]["field"] == "ionic_strength"


def test_pressure_and_ph_ends():
    res = ok("electrode", {"id": "O2/H2O", "pressures": {"O2": PRESSURE_MAX_ATM}, "pH": 16})
    assert "fugacity" in warning_text(res, "pressures.O2") and "outside 0-14" in warning_text(res, "pH")
    res = ok("electrode", {"id": "H+/H2", "pH": -2})
    assert "outside 0-14" in warning_text(res, "pH")
    for bad in (-2.0001, 16.0001):
        out = api.call("electrode", {"id": "H+/H2", "pH": bad})
        assert not out["ok"] and out["error"]["field"] == "pH"


def test_huge_values_and_ions_no_double_holds():
    """Integers of hundreds or thousands of digits and absurd ion charges give an error, not a crash
    or a silent zero."""
    for name, req, field in (
            ("convert", {"value_V": 10 ** 5000, "from": "SCE", "to": "SHE"}, "value_V"),
            ("convert", {"value_V": 10 ** 400, "from": "SCE", "to": "SHE"}, "value_V"),
            ("rate", {"material": "zinc", "current_density_uA_per_cm2": 10 ** 400}, "current_density_uA_per_cm2"),
            ("joint", {"a": "zinc", "b": "copper", "env": "seawater-flowing", "area_ratio": 10 ** 400}, "area_ratio"),
            ("activity", {"species": "Zn" + "9" * 5000 + "+", "ionic_strength": 0.1}, "species"),
            ("activity", {"species": "Zn" + "9" * 400 + "+", "ionic_strength": 0.1}, "species"),
            ("activity", {"species": "Zn" + "9" * 30 + "+", "ionic_strength": 0.1}, "species"),
            ("activity", {"species": "H" + "9" * 5000 + "+", "ionic_strength": 0.1}, "species"),
            ("activity", {"species": "Zn2+", "composition": {"Zn" + "9" * 30 + "+": 0.1}}, "species"),
    ):
        out = check_api(name, req, "extreme")
        assert not out["ok"] and out["error"]["field"].startswith(field), (name, out)


# ---------------------------------------------------------------------------- bad data, the build

ROOT = os.path.dirname(os.path.dirname(os.path.abspath(__file__)))
BROKEN = os.path.join(ROOT, "tests", "fixtures", "broken")


def _tree(folder):
    """{relative path: bytes} of every file under a folder."""
    out = {}
    for dirpath, _, files in os.walk(folder):
        for name in files:
            path = os.path.join(dirpath, name)
            with open(path, "rb") as fh:
                out[os.path.relpath(path, folder)] = fh.read()
    return out


@pytest.mark.parametrize("case", sorted(os.listdir(BROKEN)))
def test_the_build_gate_refuses_every_broken_fixture(case):
    """What the site build calls first (sitebuild.dataset.load_project_bundle) refuses each
    byte-level broken folder of the corpus with every problem as file:record:field: message
    (the corpus and its data-check messages: tests/test_validate.py)."""
    from sitebuild.dataset import DataProblems, load_project_bundle

    with pytest.raises(DataProblems) as exc:
        load_project_bundle(os.path.join(BROKEN, case), use_cache=False)
    assert exc.value.problems
    for line in exc.value.problems:
        assert re.match(r"^[a-z_]+\.yaml:[^:]+:[^:]*: \S", line), line


def _fake_site(out_dir, files=("index.html", "sw.js", "csp.txt")):
    os.makedirs(out_dir)
    for name in files:
        with open(os.path.join(out_dir, name), "w", encoding="utf-8") as fh:
            fh.write("new " + name)


def _old_site(dest):
    os.makedirs(os.path.join(dest, "sub"))
    for rel in ("index.html", "sw.js", "csp.txt", "sub/page.html"):
        with open(os.path.join(dest, rel), "w", encoding="utf-8") as fh:
            fh.write("old " + rel)
    return _tree(dest)


def test_atomic_build_swaps_only_a_complete_build(tmp_path):
    from sitebuild.atomic import BuildFailed, build_site

    dest = str(tmp_path / "site")
    before = _old_site(dest)
    # a build that fails, one that is incomplete, one that crashes: the old site stays, no leftovers
    for builder in (lambda out, env: (1, "ERROR - broken\n"),
                    lambda out, env: (_fake_site(out, ("index.html",)), (0, ""))[1],
                    lambda out, env: (_ for _ in ()).throw(OSError("disk full"))):
        with pytest.raises((BuildFailed, OSError)):
            build_site(dest, builder=builder)
        assert _tree(dest) == before
        assert sorted(os.listdir(tmp_path)) == ["site"]
    # a complete build replaces the old site entirely
    build_site(dest, builder=lambda out, env: (_fake_site(out), (0, "ok"))[1])
    assert _tree(dest) == {"index.html": b"new index.html", "sw.js": b"new sw.js", "csp.txt": b"new csp.txt"}
    assert sorted(os.listdir(tmp_path)) == ["site"]
    # with no site before, too
    fresh = str(tmp_path / "fresh")
    build_site(fresh, builder=lambda out, env: (_fake_site(out), (0, "ok"))[1])
    assert os.path.isfile(os.path.join(fresh, "sw.js"))


def test_atomic_build_passes_the_data_folder(tmp_path, monkeypatch):
    from sitebuild.atomic import build_site

    seen = {}
    monkeypatch.setenv("COUPLEWISE_DATA_DIR", "/from/the/environment")

    def builder(out, env):
        seen["data"] = env.get("COUPLEWISE_DATA_DIR")
        _fake_site(out)
        return 0, ""

    build_site(str(tmp_path / "a"), builder=builder)
    assert seen["data"] == "/from/the/environment"
    build_site(str(tmp_path / "b"), data_dir=str(tmp_path / "other"), builder=builder)
    assert seen["data"] == str(tmp_path / "other")


def test_make_site_with_bad_data_leaves_the_previous_site_and_lists_the_problems(tmp_path, capsys):
    """The real build (``make site`` runs ``python -m sitebuild.atomic site``) from a copy of data/
    with one record given twice: exit 1, every problem printed, the previous site untouched."""
    import shutil

    from sitebuild import atomic

    bad = tmp_path / "data"
    shutil.copytree(os.path.join(ROOT, "data"), bad)
    path = bad / "materials.yaml"
    text = path.read_text(encoding="utf-8")
    first = text.index("\n  - id: ") + 1
    second = text.index("\n  - id: ", first) + 1
    path.write_text(text[:second] + text[first:second] + text[second:], encoding="utf-8")
    dup = re.match(r"  - id: (\S+)", text[first:]).group(1)

    dest = str(tmp_path / "site")
    before = _old_site(dest)
    status = atomic.main([dest, "--data", str(bad)])
    err = capsys.readouterr().err
    assert status == 1
    assert _tree(dest) == before
    assert not os.path.exists(dest + ".tmp") and not os.path.exists(dest + ".old")
    assert re.search(rf"^materials\.yaml:{re.escape(dup)}:id: .*already used", err, re.M), err
    assert "left as it was" in err and "Traceback" not in err


def test_makefile_site_target_uses_the_atomic_build():
    with open(os.path.join(ROOT, "Makefile"), encoding="utf-8") as fh:
        text = fh.read()
    recipe = re.search(r"^site:.*\n((?:\t.*\n)+)", text, re.M)
    assert recipe and "-m sitebuild.atomic site" in recipe.group(1), "make site must build through sitebuild/atomic.py"


def test_limits_of_area_ratio_and_current_density():
    """The largest area ratio and current density accepted give finite rates with a warning; just
    beyond, the error names the input field (not a rate that overflowed)."""
    from calc.joint import AREA_MAX
    from calc.rate import CURRENT_MAX_UA_CM2

    res = ok("joint", {"a": "zinc", "b": "copper", "env": "seawater-flowing", "area_ratio": AREA_MAX})
    assert "outside 0.001-1000" in warning_text(res, "area_ratio")
    assert all(math.isfinite(x) for x in res["rate_mm_per_year"])
    res = ok("rate", {"material": "zinc", "current_density_uA_per_cm2": CURRENT_MAX_UA_CM2})
    assert "check the units" in warning_text(res, "current_density_uA_per_cm2")
    for name, req, field in (
            ("joint", {"a": "zinc", "b": "copper", "env": "seawater-flowing", "area_ratio": AREA_MAX * 1.0001},
             "area_ratio"),
            ("joint", {"a": "zinc", "b": "copper", "env": "seawater-flowing", "area_ratio": 1e306}, "area_ratio"),
            ("rate", {"material": "zinc", "current_density_uA_per_cm2": CURRENT_MAX_UA_CM2 * 1.0001},
             "current_density_uA_per_cm2"),
            ("rate", {"material": "zinc", "current_density_uA_per_cm2": 1e308}, "current_density_uA_per_cm2")):
        out = check_api(name, req, "extreme")
        assert not out["ok"] and out["error"]["field"] == field, out
