"""The one rule for typed numbers on the command line: calc.numbers against the table of cases
that the page's parser is tested against too (tests/fixtures/numbers.json; the page's side is in
tests/browser/test_typed_numbers.py), and the CLI's options read by it, with a one-line error.
"""

import contextlib
import io
import json
import math
import os

import pytest

from calc import cli
from calc.numbers import ECHO_MAX, NumberError, echo, read_number, visible

ROOT = os.path.dirname(os.path.dirname(os.path.abspath(__file__)))
with open(os.path.join(ROOT, "tests", "fixtures", "numbers.json"), encoding="utf-8") as _fh:
    TABLE = json.load(_fh)


def test_the_table_covers_every_kind_of_refusal():
    from calc.numbers import PROBLEMS

    assert {c["kind"] for c in TABLE["refused"]} == set(PROBLEMS)
    assert len(TABLE["accepted"]) >= 20 and len(TABLE["echo"]) >= 10


@pytest.mark.parametrize("case", TABLE["accepted"], ids=lambda c: repr(c["text"]))
def test_accepted(case):
    value = read_number(case["text"])
    assert value == case["value"] and math.copysign(1, value) == math.copysign(1, case["value"])


@pytest.mark.parametrize("case", TABLE["refused"], ids=lambda c: repr(c["text"])[:40])
def test_refused_with_what_was_read_and_what_to_write(case):
    with pytest.raises(NumberError) as err:
        read_number(case["text"])
    assert err.value.kind == case["kind"]
    message = str(err.value)
    for words in case["says"]:
        assert words in message
    assert "\n" not in message and len(message) < 200
    assert message.startswith(echo(case["text"].strip(" \t\n\r\f\v\u00a0")))


@pytest.mark.parametrize("case", TABLE["echo"], ids=lambda c: repr(c["text"])[:40])
def test_echo(case):
    assert visible(case["text"]) == (case["shown"], case["cut"], case["count"])


def test_a_long_value_is_cut_and_an_override_cannot_act_on_the_message():
    text = "1" * 100_000 + "x"
    message = str(pytest.raises(NumberError, read_number, text).value)
    assert len(message) < 200 and "(100001 characters)" in message
    message = str(pytest.raises(NumberError, read_number, "\u202e5.0").value)
    assert "\u202e" not in message and "\\u202E5.0" in message
    assert ECHO_MAX == 56  # the quoted echo stays one word of at most 60 characters (cli._one_line)


def run_cli(*argv):
    """(exit status, stdout, stderr) of the command line; argparse's refusals exit through SystemExit."""
    streams = io.StringIO(), io.StringIO()
    with contextlib.redirect_stdout(streams[0]), contextlib.redirect_stderr(streams[1]):
        code = pytest.raises(SystemExit, cli.main, list(argv)).value.code
    return code, streams[0].getvalue(), streams[1].getvalue()


@pytest.mark.parametrize("case", TABLE["accepted"], ids=lambda c: repr(c["text"]))
def test_an_option_reads_what_the_rule_accepts(case):
    ns = cli.build_parser().parse_args(["electrode", "Zn2+/Zn", "--temp=" + case["text"]])
    assert ns.temp == case["value"]


@pytest.mark.parametrize("case", TABLE["refused"], ids=lambda c: repr(c["text"])[:40])
def test_an_option_refuses_what_the_rule_refuses_in_one_line(case):
    code, out, err = run_cli("electrode", "Zn2+/Zn", "--temp=" + case["text"])
    assert code == 2 and out == ""
    assert err.startswith("couplewise: argument --temp: ") and err.count("\n") == 1, err
    for words in case["says"]:
        assert words in err


@pytest.mark.parametrize("argv", [
    ["electrode", "Zn2+/Zn", "--temp", "0x10"],                  # was read as 16 °C
    ["electrode", "Zn2+/Zn", "--pH", "1_0"],                     # was read as 10
    ["electrode", "Zn2+/Zn", "--pH", "nan"],                     # was passed on as NaN
    ["activity", "Zn2+", "--ionic-strength", "inf"],             # was passed on as infinity
    ["convert", "0x1", "--from", "SCE", "--to", "CSE"],          # a positional value
    ["rate", "--material", "zinc", "--current-density", "1,000"],
])
def test_every_number_option_uses_the_rule(argv):
    code, out, err = run_cli(*argv)
    assert code == 2 and out == "" and err.count("\n") == 1 and "Traceback" not in err
    assert err.startswith("couplewise: argument ")


def test_species_values_and_ph_lists_use_the_rule():
    ns = cli.build_parser().parse_args(["electrode", "Zn2+/Zn", "--activity", "Zn2+=0,01"])
    assert cli._request(ns)["activities"] == {"Zn2+": 0.01}
    for argv, field in ((["electrode", "Zn2+/Zn", "--activity", "Zn2+=1,000"], "--activity Zn2+"),
                        (["electrode", "Zn2+/Zn", "--activity", "Zn2+=0x1"], "--activity Zn2+"),
                        (["eph", "Zn2+/Zn", "--pH-values", "0,nan"], "--pH-values")):
        ns = cli.build_parser().parse_args(argv)
        with pytest.raises(NumberError) as err:
            cli._request(ns)
        assert str(err.value).startswith(field + ": “")


def test_no_option_reads_numbers_by_another_rule():
    """Every number the command line takes goes through calc.numbers (argparse's float would take
    "1_000", "nan" and "inf")."""
    def actions(parser):
        for action in parser._actions:  # argparse keeps them there; there is no public list
            yield parser.prog, action
            for sub in (getattr(action, "choices", None) or {}).values() if action.nargs == "A..." else ():
                yield from actions(sub)

    found = list(actions(cli.build_parser()))
    assert len({prog for prog, _ in found}) > 10  # the sub-commands were walked
    assert [(prog, a.dest) for prog, a in found if a.type in (float, int)] == []
    assert sum(a.type is cli._number for _, a in found) >= 20
