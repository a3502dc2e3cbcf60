# Couplewise: two commands do all set-up on a fresh machine.
#   make serve   set up, build the site and serve it at http://127.0.0.1:8000
#   make test    set up, then every test (unit, data, site build, browser)
#   make dist    set up, build, then pack dist/couplewise-<data version>.zip (+ .sha256)
VENV   ?= .venv
PY     := $(VENV)/bin/python
HOST   ?= 127.0.0.1
PORT   ?= 8000
PREFIX ?= /

.PHONY: setup site serve test dist bench clean chromium

setup: $(VENV)/.installed node_modules/.installed

$(VENV)/.installed: requirements.txt requirements-nodeps.txt pyproject.toml
	python3 -m venv $(VENV)
	$(VENV)/bin/pip install -q --disable-pip-version-check -r requirements.txt
	$(VENV)/bin/pip install -q --disable-pip-version-check --no-deps -r requirements-nodeps.txt
	$(VENV)/bin/pip install -q --disable-pip-version-check --no-deps --no-build-isolation -e .
	touch $@

node_modules/.installed: package.json package-lock.json
	npm ci --no-audit --no-fund --loglevel=error
	touch $@

# Build into a temporary folder, then swap: a failed build leaves the previous site intact
# (sitebuild/atomic.py; COUPLEWISE_DATA_DIR=DIR builds from another data folder).
site: setup
	$(PY) -m sitebuild.atomic site

serve: site
	$(PY) -m sitebuild.serve site --host $(HOST) --port $(PORT) --prefix $(PREFIX)

# dist/couplewise-<data version>.zip of the built site, and its .sha256 (sha256sum -c format).
dist: site
	$(PY) -m sitebuild.dist site dist

chromium:
	@build/ensure-chromium.sh

test: setup chromium
	$(VENV)/bin/pytest

# Benchmarks (bench/): ratios measured side by side in one run; results in docs/performance.md.
# BENCH_ARGS passes options, e.g. make bench BENCH_ARGS="--only startup,bytes --runs 7".
bench: setup site chromium
	$(PY) -m bench site $(BENCH_ARGS)

clean:
	rm -rf site site.tmp site.old dist
