"""Typed errors for bad input and bad data.

Every error names the field, the value given and what is allowed, so the command line and the
page can show the message and nothing else.
"""


class InputError(ValueError):
    """Bad input to a calculation: names the field, the value and what is allowed.

    >>> str(InputError("temp_C", 150, "a temperature from 0 to 100 °C"))
    'temp_C = 150: expected a temperature from 0 to 100 °C'
    """

    def __init__(self, field, value, allowed, hint=""):
        self.field = _field_text(field)
        self.value = value
        self.allowed = allowed
        self.hint = hint
        msg = f"{self.field} = {_value_text(value)}: expected {allowed}"
        if hint:
            msg += f" ({hint})"
        super().__init__(_one_line(msg))

    def to_dict(self):
        """The error as plain data for JSON: field, message."""
        return {"field": self.field, "message": str(self)}


#: longest value text shown in a message [characters]
SHOWN_MAX = 200


def _one_line(text):
    return text.replace("\r", "\\r").replace("\n", "\\n")


def _field_text(field):
    """The field name as shown: as given, or quoted when it is empty or holds control characters."""
    text = str(field)
    if not text.strip() or any(ord(c) < 32 or ord(c) == 127 for c in text):
        return repr(text)
    return text


def _value_text(value):
    """The value as shown in a message: strings quoted, one line, at most SHOWN_MAX characters."""
    try:
        text = repr(value) if isinstance(value, str) else str(value)
    except ValueError:  # an integer too long to write out in decimal (Python's 4300-digit limit)
        if isinstance(value, int):
            return f"an integer of about {int(value.bit_length() * 0.30103) + 1} digits"
        return f"a {type(value).__name__} holding an integer too long to show"
    except RecursionError:
        return f"a {type(value).__name__} nested too deeply to show"
    text = _one_line(text)
    if len(text) > SHOWN_MAX:
        text = text[:SHOWN_MAX] + f"… ({len(text)} characters)"
    return text


class DataError(ValueError):
    """The dataset itself is unusable (missing or malformed bundle)."""
