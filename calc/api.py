"""JSON-in/JSON-out entry points shared by the command line and the page.

Every entry point takes one request dict and returns one result dict made of plain JSON values
(numbers, strings, lists, dicts; never NaN or Infinity). Bad input raises
:class:`calc.errors.InputError`; :func:`call` turns it into ``{"ok": false, "error": {...}}``.

Results carry, besides their numbers: ``steps`` (ordered derivation: title, formula,
substituted values, result), ``warnings`` (each with the ``field`` it concerns where there is
one), ``sources`` (source ids used) and ``data_version``.
"""

import importlib
import json
import math

from .errors import DataError, InputError

#: entry point name -> "module:function" (imported on first use, so start-up stays small)
ENTRY_POINTS = {
    "electrode": "calc.electrode:electrode_entry",
    "couple": "calc.cell:couple_entry",
    "eph": "calc.eph:eph_entry",
    "convert": "calc.refelec:convert_entry",
    "activity": "calc.activity:activity_entry",
    "joint": "calc.joint:joint_entry",
    "matrix": "calc.matrix:matrix_entry",
    "rate": "calc.rate:rate_entry",
    "measured": "calc.field.measured:measured_joint_entry",
    "cp": "calc.field.cpreading:cp_reading_entry",
    "mixed": "calc.mixed:mixed_entry",
    "passivity": "calc.passivity:passivity_entry",
    "anodes": "calc.cpdesign.galvanic:anodes_entry",
    "anode-resistance": "calc.cpdesign.anodes:anode_resistance_entry",
    "buried": "calc.cpdesign.buried:buried_entry",
    "groundbed": "calc.cpdesign.impressed:groundbed_entry",
    "wenner": "calc.cpdesign.resistivity:wenner_entry",
    "tank": "calc.cpdesign.tankdesign:tank_entry",
}


def _finite(value, path="result"):
    """Raise if a result holds NaN or Infinity anywhere (never shown silently)."""
    if isinstance(value, float) and not math.isfinite(value):
        raise InputError(path, value, "a finite number: the inputs lead outside what the model can compute")
    if isinstance(value, dict):
        for k, v in value.items():
            _finite(v, f"{path}.{k}")
    elif isinstance(value, (list, tuple)):
        for i, v in enumerate(value):
            _finite(v, f"{path}[{i}]")


def entry(name):
    """The function behind an entry point name.

    Args:
        name: entry point name, e.g. ``couple`` [unitless]

    Returns:
        the entry function (request dict in, result dict out)

    References:
        Project convention (DESIGN.md: the entry-point table).

    >>> entry("convert").__name__
    'convert_entry'
    """
    if name not in ENTRY_POINTS:
        raise InputError("calculation", name, "one of " + ", ".join(sorted(ENTRY_POINTS)))
    module, func = ENTRY_POINTS[name].split(":")
    return getattr(importlib.import_module(module), func)


def _run(name, request):
    """The outcome of one calculation before its numbers are checked for NaN and Infinity."""
    try:
        if not isinstance(request, dict):
            raise InputError("request", type(request).__name__, "a JSON object")
        return {"ok": True, "result": entry(name)(request)}
    except InputError as exc:
        return {"ok": False, "error": exc.to_dict()}
    except DataError as exc:
        return {"ok": False, "error": {"field": "dataset", "message": str(exc)}}


def _refused(out):
    """The error naming the first NaN or Infinity of a result (``out`` unchanged when none)."""
    try:
        _finite(out["result"])
    except InputError as exc:
        return {"ok": False, "error": exc.to_dict()}
    return out


def call(name, request):
    """Run one calculation and wrap the outcome.

    Args:
        name: entry point name, e.g. ``couple`` [unitless]
        request: the request dict [unitless]

    Returns:
        ``{"ok": True, "result": {...}}`` or ``{"ok": False, "error": {"field", "message"}}``

    References:
        Project convention (DESIGN.md: one JSON-in/JSON-out entry point per calculation).

    >>> call("nope", {})["error"]["field"]
    'calculation'
    """
    out = _run(name, request)
    return _refused(out) if out["ok"] else out


def call_json(name, text):
    """JSON text in, JSON text out (what the page's worker calls).

    The same outcome as :func:`call`, written as JSON. The result is not walked for NaN and
    Infinity beforehand: ``json.dumps(allow_nan=False)`` refuses them while writing, and only
    then is the result walked to name the field that holds one (a large result, such as the
    matrix of every material, is written once instead of walked and then written).

    Args:
        name: entry point name, e.g. ``couple`` [unitless]
        text: the request as JSON text [unitless]

    Returns:
        the outcome as JSON text

    References:
        Project convention (DESIGN.md: the same entry points serve the CLI and the page).

    >>> call_json("electrode", '{"id": "Cu2+/Cu", "temp_C": "hot"}')[:36]
    '{"ok": false, "error": {"field": "te'
    """
    try:
        request = json.loads(text)
    except (TypeError, ValueError) as exc:
        return json.dumps({"ok": False, "error": {"field": "request", "message": f"request is not valid JSON: {exc}"}})
    except RecursionError:
        return json.dumps({"ok": False, "error": {"field": "request",
                                                  "message": "request is nested too deeply: expected a flat JSON object"}})
    out = _run(name, request)
    try:
        return json.dumps(out, allow_nan=False, ensure_ascii=False)
    except ValueError:  # NaN or Infinity somewhere in the result
        refused = _refused(out)
        if refused is out:  # not a number after all: never let an unwritable result pass
            refused = {"ok": False, "error": {"field": "result",
                                              "message": "result: the result could not be written as JSON"}}
        return json.dumps(refused, allow_nan=False, ensure_ascii=False)
