"""Answers to each calculator's opening request, computed at build time under CPython.

A calculator page opens with its demo inputs (the ``*_DEFAULTS`` objects in
``docs/assets/js/calculators.mjs``). Their answers are computed here with the same calc and the
same dataset the page's runtime uses, and written to ``assets/data/precomputed.json``, keyed by
calculator name and the request's canonical JSON. The page shows such an answer at once, marked
"computed at build time", while the runtime starts, and only when its own request is exactly
the precomputed one; the runtime's answer then replaces it.

The requests are rebuilt here the way each calculator's ``collect()`` builds its first request
(no URL parameters). If the page and this module ever disagree, the page simply finds no entry
and waits for the runtime: slower, never wrong. ``tests/browser/test_startup_fallback.py``
checks that every calculator finds its entry.
"""

import decimal
import json
import math
import os
import re

HERE = os.path.dirname(os.path.abspath(__file__))
ROOT = os.path.dirname(HERE)
CALCULATORS_JS = os.path.join(ROOT, "docs", "assets", "js", "calculators.mjs")
SPECIES_RE = re.compile(r"^(?:(\d+(?:\.\d+)?) )?(.+)\((aq|s|l|g)\)$")  # as parseSpecies in calculators.mjs
DEFAULTS_RE = re.compile(r"^const ([A-Z]+)_DEFAULTS = (\{.*\});\s*$", re.M)


class PrecomputeError(Exception):
    """The calculators' defaults could not be read."""


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
    (mirrors ``canonical()`` in calculators.mjs).

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


def read_defaults(path=CALCULATORS_JS):
    """The ``*_DEFAULTS`` object literals of calculators.mjs, as dicts keyed by their prefix."""
    with open(path, encoding="utf-8") as fh:
        text = fh.read()
    out = {}
    for name, literal in DEFAULTS_RE.findall(text):
        as_json = re.sub(r'([{,]\s*)([A-Za-z_]\w*)\s*:', r'\1"\2":', literal)
        try:
            out[name.lower()] = json.loads(as_json)
        except ValueError as exc:
            raise PrecomputeError(f"{path}: {name}_DEFAULTS is not a plain object literal ({exc})") from None
    return out


def _species(reaction):
    """(name, phase) of the dissolved and gaseous species, and whether H+/OH- appear."""
    seen, needs_ph = {}, False
    for text in list(reaction.get("oxidised", [])) + list(reaction.get("reduced", [])):
        m = SPECIES_RE.match(str(text).strip())
        if not m:
            continue
        name, phase = m.group(2), m.group(3)
        if name in ("H+", "OH-"):
            needs_ph = True
        elif phase in ("aq", "g"):
            seen[name] = phase
    return seen, needs_ph


def _num(text):
    return float(str(text).strip().replace(",", ".").replace("−", "-"))


def default_requests(bundle, defaults):
    """Each calculator's opening request, as its collect() builds it; name -> request."""
    reqs = {}
    by_id = {r["id"]: r for r in bundle["half_reactions"]}
    d = defaults.get("couple")
    if d and d["a"] in by_id and d["b"] in by_id:
        seen, needs_ph = {}, False
        for rid in (d["a"], d["b"]):
            s, p = _species(by_id[rid])
            seen.update(s)
            needs_ph = needs_ph or p
        req = {"a": d["a"], "b": d["b"], "temp_C": _num(d["t"]), "activities": {}, "pressures": {}}
        if needs_ph:
            req["pH"] = _num(d["pH"])
        for name, phase in seen.items():
            req["pressures" if phase == "g" else "activities"][name] = _num(d.get("act", {}).get(name, "1"))
        reqs["couple"] = req
    d = defaults.get("electrode")
    if d and d["id"] in by_id:
        seen, needs_ph = _species(by_id[d["id"]])
        req = {"id": d["id"], "temp_C": _num(d["t"])}
        if needs_ph:
            req["pH"] = _num(d["pH"])
        acts = {n: _num(d.get("act", {}).get(n, "1")) for n, ph in seen.items() if ph == "aq"}
        press = {n: _num(d.get("act", {}).get(n, "1")) for n, ph in seen.items() if ph == "g"}
        if acts:
            req["activities"] = acts
        if press:
            req["pressures"] = press
        reqs["electrode"] = req
    d = defaults.get("convert")
    if d:
        req = {"from": d["from"], "to": d["to"], "value_V": _num(d["v"]), "temp_C": _num(d["t"])}
        if "RHE" in (d["from"], d["to"]):
            req["pH"] = _num(d["pH"])
        reqs["convert"] = req
    d = defaults.get("activity")
    if d:
        reqs["activity"] = {"species": d["sp"], "model": d["model"], "ionic_strength": _num(d["I"]), "temp_C": _num(d["t"])}
    d = defaults.get("joint")
    if d:
        req = {"a": d["a"], "b": d["b"], "env": d["env"]}
        if str(d.get("ar", "")).strip():
            req["area_ratio"] = _num(d["ar"])
        reqs["joint"] = req
    d = defaults.get("matrix")
    if d:
        chosen = set(filter(None, d["m"].split(",")))
        families = {}
        for m in bundle["materials"]:  # the page lists materials grouped by family, in file order
            families.setdefault(m.get("family") or "other", []).append(m["id"])
        picked = [mid for ids in families.values() for mid in ids if mid in chosen]
        req = {"env": d["env"]}
        if picked:
            req["materials"] = picked
        reqs["matrix"] = req
    return reqs


def precompute(bundle, defaults=None):
    """``{"data_version", "answers": {name: {canonical request: result}}}`` computed by calc
    under CPython with this build's dataset (round-tripped through JSON as the wheel carries it).
    Requests that calc rejects are left out (the page then waits for the runtime)."""
    import calc.dataset
    from calc.api import call

    defaults = read_defaults() if defaults is None else defaults
    before = calc.dataset._current
    try:
        calc.dataset.set_dataset(json.dumps(bundle, ensure_ascii=False, allow_nan=False))
        answers = {}
        for name, req in default_requests(bundle, defaults).items():
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
