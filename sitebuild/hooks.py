"""mkdocs hooks: validate and bundle the data, generate the reference pages, stage the runtime.

Wired in ``mkdocs.yml`` (``hooks: [sitebuild/hooks.py]``). What happens on a build:

1. ``on_config``: the YAML dataset is read strictly, validated (every problem listed, the build
   stops on any) and bundled with its content hash as the version.
2. ``on_files``: generated reference pages, ``assets/data/dataset.json`` and
   ``assets/data/spec.json`` (calc's input bounds and each calculator's opening request) join
   the site.
3. ``on_page_markdown``: ``<!-- cw:NAME -->`` markers in hand-written pages are replaced; an
   unknown marker fails the build.
4. ``on_post_build``: the five Pyodide runtime files are copied from ``node_modules/pyodide``
   and a pure-Python wheel of calc (with the same dataset inside) is written, byte-for-byte
   reproducible; ``assets/runtime.json`` tells the page where they are. Two start-up aids
   made under Node.js join them: the standard library precompiled to bytecode and a memory
   snapshot with calc imported (both cached in ``node_modules/.cache``); and the calculators'
   opening answers are computed under CPython (``assets/data/precomputed.json``). KaTeX, which
   typesets the formulas of the pages, is copied from ``node_modules/katex`` into ``katex/``
   (``sitebuild/mathstage.py``).
"""

import datetime
import hashlib
import json
import os
import re
import shutil
import subprocess
import sys
import tempfile

from mkdocs.exceptions import PluginError
from mkdocs.structure.files import File

HERE = os.path.dirname(os.path.abspath(__file__))
ROOT = os.path.dirname(HERE)
if ROOT not in sys.path:  # hooks are loaded by path; make the project packages importable
    sys.path.insert(0, ROOT)

from sitebuild.dataset import DataProblems, load_project_bundle  # noqa: E402

RUNTIME_FILES = ("pyodide.mjs", "pyodide.asm.mjs", "pyodide.asm.wasm", "python_stdlib.zip", "pyodide-lock.json")
RUNTIME_SRC = os.path.join(ROOT, "node_modules", "pyodide")
MARKER_RE = re.compile(r"<!--\s*cw:([a-z0-9-]+)\s*-->")

_state = {}


def _build_id():
    return os.environ.get("COUPLEWISE_BUILD") or datetime.datetime.now(datetime.timezone.utc).strftime("%Y-%m-%dT%H:%MZ")


def on_config(config, **kwargs):
    data_dir = os.environ.get("COUPLEWISE_DATA_DIR") or None
    try:
        bundle = load_project_bundle(data_dir)
    except DataProblems as exc:
        raise PluginError("the dataset has problems; the site was not built:\n" + "\n".join(exc.problems)) from None
    _state["bundle"] = bundle
    _state["build"] = _build_id()
    pkg = os.path.join(RUNTIME_SRC, "package.json")
    if not os.path.exists(pkg):
        raise PluginError("the Pyodide runtime is missing from node_modules/pyodide: run 'make setup' (npm ci)")
    with open(pkg, encoding="utf-8") as fh:
        _state["pyodide_version"] = json.load(fh)["version"]
    config.extra["data_version"] = bundle["version"]
    config.extra["data_date"] = bundle["date"]
    config.extra["build"] = _state["build"]
    config.extra["pyodide_version"] = _state["pyodide_version"]
    from sitebuild.mathstage import StageError, katex_version

    try:
        _state["katex_version"] = katex_version()
    except StageError as exc:
        raise PluginError(str(exc)) from None
    return config


def on_files(files, config, **kwargs):
    bundle = _state["bundle"]
    from sitebuild.pages import generate_pages

    for path, text in generate_pages(bundle).items():
        if files.get_file_from_path(path) is not None:
            raise PluginError(f"generated page {path} would overwrite a hand-written page")
        files.append(File.generated(config, path, content=text))
    from sitebuild.charts import galvanic_series_svg

    files.append(File.generated(config, "reference/galvanic-series.svg", content=galvanic_series_svg(bundle)))
    data = json.dumps(bundle, ensure_ascii=False, separators=(",", ":"), allow_nan=False)
    files.append(File.generated(config, "assets/data/dataset.json", content=data))
    from calc.spec import page_spec  # bounds and opening requests, written once in calc

    spec = json.dumps(page_spec(), ensure_ascii=False, separators=(",", ":"), allow_nan=False)
    files.append(File.generated(config, "assets/data/spec.json", content=spec))
    return files


def _markers():
    bundle = _state["bundle"]
    return {
        "data-version": f"`{bundle['version']}` ({bundle['date']})",
        "build": _state["build"],
        "pyodide-version": _state["pyodide_version"],
        "katex-version": _state["katex_version"],
        "count-half-reactions": str(len(bundle["half_reactions"])),
        "count-materials": str(len(bundle["materials"])),
        "count-electrodes": str(len(bundle["reference_electrodes"])),
        "count-environments": str(len(bundle["environments"])),
    }


def on_page_markdown(markdown, page, config, files, **kwargs):
    known = _markers()

    def sub(m):
        name = m.group(1)
        if name not in known:
            raise PluginError(f"{page.file.src_path}: unknown marker <!-- cw:{name} -->; known: {', '.join(sorted(known))}")
        return known[name]

    return MARKER_RE.sub(sub, markdown)


WHEEL_NAME, WHEEL_VERSION = "couplewise_calc", "0.1.0"
#: member dates of the wheel (SOURCE_DATE_EPOCH, honoured by bdist_wheel): same calc and data, same bytes
WHEEL_EPOCH = "1577836800"  # 2020-01-01T00:00:00Z
WHEEL_CACHE = os.path.join(ROOT, ".cache", "wheels")


def _wheel_key(data):
    """Hash of what goes into the wheel: calc's sources, the dataset bytes, this recipe [hex]."""
    h = hashlib.sha256(b"couplewise-calc-wheel 3\0" + WHEEL_VERSION.encode() + b"\0" + data)
    calc_dir = os.path.join(ROOT, "calc")
    for dirpath, dirnames, filenames in os.walk(calc_dir):
        dirnames[:] = sorted(d for d in dirnames if d != "__pycache__")
        for name in sorted(f for f in filenames if f.endswith(".py")):
            path = os.path.join(dirpath, name)
            with open(path, "rb") as fh:
                h.update(os.path.relpath(path, calc_dir).encode() + b"\0" + fh.read())
    return h.hexdigest()[:24]


def build_wheel(bundle, out_dir):
    """Build the pure-Python calc wheel (dataset inside) into ``out_dir``; returns its file name.

    Built with ``pip wheel --no-deps`` from a temporary project holding calc and the dataset,
    with fixed member dates (reproducible); the result is cached under ``.cache/wheels`` by a hash
    of calc's sources and the dataset, so an unchanged rebuild copies it instead of running pip
    (which took most of an unchanged rebuild's time; see docs/performance.md).
    """
    data = json.dumps(bundle, ensure_ascii=False, separators=(",", ":"), allow_nan=False).encode("utf-8")
    name = f"{WHEEL_NAME}-{WHEEL_VERSION}-py3-none-any.whl"
    cached = os.path.join(WHEEL_CACHE, _wheel_key(data), name)
    if not os.path.isfile(cached):
        with tempfile.TemporaryDirectory() as tmp:
            proj, dist = os.path.join(tmp, "project"), os.path.join(tmp, "dist")
            shutil.copytree(os.path.join(ROOT, "calc"), os.path.join(proj, "calc"),
                            ignore=shutil.ignore_patterns("__pycache__", "*.pyc", "dataset.json"))
            with open(os.path.join(proj, "calc", "dataset.json"), "wb") as fh:
                fh.write(data)
            with open(os.path.join(proj, "pyproject.toml"), "w", encoding="utf-8") as fh:
                fh.write(
                    '[build-system]\nrequires = ["setuptools>=65"]\nbuild-backend = "setuptools.build_meta"\n'
                    f'[project]\nname = "couplewise-calc"\nversion = "{WHEEL_VERSION}"\nrequires-python = ">=3.11"\n'
                    '[tool.setuptools.packages.find]\ninclude = ["calc", "calc.*"]\n'
                    '[tool.setuptools.package-data]\ncalc = ["dataset.json"]\n')
            proc = subprocess.run(
                [sys.executable, "-m", "pip", "wheel", "--no-deps", "--no-build-isolation", "--quiet",
                 "--disable-pip-version-check", "-w", dist, proj],
                capture_output=True, text=True, env=dict(os.environ, SOURCE_DATE_EPOCH=WHEEL_EPOCH))
            if proc.returncode != 0:
                raise PluginError("building the calc wheel failed:\n" + proc.stderr[-2000:])
            wheels = sorted(f for f in os.listdir(dist) if f.endswith(".whl"))
            if wheels != [name]:
                raise PluginError(f"pip wheel made {wheels}, expected [{name}]")
            os.makedirs(os.path.dirname(cached), exist_ok=True)
            shutil.copyfile(os.path.join(dist, name), cached + ".tmp")
            os.replace(cached + ".tmp", cached)
    os.makedirs(out_dir, exist_ok=True)
    shutil.copyfile(cached, os.path.join(out_dir, name))
    return name


def stage_pyc_stdlib(rt_dir):
    """Copy the standard library precompiled to bytecode (made once per runtime version under
    Node.js by build/make_pyc_stdlib.mjs, cached in node_modules/.cache) into the site.

    Returns its file name, or None when Node.js is not available (the page then starts with the
    stock source-only standard library: slower, same answers).
    """
    cache_dir = os.path.join(ROOT, "node_modules", ".cache", "couplewise")
    cached = os.path.join(cache_dir, f"python_stdlib_pyc-{_state['pyodide_version']}.zip")
    if not os.path.exists(cached):
        node = shutil.which("node")
        if not node:
            return None
        os.makedirs(cache_dir, exist_ok=True)
        tmp = cached + ".tmp"
        proc = subprocess.run([node, os.path.join(ROOT, "build", "make_pyc_stdlib.mjs"), RUNTIME_SRC, tmp],
                              capture_output=True, text=True)
        if proc.returncode != 0:
            raise PluginError("precompiling the standard library failed:\n" + proc.stderr[-2000:])
        os.replace(tmp, cached)
    name = "python_stdlib_pyc.zip"
    shutil.copy2(cached, os.path.join(rt_dir, name))
    return name


SNAPSHOT_KEEP = 4  # snapshots kept in the cache (each ≈ 5.5 MB): the newest few datasets


def _wheel_digest(path):
    """SHA-256 over the names and bytes of a wheel's members (zip timestamps do not count)."""
    import hashlib
    import zipfile

    h = hashlib.sha256()
    with zipfile.ZipFile(path) as zf:
        for name in sorted(zf.namelist()):
            h.update(name.encode("utf-8") + b"\0" + hashlib.sha256(zf.read(name)).digest())
    return h.hexdigest()


def stage_snapshot(rt_dir, stdlib_name, wheel_path, data_version):
    """Stage a Pyodide memory snapshot with calc imported (made under Node.js by
    build/make_snapshot.mjs, cached in node_modules/.cache by what it depends on).

    It pairs with the bytecode standard library ``stdlib_name`` (already in ``rt_dir``) and the
    calc wheel at ``wheel_path``. Returns its file name, or None when there is no bytecode
    standard library, no Node.js, or ``COUPLEWISE_SNAPSHOT=0`` (the page then starts from the
    bytecode or stock standard library: slower, same answers).
    """
    import hashlib

    if not stdlib_name or os.environ.get("COUPLEWISE_SNAPSHOT", "1") == "0":
        return None
    node = shutil.which("node")
    if not node:
        return None
    script = os.path.join(ROOT, "build", "make_snapshot.mjs")
    stdlib = os.path.join(rt_dir, stdlib_name)
    key = hashlib.sha256()
    for part in (_state["pyodide_version"], _wheel_digest(wheel_path)):
        key.update(part.encode("utf-8") + b"\0")
    for path in (stdlib, script, os.path.join(RUNTIME_SRC, "pyodide.asm.wasm")):
        with open(path, "rb") as fh:
            key.update(hashlib.sha256(fh.read()).digest())
    name = f"snapshot-{key.hexdigest()[:16]}.bin.gz"
    cache_dir = os.path.join(ROOT, "node_modules", ".cache", "couplewise")
    cached = os.path.join(cache_dir, name)
    if not os.path.exists(cached):
        os.makedirs(cache_dir, exist_ok=True)
        tmp = cached + ".tmp"
        proc = subprocess.run([node, script, RUNTIME_SRC, stdlib, wheel_path, data_version, tmp],
                              capture_output=True, text=True)
        if proc.returncode != 0:
            raise PluginError("making the runtime memory snapshot failed (set COUPLEWISE_SNAPSHOT=0 to build "
                              "without it):\n" + (proc.stderr or proc.stdout)[-2000:])
        os.replace(tmp, cached)
        old = sorted((f for f in os.listdir(cache_dir) if f.startswith("snapshot-") and f.endswith(".bin.gz")),
                     key=lambda f: os.path.getmtime(os.path.join(cache_dir, f)), reverse=True)
        for stale in old[SNAPSHOT_KEEP:]:
            os.remove(os.path.join(cache_dir, stale))
    else:
        os.utime(cached)  # recently used: kept by the pruning above
    shutil.copy2(cached, os.path.join(rt_dir, name))
    return name


def on_post_build(config, **kwargs):
    site = config.site_dir
    bundle = _state["bundle"]
    rt_dir = os.path.join(site, "pyodide")
    os.makedirs(rt_dir, exist_ok=True)
    for name in RUNTIME_FILES:
        src = os.path.join(RUNTIME_SRC, name)
        if not os.path.exists(src):
            raise PluginError(f"runtime file {name} is missing from node_modules/pyodide: run 'make setup'")
        shutil.copy2(src, os.path.join(rt_dir, name))
    stdlib_pyc = stage_pyc_stdlib(rt_dir)
    wheel_dir = os.path.join(site, "wheels", bundle["version"])
    wheel = build_wheel(bundle, wheel_dir)
    snapshot = stage_snapshot(rt_dir, stdlib_pyc, os.path.join(wheel_dir, wheel), bundle["version"])
    runtime = {
        "pyodide_version": _state["pyodide_version"],
        "indexURL": "pyodide/",
        "stdLibURL": f"pyodide/{stdlib_pyc}" if stdlib_pyc else None,
        "snapshot": f"pyodide/{snapshot}" if snapshot else None,
        "wheel": f"wheels/{bundle['version']}/{wheel}",
        "data_version": bundle["version"],
        "data_date": bundle["date"],
        "build": _state["build"],
    }
    with open(os.path.join(site, "assets", "runtime.json"), "w", encoding="utf-8") as fh:
        json.dump(runtime, fh, indent=1)
    from sitebuild.precompute import write_precomputed

    write_precomputed(site, bundle)  # the calculators' opening answers, shown while the runtime starts
    from sitebuild.mathstage import StageError, stage_katex

    try:  # the typesetter of the pages' formulas, served from the site itself
        stage_katex(site)
    except StageError as exc:
        raise PluginError(str(exc)) from None
    from sitebuild.csp import CSPError, apply_csp

    try:  # every page gets the Content-Security-Policy; csp.txt holds it for a server's header
        apply_csp(site)
    except CSPError as exc:
        raise PluginError(f"Content-Security-Policy: {exc}") from None
    from sitebuild.offline import write_offline_support

    write_offline_support(site)  # last: sw.js hashes every other file of the site
