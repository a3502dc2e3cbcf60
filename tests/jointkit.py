"""Shared pieces of the joint, advice and matrix tests: the seawater id, lookups into the shipped
data that keep ids out of the tests, and the hypothesis strategies for material and environment names."""

from hypothesis import strategies as st

SEA = "seawater-flowing"

#: material names: known ids, aliases and UNS numbers, and junk
NAMES = st.one_of(st.sampled_from(["zinc", "316", "S31600", "graphite", "gold", "copper", "carbon steel"]),
                  st.text(max_size=12), st.none(), st.integers(), st.floats())
#: environment names: known ids and junk
ENVS = st.one_of(st.sampled_from([SEA, "marine-atmosphere", "indoor-controlled", "seawater-quiescent"]),
                 st.text(max_size=12), st.none())


def mid(ds, name):
    """Mid-point of a material's flowing-seawater range, read straight from the data [V vs SCE]."""
    lo, hi = ds.get("materials", name)["seawater_range_V_SCE"]
    return (lo + hi) / 2


def env_with(ds, **match):
    """The first environment whose fields match (so the test does not hard-code ids)."""
    for e in ds.records("environments"):
        if all(e.get(k) == v for k, v in match.items()):
            return e["id"]
    raise AssertionError(f"no environment with {match}")

