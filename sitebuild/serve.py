"""Serve the built site on the local machine with the MIME types Pyodide needs.

``python -m sitebuild.serve site [--host 127.0.0.1] [--port 8000] [--prefix /tools/couplewise/]``

The prefix serves the same build under a sub-path, as an intranet server would.
"""

import argparse
import functools
import http.server
import os
import sys

MIME = {
    ".wasm": "application/wasm",
    ".mjs": "text/javascript",
    ".js": "text/javascript",
    ".json": "application/json",
    ".webmanifest": "application/manifest+json",
    ".whl": "application/zip",
    ".zip": "application/zip",
    ".svg": "image/svg+xml",
}


class SiteHandler(http.server.SimpleHTTPRequestHandler):
    """Static files with the right MIME types, an optional URL prefix and no caching surprises."""

    extensions_map = {**http.server.SimpleHTTPRequestHandler.extensions_map, **MIME}
    prefix = "/"
    quiet = False

    def translate_path(self, path):
        if self.prefix != "/":
            if not path.startswith(self.prefix):
                return os.path.join(self.directory, "\0missing")
            path = "/" + path[len(self.prefix):]
        return super().translate_path(path)

    def do_GET(self):
        if self.prefix != "/" and self.path == self.prefix.rstrip("/"):
            self.send_response(301)
            self.send_header("Location", self.prefix)
            self.end_headers()
            return
        super().do_GET()

    def end_headers(self):
        self.send_header("Cache-Control", "no-cache")
        super().end_headers()

    def log_message(self, fmt, *args):
        if not self.quiet:
            super().log_message(fmt, *args)


class _Server(http.server.ThreadingHTTPServer):
    daemon_threads = True

    def handle_error(self, request, client_address):
        exc = sys.exc_info()[1]
        if isinstance(exc, (BrokenPipeError, ConnectionResetError)):
            return  # the browser closed a connection early (navigation, offline tests)
        super().handle_error(request, client_address)


def make_server(directory, host="127.0.0.1", port=8000, prefix="/", quiet=False):
    """A ThreadingHTTPServer serving ``directory`` under ``prefix``."""
    prefix = "/" + prefix.strip("/") + "/" if prefix.strip("/") else "/"
    handler = type("Handler", (SiteHandler,), {"prefix": prefix, "quiet": quiet})
    return _Server((host, port), functools.partial(handler, directory=directory))


def main(argv=None):
    p = argparse.ArgumentParser(prog="python -m sitebuild.serve", description=__doc__.splitlines()[0])
    p.add_argument("directory", nargs="?", default="site")
    p.add_argument("--host", default="127.0.0.1")
    p.add_argument("--port", type=int, default=8000)
    p.add_argument("--prefix", default="/")
    ns = p.parse_args(argv)
    if not os.path.isfile(os.path.join(ns.directory, "index.html")):
        sys.stderr.write(f"serve: no built site in {ns.directory!r}: run 'make serve' (it builds first)\n")
        return 2
    try:
        srv = make_server(ns.directory, ns.host, ns.port, ns.prefix)
    except OSError as exc:
        sys.stderr.write(f"serve: cannot listen on {ns.host}:{ns.port}: {exc.strerror}; "
                         "another server may be running (try 'make serve PORT=8001')\n")
        return 2
    prefix = "/" + ns.prefix.strip("/") + "/" if ns.prefix.strip("/") else "/"
    print(f"Couplewise is served at http://{ns.host}:{ns.port}{prefix}  (press Ctrl+C to stop)", flush=True)
    try:
        srv.serve_forever()
    except KeyboardInterrupt:
        print("\nstopped")
    return 0


if __name__ == "__main__":
    sys.exit(main())
