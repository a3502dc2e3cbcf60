"""What the build ships: the calc wheel (pip wheel --no-deps, reproducible, cached) and the
theme files left out of the site because it never loads them (fewer bytes for every visitor's
offline copy).

These run the build steps on their own (no mkdocs build); the built site is checked in
tests/browser/test_skeleton_browser.py and the search itself in the browser tests.
"""

import hashlib
import json
import os
import subprocess
import zipfile

import pytest

from sitebuild import hooks, offline
from sitebuild.dataset import load_project_bundle


@pytest.fixture(scope="module")
def bundle():
    return load_project_bundle()


def _sha(path):
    with open(path, "rb") as fh:
        return hashlib.sha256(fh.read()).hexdigest()


def test_wheel_is_built_by_pip_reproducibly_and_holds_calc_and_the_dataset(bundle, tmp_path, monkeypatch):
    monkeypatch.setattr(hooks, "WHEEL_CACHE", str(tmp_path / "cache-1"))
    name = hooks.build_wheel(bundle, str(tmp_path / "out-1"))
    first = tmp_path / "out-1" / name
    # A second build from an empty cache gives the same bytes (fixed member dates).
    monkeypatch.setattr(hooks, "WHEEL_CACHE", str(tmp_path / "cache-2"))
    hooks.build_wheel(bundle, str(tmp_path / "out-2"))
    assert _sha(first) == _sha(tmp_path / "out-2" / name)
    with zipfile.ZipFile(first) as zf:
        names = set(zf.namelist())
        assert {"calc/api.py", "calc/cell.py", "calc/joint.py", "calc/dataset.json"} <= names
        assert not any("__pycache__" in n or n.endswith(".pyc") for n in names)
        # every module of calc ships, those of its sub-packages too (calc/field/...)
        root = os.path.dirname(os.path.dirname(os.path.abspath(__file__)))
        sources = {os.path.relpath(os.path.join(d, f), root).replace(os.sep, "/")
                   for d, _, fs in os.walk(os.path.join(root, "calc")) if "__pycache__" not in d
                   for f in fs if f.endswith(".py")}
        assert sources <= names, sorted(sources - names)
        assert json.loads(zf.read("calc/dataset.json"))["version"] == bundle["version"]
        wheel_meta = zf.read(f"{hooks.WHEEL_NAME}-{hooks.WHEEL_VERSION}.dist-info/WHEEL").decode()
        assert "Root-Is-Purelib: true" in wheel_meta and "Tag: py3-none-any" in wheel_meta


def test_unchanged_wheel_comes_from_the_cache_without_running_pip(bundle, tmp_path, monkeypatch):
    monkeypatch.setattr(hooks, "WHEEL_CACHE", str(tmp_path / "cache"))
    name = hooks.build_wheel(bundle, str(tmp_path / "a"))

    def no_pip(*args, **kwargs):
        raise AssertionError("pip ran although calc and the data were unchanged")

    monkeypatch.setattr(subprocess, "run", no_pip)
    assert hooks.build_wheel(bundle, str(tmp_path / "b")) == name
    assert _sha(tmp_path / "a" / name) == _sha(tmp_path / "b" / name)
    # Other data is another wheel: the cache key covers the dataset's bytes.
    other = dict(bundle, version="0" * 12)
    with pytest.raises(AssertionError, match="pip ran"):
        hooks.build_wheel(other, str(tmp_path / "c"))


def test_a_failing_pip_is_a_build_error_not_a_traceback(bundle, tmp_path, monkeypatch):
    monkeypatch.setattr(hooks, "WHEEL_CACHE", str(tmp_path / "cache"))

    def failing(*args, **kwargs):
        return subprocess.CompletedProcess(args, 1, "", "error: no setuptools here")

    monkeypatch.setattr(subprocess, "run", failing)
    with pytest.raises(hooks.PluginError, match="building the calc wheel failed"):
        hooks.build_wheel(bundle, str(tmp_path / "out"))
    assert not os.path.exists(tmp_path / "cache") or not any(
        f.endswith(".whl") for _, _, fs in os.walk(tmp_path / "cache") for f in fs)


def _fake_site(root, langs):
    files = [
        "index.html",
        "assets/javascripts/bundle.abc.min.js", "assets/javascripts/bundle.abc.min.js.map",
        "assets/javascripts/workers/search.abc.min.js", "assets/javascripts/workers/search.abc.min.js.map",
        "assets/stylesheets/main.abc.min.css", "assets/stylesheets/main.abc.min.css.map",
        "assets/javascripts/lunr/tinyseg.js", "assets/javascripts/lunr/wordcut.js",
        "assets/javascripts/lunr/min/lunr.de.min.js", "assets/javascripts/lunr/min/lunr.ja.min.js",
        "assets/javascripts/lunr/min/lunr.multi.min.js", "assets/javascripts/lunr/min/lunr.stemmer.support.min.js",
        "assets/js/couplewise.mjs", "assets/data/dataset.json",
    ]
    for rel in files:
        path = root / rel
        path.parent.mkdir(parents=True, exist_ok=True)
        path.write_text("x")
    (root / "search").mkdir()
    (root / "search" / "search_index.json").write_text(json.dumps({"config": {"lang": langs}, "docs": []}))
    return files


def test_english_only_site_drops_source_maps_and_every_search_language_file(tmp_path):
    _fake_site(tmp_path, ["en"])
    removed, _ = offline.prune_unused_theme_files(str(tmp_path))
    left = set(offline.site_files(str(tmp_path)))
    assert removed == 9
    assert not any(f.endswith(".map") for f in left)
    assert not any(f.startswith("assets/javascripts/lunr") for f in left)
    assert not (tmp_path / "assets" / "javascripts" / "lunr").exists()
    # what the site loads stays
    assert {"index.html", "assets/javascripts/bundle.abc.min.js", "assets/javascripts/workers/search.abc.min.js",
            "assets/stylesheets/main.abc.min.css", "assets/js/couplewise.mjs", "assets/data/dataset.json",
            "search/search_index.json"} <= left


def test_other_search_languages_keep_the_files_their_search_loads(tmp_path):
    # mkdocs-material's search worker: lunr.<lang>.min.js per non-English language, the stemmer
    # support and lunr.multi with them, tinyseg.js for Japanese (common practice of the theme's
    # worker, read in its search worker script).
    _fake_site(tmp_path, ["en", "ja"])
    offline.prune_unused_theme_files(str(tmp_path))
    left = set(offline.site_files(str(tmp_path)))
    assert {"assets/javascripts/lunr/tinyseg.js", "assets/javascripts/lunr/min/lunr.ja.min.js",
            "assets/javascripts/lunr/min/lunr.multi.min.js",
            "assets/javascripts/lunr/min/lunr.stemmer.support.min.js"} <= left
    assert "assets/javascripts/lunr/min/lunr.de.min.js" not in left
    assert "assets/javascripts/lunr/wordcut.js" not in left
    assert not any(f.endswith(".map") for f in left)
