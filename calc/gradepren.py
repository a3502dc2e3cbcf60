"""The PREN of a material record, from the composition limits of its grade's material standard.

The formulas are :func:`calc.passivity.pren` and :func:`calc.passivity.pren_w`; this module reads
the record's ``composition_limits_*`` fields and gives the PREN at both ends of the limits.
"""

from dataclasses import dataclass

from .passivity import pren, pren_w

#: the fields of a material record that hold its composition limits [wt %]
LIMITS_MIN, LIMITS_MAX = "composition_limits_min_wt_pct", "composition_limits_max_wt_pct"


@dataclass(frozen=True)
class GradePren:
    """PREN of a grade at the minimum and at the maximum of its composition limits.

    ``low``/``high`` are (cr, mo, n, w) in wt % (w None when the grade specifies no tungsten);
    ``basis`` is the record's ``composition_limits_basis`` (``specification`` or ``nominal``).
    """

    pren_min: float
    pren_max: float
    formula: str
    low: tuple
    high: tuple
    basis: str
    source: str
    confidence: str


def _limit(limits, el):
    value = limits.get(el, 0.0)
    return float(value) if isinstance(value, (int, float)) and not isinstance(value, bool) else 0.0


def record_pren(rec):
    """PREN of a material record from its composition limits, or None when it has none.

    An element the limits do not list is taken as 0 (not specified); with tungsten in the limits
    the ISO 15156-3 form :func:`pren_w` is used, else :func:`pren`. The minimum composition gives
    the PREN a heat of the grade is sure to have.

    Args:
        rec: a material record with ``composition_limits_min_wt_pct`` and
            ``composition_limits_max_wt_pct`` (element -> share) [wt %]

    Returns:
        a :class:`GradePren` (PREN [unitless], compositions [wt %]), or None without Cr limits

    References:
        :func:`pren`, :func:`pren_w`; the limits are the data's (their source in the record).

    >>> r = record_pren({"composition_limits_min_wt_pct": {"Cr": 22.0, "Mo": 3.0, "N": 0.14},
    ...                  "composition_limits_max_wt_pct": {"Cr": 23.0, "Mo": 3.5, "N": 0.20}})
    >>> round(r.pren_min, 2), round(r.pren_max, 2), r.formula
    (34.14, 37.75, 'PREN = Cr + 3.3·Mo + 16·N')
    >>> record_pren({"id": "demo-copper"}) is None
    True
    """
    lo, hi = rec.get(LIMITS_MIN), rec.get(LIMITS_MAX)
    if not (isinstance(lo, dict) and isinstance(hi, dict) and "Cr" in lo and "Cr" in hi):
        return None
    tungsten = "W" in lo or "W" in hi
    ends = []
    for limits in (lo, hi):
        cr, mo, n = _limit(limits, "Cr"), _limit(limits, "Mo"), _limit(limits, "N")
        w = _limit(limits, "W") if tungsten else None
        ends.append((cr, mo, n, w))
    if tungsten:
        values = [pren_w(cr, mo, w, n) for cr, mo, n, w in ends]
        formula = "PREN_W = Cr + 3.3·(Mo + 0.5·W) + 16·N (ISO 15156-3)"
    else:
        values = [pren(cr, mo, n) for cr, mo, n, _ in ends]
        formula = "PREN = Cr + 3.3·Mo + 16·N"
    return GradePren(values[0], values[1], formula, ends[0], ends[1], str(rec.get("composition_limits_basis") or ""),
                     str(rec.get("composition_limits_source") or ""),
                     str(rec.get("composition_limits_confidence") or ""))
