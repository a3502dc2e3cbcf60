"""Where a basis of comparison holds: the rule that puts immersion in the harsh class, and the
warning a galvanic series carries outside the electrolyte it was measured in.

Both are written here once; :mod:`calc.series` applies the first in :func:`calc.series.basis_of`
and the results of the joint and the matrix carry the second with their warnings.
"""

#: why immersed and buried environments take the harsh class of the legacy anodic-index table
IMMERSION_RULE = (
    "continuous immersion (or burial in moist soil) is at least as severe as the harsh class of the legacy "
    "anodic-index table (outdoors, high humidity, salt), the strictest class that table gives; ECSS-Q-70-71's "
    "galvanic table, as ESA restates it, allows in immersion in salt water only the couples of its level 0, "
    "the ones it allows everywhere, so immersion is stricter than any uncontrolled atmosphere; and the anodic "
    "index is itself a scale of potentials against SCE in sea-water (MIL-DTL-14072F §3.13), so the harsh "
    "allowance applies to a difference on the seawater series as it stands. No table read gives a limit of "
    "its own for immersion")
#: the basis of the warning that a galvanic series is used outside its electrolyte
SERIES_SCOPE_BASIS = ("ASTM G82-98 (R2014) §5: a galvanic series is specific to the electrolyte it was measured "
                      "in; MIL-STD-889B Notice 1 (1979) §5.1.2: for each electrolyte a different order or series "
                      "will ensue")
#: warning codes: the series was measured in another electrolyte (loud), or in the same one under other conditions
SERIES_OTHER_ELECTROLYTE = "series-other-electrolyte"
SERIES_OTHER_CONDITIONS = "series-other-conditions"


def series_caveat(basis):
    """What the warning of a galvanic series used outside its own environment says of itself.

    Args:
        basis: the environment's :class:`calc.series.Basis` [unitless]

    Returns:
        ``{"code", "basis"}``: code :data:`SERIES_OTHER_ELECTROLYTE` when the series was measured in
        another electrolyte (soil or fresh water judged on the seawater series: to be shown loud),
        :data:`SERIES_OTHER_CONDITIONS` when in the same electrolyte under other conditions (still
        instead of flowing seawater); None when the series is the environment's own or the basis is
        the anodic index

    References:
        ASTM G82-98 (R2014) §5; MIL-STD-889B Notice 1 (1979) §5.1.2 (:data:`SERIES_SCOPE_BASIS`).

    >>> from calc.dataset import current
    >>> from calc.series import basis_of
    >>> ds = current()
    >>> [series_caveat(basis_of(ds.get("environments", e), ds))["code"] for e in ("fresh water", "still seawater")]
    ['series-other-electrolyte', 'series-other-conditions']
    >>> series_caveat(basis_of(ds.get("environments", "seawater-flowing"), ds)) is None
    True
    """
    if basis.kind != "galvanic-series" or basis.series == basis.env_id:
        return None
    code = SERIES_OTHER_ELECTROLYTE if basis.other_electrolyte else SERIES_OTHER_CONDITIONS
    return {"code": code, "basis": SERIES_SCOPE_BASIS}
