"""Browser-test fixtures: see browserkit.py (import helpers from there, never from conftest)."""

from browserkit import browser, built_site, guarded, served  # noqa: F401  (fixtures)
