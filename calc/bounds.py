"""Every bound on a calculator input, written once.

The engine checks each input against its bound here (:func:`check`); the command line shows the
same words in its help; the page reads the table from ``assets/data/spec.json`` (written at build
time by :func:`calc.spec.page_spec`) for the hints under its fields and otherwise only checks that
a field holds a number: what is allowed, and why, is decided here.
"""

from dataclasses import asdict, dataclass

from .derivation import check_number


@dataclass(frozen=True)
class Bound:
    """An allowed interval with the words the error and the page hint use."""

    low: float  # or None
    high: float  # or None
    low_open: bool
    unit: str
    allowed: str  # the error's "expected ..." words
    text: str  # the short hint shown under a field


#: name -> Bound. Where a bound has a physical reason, its words say it.
BOUNDS = {
    "temp_C": Bound(0.0, 100.0, False, "°C", "a temperature from 0 to 100 °C (liquid water at 1 atm)", "0 to 100 °C"),
    "structure_temp_C": Bound(0.0, 100.0, False, "°C", "a structure temperature from 0 to 100 °C", "0 to 100 °C, or empty"),
    "pH": Bound(-2.0, 16.0, False, "", "a pH from -2 to 16", "−2 to 16 (0 to 14 usual)"),
    "activity": Bound(0.0, 1.0e6, True, "", "an activity above 0 and at most 1e+06 [unitless]", "above 0 (1 is standard)"),
    "molality": Bound(0.0, 50.0, True, "mol/kg", "a molality above 0 and at most 50 mol/kg", "above 0, up to 50 mol/kg"),
    "pressure_atm": Bound(0.0, 1000.0, True, "atm", "a partial pressure above 0 and at most 1000 atm", "above 0, up to 1000 atm"),
    "ionic_strength": Bound(0.0, 5.0, False, "mol/kg", "an ionic strength from 0 to 5 mol/kg",
                            "0 to 5 mol/kg; each model has its own valid range"),
    "composition_molality": Bound(0.0, 50.0, False, "mol/kg", "a molality of 0 or more [mol/kg]", "0 to 50 mol/kg"),
    "size_angstrom": Bound(1.0, 15.0, False, "Å", "an ion size from 1 to 15 Å", "1 to 15 Å"),
    "value_V": Bound(-10.0, 10.0, False, "V", "a reading from -10 to 10 V", "the meter reading, −10 to +10 V"),
    "reading_V": Bound(-10.0, 10.0, False, "V", "a reading in V from -10 to 10", "−10 to +10 V"),
    "salinity": Bound(0.0, 45.0, True, "g/kg", "a salinity above 0 and up to 45 g/kg", "above 0, up to 45 g/kg"),
    "chloride_mg_per_L": Bound(0.0, 25000.0, True, "mg/L", "a chloride content above 0 and up to 25000 mg/L",
                               "above 0, up to 25000 mg/L"),
    "polarisation_mV": Bound(0.0, 2000.0, False, "mV", "a polarisation shift from 0 to 2000 mV", "0 to 2000 mV, or empty"),
    # the size of an IR drop subtracted from an on reading (cp): beyond 5 V the on reading says little (common practice)
    "ir_drop_mV": Bound(0.0, 5000.0, False, "mV", "an IR drop from 0 to 5000 mV (its size, a positive number)",
                        "0 to 5000 mV, its size"),
    "area_ratio": Bound(0.0, 1.0e6, True, "", "a cathode-to-anode wetted-area ratio, a finite number above 0 and at most 1e+06",
                        "above 0; empty for equal areas"),
    "current_density_uA_per_cm2": Bound(0.0, 1.0e6, False, "µA/cm²", "a current density from 0 to 1e+06 µA/cm²",
                                        "0 to 1e+06 µA/cm²"),
    # service conditions of a joint (issue 15): 30 m/s is beyond ship hulls and pipe flows (common practice)
    "velocity_m_s": Bound(0.0, 30.0, False, "m/s", "a flow velocity from 0 to 30 m/s", "0 (still) to 30 m/s"),
    "diameter_m": Bound(0.0, 10.0, True, "m", "a pipe diameter above 0 and up to 10 m", "above 0, up to 10 m"),
    "length_m": Bound(0.0, 1000.0, True, "m", "a surface length in the flow direction above 0 and up to 1000 m",
                      "above 0, up to 1000 m"),
    "still_layer_m": Bound(1.0e-5, 0.02, False, "m", "a still-water diffusion layer from 1e-05 to 0.02 m",
                           "1e-05 to 0.02 m"),
    # seawater is about 5 S/m and 20 S/m beyond any natural water; 1e-4 S/m (10 kΩ·m) is purer than rain (common practice)
    "conductivity_S_per_m": Bound(1.0e-4, 20.0, False, "S/m", "an electrolyte conductivity from 0.0001 to 20 S/m",
                                  "0.0001 to 20 S/m (seawater about 5, fresh water 0.005 to 0.1)"),
    # a wetted anode from 1 mm² to 1e8 cm² (10 000 m²)
    "anode_area_cm2": Bound(0.01, 1.0e8, False, "cm²", "an anode wetted area from 0.01 to 1e+08 cm²",
                            "0.01 to 1e+08 cm², or empty for no IR term"),
}


def check(name, value, field=None):
    """An input checked against its bound: a finite number inside it, or an InputError.

    Args:
        name: the bound's name in :data:`BOUNDS` [unitless]
        value: the value given [the bound's unit]
        field: the request field shown in an error, default the bound's name [unitless]

    Returns:
        the value as a float [the bound's unit]

    References:
        Input rule of the project (DESIGN.md: calc decides what is allowed and says why).

    >>> check("pH", 7)
    7.0
    >>> check("temp_C", 120)
    Traceback (most recent call last):
    ...
    calc.errors.InputError: temp_C = 120.0: expected a temperature from 0 to 100 °C (liquid water at 1 atm)
    """
    b = BOUNDS[name]
    return check_number(value, field or name, b.allowed, low=b.low, high=b.high, low_open=b.low_open)


def as_data():
    """The table as plain data for the page: name -> {low, high, low_open, unit, text}.

    Returns:
        a dict of dicts [the bounds' units]

    References:
        Project convention (one generated file carries the bounds to the page).

    >>> as_data()["temp_C"]["high"]
    100.0
    """
    return {name: {k: v for k, v in asdict(b).items() if k != "allowed"} for name, b in BOUNDS.items()}
