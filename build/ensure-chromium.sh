#!/usr/bin/env bash
# The browser tests drive Debian's chromium (Playwright's own browser download does not work here).
set -eu
if [ -x /usr/bin/chromium ]; then exit 0; fi
if [ "$(id -u)" = "0" ] && command -v apt-get >/dev/null 2>&1; then
  echo "chromium is missing: installing Debian's chromium with apt-get" >&2
  apt-get update -qq && DEBIAN_FRONTEND=noninteractive apt-get install -y -qq chromium >/dev/null
  exit 0
fi
echo "The browser tests need Debian's chromium at /usr/bin/chromium: run 'sudo apt-get install chromium' and try again." >&2
exit 1
