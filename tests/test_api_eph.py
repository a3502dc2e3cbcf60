"""The E–pH lines entry point (``eph``: every line of the couple page's chart in one calculation)
and how :func:`calc.api.call_json` refuses a non-finite number while writing the result."""

import json
import math

import pytest

from calc import api
from calc.electrode import electrode_entry
from calc.eph import EPH_PH, eph_entry

# The lines the couple page draws for its demo inputs (a galvanised tank with a copper pipe, our own
# scenario): the two water lines at unit pressure and both couples at the page's activities.
PAGE_LINES = [{"id": "H+/H2"}, {"id": "O2/H2O"}, {"id": "Zn2+/Zn", "activities": {"Zn2+": 1e-5}},
              {"id": "Cu2+/Cu", "activities": {"Cu2+": 1e-6}}]


@pytest.mark.parametrize("temp", [0, 35, 100])
def test_every_point_is_the_electrode_potential_at_that_pH(shipped, temp):
    """Same numbers, bit for bit, as one ``electrode`` calculation per point (what the page made
    before: 60 calculations per chart)."""
    lines = PAGE_LINES + [{"id": "Fe2+/Fe", "molalities": {"Fe2+": 1e-4}, "ionic_strength": 0.1, "model": "davies"},
                          {"id": "O2/H2O", "pressures": {"O2": 0.21}}]
    r = eph_entry({"lines": lines, "temp_C": temp})
    assert r["pH"] == list(EPH_PH) and [ln["id"] for ln in r["lines"]] == [ln["id"] for ln in lines]
    for line, out in zip(lines, r["lines"]):
        assert len(out["potential_V"]) == len(EPH_PH)
        for pH, e in zip(r["pH"], out["potential_V"]):
            assert e == electrode_entry({**line, "temp_C": temp, "pH": pH})["potential_V"]


def test_water_lines_and_a_flat_metal_line(shipped):
    r = eph_entry({"lines": PAGE_LINES, "temp_C": 25, "pH_values": [0, 7, 14]})
    h2, o2, zn, _ = r["lines"]
    # Hydrogen electrode at 25 °C, p(H2) = 1 atm: E = −(ln10·RT/F)·pH, 0 V at pH 0 and −0.4141 V
    # at pH 7 with p(H2) = 1 bar (Nernst equation; Bard & Faulkner, Electrochemical Methods, 2nd ed.
    # 2001, §2.1); the slope is −59.16 mV per pH (ln10·RT/F = 59.159 mV at 25 °C from CODATA 2018 R and F)
    assert h2["potential_V"][0] == 0.0
    assert h2["potential_V"][1] == pytest.approx(-7 * 0.059159, abs=7 * 5e-7)
    assert eph_entry({"lines": [{"id": "H+/H2", "pressures": {"H2": 1 / 1.01325}}], "pH_values": [0, 7]}
                     )["lines"][0]["potential_V"][1] == pytest.approx(-0.4141, abs=5e-5)
    # O2/H2O: E° = 1.229 V vs SHE (CRC Handbook, Electrochemical Series, Vanýsek 2011), falling 59.16 mV per pH
    # (4 H+ and 4 electrons: the Nernst equation, IUPAC Green Book 3rd ed. 2007, §2.13)
    assert o2["potential_V"][0] == pytest.approx(1.229, abs=1e-6)
    assert (o2["potential_V"][0] - o2["potential_V"][2]) / 14 == pytest.approx(0.059159, abs=2e-6)
    assert o2["pH_dependent"] and h2["pH_dependent"] and not zn["pH_dependent"]
    assert len(set(zn["potential_V"])) == 1  # no H+ or OH- in Zn2+/Zn: flat
    assert r["sources"] and r["data_version"] and r["steps"][0]["title"].startswith("E–pH lines")


@pytest.mark.parametrize("req,field", [
    ({}, "lines"),
    ({"lines": []}, "lines"),
    ({"lines": [{"id": "Zn2+/Zn"}] * 9}, "lines"),
    ({"lines": "Zn2+/Zn"}, "lines"),
    ({"lines": ["Zn2+/Zn"]}, "lines[0]"),
    ({"lines": [{"id": "Zn2+/Zn"}, {"id": "Unobtainium/U"}]}, "lines[1].id"),
    ({"lines": [{"activities": {"Zn2+": 1}}]}, "lines[0].id"),
    ({"lines": [{"id": "Zn2+/Zn", "pH": 7}]}, "lines[0].pH"),
    ({"lines": [{"id": "Zn2+/Zn", "temp_C": 40}]}, "lines[0].temp_C"),
    ({"lines": [{"id": "Zn2+/Zn", "activities": {"Zn2+": -1}}]}, "lines[0].activities.Zn2+"),
    ({"lines": [{"id": "Zn2+/Zn"}], "temp_C": 150}, "temp_C"),
    ({"lines": [{"id": "Zn2+/Zn"}], "pH_values": [7]}, "pH_values"),
    ({"lines": [{"id": "Zn2+/Zn"}], "pH_values": [0, math.nan]}, "pH_values[1]"),
    ({"lines": [{"id": "Zn2+/Zn"}], "pH_values": [0, 17]}, "pH_values[1]"),
    ({"lines": [{"id": "Zn2+/Zn"}], "pH": 7}, "pH"),
])
def test_bad_requests_name_the_field(shipped, req, field):
    out = api.call("eph", req)
    assert not out["ok"] and out["error"]["field"] == field, out
    assert out["error"]["message"].startswith(field) and "\n" not in out["error"]["message"]


def test_an_unknown_field_lists_the_fields_in_their_order(shipped):
    # the message as it read before the request reader was shared (calc.requests.read)
    out = api.call("eph", {"lines": [{"id": "Zn2+/Zn"}], "pH": 7})
    assert out["error"]["message"] == "pH = 7: expected no such field (eph takes: lines, temp_C, pH_values)"
    out = api.call("eph", {"lines": [{"id": "Zn2+/Zn", "pH": 7}]})
    assert out["error"]["message"] == ("lines[0].pH = 7: expected no such field (a line takes: id, activities, "
                                       "molalities, pressures, ionic_strength, env, composition, model "
                                       "(temp_C is shared; pH is the axis))")


def test_unused_values_and_ph_outside_the_usual_range_are_warned(shipped):
    r = eph_entry({"lines": [{"id": "Cu2+/Cu", "activities": {"Zn2+": 0.1}}], "pH_values": [-1, 7, 15]})
    fields = [w["field"] for w in r["warnings"]]
    assert "lines[0].activities.Zn2+" in fields and "pH_values" in fields


def _fake_entry(result):
    return lambda name: (lambda request: result)


def test_call_json_names_a_non_finite_number_where_it_sits(monkeypatch):
    """A non-finite number never leaves as JSON: call_json writes without walking the result first,
    and when writing refuses a NaN or Infinity, the error names where it sits, as call() does."""
    for bad in (math.nan, math.inf, -math.inf):
        monkeypatch.setattr(api, "entry", _fake_entry({"lines": [{"potential_V": [0.1, bad]}]}))
        out = json.loads(api.call_json("eph", "{}"))
        assert out["ok"] is False and out["error"]["field"] == "result.lines[0].potential_V[1]"
        assert api.call("eph", {}) == out
    monkeypatch.setattr(api, "entry", _fake_entry({"x": [1.5, {"y": None}]}))
    assert json.loads(api.call_json("eph", "{}")) == {"ok": True, "result": {"x": [1.5, {"y": None}]}}


def test_call_json_and_call_agree_on_real_results(shipped):
    for name, req in (("eph", {"lines": PAGE_LINES, "temp_C": 35}), ("matrix", {"env": "seawater-quiescent"}),
                      ("matrix", {"env": "seawater-flowing", "csv": True}),
                      ("couple", {"a": "Zn2+/Zn", "b": "Cu2+/Cu"}), ("electrode", {"id": "Zn2+/Zn", "temp_C": "hot"})):
        assert json.loads(api.call_json(name, json.dumps(req))) == api.call(name, req)


def test_command_line_prints_one_row_per_pH(shipped, capsys):
    from calc import cli

    assert cli.main(["eph", "O2/H2O", "Zn2+/Zn", "--activity", "Zn2+=1e-6", "--pH-values", "0,7,14"]) == 0
    out = capsys.readouterr().out.splitlines()
    head = out.index("pH\tO2/H2O\tZn2+/Zn")
    rows = [r.split("\t") for r in out[head + 1:head + 4]]
    assert [r[0] for r in rows] == ["0", "7", "14"]
    # O2/H2O at pH 0, 25 °C, p(O2) = 1 atm: E° = 1.229 V vs SHE (CRC Handbook, Electrochemical Series,
    # Vanýsek 2011); Zn2+/Zn at a(Zn2+) = 1e-6: −0.7618 − 0.05916·6/2 = −0.9393 V (Nernst; same table)
    assert float(rows[0][1]) == pytest.approx(1.229, abs=5e-5)
    assert [float(r[2]) for r in rows] == [pytest.approx(-0.9393, abs=2e-4)] * 3
    assert cli.main(["eph", "Zn2+/Zn", "--pH-values", "0,seven"]) == 2
    assert capsys.readouterr().err.startswith("couplewise: --pH-values")
