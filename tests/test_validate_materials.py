"""Material checks (sitebuild.validate.materials): states of one alloy, ASTM G102 equivalent weights,
composition limits of a grade."""

from validatekit import assert_names, check, edit, folder, record  # noqa: F401 - folder is a fixture


def test_other_state_must_point_back(folder):
    def change(doc):
        record(doc, "materials", "stainless-316-active")["other_state"] = "zinc"
    edit(folder, "materials.yaml", change)
    status, lines = check(folder)
    assert status == 1
    assert_names(lines, "materials.yaml", "stainless-316-passive", "other_state", "does not point back")
    assert_names(lines, "materials.yaml", "stainless-316-active", "other_state", "does not point back")


def test_other_state_unknown_and_same_state(folder):
    def change(doc):
        record(doc, "materials", "stainless-316-active")["state"] = "passive"
    edit(folder, "materials.yaml", change)
    status, lines = check(folder)
    assert status == 1
    assert_names(lines, "materials.yaml", "stainless-316-active", "state", "both 'passive'")


def test_passive_state_must_be_nobler(folder):
    edit(folder, "materials.yaml",
         lambda doc: record(doc, "materials", "stainless-316-passive")
         .__setitem__("seawater_range_V_SCE", [-0.58, -0.44]))
    status, lines = check(folder)
    assert status == 1
    assert_names(lines, "materials.yaml", "stainless-316-passive", "seawater_range_V_SCE", "not nobler")


def test_computed_equivalent_weight_must_match_composition(folder):
    # ASTM G102: EW = 1/Σ(f·n/W); zinc, n = 2, W = 65.38 g/mol (IUPAC standard atomic weight,
    # from memory) gives 32.69 g; 30.0 g is 8 % off
    def change(doc):
        zinc = record(doc, "materials", "zinc")
        zinc.update(composition_wt_pct={"Zn": 100}, composition_source="astm-g102", composition_confidence="recalled",
                    equivalent_weight_valences={"Zn": 2}, equivalent_weight_confidence="computed")
    edit(folder, "materials.yaml", change)
    assert check(folder) == (0, [])
    edit(folder, "materials.yaml",
         lambda doc: record(doc, "materials", "zinc").__setitem__("equivalent_weight_g", 30.0))
    status, lines = check(folder)
    assert status == 1
    assert_names(lines, "materials.yaml", "zinc", "equivalent_weight_g", "30", "32.69")


def _computed_zinc(doc, composition, valences, ew):
    zinc = record(doc, "materials", "zinc")
    zinc.update(composition_wt_pct=composition, composition_source="astm-g102", composition_confidence="recalled",
                equivalent_weight_valences=valences, equivalent_weight_g=ew, equivalent_weight_confidence="computed")


def test_the_recomputed_equivalent_weight_is_calcs(folder):
    """One G102 sum: the number the validator compares with is calc.rate.equivalent_weight's over
    the elements given a valence (Zn 98, Al 2: a made-up alloy, only to have two terms)."""
    from calc.rate import equivalent_weight

    expected = equivalent_weight({"Zn": 98, "Al": 2}, {"Zn": 2, "Al": 3}, min_wt_pct=0.0).value_g
    edit(folder, "materials.yaml", lambda doc: _computed_zinc(doc, {"Zn": 98, "Al": 2}, {"Zn": 2, "Al": 3}, 30.0))
    status, lines = check(folder)
    assert status == 1
    assert_names(lines, "materials.yaml", "zinc", "equivalent_weight_g", f"gives {expected:.2f} g")
    edit(folder, "materials.yaml", lambda doc: _computed_zinc(doc, {"Zn": 98, "Al": 2}, {"Zn": 2, "Al": 3},
                                                              round(expected, 2)))
    assert check(folder) == (0, [])


def test_an_element_without_an_atomic_weight_is_a_warning(folder):
    edit(folder, "materials.yaml", lambda doc: _computed_zinc(doc, {"Zn": 99, "Xq": 1}, {"Zn": 2, "Xq": 2}, 32.69))
    status, lines = check(folder)
    assert status == 0
    assert any(ln.startswith("warning: materials.yaml:zinc:equivalent_weight_valences.Xq: cannot re-compute")
               for ln in lines), lines


# ---------------------------------------------------------------- composition limits (PREN of a grade)
# The fixture's 316 limits are those of ASTM A240 for S31603 (Cr 16.0-18.0, Mo 2.0-3.0, N max 0.10).

def _limits(doc, rid, **changes):
    rec = record(doc, "materials", rid)
    for key, value in changes.items():
        rec[key] = value
    return rec


def test_limits_that_run_backwards_are_reported(folder):
    edit(folder, "materials.yaml", lambda doc: record(doc, "materials", "stainless-316-passive")
         ["composition_limits_min_wt_pct"].__setitem__("Cr", 19.0))
    status, lines = check(folder)
    assert status == 1
    assert_names(lines, "materials.yaml", "stainless-316-passive", "composition_limits_min_wt_pct.Cr",
                 "19 wt % above the maximum 18")


def test_an_element_needs_both_limits(folder):
    edit(folder, "materials.yaml", lambda doc: record(doc, "materials", "stainless-316-passive")
         ["composition_limits_max_wt_pct"].pop("N"))
    status, lines = check(folder)
    assert status == 1
    assert_names(lines, "materials.yaml", "stainless-316-passive", "composition_limits_max_wt_pct",
                 "N has a limit in composition_limits_min_wt_pct")


def test_nominal_limits_must_be_single_values(folder):
    edit(folder, "materials.yaml", lambda doc: _limits(doc, "stainless-316-passive", composition_limits_basis="nominal"))
    status, lines = check(folder)
    assert status == 1
    assert_names(lines, "materials.yaml", "stainless-316-passive", "composition_limits_min_wt_pct.Cr",
                 "nominal value has min = max")


def test_nominal_composition_must_lie_inside_the_limits(folder):
    # a nominal 20 % Cr is outside the 16-18 % of the grade
    edit(folder, "materials.yaml", lambda doc: _limits(
        doc, "stainless-316-passive", composition_wt_pct={"Fe": 65.5, "Cr": 20.0, "Ni": 12.0, "Mo": 2.5},
        composition_source="astm-g102", composition_confidence="recalled"))
    status, lines = check(folder)
    assert status == 1
    assert_names(lines, "materials.yaml", "stainless-316-passive", "composition_wt_pct.Cr", "outside the limits 16-18")


def test_a_passive_stainless_steel_needs_chromium_limits(folder):
    def change(doc):
        for rid in ("stainless-316-passive", "stainless-316-active"):
            rec = record(doc, "materials", rid)
            for key in [k for k in rec if k.startswith("composition_limits_")]:
                del rec[key]
    edit(folder, "materials.yaml", change)
    status, lines = check(folder)
    assert status == 1
    assert_names(lines, "materials.yaml", "stainless-316-passive", "composition_limits_min_wt_pct",
                 "passive state has no composition_limits_min_wt_pct", "PREN")


def test_both_states_of_one_alloy_share_their_limits(folder):
    edit(folder, "materials.yaml", lambda doc: record(doc, "materials", "stainless-316-active")
         ["composition_limits_max_wt_pct"].__setitem__("Mo", 4.0))
    status, lines = check(folder)
    assert status == 1
    assert_names(lines, "materials.yaml", "stainless-316-active", "composition_limits_max_wt_pct",
                 "differ from those of stainless-316-passive")
