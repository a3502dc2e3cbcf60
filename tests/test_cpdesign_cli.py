"""The design commands of the command line (calc.clicp): options or JSON on stdin give the entry's own answer.

The published numbers are those of the entries' tests (MIL-HDBK-1004/10, 1990; USACE ETL 1110-9-10,
1991; DNV-RP-B401 formulas as restated by El-Reedy 2012): here only that the command line asks the
same question and refuses bad input with one line naming the field.
"""

import io
import json

import pytest

from calc import api, cli, clicp
from calc.cpdesign.units import FT_M

IN_M = 0.0254


@pytest.fixture(autouse=True)
def _shipped(shipped):
    return shipped


def run(capsys, monkeypatch, argv, stdin=""):
    monkeypatch.setattr("sys.stdin", io.StringIO(stdin))
    code = cli.main(argv)
    out, err = capsys.readouterr()
    return code, out, err


def test_every_design_command_is_an_entry_point_and_every_option_a_field():
    import argparse

    for name, (_, options) in clicp.OPTIONS.items():
        assert name in api.ENTRY_POINTS
        flags = [o[0] for o in options]
        assert len(flags) == len(set(flags)), name
    # every option reaches its field: all given, the request holds them all
    sub = argparse.ArgumentParser().add_subparsers(dest="command")
    parsers = dict(zip(clicp.OPTIONS, clicp.add_parsers(sub, float)))
    for name, (_, options) in clicp.OPTIONS.items():
        argv = [a for flag, _, metavar, _ in options for a in (flag, "x" if metavar == "NAME" else "1")]
        req = clicp.request_of(parsers[name].parse_args(argv), None)
        got = {k if not isinstance(v, dict) else f"{k}.{kk}" for k, v in req.items()
               for kk in (v if isinstance(v, dict) else [None])}
        assert got == {field for _, field, _, _ in options}, name


def test_groundbed_options_give_the_entry_answer(capsys, monkeypatch):
    # MIL-HDBK-1004/10 p. 182: three anodes of 7 ft × 10 in in 2,000 Ω·cm at 20 ft (1.87 Ω printed; 1.885 exact K)
    argv = ["groundbed", "--resistivity-ohm-m", "20", "--length-m", str(7 * FT_M), "--diameter-m", str(10 * IN_M),
            "--count", "3", "--spacing-m", str(20 * FT_M), "--json"]
    code, out, err = run(capsys, monkeypatch, argv)
    assert code == 0 and not err
    got = json.loads(out)
    want = api.call("groundbed", {"resistivity_ohm_m": 20, "length_m": 7 * FT_M, "diameter_m": 10 * IN_M,
                                  "count": 3, "spacing_m": 20 * FT_M})["result"]
    assert got["resistance_ohm"] == pytest.approx(want["resistance_ohm"])
    assert got["resistance_ohm"] == pytest.approx(1.87, rel=1e-2)
    assert got["paralleling"]["method"] == "table"


def test_anodes_from_the_design_currents(capsys, monkeypatch):
    argv = ["anodes", "--current-mean-A", "50", "--current-final-A", "60", "--life-years", "25",
            "--capacity-Ah-per-kg", "2000", "--utilisation", "0.9", "--json"]
    code, out, _ = run(capsys, monkeypatch, argv)
    assert code == 0
    # M = I_m·t·8760/(u·ε) = 50 × 25 × 8760/(0.9 × 2000) (DNV-RP-B401 net mass, as restated by El-Reedy 2012)
    assert json.loads(out)["net_mass_kg"] == pytest.approx(50 * 25 * 8760 / (0.9 * 2000))


def test_anode_resistance_and_tank_options(capsys, monkeypatch):
    code, out, _ = run(capsys, monkeypatch, ["anode-resistance", "--shape", "bracelet", "--resistivity-ohm-m", "0.3",
                                             "--area-m2", "0.36", "--json"])
    assert code == 0 and json.loads(out)["resistance_ohm"] == pytest.approx(0.315 * 0.3 / 0.6)
    # MIL-HDBK-1004/10 p. 189, the hot-water tank: 98.2 Ω per anode, 38.94 Ω for three
    argv = ["tank", "--resistivity-ohm-m", "86", "--tank-diameter-m", str(3.83 * FT_M), "--arrangement", "centre",
            "--anode-length-m", str(9 * IN_M), "--anode-diameter-m", str(1.5 * IN_M), "--fringe-factor", "0.48",
            "--count", "3", "--spacing-m", str(4 * FT_M), "--current-A", "0.84", "--json"]
    code, out, _ = run(capsys, monkeypatch, argv)
    r = json.loads(out)
    assert code == 0 and r["single_anode_ohm"] == pytest.approx(98.2, abs=0.05)
    assert r["resistance_ohm"] == pytest.approx(38.94, abs=0.02)


def test_without_options_the_request_comes_on_stdin(capsys, monkeypatch):
    req = {"current_A": 0.858, "resistivity_ohm_m": 45, "alloy": "magnesium", "anode": "17-lb-packaged",
           "life_years": 15}
    code, out, _ = run(capsys, monkeypatch, ["buried", "--json"], json.dumps(req))
    # MIL-HDBK-1004/10 p. 186: i = 26.7 mA
    assert code == 0 and json.loads(out)["anode_output_mA"] == pytest.approx(26.7, abs=0.05)
    code, _, err = run(capsys, monkeypatch, ["buried"], "[1, 2]")
    assert code == 2 and err.startswith("couplewise: request")


@pytest.mark.parametrize("argv, field", [
    (["groundbed", "--resistivity-ohm-m", "0", "--length-m", "2", "--diameter-m", "0.2"], "resistivity_ohm_m"),
    (["groundbed", "--resistivity-ohm-m", "-20", "--length-m", "2", "--diameter-m", "0.2"], "resistivity_ohm_m"),
    (["groundbed", "--resistivity-ohm-m", "20", "--length-m", "0", "--diameter-m", "0.2"], "length_m"),
    (["anodes", "--current-mean-A", "5", "--life-years", "0", "--alloy", "al-zn-in", "--utilisation", "0.9"],
     "life_years"),
    (["anodes", "--current-mean-A", "5", "--life-years", "20", "--alloy", "unobtainium", "--utilisation", "0.9"],
     "alloy"),
    (["buried", "--current-A", "1", "--resistivity-ohm-m", "45", "--alloy", "magnesium", "--anode", "17-lb-packaged",
      "--life-years", "15", "--coating", "painted"], "coating"),
    (["tank", "--resistivity-ohm-m", "40", "--tank-diameter-m", "10", "--arrangement", "spiral"], "arrangement"),
])
def test_bad_options_are_refused_in_one_line_naming_the_field(capsys, monkeypatch, argv, field):
    code, out, err = run(capsys, monkeypatch, argv)
    assert code == 2 and not out
    assert err.count("\n") == 1 and err.startswith(f"couplewise: {field}")
