"""A strict YAML loader: plain data only, duplicate keys and aliases rejected.

PyYAML's safe loader already refuses arbitrary objects; on top of it this loader rejects
duplicate mapping keys (a silent overwrite would lose a maintainer's value) and any alias
(anchors are not needed in the dataset and aliases are the vector of "billion laughs" bombs).
"""

import os

import yaml

MAX_BYTES = 2_000_000


class _StrictLoader(yaml.SafeLoader):
    pass


def _construct_mapping(loader, node, deep=False):
    loader.flatten_mapping(node)
    seen = {}
    for key_node, _ in node.value:
        key = loader.construct_object(key_node, deep=deep)
        if key in seen:
            raise yaml.constructor.ConstructorError(
                "while constructing a mapping", node.start_mark,
                f"duplicate key {key!r} (first at line {seen[key] + 1})", key_node.start_mark)
        seen[key] = key_node.start_mark.line
    return yaml.SafeLoader.construct_mapping(loader, node, deep=deep)


_StrictLoader.add_constructor(yaml.resolver.BaseResolver.DEFAULT_MAPPING_TAG, _construct_mapping)


class _Composer(_StrictLoader):
    """The strict loader that also refuses every alias before it is expanded."""

    def compose_node(self, parent, index):
        if self.check_event(yaml.events.AliasEvent):
            event = self.peek_event()
            raise yaml.composer.ComposerError(None, None, "aliases (*name) are not allowed in the dataset",
                                              event.start_mark)
        return super().compose_node(parent, index)


def load_text(text, name="<text>"):
    """Parse YAML text strictly. Returns (document, problems).

    >>> load_text("a: 1")
    ({'a': 1}, [])
    >>> load_text("a: 1\\na: 2", "x.yaml")[1]
    ["x.yaml:line 2:-: YAML error: duplicate key 'a' (first at line 1)"]
    >>> load_text("a: &x 1\\nb: *x", "x.yaml")[1]
    ['x.yaml:line 2:-: YAML error: aliases (*name) are not allowed in the dataset']
    """
    try:
        return yaml.load(text, Loader=_Composer), []
    except yaml.YAMLError as exc:
        mark = getattr(exc, "problem_mark", None)
        where = f"line {mark.line + 1}" if mark else "-"
        problem = getattr(exc, "problem", None) or str(exc)
        return None, [f"{name}:{where}:-: YAML error: {problem}"]


def load_file(path):
    """Read and parse one YAML file strictly. Returns (document, problems)."""
    name = os.path.basename(path)
    size = os.path.getsize(path)
    if size > MAX_BYTES:
        return None, [f"{name}:-:-: file is {size} bytes; the limit is {MAX_BYTES} bytes"]
    with open(path, "rb") as fh:
        data = fh.read()
    try:
        text = data.decode("utf-8")
    except UnicodeDecodeError as exc:
        line = data[: exc.start].count(b"\n") + 1
        return None, [f"{name}:line {line}:-: not UTF-8 text (byte {exc.start}); save the file as UTF-8"]
    return load_text(text, name)
