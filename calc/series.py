"""Galvanic series positions and the verdict tiers of a pair of metals.

The tier rule is written here once; the joint judgement (:mod:`calc.joint`), the matrix and the
measured joint (site readings) all call :func:`tier_for`.
"""

#: verdict tiers, best first (our own names)
TIERS = ("matched", "compatible", "guarded", "unsuited")
#: what each tier means, in plain words
TIER_MEANING = {
    "matched": "the potentials are so close that the galvanic effect is negligible",
    "compatible": "the difference is within what this environment allows",
    "guarded": ("within the allowance as named, but the published spread of the potentials or a change "
                "between passive and active state takes it beyond: acceptable only with precautions"),
    "unsuited": ("the difference exceeds what this environment allows: the anode will corrode faster "
                 "where the metals meet; do not join them bare"),
}
#: tolerance on the limit comparison, so 0.65 - 0.50 counts as 0.15 [V]
EPS_V = 1e-9


def midpoint(range_V):
    """Nominal potential of a published range: its mid-point, or None when it is not a pair.

    Args:
        range_V: ``[active end, noble end]`` of a galvanic-series range [V vs SCE]

    Returns:
        (low + high) / 2 rounded to 1e-9 V [V vs SCE], or None

    References:
        ASTM G82-98 (R2014) §5 and Fig. 1 (a material's position is a range; we take its mid-point).

    >>> midpoint([-0.72, -0.60]), midpoint(None)
    (-0.66, None)
    """
    if not isinstance(range_V, (list, tuple)) or len(range_V) != 2:
        return None
    return round((float(range_V[0]) + float(range_V[1])) / 2.0, 9)


def tier_for(delta_E_V, worst_V, allowable_V, negligible_V=None, state_fail=False):
    """Verdict tier of a pair from its nominal and worst-case potential difference.

    ``unsuited`` when the nominal difference exceeds the allowable; otherwise ``guarded`` when the
    worst case of the published ranges exceeds it, or a change of passive/active state does
    (``state_fail``); otherwise ``matched`` when the nominal difference is within the negligible
    band, else ``compatible``. Limits are inclusive.

    Args:
        delta_E_V: nominal potential difference [V]
        worst_V: largest difference the published ranges allow [V]
        allowable_V: allowable difference of the environment [V]
        negligible_V: difference treated as negligible, or None [V]
        state_fail: whether the other state of a passive/active alloy exceeds the allowable [unitless]

    Returns:
        one of :data:`TIERS`

    References:
        ASTM G82-98 (R2014) §5-6 (use of a galvanic series); legacy anodic-index table limits.

    >>> tier_for(0.15, 0.15, 0.15)
    'compatible'
    >>> tier_for(0.20, 0.20, 0.15)
    'unsuited'
    >>> tier_for(0.06, 0.16, 0.25, 0.05)
    'compatible'
    >>> tier_for(0.20, 0.30, 0.25, 0.05)
    'guarded'
    >>> tier_for(0.03, 0.03, 0.25, 0.05, state_fail=True)
    'guarded'
    """
    if delta_E_V > allowable_V + EPS_V:
        return "unsuited"
    if state_fail or worst_V > allowable_V + EPS_V:
        return "guarded"
    if negligible_V is not None and delta_E_V <= negligible_V + EPS_V:
        return "matched"
    return "compatible"
