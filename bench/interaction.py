"""2. Interaction latency: from an input change to the new result painted.

On a calculator page whose runtime is ready, a field is changed 50 times as a user would (one
native ``input`` event per change, a short pause between changes). A capture listener marks
``bench-input`` at the input event; the page's own ``cw-result-painted`` mark closes the
measure. Median and p95 are printed, then the ratio p95/median (how even the response is).

A page that draws a chart after its result (the couple page's E–pH chart, carried in the same result)
marks ``cw-chart-painted``; those marks are read afterwards, without changing the pace of the
changes: for each change, the chart painted before the next change, if any, gives the time from
the change to its chart (median, and how many changes got their chart).
"""

from .common import Guard, fms, fr, heading, line, median, percentile, ratio

CASES = (
    # page, field selector, values cycled through (all valid)
    ("calculators/couple/", "#cw-t", [str(t) for t in range(15, 65)]),
    ("calculators/joint/", "#cw-ar", [f"{0.05 + 0.1 * k:.2f}" for k in range(50)]),
)

#: the first changes after a page opens are reported apart as well (the page's own code and the
#: engine are not yet warm then); the median and p95 above are over all changes
STEADY_AFTER = 10

MARK_INPUT = """() => {
  if (window.__cwInputMarked) return;
  window.__cwInputMarked = true;
  document.addEventListener("input", () => performance.mark("bench-input"), true);
}"""


def measure(page, selector, values, pause_ms=100):
    """Latency in ms of each change."""
    page.evaluate(MARK_INPUT)
    out = []
    for v in values:
        n = page.evaluate("performance.getEntriesByName('cw-result-painted').length")
        page.fill(selector, v)
        page.wait_for_function(f"() => performance.getEntriesByName('cw-result-painted').length > {n}", timeout=60_000)
        out.append(page.evaluate("performance.measure('bench-latency', 'bench-input', 'cw-result-painted').duration"))
        page.wait_for_timeout(pause_ms)
    return out


CHART_DELAYS = """(n) => {
  const t = (name) => performance.getEntriesByName(name).map((e) => e.startTime);
  const inputs = t("bench-input").slice(-n), charts = t("cw-chart-painted");
  return inputs.map((t0, i) => {
    const next = i + 1 < inputs.length ? inputs[i + 1] : Infinity;
    const c = charts.find((x) => x > t0 && x < next);
    return c === undefined ? null : c - t0;
  });
}"""


def chart_delays(page, n):
    """For each of the last n changes: ms from the change to its chart, or None (no chart before the next change)."""
    return page.evaluate(CHART_DELAYS, n)


ROUND_TRIP = """async ([name, repeats]) => {
  const { calculate } = await import(new URL("assets/js/couplewise.mjs", location.origin + "/").href);
  const data = await (await fetch(new URL("assets/data/precomputed.json", location.origin + "/"))).json();
  const req = JSON.parse(Object.keys(data.answers[name])[0]);
  const out = [];
  for (let i = 0; i < repeats; i++) {
    const t0 = performance.now();
    await calculate(name, req);
    out.push(performance.now() - t0);
    await new Promise((r) => setTimeout(r, 20));
  }
  return out;
}"""


def run(server, changes=50):
    from playwright.sync_api import sync_playwright

    from .common import CHROMIUM, CHROMIUM_ARGS

    heading(f"2. Interaction latency: input change to new result painted ({changes} changes per page)")
    guard = Guard()
    res = {}
    with sync_playwright() as pw:
        br = pw.chromium.launch(executable_path=CHROMIUM, headless=True, args=CHROMIUM_ARGS)
        try:
            for path, selector, values in CASES:
                ctx = br.new_context(viewport={"width": 1280, "height": 800})
                ctx.route("**/*", guard.route)
                page = ctx.new_page()
                page.goto(server.url(path))
                page.wait_for_function("() => performance.getEntriesByName('cw-result-painted').length > 0", timeout=120_000)
                lat = measure(page, selector, (values * (changes // len(values) + 1))[:changes])
                name = path.strip("/").split("/")[-1]
                page.wait_for_timeout(1000)  # let charts drawn after the last result finish
                charts = [c for c in chart_delays(page, len(lat)) if c is not None]
                trip = page.evaluate(ROUND_TRIP, [name, 20])
                ctx.close()
                steady = lat[STEADY_AFTER:]
                res[name] = {"median_ms": median(lat), "p95_ms": percentile(lat, 95), "max_ms": max(lat), "n": len(lat),
                             "first_changes_ms": [round(x, 1) for x in lat[:STEADY_AFTER]],
                             "steady_median_ms": median(steady) if steady else None,
                             "steady_p95_ms": percentile(steady, 95) if steady else None,
                             "worker_round_trip_ms": median(trip)}
                if charts:
                    res[name].update(chart_median_ms=median(charts), charts_drawn=len(charts))
        finally:
            br.close()
    guard.check()
    for name, r in res.items():
        line(f"{name:7s} median {fms(r['median_ms'])}, p95 {fms(r['p95_ms'])}, max {fms(r['max_ms'])} (n = {r['n']}); "
             f"the calculation alone (worker round trip, idle page): {fms(r['worker_round_trip_ms'])}")
        if r["steady_median_ms"] is not None:
            line(f"{'':7s} first {STEADY_AFTER} changes after the page opened: "
                 + ", ".join(f"{x:.0f}" for x in r["first_changes_ms"]) + " ms; the "
                 f"{r['n'] - STEADY_AFTER} after them: median {fms(r['steady_median_ms'])}, p95 {fms(r['steady_p95_ms'])}")
        if "chart_median_ms" in r:
            line(f"{'':7s} its chart: median {fms(r['chart_median_ms'])} from the change "
                 f"({r['charts_drawn']} of {r['n']} changes got their chart before the next change)")
    for name, r in res.items():
        r["ratio_p95_median"] = ratio(r["p95_ms"], r["median_ms"])
    line("ratio p95/median: " + ", ".join(f"{n} {fr(r['ratio_p95_median'])}" for n, r in res.items()))
    return res
