"""Build the site beside its destination, then swap it in: a failed build leaves the old site intact.

``python -m sitebuild.atomic site [--data DIR]`` (what ``make site`` runs).

The build (``mkdocs build --strict``) writes into ``<dest>.tmp``. Only when it succeeds and the
result holds a home page and a service worker is the previous ``<dest>`` moved to ``<dest>.old``,
the new one moved into place and the old one removed. If the build fails (bad data, a broken
page, a missing runtime), ``<dest>`` is not touched and the build's own messages, which list
every data problem as ``file:record:field: message``, are printed.
"""

import argparse
import os
import shutil
import subprocess
import sys

HERE = os.path.dirname(os.path.abspath(__file__))
ROOT = os.path.dirname(HERE)
#: files a finished build always holds (a build that lacks them is not swapped in)
REQUIRED = ("index.html", "sw.js", "csp.txt")


class BuildFailed(Exception):
    """The build failed; ``output`` holds what it printed."""

    def __init__(self, message, output=""):
        super().__init__(message)
        self.output = output


def mkdocs_build(out_dir, env):
    """Run ``mkdocs build --strict -d out_dir``; returns (exit status, everything it printed)."""
    proc = subprocess.run([sys.executable, "-m", "mkdocs", "build", "--strict", "-d", out_dir],
                          cwd=ROOT, env=env, capture_output=True, text=True)
    return proc.returncode, proc.stdout + proc.stderr


def build_site(dest, data_dir=None, builder=mkdocs_build):
    """Build the site into ``dest``, replacing what is there only when the build succeeds.

    Args:
        dest: the site folder, e.g. ``site`` [unitless]
        data_dir: the data folder to build from; None for ``$COUPLEWISE_DATA_DIR`` or ``data/`` [unitless]
        builder: ``builder(out_dir, env) -> (status, output)``, the build itself [unitless]

    Returns:
        the build's output (text)

    Raises:
        BuildFailed: the build failed or is incomplete; ``dest`` is as it was
    """
    dest = os.path.abspath(dest)
    tmp, old = dest + ".tmp", dest + ".old"
    env = dict(os.environ)
    env.setdefault("NO_MKDOCS_2_WARNING", "1")
    if data_dir is not None:
        env["COUPLEWISE_DATA_DIR"] = os.path.abspath(data_dir)
    shutil.rmtree(tmp, ignore_errors=True)
    try:
        status, output = builder(tmp, env)
        if status != 0:
            raise BuildFailed(f"the build failed (exit status {status}); {dest} was left as it was", output)
        missing = [name for name in REQUIRED if not os.path.isfile(os.path.join(tmp, name))]
        if missing:
            raise BuildFailed(f"the build lacks {', '.join(missing)}; {dest} was left as it was", output)
    except BaseException:
        shutil.rmtree(tmp, ignore_errors=True)
        raise
    shutil.rmtree(old, ignore_errors=True)
    had_old = os.path.isdir(dest)
    if had_old:
        os.replace(dest, old)
    try:
        os.replace(tmp, dest)
    except OSError:
        if had_old:
            os.replace(old, dest)  # put the previous site back
        raise
    shutil.rmtree(old, ignore_errors=True)
    return output


def main(argv=None):
    p = argparse.ArgumentParser(prog="python -m sitebuild.atomic", description=__doc__.splitlines()[0])
    p.add_argument("dest", nargs="?", default="site")
    p.add_argument("--data", default=None, metavar="DIR", help="data folder (default: $COUPLEWISE_DATA_DIR or data/)")
    ns = p.parse_args(argv)
    try:
        output = build_site(ns.dest, ns.data)
    except BuildFailed as exc:
        sys.stderr.write(exc.output)
        if exc.output and not exc.output.endswith("\n"):
            sys.stderr.write("\n")
        sys.stderr.write(f"site: {exc}\n")
        return 1
    sys.stderr.write(output)
    print(f"site: built into {os.path.abspath(ns.dest)}")
    return 0


if __name__ == "__main__":
    sys.exit(main())
