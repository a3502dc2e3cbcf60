"""Typed numbers, read by one rule; and typed text shown back so that it cannot mislead.

The command line reads every number it is given here. The page reads typed numbers by the same
rule (``docs/assets/js/numbers.mjs``); both are tested against one table of cases,
``tests/fixtures/numbers.json``.

The rule: a plain decimal number, as a person writes it. Digits 0-9; one decimal mark, a point or
a comma (a comma only where it cannot be a thousands separator: ``1,5`` and ``0,125`` are read,
``1,000`` is refused as ambiguous); an optional exponent (``e`` or ``E``); a sign: hyphen, true
minus (U+2212) or plus. Spaces, tabs and no-break spaces around it are ignored. Anything else
(``1_000``, ``0x10``, ``inf``, ``nan``, ``1.000,5``, Unicode digits) is refused, and the refusal
says what was read and what to write instead.
"""

import math
import re
import unicodedata

_SIGN = "[+\\-\u2212]"
_PLAIN = re.compile(f"({_SIGN}?)([0-9]*)(?:([.,])([0-9]*))?(?:[eE]({_SIGN}?[0-9]+))?")
_EDGE = " \t\n\r\f\v\u00a0"
_RADIX = re.compile(f"{_SIGN}?0[xXbBoO]")
_NONFINITE = re.compile(f"{_SIGN}?(?:inf|infinity|nan|\u221e)", re.IGNORECASE)
_COMMA_GROUPS = re.compile(f"{_SIGN}?[0-9]{{1,3}}(?:,[0-9]{{3}})+(?:\\.[0-9]*)?")
_POINT_GROUPS = re.compile(f"{_SIGN}?[0-9]{{1,3}}(?:(?:\\.[0-9]{{3}}){{2,}}(?:,[0-9]*)?|(?:\\.[0-9]{{3}})+,[0-9]*)")
_SPACE_GROUPS = re.compile(f"{_SIGN}?[0-9]{{1,3}}(?:[ \u00a0\u202f][0-9]{{3}})+(?:[.,][0-9]*)?")
_MARKS_ONLY = re.compile(f"{_SIGN}?[0-9.,]+")

#: what each refusal says: the problem (after the echo of the text) and what to write instead
PROBLEMS = {
    "empty": ("is empty", ""),
    "format": ("is not a number", "write digits with one point or comma, e.g. −0.85 or 12,5"),
    "thousands": ("is ambiguous: a comma before three digits may separate thousands", "use {fix}"),
    "grouped": ("holds digit-group separators, which are not read", "use {fix}"),
    "underscore": ("holds underscores, which are not read", "use {fix}"),
    "radix": ("is not a decimal number: hexadecimal, binary and octal are not read", "write it in decimal digits"),
    "nonfinite": ("is not a finite number", "write a decimal number such as −0.85"),
    "marks": ("has more than one decimal mark", "use one point or one comma"),
    "overflow": ("is too large to be a number", ""),
}

#: most characters of typed text shown in a message [characters]
ECHO_MAX = 56
_INVISIBLE = {"Cc", "Cf", "Cs", "Zl", "Zp"}


class NumberError(ValueError):
    """Typed text that is not a number by the rule: its kind, the text, the texts to suggest.

    >>> str(NumberError("thousands", "1,000", ["1000", "1.000"]))
    '“1,000” is ambiguous: a comma before three digits may separate thousands; use 1000 or 1.000'
    >>> str(NumberError("format", "abc", [], field="--activity Zn2+")).split(";")[0]
    '--activity Zn2+: “abc” is not a number'
    """

    def __init__(self, kind, text, fix, field=""):
        self.kind, self.text, self.fix, self.field = kind, text, list(fix), field
        problem, advice = PROBLEMS[kind]
        advice = advice.replace("{fix}", " or ".join(self.fix))
        message = f"{echo(text)} {problem}" + (f"; {advice}" if advice else "")
        super().__init__(f"{field}: {message}" if field else message)


def _plain(s):
    """The value of a plain number, a refusal (kind, fix) for one that only looks plain, or None."""
    m = _PLAIN.fullmatch(s)
    if not m or (m.group(2) == "" and not m.group(4)):
        return None
    sign, whole, mark, frac, exp = m.groups()
    frac = frac or ""
    if mark == "," and re.fullmatch("[1-9][0-9]{0,2}", whole) and len(frac) == 3:
        return ("thousands", [s.replace(",", "", 1), s.replace(",", ".", 1)])
    text = sign.replace("\u2212", "-") + (whole or "0") + "." + (frac or "0")
    if exp is not None:
        text += "e" + exp.replace("\u2212", "-")
    value = float(text)
    return value if math.isfinite(value) else ("overflow", [])


def read_number(text, field=""):
    """A number typed by a person, read by the one rule of the project (see the module's text).

    Args:
        text: the text as typed [unitless]
        field: the field named in the error, e.g. an option; empty for none [unitless]

    Returns:
        the number [the unit of the field]

    Raises:
        NumberError: the text is not a plain decimal number; its message says what to write.

    References:
        Input rule of the project (issue 20: typed numbers read as a person means them), common
        practice for decimal marks and digit grouping (a comma before three digits is read as a
        thousands separator in English, as a decimal mark in much of Europe).

    >>> read_number("−0,85"), read_number(" 1.5e-3 "), read_number("0,125")
    (-0.85, 0.0015, 0.125)
    >>> try:
    ...     read_number("0x10")
    ... except NumberError as err:
    ...     print(err.kind, str(err).split(":")[0])
    radix “0x10” is not a decimal number
    """
    raw = str(text)
    s = raw.strip(_EDGE)
    if s == "":
        raise NumberError("empty", s, [], field)
    p = _plain(s)
    if isinstance(p, float):
        return p
    if p is not None:
        raise NumberError(p[0], s, p[1], field)
    kind, fix = "format", []
    if _NONFINITE.fullmatch(s):
        kind = "nonfinite"
    elif _RADIX.match(s):
        kind = "radix"
    elif "_" in s and isinstance(_plain(s.replace("_", "")), float):
        kind, fix = "underscore", [s.replace("_", "")]
    elif _COMMA_GROUPS.fullmatch(s):
        kind, fix = "grouped", [s.replace(",", "")]
    elif _POINT_GROUPS.fullmatch(s):
        kind, fix = "grouped", [s.replace(".", "").replace(",", ".", 1)]
    elif _SPACE_GROUPS.fullmatch(s):
        kind, fix = "grouped", [re.sub("[ \u00a0\u202f]", "", s).replace(",", ".", 1)]
    elif len(re.findall("[.,]", s)) > 1 and _MARKS_ONLY.fullmatch(s):
        kind = "marks"
    raise NumberError(kind, s, fix, field)  # what was read: the text without its edges


def visible(text, most=ECHO_MAX):
    """Typed text made safe to show: control, format and separator characters as \\uXXXX, cut.

    Args:
        text: the text as typed [unitless]
        most: the most characters shown [characters]

    Returns:
        (shown, cut, count): the text as shown, whether it was cut, its length [characters]

    References:
        Unicode Standard Annex #9, Unicode Bidirectional Algorithm (explicit formatting characters
        act on the text after them); project rule: an echo never acts on the message around it.

    >>> visible("1\\u202e5")
    ('1\\\\u202E5', False, 3)
    >>> visible("x" * 1000)[1:]
    (True, 1000)
    """
    shown, length, count, cut = [], 0, 0, False
    for ch in str(text):
        count += 1
        if cut:
            continue
        piece = ch
        if unicodedata.category(ch) in _INVISIBLE:
            cp = ord(ch)
            piece = f"\\u{{{cp:X}}}" if cp > 0xFFFF else f"\\u{cp:04X}"
        n = 1 if piece == ch else len(piece)
        if length + n > most:
            cut = True
            continue
        shown.append(piece)
        length += n
    return "".join(shown), cut, count


def echo(text):
    """Typed text as a message quotes it: made visible, in quotes, cut with its length.

    Args:
        text: the text as typed [unitless]

    Returns:
        the quoted text for a one-line message [unitless]

    References:
        Project rule (issue 20: echoes that cannot mislead).

    >>> echo("0x10")
    '“0x10”'
    >>> echo("9" * 100000)
    '“99999999999999999999999999999999999999999999999999999999…” (100000 characters)'
    """
    shown, cut, count = visible(text)
    return f"“{shown}…” ({count} characters)" if cut else f"“{shown}”"
