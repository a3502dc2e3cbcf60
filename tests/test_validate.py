"""Data validation, the entry points (:mod:`sitebuild.validate`, its files checks): the valid
folders pass, YAML-level problems are named, every problem is reported at once and garbage never
raises. The other checks have a test file each, named after their module (test_validate_*.py);
the broken folders and the fixture values: see tests/validatekit.py.
"""

import filecmp
import os
import re

from sitebuild import validate
from sitebuild.dataset import FILES
from validatekit import (
    BROKEN, MINIMAL, ROOT, assert_names, check, edit, folder, record, run_check)  # noqa: F401 - folder is a fixture


def test_minimal_fixture_is_clean():
    assert validate.check_folder(MINIMAL) == []
    status, lines = run_check(MINIMAL)
    assert (status, lines) == (0, [])


def test_project_data_passes():
    """The shipped dataset has no error (warnings are allowed: they do not fail)."""
    status, lines = run_check(os.path.join(ROOT, "data"))
    errors = [ln for ln in lines if not ln.startswith("warning")]
    assert status == 0 and errors == [], "\n".join(errors)


def test_real_broken_folders_differ_from_minimal_in_one_file():
    """The byte-exact broken folders are complete copies of minimal with one file broken."""
    expected = {"duplicate-key": "half_reactions.yaml", "alias-bomb": "environments.yaml",
                "non-utf8": "materials.yaml"}
    for case, broken_file in expected.items():
        match, mismatch, errors = filecmp.cmpfiles(MINIMAL, os.path.join(BROKEN, case), list(FILES), shallow=False)
        assert mismatch == [broken_file] and not errors, \
            f"{case}: {mismatch} {errors}: run .venv/bin/python tests/fixtures/make_broken.py after changing minimal/"


def test_duplicate_key():
    status, lines = run_check(os.path.join(BROKEN, "duplicate-key"))
    assert status == 1
    assert_names(lines, "half_reactions.yaml", "Fe3+/Fe2+", "E0_V", "duplicate key", "first at line")


def test_alias_bomb_is_refused_without_expanding():
    status, lines = run_check(os.path.join(BROKEN, "alias-bomb"))
    assert status == 1
    assert any(re.match(r"^environments\.yaml:line \d+:-: .*aliases", ln) for ln in lines), lines


def test_non_utf8_bytes():
    status, lines = run_check(os.path.join(BROKEN, "non-utf8"))
    assert status == 1
    assert_names(lines, "materials.yaml", "zinc", "-", "not UTF-8", "byte")


def test_malformed_yaml(folder):
    path = os.path.join(folder, "ions.yaml")
    with open(path, "a", encoding="utf-8") as fh:
        fh.write('  - species: "Na+"\n    charge: [1, 2\n')
    status, lines = run_check(folder)
    assert status == 1
    assert_names(lines, "ions.yaml", "Na+", "-", "YAML error")


def test_huge_file(folder):
    path = os.path.join(folder, "sources.yaml")
    with open(path, "a", encoding="utf-8") as fh:
        fh.write("# " + "x" * 2_100_000 + "\n")
    status, lines = run_check(folder)
    assert status == 1
    assert any(ln.startswith("sources.yaml:-:-: file is") and "limit" in ln for ln in lines), lines


def test_missing_file_and_wrong_top_level(folder):
    os.remove(os.path.join(folder, "ions.yaml"))
    with open(os.path.join(folder, "environments.yaml"), "a", encoding="utf-8") as fh:
        fh.write("extras: []\n")
    status, lines = run_check(folder)
    assert status == 1
    assert "ions.yaml:-:-: file is missing" in lines
    assert_names(lines, "environments.yaml", "-", "extras", "unknown top-level key")


def test_schema_line_first(folder):
    path = os.path.join(folder, "materials.yaml")
    with open(path, encoding="utf-8") as fh:
        text = fh.read()
    with open(path, "w", encoding="utf-8") as fh:
        fh.write(text.split("\n", 1)[1])
    status, lines = check(folder)
    assert status == 1
    assert_names(lines, "materials.yaml", "-", "-", "yaml-language-server")


def test_every_problem_is_reported_at_once(folder):
    edit(folder, "half_reactions.yaml", lambda doc: record(doc, "half_reactions", "Zn2+/Zn").__setitem__("n", 1))
    edit(folder, "materials.yaml", lambda doc: record(doc, "materials", "zinc").__setitem__("density_g_cm3", 71.3))
    edit(folder, "ions.yaml", lambda doc: record(doc, "ions", "Zn2+").__setitem__("source", "nowhere"))
    status, lines = check(folder)
    assert status == 1
    assert_names(lines, "half_reactions.yaml", "Zn2+/Zn", "n")
    assert_names(lines, "materials.yaml", "zinc", "density_g_cm3")
    assert_names(lines, "ions.yaml", "Zn2+", "source")


def test_validate_raw_never_raises_on_garbage():
    """Records of the wrong shape give problems, not exceptions."""
    raw = {"sources": [1, None, {"id": 3}], "half_reactions": [{"id": "A/B", "oxidised": "x", "n": "2"}, []],
           "reference_electrodes": {"not": "a list"}, "materials": [{"other_state": 5, "uns": "S31600"}],
           "environments": None, "ions": [{"species": 7}]}
    lines = validate.validate_raw(raw, None)
    assert lines and all(re.match(r"^(warning: )?[a-z_]+\.yaml:[^:]+:[^:]+: ", ln) for ln in lines), lines
