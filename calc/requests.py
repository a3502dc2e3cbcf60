"""The one reader of entry-point requests: shape, field names, required fields, names.

Every JSON entry point (:mod:`calc.api`) starts by reading its request here, so an unknown field,
a missing one or a request that is not an object gets the same message from every calculator.
"""

import re

from .errors import InputError

#: longest free-text label accepted (a part's name on site, a structure's name) [characters]
NAME_MAX = 100


def norm(text):
    """Lookup key of a name: case-folded, with spaces, hyphens and underscores dropped.

    Args:
        text: a name, id or alias as typed [unitless]

    Returns:
        the key two spellings of the same name share

    References:
        Lookup rule of the project (DESIGN.md: lookups are forgiving), common practice.

    >>> norm("Ag/AgCl Sea-water"), norm("UNS_S31600")
    ('ag/agclseawater', 'unss31600')
    """
    return re.sub(r"[\s_\-]+", "", str(text)).casefold()


def read(request, entry, required=None, optional=()):
    """Check one request: a JSON object, no field it does not take, every required field present.

    Args:
        request: the request as decoded from JSON [unitless]
        entry: the entry point's name, for the message [unitless]
        required: field -> plain words for what it must hold, in the order they are reported [unitless]
        optional: the fields it may also hold [unitless]

    Returns:
        the request itself (a dict)

    References:
        Project convention (STYLE.md: typed errors that name the field, the value and what is allowed).

    >>> read({"id": "Zn2+/Zn"}, "electrode", {"id": "a half-reaction id"}, ("temp_C",))
    {'id': 'Zn2+/Zn'}
    >>> read({"idd": 1}, "electrode", {"id": "a half-reaction id"})
    Traceback (most recent call last):
    ...
    calc.errors.InputError: idd = 1: expected no such field (electrode takes: id)
    """
    required = dict(required or {})
    if not isinstance(request, dict):
        raise InputError("request", type(request).__name__, "a JSON object")
    allowed = tuple(required) + tuple(k for k in optional if k not in required)
    for key in request:
        if key not in allowed:
            raise InputError(key, request[key], "no such field", f"{entry} takes: " + ", ".join(allowed))
    for key, words in required.items():
        if key not in request:
            raise InputError(key, None, words)
    return request


def label(value, field, what, longest=NAME_MAX):
    """A free-text label (a part's name on site), stripped; refused when empty or too long.

    Args:
        value: the text given [unitless]
        field: the request field, for the message [unitless]
        what: plain words for the label [unitless]
        longest: most characters allowed [characters]

    Returns:
        the stripped text

    References:
        Project convention (a label is shown back to the user, so it is kept short).

    >>> label("  riser 3 ", "a_name", "a label for the first part")
    'riser 3'
    """
    if not isinstance(value, str) or not value.strip() or len(value) > longest:
        raise InputError(field, value, f"{what} ({longest} characters at most)")
    return value.strip()
