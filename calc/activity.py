"""Activity coefficients of ions: ionic strength and the Debye–Hückel family of models.

a = γ·m/m°, with m° = 1 mol/kg. Models (log10 basis, molal scale; A and B from
:mod:`calc.water` at the temperature):

============  ==============================================  =================
model         log10 γ                                         valid up to I
============  ==============================================  =================
ideal         0                                               0.001 mol/kg
limiting      −A z² √I                                        0.005 mol/kg
extended      −A z² √I / (1 + B å √I)   (å: Kielland size)     0.1 mol/kg
davies        −A z² (√I/(1 + √I) − 0.3 I)                     0.5 mol/kg
============  ==============================================  =================

Ranges: limiting, extended and Davies as in W. Stumm and J. J. Morgan, *Aquatic Chemistry*,
3rd ed. (1996), Table 3.3 (10^-2.3, 10^-1 and 0.5 mol/kg; from memory); ideal: where the limiting
law moves γ of a monovalent ion by less than 4 % (common practice). Beyond its range a model
still gives a number, with a warning.

The Davies coefficient is 0.3 (C. W. Davies, *Ion Association*, Butterworths 1962, eq. 3.5 as
usually quoted; the 1938 original used 0.2). Truesdell–Jones is not offered: it needs a fitted
b parameter per ion, and no validated set of them is in the dataset.
"""

import math
from dataclasses import asdict, dataclass

from . import water
from .bounds import BOUNDS, check
from .dataset import current
from .derivation import Derivation, check_temperature, fmt
from .errors import InputError
from .ionic import check_ionic_strength, environment_ionic_strength, ion, ionic_strength, ionic_strength_terms
from .requests import read

#: model name -> highest ionic strength where the model is taken as valid [mol/kg]
VALID_I_MAX = {"ideal": 0.001, "limiting": 0.005, "extended": 0.1, "davies": 0.5}
MODELS = tuple(VALID_I_MAX)
DEFAULT_MODEL = "davies"
#: Davies (1962) coefficient of the linear term [kg/mol]
DAVIES_COEFF = 0.3
#: highest ionic strength accepted at all: the models lose meaning far above 1 mol/kg [mol/kg]
I_HARD_MAX = BOUNDS["ionic_strength"].high
_MODEL_WORDS = "one of ideal, limiting, extended, davies"
_MODEL_ALIASES = {"dh": "limiting", "debye-huckel": "limiting", "debye-hückel": "limiting",
                  "extended-dh": "extended", "edh": "extended"}

_CITATIONS = {
    "ideal": "ideal solution: γ = 1 (exact only at infinite dilution)",
    "limiting": "Debye & Hückel, Phys. Z. 24 (1923) 185, limiting law",
    "extended": "Debye & Hückel (1923) extended law with the ion sizes of J. Kielland, J. Am. Chem. Soc. 59 (1937) 1675",
    "davies": "C. W. Davies, Ion Association (1962), with the 0.3·I term",
}


def log10_gamma(charge, ionic_strength_mol_kg, model, A, B=None, size_angstrom=None):
    """log10 of the activity coefficient of one ion by the chosen model.

    Args:
        charge: ion charge number z [unitless]
        ionic_strength_mol_kg: ionic strength I [mol/kg]
        model: ideal, limiting, extended or davies [unitless]
        A: Debye–Hückel A [kg^1/2 mol^-1/2]
        B: Debye–Hückel B, extended model only [kg^1/2 mol^-1/2 Å^-1]
        size_angstrom: ion size å, extended model only [Å]

    Returns:
        log10 γ [unitless]

    References:
        Debye & Hückel, Phys. Z. 24 (1923) 185 (limiting and extended laws); J. Kielland,
        J. Am. Chem. Soc. 59 (1937) 1675 (å); C. W. Davies, Ion Association (1962) (0.3·I term).

    >>> round(log10_gamma(1, 0.01, "limiting", 0.5108), 4)
    -0.0511
    >>> round(10 ** log10_gamma(2, 0.01, "extended", 0.5108, 0.3287, 6), 3)
    0.675
    """
    z2 = charge * charge
    sI = math.sqrt(ionic_strength_mol_kg)
    if model == "ideal" or z2 == 0:
        return 0.0
    if model == "limiting":
        return -A * z2 * sI
    if model == "extended":
        return -A * z2 * sI / (1.0 + B * size_angstrom * sI)
    if model == "davies":
        return -A * z2 * (sI / (1.0 + sI) - DAVIES_COEFF * ionic_strength_mol_kg)
    raise InputError("model", model, _MODEL_WORDS)


def check_model(model, field="model"):
    """The model name of a request, normalised; default Davies.

    Args:
        model: a model name or None [unitless]
        field: the input field shown in an error [unitless]

    Returns:
        one of ideal, limiting, extended, davies

    References:
        Model list of this module (see the module docstring).

    >>> check_model("Davies"), check_model(None)
    ('davies', 'davies')
    """
    if model is None:
        return DEFAULT_MODEL
    if not isinstance(model, str):
        raise InputError(field, model, _MODEL_WORDS)
    key = model.strip().casefold().replace("_", "-").replace(" ", "-")
    key = _MODEL_ALIASES.get(key, key)
    if key in ("truesdell-jones", "truesdelljones", "tj"):
        raise InputError(field, model, _MODEL_WORDS,
                         "Truesdell-Jones is not offered: the dataset holds no validated b parameters for it")
    if key not in VALID_I_MAX:
        raise InputError(field, model, _MODEL_WORDS)
    return key


def ion_size(sp):
    """The Kielland ion size of an ion from the dataset (data/ions.yaml), or None.

    Args:
        sp: the ion, a :class:`calc.species.Species` or a string such as ``Zn2+`` [unitless]

    Returns:
        (size [Å], source id) or None

    References:
        J. Kielland, J. Am. Chem. Soc. 59 (1937) 1675, table of å (via the dataset).

    >>> ion_size("Xx3+") is None
    True
    """
    if isinstance(sp, str):
        sp = ion(sp)
    for rec in current().records("ions"):
        try:
            other = ion(rec.get("species", ""))
        except InputError:
            continue
        if other.name == sp.name and rec.get("size_angstrom") is not None:
            return float(rec["size_angstrom"]), rec.get("source") or rec.get("size_source")
    return None


@dataclass(frozen=True)
class ActivityCoefficient:
    """The activity coefficient of one ion with the numbers behind it."""

    species: str
    charge: int
    gamma: float
    log10_gamma: float
    A: float
    B: float
    ionic_strength: float
    model: str
    temp_C: float
    valid_I_max: float
    size_angstrom: float
    steps: tuple
    warnings: tuple
    sources: tuple

    def to_dict(self):
        """Plain data for JSON."""
        out = asdict(self)
        for key in ("steps", "warnings", "sources"):
            out[key] = list(out[key])
        return out


def activity_coefficient(species, ionic_strength_mol_kg, model=None, temp_C=25.0, size_angstrom=None):
    """Activity coefficient γ of an ion at an ionic strength and temperature.

    Args:
        species: the ion, e.g. ``Zn2+`` [unitless]
        ionic_strength_mol_kg: ionic strength I [mol/kg]
        model: ideal, limiting, extended or davies; None for davies [unitless]
        temp_C: temperature [°C]
        size_angstrom: ion size å for the extended model; None to take Kielland's from the dataset [Å]

    Returns:
        an :class:`ActivityCoefficient`

    References:
        A and B: :func:`calc.water.debye_huckel_A`, :func:`calc.water.debye_huckel_B`; models as
        in :func:`log10_gamma`; valid ranges: Stumm & Morgan, Aquatic Chemistry (1996), Table 3.3.

    >>> r = activity_coefficient("Cl-", 0.01, "limiting")
    >>> round(r.gamma, 3), r.valid_I_max
    (0.889, 0.005)
    """
    sp = ion(species)
    I = check_ionic_strength(ionic_strength_mol_kg)
    model = check_model(model)
    t = check_temperature(temp_C)
    d = Derivation()
    A = water.debye_huckel_A(t)
    B = water.debye_huckel_B(t)
    d.step("Debye–Hückel A and B from water at the temperature",
           "A = √(2π·N_A·ρw)·λB^1.5 / ln10, B = √(8π·N_A·ρw·λB), λB = e²/(4π·ε0·εr·k·T); "
           "ρw: Kell (1975), εr: Malmberg & Maryott (1956)",
           f"t = {fmt(t)} °C: ρw = {fmt(water.density_kg_m3(t))} kg/m³, εr = {fmt(water.permittivity(t))}, "
           f"λB = {fmt(water.bjerrum_length_m(t) * 1e10)} Å",
           f"A = {fmt(A, 5)} kg^1/2 mol^-1/2, B = {fmt(B, 5)} kg^1/2 mol^-1/2 Å^-1")
    size = None
    if model == "extended" and sp.charge != 0:
        if size_angstrom is not None:
            size = check("size_angstrom", size_angstrom)
        else:
            found = ion_size(sp)
            if found is None:
                raise InputError("species", species, "an ion with a Kielland size in the dataset for the extended model",
                                 "give size_angstrom, or choose the davies model")
            size, src = found
            d.cite(src)
    lg = log10_gamma(sp.charge, I, model, A, B, size)
    gamma = 10.0 ** lg
    z = f"({sp.charge})" if sp.charge < 0 else sp.charge  # (−2)², not −2², in the step text
    if sp.charge == 0:
        d.step("Activity coefficient of a neutral species", "Debye–Hückel models: log10 γ = 0 for z = 0",
               f"z = 0, I = {fmt(I)} mol/kg", "γ = 1 (salting-out is not modelled)")
    elif model == "ideal":
        d.step("Activity coefficient, ideal solution", "γ = 1", f"I = {fmt(I)} mol/kg", "γ = 1")
    elif model == "limiting":
        d.step("Activity coefficient, Debye–Hückel limiting law", "log10 γ = −A·z²·√I",
               f"log10 γ = −{fmt(A, 5)}·{z}²·√{fmt(I)}", f"log10 γ = {fmt(lg, 5)}, γ = {fmt(gamma, 5)}")
    elif model == "extended":
        d.step("Activity coefficient, extended Debye–Hückel (Kielland ion size)", "log10 γ = −A·z²·√I / (1 + B·å·√I)",
               f"log10 γ = −{fmt(A, 5)}·{z}²·√{fmt(I)} / (1 + {fmt(B, 5)}·{fmt(size)} Å·√{fmt(I)})",
               f"log10 γ = {fmt(lg, 5)}, γ = {fmt(gamma, 5)}")
    else:
        d.step("Activity coefficient, Davies equation", "log10 γ = −A·z²·(√I/(1 + √I) − 0.3·I)",
               f"log10 γ = −{fmt(A, 5)}·{z}²·(√{fmt(I)}/(1 + √{fmt(I)}) − 0.3·{fmt(I)})",
               f"log10 γ = {fmt(lg, 5)}, γ = {fmt(gamma, 5)}")
    vmax = VALID_I_MAX[model]
    if I > vmax and sp.charge != 0:
        d.warn("ionic_strength", f"I = {fmt(I)} mol/kg is above the range of the {model} model "
                                 f"(up to {fmt(vmax)} mol/kg): γ = {fmt(gamma, 4)} is an extrapolation"
                                 + ("; a specific-interaction model (Pitzer, SIT) is needed for an accurate value"
                                    if I > VALID_I_MAX["davies"] else "; the davies model reaches 0.5 mol/kg"))
    return ActivityCoefficient(sp.name, sp.charge, gamma, lg, A, B, I, model, t, vmax, size,
                               tuple(d.steps), tuple(d.warnings), tuple(d.sources))


_ACTIVITY_KEYS = ("species", "ionic_strength", "composition", "env", "model", "temp_C", "size_angstrom", "molality")


def activity_entry(req):
    """JSON entry point ``activity``: the activity coefficient of one ion.

    Request fields: ``species`` (e.g. ``Zn2+``); ``ionic_strength`` [mol/kg] or ``composition``
    ({ion: molality} [mol/kg]) or ``env`` (an environment id with an ionic strength);
    ``model`` (ideal, limiting, extended, davies; default davies); ``temp_C`` [°C, default 25];
    ``size_angstrom`` [Å, optional]; ``molality`` [mol/kg, optional: also returns the activity].

    Args:
        req: the request dict [unitless]

    Returns:
        dict with species, charge, gamma, log10_gamma, A, B, ionic_strength, model, temp_C,
        valid_I_max, size_angstrom, (activity), steps, warnings, sources, data_version

    References:
        See :func:`activity_coefficient` and :func:`ionic_strength`.

    >>> r = activity_entry({"species": "K+", "ionic_strength": 0.001, "model": "limiting"})
    >>> round(r["gamma"], 4)
    0.9635
    """
    read(req, "activity", optional=_ACTIVITY_KEYS)
    d = Derivation()
    sources = [k for k in ("ionic_strength", "composition", "env") if req.get(k) is not None]
    if len(sources) != 1:
        raise InputError("ionic_strength", req.get("ionic_strength"),
                         "exactly one of ionic_strength [mol/kg], composition ({ion: molality}) or env",
                         f"given: {', '.join(sources) or 'none'}")
    if "composition" in sources:
        I = ionic_strength(req["composition"])
        terms = ionic_strength_terms(req["composition"])
        d.step("Ionic strength from the composition", "I = ½·Σ m_i·z_i²", f"I = ½·({terms}) mol/kg",
               f"I = {fmt(I)} mol/kg")
    elif "env" in sources:
        I, env_d = environment_ionic_strength(req["env"])
        d.merge(env_d)
    else:
        I = check_ionic_strength(req["ionic_strength"])
    res = activity_coefficient(req.get("species"), I, req.get("model"), req.get("temp_C"), req.get("size_angstrom"))
    out = res.to_dict()
    d.steps.extend(out["steps"])
    for w in out["warnings"]:
        d.warn(w["field"], w["message"])
    for s in out["sources"]:
        d.cite(s)
    if req.get("molality") is not None:
        m = check("molality", req["molality"])
        out["molality"] = m
        out["activity"] = res.gamma * m
        d.step("Activity from molality", "a = γ·m/m°, m° = 1 mol/kg", f"a = {fmt(res.gamma, 5)}·{fmt(m)}",
               f"a = {fmt(res.gamma * m, 5)}")
    out.update(d.as_dict())
    out["data_version"] = current().version
    return out

