"""calc.cpdesign.resistivity: the Wenner four-pin soil resistivity (ASTM G57).

ASTM G57-95a (reapproved 2001), Sec. 3.2 (read in a public copy): ρ [Ω·cm] = 2π·a·R with a in cm,
= 191.5·a·R with a in ft.
"""

import math

import pytest

from calc.cpdesign.catalogue import table
from calc.cpdesign.resistivity import wenner, wenner_entry
from calc.cpdesign.units import FT_M
from calc.errors import InputError


@pytest.fixture(autouse=True)
def _shipped(shipped):
    return shipped


def test_the_feet_factor_of_the_standard_is_two_pi_times_a_foot():
    # ASTM G57-95a (2001) Sec. 3.2: 191.5 = 2π × 30.48 cm, rounded (tolerance half a unit of the last figure)
    factor = table("wenner-constant")["rows"][0]["factor_ohm_cm_per_ft_ohm"]
    assert factor == 191.5
    assert 2 * math.pi * 30.48 == pytest.approx(factor, abs=0.05)


def test_feet_form_agrees_with_the_si_form():
    # 10 ft spacing, 2 Ω: 191.5 × 10 × 2 = 3830 Ω·cm (ASTM G57 feet form), 38.30 Ω·m
    assert wenner(10 * FT_M, 2.0) * 100 == pytest.approx(191.5 * 10 * 2, rel=3e-4)


def test_mil_hdbk_419a_example():
    # MIL-HDBK-419A, Grounding, Bonding and Shielding, Volume II, eq. (11) and its example beside Figure 11
    # (read in a public copy; the year, 1987, is recalled): 20 ft spacing,
    # 2 Ω: 20 ft × 30.5 cm/ft = 610 cm, ρ = 7662 Ω·cm (its rounding); exactly 2π × 609.6 cm × 2 Ω = 7660.5 Ω·cm:
    # tolerance 0.05 %
    assert wenner(20 * FT_M, 2.0) * 100 == pytest.approx(7662, rel=5e-4)


def test_resistivity_is_linear_in_spacing_and_reading():
    assert wenner(2.0, 3.0) == pytest.approx(2 * wenner(1.0, 3.0)) == pytest.approx(3 * wenner(2.0, 1.0))


def test_entry():
    r = wenner_entry({"spacing_m": 1.524, "resistance_ohm": 2.5})
    assert r["resistivity_ohm_m"] == pytest.approx(2 * math.pi * 1.524 * 2.5)
    assert r["resistivity_ohm_cm"] == pytest.approx(100 * r["resistivity_ohm_m"])
    assert r["sources"] == ["astm-g57"] and r["cautions"] and len(r["steps"]) == 2


@pytest.mark.parametrize("req, field", [
    ({"spacing_m": 0, "resistance_ohm": 2}, "spacing_m"),
    ({"spacing_m": -1, "resistance_ohm": 2}, "spacing_m"),
    ({"spacing_m": 1, "resistance_ohm": 0}, "resistance_ohm"),
    ({"spacing_m": 1, "resistance_ohm": -2}, "resistance_ohm"),
    ({"spacing_m": 1, "resistance_ohm": "many"}, "resistance_ohm"),
    ({"resistance_ohm": 2}, "spacing_m"),
    ({"spacing_m": 1, "resistance_ohm": 2, "depth": 1}, "depth"),
])
def test_bad_input_is_refused_naming_the_field(req, field):
    with pytest.raises(InputError) as exc:
        wenner_entry(req)
    assert exc.value.field == field
