"""Oxygen transport (calc.transport) and the O2 limiting current (calc.o2supply).

Published values used here, each with its source beside it:
- viscosity of water: Perry's Chemical Engineers' Handbook, 9th ed. (2019), Table 2-135,
  "Thermodynamic properties of water", saturated liquid, viscosity in µPa·s (IAPWS), read;
- viscosity of seawater: the check value 1.383779 mPa·s at S = 30, 10 °C of D. Kelley's oce
  package (swViscosity, a fit to N. E. Dorsey, Properties of Ordinary Water-Substance, 1940,
  Table 87, within 0.2 %), read; F. J. Millero (1974, The Sea vol. 5, p. 3) check value
  0.96541 mPa·s at S = 40, 25 °C, as printed with a public implementation of it, read;
- O2 diffusivity: P. R. Roberge, Corrosion Engineering: Principles and Practice (2008),
  Table 5.3, O2 2.26e-5 cm²/s at 25 °C, read; measured values scatter by some 20 % between
  authors (CRC Handbook, "Diffusion of gases in water", introduction), so the check is loose;
- cathodic current densities of aerated seawater: data/environments.yaml, still 5–20 and flowing
  (2.4–4 m/s) 50–200 µA/cm², source laque-1975 (F. L. LaQue, Marine Corrosion: Causes and
  Prevention, Wiley 1975), recalled and provisional there.
The Sherwood correlations' own papers (Berger & Hau 1977; Incropera et al. 2007) were not read
here: their equations are checked at hand-computed points only.
"""

import math

import pytest

from calc import transport as tr
from calc.errors import InputError
from calc.o2supply import oxygen_limiting_current as olc

PERRY_2_135 = [(273.16, 1791.2), (280, 1433.7), (290, 1084.0), (300, 853.84), (310, 693.54), (320, 577.02),
               (330, 489.49), (340, 421.97), (350, 368.77), (360, 326.10), (370, 291.36)]


@pytest.mark.parametrize("T, mu_uPa_s", PERRY_2_135)
def test_water_viscosity_matches_perry_table_2_135(T, mu_uPa_s):
    # Sharqawy et al. (2010) eq. (23) is a fit to IAPWS 2008; within 0.2 %
    assert tr.water_viscosity_Pa_s(T - 273.15) * 1e6 == pytest.approx(mu_uPa_s, rel=2e-3)


@pytest.mark.parametrize("t, s, mu_Pa_s", [(10.0, 30.0, 1.383779e-3), (25.0, 40.0, 9.6541e-4)])
def test_seawater_viscosity_matches_published_check_values(t, s, mu_Pa_s):
    # within the ±1.5 % Sharqawy et al. (2010) state for eq. (22)
    assert tr.seawater_viscosity_Pa_s(t, s) == pytest.approx(mu_Pa_s, rel=0.015)


def test_seawater_is_more_viscous_than_water_and_kinematic_viscosity_is_mu_over_rho():
    for t in (0.0, 10.0, 25.0, 40.0, 80.0):
        assert tr.seawater_viscosity_Pa_s(t, 35.0) > tr.water_viscosity_Pa_s(t) == tr.seawater_viscosity_Pa_s(t, 0.0)
    r = olc(25.0, 35.0)
    assert r.kinematic_viscosity_m2_s == pytest.approx(r.viscosity_Pa_s / r.density_kg_m3, rel=1e-12)


def test_o2_diffusivity_formula_of_han_bartels():
    # the abstract's formula evaluated by hand: log10 D = −4.410 + 773.8/298.15 − (506.4/298.15)²
    assert tr.o2_diffusivity_water_m2_s(25.0) == pytest.approx(10 ** -4.699459 * 1e-4, rel=1e-5)
    values = [tr.o2_diffusivity_water_m2_s(t) for t in range(0, 100, 5)]
    assert all(a < b for a, b in zip(values, values[1:]))


def test_o2_diffusivity_near_roberge_table_5_3_loosely():
    # Roberge 2008 Table 5.3: 2.26e-5 cm²/s at 25 °C; Han & Bartels give 2.00e-5; within 15 %
    assert tr.o2_diffusivity_water_m2_s(25.0) == pytest.approx(2.26e-9, rel=0.15)


def test_seawater_diffusivity_is_scaled_by_the_viscosity_ratio():
    ratio = tr.o2_diffusivity_m2_s(25.0, 35.0) / tr.o2_diffusivity_water_m2_s(25.0)
    assert ratio == pytest.approx(tr.water_viscosity_Pa_s(25.0) / tr.seawater_viscosity_Pa_s(25.0, 35.0), rel=1e-12)
    assert 0.90 < ratio < 0.95


def test_sherwood_correlations_at_hand_computed_points():
    # the equations as printed: 0.0165·Re^0.86·Sc^0.33; 0.664·Re^0.5·Sc^(1/3); 0.037·Re^0.8·Sc^(1/3)
    assert tr.sherwood_pipe_turbulent(1e5, 1e3) == pytest.approx(0.0165 * 10 ** (5 * 0.86 + 3 * 0.33), rel=1e-12)
    assert tr.sherwood_plate_laminar(1e4, 1e3) == pytest.approx(0.664 * 100 * 10, rel=1e-12)
    assert tr.sherwood_plate_turbulent(1e5, 8.0) == pytest.approx(0.037 * 1e4 * 2.0, rel=1e-12)
    assert tr.sherwood_pipe_laminar(100.0, 1e3) == 3.66


def test_turbulent_plate_gives_more_transfer_than_laminar_at_the_transition():
    re = tr.RE_PLATE_LAMINAR_MAX
    assert tr.sherwood_plate_turbulent(re, 500.0) > tr.sherwood_plate_laminar(re, 500.0)


def test_validity_warnings_inside_and_outside():
    assert tr.validity_warnings("pipe-turbulent", 5e4, 2000.0) == []
    out = tr.validity_warnings("pipe-turbulent", 5e5, 500.0)
    assert len(out) == 2 and out[0].startswith("Re = ") and out[1].startswith("Sc = ")
    assert tr.validity_warnings("plate-turbulent", 2e8, 1000.0)[0].startswith("Re = ")


def test_limiting_current_formula_and_units():
    # i_L = n·F·D·C/δ, Roberge 2008 Eq. (5.14): 4 × 96485.33 × 2e-9 × 0.25 / 1e-3 = 0.19297 A/m²
    assert tr.limiting_current_density_A_m2(2e-9, 0.25, 1e-3) == pytest.approx(0.192971, rel=1e-5)
    r = olc(15.0, 35.0, velocity_m_s=1.0, geometry="pipe", diameter_m=0.05)
    assert r.i_L_uA_per_cm2 == pytest.approx(100.0 * r.i_L_A_per_m2, rel=1e-12)
    assert r.delta_m == pytest.approx(0.05 / r.sherwood, rel=1e-12)
    assert r.i_L_A_per_m2 == pytest.approx(4 * 96485.33212 * r.diffusivity_m2_s * r.o2_mol_m3 / r.delta_m, rel=1e-8)
    assert "A/m²" in r.steps[-1]["result"] and "µA/cm²" in r.steps[-1]["result"]


# ---------------------------------------------------------------- cross-checks with the environments


@pytest.mark.parametrize("t", [5.0, 10.0, 15.0, 20.0, 25.0, 30.0])
def test_still_seawater_lands_in_the_published_5_to_20_uA_per_cm2(t):
    # environments.yaml seawater-quiescent, 5–20 µA/cm² (laque-1975, recalled). Not independent:
    # the 1 mm still-water layer (calc.transport.STILL_LAYER_M) is a stated choice; this checks
    # that with it D·C gives the band over 5–30 °C
    assert 5.0 <= olc(t, 35.0).i_L_uA_per_cm2 <= 20.0


FLOWING = [("pipe", {"diameter_m": 0.1}), ("surface", {"length_m": 1.0})]


@pytest.mark.parametrize("geometry, size", FLOWING)
@pytest.mark.parametrize("v", [2.4, 4.0])
@pytest.mark.parametrize("t", [10.0, 25.0])
def test_flowing_seawater_diffusion_limit_lies_above_the_published_range(geometry, size, v, t):
    # environments.yaml seawater-flowing, 50–200 µA/cm² at 2.4–4 m/s (laque-1975, recalled). For
    # the inside of a 0.1 m pipe (Berger & Hau) and a 1 m open surface (turbulent flat plate) the
    # diffusion limit at 10–25 °C is 500–1400 µA/cm², 2.5–7 times the top of the published band:
    # the cathodes behind those currents were not diffusion-limited (films, fouling, kinetics).
    # i_L is the upper bound a real cathode current cannot exceed.
    r = olc(t, 35.0, velocity_m_s=v, geometry=geometry, **size)
    assert 200.0 < r.i_L_uA_per_cm2 < 2000.0


@pytest.mark.xfail(strict=True, reason="the diffusion limit at 2.4-4 m/s is 2.5-7x the top of the recalled "
                                       "50-200 uA/cm2 for any sensible geometry; see the test above")
def test_flowing_seawater_lands_in_the_published_range_as_the_issue_expects():
    r = olc(25.0, 35.0, velocity_m_s=2.4, geometry="pipe", diameter_m=0.1)
    assert 50.0 <= r.i_L_uA_per_cm2 <= 200.0


def test_the_published_flowing_range_is_the_diffusion_limit_of_slow_flow():
    # the same 50–200 µA/cm² is reached by diffusion alone at about 0.1–0.5 m/s in a 0.1 m pipe
    assert 50.0 <= olc(25.0, 35.0, velocity_m_s=0.1, geometry="pipe", diameter_m=0.1).i_L_uA_per_cm2 <= 200.0
    assert 50.0 <= olc(10.0, 35.0, velocity_m_s=0.5, geometry="pipe", diameter_m=0.1).i_L_uA_per_cm2 <= 200.0


# ---------------------------------------------------------------- invariants

GEOMS = [("still", {}), ("pipe", {"diameter_m": 0.025}), ("pipe", {"diameter_m": 0.3}),
         ("surface", {"length_m": 0.1}), ("surface", {"length_m": 10.0})]
VELOCITIES = [0.0, 0.005, 0.02, 0.05, 0.1, 0.2, 0.5, 1.0, 2.0, 3.0, 5.0, 10.0, 20.0]


@pytest.mark.parametrize("geometry, size", GEOMS)
@pytest.mark.parametrize("t", [2.0, 25.0, 60.0])
def test_limiting_current_never_falls_with_velocity(geometry, size, t):
    values = [olc(t, 35.0, velocity_m_s=v, geometry=geometry, **size).i_L_A_per_m2 for v in VELOCITIES]
    assert all(b >= a for a, b in zip(values, values[1:]))
    assert all(math.isfinite(x) and x > 0 for x in values)


@pytest.mark.parametrize("geometry, size, v", [("still", {}, 0.0), ("pipe", {"diameter_m": 0.1}, 2.0),
                                               ("surface", {"length_m": 1.0}, 0.3)])
@pytest.mark.parametrize("t", [5.0, 25.0, 40.0])
def test_limiting_current_falls_with_salinity_at_fixed_temperature(geometry, size, v, t):
    values = [olc(t, s, velocity_m_s=v, geometry=geometry, **size).i_L_A_per_m2 for s in (0, 5, 10, 20, 30, 35, 40)]
    assert all(a > b for a, b in zip(values, values[1:]))


def test_limiting_current_is_proportional_to_the_oxygen_given():
    sat = olc(20.0, 35.0, velocity_m_s=1.0, geometry="pipe", diameter_m=0.1)
    half = olc(20.0, 35.0, o2_mg_L=sat.o2_saturation_mg_L / 2, velocity_m_s=1.0, geometry="pipe", diameter_m=0.1)
    assert half.i_L_A_per_m2 == pytest.approx(sat.i_L_A_per_m2 / 2, rel=1e-9) and half.o2_given
    assert olc(20.0, 35.0, o2_mg_L=0.0).i_L_A_per_m2 == 0.0


def test_the_diffusion_layer_is_never_thicker_than_in_still_water():
    for geometry, size in GEOMS:
        for v in VELOCITIES:
            assert olc(25.0, 35.0, velocity_m_s=v, geometry=geometry, **size).delta_m <= tr.STILL_LAYER_M


def test_same_joint_at_5_and_40_C_still_and_at_3_m_s_differs_and_says_why():
    runs = {(t, v): olc(t, 35.0, velocity_m_s=v, geometry="surface", length_m=0.5)
            for t in (5.0, 40.0) for v in (0.0, 3.0)}
    assert len({round(r.i_L_A_per_m2, 6) for r in runs.values()}) == 4
    assert runs[(5.0, 3.0)].i_L_A_per_m2 > 10 * runs[(5.0, 0.0)].i_L_A_per_m2
    assert runs[(5.0, 0.0)].correlation == "still-layer" and runs[(5.0, 3.0)].correlation == "plate-turbulent"
    assert runs[(40.0, 0.0)].o2_mg_L < runs[(5.0, 0.0)].o2_mg_L


def test_result_is_plain_data():
    out = olc(25.0, 35.0, velocity_m_s=2.0, geometry="pipe", diameter_m=0.1).to_dict()
    assert out["geometry"] == "pipe" and out["length_m"] is None and isinstance(out["steps"], list)
    assert {"berger-hau-1977", "roberge-2008", "garcia-gordon-1992"} <= set(out["sources"])


# ---------------------------------------------------------------- bad input


@pytest.mark.parametrize("kwargs, field", [
    ({"velocity_m_s": -0.1, "geometry": "pipe", "diameter_m": 0.1}, "velocity_m_s"),
    ({"velocity_m_s": 31.0, "geometry": "pipe", "diameter_m": 0.1}, "velocity_m_s"),
    ({"velocity_m_s": float("inf"), "geometry": "pipe", "diameter_m": 0.1}, "velocity_m_s"),
    ({"velocity_m_s": 1.0, "geometry": "pipe", "diameter_m": 0.0}, "diameter_m"),
    ({"velocity_m_s": 1.0, "geometry": "pipe", "diameter_m": -0.1}, "diameter_m"),
    ({"velocity_m_s": 1.0, "geometry": "pipe"}, "diameter_m"),
    ({"velocity_m_s": 1.0, "geometry": "surface", "length_m": 0.0}, "length_m"),
    ({"velocity_m_s": 1.0, "geometry": "surface"}, "length_m"),
    ({"velocity_m_s": 1.0, "geometry": "duct", "diameter_m": 0.1}, "geometry"),
    ({"o2_mg_L": 25.0}, "o2_mg_L"),
    ({"o2_mg_L": -1.0}, "o2_mg_L"),
    ({"still_layer_m": 0.0}, "still_layer_m"),
])
def test_bad_input_names_the_field(kwargs, field):
    with pytest.raises(InputError) as e:
        olc(25.0, 35.0, **kwargs)
    assert e.value.field == field
    assert str(e.value).startswith(field + " = ")


@pytest.mark.parametrize("t", [-0.5, 100.1, float("nan")])
def test_temperature_outside_0_to_100_is_refused(t):
    with pytest.raises(InputError) as e:
        olc(t, 35.0)
    assert e.value.field == "temp_C" and "0 to 100 °C" in str(e.value)


def test_unneeded_inputs_are_warned_about():
    r = olc(25.0, 35.0, velocity_m_s=1.0, geometry="still", length_m=2.0)
    assert {w["field"] for w in r.warnings} == {"velocity_m_s", "length_m"}
