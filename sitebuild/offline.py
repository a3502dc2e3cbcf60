"""Offline support for a built site: the service worker with its precache, and file:// support.

Called last from the build hooks (``write_offline_support``), when every other file is in place.

* ``sw.js`` precaches every file of the site under one cache whose name carries the site's path
  and a hash of every file's bytes: any change (data, calc, pages, runtime) is a new version that
  the browser offers on the next online visit. Each precached file is fetched with its SHA-256
  (Subresource Integrity), so a server that delivers a mixture of two builds cannot produce a
  mixed cache: the install fails and is tried again on a later visit.
* For pages opened from a file manager (file://), where no service worker or Pyodide can run,
  the search index is also written as a script (``search/search_index.js``, which
  mkdocs-material loads on file:// pages instead of fetching the JSON). There
  ``docs/assets/js/file-worker.js`` runs material's search worker in a frame, and
  ``docs/assets/js/file-pages.js`` makes folder links open their ``index.html`` and tells the
  calculator pages how to serve the site.
"""

import base64
import hashlib
import json
import logging
import os

from mkdocs.exceptions import PluginError

HERE = os.path.dirname(os.path.abspath(__file__))
ROOT = os.path.dirname(HERE)
log = logging.getLogger("mkdocs.plugins.couplewise.offline")

#: never precached: the worker itself (the browser fetches it outside any cache) and the
#: compressed sitemap, which no browser requests.
SKIP = {"sw.js", "sitemap.xml.gz"}
#: precached but left out of the version hash: the sitemap carries the build date, not content.
UNHASHED = {"sitemap.xml"}


def site_files(site_dir):
    """All files of the built site as URL paths relative to its root, sorted."""
    out = []
    for dirpath, _, files in os.walk(site_dir):
        for name in files:
            rel = os.path.relpath(os.path.join(dirpath, name), site_dir).replace(os.sep, "/")
            if rel in SKIP:
                continue
            out.append(rel)
    return sorted(out)


def file_digests(site_dir, files):
    """SHA-256 digest (bytes) of each file, by relative path."""
    out = {}
    for rel in files:
        h = hashlib.sha256()
        with open(os.path.join(site_dir, rel), "rb") as fh:
            for chunk in iter(lambda: fh.read(1 << 20), b""):
                h.update(chunk)
        out[rel] = h.digest()
    return out


def content_hash(digests):
    """SHA-256 over the paths and digests of the files, except UNHASHED [hex, 16 characters]."""
    h = hashlib.sha256()
    for rel in sorted(digests):
        if rel in UNHASHED:
            continue
        h.update(rel.encode("utf-8") + b"\0" + digests[rel])
    return h.hexdigest()[:16]


def url_for(rel):
    """The URL a file is requested by, relative to the site root: directory URLs for index pages."""
    if rel == "index.html":
        return "./"
    if rel.endswith("/index.html"):
        return rel[: -len("index.html")]
    return rel


def integrity(rel, digest):
    """The Subresource Integrity value the service worker fetches a file with; none for ``.gz``
    files, which a server may send with Content-Encoding: gzip (the browser then checks the
    inflated bytes): their names carry their content hash instead."""
    if rel.endswith(".gz"):
        return ""
    return "sha256-" + base64.b64encode(digest).decode("ascii")


def precache_entries(digests):
    """[[url, integrity], ...] for the service worker, sorted by URL."""
    return sorted([url_for(rel), integrity(rel, d)] for rel, d in digests.items())


def _runtime_meta(site_dir):
    path = os.path.join(site_dir, "assets", "runtime.json")
    if not os.path.isfile(path):
        raise PluginError("assets/runtime.json is missing: the runtime must be staged before the service worker")
    with open(path, encoding="utf-8") as fh:
        info = json.load(fh)
    return {k: info.get(k) for k in ("data_version", "data_date", "build")}


def write_search_index_script(site_dir):
    """Write search/search_index.js, which mkdocs-material loads on file:// pages (where it
    cannot fetch search_index.json)."""
    index = os.path.join(site_dir, "search", "search_index.json")
    if os.path.isfile(index):
        with open(index, encoding="utf-8") as fh:
            data = fh.read()
        with open(os.path.join(site_dir, "search", "search_index.js"), "w", encoding="utf-8") as fh:
            fh.write("var __index = " + data)


def write_service_worker(site_dir):
    """Write sw.js into the built site; returns (version, number of files, bytes precached)."""
    files = site_files(site_dir)
    digests = file_digests(site_dir, files)
    version = content_hash(digests)
    size = sum(os.path.getsize(os.path.join(site_dir, rel)) for rel in files)
    # what the copy holds, for the About page (docs/assets/js/about.mjs asks the worker)
    meta = dict(_runtime_meta(site_dir), version=version, files=len(files), bytes=size)
    with open(os.path.join(HERE, "sw_template.js"), encoding="utf-8") as fh:
        template = fh.read()
    text = (template.replace("__META__", json.dumps(meta))
            .replace("__PRECACHE__", json.dumps(precache_entries(digests), indent=0)))
    with open(os.path.join(site_dir, "sw.js"), "w", encoding="utf-8") as fh:
        fh.write(text)
    return version, len(files), size


def _search_languages(site_dir):
    """The languages the site's search is configured for (mkdocs-material writes them into the
    index); None when the site has no search index."""
    index = os.path.join(site_dir, "search", "search_index.json")
    if not os.path.isfile(index):
        return None
    with open(index, encoding="utf-8") as fh:
        return list(json.load(fh).get("config", {}).get("lang") or ["en"])


def unused_theme_files(site_dir):
    """Theme files mkdocs-material copies into every build that this site never loads.

    * source maps (``*.map``): read only by a browser's developer tools;
    * the search's language support under ``assets/javascripts/lunr/``: the search worker loads
      ``min/lunr.<lang>.min.js`` for each configured language other than English, the stemmer
      support and ``lunr.multi`` when any is loaded or several are configured, ``tinyseg.js`` for
      Japanese and ``wordcut.js`` for Hindi and Thai. Files needed by the configured languages
      are kept.

    Returns relative paths, sorted.
    """
    langs = _search_languages(site_dir) or ["en"]
    keep = {f"assets/javascripts/lunr/min/lunr.{lang}.min.js" for lang in langs if lang != "en"}
    if keep or len(langs) > 1:
        keep |= {"assets/javascripts/lunr/min/lunr.stemmer.support.min.js",
                 "assets/javascripts/lunr/min/lunr.multi.min.js"}
    if "ja" in langs:
        keep.add("assets/javascripts/lunr/tinyseg.js")
    if {"hi", "th"} & set(langs):
        keep.add("assets/javascripts/lunr/wordcut.js")
    out = []
    for rel in site_files(site_dir):
        theme = rel.startswith("assets/javascripts/") or rel.startswith("assets/stylesheets/")
        if theme and (rel.endswith(".map") or rel.startswith("assets/javascripts/lunr/")) and rel not in keep:
            out.append(rel)
    return out


def prune_unused_theme_files(site_dir):
    """Remove :func:`unused_theme_files` from the built site: they would otherwise be downloaded
    by every visitor's service worker for offline use. Returns (count, bytes) removed."""
    removed, size = 0, 0
    for rel in unused_theme_files(site_dir):
        path = os.path.join(site_dir, rel)
        size += os.path.getsize(path)
        os.remove(path)
        removed += 1
    lunr = os.path.join(site_dir, "assets", "javascripts", "lunr")
    for dirpath, _, _ in sorted(os.walk(lunr), reverse=True):  # empty folders left behind
        if os.path.isdir(dirpath) and not os.listdir(dirpath):
            os.rmdir(dirpath)
    return removed, size


def write_offline_support(site_dir):
    """Everything offline for a built site; the service worker last (it hashes every other file)."""
    removed, size = prune_unused_theme_files(site_dir)
    log.info("offline: removed %d theme files the site never loads (%.2f MB)", removed, size / 1e6)
    write_search_index_script(site_dir)
    version, count, size = write_service_worker(site_dir)
    log.info("offline: sw.js precaches %d files, %.1f MB, version %s", count, size / 1e6, version)
    return version
