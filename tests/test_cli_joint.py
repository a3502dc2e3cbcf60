"""The command line for joints, pair tables and rates: `python -m calc.cli joint|matrix|rate`."""

import csv
import io
import json
import os
import subprocess
import sys

import pytest

ROOT = os.path.dirname(os.path.dirname(os.path.abspath(__file__)))


def cli(*args):
    """Run the command line in a fresh interpreter from the project folder."""
    return subprocess.run([sys.executable, "-m", "calc.cli", *args], cwd=ROOT, capture_output=True, text=True,
                          timeout=120, env={**os.environ, "PYTHONPATH": ROOT})


def test_joint_json_keys():
    out = cli("joint", "carbon steel", "316", "--env", "seawater-flowing", "--area-ratio", "10", "--json")
    assert out.returncode == 0, out.stderr
    r = json.loads(out.stdout)
    for key in ("anode", "cathode", "basis", "basis_description", "basis_source", "delta_E_V", "delta_E_range_V",
                "allowable_V", "negligible_V", "verdict", "verdict_text", "states", "worst_state", "area_ratio",
                "rate_mm_per_year", "rate", "assumptions", "mitigations", "alternatives", "cautions", "steps",
                "warnings", "sources", "data_version"):
        assert key in r, key
    # ASTM G82-98 (R2014) Fig. 1 (after LaQue 1975): mild steel is anodic to passive 316 in flowing seawater
    assert r["anode"] == "carbon-steel" and r["verdict"] == "unsuited"
    assert r["area_ratio"] == 10


def test_joint_text():
    out = cli("joint", "titanium", "316", "--env", "seawater-flowing")
    assert out.returncode == 0, out.stderr
    assert "verdict: " in out.stdout and "Derivation:" in out.stdout and "caution: " in out.stdout
    assert "data version: " in out.stdout


def test_matrix_csv():
    out = cli("matrix", "--env", "seawater-flowing", "--materials", "zinc,carbon steel,316", "--csv")
    assert out.returncode == 0, out.stderr
    lines = out.stdout.splitlines()
    assert lines[0].startswith("# ") and "data version" in lines[0]
    rows = list(csv.reader(io.StringIO("\n".join(lines[1:]))))
    assert rows[0] == ["a", "b", "anode", "delta_E_V", "verdict"]
    assert len(rows) == 4
    zinc_steel = rows[1]
    # ASTM G82-98 (R2014) Fig. 1: zinc (-0.98 to -1.03 V SCE) is anodic to mild steel (-0.60 to -0.72 V SCE)
    assert zinc_steel[:3] == ["zinc", "carbon-steel", "zinc"]
    assert float(zinc_steel[3]) == pytest.approx(0.345, abs=0.001)


def test_rate_text():
    out = cli("rate", "--material", "carbon steel", "--current-density", "1")
    assert out.returncode == 0, out.stderr
    line = next(x for x in out.stdout.splitlines() if x.startswith("penetration_mm_per_year:"))
    # ASTM G102-89 (R2015) Eq. (1): 1 µA/cm² on carbon steel is 11.6 µm/y (Faraday, computed)
    assert float(line.split(":")[1]) == pytest.approx(0.0116, abs=0.00005)


# each case starts an interpreter that bundles the YAML data (seconds each): the field-by-field checks of
# bad input run in-process in test_joint.py and test_rate.py; these check the exit status and the one line
@pytest.mark.parametrize("args,field", [
    (("joint", "steel", "nonsense", "--env", "seawater-flowing"), "a"),
    (("joint", "zinc", "copper", "--env", "seawater-flowing", "--area-ratio", "0"), "area_ratio"),
    (("matrix", "--env", "seawater-flowing", "--materials", "zinc,unobtainium"), "materials[1]"),
    (("rate", "--material", "graphite", "--current-density", "1"), "material"),
    (("rate", "--material", "zinc", "--current-density", "abc"), "--current-density"),
])
def test_bad_input_exit_2_one_line(args, field):
    out = cli(*args)
    assert out.returncode == 2
    assert out.stdout == ""
    lines = out.stderr.strip().splitlines()
    assert len(lines) == 1, out.stderr
    assert "Traceback" not in out.stderr and field in lines[0]
