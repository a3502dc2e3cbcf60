"""The command line's service-condition options (joint, matrix, measured) and test-post options (cp): calc.cliservice.

Each option must reach its request field, so that the command line gives exactly the entry point's
answer to the same request (project convention, DESIGN.md: the command line and the page call the
same entry points); bad values are refused in one line naming the field (exit status 2, as every
other refusal of the command line); the help states each option's unit and its bound from
calc.bounds. The scenarios are our own; the numbers of the models are checked in test_service.py,
test_service_joint.py and test_field_onreading.py against their published sources.
"""

import argparse
import json

import pytest

from calc import api, cli, cliservice
from calc.bounds import BOUNDS


@pytest.fixture(autouse=True)
def _shipped(shipped):
    return shipped


def run(capsys, *argv):
    """cli.main in this process: (exit status, stdout, stderr); argparse's refusals exit through SystemExit."""
    try:
        code = cli.main(list(argv))
    except SystemExit as exc:
        code = exc.code
    out, err = capsys.readouterr()
    return code, out, err


def same_as_api(capsys, argv, name, request):
    """The CLI's --json answer is the entry point's result for the request, unchanged."""
    code, out, err = run(capsys, *argv, "--json")
    assert code == 0 and err == "", err
    want = api.call(name, request)
    assert want["ok"], want
    assert json.loads(out) == json.loads(json.dumps(want["result"], ensure_ascii=False))
    return json.loads(out)


JOINT = ["joint", "zinc", "carbon steel", "--env", "seawater-quiescent"]
JOINT_REQ = {"a": "zinc", "b": "carbon steel", "env": "seawater-quiescent"}


def test_every_option_reaches_its_field():
    for command in (*cliservice.COMMAND_FIELDS, "cp"):
        table = cliservice.POST_OPTIONS if command == "cp" else cliservice.SERVICE_OPTIONS
        parser = argparse.ArgumentParser()
        fields = cliservice.add_service_options(parser, command, cli._number, cli._bound)
        assert fields == list(cliservice.COMMAND_FIELDS.get(command, cliservice.POST_OPTIONS))
        for field in fields:  # one option at a time: salinity and chloride exclude each other
            flag = table[field][0]
            word = field in cliservice.WORD_FIELDS
            got = cliservice.service_request(parser.parse_args([flag, "x" if word else "1"]))
            assert got == {field: "x" if word else 1.0} and type(got[field]) is (str if word else float), got
    # the commands take what their entry points take: matrix has no anode area, measured its own temperature
    assert set(cliservice.COMMAND_FIELDS["joint"]) == set(cliservice.SERVICE_OPTIONS)
    assert "anode_area_cm2" not in cliservice.COMMAND_FIELDS["matrix"]
    assert not {"temp_C", "salinity", "chloride_mg_per_L"} & set(cliservice.COMMAND_FIELDS["measured"])


def test_joint_pipe_flow_measured_oxygen_and_ir_term(capsys):
    argv = JOINT + ["--temp", "10", "--salinity", "30", "--o2", "6", "--velocity", "1.5", "--geometry", "pipe",
                    "--diameter", "0.2", "--pH", "7.9", "--conductivity", "4", "--anode-area", "50",
                    "--area-ratio", "10"]
    req = {**JOINT_REQ, "temp_C": 10, "salinity": 30, "o2_mg_L": 6, "velocity_m_s": 1.5, "geometry": "pipe",
           "diameter_m": 0.2, "pH": 7.9, "conductivity_S_per_m": 4, "anode_area_cm2": 50, "area_ratio": 10}
    r = same_as_api(capsys, argv, "joint", req)
    conds = r["service_conditions"]
    for field in ("temp_C", "salinity", "o2_mg_L", "velocity_m_s", "geometry", "diameter_m", "pH",
                  "conductivity_S_per_m", "anode_area_cm2"):
        assert conds[field]["from"] == "user", field
    assert r["assessment"]["with_ir"] is not None  # the anode area asks for the electrolyte-resistance term


def test_joint_surface_flow_chloride_and_aeration(capsys):
    argv = JOINT + ["--chloride", "15000", "--aeration", "deaerated", "--velocity", "0.5", "--geometry", "surface",
                    "--length", "4"]
    req = {**JOINT_REQ, "chloride_mg_per_L": 15000, "aeration": "deaerated", "velocity_m_s": 0.5,
           "geometry": "surface", "length_m": 4}
    r = same_as_api(capsys, argv, "joint", req)
    # no dissolved oxygen, no oxygen limiting current: i_L = nFDc/δ with c = 0 (limiting current of a
    # diffusion layer, common practice)
    assert r["oxygen_supply"]["o2_mg_L"] == 0 and r["oxygen_supply"]["i_L_A_per_m2"] == 0


def test_matrix_takes_the_conditions(capsys):
    argv = ["matrix", "--env", "fresh-water", "--materials", "zinc,carbon steel", "--temp", "30", "--pH", "6.5",
            "--velocity", "0.3", "--geometry", "pipe", "--diameter", "0.05", "--o2", "4", "--salinity", "0.5"]
    req = {"env": "fresh-water", "materials": ["zinc", "carbon steel"], "temp_C": 30, "pH": 6.5, "velocity_m_s": 0.3,
           "geometry": "pipe", "diameter_m": 0.05, "o2_mg_L": 4, "salinity": 0.5}
    r = same_as_api(capsys, argv, "matrix", req)
    assert r["service_conditions"]["diameter_m"]["value"] == 0.05
    argv = ["matrix", "--env", "seawater-flowing", "--materials", "zinc,316", "--chloride", "10000",
            "--conductivity", "3", "--aeration", "air-saturated", "--geometry", "still"]
    req = {"env": "seawater-flowing", "materials": ["zinc", "316"], "chloride_mg_per_L": 10000,
           "conductivity_S_per_m": 3, "aeration": "air-saturated", "geometry": "still"}
    same_as_api(capsys, argv, "matrix", req)


def test_measured_passes_the_conditions_to_the_published_judgement(capsys):
    base = ["measured", "--a", "pile", "--a-reading", "-0.98", "--b", "ladder", "--b-reading", "-0.62",
            "--electrode", "SCE", "--env", "seawater-quiescent", "--a-material", "zinc", "--b-material", "carbon steel",
            "--temp", "12"]
    req = {"a_name": "pile", "a_reading_V": -0.98, "b_name": "ladder", "b_reading_V": -0.62, "electrode": "SCE",
           "env": "seawater-quiescent", "a_material": "zinc", "b_material": "carbon steel", "temp_C": 12}
    argv = base + ["--o2", "5", "--velocity", "2", "--geometry", "surface", "--length", "10", "--pH", "8",
                   "--conductivity", "4.5", "--anode-area", "100"]
    more = {"o2_mg_L": 5, "velocity_m_s": 2, "geometry": "surface", "length_m": 10, "pH": 8,
            "conductivity_S_per_m": 4.5, "anode_area_cm2": 100}
    r = same_as_api(capsys, argv, "measured", {**req, **more})
    conds = r["published"]["at_service"]["service_conditions"]
    assert conds["length_m"]["from"] == "user" and conds["temp_C"]["value"] == 12
    argv = base + ["--aeration", "deaerated", "--geometry", "pipe", "--velocity", "1", "--diameter", "0.3"]
    same_as_api(capsys, argv, "measured", {**req, "aeration": "deaerated", "geometry": "pipe", "velocity_m_s": 1,
                                           "diameter_m": 0.3})


CP = ["cp", "--structure", "carbon-steel", "--setting", "soil-aerobic", "--electrode", "CSE"]
CP_REQ = {"structure": "carbon-steel", "setting": "soil-aerobic", "electrode": "CSE"}


def test_cp_on_reading_with_its_ir_drop_considered(capsys):
    argv = CP + ["-0.95", "--kind", "on", "--ir-drop-method", "measured", "--ir-drop", "50", "--unit", "mV"]
    r = same_as_api(capsys, argv, "cp", {**CP_REQ, "reading_V": -0.95, "reading_kind": "on",
                                         "ir_drop_method": "measured", "ir_drop_mV": 50, "unit": "mV"})
    assert r["ir_drop_method"] == "measured" and r["ir_drop_mV"] == 50 and r["unit"] == "mV"
    argv = CP + ["-0.95", "--kind", "on", "--ir-drop-method", "history"]
    same_as_api(capsys, argv, "cp", {**CP_REQ, "reading_V": -0.95, "reading_kind": "on", "ir_drop_method": "history"})


def test_cp_instant_off_with_the_post_readings(capsys):
    argv = CP + ["-0.80", "--kind", "instant-off", "--on-reading", "-1.0", "--native-reading", "-0.6", "--unit", "V"]
    r = same_as_api(capsys, argv, "cp", {**CP_REQ, "reading_V": -0.80, "reading_kind": "instant-off", "on_V": -1.0,
                                         "native_V": -0.6, "unit": "V"})
    # the polarisation is E(instant-off) − E(native) and the IR drop E(on) − E(instant-off) (49 CFR 192
    # App. D Section III, as reproduced in MIL-HDBK-1004/10 App. E): 200 mV and −0.2 V here
    assert r["polarisation_mV"] == pytest.approx(200) and r["polarisation_from"] == "native"
    assert r["ir_drop_V"] == pytest.approx(-0.2)


# ---------------------------------------------------------------- refusals: one line naming the field

@pytest.mark.parametrize("argv, field", [
    (JOINT + ["--temp", "150"], "temp_C"),
    (JOINT + ["--salinity", "60"], "salinity"),
    (JOINT + ["--chloride", "0"], "chloride_mg_per_L"),
    (JOINT + ["--salinity", "35", "--chloride", "19000"], "--chloride"),
    (JOINT + ["--o2", "100"], "o2_mg_L"),
    (JOINT + ["--o2", "5", "--aeration", "deaerated"], "aeration"),
    (JOINT + ["--aeration", "half"], "aeration"),
    (JOINT + ["--velocity", "40", "--geometry", "pipe", "--diameter", "0.1"], "velocity_m_s"),
    (JOINT + ["--velocity", "abc"], "--velocity"),
    (JOINT + ["--geometry", "tunnel"], "geometry"),
    (JOINT + ["--velocity", "1", "--geometry", "pipe"], "diameter_m"),
    (JOINT + ["--velocity", "1", "--geometry", "pipe", "--diameter", "11"], "diameter_m"),
    (JOINT + ["--velocity", "1", "--geometry", "surface", "--length", "-1"], "length_m"),
    (JOINT + ["--pH", "17"], "pH"),
    (JOINT + ["--conductivity", "50"], "conductivity_S_per_m"),
    (JOINT + ["--anode-area", "0"], "anode_area_cm2"),
    (["matrix", "--env", "seawater-flowing", "--temp", "-5"], "temp_C"),
    (["matrix", "--env", "seawater-flowing", "--anode-area", "10"], "--anode-area"),
    (["measured", "--a", "p", "--a-reading", "-0.9", "--b", "q", "--b-reading", "-0.6", "--electrode", "SCE",
      "--env", "seawater-quiescent", "--a-material", "zinc", "--b-material", "carbon steel", "--geometry", "duct"],
     "geometry"),
    (CP + ["-0.9", "--kind", "on", "--unit", "kV"], "unit"),
    (CP + ["-0.9", "--kind", "on", "--ir-drop-method", "guessed"], "ir_drop_method"),
    (CP + ["-0.9", "--kind", "on", "--ir-drop", "50"], "ir_drop_method"),
    (CP + ["-0.9", "--kind", "on", "--ir-drop-method", "measured"], "ir_drop_mV"),
    (CP + ["-0.9", "--kind", "on", "--ir-drop-method", "measured", "--ir-drop", "6000"], "ir_drop_mV"),
    (CP + ["-0.9", "--kind", "on", "--on-reading", "-1.0"], "on_V"),
    (CP + ["-0.9", "--kind", "instant-off", "--on-reading", "20"], "on_V"),
    (CP + ["-0.9", "--kind", "instant-off", "--native-reading", "-0.6", "--polarisation", "100"], "native_V"),
])
def test_bad_values_exit_2_one_line_naming_the_field(capsys, argv, field):
    code, out, err = run(capsys, *argv)
    assert code == 2 and out == ""
    assert err.startswith("couplewise: ") and err.count("\n") == 1, err
    assert field in err and "Traceback" not in err, err


# ---------------------------------------------------------------- help: units and bounds

def _help(capsys, command):
    code, out, _ = run(capsys, command, "--help")
    assert code == 0
    return " ".join(out.split())  # argparse wraps the lines


@pytest.mark.parametrize("command", ["joint", "matrix", "measured", "cp"])
def test_help_shows_each_option_with_its_unit_and_bound(capsys, command):
    text = _help(capsys, command)
    table = cliservice.POST_OPTIONS if command == "cp" else cliservice.SERVICE_OPTIONS
    fields = table if command == "cp" else cliservice.COMMAND_FIELDS[command]
    for field in fields:
        flag, _, words, bound = table[field]
        assert flag in text, (command, flag)
        if bound is not None:
            b = BOUNDS[bound]
            assert f"{b.high:g} {b.unit}".strip() in text, (command, flag)
            assert words.split("[")[-1].rstrip("]") in text, (command, flag)  # the unit in brackets


def test_help_names_every_ir_drop_method_of_the_data():
    from calc.field.onreading import NOT_CONSIDERED, ir_methods

    words = cliservice.IR_METHOD_WORDS.replace(",", " ").split()
    assert set(ir_methods()) | {NOT_CONSIDERED} <= set(words)


# ---------------------------------------------------------------- text: the headlines a user reads

def test_joint_text_shows_the_attack_the_couple_and_the_screen(capsys):
    code, out, err = run(capsys, *JOINT, "--temp", "10", "--area-ratio", "10")
    assert code == 0 and err == ""
    r = api.call("joint", {**JOINT_REQ, "temp_C": 10, "area_ratio": 10})["result"]
    lines = out.splitlines()
    assert f"attack_mm_per_year: {r['attack_mm_per_year']:.3g}" in out
    couple = next(ln for ln in lines if ln.startswith("at the service conditions (mixed potential)"))
    assert "anode zinc" in couple and f"{r['assessment']['couple_potential_V_SCE']:.3g} V vs SCE" in couple
    screen = next(ln for ln in lines if ln.startswith("upper-bound screen"))
    assert "i_a = i_L·(1 + A_c/A_a)" in screen and "mm/y" in screen
    # the screen of Mansfeld (Corrosion 27 (1971) 436): the anode carries the cathodic density times (1 + A_c/A_a)
    rate = r["rate"]
    assert rate["anode_current_density_uA_per_cm2"][0] == pytest.approx(
        rate["cathodic_current_density_uA_per_cm2"][0] * 11, rel=1e-4)
    assert any(ln.startswith("service conditions: seawater; temp_C 10 °C (user)") for ln in lines)


def test_joint_text_without_a_service_model_says_why(capsys):
    code, out, _ = run(capsys, "joint", "zinc", "carbon steel", "--env", "marine-atmosphere")
    assert code == 0
    assert "at the service conditions: no mixed-potential judgement (" in out
    assert "upper-bound screen: none (" in out


def test_cp_text_shows_the_state_and_each_criterion(capsys):
    code, out, _ = run(capsys, *CP, "-0.95", "--kind", "on")
    assert code == 0
    assert "verdict_label: unconfirmed (on reading, IR drop included)" in out
    assert "value met, IR drop not considered" in out
    code, out, _ = run(capsys, *CP, "-0.95", "--kind", "on", "--ir-drop-method", "measured", "--ir-drop", "50")
    assert "verdict_label: protected" in out and "IR drop considered: measured, 50 mV subtracted" in out
    code, out, _ = run(capsys, *CP, "-0.80", "--kind", "instant-off", "--on-reading", "-1.0", "--native-reading", "-0.6")
    assert "polarisation: 200 mV (instant-off − native)" in out and "IR drop at the post (on − instant-off): -0.2 V" in out
