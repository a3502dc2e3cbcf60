"""Pack a built site into dist/couplewise-<data version>.zip with a sha256sum-format checksum.

``python -m sitebuild.dist [site] [dist]`` (``make dist`` builds the site first, then runs this).

The zip holds one folder, ``couplewise-<data version>/``, with the site as built: serve that
folder with any static web server, or open its ``index.html`` from a file manager to read the
reference pages and search them (the calculators need it served). The entries are sorted and
dated with the data date, so the same site always packs to the same bytes.
"""

import argparse
import hashlib
import json
import os
import sys
import zipfile

#: already compressed: stored as they are
STORED = (".zip", ".whl", ".gz", ".png", ".jpg", ".woff2")


def data_version(site_dir):
    path = os.path.join(site_dir, "assets", "runtime.json")
    if not os.path.isfile(path):
        raise SystemExit(f"dist: {site_dir!r} is not a built Couplewise site (no assets/runtime.json): run 'make site'")
    with open(path, encoding="utf-8") as fh:
        info = json.load(fh)
    return info["data_version"], info["data_date"]


def pack(site_dir, dist_dir):
    """Write the zip and its .sha256 file; returns (zip path, sha256 hex)."""
    version, date = data_version(site_dir)
    name = f"couplewise-{version}"
    stamp = tuple(int(x) for x in date.split("-")) + (0, 0, 0)
    os.makedirs(dist_dir, exist_ok=True)
    zip_path = os.path.join(dist_dir, name + ".zip")
    tmp = zip_path + ".tmp"
    files = []
    for dirpath, _, names in os.walk(site_dir):
        for n in names:
            files.append(os.path.relpath(os.path.join(dirpath, n), site_dir).replace(os.sep, "/"))
    with zipfile.ZipFile(tmp, "w") as zf:
        for rel in sorted(files):
            info = zipfile.ZipInfo(f"{name}/{rel}", date_time=stamp)
            info.external_attr = 0o644 << 16
            info.compress_type = zipfile.ZIP_STORED if rel.lower().endswith(STORED) else zipfile.ZIP_DEFLATED
            with open(os.path.join(site_dir, rel), "rb") as fh:
                zf.writestr(info, fh.read(), compresslevel=9 if info.compress_type == zipfile.ZIP_DEFLATED else None)
    os.replace(tmp, zip_path)
    h = hashlib.sha256()
    with open(zip_path, "rb") as fh:
        for chunk in iter(lambda: fh.read(1 << 20), b""):
            h.update(chunk)
    digest = h.hexdigest()
    with open(zip_path + ".sha256", "w", encoding="utf-8") as fh:
        fh.write(f"{digest}  {name}.zip\n")  # the format sha256sum -c reads
    return zip_path, digest


def main(argv=None):
    p = argparse.ArgumentParser(prog="python -m sitebuild.dist", description=__doc__.splitlines()[0])
    p.add_argument("site", nargs="?", default="site")
    p.add_argument("dist", nargs="?", default="dist")
    ns = p.parse_args(argv)
    zip_path, digest = pack(ns.site, ns.dist)
    print(f"{zip_path} ({os.path.getsize(zip_path) / 1e6:.1f} MB)\n{zip_path}.sha256: {digest}")
    return 0


if __name__ == "__main__":
    sys.exit(main())
