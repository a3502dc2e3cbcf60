"""Shared helpers of the benchmarks: statistics, a served copy of the site with the bench-only
pages added, and Debian's chromium with every request outside 127.0.0.1 blocked.

Timings are printed, never asserted: the machines are shared and noisy, so each benchmark
measures the things it compares side by side in one run and reports their ratio.
"""

import contextlib
import json
import math
import os
import shutil
import statistics
import sys
import tempfile
import threading
import time
from urllib.parse import urlparse

HERE = os.path.dirname(os.path.abspath(__file__))
ROOT = os.path.dirname(HERE)
if ROOT not in sys.path:
    sys.path.insert(0, ROOT)

CHROMIUM = os.environ.get("COUPLEWISE_CHROMIUM", "/usr/bin/chromium")
CHROMIUM_ARGS = ["--no-sandbox", "--disable-gpu", "--disable-quic", "--no-first-run",
                 "--disable-background-networking", "--disable-component-update", "--disable-sync",
                 "--disable-dev-shm-usage"]
BENCH_PAGES = os.path.join(HERE, "pages")  # bench-only HTML, copied into a temporary site copy


def median(xs):
    xs = [x for x in xs if x is not None]
    return statistics.median(xs) if xs else None


def percentile(xs, p):
    """Nearest-rank percentile (p in 0..100)."""
    xs = sorted(x for x in xs if x is not None)
    if not xs:
        return None
    return xs[max(0, math.ceil(p / 100 * len(xs)) - 1)]


def ratio(a, b):
    return (a / b) if (a is not None and b) else None


def fs(x, unit="s", digits=2):
    """Format seconds (or another unit) for the report."""
    if x is None:
        return "n/a"
    return f"{x:.{digits}f} {unit}"


def fr(x):
    return "n/a" if x is None else f"{x:.2f}"


def fms(x):
    return "n/a" if x is None else f"{x:.1f} ms"


def heading(text):
    print()
    print("== " + text + " ==", flush=True)


def line(text=""):
    print("  " + text if text else "", flush=True)


@contextlib.contextmanager
def bench_site(site_dir):
    """A temporary copy of the built site with the bench-only pages beside it (never shipped)."""
    if not os.path.isfile(os.path.join(site_dir, "assets", "runtime.json")):
        raise SystemExit(f"bench: no built site in {site_dir!r} (run 'make site' first)")
    tmp = tempfile.mkdtemp(prefix="couplewise-bench-")
    dest = os.path.join(tmp, "site")
    try:
        shutil.copytree(site_dir, dest)
        for name in os.listdir(BENCH_PAGES):
            shutil.copy2(os.path.join(BENCH_PAGES, name), os.path.join(dest, name))
        yield dest
    finally:
        shutil.rmtree(tmp, ignore_errors=True)


class Server:
    """sitebuild.serve on 127.0.0.1, a free port, in a thread."""

    def __init__(self, directory):
        from sitebuild.serve import make_server

        self.server = make_server(directory, "127.0.0.1", 0, "/", quiet=True)
        self.port = self.server.server_address[1]
        self.thread = threading.Thread(target=self.server.serve_forever, daemon=True)
        self.thread.start()

    def url(self, path=""):
        return f"http://127.0.0.1:{self.port}/{path.lstrip('/')}"

    def stop(self):
        self.server.shutdown()
        self.server.server_close()


class Guard:
    """Aborts every request that leaves 127.0.0.1 and keeps them to report.

    ``route`` intercepts requests (which makes Playwright switch the browser's HTTP cache off);
    the start-up benchmark instead blocks other hosts in the browser itself (BLOCK_ARGS: a proxy
    that does not exist for every host but loopback) and only records them (``record``), so the
    HTTP cache and the WebAssembly code cache work as they do for a visitor."""

    def __init__(self):
        self.outside = []

    def record(self, request):
        url = request.url
        if not url.startswith(("data:", "blob:")) and urlparse(url).hostname != "127.0.0.1":
            self.outside.append(url)

    def route(self, route):
        url = route.request.url
        if url.startswith(("data:", "blob:")) or urlparse(url).hostname == "127.0.0.1":
            route.continue_()
        else:
            self.outside.append(url)
            route.abort()

    def check(self):
        if self.outside:
            raise SystemExit(f"bench: requests to other hosts were attempted (blocked): {self.outside[:5]}")


def chromium_version():
    import subprocess

    try:
        out = subprocess.run([CHROMIUM, "--version"], capture_output=True, text=True, timeout=30).stdout
    except (OSError, subprocess.TimeoutExpired):
        return "unknown"
    return out.strip() or "unknown"


def require_chromium():
    if not os.path.exists(CHROMIUM):
        raise SystemExit(f"bench: chromium not found at {CHROMIUM}: run 'make chromium'")


# Every host but loopback goes to a proxy on a closed port: nothing leaves the machine, and no
# request interception is needed (which would switch the HTTP cache off).
BLOCK_ARGS = ["--proxy-server=http://127.0.0.1:9", "--proxy-bypass-list=127.0.0.1"]


def tablet_executable():
    """A wrapper that runs chromium confined to one CPU (``taskset -c 0``), all its processes."""
    path = os.path.join(tempfile.gettempdir(), f"couplewise-bench-chromium-1cpu-{os.getpid()}.sh")
    with open(path, "w", encoding="utf-8") as fh:
        fh.write(f'#!/bin/sh\nexec taskset -c 0 "{CHROMIUM}" "$@"\n')
    os.chmod(path, 0o755)
    return path


def launch_persistent(pw, profile_dir, guard, init_script=None, executable=None):
    """A chromium with its own profile folder (disk cache, service workers, code cache); other
    hosts are blocked by the browser itself and recorded, the HTTP cache stays on."""
    ctx = pw.chromium.launch_persistent_context(
        profile_dir, executable_path=executable or CHROMIUM, headless=True, args=CHROMIUM_ARGS + BLOCK_ARGS,
        viewport={"width": 1280, "height": 800}, service_workers="allow")
    ctx.on("request", guard.record)
    if init_script:
        ctx.add_init_script(init_script)
    return ctx


def machine():
    """nproc, CPU model and chromium version, for the record."""
    model = "unknown"
    try:
        with open("/proc/cpuinfo", encoding="utf-8") as fh:
            for ln in fh:
                if ln.startswith("model name"):
                    model = ln.split(":", 1)[1].strip()
                    break
    except OSError:
        pass
    try:
        load = os.getloadavg()[0]
    except OSError:
        load = None
    return {"nproc": os.cpu_count(), "cpu": model, "chromium": chromium_version(),
            "load_1min": load, "date": time.strftime("%Y-%m-%d %H:%M %Z")}


def runtime_info(site_dir):
    with open(os.path.join(site_dir, "assets", "runtime.json"), encoding="utf-8") as fh:
        return json.load(fh)
