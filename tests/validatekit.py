"""Helpers of the data-validation tests (tests/test_validate*.py): broken copies of a data folder.

Each broken case is a complete data folder: the minimal valid folder of
``tests/fixtures/minimal`` with one thing broken. The YAML-level cases that must stay byte-exact
(duplicate key, alias bomb, non-UTF-8 bytes) are real folders under ``tests/fixtures/broken``;
the others are made in a temporary copy by the test. A case runs ``couplewise data check DIR``
(in a subprocess, :func:`run_check`, or in this process, :func:`check`) and asserts exit status 1
and a line ``file:record:field: message`` naming the file, the record and the field.

Values in the fixtures: Vanýsek, "Electrochemical Series", CRC Handbook of Chemistry and Physics,
92nd ed. (2011), Table 1; Fe2+/Fe -0.44 V from Bratsch, J. Phys. Chem. Ref. Data 18 (1989),
Table 1 (from memory); seawater ranges ASTM G82-98 Fig. 1 after LaQue (1975); SCE polynomial as
quoted from Ives & Janz (1961) by Sawyer et al. (1995) (from memory).
"""

import contextlib
import io
import os
import re
import shutil
import subprocess
import sys

import pytest
import yaml

from calc import cli

ROOT = os.path.dirname(os.path.dirname(os.path.abspath(__file__)))
FIXTURES = os.path.join(ROOT, "tests", "fixtures")
MINIMAL = os.path.join(FIXTURES, "minimal")
BROKEN = os.path.join(FIXTURES, "broken")
PYTHON = os.path.join(ROOT, ".venv", "bin", "python")
if not os.path.exists(PYTHON):  # pragma: no cover - outside the project's venv
    PYTHON = sys.executable


def run_check(folder):
    """``couplewise data check FOLDER`` in a subprocess: (exit status, stdout lines)."""
    proc = subprocess.run([PYTHON, "-m", "calc.cli", "data", "check", str(folder)], cwd=ROOT,
                          capture_output=True, text=True, timeout=120)
    assert "Traceback" not in proc.stderr, proc.stderr
    return proc.returncode, [ln for ln in proc.stdout.splitlines() if ln.strip()]


def check(folder):
    """The same command run in this process (for the many variants of one case): (status, lines)."""
    out, err = io.StringIO(), io.StringIO()
    with contextlib.redirect_stdout(out), contextlib.redirect_stderr(err):
        status = cli.main(["data", "check", str(folder)])
    return status, [ln for ln in out.getvalue().splitlines() if ln.strip()]


def load(folder, fname):
    with open(os.path.join(folder, fname), encoding="utf-8") as fh:
        return yaml.safe_load(fh)


def dump(folder, fname, doc):
    """Write a dataset file with its schema line first, as the data format asks."""
    header = f"# yaml-language-server: $schema=schema/{fname[:-5]}.schema.json\n"
    with open(os.path.join(folder, fname), "w", encoding="utf-8") as fh:
        fh.write(header + yaml.safe_dump(doc, sort_keys=False, allow_unicode=True))


def record(doc, key, rid):
    for rec in doc[key]:
        if rec.get("id", rec.get("species")) == rid:
            return rec
    raise KeyError(rid)


@pytest.fixture
def folder(tmp_path):
    """A fresh copy of the minimal valid data folder."""
    dest = tmp_path / "data"
    shutil.copytree(MINIMAL, dest)
    return str(dest)


def edit(folder, fname, change):
    """Load one file of a folder, let ``change(doc)`` break it, write it back."""
    doc = load(folder, fname)
    change(doc)
    dump(folder, fname, doc)


def assert_names(lines, fname, rec, field, *words):
    """Some error line is ``fname:rec:field: ...`` and contains every word."""
    pattern = re.compile(rf"^{re.escape(fname)}:{re.escape(rec)}(?: \(line \d+\))?:{re.escape(field)}: ")
    hits = [ln for ln in lines if pattern.match(ln) and all(w in ln for w in words)]
    assert hits, f"no line {fname}:{rec}:{field}: ... with {words} in:\n" + "\n".join(lines)
    return hits
