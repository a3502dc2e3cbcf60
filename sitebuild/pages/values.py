"""Data values as page text: numbers as written in the data, ranges, any other value."""

from .text import Md


def isnum(value):
    """True for an int or float that is not a bool."""
    return isinstance(value, (int, float)) and not isinstance(value, bool)


def num(value, places=0):
    """A number as written in the data (shortest round-trip form), with at least ``places`` decimals.

    >>> num(0.1, 2), num(-0.5), num(3), num(2.0), num(1e-05)
    (Md('0.10'), Md('-0.5'), Md('3'), Md('2'), Md('1e-05'))
    """
    if not isnum(value):
        return Md.escape(value)
    if isinstance(value, int):
        return Md(f"{value:.{places}f}" if places else str(value))
    text = repr(value)
    if "e" in text or "n" in text:  # exponent, nan, inf
        return Md(text)
    decimals = len(text.split(".")[1]) if "." in text else 0
    if text.endswith(".0") and not places:
        return Md(text[:-2])
    return Md(f"{value:.{max(decimals, places)}f}")


def signed(value, places=0):
    """:func:`num` with a plus sign on a positive number.

    >>> signed(0.34, 2), signed(-0.44)
    (Md('+0.34'), Md('-0.44'))
    """
    text = num(value, places)
    return Md("+") + text if isnum(value) and value > 0 else text


def pair_text(pair, unit, sep=" to ", places=0):
    """A [low, high] pair as signed numbers: ``-0.60 to -0.50 V``; anything else escaped.

    >>> pair_text([-0.6, -0.5], "V", places=2)
    Md('-0.60 to -0.50 V')
    """
    if isinstance(pair, list) and len(pair) == 2:
        return Md(f"{signed(pair[0], places)}{sep}{signed(pair[1], places)} {unit}".strip())
    return Md.escape(pair)


def range_text(pair, unit):
    """A [low, high] range without signs, ``0 to 100 °C``.

    >>> range_text([0, 100], "°C")
    Md('0 to 100 °C')
    """
    return Md("{} to {} " + unit).format(num(pair[0]), num(pair[1]))


def value_text(value, unit=""):
    """Any data value as escaped text: numbers as written, [a, b] as a range, mappings as k v.

    >>> value_text({"Cu": 70, "Ni": [29, 31]}), value_text(True), value_text("a*b", "m")
    (Md('Cu 70, Ni 29 to 31'), Md('yes'), Md('a&#42;b m'))
    """
    unit = f" {unit}" if unit else ""
    if isnum(value):
        return num(value) + Md(unit)
    if isinstance(value, list) and len(value) == 2 and all(isnum(v) for v in value):
        return range_text(value, "").rstrip() + Md(unit)
    if isinstance(value, list):
        return Md(", ").join(value_text(v) for v in value) + Md(unit)
    if isinstance(value, dict):
        return Md(", ").join(Md("{} {}").format(k, value_text(v)) for k, v in value.items()) + Md(unit)
    if isinstance(value, bool):
        return Md("yes" if value else "no")
    return Md.escape(value) + Md(unit)


def _prefixes(field):
    parts = str(field).split("_")
    return ["_".join(parts[:i]) for i in range(len(parts) - 1, 0, -1)]


def leftover_rows(page, rec, shown, what, link):
    """(label, value) rows for fields no page knows, so that no data value is ever dropped silently.

    Args:
        page: the page being written (its ``cite`` links the value's source) [unitless]
        rec: the record [unitless]
        shown: the fields the page shows already [unitless]
        what: the record's name, for the bibliography's "cited for" [unitless]
        link: the record's link from the bibliography [unitless]
    """
    rows = []
    for key, value in rec.items():
        if key in shown or key.endswith(("_source", "_confidence", "_where")) \
                or key in ("source", "confidence", "where"):
            continue
        if value is None or value == [] or value == {}:
            continue
        prefix = next((p for p in _prefixes(key) if f"{p}_source" in rec), key)
        rows.append((Md.escape(key.replace("_", " ")),
                     value_text(value) + page.cite(rec, prefix, what=f"{key} of {what}", link=link)))
    return rows
