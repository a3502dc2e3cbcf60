"""Shared pieces of every calculation result: input checks, derivation steps, warnings, sources.

A result of the engine carries, besides its numbers, the ordered derivation ``steps`` (each a
dict ``{title, formula, substituted, result}`` with units written out), ``warnings`` (each
``{field, message}``), the ``sources`` (source ids of the data used) and the ``data_version``.
:class:`Derivation` collects them while a calculation runs.

The text of steps, warnings and notes is plain text that reads as it is in a terminal (the CLI
prints it unchanged), with one small markup that the site sets on the page by one rule
(``docs/assets/js/math.mjs``, ``mathNodes``):

- ``^`` raises what follows it: a bracketed group, ``10^(−pH)`` or ``Sc^(1/3)`` (shown raised
  without the brackets), or a signed number, fraction, word or charge: ``a(H+)^2``,
  ``kg^-1/2``, ``λB^1.5``, ``(t − t_ref)^i``, ``SO4^2-``;
- a number in exponent form, as :func:`fmt` and Python write it (``1e-05``, ``1.16572e+36``,
  ``3.27e-3``), is shown as 1 × 10⁻⁵ written out, and bracketed when it is raised itself
  (``1e-10^14``);
- a hyphen-minus before a number, where it is a sign (not inside a word, an id or a range:
  ``cuni-90-10``, ``2.4-4 m/s``), is shown as the minus sign U+2212. Operators written by hand
  in step text use U+2212 (``E_cathode − E_anode``); a negative number raised to a power is
  bracketed, ``(-2)²``.

Write no TeX (``^{...}``, ``\frac``) in step text: the page would show it raised but not typeset,
and the CLI as it is.

The engine accepts temperatures from 0 to 100 °C: liquid water at atmospheric pressure, and the
span of the water correlations used for the Debye–Hückel parameters (Malmberg & Maryott 1956,
0–100 °C). Outside it there is no liquid water at 1 atm, so the input is refused, not warned.
"""

import math

from .errors import InputError

#: the temperature of the tabulated standard potentials [°C]
T_REF_C = 25.0


def fmt(value, digits=6):
    """A number as shown in derivation steps: ``digits`` significant figures, no exponent clutter.

    Args:
        value: the number [any unit]
        digits: significant figures [unitless]

    Returns:
        text

    References:
        Presentation only (no published method).

    >>> fmt(0.0591593535)
    '0.0591594'
    >>> fmt(2.5e-40)
    '2.5e-40'
    """
    if isinstance(value, bool) or not isinstance(value, (int, float)):
        return str(value)
    if value == 0:
        return "0"
    text = f"{value:.{digits}g}"
    return text


def check_number(value, field, allowed, low=None, high=None, low_open=False):
    """A finite real number within bounds, or an :class:`InputError` naming the field.

    Args:
        value: the value given [any unit]
        field: the input field name shown in the error [unitless]
        allowed: plain words for what is allowed, used in the error [unitless]
        low: lowest allowed value, or None [same unit as value]
        high: highest allowed value, or None [same unit as value]
        low_open: True when ``low`` itself is not allowed [unitless]

    Returns:
        the value as a float [same unit as value]

    References:
        Input rule of the project (DESIGN.md: bad input gets a clear message, never a wrong number).

    >>> check_number(0.1, "activities.Zn2+", "a positive number", low=0, low_open=True)
    0.1
    >>> check_number(10 ** 400, "value_V", "a reading")  # doctest: +ELLIPSIS
    Traceback (most recent call last):
    ...
    calc.errors.InputError: value_V = 1000...: expected a reading
    >>> check_number(float("nan"), "temp_C", "a temperature")
    Traceback (most recent call last):
    ...
    calc.errors.InputError: temp_C = nan: expected a temperature
    """
    if isinstance(value, bool) or not isinstance(value, (int, float)):
        if isinstance(value, str):
            try:
                value = float(value.strip())
            except ValueError:
                raise InputError(field, value, allowed) from None
        else:
            raise InputError(field, value, allowed)
    try:
        value = float(value)
    except OverflowError:  # an integer beyond the range of a float
        raise InputError(field, value, allowed) from None
    if not math.isfinite(value):
        raise InputError(field, value, allowed)
    if low is not None and (value < low or (low_open and value == low)):
        raise InputError(field, value, allowed)
    if high is not None and value > high:
        raise InputError(field, value, allowed)
    return value


def check_temperature(value, field="temp_C"):
    """The temperature of a request: default 25 °C, accepted from 0 to 100 °C.

    Args:
        value: temperature, or None for 25 °C [°C]
        field: the input field name shown in an error [unitless]

    Returns:
        the temperature [°C]

    References:
        Range: liquid water at 1 atm, and the 0–100 °C span of C. G. Malmberg and A. A. Maryott,
        J. Res. NBS 56 (1956) 1, eq. (1), used for the dielectric constant.

    >>> check_temperature(None)
    25.0
    >>> check_temperature(120)
    Traceback (most recent call last):
    ...
    calc.errors.InputError: temp_C = 120.0: expected a temperature from 0 to 100 °C (liquid water at 1 atm)
    """
    if value is None:
        return T_REF_C
    from .bounds import check  # the bound is written in calc.bounds (which imports this module)

    return check("temp_C", value, field)


class Derivation:
    """Steps, warnings and source ids collected while one calculation runs.

    >>> d = Derivation()
    >>> d.step("Nernst slope", "s = ln10·R·T/F", "T = 298.15 K", "s = 0.0591594 V")
    >>> d.warn("pH", "pH 15 is outside 0-14")
    >>> d.cite("crc-vanysek"); d.cite(None); d.cite("crc-vanysek")
    >>> d.as_dict()["sources"]
    ['crc-vanysek']
    """

    def __init__(self):
        self.steps = []
        self.warnings = []
        self.sources = []

    def step(self, title, formula, substituted, result):
        """Add one derivation step (units written in the text).

        Args:
            title: what the step computes [unitless]
            formula: the equation, with symbols and units [unitless]
            substituted: the equation with the numbers put in [unitless]
            result: the outcome with its unit [unitless]

        References:
            Presentation of the derivation (no published method).

        >>> d = Derivation(); d.step("a", "b", "c", "d"); d.steps[0]["result"]
        'd'
        """
        self.steps.append({"title": title, "formula": formula, "substituted": substituted, "result": result})

    def warn(self, field, message):
        """Add a warning about one input field (no duplicates).

        Args:
            field: the input field the warning concerns, or None [unitless]
            message: plain words [unitless]

        References:
            Presentation of the derivation (no published method).

        >>> d = Derivation(); d.warn("temp_C", "x"); d.warn("temp_C", "x"); len(d.warnings)
        1
        """
        item = {"field": field, "message": message}
        if item not in self.warnings:
            self.warnings.append(item)

    def cite(self, source_id):
        """Record a source id of the data used (ignored when empty, kept once).

        Args:
            source_id: an id from data/sources.yaml [unitless]

        References:
            Presentation of the derivation (no published method).

        >>> d = Derivation(); d.cite("a"); d.cite("a"); d.sources
        ['a']
        """
        if isinstance(source_id, str) and source_id and source_id not in self.sources:
            self.sources.append(source_id)

    def merge(self, other):
        """Append the steps, warnings and sources of another derivation.

        Args:
            other: another Derivation [unitless]

        References:
            Presentation of the derivation (no published method).

        >>> a = Derivation(); b = Derivation(); b.cite("x"); a.merge(b); a.sources
        ['x']
        """
        self.steps.extend(other.steps)
        for w in other.warnings:
            self.warn(w["field"], w["message"])
        for s in other.sources:
            self.cite(s)

    def as_dict(self):
        """The collected steps, warnings and sources as plain data."""
        return {"steps": list(self.steps), "warnings": list(self.warnings), "sources": list(self.sources)}
