"""5. Bytes: what the service worker precaches (the list in the built site's sw.js), split into
the Pyodide runtime and our own files, raw and gzip-compressed (level 6, as servers commonly
send them; the snapshot is already gzip and is counted as stored).

Groups:
- runtime, stock: the files copied from the npm package ``pyodide``;
- runtime, made at build: the bytecode standard library and the memory snapshot (both derived
  from the runtime; the snapshot also holds calc and its dataset in memory);
- ours: everything else (pages, scripts, styles, icons, search index, dataset, calc wheel).
"""

import gzip
import json
import os
import re

from .common import fr, heading, line

STOCK = {"pyodide.mjs", "pyodide.asm.mjs", "pyodide.asm.wasm", "python_stdlib.zip", "pyodide-lock.json"}
PRECACHE_RE = re.compile(r"PRECACHE\s*=\s*(\[.*?\])\s*;", re.S)


def precache_files(site_dir):
    """Relative file paths of the precache list in sw.js (directory URLs -> their index.html)."""
    with open(os.path.join(site_dir, "sw.js"), encoding="utf-8") as fh:
        text = fh.read()
    m = PRECACHE_RE.search(text)
    if not m:
        raise ValueError("sw.js: no PRECACHE list found")
    out = []
    for item in json.loads(m.group(1)):
        url = item[0] if isinstance(item, list) else item  # [path, integrity] or path
        rel = url.split("?", 1)[0].split("#", 1)[0]
        if rel.startswith("./"):
            rel = rel[2:]
        if rel == "" or rel.endswith("/"):
            rel += "index.html"
        out.append(rel)
    return out


def group_of(rel):
    if rel.startswith("pyodide/"):
        return "runtime, stock" if os.path.basename(rel) in STOCK else "runtime, made at build"
    return "ours"


def kind_of(rel):
    """A finer split of our own files."""
    if rel.startswith("wheels/"):
        return "calc wheel"
    if rel.startswith("assets/data/"):
        return "data (dataset, precomputed answers)"
    if rel.startswith("search/"):
        return "search index"
    if rel.endswith(".html"):
        return "pages (HTML)"
    if rel.startswith("assets/javascripts/") or rel.startswith("assets/stylesheets/"):
        return "theme scripts and styles"
    if rel.startswith("assets/js/") or rel.startswith("assets/css/"):
        return "our scripts and styles"
    return "other (icons, images, manifest)"


def unneeded(rel):
    """Theme files an English-only site never loads: source maps, and the search's stemmers and
    word segmenters for other languages (mkdocs-material copies them all)."""
    if rel.endswith(".map"):
        return True
    if rel.startswith("assets/javascripts/lunr/"):
        base = os.path.basename(rel)
        return base not in ("lunr.stemmer.support.min.js", "lunr.multi.min.js")
    return False


def gz_size(path):
    with open(path, "rb") as fh:
        data = fh.read()
    if data[:2] == b"\x1f\x8b":
        return len(data)  # stored compressed already
    return len(gzip.compress(data, compresslevel=6, mtime=0))


def measure(site_dir):
    files = precache_files(site_dir)
    missing = [f for f in files if not os.path.isfile(os.path.join(site_dir, f))]
    if missing:
        raise ValueError(f"sw.js precaches files that are not in the site: {missing[:5]}")
    groups, kinds = {}, {}
    spare = {"files": 0, "raw": 0, "gzip": 0}
    for rel in files:
        path = os.path.join(site_dir, rel)
        raw, gz = os.path.getsize(path), gz_size(path)
        if unneeded(rel):
            spare["files"] += 1
            spare["raw"] += raw
            spare["gzip"] += gz
        for table, key in ((groups, group_of(rel)), (kinds, kind_of(rel) if group_of(rel) == "ours" else None)):
            if key is None:
                continue
            t = table.setdefault(key, {"files": 0, "raw": 0, "gzip": 0})
            t["files"] += 1
            t["raw"] += raw
            t["gzip"] += gz
    total = {k: sum(g[k] for g in groups.values()) for k in ("files", "raw", "gzip")}
    return {"groups": groups, "ours_by_kind": kinds, "total": total, "ours_unneeded": spare}


def mb(n):
    return f"{n / 1e6:.2f} MB"


def run(site_dir):
    heading("5. Bytes the service worker precaches (sw.js list)")
    r = measure(site_dir)
    for name in ("runtime, stock", "runtime, made at build", "ours"):
        g = r["groups"].get(name, {"files": 0, "raw": 0, "gzip": 0})
        line(f"{name:24s} {g['files']:4d} files  {mb(g['raw']):>9s} raw  {mb(g['gzip']):>9s} gzip")
    for name, g in sorted(r["ours_by_kind"].items(), key=lambda kv: -kv[1]["gzip"]):
        line(f"   ours: {name:36s} {g['files']:4d} files  {mb(g['raw']):>9s} raw  {mb(g['gzip']):>9s} gzip")
    sp = r["ours_unneeded"]
    line(f"   of ours, never loaded by this English-only site (source maps, other languages' search files): "
         f"{sp['files']} files, {mb(sp['raw'])} raw, {mb(sp['gzip'])} gzip")
    t = r["total"]
    line(f"{'total':24s} {t['files']:4d} files  {mb(t['raw']):>9s} raw  {mb(t['gzip']):>9s} gzip")
    ours = r["groups"].get("ours", {"gzip": 0})["gzip"]
    r["ratio_ours_total_gzip"] = ours / t["gzip"] if t["gzip"] else None
    line(f"ratio ours/total (gzip): {fr(r['ratio_ours_total_gzip'])}; ours {mb(ours)} gzip "
         f"({mb(ours - sp['gzip'])} without the files never loaded) against a goal of 1 MB")
    return r
