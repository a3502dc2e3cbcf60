"""Data text on a generated page: the one escape every data string goes through.

Data is text, never HTML or Markdown: :func:`esc` writes the characters that mean something to
Markdown, its extensions or HTML as character references, so a ``<script>`` in a note shows
literally. :class:`Md` is page text already made safe; joining, adding or formatting a plain
string into it escapes that string with :func:`esc` (the templates' autoescape does the same).
"""

import html
import re

from markupsafe import Markup

# characters that mean something to Markdown or its extensions (tables, attr_list, emoji,
# mark, caret, tilde, arithmatex) or to HTML: written as character references
_ESCAPE = {c: f"&#{ord(c)};" for c in "\\`*_{}[]#|~^=:$<>\"'&"}
_ESCAPE_TABLE = str.maketrans(_ESCAPE)
_CONTROL_RE = re.compile(r"[\x00-\x08\x0b\x0c\x0e-\x1f\x7f]")
_SPACE_RE = re.compile(r"\s+")


def esc(text):
    """Data text as Markdown that renders to exactly that text (no markup, no HTML).

    Args:
        text: any data value; None gives an empty string [unitless]

    Returns:
        the escaped text, on one line

    >>> esc("<script>alert(1)</script>")
    '&#60;script&#62;alert(1)&#60;/script&#62;'
    >>> esc("a | b *c*")
    'a &#124; b &#42;c&#42;'
    """
    if text is None:
        return ""
    text = _CONTROL_RE.sub("\ufffd", str(text))
    text = _SPACE_RE.sub(" ", text).strip()
    return text.translate(_ESCAPE_TABLE).replace("--", "-&#45;")


class Md(Markup):
    """Page text that is safe as Markdown and as HTML.

    Like markupsafe's ``Markup`` (which Jinja2's autoescape uses), but a plain string joined,
    added or formatted into it is escaped with :func:`esc`, and None is the empty string.

    >>> Md("<br>").join(["a*b", Md("<sup>2</sup>")])
    Md('a&#42;b<br><sup>2</sup>')
    >>> Md("{} V").format(None), Md("<sub>{}</sub>").format("<2>")
    (Md(' V'), Md('<sub>&#60;2&#62;</sub>'))
    """

    __slots__ = ()

    @classmethod
    def escape(cls, s):
        """``s`` as :class:`Md`: kept if it is markup already, else escaped with :func:`esc`."""
        if hasattr(s, "__html__"):
            return cls(s.__html__())
        return cls(esc(s))

    def format(self, *args, **kwargs):
        """str.format with every argument escaped (None gives the empty string)."""
        return super().format(*map(self.escape, args), **{k: self.escape(v) for k, v in kwargs.items()})


#: the mark of a missing value
DASH = Md("–")


def code_text(text):
    """Text for inside a code span: no backticks, no line breaks (code spans show text literally)."""
    return re.sub(r"\s+", " ", str(text)).replace("`", "'")


def attr(text):
    """Text for inside a double-quoted HTML attribute."""
    return html.escape(re.sub(r"\s+", " ", str(text)), quote=True)
