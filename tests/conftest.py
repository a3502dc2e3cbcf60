"""Shared test fixtures: the project root on sys.path, the shipped dataset, dataset isolation.

The engine tests run against the project's own data (``data/*.yaml``, validated and bundled by
``sitebuild.dataset.load_project_bundle``). A test that needs records the shipped data does not
hold builds a small bundle and installs it with ``calc.dataset.set_dataset``; the autouse
fixture below puts the previous dataset back after every test.
"""

import os
import sys

import pytest

# --doctest-modules would also import the conftest files as doctest modules, and the two of
# them (here and in browser/) share the module name "conftest": collect neither as a module.
collect_ignore = ["conftest.py", os.path.join("browser", "conftest.py")]

ROOT = os.path.dirname(os.path.dirname(os.path.abspath(__file__)))
if ROOT not in sys.path:
    sys.path.insert(0, ROOT)


def _engine_bundle():
    """calc reads only calc/dataset.json: write it from data/ when it is missing or stale (as the
    command line does), so the doctests of calc and every test start from the data as it is."""
    import json

    from calc import dataset
    from sitebuild.dataset import DataProblems, write_engine_bundle

    try:
        with open(dataset.BUNDLE_PATH, encoding="utf-8") as fh:
            fresh = dataset.stale_reason(json.load(fh)) is None
    except (OSError, ValueError):
        fresh = False
    if not fresh:
        try:
            write_engine_bundle()
        except DataProblems:  # the data tests report the problems themselves
            pass


_engine_bundle()


@pytest.fixture(scope="session")
def shipped_bundle():
    """The validated bundle of the project's data/ (a dict); errors if the data has problems."""
    from sitebuild.dataset import load_project_bundle

    return load_project_bundle()


@pytest.fixture()
def shipped(shipped_bundle):
    """Install the shipped dataset as the current one and return it (a calc.dataset.Dataset)."""
    from calc import dataset

    return dataset.set_dataset(shipped_bundle)


@pytest.fixture(autouse=True)
def _restore_dataset():
    """Whatever a test installs with set_dataset, the next test starts from the previous dataset."""
    from calc import dataset

    saved = dataset._current
    yield
    dataset._current = saved
