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
        self.field = field
        self.value = value
        self.allowed = allowed
        self.hint = hint
        shown = repr(value) if isinstance(value, str) else value
        msg = f"{field} = {shown}: expected {allowed}"
        if hint:
            msg += f" ({hint})"
        super().__init__(msg)

    def to_dict(self):
        """The error as plain data for JSON: field, message."""
        return {"field": self.field, "message": str(self)}


class DataError(ValueError):
    """The dataset itself is unusable (missing or malformed bundle)."""
