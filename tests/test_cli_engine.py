"""The engine behind the command line and the page: CLI commands electrode, couple, convert,
activity; JSON entry points under random input; docstrings of the engine's public functions."""

import importlib
import inspect
import json
import math
import os
import re
import subprocess
import sys

import pytest
from hypothesis import HealthCheck, given, settings
from hypothesis import strategies as st

from calc import api, cli

ROOT = os.path.dirname(os.path.dirname(os.path.abspath(__file__)))
#: every module of the engine (calc), found on disk, apart from its command-line face
ENGINE_MODULES = sorted(
    "calc." + os.path.relpath(os.path.join(d, f), os.path.join(ROOT, "calc"))[:-3].replace(os.sep, ".").removesuffix(".__init__")
    for d, _, files in os.walk(os.path.join(ROOT, "calc")) if "__pycache__" not in d
    for f in files if f.endswith(".py") and f not in ("cli.py", "clitext.py", "__main__.py"))


def run_cli(capsys, *argv):
    code = cli.main(list(argv))
    out, err = capsys.readouterr()
    return code, out, err


# ---------------------------------------------------------------- the commands, in process

def test_couple_json(shipped, capsys):
    code, out, err = run_cli(capsys, "couple", "Zn2+/Zn", "Cu2+/Cu", "--json")
    assert code == 0 and err == ""
    r = json.loads(out)
    # CRC (Vanýsek 2011) Table 1: 0.3419 − (−0.7618) = 1.1037 V
    assert r["anode"] == "Zn2+/Zn" and r["standard_cell_potential_V"] == pytest.approx(1.1037, abs=1e-9)


def test_couple_text(shipped, capsys):
    code, out, err = run_cli(capsys, "couple", "Zn2+/Zn", "Cu2+/Cu", "--activity", "Zn2+=0.1", "--activity", "Cu2+=0.001")
    assert code == 0
    assert "anode: Zn2+/Zn" in out and "Derivation:" in out
    # Nernst: 1.1037 − (0.0591593/2)·log10(0.1/0.001) = 1.0445 V (CODATA 2018 slope, computed)
    assert re.search(r"cell_potential_V: 1\.0445", out)


def test_electrode_with_ph_pressure_and_temperature(shipped, capsys):
    code, out, err = run_cli(capsys, "electrode", "O2/H2O", "--pH", "7", "--pressure", "O2=0.21", "--temp", "40", "--json")
    assert code == 0
    r = json.loads(out)
    assert r["temp_C"] == 40 and r["n"] == 4


def test_electrode_molality_env_model(shipped, capsys):
    code, out, err = run_cli(capsys, "electrode", "Zn2+/Zn", "--molality", "Zn2+=0.001", "--env", "seawater-flowing",
                             "--model", "davies", "--json")
    assert code == 0
    r = json.loads(out)
    assert r["activities"][0]["activity"] < 0.001


def test_convert(shipped, capsys):
    code, out, err = run_cli(capsys, "convert", "-0.85", "--from", "CSE", "--to", "Ag/AgCl seawater")
    assert code == 0 and "value_V: -0.78" in out


def test_activity(shipped, capsys):
    code, out, err = run_cli(capsys, "activity", "Zn2+", "--ionic-strength", "0.01", "--model", "extended", "--json")
    assert code == 0
    # Kielland (1937) table, z = 2, å = 6 Å, I = 0.01 → 0.675 (read as reproduced in R. A. Freeze and
    # J. A. Cherry, Groundwater, Prentice-Hall 1979, Appendix IV, online edition)
    assert json.loads(out)["gamma"] == pytest.approx(0.675, abs=0.003)


@pytest.mark.parametrize("argv, field", [
    (["couple", "Zn2+/Zn", "Copper"], "b"),
    (["electrode", "Zn2+/Zn", "--temp", "150"], "temp_C"),
    (["electrode", "Zn2+/Zn", "--activity", "Zn2+=-1"], "activities.Zn2+"),
    (["electrode", "Zn2+/Zn", "--activity", "Zn2+"], "--activity"),
    (["electrode", "Zn2+/Zn", "--activity", "Zn2+=abc"], "--activity Zn2+"),
    (["electrode", "H+/H2", "--pH", "17"], "pH"),
    (["activity", "Zn2+", "--ionic-strength", "0.1", "--model", "pitzer"], "model"),
    (["convert", "0.1", "--from", "SCE", "--to", "RHE"], "pH"),
])
def test_bad_input_exit_2_one_line(shipped, capsys, argv, field):
    code, out, err = run_cli(capsys, *argv)
    assert code == 2 and out == ""
    assert err.count("\n") == 1 and err.startswith("couplewise: ")
    assert field in err
    assert "Traceback" not in err


# ---------------------------------------------------------------- the commands, as a user runs them

# each run bundles and validates data/ afresh (several seconds), so two runs cover both module names

def test_python_dash_m():
    proc = subprocess.run([sys.executable, "-m", "calc.cli", "couple", "Zn2+/Zn", "Cu2+/Cu", "--json"],
                          cwd=ROOT, capture_output=True, text=True, timeout=120)
    assert proc.returncode == 0, proc.stderr
    r = json.loads(proc.stdout)
    assert r["overall_reaction"] == "Cu2+(aq) + Zn(s) → Cu(s) + Zn2+(aq)"


def test_python_dash_m_bad_input():
    proc = subprocess.run([sys.executable, "-m", "calc", "convert", "0.1", "--from", "SCE", "--to", "nowhere"],
                          cwd=ROOT, capture_output=True, text=True, timeout=120)
    assert proc.returncode == 2 and proc.stdout == ""
    assert proc.stderr.count("\n") == 1 and "to = 'nowhere'" in proc.stderr


# ---------------------------------------------------------------- entry points under random input

JUNK = st.one_of(st.none(), st.booleans(), st.integers(), st.floats(allow_nan=True, allow_infinity=True),
                 st.text(max_size=12), st.lists(st.integers(), max_size=2), st.dictionaries(st.text(max_size=4), st.integers(), max_size=2))
NUM = st.one_of(st.floats(-1e3, 1e3, allow_nan=False), st.floats(allow_nan=True, allow_infinity=True), JUNK)
SPECIES = st.sampled_from(["Zn2+", "Cu2+", "H+", "OH-", "O2", "H2", "Fe3+", "Fe2+", "Cl-", "SO4^2-", "Ag+", "X", ""])
HALF = st.sampled_from(["Zn2+/Zn", "Cu2+/Cu", "Fe3+/Fe2+", "O2/OH-", "O2/H2O", "H2O/H2", "H+/H2", "AgCl/Ag",
                        "Hg2Cl2/Hg", "Ti2+/Ti", "zinc", ""])
REFS = st.sampled_from(["SHE", "SCE", "CSE", "Ag/AgCl sat. KCl", "Ag/AgCl seawater", "RHE", "she", "nope"])
MODELS = st.sampled_from(["ideal", "limiting", "extended", "davies", "truesdell-jones", "DAVIES", "x"])
TEMP = st.one_of(st.floats(-10, 120), NUM)
MAPPING = st.one_of(st.dictionaries(SPECIES, NUM, max_size=3), JUNK)
CONDITIONS = st.fixed_dictionaries({}, optional={
    "temp_C": TEMP, "activities": MAPPING, "molalities": MAPPING, "pressures": MAPPING,
    "ionic_strength": NUM, "env": st.sampled_from(["seawater-flowing", "fresh-water", "indoor-controlled", "x"]),
    "model": MODELS, "pH": st.one_of(st.floats(-3, 17), NUM), "composition": MAPPING})

REQUESTS = {
    "electrode": st.builds(lambda c, i: {**c, "id": i}, CONDITIONS, HALF),
    "couple": st.builds(lambda c, a, b, ac: {**c, "a": a, "b": b, **({"a_conditions": ac} if ac else {})},
                        CONDITIONS, HALF, HALF, st.one_of(st.none(), st.fixed_dictionaries({}, optional={"activities": MAPPING, "pH": NUM}))),
    "convert": st.fixed_dictionaries({"value_V": NUM, "from": REFS, "to": REFS},
                                     optional={"temp_C": TEMP, "pH": NUM}),
    "activity": st.fixed_dictionaries({"species": SPECIES}, optional={
        "ionic_strength": st.one_of(st.floats(0, 6), NUM), "model": MODELS, "temp_C": TEMP,
        "env": st.sampled_from(["seawater-flowing", "x"]),
        "composition": MAPPING, "molality": NUM, "size_angstrom": NUM}),
}


@pytest.mark.parametrize("name", sorted(REQUESTS))
def test_entry_points_never_raise(shipped_bundle, name):
    from calc import dataset

    @settings(max_examples=150, deadline=None, suppress_health_check=list(HealthCheck))
    @given(REQUESTS[name])
    def check(req):
        dataset.set_dataset(shipped_bundle)
        out = api.call(name, req)
        text = json.dumps(out, allow_nan=False, ensure_ascii=False)  # plain JSON, never NaN/Infinity
        assert isinstance(out["ok"], bool)
        if out["ok"]:
            for key in ("steps", "warnings", "sources", "data_version"):
                assert key in out["result"]
        else:
            assert out["error"]["field"] and out["error"]["message"]
            assert "Traceback" not in text

    check()


def test_json_text_entry(shipped):
    out = json.loads(api.call_json("couple", '{"a": "Zn2+/Zn", "b": "Cu2+/Cu", "temp_C": 50}'))
    assert out["ok"] and math.isfinite(out["result"]["cell_potential_V"])


# ---------------------------------------------------------------- docstrings of the engine

def _public_functions():
    for name in ENGINE_MODULES:
        mod = importlib.import_module(name)
        for fname, obj in vars(mod).items():
            if fname.startswith("_") or not inspect.isfunction(obj) or obj.__module__ != name:
                continue
            yield f"{name}.{fname}", obj


@pytest.mark.parametrize("qualname, func", list(_public_functions()))
def test_public_functions_document_units_references_and_examples(qualname, func):
    doc = inspect.getdoc(func) or ""
    assert doc, f"{qualname} has no docstring"
    assert ">>>" in doc, f"{qualname} has no doctest example"
    assert "References:" in doc, f"{qualname} has no References section"
    for pname in inspect.signature(func).parameters:
        m = re.search(rf"^\s*{re.escape(pname)}: (.+)$", doc, re.MULTILINE)
        assert m, f"{qualname}: parameter {pname} is not described"
        # the unit in brackets ends the parameter's description (which may wrap onto more lines)
        rest = doc[m.start():].split("\n")
        text = rest[0]
        for line in rest[1:]:
            if re.match(r"^\s{8,}\S", line) and not re.match(r"^\s*\w+: ", line):
                text += " " + line.strip()
            else:
                break
        assert re.search(r"\[[^\]]+\]\s*$", text), f"{qualname}: parameter {pname} has no [unit] at the end"
