"""Couplewise benchmarks (python -m bench; make bench): ratios measured side by side in one run."""
