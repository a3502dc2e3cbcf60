"""The basis on which an environment compares two materials, and its limits.

An environment record names its basis (``galvanic-series`` or ``anodic-index``), its allowable and
negligible differences and its severity class; :func:`basis_of` reads them once, checked, for the
verdict rule of :mod:`calc.series` (see its docstring for the two bases and their sources).
"""

from dataclasses import dataclass

from .errors import DataError, InputError
from .scope import IMMERSION_RULE


@dataclass(frozen=True)
class Basis:
    """How an environment compares materials, and its limits."""

    kind: str  # galvanic-series | anodic-index
    env_id: str
    env_name: str
    series: str  # electrolyte the series was measured in ('' for anodic index)
    value_field: str  # material field holding the value
    source_field: str
    confidence_field: str
    allowable_V: float
    allowable_source: str
    negligible_V: float  # or None
    severity: str  # anodic-index severity, or ''
    immersed: bool
    description: str
    series_name: str = ""  # plain name of the series' electrolyte ('' for anodic index)
    electrolyte: str = ""  # the environment's electrolyte in plain words ('' when the record does not say)
    series_electrolyte: str = ""  # the electrolyte the series was measured in ('' when not known)
    allowable_note: str = ""  # why this allowable applies (the immersion rule), or ''

    @property
    def other_electrolyte(self):
        """True when the galvanic series was measured in another electrolyte than the environment's."""
        return (self.kind == "galvanic-series" and bool(self.electrolyte) and bool(self.series_electrolyte)
                and self.electrolyte != self.series_electrolyte)


def _immersed(env):
    """An environment is an immersed electrolyte when it says so or carries an ionic strength."""
    if "immersed" in env and env["immersed"] is not None:
        return bool(env["immersed"])
    if env.get("exposure") in ("immersed", "atmospheric"):
        return env["exposure"] == "immersed"
    return env.get("ionic_strength_mol_per_kg") is not None


def basis_of(env, ds=None):
    """The basis of comparison and the limits of an environment record.

    Args:
        env: an environment record of the dataset [unitless]
        ds: the dataset, to name the electrolyte a galvanic series was measured in; None names it by id [unitless]

    Returns:
        a :class:`Basis` (allowable and negligible differences in [V])

    References:
        ASTM G82-98 (R2014) §5 (a galvanic series belongs to its electrolyte); legacy anodic-index
        table (the allowable difference of each severity class); :data:`IMMERSION_RULE`.

    >>> b = basis_of({"id": "demo", "name": "Demo", "basis": "anodic-index", "severity": "harsh",
    ...               "allowable_V": 0.15, "allowable_source": "x"})
    >>> (b.kind, b.value_field, b.allowable_V)
    ('anodic-index', 'anodic_index_V', 0.15)
    >>> from calc.dataset import current
    >>> soil = basis_of(current().get("environments", "buried-soil"), current())
    >>> (soil.series, soil.electrolyte, soil.series_electrolyte, soil.other_electrolyte)
    ('seawater-flowing', 'soil', 'seawater', True)
    """
    kind = env.get("basis")
    eid = env.get("id", "?")
    if kind not in ("galvanic-series", "anodic-index"):
        raise DataError(f"environments:{eid}:basis: {kind!r} is not galvanic-series or anodic-index")
    allow = env.get("allowable_V")
    if isinstance(allow, bool) or not isinstance(allow, (int, float)) or not allow > 0:
        raise DataError(f"environments:{eid}:allowable_V: {allow!r} is not a positive number")
    neg = env.get("negligible_V")
    neg = float(neg) if isinstance(neg, (int, float)) and not isinstance(neg, bool) else None
    limits = (float(allow), env.get("allowable_source", ""), neg, env.get("severity") or "", _immersed(env))
    name = env.get("name", eid)
    if kind == "galvanic-series":
        series = env.get("series") or eid
        series_name, series_electrolyte = series, env.get("electrolyte", "") if series == eid else ""
        if ds is not None:
            try:
                srec = ds.get("environments", series)
                series_name, series_electrolyte = srec.get("name", series), srec.get("electrolyte", "")
            except InputError:
                pass
        prefix = str(series).split("-")[0].replace(" ", "_").lower()  # 'seawater-flowing' -> 'seawater'
        desc = (f"galvanic series measured in {series_name}: steady corrosion potentials as ranges "
                "in V vs SCE; "
                "the mid-point of a range is the nominal potential and the more negative metal is the anode")
        return Basis(kind, eid, name, series, f"{prefix}_range_V_SCE", f"{prefix}_source", f"{prefix}_confidence",
                     *limits, desc, series_name, env.get("electrolyte") or "", series_electrolyte or "",
                     IMMERSION_RULE if env.get("severity") == "harsh" else "")
    desc = ("anodic index (legacy military/industry table): one value per metal group in V, 0 for gold; "
            "the larger index is the anode; the allowable difference depends on the severity of exposure")
    return Basis(kind, eid, name, "", "anodic_index_V", "anodic_index_source", "anodic_index_confidence",
                 *limits, desc)
