"""Reference electrodes: potential vs SHE at a temperature, and conversion of a reading.

Each electrode of data/reference_electrodes.yaml gives its potential vs SHE at 25 °C and a
temperature model:

- ``polynomial``: E(t) = Σ c_i·(t − t_ref)^i with ``coeffs_V`` and ``t_ref_C``;
- ``linear``: E(t) = E(t_ref) + (slope/1000)·(t − t_ref), ``slope_mV_per_K``, t_ref default 25 °C;
- ``constant``: E(t) = E(25 °C).

Outside the model's ``valid_C`` a warning is given (extrapolation); the engine accepts 0–100 °C.
The SHE is 0 V at every temperature (IUPAC convention). The reversible hydrogen electrode (RHE)
is not stored: E(RHE) = −(ln10·RT/F)·pH vs SHE at p(H2) = 1 bar.

A reading E_x measured against electrode X, expressed against electrode Y:
E_y = E_x + E(X vs SHE) − E(Y vs SHE). Liquid-junction potentials are not included.
"""

import math
import re
from dataclasses import dataclass

from . import constants
from .bounds import BOUNDS, check
from .dataset import current
from .derivation import Derivation, check_temperature, fmt
from .errors import DataError, InputError
from .requests import norm as _norm
from .requests import read

#: largest reading accepted: beyond it no aqueous measurement makes sense [V]
VALUE_MAX_V = BOUNDS["value_V"].high
_RHE_NAMES = {"rhe", "reversiblehydrogenelectrode", "reversiblehydrogen"}
_SHE_NAMES = {"she", "standardhydrogenelectrode", "nhe"}


def rhe_potential(pH, temp_C=25.0):
    """Potential of the reversible hydrogen electrode vs SHE: E = −(ln10·RT/F)·pH.

    Args:
        pH: pH of the solution [unitless]
        temp_C: temperature [°C]

    Returns:
        E(RHE) [V vs SHE]

    References:
        Nernst equation for 2 H+ + 2 e− → H2 at p(H2) = 1 bar (e.g. Bard & Faulkner,
        Electrochemical Methods, 2nd ed., 2001, ch. 2, from memory); CODATA 2018 R and F.

    >>> round(rhe_potential(7.0, 25.0), 5)
    -0.41412
    """
    return -constants.nernst_slope(temp_C + constants.T_ZERO_C) * pH


@dataclass(frozen=True)
class ReferencePotential:
    """The potential of a reference electrode vs SHE at a temperature, with its derivation."""

    id: str
    name: str
    temp_C: float
    E_V_SHE: float
    steps: tuple
    warnings: tuple
    sources: tuple


def _float(value, what):
    if isinstance(value, bool) or not isinstance(value, (int, float)) or not math.isfinite(value):
        raise DataError(f"reference electrode {what} = {value!r} is not a number")
    return float(value)


def temperature_model_E(model, E25_V, temp_C, rid="reference electrode"):
    """Potential of a reference electrode at a temperature from its dataset temperature model.

    ``constant``: E = E25; ``linear``: E = E25 + (slope_mV_per_K/1000)·(t − t_ref_C);
    ``polynomial``: E = Σ coeffs_V[i]·(t − t_ref_C)^i. The one statement of the model: the
    engine, the data validator and the reference pages all call it.

    Args:
        model: the record's ``temperature`` mapping (kind, t_ref_C, slope_mV_per_K or coeffs_V) [unitless]
        E25_V: the record's E_V_SHE, its potential at t_ref_C (25 °C in the dataset) [V vs SHE]
        temp_C: temperature [°C]
        rid: the electrode id, for a data error [unitless]

    Returns:
        E [V vs SHE]; raises DataError for a model with a missing or non-numeric coefficient

    References:
        The forms in which the dataset's sources state an electrode's temperature dependence
        (a coefficient in mV/K, or a polynomial fit in t); each record cites its own source.

    >>> temperature_model_E({"kind": "linear", "t_ref_C": 25, "slope_mV_per_K": 0.9}, 0.316, 35)
    0.325
    >>> round(temperature_model_E({"kind": "polynomial", "t_ref_C": 25, "coeffs_V": [0.2412, -6.61e-4]}, 0.2412, 35), 6)
    0.23459
    """
    kind = (model or {}).get("kind", "constant")
    if kind == "constant":
        return E25_V
    tref = _float(model.get("t_ref_C", 25.0), f"{rid}: t_ref_C")
    x = temp_C - tref
    if kind == "linear":
        return E25_V + _float(model.get("slope_mV_per_K"), f"{rid}: slope_mV_per_K") / 1000.0 * x
    if kind == "polynomial":
        raw = model.get("coeffs_V")
        coeffs = [_float(c, f"{rid}: coeffs_V") for c in raw] if isinstance(raw, (list, tuple)) else []
        if not coeffs:
            raise DataError(f"reference electrode {rid}: polynomial model without coeffs_V")
        return sum(c * x ** i for i, c in enumerate(coeffs))
    raise DataError(f"reference electrode {rid}: unknown temperature kind {kind!r}")


def reference_potential(ref, temp_C=25.0, pH=None, field="from"):
    """Potential of a reference electrode vs SHE at a temperature.

    Args:
        ref: electrode id or alias (``SCE``, ``CSE``, ``Ag/AgCl sat. KCl``, ``RHE``, ...) [unitless]
        temp_C: temperature, 0 to 100 [°C]
        pH: pH, needed for RHE only [unitless]
        field: the input field shown in an error [unitless]

    Returns:
        a :class:`ReferencePotential`

    References:
        The electrode's value and temperature model from the dataset (with source ids);
        RHE by :func:`rhe_potential`; SHE 0 V at all temperatures (IUPAC convention).

    >>> reference_potential("SHE", 60).E_V_SHE
    0.0
    """
    t = check_temperature(temp_C)
    d = Derivation()
    if isinstance(ref, str) and _norm(ref) in _RHE_NAMES:
        if pH is None:
            raise InputError("pH", None, "a pH from -2 to 16 (the RHE potential depends on it)")
        pH = check("pH", pH)
        E = rhe_potential(pH, t)
        slope = constants.nernst_slope(t + constants.T_ZERO_C)
        d.step("Reversible hydrogen electrode vs SHE", "E(RHE) = −(ln10·R·T/F)·pH, p(H2) = 1 bar",
               f"E = −{fmt(slope)} V·{fmt(pH)}", f"E(RHE) = {fmt(E)} V vs SHE")
        return ReferencePotential("RHE", "Reversible hydrogen electrode", t, E, tuple(d.steps), tuple(d.warnings), ())
    rec = current().get("reference_electrodes", ref, field)
    rid = rec.get("id")
    name = rec.get("name", rid)
    d.cite(rec.get("source"))
    if _norm(rid) in _SHE_NAMES:
        d.step("Standard hydrogen electrode", "E(SHE) = 0 V at every temperature (IUPAC convention)",
               f"t = {fmt(t)} °C", "E(SHE) = 0 V")
        return ReferencePotential(rid, name, t, 0.0, tuple(d.steps), tuple(d.warnings), tuple(d.sources))
    E25 = _float(rec.get("E_V_SHE"), f"{rid}: E_V_SHE")
    model = rec.get("temperature") or {"kind": "constant"}
    kind = model.get("kind", "constant")
    d.cite(model.get("source"))
    conf = rec.get("confidence")
    E = temperature_model_E(model, E25, t, rid)
    tref = _float(model.get("t_ref_C", 25.0), f"{rid}: t_ref_C")
    if kind == "polynomial":
        x = t - tref
        terms = " + ".join(f"({fmt(c)})·({fmt(x)})^{i}" if i else f"{fmt(c)}" for i, c in enumerate(model["coeffs_V"]))
        d.step(f"{rid} vs SHE at the temperature (polynomial)", f"E(t) = Σ c_i·(t − {fmt(tref)} °C)^i [V]",
               f"E = {terms}", f"E({rid}, {fmt(t)} °C) = {fmt(E)} V vs SHE")
    elif kind == "linear":
        slope = model["slope_mV_per_K"]
        d.step(f"{rid} vs SHE at the temperature (linear)", f"E(t) = E({fmt(tref)} °C) + slope·(t − {fmt(tref)} °C)",
               f"E = {fmt(E25)} V + ({fmt(slope)} mV/K)·({fmt(t)} − {fmt(tref)}) K",
               f"E({rid}, {fmt(t)} °C) = {fmt(E)} V vs SHE")
    else:
        d.step(f"{rid} vs SHE", "no temperature dependence in the dataset: E(t) = E(25 °C)",
               f"source {rec.get('source', '?')}" + (f" ({conf})" if conf else ""), f"E({rid}) = {fmt(E)} V vs SHE")
        if model.get("valid_C") is None and abs(t - 25.0) > 1e-9:
            d.warn("temp_C", f"{rid} has no temperature model in the dataset: its 25 °C value is used at {fmt(t)} °C")
    if model.get("valid_C") is not None:
        lo, hi = (_float(v, f"{rid}: valid_C") for v in model["valid_C"])
        if not lo - 1e-9 <= t <= hi + 1e-9:
            d.warn("temp_C", f"t = {fmt(t)} °C is outside the range of the {rid} temperature model "
                             f"({fmt(lo)}–{fmt(hi)} °C): extrapolated")
    return ReferencePotential(rid, name, t, E, tuple(d.steps), tuple(d.warnings), tuple(d.sources))


def convert(value_V, from_ref, to_ref, temp_C=25.0, pH=None):
    """Express a reading measured against one reference electrode against another.

    E_to = E_from + E(from vs SHE) − E(to vs SHE).

    Args:
        value_V: the reading [V vs from_ref]
        from_ref: the electrode the reading was taken against [unitless]
        to_ref: the electrode to express it against [unitless]
        temp_C: temperature of both electrodes [°C]
        pH: pH, needed when either electrode is the RHE [unitless]

    Returns:
        dict with value_V, from, to, temp_C, pH, E_from_V_SHE, E_to_V_SHE, steps, warnings, sources

    References:
        Reference-electrode scale conversion (e.g. Bard & Faulkner, Electrochemical Methods,
        2nd ed., 2001, ch. 1, from memory); electrode values from the dataset.

    >>> round(convert(0.5, "SHE", "RHE", 25.0, 7.0)["value_V"], 5)
    0.91412
    """
    v = check("value_V", value_V)
    t = check_temperature(temp_C)
    if pH is not None:
        pH = check("pH", pH)
    rf = reference_potential(from_ref, t, pH, "from")
    rt = reference_potential(to_ref, t, pH, "to")
    d = Derivation()
    for r in (rf, rt):
        d.steps.extend(r.steps)
        for w in r.warnings:
            d.warn(w["field"], w["message"])
        for s in r.sources:
            d.cite(s)
    out_v = v + rf.E_V_SHE - rt.E_V_SHE
    d.step("Conversion of the reading", "E(vs to) = E(vs from) + E(from vs SHE) − E(to vs SHE); liquid-junction potentials not included",
           f"E = {fmt(v)} V + {fmt(rf.E_V_SHE)} V − ({fmt(rt.E_V_SHE)} V)", f"E = {fmt(out_v)} V vs {rt.id}")
    if pH is not None and "RHE" not in (rf.id, rt.id):
        d.warn("pH", f"pH {fmt(pH)} was not used: it matters only for the RHE")
    if pH is not None and not 0.0 <= pH <= 14.0:
        d.warn("pH", f"pH {fmt(pH)} is outside 0-14")
    return {"value_V": out_v, "from": rf.id, "to": rt.id, "temp_C": t, "pH": pH,
            "E_from_V_SHE": rf.E_V_SHE, "E_to_V_SHE": rt.E_V_SHE, **d.as_dict()}


def convert_entry(req):
    """JSON entry point ``convert``: a reading against one reference electrode, against another.

    Request fields: ``value_V`` [V], ``from``, ``to`` (electrode ids), ``temp_C`` [°C, default
    25], ``pH`` (for RHE).

    Args:
        req: the request dict [unitless]

    Returns:
        dict with value_V, from, to, temp_C, pH, E_from_V_SHE, E_to_V_SHE, steps, warnings,
        sources, data_version

    References:
        See :func:`convert`.

    >>> r = convert_entry({"value_V": -0.85, "from": "CSE", "to": "SHE"})
    >>> r["to"], abs(r["value_V"] - (-0.85 + r["E_from_V_SHE"])) < 1e-12
    ('SHE', True)
    """
    electrode = "a reference electrode id such as SCE"
    read(req, "convert", {"value_V": "a reading in V", "from": electrode, "to": electrode}, ("temp_C", "pH"))
    out = convert(req["value_V"], req["from"], req["to"], req.get("temp_C"), req.get("pH"))
    out["data_version"] = current().version
    return out
