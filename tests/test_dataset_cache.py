"""The validated-bundle cache (.cache/dataset-<key>.json) is keyed by the data and schema bytes
and by the code that validates and bundles them: a change to that code must not reuse a bundle
made (and validated) by the old code.

The data is the minimal valid fixture (tests/fixtures/minimal); the cache and the code copies
live in a temporary folder, so the project's own .cache/ is not touched.
"""

import json
import os
import shutil

import pytest

from sitebuild import dataset

ROOT = os.path.dirname(os.path.dirname(os.path.abspath(__file__)))
MINIMAL = os.path.join(ROOT, "tests", "fixtures", "minimal")


@pytest.fixture
def code_copy(tmp_path, monkeypatch):
    """A copy of the bundling code the key reads, with the cache in the temporary folder too."""
    root = tmp_path / "project"
    for rel in dataset.BUNDLER_SOURCES:
        dest = root / rel
        dest.parent.mkdir(parents=True, exist_ok=True)
        shutil.copyfile(os.path.join(ROOT, rel), dest)
    monkeypatch.setattr(dataset, "PROJECT_ROOT", str(root))
    monkeypatch.setattr(dataset, "CACHE_DIR", str(tmp_path / "cache"))
    return root


def test_the_key_covers_the_validator_and_bundler_code(code_copy):
    assert {"sitebuild/validate/__init__.py", "sitebuild/dataset.py", "sitebuild/yamlsafe.py"} <= set(dataset.BUNDLER_SOURCES)
    before = dataset._files_digest(MINIMAL)
    assert dataset._files_digest(MINIMAL) == before  # the same bytes give the same key
    for rel in ("sitebuild/validate/__init__.py", "sitebuild/dataset.py", "sitebuild/yamlsafe.py"):
        path = code_copy / rel
        original = path.read_bytes()
        path.write_bytes(original + b"\n# a change to the code\n")
        assert dataset._files_digest(MINIMAL) != before, f"a change to {rel} kept the cache key"
        path.write_bytes(original)
        assert dataset._files_digest(MINIMAL) == before


def test_the_key_still_covers_the_data_and_schema(tmp_path, code_copy):
    data = tmp_path / "data"
    shutil.copytree(MINIMAL, data)
    before = dataset._files_digest(str(data))
    with open(data / "materials.yaml", "a", encoding="utf-8") as fh:
        fh.write("# edited\n")
    after_data = dataset._files_digest(str(data))
    assert after_data != before
    shutil.copytree(os.path.join(ROOT, "data", "schema"), data / "schema")  # the folder's own schemas
    own_schema = dataset._files_digest(str(data))
    assert own_schema == after_data  # the same schema bytes as the project's, which it used before
    schema = data / "schema" / "materials.schema.json"
    schema.write_text(schema.read_text(encoding="utf-8") + "\n", encoding="utf-8")
    assert dataset._files_digest(str(data)) not in (before, after_data)


def test_the_key_covers_the_project_schemas_a_folder_without_its_own_uses(tmp_path, code_copy, monkeypatch):
    assert not os.path.isdir(os.path.join(MINIMAL, "schema"))  # validated against data/schema
    project_data = tmp_path / "project-data"
    shutil.copytree(os.path.join(ROOT, "data", "schema"), project_data / "schema")
    monkeypatch.setattr(dataset, "PROJECT_DATA", str(project_data))
    before = dataset._files_digest(MINIMAL)
    schema = project_data / "schema" / "half_reactions.schema.json"
    schema.write_text(schema.read_text(encoding="utf-8") + "\n", encoding="utf-8")
    assert dataset._files_digest(MINIMAL) != before


def test_a_bundle_cached_by_old_code_is_not_reused(code_copy):
    # a cache entry at the current key is used as it is (that is what the cache is for) ...
    key = dataset._files_digest(MINIMAL)
    os.makedirs(dataset.CACHE_DIR)
    stale = os.path.join(dataset.CACHE_DIR, f"dataset-{key}.json")
    with open(stale, "w", encoding="utf-8") as fh:
        json.dump({"version": "made-by-old-code"}, fh)
    assert dataset.load_project_bundle(MINIMAL)["version"] == "made-by-old-code"
    # ... but after an edit to the validator the data is validated and bundled again
    with open(code_copy / "sitebuild" / "validate" / "__init__.py", "a", encoding="utf-8") as fh:
        fh.write("\n# a new check\n")
    bundle = dataset.load_project_bundle(MINIMAL)
    assert bundle["version"] != "made-by-old-code"
    assert bundle["version"] == dataset.load_bundle(MINIMAL)["version"]
    assert os.path.exists(os.path.join(dataset.CACHE_DIR, f"dataset-{dataset._files_digest(MINIMAL)}.json"))
