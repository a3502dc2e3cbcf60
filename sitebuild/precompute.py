"""Answers to each calculator's opening request, computed at build time under CPython.

A calculator page opens with its demonstration request, ``calc.spec.OPENINGS`` (the page reads
the same requests from ``assets/data/spec.json``). Their answers are computed here with the same
calc and the same dataset the page's runtime uses, and written to
``assets/data/precomputed.json``, keyed by calculator name and the request's canonical JSON. The
page shows such an answer at once, marked "computed at build time", while the runtime starts,
and only when its own request is exactly the precomputed one; the runtime's answer then replaces
it. ``tests/browser/test_startup_fallback.py`` checks that every calculator finds its entry.
"""

import decimal
import json
import math
import os


def js_number(x):
    """A number as JavaScript's ``JSON.stringify`` writes it (shortest round-trip digits).

    >>> [js_number(v) for v in (35.0, 1e-05, 1e-07, 0.2, -0.93, 1e21, 123456.0, 0.0)]
    ['35', '0.00001', '1e-7', '0.2', '-0.93', '1e+21', '123456', '0']
    """
    if isinstance(x, bool):
        return "true" if x else "false"
    x = float(x)
    if not math.isfinite(x):
        return "null"
    if x == 0:
        return "0"
    if x < 0:
        return "-" + js_number(-x)
    _, digits, exp = decimal.Decimal(repr(x)).normalize().as_tuple()
    s = "".join(map(str, digits))
    k, n = len(s), exp + len(s)  # x = 0.s × 10^n
    if k <= n <= 21:
        return s + "0" * (n - k)
    if 0 < n <= 21:
        return s[:n] + "." + s[n:]
    if -6 < n <= 0:
        return "0." + "0" * (-n) + s
    e = n - 1
    return (s if k == 1 else s[0] + "." + s[1:]) + "e" + ("+" if e >= 0 else "-") + str(abs(e))


def canonical(value):
    """Canonical JSON: object keys sorted, no spaces, numbers as JavaScript writes them
    (mirrors ``canonical()`` in runner.mjs).

    >>> canonical({"b": [1.0, "x"], "a": {"Zn2+": 1e-05}})
    '{"a":{"Zn2+":0.00001},"b":[1,"x"]}'
    """
    if isinstance(value, dict):
        return "{" + ",".join(json.dumps(k, ensure_ascii=False) + ":" + canonical(value[k]) for k in sorted(value)) + "}"
    if isinstance(value, (list, tuple)):
        return "[" + ",".join(canonical(v) for v in value) + "]"
    if isinstance(value, (bool, int, float)):
        return js_number(value)
    if value is None:
        return "null"
    return json.dumps(value, ensure_ascii=False)


def precompute(bundle, openings=None):
    """``{"data_version", "answers": {name: {canonical request: result}}}`` computed by calc
    under CPython with this build's dataset (round-tripped through JSON as the wheel carries it).
    Requests that calc rejects are left out (the page then waits for the runtime)."""
    import calc.dataset
    from calc.api import call

    from calc.spec import OPENINGS

    openings = OPENINGS if openings is None else openings
    before = calc.dataset._current
    try:
        calc.dataset.set_dataset(json.dumps(bundle, ensure_ascii=False, allow_nan=False))
        answers = {}
        for name, req in openings.items():
            out = call(name, json.loads(json.dumps(req)))
            if out.get("ok"):
                answers.setdefault(name, {})[canonical(req)] = out["result"]
    finally:
        calc.dataset._current = before
    return {"data_version": bundle["version"], "answers": answers}


def write_precomputed(site_dir, bundle):
    """Write assets/data/precomputed.json into the built site; returns its path."""
    data = precompute(bundle)
    path = os.path.join(site_dir, "assets", "data", "precomputed.json")
    os.makedirs(os.path.dirname(path), exist_ok=True)
    with open(path, "w", encoding="utf-8") as fh:
        json.dump(data, fh, ensure_ascii=False, separators=(",", ":"), allow_nan=False)
    return path
