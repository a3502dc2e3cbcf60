"""Field readings: what an engineer measured on site, judged.

Two checks on readings taken with a reference electrode:

- **Measured joint** (:func:`measured_joint`): the corrosion potentials of two parts read
  against one electrode. The more negative part is the anode; the difference of the two
  readings is compared with the allowable difference of the named environment, with the same
  tier words as :mod:`calc.joint` (matched, compatible, guarded, unsuited; limit inclusive).
  Both readings are also put on one scale (SCE, the scale of the published galvanic series,
  and SHE) by :mod:`calc.refelec`. When both materials are named, the published-series
  judgement of :func:`calc.joint.judge_joint` is shown beside the measured one; where they
  disagree the site measurement wins.
- **CP reading** (:func:`check_cp_reading`): one structure-to-electrolyte potential of a
  cathodically protected structure against the potential criteria of ``data/cp_criteria.yaml``
  (protected, not protected, over-protected; limits inclusive). The reading is converted to
  each criterion's own electrode at the electrode's temperature.

IR drop (common practice; ISO 15589-1:2015, NACE SP0169-2013): a reading taken with the
protective current flowing ("on") includes the voltage drop of that current between the
structure and the electrode, which makes the reading more negative than the structure's
polarised potential. A criterion defined for the IR-free potential needs an "instant-off"
reading (the current interrupted, read before the structure depolarises). From an on reading
a criterion that is *not* met is conclusive (the polarised potential is even less negative),
one that *is* met is not; for the negative limit it is the other way round.

Ag/AgCl/seawater electrode in brackish water (an estimate): the electrode responds to chloride
(Nernst), E = E(seawater) + (ln10·RT/F)·log10(a_Cl,sw / a_Cl). Chloride from salinity through
chlorinity (S = 1.80655·Cl, the Knudsen relation as kept in PSS-78), ionic strength
I = 19.924·S/(1000 − 1.005·S) (Dickson & Goyet 1994), single-ion activity coefficients by
Davies; reference seawater S = 35. EN 12473:2014 Annex C gives a correction graph, which was
not consulted.

Implausible readings (a decision of this project, common practice): a reading more than 10 V
from zero is refused (not a potential measurement). A potential more positive than +1.3 V vs SHE
(above +1 V vs CSE: beyond oxygen evolution) is refused for every reading, and one more negative
than −2.2 V vs SHE (below −2.5 V vs CSE, more negative than magnesium anodes) is refused for
instant-off readings and corrosion potentials; an "on" reading may go that far because of its IR
drop, with a warning. The message names the reading and points at the usual causes (sign,
leads, electrode).
"""

import math
import re
from dataclasses import dataclass

from . import constants, water
from .activity import log10_gamma
from .dataset import current
from .derivation import Derivation, check_number, check_temperature, fmt
from .errors import DataError, InputError
from .refelec import VALUE_MAX_V, reference_potential

#: structures that CP criteria can be given for: id -> (name, aliases)
STRUCTURES = {
    "carbon-steel": ("Carbon steel (C-Mn and low-alloy, yield strength up to 550 MPa)",
                     ("steel", "carbon steel", "mild steel", "C-Mn steel", "low-alloy steel")),
    "high-strength-steel": ("High-strength steel (specified minimum yield strength above 550 MPa)",
                            ("high strength steel", "HSS")),
    "stainless-pren-40": ("Austenitic stainless steel, PREN 40 or more", ("stainless PREN >= 40",)),
    "stainless-pren-below-40": ("Austenitic stainless steel, PREN below 40", ("stainless PREN < 40",)),
    "copper-alloys": ("Copper and copper alloys without aluminium", ("copper", "copper alloy")),
    "aluminium": ("Aluminium and aluminium alloys", ("aluminum", "aluminium alloy", "aluminum alloy")),
    "galvanized-steel": ("Galvanized (zinc-coated) steel", ("galvanised steel", "zinc-coated steel")),
}
#: settings (where the structure is): id -> (name, electrolyte)
SETTINGS = {
    "soil-aerobic": ("Buried, aerobic soil, resistivity below 100 Ω·m", "soil"),
    "soil-anaerobic": ("Buried, anaerobic soil with sulfate-reducing bacteria", "soil"),
    "soil-aerated-100-1000": ("Buried, aerated sandy soil, 100 to 1000 Ω·m", "soil"),
    "soil-aerated-above-1000": ("Buried, aerated soil, 1000 Ω·m or more", "soil"),
    "seawater-aerobic": ("Immersed in aerobic seawater", "seawater"),
    "seawater-anaerobic": ("In seawater sediment, anaerobic (sulfate-reducing bacteria)", "seawater"),
}
READING_KINDS = ("on", "instant-off")
VERDICTS = ("protected", "not protected", "over-protected")

#: plausible potentials of a metal in water or soil [V vs SHE]: below magnesium anodes, above
#: oxygen evolution (−2.5 and +1.0 V vs CSE; common practice)
PLAUSIBLE_SHE_V = (-2.2, 1.3)
#: limit comparisons: a reading within this of a limit counts as on the limit [V]
EPS_V = 1e-9
#: salinity of the seawater the Ag/AgCl/seawater electrode value refers to [g/kg]
SALINITY_REF = 35.0
#: Knudsen relation S = 1.80655·Cl (chlorinity in g/kg), kept in PSS-78 [unitless]
SALINITY_PER_CHLORINITY = 1.80655
#: molar mass of chlorine [g/mol] (IUPAC standard atomic weight, abridged)
M_CL = 35.453
#: salinity and chloride accepted [g/kg], [mg/L]
SALINITY_MAX = 45.0
CHLORIDE_MAX_MG_PER_L = 25000.0
#: below this salinity the Ag/AgCl/seawater electrode is unreliable and PSS-78 does not apply [g/kg]
SALINITY_LOW = 2.0
#: longest part name accepted [characters]
NAME_MAX = 100
_AGAGCL_SW = "Ag/AgCl seawater"

CP_CAUTIONS = (
    "Safety-relevant: cathodic protection keeps pipelines, tanks and structures whose failure can hurt people "
    "and the environment. This check helps read one number; it does not accept or certify a CP system.",
    "The criteria apply as the named standard defines them: its electrode, whether it needs an IR-free "
    "(instant-off) value, the structure's material and temperature, the soil or water. Where documents differ "
    "the value used and the span are shown.",
    "Follow the operator's procedures and the local regulation, and have CP surveys interpreted by a qualified "
    "cathodic-protection specialist.",
    "One reading is one point: coating defects, interference and telluric currents, and poorly placed electrodes "
    "are found only by a survey along the structure.",
)
MEASURED_CAUTIONS = (
    "Measure each part's own potential with the parts electrically separated (or before they are joined): two "
    "connected parts polarise each other and read almost the same potential, so a small difference measured on a "
    "joined pair does not prove them compatible.",
    "Potentials drift with time, flow, aeration, temperature and where the electrode sits; read both parts at the "
    "same time, with the electrode close to the surface.",
    "Screening only. For structural, pressure-retaining, potable-water or other safety-relevant joints, apply the "
    "governing codes and standards and have the joint assessed by a qualified corrosion professional.",
)


def _norm(text):
    return re.sub(r"[\s_\-]+", "", str(text)).casefold()


def _v(x):
    """Voltage text for sentences: sign, 3 decimals."""
    return f"{x:+.3f}".replace("+0.000", "0.000").replace("-0.000", "0.000")


def _check_keys(req, allowed, entry):
    if not isinstance(req, dict):
        raise InputError("request", type(req).__name__, "a JSON object")
    for k in req:
        if k not in allowed:
            raise InputError(k, req[k], "no such field", f"{entry} takes: " + ", ".join(allowed))


def _text(value, field, what):
    if not isinstance(value, str) or not value.strip() or len(value) > NAME_MAX:
        raise InputError(field, value, f"{what} ({NAME_MAX} characters at most)")
    return value.strip()


def lookup(table, name, field, what):
    """An id of STRUCTURES or SETTINGS by id, alias or name (case, spaces and hyphens ignored).

    Args:
        table: :data:`STRUCTURES` or :data:`SETTINGS` [unitless]
        name: what the user gave [unitless]
        field: the request field, for the error [unitless]
        what: plain words for the kind of thing, for the error [unitless]

    Returns:
        the id

    References:
        Lookup rule of the project (DESIGN.md: lookups are forgiving).

    >>> lookup(STRUCTURES, "Mild Steel", "structure", "a structure")
    'carbon-steel'
    """
    if isinstance(name, str) and name.strip():
        key = _norm(name)
        for tid, entry in table.items():
            aliases = entry[1] if table is STRUCTURES else ()
            if key in {_norm(tid), _norm(entry[0]), *(_norm(a) for a in aliases)}:
                return tid
    raise InputError(field, name, f"{what}: one of " + ", ".join(table))


# --------------------------------------------------------------------------------------------
# the electrode, with the chloride correction in brackish water


def chloride_molality(salinity):
    """Chloride molality of seawater-type water from its salinity, through chlorinity.

    Args:
        salinity: salinity (practical salinity, about g/kg) [g/kg]

    Returns:
        m(Cl−) [mol/kg of water]

    References:
        Knudsen relation S = 1.80655·Cl as kept in PSS-78 (UNESCO 1981, from memory); molar mass
        of Cl 35.453 g/mol (IUPAC). Bromide is counted as chloride (chlorinity convention).

    >>> round(chloride_molality(35.0), 4)
    0.5663
    """
    cl_g_per_kg = salinity / SALINITY_PER_CHLORINITY
    return cl_g_per_kg / M_CL / (1.0 - salinity / 1000.0)


def seawater_ionic_strength(salinity):
    """Ionic strength of seawater-type water from its salinity.

    Args:
        salinity: salinity [g/kg]

    Returns:
        I [mol/kg]

    References:
        A. G. Dickson and C. Goyet (eds.), DOE Handbook of Methods for the Analysis of the Various
        Parameters of the Carbon Dioxide System in Sea Water, 1994, ch. 5: I = 19.924·S/(1000 − 1.005·S).

    >>> round(seawater_ionic_strength(35.0), 4)
    0.7228
    """
    return 19.924 * salinity / (1000.0 - 1.005 * salinity)


def chloride_activity(salinity, temp_C=25.0):
    """Activity of chloride in seawater-type water: m·γ with γ by Davies.

    Args:
        salinity: salinity [g/kg]
        temp_C: temperature [°C]

    Returns:
        a(Cl−) [unitless]

    References:
        :func:`chloride_molality`, :func:`seawater_ionic_strength`; C. W. Davies, Ion Association
        (1962), with A(T) of :func:`calc.water.debye_huckel_A`. Seawater's ionic strength lies above
        the Davies range (0.5 mol/kg): the activity is an estimate.

    >>> 0.40 < chloride_activity(35.0, 25.0) < 0.45
    True
    """
    ionic = seawater_ionic_strength(salinity)
    lg = log10_gamma(-1, ionic, "davies", water.debye_huckel_A(temp_C))
    return chloride_molality(salinity) * 10.0 ** lg


def brackish_shift(salinity, temp_C=25.0):
    """How far an Ag/AgCl/seawater electrode reads from its seawater value in brackish water.

    The electrode sits at E(seawater) + shift; add the shift to a reading taken with it to refer
    the reading to the electrode in seawater (salinity 35).

    Args:
        salinity: salinity of the water the electrode is in [g/kg]
        temp_C: temperature [°C]

    Returns:
        shift [V], positive in water less salty than seawater

    References:
        Nernst equation of AgCl + e− → Ag + Cl−: E = E° − (ln10·RT/F)·log10 a(Cl−) (e.g. Bard &
        Faulkner, Electrochemical Methods, 2nd ed., 2001, ch. 2, from memory); activities by
        :func:`chloride_activity`. An estimate, not the EN 12473:2014 Annex C graph.

    >>> brackish_shift(35.0)
    0.0
    >>> 0.030 < brackish_shift(10.0) < 0.034
    True
    """
    if abs(salinity - SALINITY_REF) < 1e-12:
        return 0.0
    slope = constants.nernst_slope(temp_C + constants.T_ZERO_C)
    return slope * math.log10(chloride_activity(SALINITY_REF, temp_C) / chloride_activity(salinity, temp_C))


@dataclass(frozen=True)
class Electrode:
    """The electrode a reading was taken with, at its temperature (and chloride, for Ag/AgCl/sw)."""

    id: str
    temp_C: float
    E_V_SHE: float  # including the chloride shift
    shift_V: float  # chloride shift (0 when none)
    salinity: float  # salinity used for the shift, or None
    steps: tuple
    warnings: tuple
    sources: tuple


def field_electrode(electrode, temp_C=25.0, salinity=None, chloride_mg_per_L=None, field="electrode"):
    """A field reference electrode vs SHE at its temperature, with the brackish-water correction.

    Args:
        electrode: electrode id or alias (CSE, Ag/AgCl seawater, Zn seawater, SCE, ...) [unitless]
        temp_C: temperature of the electrode [°C]
        salinity: salinity of the water, for Ag/AgCl/seawater only [g/kg]
        chloride_mg_per_L: chloride of the water instead of salinity [mg/L]
        field: the request field of the electrode, for errors [unitless]

    Returns:
        an :class:`Electrode` (potential in [V vs SHE])

    References:
        :func:`calc.refelec.reference_potential`; :func:`brackish_shift`.

    >>> e = field_electrode("Ag/AgCl seawater", 25.0, salinity=35.0)
    >>> e.id, e.shift_V
    ('Ag/AgCl seawater', 0.0)
    """
    if isinstance(electrode, str) and _norm(electrode) in {"rhe", "reversiblehydrogenelectrode"}:
        raise InputError(field, electrode, "a field reference electrode (CSE, Ag/AgCl seawater, Zn seawater, SCE, ...)",
                         "the RHE depends on the pH at the surface and is not a field electrode")
    t = check_temperature(temp_C)
    if salinity is not None and chloride_mg_per_L is not None:
        raise InputError("chloride_mg_per_L", chloride_mg_per_L, "only one of salinity or chloride_mg_per_L")
    ref = reference_potential(electrode, t, field=field)
    d = Derivation()
    d.steps.extend(ref.steps)
    for w in ref.warnings:
        d.warn(field if w["field"] == "from" else w["field"], w["message"])
    for s in ref.sources:
        d.cite(s)
    shift, used_s = 0.0, None
    if chloride_mg_per_L is not None:
        chloride = check_number(chloride_mg_per_L, "chloride_mg_per_L",
                                f"a chloride content above 0 and up to {CHLORIDE_MAX_MG_PER_L:g} mg/L",
                                low=0.0, high=CHLORIDE_MAX_MG_PER_L, low_open=True)
        used_s = SALINITY_PER_CHLORINITY * chloride / 1000.0
        d.step("Salinity from chloride", "S = 1.80655·Cl, Cl in g/kg, taking 1 L of water as 1 kg",
               f"S = 1.80655 × {fmt(chloride)} mg/L / 1000", f"S = {fmt(used_s, 4)} g/kg")
    elif salinity is not None:
        used_s = check_number(salinity, "salinity", f"a salinity above 0 and up to {SALINITY_MAX:g} g/kg",
                              low=0.0, high=SALINITY_MAX, low_open=True)
    what = "chloride_mg_per_L" if chloride_mg_per_L is not None else "salinity"
    if used_s is not None and ref.id != _AGAGCL_SW:
        d.warn(what, f"the {what.split('_')[0]} was not used: only the Ag/AgCl seawater electrode needs a "
                     "chloride correction")
        used_s = None
    if used_s is not None:
        shift = brackish_shift(used_s, t)
        slope = constants.nernst_slope(t + constants.T_ZERO_C)
        a_ref, a_x = chloride_activity(SALINITY_REF, t), chloride_activity(used_s, t)
        d.step("Chloride activity (estimate)",
               "m(Cl−) = (S/1.80655)/35.453/(1 − S/1000); I = 19.924·S/(1000 − 1.005·S); γ by Davies",
               f"S = {fmt(used_s, 4)}: a(Cl−) = {fmt(a_x, 4)}; "
               f"seawater S = {fmt(SALINITY_REF)}: a(Cl−) = {fmt(a_ref, 4)}",
               f"ratio {fmt(a_ref / a_x, 4)}")
        d.step("Ag/AgCl/seawater electrode in this water (Nernst, estimate)",
               "ΔE = (ln10·R·T/F)·log10(a(Cl−, seawater)/a(Cl−, here))",
               f"ΔE = {fmt(slope)} V × log10({fmt(a_ref / a_x, 4)})",
               f"ΔE = {fmt(shift * 1000, 4)} mV: the electrode reads {fmt(abs(shift) * 1000, 3)} mV "
               f"{'more positive' if shift >= 0 else 'more negative'} than in seawater")
        d.cite("dickson-goyet-1994")
        d.cite("computed-nernst")
        d.warn(what, "the brackish-water correction of the Ag/AgCl seawater electrode is an estimate (Nernst on "
                     "chloride activity relative to seawater of salinity 35); calibrate the electrode against a "
                     "CSE or a KCl-filled electrode in this water where a reading is close to a limit")
        if used_s < SALINITY_LOW:
            d.warn(what, f"salinity {fmt(used_s, 3)} is below {fmt(SALINITY_LOW)}: in nearly fresh water the "
                         "Ag/AgCl seawater electrode drifts; use a CSE or a KCl-filled electrode")
    return Electrode(ref.id, t, ref.E_V_SHE + shift, shift, used_s, tuple(d.steps), tuple(d.warnings),
                     tuple(d.sources))


def _on_scale(E_she, target, temp_C):
    """A potential vs SHE expressed against another electrode at the temperature: (value, record)."""
    ref = reference_potential(target, temp_C, field="electrode")
    return E_she - ref.E_V_SHE, ref


def _plausible(value_V, E_she, field, kind, electrode_id):
    """Refuse readings outside the plausible window (see the module notes); returns warnings."""
    lo, hi = PLAUSIBLE_SHE_V
    where = f"{fmt(value_V)} V vs {electrode_id} is {fmt(E_she, 4)} V vs SHE"
    if E_she > hi + EPS_V:
        raise InputError(field, value_V, f"a potential no more positive than {fmt(hi)} V vs SHE (about +1 V vs CSE)",
                         f"{where}: no metal under cathodic protection or freely corroding in water or soil reads "
                         "this; check the sign, the meter leads and the electrode named")
    if E_she < lo - EPS_V:
        if kind == "on":
            return [{"field": field, "message": f"{where}: more negative than any polarised potential, so this on "
                                                "reading holds a large IR drop; only an instant-off reading can be "
                                                "judged against the criteria"}]
        raise InputError(field, value_V,
                         f"a potential no more negative than {fmt(lo)} V vs SHE (about −2.5 V vs CSE)",
                         f"{where}: more negative than a magnesium anode, which no "
                         f"{'polarised' if kind == 'instant-off' else 'corrosion'} potential reaches; check the "
                         "sign, the meter leads and the electrode named")
    return []


def _reading(value, field):
    return check_number(value, field, f"a reading in V from -{VALUE_MAX_V:g} to {VALUE_MAX_V:g}",
                        low=-VALUE_MAX_V, high=VALUE_MAX_V)


# --------------------------------------------------------------------------------------------
# measured joint


@dataclass(frozen=True)
class MeasuredJoint:
    """A measured joint judgement; :meth:`to_dict` is the JSON result."""

    data: tuple

    def to_dict(self):
        """Plain data for JSON."""
        return dict(self.data)


def _tier_measured(delta, allow, negligible, state_fail):
    if delta > allow + EPS_V:
        return "unsuited"
    if state_fail:
        return "guarded"
    if negligible is not None and delta <= negligible + EPS_V:
        return "matched"
    return "compatible"


def _mid(rec):
    rng = rec.get("seawater_range_V_SCE")
    if isinstance(rng, list) and len(rng) == 2:
        return (float(rng[0]) + float(rng[1])) / 2.0
    return None


def measured_joint(a_name, a_reading_V, b_name, b_reading_V, electrode, env, temp_C=None, salinity=None,
                   chloride_mg_per_L=None, a_material=None, b_material=None):
    """Judge a joint from the two parts' potentials measured on site against one electrode.

    Args:
        a_name: label of the first part, e.g. "hull plate" [unitless]
        a_reading_V: its potential [V vs electrode]
        b_name: label of the second part [unitless]
        b_reading_V: its potential [V vs electrode]
        electrode: the reference electrode both readings were taken with [unitless]
        env: environment id or alias (sets the allowable difference) [unitless]
        temp_C: temperature of the electrode, default 25 [°C]
        salinity: salinity of the water, for an Ag/AgCl seawater electrode [g/kg]
        chloride_mg_per_L: chloride instead of salinity [mg/L]
        a_material: dataset material id of the first part, optional [unitless]
        b_material: dataset material id of the second part, optional [unitless]

    Returns:
        a :class:`MeasuredJoint` (potentials in [V], difference in [V])

    References:
        ASTM G82-98 (R2014) §6 (the more active metal of a couple is the anode); the environment's
        allowable difference as in :mod:`calc.joint`; reference conversion by :mod:`calc.refelec`.

    >>> r = measured_joint("hull", -0.62, "shaft", -0.05, "SCE", "seawater-flowing").to_dict()
    >>> r["anode"], r["delta_E_V"], r["verdict"]
    ('hull', 0.57, 'unsuited')
    """
    from . import joint

    ds = current()
    a_label = _text(a_name, "a_name", "a label for the first part, e.g. hull plate")
    b_label = _text(b_name, "b_name", "a label for the second part, e.g. propeller")
    ra = _reading(a_reading_V, "a_reading_V")
    rb = _reading(b_reading_V, "b_reading_V")
    temp_given = temp_C is not None
    el = field_electrode(electrode, temp_C, salinity, chloride_mg_per_L)
    t = el.temp_C
    envrec = ds.get("environments", env, field="env")
    basis = joint.basis_of(envrec)
    d = Derivation()
    d.steps.extend(el.steps)
    for w in el.warnings:
        d.warn(w["field"], w["message"])
    for s in el.sources:
        d.cite(s)
    ea, eb = ra + el.E_V_SHE, rb + el.E_V_SHE
    for w in (_plausible(ra, ea, "a_reading_V", "corrosion", el.id)
              + _plausible(rb, eb, "b_reading_V", "corrosion", el.id)):
        d.warn(w["field"], w["message"])
    sce_a, sce_rec = _on_scale(ea, "SCE", t)
    sce_b = eb - sce_rec.E_V_SHE
    e_txt = f"{fmt(el.E_V_SHE - el.shift_V)} + {fmt(el.shift_V)}" if el.shift_V else fmt(el.E_V_SHE)
    d.step("Both readings vs SHE", f"E(SHE) = reading + E({el.id} vs SHE at {fmt(t)} °C)"
           + (" + chloride shift ΔE" if el.shift_V else ""),
           f"{a_label}: {fmt(ra)} + {e_txt}; {b_label}: {fmt(rb)} + {e_txt}",
           f"{a_label} {fmt(ea, 4)} V, {b_label} {fmt(eb, 4)} V vs SHE")
    d.step("Both readings vs SCE (the scale of the galvanic series)",
           f"E(SCE) = E(SHE) − E(SCE vs SHE at {fmt(t)} °C)",
           f"− {fmt(sce_rec.E_V_SHE)} V", f"{a_label} {fmt(sce_a, 4)} V, {b_label} {fmt(sce_b, 4)} V vs SCE")
    for s in sce_rec.sources:
        d.cite(s)
    delta = round(abs(ra - rb), 9)
    if delta <= EPS_V:
        anode = cathode = None
        anode_part = None
    elif ra < rb:
        anode, cathode, anode_part = a_label, b_label, "a"
    else:
        anode, cathode, anode_part = b_label, a_label, "b"
    d.step("Anode and potential difference", "the more negative part is the anode; ΔE = |E_a − E_b| (the same "
           "electrode for both, so its value cancels)", f"|{fmt(ra)} − ({fmt(rb)})| V",
           f"ΔE = {fmt(delta, 4)} V; anode: {anode or 'neither (equal readings)'}")

    # materials: published positions, the passive/active state check, the published judgement
    recs = {}
    for part, name in (("a", a_material), ("b", b_material)):
        if name is not None:
            recs[part] = ds.get("materials", name, field=f"{part}_material")
    measured_sce = {"a": sce_a, "b": sce_b}
    labels = {"a": a_label, "b": b_label}
    state_notes, state_fail = [], False
    for part, rec in recs.items():
        other_id = rec.get("other_state")
        if rec.get("state") != "passive" or not other_id:
            continue
        other = ds.get("materials", other_id)
        mp, mo = _mid(rec), _mid(other)
        if mp is None or mo is None:
            continue
        drop = mp - mo
        alt = measured_sce[part] - drop
        other_part = "b" if part == "a" else "a"
        alt_delta = abs(alt - measured_sce[other_part])
        fails = alt_delta > basis.allowable_V + EPS_V
        state_fail = state_fail or fails
        state_notes.append({"part": part, "material": rec["id"], "other_state": other_id, "drop_V": round(drop, 4),
                            "delta_E_if_active_V": round(alt_delta, 4), "fails": fails})
        d.step(f"If {labels[part]} turns active",
               "E_active ≈ E_measured − (mid-point passive − mid-point active) of the published ranges",
               f"{fmt(measured_sce[part], 4)} − {fmt(drop, 4)} V vs SCE",
               f"ΔE would be {fmt(alt_delta, 4)} V: {'beyond' if fails else 'within'} the "
               f"{fmt(basis.allowable_V)} V allowed")
        d.cite(rec.get("seawater_source"))
        d.cite(other.get("seawater_source"))
    tier = _tier_measured(delta, basis.allowable_V, basis.negligible_V, state_fail)
    cmp_sign = "≤" if delta <= basis.allowable_V + EPS_V else ">"
    d.step("Check against the allowable difference", "passes when ΔE ≤ allowable (limit inclusive)",
           f"{fmt(delta, 4)} V {cmp_sign} {fmt(basis.allowable_V)} V ({envrec.get('name', envrec['id'])})",
           f"tier: {tier}")
    d.cite(basis.allowable_source)
    if basis.negligible_V is not None:
        d.cite(envrec.get("negligible_source") or basis.allowable_source)

    published, agreement, agreement_text = None, None, None
    if len(recs) == 2:
        try:
            pub = joint.judge_joint(recs["a"]["id"], recs["b"]["id"], envrec["id"]).to_dict()
        except InputError as exc:
            raise InputError({"a": "a_material", "b": "b_material"}.get(exc.field, exc.field), exc.value,
                             exc.allowed, exc.hint) from None
        pub_anode = {recs["a"]["id"]: a_label, recs["b"]["id"]: b_label}.get(pub["anode"])
        if recs["a"]["id"] == recs["b"]["id"]:
            pub_anode = None
        published = {"verdict": pub["verdict"], "anode": pub["anode"], "anode_part_name": pub_anode,
                     "delta_E_V": pub["delta_E_V"], "delta_E_range_V": pub["delta_E_range_V"],
                     "basis": pub["basis"], "verdict_text": pub["verdict_text"], "positions": pub["positions"],
                     "sources": pub["sources"]}
        for s in pub["sources"]:
            d.cite(s)
        same_anode = pub_anode == anode
        agreement = pub["verdict"] == tier and same_anode
        if agreement:
            agreement_text = (f"The published series agrees: {pub['verdict']}, with {anode or 'neither part'} as the "
                              "anode.")
        else:
            parts = []
            if pub["verdict"] != tier:
                parts.append(f"the published series says {pub['verdict']} (ΔE {fmt(pub['delta_E_V'], 3)} V), the "
                             f"site readings {tier} (ΔE {fmt(delta, 3)} V)")
            if not same_anode:
                parts.append(f"the published series makes {pub_anode or 'neither part'} the anode, the site readings "
                             f"{anode or 'neither part'}")
            agreement_text = ("They disagree: " + "; ".join(parts) + ". The site measurement wins: it measures "
                              "these parts in this water, at this temperature and flow, with their actual surface "
                              "films, whereas the published series gives ranges measured in flowing seawater at "
                              "10-27 °C. Check that both readings were taken with the parts separated and repeat "
                              "them before relying on either.")
        if pub["basis"] == "galvanic-series":
            for part, rec in recs.items():
                rng = rec.get("seawater_range_V_SCE")
                if isinstance(rng, list) and len(rng) == 2:
                    lo, hi = min(rng), max(rng)
                    if not lo - 0.02 <= measured_sce[part] <= hi + 0.02:
                        d.warn(f"{part}_reading_V",
                               f"{labels[part]} reads {fmt(measured_sce[part], 3)} V vs SCE, outside the published "
                               f"range of {rec.get('name', rec['id'])} ({fmt(lo)} to {fmt(hi)} V vs SCE in flowing "
                               "seawater): another state, electrolyte or surface condition, or a reading fault")
    elif len(recs) == 1:
        d.warn("b_material" if "a" in recs else "a_material",
               "the published-series judgement needs both materials; only one was given")

    if basis.kind == "anodic-index":
        d.warn("env", f"{envrec.get('name', envrec['id'])} is judged on the anodic index (a table for equipment in "
                      "air); site potentials are read in an electrolyte, so take them in the film or water the parts "
                      "actually share")
    if el.id == _AGAGCL_SW and el.salinity is None and not envrec["id"].startswith("seawater"):
        d.warn("salinity", f"an Ag/AgCl seawater electrode in {envrec.get('name', envrec['id']).lower()}: the "
                           "difference of the two readings is unaffected, but their values on the SCE scale need "
                           "the salinity or chloride_mg_per_L (the electrode is taken to be in seawater of "
                           "salinity 35)")
    if not temp_given:
        d.warn("temp_C", "temperature not given: 25 °C assumed for the electrode")

    if tier == "unsuited":
        text = (f"{anode} is the anode, {fmt(delta, 3)} V below {cathode} as measured: more than the "
                f"{fmt(basis.allowable_V)} V allowed in {envrec.get('name', envrec['id'])}, so it will corrode "
                "faster where the two meet unless they are isolated or protected.")
    elif anode is None:
        text = f"The two parts read the same potential: no galvanic driving force was measured ({tier})."
    elif tier == "guarded":
        bad = [n for n in state_notes if n["fails"]]
        text = (f"{anode} is the anode, {fmt(delta, 3)} V below {cathode} as measured: within the "
                f"{fmt(basis.allowable_V)} V allowed, but if {labels[bad[0]['part']]} turns active (crevices, "
                f"deposits, still water) the difference would be about {fmt(bad[0]['delta_E_if_active_V'], 3)} V, "
                "beyond it: join them only with precautions.")
    elif tier == "matched":
        text = (f"{anode} is the anode, only {fmt(delta, 3)} V below {cathode} as measured: inside the "
                f"{fmt(basis.negligible_V)} V treated as negligible, so the galvanic effect does not matter.")
    else:
        text = (f"{anode} is the anode, {fmt(delta, 3)} V below {cathode} as measured: within the "
                f"{fmt(basis.allowable_V)} V allowed in {envrec.get('name', envrec['id'])}.")
    assumptions = [
        "both readings were taken against the same electrode, each part on its own (not connected to the other)",
        "the limit is inclusive: a difference equal to the allowable passes",
        "the difference of the two readings does not depend on the electrode's own value; the SCE and SHE values "
        "do, and carry that electrode's uncertainty",
    ]
    if envrec.get("allowable_source") == "common-practice":
        assumptions.append(f"the allowable {fmt(basis.allowable_V)} V for {envrec.get('name', envrec['id'])} is a "
                           "rule of thumb of the trade, not a standard")
    data = (
        ("a_name", a_label), ("b_name", b_label), ("a_reading_V", ra), ("b_reading_V", rb),
        ("electrode", el.id), ("temp_C", t), ("env", envrec["id"]), ("env_name", envrec.get("name", envrec["id"])),
        ("salinity", el.salinity), ("electrode_shift_V", round(el.shift_V, 6)),
        ("electrode_V_SHE", round(el.E_V_SHE, 6)),
        ("scale", "SCE"), ("a_V_SCE", round(sce_a, 6)), ("b_V_SCE", round(sce_b, 6)),
        ("a_V_SHE", round(ea, 6)), ("b_V_SHE", round(eb, 6)),
        ("anode", anode), ("cathode", cathode), ("anode_part", anode_part),
        ("delta_E_V", round(delta, 4)), ("allowable_V", basis.allowable_V), ("negligible_V", basis.negligible_V),
        ("allowable_source", basis.allowable_source or None),
        ("passes", delta <= basis.allowable_V + EPS_V), ("margin_V", round(basis.allowable_V - delta, 4)),
        ("verdict", tier), ("verdict_text", text), ("verdict_meaning", joint.TIER_MEANING[tier]),
        ("materials", {p: r["id"] for p, r in recs.items()}),
        ("state_check", state_notes),
        ("published", published), ("agreement", agreement), ("agreement_text", agreement_text),
        ("assumptions", assumptions), ("cautions", list(MEASURED_CAUTIONS)),
        ("steps", d.steps), ("warnings", d.warnings), ("sources", d.sources), ("data_version", ds.version),
    )
    return MeasuredJoint(data)


_MEASURED_KEYS = ("a_name", "a_reading_V", "b_name", "b_reading_V", "electrode", "temp_C", "env",
                  "chloride_mg_per_L", "salinity", "a_material", "b_material")


def measured_joint_entry(req):
    """JSON entry point ``measured``: judge a joint from two potentials measured on site.

    Request fields: ``a_name``, ``a_reading_V`` [V], ``b_name``, ``b_reading_V`` [V],
    ``electrode``, ``env``; optional ``temp_C`` [°C, default 25], ``salinity`` [g/kg] or
    ``chloride_mg_per_L`` [mg/L] (Ag/AgCl seawater electrode), ``a_material``, ``b_material``.

    Args:
        req: the request dict [unitless]

    Returns:
        dict: anode, cathode, delta_E_V [V], allowable_V [V], verdict, verdict_text, a_V_SCE and
        b_V_SCE [V vs SCE], published (the published-series judgement or None), agreement_text,
        state_check, assumptions, cautions, steps, warnings, sources, data_version

    References:
        See :func:`measured_joint`.

    >>> r = measured_joint_entry({"a_name": "pile", "a_reading_V": -0.70, "b_name": "ladder",
    ...                           "b_reading_V": -0.66, "electrode": "SCE", "env": "seawater-flowing"})
    >>> r["verdict"], r["anode"]
    ('matched', 'pile')
    """
    _check_keys(req, _MEASURED_KEYS, "measured")
    for k in ("a_name", "a_reading_V", "b_name", "b_reading_V", "electrode", "env"):
        if k not in req:
            allowed = {"a_name": "a label for the first part", "b_name": "a label for the second part",
                       "electrode": "a reference electrode id such as CSE or Ag/AgCl seawater",
                       "env": "an environment id"}.get(k, "a reading in V")
            raise InputError(k, None, allowed)
    return measured_joint(req["a_name"], req["a_reading_V"], req["b_name"], req["b_reading_V"], req["electrode"],
                          req["env"], req.get("temp_C"), req.get("salinity"), req.get("chloride_mg_per_L"),
                          req.get("a_material"), req.get("b_material")).to_dict()


# --------------------------------------------------------------------------------------------
# CP reading


def standard_name(ds, source_id):
    """Short name of a cited document: its designation (container) or title and year.

    Args:
        ds: the dataset [unitless]
        source_id: an id of data/sources.yaml [unitless]

    Returns:
        text

    References:
        Presentation of data/sources.yaml (no published method).

    >>> standard_name(current(), "iso-15589-1-2015")
    'ISO 15589-1:2015'
    """
    src = ds.source(source_id) or {}
    if src.get("container"):
        return src["container"]
    title = src.get("title") or source_id
    return f"{title}, {src['year']}" if src.get("year") else title


def reading_kind(value):
    """The kind of a CP reading: ``on`` or ``instant-off`` (also ``off``, ``instant off``).

    Args:
        value: what the user gave [unitless]

    Returns:
        ``on`` or ``instant-off``

    References:
        Terms of CP practice (NACE SP0169-2013 and ISO 15589-1:2015 use on and instant-off potentials).

    >>> reading_kind("Instant Off"), reading_kind("ON")
    ('instant-off', 'on')
    """
    key = _norm(value) if isinstance(value, str) else None
    if key == "on":
        return "on"
    if key in ("instantoff", "off"):
        return "instant-off"
    raise InputError("reading_kind", value, "on (current flowing) or instant-off (current just interrupted)")


def criteria_for(structure, setting):
    """The CP criteria records of the dataset for a structure in a setting.

    Args:
        structure: structure id of :data:`STRUCTURES` [unitless]
        setting: setting id of :data:`SETTINGS` [unitless]

    Returns:
        list of criteria records (dicts), in file order

    References:
        data/cp_criteria.yaml (each record cites its standard and clause).

    >>> [r["id"] for r in criteria_for("carbon-steel", "seawater-aerobic")]
    ['steel-seawater-aerobic', 'steel-seawater-limit']
    """
    return [r for r in current().records("cp_criteria")
            if r.get("structure") == structure and setting in (r.get("settings") or [])]


def _within(t, window):
    return window is None or (window[0] - EPS_V <= t <= window[1] + EPS_V)


@dataclass(frozen=True)
class CPResult:
    """A CP reading judged against the criteria; :meth:`to_dict` is the JSON result."""

    data: tuple

    def to_dict(self):
        """Plain data for JSON."""
        return dict(self.data)


def check_cp_reading(structure, setting, reading_V, electrode, kind, temp_C=None, polarisation_mV=None,
                     structure_temp_C=None, salinity=None, chloride_mg_per_L=None):
    """Judge one structure-to-electrolyte potential against the CP criteria of the dataset.

    Args:
        structure: structure id or alias (carbon-steel, aluminium, ...) [unitless]
        setting: setting id (soil-aerobic, seawater-aerobic, ...) [unitless]
        reading_V: the reading as taken [V vs electrode]
        electrode: the reference electrode it was taken with [unitless]
        kind: ``on`` or ``instant-off`` [unitless]
        temp_C: temperature of the electrode, default 25 [°C]
        polarisation_mV: cathodic polarisation shift (instant-off to depolarised), optional [mV]
        structure_temp_C: temperature of the structure, default temp_C [°C]
        salinity: salinity of the water, for an Ag/AgCl seawater electrode [g/kg]
        chloride_mg_per_L: chloride instead of salinity [mg/L]

    Returns:
        a :class:`CPResult` (potentials in [V], shifts in [mV])

    References:
        The criteria of data/cp_criteria.yaml with their standards and clauses (ISO 15589-1:2015
        Table 1; NACE SP0169-2013 §6.2.2; 49 CFR 192 App. D; EN 12473:2014 Table 1; DNV-RP-B401;
        ISO 15589-2:2012; MIL-HDBK-1004/10 §3.3.1.2); conversion by :mod:`calc.refelec`.

    >>> r = check_cp_reading("carbon-steel", "soil-aerobic", -0.85, "CSE", "instant-off", 25).to_dict()
    >>> r["verdict"], r["conclusive"]
    ('protected', True)
    """
    ds = current()
    sid = lookup(STRUCTURES, structure, "structure", "a structure")
    sett = lookup(SETTINGS, setting, "setting", "a setting")
    rkind = reading_kind(kind)
    value = _reading(reading_V, "reading_V")
    temp_given = temp_C is not None
    el = field_electrode(electrode, temp_C, salinity, chloride_mg_per_L)
    t = el.temp_C
    ts = t if structure_temp_C is None else check_number(
        structure_temp_C, "structure_temp_C", "a structure temperature from 0 to 100 °C", low=0.0, high=100.0)
    pol = None
    if polarisation_mV is not None:
        pol = check_number(polarisation_mV, "polarisation_mV", "a polarisation shift from 0 to 2000 mV",
                           low=0.0, high=2000.0)
    recs = criteria_for(sid, sett)
    if not recs:
        have = sorted({s for r in ds.records("cp_criteria") if r.get("structure") == sid
                       for s in r.get("settings", [])})
        raise InputError("setting", setting, f"a setting with criteria for {sid}: " + (", ".join(have) or "none"))
    d = Derivation()
    d.steps.extend(el.steps)
    for w in el.warnings:
        d.warn(w["field"], w["message"])
    for s in el.sources:
        d.cite(s)
    e_she = value + el.E_V_SHE
    for w in _plausible(value, e_she, "reading_V", rkind, el.id):
        d.warn(w["field"], w["message"])
    implausible = e_she < PLAUSIBLE_SHE_V[0] - EPS_V
    d.step("Reading vs SHE", f"E(SHE) = reading + E({el.id} vs SHE at {fmt(t)} °C)",
           f"{fmt(value)} V + {fmt(el.E_V_SHE)} V", f"E = {fmt(e_she, 5)} V vs SHE")

    scales = {}

    def on_scale(electrode_id):
        if electrode_id not in scales:
            v, ref = _on_scale(e_she, electrode_id, t)
            scales[electrode_id] = v
            if ref.id != el.id or el.shift_V:
                d.steps.extend(ref.steps)
                d.step(f"Reading vs {ref.id}", f"E({ref.id}) = E(SHE) − E({ref.id} vs SHE at {fmt(t)} °C)",
                       f"{fmt(e_she, 5)} − ({fmt(ref.E_V_SHE)})", f"E = {fmt(v, 4)} V vs {ref.id}")
            for s in ref.sources:
                d.cite(s)
        return scales[electrode_id]

    def cite_rec(r):
        d.cite(r.get("source"))
        for a in r.get("also") or []:
            d.cite(a.get("source"))

    def describe(r):
        return {"id": r["id"], "name": r.get("name", r["id"]), "kind": r["kind"],
                "standard": standard_name(ds, r["source"]), "clause": r.get("clause"), "source": r["source"],
                "confidence": r.get("confidence"), "provisional": bool(r.get("provisional")),
                "ir_free": bool(r.get("ir_free")), "electrode": r.get("electrode"), "note": r.get("note"),
                "also": [{"source": a["source"], "standard": standard_name(ds, a["source"]),
                          "clause": a.get("clause"), "confidence": a.get("confidence"), "note": a.get("note")}
                         for a in r.get("also") or []]}

    base = [r for r in recs if r["kind"] == "protection" and not r.get("structure_temp_C")]
    temps = [r for r in recs if r["kind"] == "protection" and r.get("structure_temp_C")]
    pols = [r for r in recs if r["kind"] == "polarisation"]
    limits = [r for r in recs if r["kind"] == "limit"]
    others = [r for r in recs if r["kind"] == "shift-on"]
    if len(base) > 1 or len(limits) > 1:
        raise DataError(f"cp_criteria: more than one base protection or limit record for {sid} in {sett}")
    criteria = []
    ir_words = {True: "needs the IR-free (instant-off) potential", False: "is stated for the on potential"}

    # protection potential (base, moved by an elevated-temperature record)
    prot = None
    if base:
        r = base[0]
        threshold = float(r["potential_V"])
        used = [r]
        cite_rec(r)
        for tr in temps:
            if not _within(ts, tr.get("structure_temp_C")):
                continue
            target = float(tr["potential_V"])
            ramp = tr.get("ramp_C")
            if ramp and ts < ramp[1]:
                frac = (ts - ramp[0]) / (ramp[1] - ramp[0])
                moved = threshold + (target - threshold) * max(0.0, min(1.0, frac))
                formula = (f"linear from {fmt(threshold)} V at {fmt(ramp[0])} °C to {fmt(target)} V at "
                           f"{fmt(ramp[1])} °C")
            else:
                start = ramp[1] if ramp else tr["structure_temp_C"][0]
                moved, formula = target, f"{fmt(target)} V at {fmt(start)} °C or more"
            if moved < threshold:
                d.step("Elevated structure temperature", formula, f"structure at {fmt(ts)} °C",
                       f"criterion {fmt(moved, 4)} V vs {r['electrode']} instead of {fmt(threshold)} V")
                threshold = moved
                used.append(tr)
                cite_rec(tr)
        if ts > 40.0 + EPS_V and not temps:
            d.warn("structure_temp_C", f"the structure is at {fmt(ts)} °C: the dataset holds no elevated-temperature "
                                       f"criterion for {SETTINGS[sett][0].lower()}; hot structures need more "
                                       "polarisation (ISO 15589-1, NACE SP0169): ask a CP specialist")
        ev = on_scale(r["electrode"])
        met = ev <= threshold + EPS_V
        rng = r.get("range_V")
        conclusive = (rkind == "instant-off") or not r.get("ir_free") or not met
        borderline = bool(rng) and not met and ev <= max(rng) + EPS_V
        info = describe(r)
        info.update({"role": "protection", "value_V": round(threshold, 6), "published_V": r["potential_V"],
                     "reading_V": round(ev, 6), "margin_V": round(threshold - ev, 6), "met": met,
                     "conclusive": conclusive, "borderline": borderline, "range_V": rng,
                     "applied": [u["id"] for u in used]})
        sign = "≤" if met else ">"
        d.step(f"Protection criterion: {r['name']}",
               f"protected when E ≤ criterion (limit inclusive); {standard_name(ds, r['source'])}, {r['clause']}",
               f"{fmt(ev, 4)} V {sign} {fmt(threshold, 4)} V vs {r['electrode']}",
               "met" if met else "not met")
        txt = (f"{fmt(ev, 3)} V vs {r['electrode']} is {'at or below' if met else 'above'} the {fmt(threshold, 3)} V "
               f"of {standard_name(ds, r['source'])}, {r['clause']}; the criterion {ir_words[bool(r.get('ir_free'))]}")
        if borderline:
            txt += (f"; the documents give {fmt(min(rng))} to {fmt(max(rng))} V, and the reading lies in that span: "
                    "borderline")
        info["text"] = txt + "."
        criteria.append(info)
        prot = info

    # polarisation shift
    pol_info = None
    for r in pols:
        info = describe(r)
        need_mV = float(r["shift_V"]) * 1000.0
        applies = _within(ts, r.get("structure_temp_C"))
        info.update({"role": "polarisation", "value_mV": round(need_mV, 6), "given_mV": pol, "applies": applies})
        cite_rec(r)
        if not applies:
            lo, hi = r["structure_temp_C"]
            info.update({"met": None, "conclusive": None, "text": (
                f"{r['name']} ({standard_name(ds, r['source'])}, {r['clause']}) does not apply at a structure "
                f"temperature of {fmt(ts)} °C (only {fmt(lo)} to {fmt(hi)} °C here)")})
            if pol is not None:
                d.warn("polarisation_mV", info["text"] + ": the polarisation given was not used")
        elif pol is None:
            info.update({"met": None, "conclusive": None, "text": (
                f"{r['name']} ({standard_name(ds, r['source'])}, {r['clause']}) can also show protection: give the "
                "polarisation shift (instant-off potential minus depolarised potential) to check it")})
        else:
            met = pol >= need_mV - 1e-6
            info.update({"met": met, "conclusive": True, "text": (
                f"polarisation {fmt(pol)} mV is {'at least' if met else 'less than'} the {fmt(need_mV)} mV of "
                f"{standard_name(ds, r['source'])}, {r['clause']}.")})
            d.step(f"Polarisation criterion: {r['name']}", "protected when the polarisation ≥ the shift (inclusive)",
                   f"{fmt(pol)} mV {'≥' if met else '<'} {fmt(need_mV)} mV", "met" if met else "not met")
            pol_info = info
        criteria.append(info)
    if pol is not None and not pols:
        d.warn("polarisation_mV", f"no polarisation criterion is stored for {STRUCTURES[sid][0].lower()} in "
                                  f"{SETTINGS[sett][0].lower()}: the polarisation given was not used")
    if prot is None and pol_info is None:
        need = [c for c in criteria if c["role"] == "polarisation" and c.get("applies")]
        if need:
            raise InputError("polarisation_mV", polarisation_mV,
                             f"the polarisation shift in mV: {STRUCTURES[sid][0].lower()} in "
                             f"{SETTINGS[sett][0].lower()} "
                             "has no potential criterion, only a polarisation criterion")
        raise InputError("structure_temp_C", structure_temp_C,
                         "a temperature at which a protection criterion applies to this structure and setting")

    # negative limit
    lim = None
    if limits:
        r = limits[0]
        cite_rec(r)
        ev = on_scale(r["electrode"])
        limit_v = float(r["potential_V"])
        over = ev < limit_v - EPS_V
        rng = r.get("range_V")
        conclusive = (rkind == "instant-off") or not r.get("ir_free") or not over
        borderline = bool(rng) and over and ev >= min(rng) - EPS_V
        info = describe(r)
        info.update({"role": "limit", "value_V": limit_v, "published_V": r["potential_V"], "reading_V": round(ev, 6),
                     "margin_V": round(ev - limit_v, 6), "exceeded": over, "conclusive": conclusive,
                     "borderline": borderline, "range_V": rng})
        d.step(f"Negative limit: {r['name']}",
               "over-protected when E < limit (a reading on the limit is within it); "
               f"{standard_name(ds, r['source'])}, "
               f"{r['clause']}", f"{fmt(ev, 4)} V {'<' if over else '≥'} {fmt(limit_v, 4)} V vs {r['electrode']}",
               "beyond the limit" if over else "within the limit")
        txt = (f"{fmt(ev, 3)} V vs {r['electrode']} is {'beyond' if over else 'within'} the "
               f"{fmt(limit_v, 3)} V limit of "
               f"{standard_name(ds, r['source'])}, {r['clause']}")
        if borderline:
            txt += (f"; the documents give {fmt(min(rng))} to {fmt(max(rng))} V and the reading lies in that span: "
                    "borderline")
        info["text"] = txt + "."
        criteria.append(info)
        lim = info
    else:
        d.warn(None, f"no negative (over-protection) limit is stored for {STRUCTURES[sid][0].lower()} in "
                     f"{SETTINGS[sett][0].lower()}")
    for r in others:
        info = describe(r)
        info.update({"role": "not checked", "value_mV": round(float(r["shift_V"]) * 1000.0, 6), "met": None,
                     "conclusive": None, "text": (
                         f"{r['name']} ({standard_name(ds, r['source'])}, {r['clause']}) is not checked: it needs "
                         "the shift of the on potential from the native potential, not one reading")})
        cite_rec(r)
        criteria.append(info)

    # verdict
    prot_met = prot is not None and prot["met"]
    pol_met = pol_info is not None and pol_info["met"]
    if lim is not None and lim["exceeded"]:
        verdict, conclusive = "over-protected", lim["conclusive"]
    elif prot_met or pol_met:
        verdict = "protected"
        conclusive = bool(pol_met) or bool(prot_met and prot["conclusive"])
    else:
        verdict, conclusive = "not protected", all(c["conclusive"] for c in (prot, pol_info) if c is not None)
    if implausible:
        conclusive = False
    used = [c for c in criteria if c.get("met") is not None or c["role"] == "limit"]
    provisional = [c for c in used if c["provisional"]]
    for c in provisional:
        d.warn(None, f"{c['name']}: provisional value ({c['standard']}, {c['clause']}; {c['confidence']}): "
                     "check it in the standard before relying on the verdict")
    for c in used:
        if c.get("electrode") and c["electrode"] != el.id:
            d.warn("electrode", f"the reading was converted from {el.id} to {c['electrode']} with the dataset's "
                                "electrode values; the standards' working equivalences differ by up to about 15 mV "
                                "(e.g. -0.80 V Ag/AgCl seawater is taken as -0.85 V CSE): near a limit, measure with "
                                f"a {c['electrode']} electrode")
            break
    ir_needed = [c for c in used if c["ir_free"] and c["role"] in ("protection", "limit")]
    if rkind == "on":
        ir = ("Given: an on reading, taken with the protective current flowing. It includes the IR drop: the voltage "
              "lost by that current in the soil or water between the structure and the electrode, which makes the "
              "reading more negative than the structure's polarised potential. ")
        if ir_needed:
            ir += ("The criteria used here need the IR-free (polarised) potential: interrupt the current (switch the "
                   "rectifier or disconnect the anodes) and read at that instant, before the structure depolarises "
                   "(instant-off), or use a coupon. From an on reading a criterion that is not met is conclusive; one "
                   "that is met is not, and a reading beyond the negative limit may be IR drop only.")
        else:
            ir += "The criteria used here are stated for the on potential."
    else:
        ir = ("Given: an instant-off reading, taken at the instant the protective current was interrupted, before the "
              "structure depolarises. It is free of the IR drop of the interrupted current, but not of currents that "
              "kept flowing (other rectifiers, bonded galvanic anodes, stray or telluric currents).")
    word = {"protected": "Protected", "not protected": "Not protected", "over-protected": "Over-protected"}[verdict]
    reasons = [c["text"] for c in (prot, pol_info, lim) if c is not None and (c.get("met") is not None or c is lim)]
    if verdict == "protected" and not conclusive:
        text = (f"{word} on this on reading only, which does not demonstrate protection: the criterion needs an "
                "instant-off reading. " + " ".join(reasons))
    elif verdict == "over-protected" and not conclusive:
        text = (f"{word} on this on reading, which may be IR drop only: take an instant-off reading to see whether "
                "the polarised potential is beyond the limit. " + " ".join(reasons))
    elif implausible:
        text = f"{word} as read, but the reading is implausible (see the warnings). " + " ".join(reasons)
    else:
        text = f"{word}. " + " ".join(reasons)
    label = verdict if conclusive else f"{verdict} (not conclusive: {rkind} reading)"
    if not temp_given:
        d.warn("temp_C", "temperature not given: 25 °C assumed for the electrode")
    assumptions = [
        "limits are inclusive: a reading exactly on a protection criterion is protected, one exactly on a negative "
        "limit is within it",
        "the reading was converted to each criterion's electrode at the electrode's temperature; liquid-junction "
        "potentials are not included",
        f"structure temperature {fmt(ts)} °C"
        + ("" if structure_temp_C is not None else " (taken as the electrode's)"),
        "the protective current flows onto the structure (cathodic); under stray-current interference the reasoning "
        "about IR drop does not hold",
    ]
    if pol is not None:
        assumptions.append("the polarisation is the shift from the depolarised (or native) potential to the "
                           "instant-off potential, free of IR drop")
    if el.id == _AGAGCL_SW and el.salinity is None:
        assumptions.append("the Ag/AgCl seawater electrode is in full-strength seawater (salinity 35); in brackish "
                           "water give the salinity or chloride to correct it")
    data = (
        ("structure", sid), ("structure_name", STRUCTURES[sid][0]), ("setting", sett),
        ("setting_name", SETTINGS[sett][0]), ("reading_V", value), ("electrode", el.id), ("temp_C", t),
        ("structure_temp_C", ts), ("reading_kind", rkind), ("polarisation_mV", pol),
        ("salinity", el.salinity), ("electrode_shift_V", round(el.shift_V, 6)), ("reading_V_SHE", round(e_she, 6)),
        ("verdict", verdict), ("conclusive", conclusive), ("verdict_label", label), ("verdict_text", text),
        ("implausible", implausible), ("criteria", criteria), ("ir_drop", ir),
        ("instant_off_needed", bool(ir_needed)), ("assumptions", assumptions), ("cautions", list(CP_CAUTIONS)),
        ("steps", d.steps), ("warnings", d.warnings), ("sources", d.sources), ("data_version", ds.version),
    )
    return CPResult(data)


_CP_KEYS = ("structure", "setting", "reading_V", "electrode", "temp_C", "reading_kind", "polarisation_mV",
            "structure_temp_C", "salinity", "chloride_mg_per_L")


def cp_reading_entry(req):
    """JSON entry point ``cp``: judge one CP reading against the criteria of the dataset.

    Request fields: ``structure``, ``setting``, ``reading_V`` [V], ``electrode``,
    ``reading_kind`` (``on`` or ``instant-off``); optional ``temp_C`` [°C, default 25],
    ``polarisation_mV`` [mV], ``structure_temp_C`` [°C], ``salinity`` [g/kg] or
    ``chloride_mg_per_L`` [mg/L].

    Args:
        req: the request dict [unitless]

    Returns:
        dict: verdict (protected, not protected, over-protected), conclusive, verdict_text,
        criteria (each with its standard, clause, value in [V], the reading on its electrode in
        [V], whether it needs an instant-off value), ir_drop, assumptions, cautions, steps,
        warnings, sources, data_version

    References:
        See :func:`check_cp_reading`.

    >>> r = cp_reading_entry({"structure": "carbon-steel", "setting": "seawater-aerobic", "reading_V": -1.05,
    ...                       "electrode": "Ag/AgCl seawater", "reading_kind": "instant-off", "temp_C": 12})
    >>> r["verdict"], [c["value_V"] for c in r["criteria"]]
    ('protected', [-0.8, -1.1])
    """
    _check_keys(req, _CP_KEYS, "cp")
    for k in ("structure", "setting", "reading_V", "electrode", "reading_kind"):
        if k not in req:
            allowed = {"structure": "a structure: one of " + ", ".join(STRUCTURES),
                       "setting": "a setting: one of " + ", ".join(SETTINGS),
                       "electrode": "a reference electrode id such as CSE or Ag/AgCl seawater",
                       "reading_kind": "on or instant-off"}.get(k, "a reading in V")
            raise InputError(k, None, allowed)
    return check_cp_reading(req["structure"], req["setting"], req["reading_V"], req["electrode"], req["reading_kind"],
                            req.get("temp_C"), req.get("polarisation_mV"), req.get("structure_temp_C"),
                            req.get("salinity"), req.get("chloride_mg_per_L")).to_dict()
