"""1. Time to first result: our couple calculator against a bare Pyodide page, same server, same run.

Each run uses fresh chromium profiles (one for ours, one for the bare page; the order
alternates between runs) and visits three times:

- cold: fresh profile, nothing cached;
- warm: a second visit in the same browser session (our service worker now controls the page);
- restarted: the browser closed and started again on the same profile (a returning user).

For ours two moments are taken from navigation start: the first computed number on screen
(the build-time answer when the page's request is the precomputed one) and the runtime's own
answer (performance mark ``cw-result-painted``). The bare page (bench/pages/bench-bare.html)
loads the same Pyodide files with Pyodide's default start and runs ``1 + 1``.
"""

import os
import shutil
import tempfile

from .common import (Guard, fr, fs, heading, launch_persistent, line, median, ratio, tablet_executable)

PAGE = "calculators/couple/"
BARE = "bench-bare.html"
BARE_WORKER = "bench-bare-worker.html"  # tablet-class run: the bare start in a worker, as ours
THROTTLE = 4  # tablet-class run: DevTools CPU throttling rate, set on every page before it loads
# A fixed amount of JavaScript work, timed in the page and in our worker: does the throttle reach it?
LOOP = "(() => { const t = performance.now(); let x = 0; for (let i = 0; i < 2e7; i++) x += i % 7; return performance.now() - t; })()"
VISITS = ("cold", "warm", "restarted")

# Records when a number first appears (DOM mutation, then the next animation frame).
OBSERVER = """
(() => {
  const rec = { first: null, firstFrame: null, early: false };
  window.__cwBench = rec;
  const look = () => {
    if (rec.first !== null) return;
    const el = document.querySelector(".cw-big-value");
    if (!el || !el.textContent.trim()) return;
    rec.first = performance.now();
    rec.early = !!el.closest(".cw-early");
    requestAnimationFrame(() => { rec.firstFrame = performance.now(); });
    obs.disconnect();
  };
  const obs = new MutationObserver(look);
  obs.observe(document, { childList: true, subtree: true, characterData: true });
})();
"""

READ = """() => {
  const rec = window.__cwBench || {};
  const mark = (n) => { const e = performance.getEntriesByName(n); return e.length ? e[0].startTime : null; };
  return { first: rec.firstFrame ?? rec.first, early: !!rec.early, final: mark("cw-result-painted"),
           earlyMark: mark("cw-early-painted"), controlled: !!(navigator.serviceWorker && navigator.serviceWorker.controller) };
}"""


def _throttled(ctx, page, rate):
    cdp = ctx.new_cdp_session(page)
    cdp.send("Emulation.setCPUThrottlingRate", {"rate": rate})
    return cdp


def _reach(page, cdp):
    """JavaScript work timed in the page and in our worker, throttled and then not: {where: ratio}."""
    worker = next((w for w in page.workers if w.url.endswith("calc-worker.mjs")), None)
    if worker is None:
        return None
    slow = {"page": page.evaluate(LOOP), "worker": worker.evaluate(LOOP)}
    cdp.send("Emulation.setCPUThrottlingRate", {"rate": 1})
    fast = {"page": page.evaluate(LOOP), "worker": worker.evaluate(LOOP)}
    return {k: slow[k] / fast[k] for k in slow if fast[k]}


def _visit(ctx, url, timeout_ms=240_000, throttle=None, probe=False):
    page = ctx.new_page()
    cdp = _throttled(ctx, page, throttle) if throttle else None
    page.goto(url)
    page.wait_for_function("() => performance.getEntriesByName('cw-result-painted').length > 0", timeout=timeout_ms)
    page.wait_for_function("() => window.__cwBench && window.__cwBench.firstFrame !== null", timeout=timeout_ms)
    rec = page.evaluate(READ)
    rec["path"] = None
    for w in page.workers:
        if w.url.endswith("calc-worker.mjs"):
            start = w.evaluate("self.cwStart || null")
            rec["path"] = start and start.get("path")
            rec["worker"] = (start or {}).get("timings") or {}
    if probe and cdp is not None:
        rec["throttle_reach"] = _reach(page, cdp)
    return page, rec


def _one(pw, server, which, guard, tablet=None):
    """Cold, warm and restarted visits of one page in a fresh profile; {visit: record} in ms.
    ``tablet``: the one-CPU chromium wrapper; every page is then throttled THROTTLE times."""
    url = server.url({"ours": PAGE, "bare": BARE, "bare-worker": BARE_WORKER}[which])
    profile = tempfile.mkdtemp(prefix=f"couplewise-bench-{which}-")
    out = {}
    kw = {"throttle": THROTTLE} if tablet else {}
    try:
        ctx = launch_persistent(pw, profile, guard, OBSERVER, executable=tablet)
        page, out["cold"] = _visit(ctx, url, **kw)
        if which == "ours":  # let the service worker finish precaching and take control
            page.evaluate("navigator.serviceWorker.ready.then(() => true)")
            page.wait_for_function("() => !!navigator.serviceWorker.controller", timeout=120_000)
        page.close()
        page, out["warm"] = _visit(ctx, url, probe=which == "ours", **kw)
        page.close()
        ctx.close()
        ctx = launch_persistent(pw, profile, guard, OBSERVER, executable=tablet)
        page, out["restarted"] = _visit(ctx, url, **kw)
        ctx.close()
    finally:
        shutil.rmtree(profile, ignore_errors=True)
    return out


def run(server, runs=5, tablet=False):
    from playwright.sync_api import sync_playwright

    if tablet:
        heading(f"1b. Tablet class: one CPU (taskset -c 0), CPU throttling {THROTTLE}x on every page; "
                f"couple calculator vs bare page, bare page with its runtime in a worker (medians of {runs} rotating runs)")
    else:
        heading(f"1. Time to first result: couple calculator vs bare Pyodide page (medians of {runs} alternating runs)")
    guard = Guard()
    kinds = ("ours", "bare", "bare-worker") if tablet else ("ours", "bare")
    exe = tablet_executable() if tablet else None
    samples = {k: [] for k in kinds}
    try:
        with sync_playwright() as pw:
            for i in range(runs):
                order = kinds[i % len(kinds):] + kinds[:i % len(kinds)]
                for which in order:
                    samples[which].append(_one(pw, server, which, guard, exe))
    finally:
        if exe:
            os.remove(exe)
    guard.check()

    def med(which, visit, key):
        vals = [s[visit][key] for s in samples[which] if s[visit].get(key) is not None]
        return median(vals) / 1000 if vals else None

    res = {"runs": runs, "tablet": tablet}
    for visit in VISITS:
        res[visit] = {
            "ours_first": med("ours", visit, "first"), "ours_answer": med("ours", visit, "final"),
            "bare": med("bare", visit, "final"),
            "bare_worker": med("bare-worker", visit, "final") if tablet else None,
            "ours_early_shown": sum(1 for s in samples["ours"] if s[visit]["early"]),
            "paths": sorted({s[visit]["path"] or "none" for s in samples["ours"]}),
            "controlled": sum(1 for s in samples["ours"] if s[visit]["controlled"]),
        }
    for visit in VISITS:
        r = res[visit]
        line(f"{visit:9s} ours: first number {fs(r['ours_first'])} "
             f"({r['ours_early_shown']}/{runs} runs showed the build-time answer first), "
             f"runtime answer {fs(r['ours_answer'])} [start: {', '.join(r['paths'])}; "
             f"service worker controlled {r['controlled']}/{runs}]")
        line(f"{visit:9s} bare: {fs(r['bare'])}" + (f", bare in a worker: {fs(r['bare_worker'])}" if tablet else ""))
    for visit in VISITS:  # where the worker's time goes (ms since the worker started)
        stages = {}
        for smp in samples["ours"]:
            for k, v in (smp[visit].get("worker") or {}).items():
                stages.setdefault(k, []).append(v)
        if stages:
            line(f"{visit:9s} ours, worker stages (median ms since the worker started): "
                 + ", ".join(f"{k} {median(v):.0f}" for k, v in sorted(stages.items(), key=lambda kv: median(kv[1]))))
    reach = [s["warm"]["throttle_reach"] for s in samples["ours"] if s["warm"].get("throttle_reach")]
    if reach:
        res["throttle_reach"] = {k: median([x[k] for x in reach]) for k in reach[0]}
        line(f"throttle {THROTTLE}x, the same JavaScript loop throttled / not (median): "
             + ", ".join(f"{k} {v:.2f}x" for k, v in res["throttle_reach"].items()))
    line("all samples (s), ours runtime answer / " + " / ".join(kinds[1:]) + ":")
    for visit in VISITS:
        cols = [[round(s[visit]['final'] / 1000, 2) for s in samples[k]] for k in kinds]
        line(f"  {visit:9s} " + " / ".join(str(c) for c in cols))
    for visit in VISITS:
        r = res[visit]
        r["ratio_answer"] = ratio(r["ours_answer"], r["bare"])
        r["ratio_first"] = ratio(r["ours_first"], r["bare"])
        r["ratio_answer_bare_worker"] = ratio(r["ours_answer"], r["bare_worker"])
        r["ratio_first_bare_worker"] = ratio(r["ours_first"], r["bare_worker"])
    line("ratio ours/bare, runtime answer:  " + ", ".join(f"{v} {fr(res[v]['ratio_answer'])}" for v in VISITS))
    line("ratio ours/bare, first number:    " + ", ".join(f"{v} {fr(res[v]['ratio_first'])}" for v in VISITS))
    if tablet:
        line("ratio ours/bare in a worker, runtime answer: " + ", ".join(f"{v} {fr(res[v]['ratio_answer_bare_worker'])}" for v in VISITS))
        line("ratio ours/bare in a worker, first number:   " + ", ".join(f"{v} {fr(res[v]['ratio_first_bare_worker'])}" for v in VISITS))
    res["samples"] = samples
    return res


if __name__ == "__main__":  # pragma: no cover
    import sys

    from .common import Server, bench_site

    with bench_site(sys.argv[1] if len(sys.argv) > 1 else os.path.join(os.path.dirname(__file__), "..", "site")) as d:
        srv = Server(d)
        try:
            run(srv, int(sys.argv[2]) if len(sys.argv) > 2 else 5)
        finally:
            srv.stop()
