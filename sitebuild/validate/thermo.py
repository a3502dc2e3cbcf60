"""Thermodynamic consistency of the half-reactions.

- Free-energy additivity of linked couples: A: X→Y and B: Y→Z combine into C: X→Z, so
  n_C·E°_C = α·n_A·E°_A + β·n_B·E°_B, and the same for n·dE°/dT.
- Acid and alkaline forms of one couple, whose reactions differ by ν (H+ + OH- − H2O):
  E°_alk = E°_acid − (ln10·RT/F)·pKw·ν/n, and dE°_alk/dT = dE°_acid/dT + (ν/n)·ΔS°_w/F.
"""

import math

from calc.constants import FARADAY, T_STANDARD, nernst_slope

from .collect import each, is_num
from .reactions import key_name, name_key, reaction

K = "half_reactions"
#: free-energy additivity, in volts of n·E° of the combined couple: below WARN nothing is said;
#: WARN..ERROR is a warning (handbooks genuinely differ by a few mV: CRC's Cu2+/Cu+ 0.153 V,
#: Cu+/Cu 0.521 V and Cu2+/Cu 0.3419 V miss by 9.8 mV; Vanýsek, CRC Handbook 92nd ed. 2011,
#: Table 1); beyond ERROR it is an error (a typo, a sign or a wrong n).
ADDITIVITY_WARN_V = 0.005
ADDITIVITY_ERROR_V = 0.100
#: the same for temperature coefficients, in mV/K of n·dE°/dT
ADDITIVITY_DEDT_WARN = 0.05
ADDITIVITY_DEDT_ERROR = 1.0
#: pKw at 25 °C, 0.1 MPa (Bandura & Lvov, J. Phys. Chem. Ref. Data 35 (2006) 15, from memory)
PKW_25C = 13.995
#: ΔS° of H2O(l) -> H+(aq) + OH-(aq) [J/(mol·K)]: S°(OH-) - S°(H2O, l) with S°(H+) = 0,
#: -10.75 - 69.91 (Wagman et al., NBS tables, J. Phys. Chem. Ref. Data 11 Suppl. 2, 1982)
DELTA_S_WATER = -10.75 - 69.91
WATER = frozenset({"H+(aq)", "OH-(aq)", "H2O(l)"})


def couples(raw):
    """Half-reactions usable in the consistency checks: (label, record, ox name, red name, vector).

    A couple whose n is 0 or not finite is left out (the ranges check reports it): n divides.
    """
    out = []
    for label, rec in each(raw, K):
        rid, vec = rec.get("id"), reaction(rec)
        if not (isinstance(rid, str) and rid.count("/") == 1 and vec and is_num(rec.get("E0_V"))
                and rec["n"] != 0 and math.isfinite(rec["n"])):
            continue
        ox, red = (name_key(p) for p in rid.split("/"))
        out.append((label, rec, ox, red, vec))
    return out


def _report(out, label, field, diff, text, limits, notes=("", "")):
    """An error beyond limits[1], a warning beyond limits[0], nothing below; notes: (warning's, error's)."""
    if abs(diff) > limits[1]:
        out.error(K, label, field, text + notes[1])
    elif abs(diff) > limits[0]:
        out.warning(K, label, field, text + notes[0])


def _error_note():
    return f"; more than {ADDITIVITY_ERROR_V * 1000:g} mV is an error"


# --- free-energy additivity ----------------------------------------------------------------------------
def _coeff(vec, name, sign):
    """Net coefficient of the species called ``name`` on one side (sign +1 oxidised, -1 reduced)."""
    return sum(c for key, c in vec.items() if key != "e-" and key_name(key) == name and c * sign > 0)


def _triples(cps):
    """(A, B, C, α, β) for every C: X→Z that is α·A (X→Y) + β·B (Y→Z) in its species."""
    by_ox = {}
    for c in cps:
        by_ox.setdefault(c[2], []).append(c)
    for a in cps:
        la, _, x, y, va = a
        for b in by_ox.get(y, []):
            lb, _, _, z, vb = b
            if lb == la or z == x:
                continue
            for c in by_ox.get(x, []):
                if c[3] != z or c[0] in (la, lb):
                    continue
                ca, cc, cb, cz = _coeff(va, x, 1), _coeff(c[4], x, 1), _coeff(vb, z, -1), _coeff(c[4], z, -1)
                if ca and cc and cb and cz:
                    yield a, b, c, cc / ca, cz / cb


def _left_over(a, b, c, alpha, beta):
    """The species α·A + β·B − C leaves, as text; '' when the reactions add up."""
    va, vb, vc = a[4], b[4], c[4]
    keys = set(va) | set(vb) | set(vc)
    resid = {key: alpha * va.get(key, 0) + beta * vb.get(key, 0) - vc.get(key, 0) for key in keys}
    return ", ".join(f"{key} {r:+g}" for key, r in sorted(resid.items()) if abs(r) > 1e-9)


def _term(scale, n, e):
    return f"{n:g} × {e:g}" if abs(scale - 1) < 1e-12 else f"{scale:g} × {n:g} × {e:g}"


def _check_e0(out, a, b, c, alpha, beta):
    (la, ra), (lb, rb), (lc, rc) = a[:2], b[:2], c[:2]
    combined = alpha * ra["n"] * ra["E0_V"] + beta * rb["n"] * rb["E0_V"]
    stated = rc["n"] * rc["E0_V"]
    diff = stated - combined
    text = (f"free-energy additivity: n·E° of {lc} is {rc['n']:g} × {rc['E0_V']:g} = {stated:.4f} V, but "
            f"{la} + {lb} give {_term(alpha, ra['n'], ra['E0_V'])} + {_term(beta, rb['n'], rb['E0_V'])} = "
            f"{combined:.4f} V; the difference is {diff * 1000:.1f} mV (E° implied by the other two: "
            f"{combined / rc['n']:.4f} V)")
    warn_note = (f" (warning above {ADDITIVITY_WARN_V * 1000:g} mV: where handbooks genuinely differ, keep the "
                 "published values and say so in 'spread' or 'note')")
    _report(out, lc, "E0_V", diff, text, (ADDITIVITY_WARN_V, ADDITIVITY_ERROR_V), (warn_note, _error_note()))


def _check_dedt(out, a, b, c, alpha, beta):
    (la, ra), (lb, rb), (lc, rc) = a[:2], b[:2], c[:2]
    da, db, dc = ra.get("dEdT_mV_per_K"), rb.get("dEdT_mV_per_K"), rc.get("dEdT_mV_per_K")
    if not all(is_num(d) for d in (da, db, dc)):
        return
    dcomb = alpha * ra["n"] * da + beta * rb["n"] * db
    ddiff = rc["n"] * dc - dcomb
    text = (f"additivity of temperature coefficients: n·dE°/dT of {lc} is {rc['n'] * dc:.3f} mV/K, "
            f"{la} + {lb} give {dcomb:.3f} mV/K (difference {ddiff:+.3f} mV/K)")
    _report(out, lc, "dEdT_mV_per_K", ddiff, text, (ADDITIVITY_DEDT_WARN, ADDITIVITY_DEDT_ERROR))


def check_additivity(raw, out):
    """Every linked triple of couples obeys free-energy additivity (E° and dE°/dT)."""
    for a, b, c, alpha, beta in _triples(couples(raw)):
        left = _left_over(a, b, c, alpha, beta)
        if left:
            out.warning(K, c[0], "oxidised", f"{c[0]} should be the sum of {a[0]} and {b[0]}, but the reactions do "
                                             f"not add up (left over: {left}); additivity not checked")
            continue
        _check_e0(out, a, b, c, alpha, beta)
        _check_dedt(out, a, b, c, alpha, beta)


# --- acid and alkaline forms -----------------------------------------------------------------------------
def _water_nu(va, vb):
    """ν when reaction A − reaction B is exactly ν (H+ + OH- − H2O) with ν > 0, else None."""
    d = {key: va.get(key, 0) - vb.get(key, 0) for key in set(va) | set(vb)}
    d = {key: v for key, v in d.items() if abs(v) > 1e-12}
    if set(d) != WATER:
        return None
    nu = d["H+(aq)"]
    if nu <= 0 or abs(d["OH-(aq)"] - nu) > 1e-9 or abs(d["H2O(l)"] + nu) > 1e-9:
        return None
    return nu


def _check_alkaline_e0(out, la, ra, lb, rb, nu):
    slope, n = nernst_slope(T_STANDARD), ra["n"]
    expected = ra["E0_V"] - slope * PKW_25C * nu / n
    diff = rb["E0_V"] - expected
    text = (f"acid and alkaline forms: E° of {lb} is {rb['E0_V']:g} V, but {la} ({ra['E0_V']:g} V) and "
            f"pKw {PKW_25C} give {ra['E0_V']:g} - {slope:.5f} × {PKW_25C} × {nu:g}/{n:g} = {expected:.4f} V; "
            f"the difference is {diff * 1000:.1f} mV")
    _report(out, lb, "E0_V", diff, text, (ADDITIVITY_WARN_V, ADDITIVITY_ERROR_V), ("", _error_note()))


def _check_alkaline_dedt(out, la, ra, lb, rb, nu):
    da, db, n = ra.get("dEdT_mV_per_K"), rb.get("dEdT_mV_per_K"), ra["n"]
    if not (is_num(da) and is_num(db)):
        return
    dexp = da + nu / n * DELTA_S_WATER / FARADAY * 1000.0
    ddiff = db - dexp
    text = (f"acid and alkaline forms: dE°/dT of {lb} is {db:g} mV/K, {la} and ΔS° of water dissociation "
            f"({DELTA_S_WATER:.2f} J/(mol·K)) give {dexp:.3f} mV/K (difference {ddiff:+.3f} mV/K)")
    _report(out, lb, "dEdT_mV_per_K", ddiff * n, text, (ADDITIVITY_DEDT_WARN, ADDITIVITY_DEDT_ERROR))


def check_acid_alkaline(raw, out):
    """Pairs whose reactions differ by ν (H+ + OH- - H2O): E°alk = E°acid - slope·pKw·ν/n."""
    cps = couples(raw)
    # Two reactions can differ by water's ions only when they hold the same other species (the
    # electrons included): group by that set, so each reaction is compared with its group only
    # (linear in the number of half-reactions; the groups keep the records' order, so the
    # findings come in the same order as comparing every pair).
    groups = {}
    for c in cps:
        groups.setdefault(frozenset(c[4]) - WATER, []).append(c)
    for la, ra, _, _, va in cps:
        for lb, rb, _, _, vb in groups[frozenset(va) - WATER]:
            nu = None if la == lb else _water_nu(va, vb)
            if nu is not None:
                _check_alkaline_e0(out, la, ra, lb, rb, nu)
                _check_alkaline_dedt(out, la, ra, lb, rb, nu)
