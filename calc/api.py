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
    "electrode": "calc.potentials:electrode_entry",
    "couple": "calc.potentials:couple_entry",
    "convert": "calc.refelec:convert_entry",
    "activity": "calc.activity:activity_entry",
    "joint": "calc.joint:joint_entry",
    "matrix": "calc.joint:matrix_entry",
    "rate": "calc.rate:rate_entry",
    "measured": "calc.fieldcheck:measured_joint_entry",
    "cp": "calc.fieldcheck:cp_reading_entry",
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
    """The function behind an entry point name."""
    if name not in ENTRY_POINTS:
        raise InputError("calculation", name, "one of " + ", ".join(sorted(ENTRY_POINTS)))
    module, func = ENTRY_POINTS[name].split(":")
    return getattr(importlib.import_module(module), func)


def call(name, request):
    """Run one calculation and wrap the outcome.

    Args:
        name: entry point name, e.g. ``couple`` [unitless]
        request: the request dict [unitless]

    Returns:
        ``{"ok": True, "result": {...}}`` or ``{"ok": False, "error": {"field", "message"}}``

    >>> call("nope", {})["error"]["field"]
    'calculation'
    """
    try:
        if not isinstance(request, dict):
            raise InputError("request", type(request).__name__, "a JSON object")
        result = entry(name)(request)
        _finite(result)
        return {"ok": True, "result": result}
    except InputError as exc:
        return {"ok": False, "error": exc.to_dict()}
    except DataError as exc:
        return {"ok": False, "error": {"field": "dataset", "message": str(exc)}}


def call_json(name, text):
    """JSON text in, JSON text out (what the page's worker calls)."""
    try:
        request = json.loads(text)
    except (TypeError, ValueError) as exc:
        return json.dumps({"ok": False, "error": {"field": "request", "message": f"request is not valid JSON: {exc}"}})
    except RecursionError:
        return json.dumps({"ok": False, "error": {"field": "request",
                                                  "message": "request is nested too deeply: expected a flat JSON object"}})
    return json.dumps(call(name, request), allow_nan=False, ensure_ascii=False)
