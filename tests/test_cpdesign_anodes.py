"""calc.cpdesign.anodes: anode resistance by shape, the stand-off rule, consumed dimensions, output.

The formulas are those of DNV-RP-B401 as restated by El-Reedy, Offshore Structures (2012), ch. 6 (and
listed in the project's reference notes (flagged read there): modified Dwight for long stand-off anodes,
valid from 0.30 m, ×1.3 from 0.15 to 0.30 m; Lloyd's ρ/(2S) for long flush anodes; McCoy's 0.315ρ/√A
for short flush, bracelet and plate anodes). No worked numbers were read for them: the values below
are computed [C]; the short stand-off formula and the consumed-dimension rule are from memory.
"""

import math

import pytest

from calc.cpdesign.anodes import (SHAPES, anode_resistance_entry, compact, consumed_standoff, flush_long, output,
                                  resistance, standoff_factor, standoff_long, standoff_short)
from calc.cpdesign.catalogue import record
from calc.errors import InputError

RULE = {"min_m": 0.30, "near_min_m": 0.15, "near_factor": 1.3}


@pytest.fixture(autouse=True)
def _shipped(shipped):
    return shipped


def test_the_formulas_by_hand():
    # [C] 0.30 Ω·m seawater; a 2.5 m × 0.12 m stand-off anode; a 1.5 × 0.2 m flush anode; a 0.36 m² bracelet
    assert standoff_long(0.30, 2.5, 0.12) == pytest.approx(0.30 / (2 * math.pi * 2.5) * (math.log(10 / 0.12) - 1))
    assert flush_long(0.30, 1.5, 0.2) == pytest.approx(0.30 / (2 * 0.85))
    assert compact(0.30, 0.36) == pytest.approx(0.315 * 0.30 / 0.6)
    assert output(0.25, 0.0625) == pytest.approx(4.0)


def test_short_standoff_meets_the_long_formula_for_slender_anodes():
    # the short formula tends to the long one as L/r grows
    assert standoff_short(0.3, 100.0, 0.01) == pytest.approx(standoff_long(0.3, 100.0, 0.01), rel=1e-4)


def test_the_standoff_rule_as_restated():
    # El-Reedy (2012) ch. 6 (the project's reference notes, flagged read): valid at 0.30 m and more, ×1.3 from 0.15 to 0.30 m
    assert standoff_factor(0.30, RULE) == 1.0
    assert standoff_factor(0.5, RULE) == 1.0
    assert standoff_factor(0.15, RULE) == 1.3
    assert standoff_factor(0.29, RULE) == 1.3
    with pytest.raises(InputError) as exc:
        standoff_factor(0.10, RULE)
    assert exc.value.field == "anode.standoff_m" and "flush" in str(exc.value)


def test_the_shipped_rule_is_the_restated_one():
    rule = record("cp_anode_types", "long-slender-standoff", "anode_type")["standoff"]
    assert (rule["min_m"], rule["near_min_m"], rule["near_factor"]) == (0.30, 0.15, 1.3)
    assert rule["source"] == "el-reedy-2012"


def test_consumed_standoff_keeps_the_remaining_volume():
    lf, rf = consumed_standoff(2.5, 0.12, 0.9)
    assert lf == pytest.approx(2.25)
    assert math.pi * rf ** 2 * lf == pytest.approx(0.1 * math.pi * 0.12 ** 2 * 2.5)
    lf, rf = consumed_standoff(2.5, 0.12, 0.9, core_radius=0.03)
    assert rf > 0.03


# ------------------------------------------------------------------ invariants

def test_resistance_falls_as_the_anode_is_longer():
    lengths = [0.2 * k for k in range(3, 60)]
    for model in (lambda L: standoff_long(0.3, L, 0.1), lambda L: flush_long(0.3, L, 0.2),
                  lambda L: standoff_short(0.3, L, 0.1)):
        values = [model(L) for L in lengths]
        assert all(b < a for a, b in zip(values, values[1:]))


def test_resistance_falls_as_the_area_grows_and_rises_with_resistivity():
    areas = [0.05 * k for k in range(1, 40)]
    values = [compact(0.3, a) for a in areas]
    assert all(b < a for a, b in zip(values, values[1:]))
    for shape, dims in (("standoff", {"length_m": 2, "radius_m": 0.1, "standoff_m": 0.3}),
                        ("flush", {"length_m": 2, "width_m": 0.3}), ("plate", {"area_m2": 0.2})):
        assert resistance(shape, 0.6, dims)[0] == pytest.approx(2 * resistance(shape, 0.3, dims)[0])


def test_consumed_anode_has_a_higher_resistance():
    lf, rf = consumed_standoff(2.5, 0.12, 0.9)
    assert standoff_long(0.3, lf, rf) > standoff_long(0.3, 2.5, 0.12)


def test_near_the_structure_the_resistance_is_higher():
    far = resistance("standoff", 0.3, {"length_m": 2.5, "radius_m": 0.1, "standoff_m": 0.3})[0]
    near = resistance("standoff", 0.3, {"length_m": 2.5, "radius_m": 0.1, "standoff_m": 0.2})[0]
    assert near == pytest.approx(1.3 * far)


def test_periphery_gives_the_radius():
    by_radius = resistance("standoff", 0.3, {"length_m": 2.5, "radius_m": 0.1, "standoff_m": 0.3})[0]
    by_periphery = resistance("standoff", 0.3, {"length_m": 2.5, "periphery_m": 0.2 * math.pi, "standoff_m": 0.3})[0]
    assert by_periphery == pytest.approx(by_radius)


def test_short_standoff_anode_warns_and_uses_the_short_formula():
    value, formula, _, warns = resistance("standoff", 0.3, {"length_m": 0.3, "radius_m": 0.1, "standoff_m": 0.3})
    assert value == pytest.approx(standoff_short(0.3, 0.3, 0.1)) and warns


# ------------------------------------------------------------------ the entry

@pytest.mark.parametrize("shape", SHAPES)
def test_entry_gives_a_resistance_for_every_shape(shape):
    req = {"shape": shape, "resistivity_ohm_m": 0.3, "length_m": 2.0, "radius_m": 0.1, "width_m": 0.3,
           "area_m2": 0.3, "standoff_m": 0.4}
    r = anode_resistance_entry(req)
    assert r["resistance_ohm"] > 0 and r["steps"] and r["cautions"] and r["sources"]


@pytest.mark.parametrize("change, field", [
    ({"resistivity_ohm_m": 0}, "resistivity_ohm_m"),
    ({"resistivity_ohm_m": -0.3}, "resistivity_ohm_m"),
    ({"length_m": 0}, "length_m"),
    ({"length_m": -2}, "length_m"),
    ({"radius_m": 0}, "radius_m"),
    ({"radius_m": None}, "radius_m"),
    ({"standoff_m": None}, "standoff_m"),
    ({"standoff_m": 0.1}, "standoff_m"),
    ({"shape": "sphere"}, "shape"),
    ({"shape": "flush", "width_m": None}, "width_m"),
    ({"shape": "bracelet", "area_m2": 0}, "area_m2"),
    ({"shape": "plate", "area_m2": None}, "area_m2"),
    ({"colour": "grey"}, "colour"),
])
def test_bad_input_is_refused_naming_the_field(change, field):
    req = {"shape": "standoff", "resistivity_ohm_m": 0.3, "length_m": 2.0, "radius_m": 0.1, "width_m": 0.3,
           "area_m2": 0.3, "standoff_m": 0.4}
    req = {k: v for k, v in dict(req, **change).items() if v is not None}
    with pytest.raises(InputError) as exc:
        anode_resistance_entry(req)
    assert exc.value.field == field
