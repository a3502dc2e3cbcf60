"""Reference electrodes: the SHE is 0 V, and each temperature model gives ``E_V_SHE`` at 25 °C
within 1 mV and changes by no more than a few mV/K over its range of validity.

The model itself is calc's (:func:`calc.refelec.temperature_model_E`): written once, used here.
"""

from calc.errors import DataError
from calc.refelec import temperature_model_E

from .collect import each, is_num

K = "reference_electrodes"
KINDS = ("constant", "linear", "polynomial")
#: how far a reference electrode's temperature model may be from E_V_SHE at 25 °C [V] (brief)
REFELEC_TOLERANCE_V = 0.001
#: reference electrodes change by a few tenths of a mV/K up to about 1 mV/K (common practice);
#: beyond this rate the coefficients hold a typo [V/K]
REFELEC_MAX_SLOPE_V_PER_K = 0.005


def refelec_potential(rec, temp_C):
    """E of a reference electrode record at a temperature from its temperature model.

    Args:
        rec: a reference_electrodes record [unitless]
        temp_C: temperature [°C]

    Returns:
        potential [V vs SHE], or None when the model cannot be evaluated

    References:
        The record's temperature model, evaluated by :func:`calc.refelec.temperature_model_E`.

    >>> round(refelec_potential({"E_V_SHE": 0.2, "temperature": {"kind": "linear", "slope_mV_per_K": -1.0}}, 35), 12)
    0.19
    """
    e25, model = rec.get("E_V_SHE"), rec.get("temperature")
    if not isinstance(model, (dict, type(None))) or not isinstance((model or {}).get("coeffs_V", []), list):
        return None  # not a model's shape (the schema reports it)
    if not is_num(e25) and (model or {}).get("kind") != "polynomial":
        return None  # only a polynomial does without the 25 °C value
    try:
        return temperature_model_E(model, e25, temp_C)
    except DataError:
        return None


def _she(label, rec, out):
    e25, model = rec.get("E_V_SHE"), rec.get("temperature")
    if is_num(e25) and e25 != 0:
        out.error(K, label, "E_V_SHE", f"value {e25:g}: the SHE is 0 V at every temperature by convention")
    if isinstance(model, dict) and model.get("kind") not in (None, "constant"):
        out.error(K, label, "temperature.kind", f"kind {model.get('kind')!r}: the SHE is 0 V at every "
                                                "temperature, use kind constant")


def _valid_range(model):
    """The model's (low, high) range of validity [°C], or None when it is not two ordered numbers."""
    valid = model.get("valid_C")
    if isinstance(valid, list) and len(valid) == 2 and all(is_num(v) for v in valid) and valid[0] < valid[1]:
        return valid[0], valid[1]
    return None


def _steepest(rec, lo, hi):
    """(rate [V/K], temperature [°C]) of the first 1-K step over [lo, hi] steeper than the limit, or None."""
    steps = max(1, int(hi - lo))
    width = (hi - lo) / steps
    prev = refelec_potential(rec, lo)
    for i in range(1, steps + 1):
        t = lo + (hi - lo) * i / steps
        cur = refelec_potential(rec, t)
        if cur is None or prev is None:
            return None  # the model cannot be evaluated there: reported at 25 °C if anywhere
        rate = (cur - prev) / width
        if abs(rate) > REFELEC_MAX_SLOPE_V_PER_K:
            return rate, t
        prev = cur
    return None


def _model(label, rec, out):
    e25, model = rec.get("E_V_SHE"), rec.get("temperature")
    kind = model.get("kind")
    at25 = refelec_potential(rec, 25.0)
    if at25 is None:
        out.error(K, label, "temperature", f"the {kind} model cannot be evaluated: check its fields")
        return
    if abs(at25 - e25) > REFELEC_TOLERANCE_V:
        out.error(K, label, "temperature", f"the {kind} model gives {at25:.4f} V at 25 °C but E_V_SHE is "
                                           f"{e25:g} V: they must agree within {REFELEC_TOLERANCE_V * 1000:g} mV")
    valid = _valid_range(model)
    steep = _steepest(rec, *valid) if valid else None
    if steep:
        out.error(K, label, "temperature", f"the {kind} model changes by {steep[0] * 1000:.2f} mV/K near "
                                           f"{steep[1]:g} °C: more than {REFELEC_MAX_SLOPE_V_PER_K * 1000:g} mV/K "
                                           "means a coefficient is wrong")


def check_reference_electrodes(raw, out):
    """The SHE at 0 V, and every temperature model at E_V_SHE at 25 °C and of a plausible slope."""
    for label, rec in each(raw, K):
        if rec.get("id") == "SHE":
            _she(label, rec, out)
        model = rec.get("temperature")
        if is_num(rec.get("E_V_SHE")) and isinstance(model, dict) and model.get("kind") in KINDS:
            _model(label, rec, out)
