"""Content-Security-Policy of the built site: no script but the site's own files, no other origin.

:func:`apply_csp` runs after the build has written every page (from the post-build hook, before
the service worker hashes the files). It

1. finds every inline script the theme writes into the pages (mkdocs-material puts a few small
   ones in ``base.html``: the local-storage helpers, the colour palette and the tab anchor) and
   takes the SHA-256 of each, so they run and nothing else inline does;
2. inserts ``<meta http-equiv="Content-Security-Policy" content="...">`` right after the
   ``<meta charset>`` of every HTML page, before any script;
3. writes the same policy to ``csp.txt`` (with ``frame-ancestors``, which browsers ignore in a
   ``<meta>``) for a web server to send as a ``Content-Security-Policy`` header. Only the header
   also governs the calculation worker: a worker takes its policy from the response that
   delivered its script, never from the page's ``<meta>``.

The policy (every origin other than the site's own is refused):

- ``script-src 'self' 'wasm-unsafe-eval' 'sha256-…'``: WebAssembly compilation is what the
  Python runtime (Pyodide) needs; it does not need ``'unsafe-eval'`` for a pure-Python package
  (checked by tests/browser/test_csp.py, which serves the header to the worker as well);
- ``style-src 'self'``: no inline ``<style>`` and no ``style=""`` attribute (the matrix heat map
  uses classes); styles set from script through the CSSOM are not governed by CSP. That is why
  the formulas are typeset in the page by ``katex.render()`` (DOM nodes, styles through the
  CSSOM; ``docs/assets/js/typeset.js``) and never from ``katex.renderToString()`` HTML, whose
  ``style=""`` attributes this policy blocks; KaTeX's stylesheet and fonts are files of the
  site (``font-src 'self'``);
- ``img-src 'self' data:``: the theme's icons are ``data:`` SVG images in its stylesheet;
- ``worker-src``/``connect-src``/``font-src``/``manifest-src`` fall back to ``default-src 'self'``;
  ``object-src 'none'``, ``base-uri 'self'``, ``form-action 'none'`` (the site has no form that
  submits anywhere).
"""

import base64
import hashlib
import os
import re

#: directives before the script hashes are added (order kept in the written policy)
BASE_POLICY = (
    ("default-src", ("'self'",)),
    ("script-src", ("'self'", "'wasm-unsafe-eval'")),
    ("style-src", ("'self'",)),
    ("img-src", ("'self'", "data:")),
    ("font-src", ("'self'",)),
    ("connect-src", ("'self'",)),
    ("worker-src", ("'self'",)),
    ("manifest-src", ("'self'",)),
    ("object-src", ("'none'",)),
    ("base-uri", ("'self'",)),
    ("form-action", ("'none'",)),
)
#: directives that only a header can carry (a <meta> policy ignores them, with a console error)
HEADER_ONLY = (("frame-ancestors", ("'self'",)),)
POLICY_FILE = "csp.txt"
META_NAME = "Content-Security-Policy"

_SCRIPT_RE = re.compile(r"<script\b([^>]*)>(.*?)</script\s*>", re.S | re.I)
_SRC_RE = re.compile(r"""\bsrc\s*=""", re.I)
_TYPE_RE = re.compile(r"""\btype\s*=\s*["']?([^"'\s>]+)""", re.I)
_CHARSET_RE = re.compile(r"<meta\s+charset\s*=\s*[\"']?[\w-]+[\"']?\s*/?>", re.I)
_HEAD_RE = re.compile(r"<head\b[^>]*>", re.I)
_EXISTING_RE = re.compile(r"<meta\s+http-equiv\s*=\s*[\"']Content-Security-Policy[\"'][^>]*>\s*", re.I)
#: script types a browser executes (anything else, e.g. application/json, is a data block)
_JS_TYPES = {"", "text/javascript", "application/javascript", "module", "text/ecmascript",
             "application/ecmascript"}


class CSPError(Exception):
    """A page cannot carry the policy (no <head>) or holds script the policy would block."""


def inline_scripts(html_text):
    """The text of every inline script a browser would execute in a page.

    Args:
        html_text: the page [unitless]

    Returns:
        list of script texts, in page order

    >>> inline_scripts('<script>a=1</script><script src="x.js"></script><script type="application/json">{}</script>')
    ['a=1']
    """
    out = []
    for m in _SCRIPT_RE.finditer(html_text):
        attrs, body = m.group(1), m.group(2)
        if _SRC_RE.search(attrs):
            continue
        t = _TYPE_RE.search(attrs)
        if t and t.group(1).strip().lower() not in _JS_TYPES:
            continue
        out.append(body)
    return out


def script_hash(text):
    """CSP source expression of an inline script: ``'sha256-<base64>'`` of its UTF-8 text.

    >>> script_hash("alert(1)")
    "'sha256-bhHHL3z2vDgxUt0W3dWQOrprscmda2Y5pLsLg4GF+pI='"
    """
    digest = hashlib.sha256(text.encode("utf-8")).digest()
    return "'sha256-" + base64.b64encode(digest).decode("ascii") + "'"


def policy_text(hashes=(), header=False):
    """The policy as one line, with the script hashes in ``script-src``.

    Args:
        hashes: CSP hash sources of the allowed inline scripts [unitless]
        header: True for the header form (adds the directives a <meta> cannot carry) [unitless]

    Returns:
        the policy text

    >>> policy_text().startswith("default-src 'self'; script-src 'self' 'wasm-unsafe-eval';")
    True
    """
    parts = []
    for name, sources in BASE_POLICY + (HEADER_ONLY if header else ()):
        if name == "script-src":
            sources = sources + tuple(sorted(set(hashes)))
        parts.append(name + " " + " ".join(sources))
    return "; ".join(parts)


def _pages(site_dir):
    for dirpath, _, files in os.walk(site_dir):
        for name in sorted(files):
            if name.endswith(".html"):
                yield os.path.join(dirpath, name)


def insert_meta(html_text, policy):
    """The page with the policy as a <meta> right after <meta charset> (or <head>), replacing any
    policy inserted before.

    >>> insert_meta('<html><head><meta charset="utf-8"><script>x</script></head></html>', "default-src 'self'")
    '<html><head><meta charset="utf-8"><meta http-equiv="Content-Security-Policy" content="default-src &#39;self&#39;"><script>x</script></head></html>'
    """
    html_text = _EXISTING_RE.sub("", html_text)
    content = policy.replace("&", "&amp;").replace('"', "&quot;").replace("'", "&#39;")
    meta = f'<meta http-equiv="{META_NAME}" content="{content}">'
    m = _CHARSET_RE.search(html_text) or _HEAD_RE.search(html_text)
    if m is None:
        raise CSPError("no <head> to put the policy in")
    first_script = html_text.lower().find("<script")
    if 0 <= first_script < m.end():
        raise CSPError("a script comes before <meta charset>: the policy would not cover it")
    return html_text[:m.end()] + meta + html_text[m.end():]


def apply_csp(site_dir):
    """Put the policy into every HTML page of a built site and write it to ``csp.txt``.

    Args:
        site_dir: the built site [unitless]

    Returns:
        the policy as written into the pages (the header form in csp.txt adds frame-ancestors)
    """
    pages = list(_pages(site_dir))
    texts = {}
    hashes = set()
    for path in pages:
        with open(path, encoding="utf-8") as fh:
            text = fh.read()
        texts[path] = text
        hashes.update(script_hash(s) for s in inline_scripts(text))
    policy = policy_text(hashes)
    for path, text in texts.items():
        try:
            new = insert_meta(text, policy)
        except CSPError as exc:
            raise CSPError(f"{os.path.relpath(path, site_dir)}: {exc}") from None
        if new != text:
            with open(path, "w", encoding="utf-8") as fh:
                fh.write(new)
    with open(os.path.join(site_dir, POLICY_FILE), "w", encoding="utf-8") as fh:
        fh.write(policy_text(hashes, header=True) + "\n")
    return policy
