"""The benchmark code runs (cheaply, untimed): bench/ imports, the bytes benchmark reads the
built site's service-worker list, and the bare page is a real page of the benchmark."""

import os

import pytest

pytestmark = pytest.mark.browser


def test_bench_modules_import():
    import bench.__main__  # noqa: F401
    import bench._timed_build  # noqa: F401
    from bench import build_scaling, bytes, calcspeed, common, interaction, startup, synth  # noqa: F401

    assert set(bench.__main__.ALL) == {"startup", "latency", "calc", "bytes", "build"}


def test_bytes_benchmark_on_the_built_site(built_site):
    from bench import bytes as bytes_bench

    files = bytes_bench.precache_files(built_site)
    assert "index.html" in files and "assets/runtime.json" in files
    r = bytes_bench.measure(built_site)
    assert r["total"]["files"] == len(files)
    # every precached runtime file is under pyodide/, and the five stock files are all there
    assert r["groups"]["runtime, stock"]["files"] == len(bytes_bench.STOCK)
    for g in r["groups"].values():
        assert 0 < g["gzip"] <= g["raw"] + 64  # gzip never meaningfully larger than raw
    assert abs(sum(g["raw"] for g in r["groups"].values())
               - sum(os.path.getsize(os.path.join(built_site, f)) for f in files)) == 0


def test_bench_pages_are_not_shipped(built_site):
    from bench.common import BENCH_PAGES

    for name in os.listdir(BENCH_PAGES):
        assert not os.path.exists(os.path.join(built_site, name)), name
