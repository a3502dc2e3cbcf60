"""The design catalogues of the dataset: anode materials and types, coatings, current densities, tables.

Every lookup is forgiving (id, alias; case, spaces, hyphens and underscores ignored) and an unknown
name gets the closest ones in its message (:meth:`calc.dataset.Dataset.get`). The records are those
of ``data/cp_anode_alloys.yaml``, ``cp_anode_types.yaml``, ``cp_coatings.yaml``,
``cp_current_densities.yaml`` and ``cp_design_tables.yaml``, each with its source and confidence.
"""

import re

from ..dataset import current
from ..errors import DataError, InputError

#: catalogue -> what its entries are, for the message about an unknown one
KINDS = {"cp_anode_alloys": "an anode material of the dataset", "cp_anode_types": "an anode type of the dataset",
         "cp_coatings": "a coating category of the dataset, or bare", "cp_structures": "a structure material of the dataset",
         "cp_criteria": "a protection criterion of the dataset", "cp_current_densities": "a climatic region of the dataset"}

#: use of an anode material -> its words
USES = {"seawater": "seawater", "buried": "buried structures", "impressed": "impressed current"}


def record(kind, name, field):
    """One record of a design catalogue by id or alias.

    Args:
        kind: the catalogue, e.g. ``cp_coatings`` [unitless]
        name: the id or an alias as given [unitless]
        field: the request field, for the error [unitless]

    Returns:
        the record (a dict)

    References:
        Lookup rule of the project (DESIGN.md: lookups are forgiving, with the closest matches).

    >>> record("cp_coatings", "Category II", "coating")["id"]
    'category-ii'
    """
    try:
        return current().get(kind, name, field)
    except InputError as exc:  # the dataset's words name the catalogue and its ids: say it by names
        close = [short_name(current().get(kind, i)) for i in exc.hint[len("closest: "):].split(", ")
                 ] if exc.hint.startswith("closest: ") else []
        raise InputError(field, name, KINDS.get(kind, "an entry of the dataset"),
                         ("closest: " + "; ".join(close)) if close else "see the reference pages for the list") from None


def short_name(rec):
    """A record's name without its explanation: "Category II" of "Category II: primer and ...".

    Args:
        rec: a catalogue record [unitless]

    Returns:
        the name up to its first colon or bracket

    References:
        Presentation rule of the project (users read names, not ids).

    >>> short_name({"id": "x", "name": "Zinc alloy (any)"})
    'Zinc alloy'
    """
    return re.split(r": | \(", rec.get("name") or rec["id"], maxsplit=1)[0]


def names_of(kind, keep=lambda rec: True):
    """The short names of a catalogue's records, joined for a message ("A, B or C").

    Args:
        kind: the catalogue, e.g. ``cp_anode_alloys`` [unitless]
        keep: which records to name [unitless]

    Returns:
        the names in file order, the last joined by "or"

    References:
        Presentation rule of the project (users read names, not ids).

    >>> names_of("cp_coatings").endswith("or Category III")
    True
    """
    names = [short_name(r) for r in current().records(kind) if keep(r)]
    return names[0] if len(names) == 1 else ", ".join(names[:-1]) + " or " + names[-1]


def alloy_group(name, group, field="alloy"):
    """An anode material's design values for one use: ``seawater``, ``buried`` or ``impressed``.

    Args:
        name: the material's id or alias [unitless]
        group: ``seawater``, ``buried`` or ``impressed`` [unitless]
        field: the request field, for the error [unitless]

    Returns:
        (the material record, its values for that use)

    References:
        data/cp_anode_alloys.yaml (each group cites its source).

    >>> rec, sea = alloy_group("aluminium", "seawater")
    >>> rec["id"], sea["capacity_Ah_per_kg"]
    ('al-zn-in', 2000)
    """
    rec = record("cp_anode_alloys", name, field)
    if not isinstance(rec.get(group), dict):
        fits = names_of("cp_anode_alloys", lambda r: isinstance(r.get(group), dict))
        raise InputError(field, name, f"an anode material with design values for {USES[group]}: {fits}")
    return rec, rec[group]


def band_of(bands, depth, field):
    """The depth band of a list of bands ``[{depth_m: [from, to), ...}]`` that holds a depth.

    Args:
        bands: the bands of a record, in order [unitless]
        depth: the depth below the surface [m]
        field: the request field, for the error [unitless]

    Returns:
        the band (a dict)

    References:
        Depth bands of the offshore design tables (DNV-RP-B401), as the data files hold them.

    >>> band_of([{"depth_m": [0, 30]}, {"depth_m": [30, None]}], 30.0, "depth_m")["depth_m"]
    [30, None]
    """
    for band in bands:
        low, high = band["depth_m"]
        if depth >= (low or 0.0) and (high is None or depth < high):
            return band
    raise InputError(field, depth, "a depth inside the bands of the table", "the table starts at "
                     f"{bands[0]['depth_m'][0]} m")


def region_for(temp_C):
    """The climatic region whose surface-water temperature span holds a temperature.

    Args:
        temp_C: surface-water temperature [°C]

    Returns:
        the region record of data/cp_current_densities.yaml

    References:
        Regions by surface-water temperature of DNV-RP-B401 (2010, recalled), as the data holds them.

    >>> region_for(10.0)["id"]
    'temperate'
    """
    for rec in current().records("cp_current_densities"):
        span = rec.get("surface_water_C")
        if rec.get("zone") != "seawater" or not span:
            continue
        low, high = span
        if (low is None or temp_C >= low) and (high is None or temp_C < high):
            return rec
    raise DataError(f"no climatic region of the dataset holds {temp_C} °C")


def table(table_id):
    """One table of data/cp_design_tables.yaml.

    Args:
        table_id: e.g. ``paralleling-factor`` [unitless]

    Returns:
        the table record (its ``rows`` in file order)

    References:
        data/cp_design_tables.yaml (each table or row cites its source).

    >>> len(table("structure-potential-factor")["rows"])
    7
    """
    for rec in current().records("cp_design_tables"):
        if rec.get("id") == table_id:
            return rec
    raise DataError(f"the dataset holds no {table_id} table: rebuild it ('couplewise data bundle')")


def row_source(tab, row):
    """The source id and confidence of one row of a design table (its own, else its table's).

    Args:
        tab: the table record [unitless]
        row: one of its rows [unitless]

    Returns:
        (source id, confidence)

    References:
        data/cp_design_tables.yaml layout (rows may carry their own source).

    >>> tab = table("paralleling-factor"); row_source(tab, tab["rows"][1])
    ('mil-hdbk-1004-10', 'read')
    """
    return row.get("source", tab.get("source")), row.get("confidence", tab.get("confidence"))


def paralleling_factor(count, field="count"):
    """The handbook's paralleling factor P for N vertical anodes in a line.

    Args:
        count: number of anodes N [unitless]
        field: the request field, for the error [unitless]

    Returns:
        (P, its table row) with P for ρ in Ω·cm and S in ft [ft/cm]

    References:
        MIL-HDBK-1004/10 para 6.2.1.4b; USACE ETL 1110-9-10 (1991) Table 3-5 (data/cp_design_tables.yaml).

    >>> paralleling_factor(3)[0]
    0.00289
    """
    tab = table("paralleling-factor")
    for row in tab["rows"]:
        if row["count"] == count:
            return row["P"], row
    counts = ", ".join(str(r["count"]) for r in tab["rows"])
    raise InputError(field, count, f"a number of anodes the handbook's paralleling table holds ({counts})",
                     "or choose Sunde's formula for the paralleling")
