"""calc.cpdesign.mass: net anode mass (DNV-RP-B401 form) and the handbook's weight and life equations.

The net mass equation M = I_m·t_f·8760/(u·ε) is restated by El-Reedy, Offshore Structures (2012),
ch. 6 (read); no worked numbers were read for it, so its values are computed [C]. The handbook form
W = Y·S·I/E and its rearrangement Y = W·E/(S·I) are checked against the printed examples of
MIL-HDBK-1004/10 in tests/test_cpdesign_buried.py and tests/test_cpdesign_groundbed.py.
"""

import pytest

from calc.cpdesign.mass import count_for, handbook_life, handbook_mass, net_mass
from calc.cpdesign.units import HOURS_PER_YEAR


def test_net_mass_by_hand():
    # [C] 50 A mean, 25 years, u = 0.90, ε = 2000 A·h/kg: 50 × 25 × 8760/(0.9 × 2000) = 6083.3 kg
    assert net_mass(50.0, 25, 0.90, 2000) == pytest.approx(50 * 25 * 8760 / 1800)
    assert HOURS_PER_YEAR == 8760.0


def test_net_mass_scales_as_it_should():
    base = net_mass(10.0, 20, 0.85, 780)
    assert net_mass(20.0, 20, 0.85, 780) == pytest.approx(2 * base)
    assert net_mass(10.0, 40, 0.85, 780) == pytest.approx(2 * base)
    assert net_mass(10.0, 20, 0.85, 1560) == pytest.approx(base / 2)
    assert net_mass(10.0, 20, 0.90, 780) < base


def test_life_and_weight_are_inverse():
    for life in (1, 7.5, 15, 40):
        w = handbook_mass(life, 3.99, 0.6, 0.5)
        assert handbook_life(w, 3.99, 0.6, 0.5) == pytest.approx(life)


@pytest.mark.parametrize("total, each, n", [(10.0, 2.5, 4), (10.0, 3.0, 4), (0.1, 5.0, 1), (32.1, 1.0, 33),
                                           (3.0000000001, 1.0, 3)])
def test_count_rounds_up(total, each, n):
    assert count_for(total, each) == n
