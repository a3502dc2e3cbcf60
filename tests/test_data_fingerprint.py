"""Fingerprint of the shipped dataset: record counts and sums of key values.

A data pull request changes this fingerprint on purpose, in the same pull request, so no value
changes by accident (see DEVELOPERS.md, "Adding or correcting a value").
"""

import pytest

from sitebuild.dataset import load_project_bundle

FINGERPRINT = {
    "counts": {"half_reactions": 78, "reference_electrodes": 16, "materials": 56, "environments": 10,
               "ions": 61, "sources": 38, "cp_criteria": 22, "cp_structures": 7, "cp_settings": 6},
    "sum_E0_V": -24.0248,
    "sum_dEdT_mV_per_K": -7.342,
    "sum_reference_E_V_SHE": 3.4874,
    "sum_seawater_range_ends_V_SCE": -44.53,
    "sum_anodic_index_V": 29.65,
    "sum_density_g_cm3": 426.37,
    "sum_equivalent_weight_g": 1767.01,
    "sum_allowable_V": 2.45,
    "sum_ion_size_angstrom": 234.5,
}


@pytest.fixture(scope="module")
def bundle():
    return load_project_bundle()


def _sum(records, key):
    return sum(r.get(key) or 0 for r in records)


def test_counts(bundle):
    assert {k: len(bundle[k]) for k in FINGERPRINT["counts"]} == FINGERPRINT["counts"]


def test_sums_of_key_values(bundle):
    got = {
        "sum_E0_V": _sum(bundle["half_reactions"], "E0_V"),
        "sum_dEdT_mV_per_K": _sum(bundle["half_reactions"], "dEdT_mV_per_K"),
        "sum_reference_E_V_SHE": _sum(bundle["reference_electrodes"], "E_V_SHE"),
        "sum_seawater_range_ends_V_SCE": sum(sum(r["seawater_range_V_SCE"]) for r in bundle["materials"]
                                             if r.get("seawater_range_V_SCE")),
        "sum_anodic_index_V": _sum(bundle["materials"], "anodic_index_V"),
        "sum_density_g_cm3": _sum(bundle["materials"], "density_g_cm3"),
        "sum_equivalent_weight_g": _sum(bundle["materials"], "equivalent_weight_g"),
        "sum_allowable_V": _sum(bundle["environments"], "allowable_V"),
        "sum_ion_size_angstrom": _sum(bundle["ions"], "size_angstrom"),
    }
    for key, value in got.items():
        assert value == pytest.approx(FINGERPRINT[key], abs=5e-4), key


def test_version_is_content_hash(bundle):
    assert len(bundle["version"]) == 12 and all(c in "0123456789abcdef" for c in bundle["version"])


def test_invariants_over_the_whole_table(bundle):
    # every material with a seawater range has it in the right order, and every passive record
    # is nobler than its active twin (ASTM G82 Fig. 1: active states lie ~0.3-0.5 V lower)
    by_id = {m["id"]: m for m in bundle["materials"]}
    for m in bundle["materials"]:
        rng = m.get("seawater_range_V_SCE")
        if rng:
            assert rng[0] <= rng[1], m["id"]
        if m.get("state") == "passive" and m.get("other_state"):
            active = by_id[m["other_state"]]
            assert sum(active["seawater_range_V_SCE"]) < sum(rng), m["id"]
