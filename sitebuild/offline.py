"""Write the service worker and the web app manifest's precache list for a built site.

The cache name comes from a hash of every file's bytes, so any change (data, calc, pages,
runtime) makes a new version that the browser offers to the user on the next online visit.
"""

import hashlib
import json
import os

HERE = os.path.dirname(os.path.abspath(__file__))
SKIP = {"sw.js", "sitemap.xml", "sitemap.xml.gz"}


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


def content_hash(site_dir, files):
    """SHA-256 over the paths and bytes of the files [hex, 16 characters]."""
    h = hashlib.sha256()
    for rel in files:
        h.update(rel.encode("utf-8") + b"\0")
        with open(os.path.join(site_dir, rel), "rb") as fh:
            h.update(hashlib.sha256(fh.read()).digest())
    return h.hexdigest()[:16]


def precache_urls(files):
    """URLs to precache: directory URLs stand for their index.html (how pages are linked)."""
    urls = []
    for rel in files:
        if rel == "index.html":
            urls.append("./")
        elif rel.endswith("/index.html"):
            urls.append(rel[: -len("index.html")])
        else:
            urls.append(rel)
    return urls


def write_service_worker(site_dir):
    """Write sw.js into the built site; returns the version (content hash)."""
    files = site_files(site_dir)
    version = content_hash(site_dir, files)
    with open(os.path.join(HERE, "sw_template.js"), encoding="utf-8") as fh:
        template = fh.read()
    text = template.replace("__VERSION__", version).replace("__PRECACHE__", json.dumps(precache_urls(files), indent=0))
    with open(os.path.join(site_dir, "sw.js"), "w", encoding="utf-8") as fh:
        fh.write(text)
    return version
