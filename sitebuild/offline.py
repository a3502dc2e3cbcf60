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
    meta = dict(_runtime_meta(site_dir), version=version)
    with open(os.path.join(HERE, "sw_template.js"), encoding="utf-8") as fh:
        template = fh.read()
    text = (template.replace("__META__", json.dumps(meta))
            .replace("__PRECACHE__", json.dumps(precache_entries(digests), indent=0)))
    with open(os.path.join(site_dir, "sw.js"), "w", encoding="utf-8") as fh:
        fh.write(text)
    size = sum(os.path.getsize(os.path.join(site_dir, rel)) for rel in files)
    return version, len(files), size


def write_offline_support(site_dir):
    """Everything offline for a built site; the service worker last (it hashes every other file)."""
    write_search_index_script(site_dir)
    version, count, size = write_service_worker(site_dir)
    log.info("offline: sw.js precaches %d files, %.1f MB, version %s", count, size / 1e6, version)
    return version
