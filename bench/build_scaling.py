"""6. Build scaling: ``mkdocs build --strict`` with the shipped dataset and with a synthetic one
ten times larger (bench/synth.py, generated in a temporary folder, never shipped).

Both datasets are written fresh for the run with a marker in one note, so their data versions
are new, as after a maintainer's edit. Two situations are timed:

- after a data edit: the first build of each (validation, calc wheel, memory snapshot redone);
- unchanged rebuild: the next builds, alternating (the validated bundle and the snapshot are
  cached by content); the ratio of their medians is the headline.

Wall and CPU seconds (the build process and its children) are both printed: on a shared
machine the CPU time is the steadier of the two. The per-phase times say where the time goes.
Cache entries made for the benchmark's datasets are removed afterwards.
"""

import json
import os
import shutil
import subprocess
import sys
import tempfile
import time

from .common import ROOT, fr, heading, line, median
from .synth import synthesize


def timed_build(data_dir, dest):
    env = dict(os.environ, COUPLEWISE_DATA_DIR=data_dir, NO_MKDOCS_2_WARNING="1")
    t0 = time.perf_counter()
    proc = subprocess.run([sys.executable, "-m", "bench._timed_build", dest], cwd=ROOT, env=env,
                          capture_output=True, text=True)
    wall = time.perf_counter() - t0
    if proc.returncode != 0:
        raise SystemExit("bench: mkdocs build failed:\n" + (proc.stdout + proc.stderr)[-3000:])
    phases = {}
    for ln in (proc.stdout + proc.stderr).splitlines():
        if ln.startswith("BENCH-PHASES "):
            phases = json.loads(ln[len("BENCH-PHASES "):])
    phases["wall (outside)"] = wall
    return phases


def _cleanup_caches(data_dirs, sites):
    """Remove the cache entries this benchmark's datasets made (validated bundle, snapshot)."""
    from sitebuild.dataset import CACHE_DIR, _files_digest

    for d in data_dirs:
        try:
            path = os.path.join(CACHE_DIR, f"dataset-{_files_digest(d)}.json")
            if os.path.exists(path):
                os.remove(path)
        except OSError:
            pass
    snap_cache = os.path.join(ROOT, "node_modules", ".cache", "couplewise")
    for s in sites:
        try:
            with open(os.path.join(s, "assets", "runtime.json"), encoding="utf-8") as fh:
                snap = json.load(fh).get("snapshot")
            if snap:
                path = os.path.join(snap_cache, os.path.basename(snap))
                if os.path.exists(path):
                    os.remove(path)
        except (OSError, ValueError):
            pass


def _show_phases(label, ph):
    keys = [k for k in ph if k not in ("total", "cpu (process and children)", "wall (outside)")]
    line(f"{label}: total {ph.get('total', 0):.1f} s wall, {ph.get('cpu (process and children)', 0):.1f} s CPU")
    for k in sorted(keys, key=lambda k: -ph[k]):
        line(f"    {k:52s} {ph[k]:6.2f} s")


def run(factor=10, repeats=2):
    heading(f"6. Build scaling: mkdocs build, shipped dataset vs synthetic {factor}x")
    tmp = tempfile.mkdtemp(prefix="couplewise-bench-build-")
    marker = f"bench {time.strftime('%Y%m%dT%H%M%S')} {os.getpid()}"
    data = {"shipped": os.path.join(tmp, "data-1x"), f"{factor}x": os.path.join(tmp, f"data-{factor}x")}
    sites = []
    try:
        counts = {"shipped": synthesize(data["shipped"], 1, marker=marker),
                  f"{factor}x": synthesize(data[f"{factor}x"], factor, marker=marker)}
        big = f"{factor}x"
        line("records: " + ", ".join(f"{k} {counts['shipped'][k][1]} -> {counts[big][k][1]}" for k in counts["shipped"]))
        first, again = {}, {k: [] for k in data}
        for name in data:  # first build after the edit
            dest = os.path.join(tmp, f"site-{name}-0")
            first[name] = timed_build(data[name], dest)
            sites.append(dest)
        for i in range(repeats):  # unchanged rebuilds, alternating
            for name in (list(data) if i % 2 == 0 else list(data)[::-1]):
                dest = os.path.join(tmp, f"site-{name}-{i + 1}")
                again[name].append(timed_build(data[name], dest))
                shutil.rmtree(dest, ignore_errors=True)
        res = {"counts": counts, "first": first, "again": again}
        for name in data:
            _show_phases(f"{name}, first build after a data edit", first[name])
        for name in data:
            _show_phases(f"{name}, unchanged rebuild (last of {repeats})", again[name][-1])

        def med(name, key):
            return median([p.get(key) for p in again[name]])

        summary = {}
        for key, label in (("total", "wall"), ("cpu (process and children)", "CPU")):
            a, b = med("shipped", key), med(big, key)
            summary[label] = {"shipped": a, big: b, "ratio": (b / a) if a else None}
            fa, fb = first["shipped"].get(key), first[big].get(key)
            summary[label + " first"] = {"shipped": fa, big: fb, "ratio": (fb / fa) if fa else None}
        line(f"unchanged rebuild, median of {repeats}: shipped {summary['wall']['shipped']:.1f} s wall / "
             f"{summary['CPU']['shipped']:.1f} s CPU; {big} {summary['wall'][big]:.1f} s wall / {summary['CPU'][big]:.1f} s CPU")
        line(f"first build after a data edit: shipped {summary['wall first']['shipped']:.1f} s wall / "
             f"{summary['CPU first']['shipped']:.1f} s CPU; {big} {summary['wall first'][big]:.1f} s wall / "
             f"{summary['CPU first'][big]:.1f} s CPU")
        res["summary"] = summary
        line(f"ratio {big}/shipped: unchanged rebuild {fr(summary['wall']['ratio'])} wall, {fr(summary['CPU']['ratio'])} CPU; "
             f"after a data edit {fr(summary['wall first']['ratio'])} wall, {fr(summary['CPU first']['ratio'])} CPU")
        return res
    finally:
        _cleanup_caches(list(data.values()), sites)
        shutil.rmtree(tmp, ignore_errors=True)
