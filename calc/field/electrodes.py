"""The field reference electrode a reading was taken with, and whether a reading can be one.

A field electrode is a reference electrode of the dataset at its temperature
(:func:`calc.refelec.reference_potential`); an Ag/AgCl/seawater electrode in brackish water is
corrected for its chloride (:mod:`calc.field.seawater`).

Implausible readings (a decision of this project, common practice): a reading more than 10 V
from zero is refused (not a potential measurement). A potential more positive than +1.3 V vs SHE
(above +1 V vs CSE: beyond oxygen evolution) is refused for every reading, and one more negative
than −2.2 V vs SHE (below −2.5 V vs CSE, more negative than magnesium anodes) is refused for
instant-off readings and corrosion potentials; an "on" reading may go that far because of its IR
drop, with a warning. The message names the reading and points at the usual causes (sign,
leads, electrode).
"""

from dataclasses import dataclass

from .. import constants
from ..bounds import check
from ..derivation import Derivation, check_temperature, fmt
from ..errors import InputError
from ..refelec import reference_potential
from ..requests import norm
from ..series import EPS_V
from .seawater import (
    SALINITY_LOW,
    SALINITY_REF,
    brackish_shift,
    chloride_activity,
    salinity_from_chloride,
)

#: plausible potentials of a metal in water or soil [V vs SHE]: below magnesium anodes, above
#: oxygen evolution (−2.5 and +1.0 V vs CSE; common practice)
PLAUSIBLE_SHE_V = (-2.2, 1.3)
#: the one electrode that needs the chloride correction
AGAGCL_SW = "Ag/AgCl seawater"


@dataclass(frozen=True)
class Electrode:
    """The electrode a reading was taken with, at its temperature (and chloride, for Ag/AgCl/sw)."""

    id: str
    temp_C: float
    E_V_SHE: float  # including the chloride shift
    shift_V: float  # chloride shift (0 when none)
    salinity: float  # salinity used for the shift, or None
    steps: tuple
    warnings: tuple
    sources: tuple


def _salinity_given(d, salinity, chloride_mg_per_L):
    """The salinity of the request (or from its chloride, with the step), checked; None when neither."""
    if chloride_mg_per_L is not None:
        chloride = check("chloride_mg_per_L", chloride_mg_per_L)
        used_s = salinity_from_chloride(chloride)
        d.step("Salinity from chloride", "S = 1.80655·Cl, Cl in g/kg, taking 1 L of water as 1 kg",
               f"S = 1.80655 × {fmt(chloride)} mg/L / 1000", f"S = {fmt(used_s, 4)} g/kg")
        return used_s
    if salinity is not None:
        return check("salinity", salinity)
    return None


def _chloride_correction(d, used_s, t, what):
    """The brackish-water shift of the Ag/AgCl/seawater electrode, with its steps and cautions [V]."""
    shift = brackish_shift(used_s, t)
    slope = constants.nernst_slope(t + constants.T_ZERO_C)
    a_ref, a_x = chloride_activity(SALINITY_REF, t), chloride_activity(used_s, t)
    d.step("Chloride activity (estimate)",
           "m(Cl−) = (S/1.80655)/35.453/(1 − S/1000); I = 19.924·S/(1000 − 1.005·S); γ by Davies",
           f"S = {fmt(used_s, 4)}: a(Cl−) = {fmt(a_x, 4)}; "
           f"seawater S = {fmt(SALINITY_REF)}: a(Cl−) = {fmt(a_ref, 4)}",
           f"ratio {fmt(a_ref / a_x, 4)}")
    d.step("Ag/AgCl/seawater electrode in this water (Nernst, estimate)",
           "ΔE = (ln10·R·T/F)·log10(a(Cl−, seawater)/a(Cl−, here))",
           f"ΔE = {fmt(slope)} V × log10({fmt(a_ref / a_x, 4)})",
           f"ΔE = {fmt(shift * 1000, 4)} mV: the electrode reads {fmt(abs(shift) * 1000, 3)} mV "
           f"{'more positive' if shift >= 0 else 'more negative'} than in seawater")
    d.cite("dickson-goyet-1994")
    d.cite("computed-nernst")
    d.warn(what, "the brackish-water correction of the Ag/AgCl seawater electrode is an estimate (Nernst on "
                 "chloride activity relative to seawater of salinity 35); calibrate the electrode against a "
                 "CSE or a KCl-filled electrode in this water where a reading is close to a limit")
    if used_s < SALINITY_LOW:
        d.warn(what, f"salinity {fmt(used_s, 3)} is below {fmt(SALINITY_LOW)}: in nearly fresh water the "
                     "Ag/AgCl seawater electrode drifts; use a CSE or a KCl-filled electrode")
    return shift


def field_electrode(electrode, temp_C=25.0, salinity=None, chloride_mg_per_L=None, field="electrode"):
    """A field reference electrode vs SHE at its temperature, with the brackish-water correction.

    Args:
        electrode: electrode id or alias (CSE, Ag/AgCl seawater, Zn seawater, SCE, ...) [unitless]
        temp_C: temperature of the electrode [°C]
        salinity: salinity of the water, for Ag/AgCl/seawater only [g/kg]
        chloride_mg_per_L: chloride of the water instead of salinity [mg/L]
        field: the request field of the electrode, for errors [unitless]

    Returns:
        an :class:`Electrode` (potential in [V vs SHE])

    References:
        :func:`calc.refelec.reference_potential`; :func:`calc.field.seawater.brackish_shift`.

    >>> e = field_electrode("Ag/AgCl seawater", 25.0, salinity=35.0)
    >>> e.id, e.shift_V
    ('Ag/AgCl seawater', 0.0)
    """
    if isinstance(electrode, str) and norm(electrode) in {"rhe", "reversiblehydrogenelectrode"}:
        raise InputError(field, electrode, "a field reference electrode (CSE, Ag/AgCl seawater, Zn seawater, SCE, ...)",
                         "the RHE depends on the pH at the surface and is not a field electrode")
    t = check_temperature(temp_C)
    if salinity is not None and chloride_mg_per_L is not None:
        raise InputError("chloride_mg_per_L", chloride_mg_per_L, "only one of salinity or chloride_mg_per_L")
    ref = reference_potential(electrode, t, field=field)
    d = Derivation()
    d.steps.extend(ref.steps)
    for w in ref.warnings:
        d.warn(field if w["field"] == "from" else w["field"], w["message"])
    for s in ref.sources:
        d.cite(s)
    used_s = _salinity_given(d, salinity, chloride_mg_per_L)
    what = "chloride_mg_per_L" if chloride_mg_per_L is not None else "salinity"
    if used_s is not None and ref.id != AGAGCL_SW:
        d.warn(what, f"the {what.split('_')[0]} was not used: only the Ag/AgCl seawater electrode needs a "
                     "chloride correction")
        used_s = None
    shift = 0.0 if used_s is None else _chloride_correction(d, used_s, t, what)
    return Electrode(ref.id, t, ref.E_V_SHE + shift, shift, used_s, tuple(d.steps), tuple(d.warnings),
                     tuple(d.sources))


def start_derivation(el):
    """A derivation that starts with the electrode's steps, warnings and sources.

    Args:
        el: the :class:`Electrode` of the readings [unitless]

    Returns:
        a :class:`calc.derivation.Derivation`

    References:
        Presentation of the result (no published method).

    >>> len(start_derivation(field_electrode("SCE", 25.0)).steps) >= 1
    True
    """
    d = Derivation()
    d.steps.extend(el.steps)
    for w in el.warnings:
        d.warn(w["field"], w["message"])
    for s in el.sources:
        d.cite(s)
    return d


def on_scale(E_she, target, temp_C):
    """A potential vs SHE expressed against another electrode at the temperature.

    Args:
        E_she: the potential [V vs SHE]
        target: id or alias of the electrode to express it against [unitless]
        temp_C: temperature of that electrode [°C]

    Returns:
        (potential [V vs target], the target's :func:`calc.refelec.reference_potential` record)

    References:
        E(target) = E(SHE) − E(target vs SHE at T); :mod:`calc.refelec`.

    >>> round(on_scale(0.0, "SCE", 25.0)[0], 4)
    -0.2412
    """
    ref = reference_potential(target, temp_C, field="electrode")
    return E_she - ref.E_V_SHE, ref


def read_reading(value, field):
    """A potential reading as given: a number of volts within ±10 V.

    Args:
        value: the reading [V vs its electrode]
        field: the request field, for the error [unitless]

    Returns:
        the reading [V]

    References:
        Decision of this project (module notes): more than 10 V from zero is no potential reading.

    >>> read_reading("-0.85", "reading_V")
    -0.85
    """
    return check("reading_V", value, field)


def plausibility(value_V, E_she, field, kind, electrode_id):
    """Refuse a reading outside the plausible window (module notes); the warnings of one let through.

    Args:
        value_V: the reading as given [V vs electrode]
        E_she: the reading on the SHE scale [V vs SHE]
        field: the request field, for the error [unitless]
        kind: ``on``, ``instant-off`` or ``corrosion`` (a corrosion potential) [unitless]
        electrode_id: the electrode it was read against, for the message [unitless]

    Returns:
        list of warnings (``{field, message}``); empty for a plausible reading

    References:
        Decision of this project, common practice: magnesium anodes about −2.5 V and oxygen
        evolution about +1.0 V vs CSE bound the potentials of metals in water or soil.

    >>> plausibility(-0.85, -0.534, "reading_V", "instant-off", "CSE")
    []
    """
    lo, hi = PLAUSIBLE_SHE_V
    where = f"{fmt(value_V)} V vs {electrode_id} is {fmt(E_she, 4)} V vs SHE"
    if E_she > hi + EPS_V:
        raise InputError(field, value_V, f"a potential no more positive than {fmt(hi)} V vs SHE (about +1 V vs CSE)",
                         f"{where}: no metal under cathodic protection or freely corroding in water or soil reads "
                         "this; check the sign, the meter leads and the electrode named")
    if E_she < lo - EPS_V:
        if kind == "on":
            return [{"field": field, "message": f"{where}: more negative than any polarised potential, so this on "
                                                "reading holds a large IR drop; only an instant-off reading can be "
                                                "judged against the criteria"}]
        raise InputError(field, value_V,
                         f"a potential no more negative than {fmt(lo)} V vs SHE (about −2.5 V vs CSE)",
                         f"{where}: more negative than a magnesium anode, which no "
                         f"{'polarised' if kind == 'instant-off' else 'corrosion'} potential reaches; check the "
                         "sign, the meter leads and the electrode named")
    return []
