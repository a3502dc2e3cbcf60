"""Couplewise benchmarks: ``python -m bench [SITE] [options]`` (``make bench`` builds first).

Runs, in one go and side by side, each benchmark printing its figures and its ratio last:

1. time to first result: couple calculator vs a bare Pyodide page (cold, warm, restarted);
2. interaction latency: input change to new result painted (median, p95);
3. matrix: every pair of materials, CPython vs Pyodide (raw and in the page);
4. throughput: electrode potentials per second, CPython vs Pyodide;
5. bytes the service worker precaches, runtime vs our own files;
6. build scaling: shipped dataset vs a synthetic one ten times larger.

Absolute times depend on the machine and its load; compare the ratios, which are measured in
the same run. Results can be saved as JSON (``--json``) for docs/performance.md.
"""

import argparse
import json
import os
import sys
import time

from .common import ROOT, Server, bench_site, heading, line, machine, require_chromium

ALL = ("startup", "latency", "calc", "bytes", "build")


def main(argv=None):
    p = argparse.ArgumentParser(prog="python -m bench", description=__doc__.splitlines()[0])
    p.add_argument("site", nargs="?", default=os.path.join(ROOT, "site"), help="the built site (default: site/)")
    p.add_argument("--runs", type=int, default=5, help="alternating start-up runs (default 5, at least 5 for the record)")
    p.add_argument("--changes", type=int, default=50, help="input changes per page for the latency (default 50)")
    p.add_argument("--electrodes", type=int, default=1000, help="electrode requests per throughput pass (default 1000)")
    p.add_argument("--build-repeats", type=int, default=2, help="unchanged rebuilds per dataset (default 2)")
    p.add_argument("--factor", type=int, default=10, help="size of the synthetic dataset (default 10x)")
    p.add_argument("--tablet", action="store_true", help="start-up also as a tablet: one CPU (taskset), CPU throttling 4x")
    p.add_argument("--only", default=",".join(ALL), help="comma-separated subset of: " + ", ".join(ALL))
    p.add_argument("--json", dest="json_out", help="also write every figure to this JSON file")
    ns = p.parse_args(argv)
    only = [x.strip() for x in ns.only.split(",") if x.strip()]
    unknown = [x for x in only if x not in ALL]
    if unknown:
        p.error(f"unknown benchmark(s) {unknown}; choose from {', '.join(ALL)}")

    info = machine()
    heading("Couplewise benchmarks")
    line(f"{info['date']}; {info['nproc']} CPUs ({info['cpu']}); {info['chromium']}; "
         f"load average {info['load_1min']:.2f}" if info["load_1min"] is not None else info["date"])
    line(f"site: {os.path.abspath(ns.site)}")
    results = {"machine": info}
    if any(x in only for x in ("startup", "latency", "calc")):
        require_chromium()
    site = os.path.abspath(ns.site)
    if any(x in only for x in ("startup", "latency", "calc", "bytes")):
        if not os.path.isfile(os.path.join(site, "assets", "runtime.json")):
            p.error(f"no built site in {site} (run 'make site' first)")
        with open(os.path.join(site, "assets", "runtime.json"), encoding="utf-8") as fh:
            rt = json.load(fh)
        line(f"runtime: Pyodide {rt.get('pyodide_version')}; bytecode stdlib: {'yes' if rt.get('stdLibURL') else 'no'}; "
             f"snapshot: {'yes' if rt.get('snapshot') else 'no'}; data version {rt.get('data_version')}")
    t0 = time.perf_counter()
    if any(x in only for x in ("startup", "latency", "calc")):
        from . import calcspeed, interaction, startup

        with bench_site(site) as copy:
            srv = Server(copy)
            try:
                if "startup" in only:
                    results["startup"] = startup.run(srv, ns.runs)
                    if ns.tablet:
                        results["startup_tablet"] = startup.run(srv, ns.runs, tablet=True)
                if "latency" in only:
                    results["latency"] = interaction.run(srv, ns.changes)
                if "calc" in only:
                    results.update(calcspeed.run(srv, copy, ns.electrodes))
            finally:
                srv.stop()
    if "bytes" in only:
        from . import bytes as bytes_bench

        results["bytes"] = bytes_bench.run(site)
    if "build" in only:
        from . import build_scaling

        results["build"] = build_scaling.run(ns.factor, ns.build_repeats)
    print(f"\n(benchmarks took {time.perf_counter() - t0:.0f} s)")
    if ns.json_out:
        with open(ns.json_out, "w", encoding="utf-8") as fh:
            json.dump(results, fh, indent=1, default=str)
    return 0


if __name__ == "__main__":
    sys.exit(main())
