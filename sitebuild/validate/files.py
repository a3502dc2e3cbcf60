"""File-level checks: the schema line first, one top-level key per file; and the record a YAML
problem reported by line number belongs to."""

import os
import re

from ..dataset import FILES

#: files larger than this are reported by the reader, not read again here [bytes]
MAX_SHAPE_BYTES = 2 * 1024 * 1024
_TOP_KEY_RE = re.compile(r"^([^\s#\-][^:\n]*?)\s*:(?:[ \t]|$)", re.M)
_READ_PROBLEM_RE = re.compile(r"^(?P<file>[^:]+\.yaml):line (?P<line>\d+):-: (?P<msg>.*)$")
_DUPLICATE_RE = re.compile(r"duplicate key (?P<key>'[^']*'|\"[^\"]*\"|\S+)")
_RECORD_START_RE = re.compile(r"^\s*-\s+(?:id|species):\s*(?P<id>.+?)\s*(?:#.*)?$")


def _read_text(path):
    with open(path, encoding="utf-8", errors="replace") as fh:
        return fh.read()


def _shape_of_one(fname, key, text, raw, out):
    expected = f"# yaml-language-server: $schema=schema/{fname[:-5]}.schema.json"
    if text.split("\n", 1)[0].strip() != expected:
        out.error(key, "-", "-", f"the first line must be '{expected}' so editors validate while typing")
    top = [k.strip("'\"") for k in _TOP_KEY_RE.findall(text)]
    if not top:
        out.error(key, "-", "-", f"the file holds no mapping: expected the top-level key '{key}'")
        return
    if key not in raw:
        return  # unreadable: reported by the reader
    if key not in top:
        out.error(key, "-", key, f"the top-level key '{key}' is missing")
    for other in top:
        if other != key:
            out.error(key, "-", other, f"unknown top-level key {other!r}: the file holds only '{key}'")


def file_shape(raw, data_dir, out):
    """The schema line first and one top-level key per file (read from the text: no second parse)."""
    for fname, key in FILES.items():
        path = os.path.join(data_dir, fname)
        if not os.path.exists(path) or os.path.getsize(path) > MAX_SHAPE_BYTES:
            continue  # reported by the reader
        _shape_of_one(fname, key, _read_text(path), raw, out)


def _record_at(path, line):
    """The id of the record a line of a data file belongs to (the nearest '- id:' above it)."""
    try:
        lines = _read_text(path).splitlines()[:line]
    except OSError:
        return None
    for text in reversed(lines):
        m = _RECORD_START_RE.match(text)
        if m:
            return m.group("id").strip("'\"")
        if re.match(r"^\S", text) and not text.startswith("#"):
            return None  # reached the top-level key
    return None


def locate_read_problems(problems, folder):
    """Name the record (and, for a duplicate key, the field) of a YAML problem reported by line."""
    out = []
    for prob in problems:
        m = _READ_PROBLEM_RE.match(prob)
        if not m:
            out.append(prob)
            continue
        line = int(m.group("line"))
        rec = _record_at(os.path.join(folder, m.group("file")), line)
        where = f"{rec} (line {line})" if rec else f"line {line}"
        dup = _DUPLICATE_RE.search(m.group("msg"))
        field = dup.group("key").strip("'\"") if dup else "-"
        out.append(f"{m.group('file')}:{where}:{field}: {m.group('msg')}")
    return out
