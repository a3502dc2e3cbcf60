"""Soil resistivity from a Wenner four-pin reading (ASTM G57).

Four pins in a line at equal spacing a: a current between the outer pins, the voltage between the
inner ones; their ratio R gives the average resistivity to a depth of about a, ρ = 2π·a·R.
"""

import math

from ..dataset import current
from ..derivation import Derivation, fmt
from ..requests import read
from .cautions import cautions
from .catalogue import table
from .limits import check
from .units import FT_M, OHM_CM_PER_OHM_M


def wenner(spacing, resistance):
    """Soil resistivity of a Wenner four-electrode reading, ρ = 2π·a·R.

    Args:
        spacing: pin spacing a [m]
        resistance: the instrument's reading R = V/I [Ω]

    Returns:
        resistivity [Ω·m]

    References:
        ASTM G57-95a (2001), Sec. 3.2: ρ = 2π·a·R (a in cm gives Ω·cm; a in m gives Ω·m).

    >>> round(wenner(1.524, 2.5), 3)  # 5 ft pin spacing, 2.5 ohm
    23.939
    """
    return 2.0 * math.pi * spacing * resistance


def wenner_entry(request):
    """JSON entry point ``wenner``: soil resistivity from a Wenner four-pin reading.

    Args:
        request: ``{"spacing_m": a, "resistance_ohm": R}`` [m, Ω]

    Returns:
        dict with resistivity_ohm_m, resistivity_ohm_cm, spacing_m, resistance_ohm, depth_m (the
        depth the reading averages to, about the spacing), steps, warnings, cautions, sources,
        data_version

    References:
        :func:`wenner`; ASTM G57-95a (2001) Sec. 3.2 (data/cp_design_tables.yaml, wenner-constant).

    >>> r = wenner_entry({"spacing_m": 3.048, "resistance_ohm": 2.0})
    >>> round(r["resistivity_ohm_cm"])  # 10 ft spacing: 191.5 × 10 × 2 = 3830 Ω·cm
    3830
    """
    read(request, "wenner", {"spacing_m": "the pin spacing a in m", "resistance_ohm": "the reading R in Ω"})
    a = check("spacing_m", request["spacing_m"])
    r = check("resistance_ohm", request["resistance_ohm"])
    rho = wenner(a, r)
    d = Derivation()
    d.step("Soil resistivity (Wenner four-pin method)", "ρ = 2π·a·R",
           f"ρ = 2π × {fmt(a)} m × {fmt(r)} Ω", f"ρ = {fmt(rho, 5)} Ω·m = {fmt(rho * OHM_CM_PER_OHM_M, 5)} Ω·cm")
    tab = table("wenner-constant")
    d.cite(tab["source"])
    factor = tab["rows"][0]["factor_ohm_cm_per_ft_ohm"]
    d.step("The same in the feet form of the standard", f"ρ [Ω·cm] = {fmt(factor)} × a [ft] × R [Ω]",
           f"ρ = {fmt(factor)} × {fmt(a / FT_M, 5)} ft × {fmt(r)} Ω",
           f"ρ = {fmt(factor * a / FT_M * r, 5)} Ω·cm (the factor is 2π × 30.48 cm rounded)")
    return {"resistivity_ohm_m": rho, "resistivity_ohm_cm": rho * OHM_CM_PER_OHM_M, "spacing_m": a,
            "resistance_ohm": r, "depth_m": a, "steps": d.steps, "warnings": d.warnings,
            "cautions": cautions("resistivity"), "sources": d.sources, "data_version": current().version}
