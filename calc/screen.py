"""The quick upper-bound screen of a joint's attack: the catchment estimate i_a = i_L·(1 + A_c/A_a).

When the cathodic reaction on both parts runs at its diffusion limit i_L, the anode's dissolution is
its own oxygen-limited current plus everything the cathode collects: i_a = i_L·(1 + A_c/A_a)
(F. Mansfeld, Corrosion 27 (1971) 436, Case 3, the catchment principle, as its abstract states
it). No cathode can draw more than i_L, so this is an upper bound of the attack on the anode; the
mixed-potential judgement (:mod:`calc.couplemix`) says how much less the kinetics give. i_L comes
from the service conditions (:mod:`calc.service`) where the environment has a service model, else
from the environment's published cathodic current-density range. The rate is ASTM G102 Eqs. (1)-(2)
(:mod:`calc.rate`).
"""

from . import rate as g102
from .derivation import Derivation
from .errors import InputError


def _sig(x, n=6):
    return float(f"{x:.{n}g}")


def upper_bound_density(limiting_uA_per_cm2, area_ratio):
    """The anode's attack when both parts' cathodic reactions run at the diffusion limit.

    i_a = i_L·(1 + A_c/A_a): the anode's own oxygen-limited current plus the cathode's, collected
    over the cathode's area and leaving through the anode's.

    Args:
        limiting_uA_per_cm2: the O2 diffusion-limited current density i_L [µA/cm²]
        area_ratio: wetted area of the cathode over that of the anode [unitless]

    Returns:
        i_a [µA/cm²]

    References:
        F. Mansfeld, "Area relationships in galvanic corrosion", Corrosion 27 (1971) 436, Case 3
        (abstract: the dissolution rate of the anode proportional to A_C/A_A for large ratios).

    >>> upper_bound_density(20.0, 10.0)
    220.0
    """
    return limiting_uA_per_cm2 * (1.0 + area_ratio)


def _no_rate_reason(env, basis, primary, service):
    """Why no screening rate is estimated for this joint, or None."""
    if primary.anode is None:
        return "no anode: the two sit at the same nominal potential"
    if service is None and not env.get("cathodic_current_density_uA_per_cm2"):
        return (f"{basis.env_name} has no cathodic current density in the dataset (in air the wetted film, not "
                "the metal, limits the current), so no rate is estimated")
    if service is not None and service.supply.i_L_A_per_m2 <= 0.0:
        return "deaerated water: no oxygen to reduce, so the oxygen-limited screen gives no attack"
    if primary.tier == "matched":
        return ("the difference is within the negligible band: the catchment estimate, which lets the cathode "
                "run at its full oxygen-limited current, would grossly overstate the attack")
    return None


def screen(env, basis, primary, area_ratio, names, rec_by_id, service=None):
    """The upper-bound screening rate of a joint's anode, or (None, the reason there is none).

    Args:
        env: the environment record [unitless]
        basis: the environment's :class:`calc.series.Basis` [unitless]
        primary: the pair comparison of the parts as named (:class:`calc.series` combo) [unitless]
        area_ratio: wetted area of the cathode over that of the anode [unitless]
        names: material id -> name [unitless]
        rec_by_id: material id -> record [unitless]
        service: the :class:`calc.service.Service` conditions, or None [unitless]

    Returns:
        (rate dict with current densities in [µA/cm²] and rates in [mm/y] and [g/(m²·d)], or None; reason or None)

    References:
        :func:`upper_bound_density` (Mansfeld 1971, Case 3); ASTM G102-89 (R2015) Eqs. (1)-(2).

    >>> from calc.dataset import current
    >>> from calc.series import basis_of, judge_pair
    >>> ds = current(); env = ds.get("environments", "buried-soil"); b = basis_of(env, ds)
    >>> recs = {r["id"]: r for r in ds.records("materials")}
    >>> pair = judge_pair(ds, recs["zinc"], recs["carbon-steel"], b).primary
    >>> rate, _ = screen(env, b, pair, 1.0, {}, recs)
    >>> rate["anode_current_density_uA_per_cm2"]
    [2.2, 4.4]
    """
    reason = _no_rate_reason(env, basis, primary, service)
    if reason:
        return None, reason
    try:
        fd = g102.material_faraday_data(rec_by_id[primary.anode], field_name="anode")
    except InputError as exc:
        return None, f"no Faraday rate for {names[primary.anode]}: {exc.hint or exc.allowed}"
    if service is not None:
        lo = hi = service.supply.i_L_uA_per_cm2
        basis_words, sources = "the O2 limiting current at the service conditions", list(service.supply.sources)
    else:
        ic = env["cathodic_current_density_uA_per_cm2"]
        lo, hi = float(min(ic)), float(max(ic))
        basis_words = f"the published cathodic current-density range of {basis.env_name}"
        sources = [env.get("cathodic_current_density_source")]
    ia_lo, ia_hi = upper_bound_density(lo, area_ratio), upper_bound_density(hi, area_ratio)
    ew, rho = fd.equivalent_weight_g, fd.density_g_cm3
    r_lo, r_hi = g102.corrosion_rate(ia_lo, ew, rho), g102.corrosion_rate(ia_hi, ew, rho)
    shown = f"{lo:.4g}" if lo == hi else f"[{lo:.4g}, {hi:.4g}]"
    d = Derivation()
    d.step("Upper-bound screen of the anode's attack (catchment, Mansfeld 1971 Case 3)",
           "i_a = i_L × (1 + A_c/A_a): both cathodic reactions at their diffusion limit",
           f"i_a = {shown} µA/cm² × (1 + {area_ratio:g}), i_L from {basis_words}",
           f"i_a = [{ia_lo:.4g}, {ia_hi:.4g}] µA/cm²")
    d.step("Upper-bound rate of the anode (ASTM G102 Eqs. 1-2)", "CR = K1·i_a·EW/ρ; MR = K2·i_a·EW",
           f"CR = 3.27e-3 × [{ia_lo:.4g}, {ia_hi:.4g}] × {ew:.4g} / {rho:g}",
           f"CR = [{r_lo.penetration_mm_per_year:.3g}, {r_hi.penetration_mm_per_year:.3g}] mm/y, MR = "
           f"[{r_lo.mass_loss_g_per_m2_day:.3g}, {r_hi.mass_loss_g_per_m2_day:.3g}] g/(m²·d)")
    return {
        "kind": "upper-bound screen",
        "formula": "i_a = i_L·(1 + A_c/A_a)",
        "anode": primary.anode,
        "area_ratio": area_ratio,
        "limiting_current_from": "service conditions" if service is not None else "environment range",
        "cathodic_current_density_uA_per_cm2": [_sig(lo), _sig(hi)],
        "anode_current_density_uA_per_cm2": [_sig(ia_lo), _sig(ia_hi)],
        "penetration_mm_per_year": [_sig(r_lo.penetration_mm_per_year), _sig(r_hi.penetration_mm_per_year)],
        "mass_loss_g_per_m2_day": [_sig(r_lo.mass_loss_g_per_m2_day), _sig(r_hi.mass_loss_g_per_m2_day)],
        "equivalent_weight_g": ew,
        "density_g_cm3": rho,
        "note": ("an upper bound: both parts' cathodic reactions at the full O2 diffusion limit, the anode's own "
                 "included, and all of the cathode's current leaving through the anode"),
        "steps": list(fd.steps) + d.steps,
        "sources": [s for s in sources + list(fd.sources) if s],
        "warnings": list(fd.warnings),
    }, None
