"""``python -m calc``: the couplewise command line (see :mod:`calc.cli`)."""

from .cli import run

if __name__ == "__main__":  # pragma: no cover
    run()
