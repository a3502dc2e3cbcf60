"""KaTeX, the typesetter of the site's formulas, staged from its npm package into the built site.

Copied like the Pyodide runtime (``sitebuild/hooks.py``), from ``node_modules/katex`` (exact
version in ``package.json`` and ``package-lock.json``) into ``katex/`` of the site, so no formula
ever needs another host:

- ``katex.min.js``: the classic build, which ``docs/assets/js/typeset.js`` loads on a page with
  maths (pages opened from a file manager included, where module scripts cannot run);
- ``katex.min.css``, its ``@font-face`` rules cut down to the WOFF2 files: every browser that
  runs the site reads WOFF2, and the ``.woff``/``.ttf`` copies would only add to what each
  visitor's service worker downloads for offline use (``sitebuild/offline.py`` precaches every
  file of the site, these included);
- ``fonts/*.woff2``, exactly the fonts that stylesheet names;
- ``LICENSE``: KaTeX is MIT-licensed, which asks for its notice to go with copies.
"""

import json
import os
import re
import shutil

HERE = os.path.dirname(os.path.abspath(__file__))
ROOT = os.path.dirname(HERE)
KATEX_SRC = os.path.join(ROOT, "node_modules", "katex")
STAGED = "katex"  # the folder of the built site

_SRC_RE = re.compile(r"src:([^;}]*)")
_URL_RE = re.compile(r"url\(([^)]+)\)")


class StageError(Exception):
    """The KaTeX package is missing or not as expected."""


def katex_version(src=KATEX_SRC):
    """The version of the KaTeX package in ``node_modules`` (its package.json).

    Args:
        src: the package folder [unitless]

    Returns:
        the version text, e.g. ``0.19.1``
    """
    pkg = os.path.join(src, "package.json")
    if not os.path.isfile(pkg):
        raise StageError("KaTeX is missing from node_modules/katex: run 'make setup' (npm ci)")
    with open(pkg, encoding="utf-8") as fh:
        return json.load(fh)["version"]


def woff2_only(css):
    """The stylesheet with each ``src:`` of its ``@font-face`` rules reduced to the WOFF2 file.

    Args:
        css: KaTeX's stylesheet [unitless]

    Returns:
        the stylesheet text

    >>> woff2_only('@font-face{src:url(fonts/A.woff2) format("woff2"),url(fonts/A.woff) format("woff")}')
    '@font-face{src:url(fonts/A.woff2) format("woff2")}'
    """
    def keep(m):
        parts = [p.strip() for p in m.group(1).split(",")]
        woff2 = [p for p in parts if 'format("woff2")' in p]
        if not woff2:
            raise StageError("a @font-face rule of katex.min.css has no WOFF2 file: " + m.group(0)[:120])
        return "src:" + ",".join(woff2)

    return _SRC_RE.sub(keep, css)


def stage_katex(site_dir, src=KATEX_SRC):
    """Copy KaTeX into ``<site_dir>/katex/``; returns the staged paths relative to the site, sorted.

    Args:
        site_dir: the built site [unitless]
        src: the npm package folder [unitless]
    """
    katex_version(src)  # present, with its package.json
    dist = os.path.join(src, "dist")
    out = os.path.join(site_dir, STAGED)
    if os.path.isdir(out):
        shutil.rmtree(out)
    os.makedirs(os.path.join(out, "fonts"))
    shutil.copy2(os.path.join(dist, "katex.min.js"), os.path.join(out, "katex.min.js"))
    shutil.copy2(os.path.join(src, "LICENSE"), os.path.join(out, "LICENSE"))
    with open(os.path.join(dist, "katex.min.css"), encoding="utf-8") as fh:
        css = woff2_only(fh.read())
    fonts = sorted({u.strip("'\"") for u in _URL_RE.findall(css)})
    for rel in fonts:
        if not rel.startswith("fonts/") or "/" in rel[len("fonts/"):] or not rel.endswith(".woff2"):
            raise StageError("katex.min.css names a file outside fonts/: " + rel)
        path = os.path.join(dist, rel)
        if not os.path.isfile(path):
            raise StageError("katex.min.css names a font the package does not have: " + rel)
        shutil.copy2(path, os.path.join(out, rel))
    with open(os.path.join(out, "katex.min.css"), "w", encoding="utf-8") as fh:
        fh.write(css)
    staged = ["katex.min.js", "katex.min.css", "LICENSE"] + fonts
    return sorted(f"{STAGED}/{rel}" for rel in staged)
