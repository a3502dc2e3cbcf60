"""Dissolved oxygen in fresh water and seawater at 1 atm: air saturation, density, concentration.

Methods:

- solubility: H. E. Garcia and L. I. Gordon, "Oxygen solubility in seawater: better fitting
  equations", Limnol. Oceanogr. 37 (1992) 1307, eq. (8) with the coefficients of Table 1 for the
  data of B. B. Benson and D. Krause, Limnol. Oceanogr. 29 (1984) 620 (µmol/kg; erratum
  Limnol. Oceanogr. 38 (1993) 656). Water in equilibrium with moist air (saturated with water
  vapour) at a total pressure of 101.325 kPa; fitted for 0–40 °C and practical salinity 0–40.
  The coefficients are those of the TEOS-10 GSW toolbox's ``gsw_o2sol_sp_pt`` (C source, "second
  column of Table 1 of Garcia and Gordon (1992)"), which also converts the ITS-90 temperature to
  IPTS-68 by t68 = 1.00024·t90 before the fit; done here the same way.
- density: M. H. Sharqawy, J. H. Lienhard V and S. M. Zubair, "Thermophysical properties of
  seawater: a review of existing correlations and data", Desalination and Water Treatment 16
  (2010) 354, eq. (8) at 0.1 MPa (0–180 °C, 0–150 g/kg, ±0.1 %; coefficients as in the authors'
  seawater property library), with the reference-composition salinity S_R = (35.16504/35)·S_P
  (F. J. Millero et al., Deep-Sea Res. I 55 (2008) 50) from the practical salinity given here.
- salinity from chloride: :func:`calc.field.seawater.salinity_from_chloride` (S = 1.80655·Cl).

Units: salinity in g/kg, taken equal to the practical salinity (PSS-78, unitless) as everywhere
in this engine; concentrations in µmol/kg, mg/L (= g/m³) and mol/m³.
"""

import math
from dataclasses import asdict, dataclass

from .bounds import check
from .derivation import Derivation, check_number, fmt
from .elements import ATOMIC_WEIGHTS
from .errors import InputError
from .field.seawater import salinity_from_chloride

#: molar mass of O2 [g/mol] (IUPAC abridged atomic weight of O, :data:`calc.elements.ATOMIC_WEIGHTS`)
M_O2 = 2.0 * ATOMIC_WEIGHTS["O"]
#: ITS-90 to IPTS-68 temperature factor used before the Garcia & Gordon fit (as gsw does) [unitless]
T68_PER_T90 = 1.00024
#: Garcia & Gordon (1992) Table 1, Benson & Krause data, µmol/kg: A0..A5, B0..B3, C0 [unitless]
GG_A = (5.80871, 3.20291, 4.17887, 5.10006, -9.86643e-2, 3.80369)
GG_B = (-7.01577e-3, -7.70028e-3, -1.13864e-2, -9.51519e-3)
GG_C0 = -2.75915e-7
#: range of the Benson & Krause data behind the fit [°C], [g/kg]
GG_TEMP_RANGE_C = (0.0, 40.0)
GG_SALINITY_MAX = 40.0
#: Sharqawy et al. (2010) eq. (8): pure water a1..a5 [kg/m³ per °C^i], salt b1..b5 [kg/m³ ...]
SHARQAWY_RHO_A = (9.9992293295e2, 2.0341179217e-2, -6.1624591598e-3, 2.2614664708e-5, -4.6570659168e-8)
SHARQAWY_RHO_B = (8.0200240891e2, -2.0005183488e0, 1.6771024982e-2, -3.0600536746e-5, -1.6132224742e-5)
#: reference-composition salinity per practical salinity, Millero et al. (2008) [g/kg]
SR_PER_SP = 35.16504 / 35.0

# -- bounds for the lead to move into calc/bounds.py (kept here until then) -------------------------
#: salinity of a service water, fresh water included [g/kg]; calc.bounds "salinity" excludes 0
SALINITY_BOUND = (0.0, 45.0)
SALINITY_ALLOWED = "a salinity from 0 (fresh water) to 45 g/kg"
#: dissolved oxygen given by the user: 0 (deaerated) up to this multiple of air saturation
#: (an engineering bound of this project: supersaturation in service, from algal blooms or air
#: entrainment, stays below about twice air saturation, common practice; a larger number is far
#: more often a unit slip, µmol/L or % typed as mg/L; water under pure oxygen is outside it)
O2_SATURATION_MULTIPLE_MAX = 2.0


def o2_solubility_umol_kg(temp_C, salinity):
    """Oxygen solubility of water in equilibrium with moist air at 1 atm (Garcia & Gordon 1992).

    Args:
        temp_C: temperature (ITS-90) [°C]
        salinity: practical salinity, 0 for fresh water [g/kg]

    Returns:
        the air-saturation concentration [µmol/kg]

    References:
        H. E. Garcia and L. I. Gordon, Limnol. Oceanogr. 37 (1992) 1307, eq. (8) and Table 1
        (fit to Benson & Krause 1984): ln C = A0 + A1·Ts + … + A5·Ts⁵ + S·(B0 + … + B3·Ts³) + C0·S²,
        Ts = ln((298.15 − t)/(273.15 + t)), t in IPTS-68; as in TEOS-10 ``gsw.O2sol_SP_pt``.

    >>> round(o2_solubility_umol_kg(25.0, 35.0), 2)
    206.77
    """
    t68 = temp_C * T68_PER_T90
    ts = math.log((298.15 - t68) / (273.15 + t68))
    a = sum(coef * ts ** i for i, coef in enumerate(GG_A))
    b = sum(coef * ts ** i for i, coef in enumerate(GG_B))
    return math.exp(a + salinity * b + GG_C0 * salinity ** 2)


def seawater_density_kg_m3(temp_C, salinity):
    """Density of seawater (or of pure water, at salinity 0) at 0.1 MPa.

    Args:
        temp_C: temperature [°C]
        salinity: practical salinity [g/kg]

    Returns:
        density [kg/m³]

    References:
        M. H. Sharqawy, J. H. Lienhard V, S. M. Zubair, Desalination and Water Treatment 16
        (2010) 354, eq. (8): ρ = ρ_w(t) + s·(b1 + b2·t + b3·t² + b4·t³) + b5·s²·t², s = S_R/1000
        kg/kg, with S_R = (35.16504/35)·S (Millero et al., Deep-Sea Res. I 55 (2008) 50).

    >>> round(seawater_density_kg_m3(25.0, 35.0), 1), round(seawater_density_kg_m3(4.0, 0.0), 1)
    (1023.7, 999.9)
    """
    t, s = temp_C, salinity * SR_PER_SP / 1000.0
    a1, a2, a3, a4, a5 = SHARQAWY_RHO_A
    b1, b2, b3, b4, b5 = SHARQAWY_RHO_B
    rho_w = a1 + a2 * t + a3 * t ** 2 + a4 * t ** 3 + a5 * t ** 4
    return rho_w + s * (b1 + b2 * t + b3 * t ** 2 + b4 * t ** 3) + b5 * s ** 2 * t ** 2


def umol_kg_to_mol_m3(c_umol_kg, density_kg_m3):
    """A concentration per kilogram of solution as one per cubic metre.

    Args:
        c_umol_kg: concentration [µmol/kg]
        density_kg_m3: density of the solution [kg/m³]

    Returns:
        concentration [mol/m³]

    References:
        Definition of the units (BIPM, The International System of Units, 9th ed., 2019).

    >>> round(umol_kg_to_mol_m3(206.77, 1023.71), 4)
    0.2117
    """
    return c_umol_kg * density_kg_m3 * 1e-6


def mol_m3_to_mg_L(c_mol_m3):
    """An O2 concentration in mol/m³ as mg/L (1 mg/L = 1 g/m³).

    Args:
        c_mol_m3: O2 concentration [mol/m³]

    Returns:
        O2 concentration [mg/L]

    References:
        Molar mass of O2 from the IUPAC atomic weight of O (:data:`M_O2`).

    >>> round(mol_m3_to_mg_L(0.25), 4)
    7.9995
    """
    return c_mol_m3 * M_O2


def service_salinity(salinity=None, chloride_mg_per_L=None, d=None):
    """The salinity of a service water, from salinity or from chloride, checked.

    Args:
        salinity: practical salinity, 0 for fresh water, or None [g/kg]
        chloride_mg_per_L: chloride content instead of salinity, or None [mg/L]
        d: a Derivation that gets the step from chloride, or None [unitless]

    Returns:
        salinity [g/kg]

    References:
        Knudsen relation S = 1.80655·Cl as kept in PSS-78, through
        :func:`calc.field.seawater.salinity_from_chloride`.

    >>> service_salinity(chloride_mg_per_L=19374.0) > 34.99
    True
    >>> service_salinity(-1)
    Traceback (most recent call last):
    ...
    calc.errors.InputError: salinity = -1.0: expected a salinity from 0 (fresh water) to 45 g/kg
    """
    if salinity is not None and chloride_mg_per_L is not None:
        raise InputError("chloride_mg_per_L", chloride_mg_per_L, "only one of salinity or chloride_mg_per_L")
    if chloride_mg_per_L is not None:
        chloride = check("chloride_mg_per_L", chloride_mg_per_L)
        s = salinity_from_chloride(chloride)
        if d is not None:
            d.step("Salinity from chloride", "S = 1.80655·Cl, Cl in g/kg, taking 1 L of water as 1 kg",
                   f"S = 1.80655 × {fmt(chloride)} mg/L / 1000", f"S = {fmt(s, 4)} g/kg")
        return s
    if salinity is None:
        raise InputError("salinity", None, SALINITY_ALLOWED, "or give chloride_mg_per_L")
    return check_number(salinity, "salinity", SALINITY_ALLOWED, *SALINITY_BOUND)


@dataclass(frozen=True)
class DissolvedOxygen:
    """The oxygen of a service water: air saturation and the concentration used."""

    temp_C: float
    salinity: float
    density_kg_m3: float
    saturation_umol_kg: float
    saturation_mg_L: float
    saturation_mol_m3: float
    o2_mg_L: float  # the concentration used
    o2_mol_m3: float
    o2_given: bool  # True: the user's value; False: air saturation
    steps: tuple
    warnings: tuple
    sources: tuple

    def to_dict(self):
        """The result as plain data (lists for the tuples)."""
        out = asdict(self)
        out.update(steps=list(self.steps), warnings=list(self.warnings), sources=list(self.sources))
        return out


def dissolved_oxygen(temp_C, salinity=None, chloride_mg_per_L=None, o2_mg_L=None):
    """Air-saturated O2 of a water at its temperature and salinity, or a user's partial saturation.

    Args:
        temp_C: temperature, 0 to 100 [°C]
        salinity: practical salinity, 0 for fresh water, up to 45 [g/kg]
        chloride_mg_per_L: chloride content instead of salinity [mg/L]
        o2_mg_L: measured dissolved O2, None for air saturation, 0 for deaerated water [mg/L]

    Returns:
        a :class:`DissolvedOxygen` (concentrations in [mg/L] and [mol/m³])

    References:
        :func:`o2_solubility_umol_kg` (Garcia & Gordon 1992, eq. 8, Table 1),
        :func:`seawater_density_kg_m3` (Sharqawy et al. 2010, eq. 8). The bound of
        :data:`O2_SATURATION_MULTIPLE_MAX` is an engineering bound of this project.

    >>> round(dissolved_oxygen(25.0, 35.0).o2_mg_L, 2)
    6.77
    >>> dissolved_oxygen(25.0, 35.0, o2_mg_L=30.0)  # doctest: +ELLIPSIS
    Traceback (most recent call last):
    ...
    calc.errors.InputError: o2_mg_L = 30.0: expected a dissolved oxygen from 0 to 13.5... mg/L (twice air ...
    """
    t = check("temp_C", temp_C)
    d = Derivation()
    s = service_salinity(salinity, chloride_mg_per_L, d)
    c_kg = o2_solubility_umol_kg(t, s)
    rho = seawater_density_kg_m3(t, s)
    sat_mol = umol_kg_to_mol_m3(c_kg, rho)
    sat_mg = mol_m3_to_mg_L(sat_mol)
    d.step("O2 solubility, air-saturated at 1 atm (Garcia & Gordon 1992, Benson & Krause data)",
           "ln C = A0 + A1·Ts + … + A5·Ts⁵ + S·(B0 + B1·Ts + B2·Ts² + B3·Ts³) + C0·S², "
           "Ts = ln((298.15 − t68)/(273.15 + t68)), t68 = 1.00024·t",
           f"t = {fmt(t)} °C, S = {fmt(s, 4)} g/kg", f"C = {fmt(c_kg, 5)} µmol/kg")
    d.step("Density of the water (Sharqawy et al. 2010, eq. 8)",
           "ρ = ρ_w(t) + s·(b1 + b2·t + b3·t² + b4·t³) + b5·s²·t², s = (35.16504/35)·S/1000",
           f"t = {fmt(t)} °C, S = {fmt(s, 4)} g/kg", f"ρ = {fmt(rho, 6)} kg/m³")
    d.step("Air-saturated O2 per volume", "C_sat = C·ρ; mg/L = mol/m³ × 31.998 g/mol",
           f"C_sat = {fmt(c_kg, 5)} µmol/kg × {fmt(rho, 6)} kg/m³",
           f"C_sat = {fmt(sat_mol, 4)} mol/m³ = {fmt(sat_mg, 4)} mg/L")
    for cite in ("garcia-gordon-1992", "sharqawy-2010"):
        d.cite(cite)
    if not GG_TEMP_RANGE_C[0] <= t <= GG_TEMP_RANGE_C[1]:
        d.warn("temp_C", f"{fmt(t)} °C is outside the 0–40 °C of the oxygen-solubility data (Benson & Krause "
                         "1984): the value is extrapolated; towards boiling the true solubility at 1 atm falls "
                         "to zero, so it is overstated there")
    if s > GG_SALINITY_MAX:
        d.warn("salinity", f"salinity {fmt(s, 4)} is above the 40 of the oxygen-solubility data: extrapolated")
    if o2_mg_L is None:
        return DissolvedOxygen(t, s, rho, c_kg, sat_mg, sat_mol, sat_mg, sat_mol, False,
                               tuple(d.steps), tuple(d.warnings), tuple(d.sources))
    high = O2_SATURATION_MULTIPLE_MAX * sat_mg
    given = check_number(o2_mg_L, "o2_mg_L", f"a dissolved oxygen from 0 to {fmt(high, 4)} mg/L (twice air "
                         f"saturation at {fmt(t)} °C and salinity {fmt(s, 4)}; an engineering bound)",
                         low=0.0, high=high)
    mol = given / M_O2
    d.step("Dissolved O2 given", "C = (mg/L)/31.998 g/mol; share of air saturation = C/C_sat",
           f"C = {fmt(given)} mg/L / {fmt(M_O2, 5)} g/mol",
           f"C = {fmt(mol, 4)} mol/m³, {fmt(100.0 * given / sat_mg, 3)} % of air saturation")
    if given > sat_mg * 1.0001:
        d.warn("o2_mg_L", f"{fmt(given)} mg/L is above air saturation ({fmt(sat_mg, 4)} mg/L): supersaturated "
                          "water loses the excess to the air; check the unit")
    return DissolvedOxygen(t, s, rho, c_kg, sat_mg, sat_mol, given, mol, True,
                           tuple(d.steps), tuple(d.warnings), tuple(d.sources))
