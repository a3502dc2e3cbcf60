"""Run ``mkdocs build --strict -d DEST`` in this process with timers around its phases.

``python -m bench._timed_build DEST`` builds like ``mkdocs build --strict -d DEST`` and then
prints one line ``BENCH-PHASES {json}``: wall seconds per phase (our hooks' steps and the
mkdocs steps they sit between) and the CPU seconds of the whole build (this process and its
children: pip for the wheel, Node.js for the runtime files).
"""

import functools
import json
import os
import resource
import sys
import time

HERE = os.path.dirname(os.path.abspath(__file__))
ROOT = os.path.dirname(HERE)
sys.path.insert(0, ROOT)

PHASES = {}


def _timed(name, fn):
    @functools.wraps(fn)
    def wrapper(*args, **kwargs):
        t0 = time.perf_counter()
        try:
            return fn(*args, **kwargs)
        finally:
            PHASES[name] = PHASES.get(name, 0.0) + time.perf_counter() - t0
    return wrapper


def _patch(module, attr, name):
    setattr(module, attr, _timed(name, getattr(module, attr)))


def main(dest):
    import mkdocs.commands.build as mb
    import sitebuild.dataset
    import sitebuild.offline
    import sitebuild.pages
    import sitebuild.precompute

    _patch(sitebuild.dataset, "load_project_bundle", "data: read, validate, bundle (cached when unchanged)")
    _patch(sitebuild.pages, "generate_pages", "reference pages: generate markdown")
    _patch(sitebuild.precompute, "write_precomputed", "precomputed answers (CPython)")
    for attr in ("write_offline_support", "write_service_worker"):
        if hasattr(sitebuild.offline, attr):
            _patch(sitebuild.offline, attr, "service worker: hash and list files")
    _patch(mb, "_populate_page", "mkdocs: markdown to HTML, all pages")
    _patch(mb, "_build_page", "mkdocs: templates and search index, all pages")

    hooks_loaded = {}
    orig_load = None
    try:
        from mkdocs.config import config_options

        orig_load = config_options.Hooks._load_hook

        def load_hook(self, name, path):
            mod = orig_load(self, name, path)
            if not hooks_loaded:
                hooks_loaded["m"] = mod
                for attr, label in (("build_wheel", "calc wheel (pip wheel --no-deps, cached)"),
                                    ("stage_pyc_stdlib", "runtime: bytecode stdlib (cached)"),
                                    ("stage_snapshot", "runtime: memory snapshot (cached per wheel)")):
                    if hasattr(mod, attr):
                        _patch(mod, attr, label)
            return mod

        config_options.Hooks._load_hook = load_hook
    except (ImportError, AttributeError):  # pragma: no cover - another mkdocs version
        pass

    from mkdocs.__main__ import cli

    t0, c0 = time.perf_counter(), _cpu()
    try:
        cli.main(["build", "--strict", "-d", dest], standalone_mode=False)
    finally:
        PHASES["total"] = time.perf_counter() - t0
        PHASES["cpu (process and children)"] = _cpu() - c0
        print("BENCH-PHASES " + json.dumps(PHASES), flush=True)


def _cpu():
    s, c = resource.getrusage(resource.RUSAGE_SELF), resource.getrusage(resource.RUSAGE_CHILDREN)
    return s.ru_utime + s.ru_stime + c.ru_utime + c.ru_stime


if __name__ == "__main__":
    main(sys.argv[1])
