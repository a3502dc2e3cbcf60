"""The Evans diagram of a mixed-potential solution, sampled for a chart: E against log10 |I|.

Each reaction of each electrode gives its branches as lines of points (E [V], log10 of the branch
current scaled by the electrode's area [log10 A]): a Butler–Volmer reaction its anodic branch above
its E_eq and its cathodic branch below it, meeting at (E_eq, log10(i0·A)); a one-slope reaction its
one Tafel line across the whole range (that is how the solver uses it). The sums of every anodic and
of every cathodic partial current of all electrodes are sampled too: the couple point (the mixed
potential and the total anodic current) is where those two lines cross, and each electrode's
free-corrosion point is marked.
Logarithms come from the reactions' ``log10_partials`` (Tafel's logarithmic form), so no point
overflows.

References: U. R. Evans's polarization diagram as drawn in M. G. Fontana, *Corrosion Engineering*,
3rd ed., McGraw-Hill 1986, ch. 9 (from memory), and Callister & Rethwisch 2008, Figs. 16.10-16.11.
"""

import math

from .kinetics import _log10_sum

#: points per branch, and the margin of the potential range beyond the marked potentials [unitless], [V]
CURVE_POINTS = 61
CURVE_MARGIN_V = 0.2


def potential_range(marks, margin=CURVE_MARGIN_V):
    """The potential range of the diagram: every marked potential, with a margin each side.

    Args:
        marks: the potentials to show (E_eq values, the mixed and the free-corrosion potentials) [V]
        margin: the margin each side [V]

    Returns:
        (E_low, E_high) [V]

    References:
        Presentation only (no published method).

    >>> [round(e, 3) for e in potential_range([-0.763, 0.0, -0.486])]
    [-0.963, 0.2]
    """
    return min(marks) - margin, max(marks) + margin


def branch_points(reaction, area_cm2, low, high, branch, points=CURVE_POINTS):
    """One branch of one reaction as chart points: E against log10 of its current on the electrode.

    Args:
        reaction: a :class:`calc.kinetics.Reaction` [unitless]
        area_cm2: the electrode's wetted area [cm²]
        low: lowest potential of the diagram [V]
        high: highest potential of the diagram [V]
        branch: ``"anodic"`` or ``"cathodic"`` [unitless]
        points: number of potentials sampled across the range [unitless]

    Returns:
        a list of ``{"E_V", "log10_I_A"}`` [V, log10 A]

    References:
        Tafel's logarithmic form log10 i = log10 i0 + η/b (Callister & Rethwisch 2008, eq. 16.25).

    >>> from calc.kinetics import Reaction
    >>> h = Reaction("H2", 0.0, 1e-10, None, 0.08, None)
    >>> branch_points(h, 1.0, -0.08, 0.0, "cathodic", 2)
    [{'E_V': -0.08, 'log10_I_A': -9.0}, {'E_V': 0.0, 'log10_I_A': -10.0}]
    """
    both = bool(reaction.b_a and reaction.b_c)
    grid = [low + (high - low) * j / (points - 1) for j in range(points)]
    if both:  # Butler–Volmer: each branch on its own side of E_eq, starting at (E_eq, log10 i0·A)
        side = [e for e in grid if (e > reaction.E_eq_V if branch == "anodic" else e < reaction.E_eq_V)]
        grid = sorted(side + [reaction.E_eq_V]) if low <= reaction.E_eq_V <= high else side
    log_area = math.log10(area_cm2)
    out = []
    for e in grid:
        la, lc = reaction.log10_partials(e)
        value = la if branch == "anodic" else lc
        out.append({"E_V": e, "log10_I_A": value + log_area})
    return out


def total_points(electrodes, low, high, branch, points=CURVE_POINTS):
    """The sum of one direction's partial currents over every reaction of every electrode, as chart points.

    Args:
        electrodes: the electrodes, each a :class:`calc.kinetics.Electrode` [unitless]
        low: lowest potential of the diagram [V]
        high: highest potential of the diagram [V]
        branch: ``"anodic"`` or ``"cathodic"`` [unitless]
        points: number of potentials sampled across the range [unitless]

    Returns:
        a list of ``{"E_V", "log10_I_A"}``: log10 Σ_e A_e·Σ_k i_k of that direction [V, log10 A]

    References:
        Mixed-potential theory: the couple potential is where the total anodic and the total cathodic
        currents are equal (Wagner & Traud 1938, from memory; Mansfeld, Corrosion 27 (1971) 436);
        the sums of the partial currents as the solver forms them (:mod:`calc.kinetics`).

    >>> from calc.kinetics import Electrode, Reaction
    >>> a = Electrode("A", 1.0, (Reaction("H2", 0.0, 1e-6, None, 0.1, None),))
    >>> b = Electrode("B", 9.0, (Reaction("H2", 0.0, 1e-6, None, 0.1, None),))
    >>> total_points([a, b], 0.0, 0.0, "cathodic", 1)
    [{'E_V': 0.0, 'log10_I_A': -5.0}]
    """
    side = 0 if branch == "anodic" else 1
    out = []
    for j in range(points):
        e = low + (high - low) * j / (points - 1) if points > 1 else low
        logs = [r.log10_partials(e)[side] + math.log10(el.area_cm2) for el in electrodes for r in el.reactions]
        out.append({"E_V": e, "log10_I_A": _log10_sum(logs)})
    return out


def evans_diagram(electrodes, E_mixed, anodic_total_A, free):
    """The whole diagram: every branch of every reaction, the couple point and the free-corrosion points.

    Args:
        electrodes: the electrodes, each a :class:`calc.kinetics.Electrode` [unitless]
        E_mixed: the mixed potential [V]
        anodic_total_A: the total anodic current at the mixed potential [A]
        free: per electrode (E_corr [V], i_corr [A/cm²]) or None [V, A/cm²]

    Returns:
        dict with range_V, curves (electrode, reaction, branch, points), totals (branch, count of
        the branches summed, points), exchange_points (electrode, reaction, E_V, log10_I_A: where
        each reaction's lines start, at E_eq and i0 times the area), couple_point,
        free_corrosion_points

    References:
        Evans diagram as drawn by Fontana 1986, ch. 9 (from memory); Callister & Rethwisch 2008,
        Figs. 16.10-16.11.

    >>> from calc.kinetics import Electrode, Reaction
    >>> zn = Electrode("Zn", 1.0, (Reaction("Zn", -0.763, 1e-7, 0.09, None, None),))
    >>> d = evans_diagram([zn], -0.763, 1e-7, [None])
    >>> [round(e, 3) for e in d["range_V"]], len(d["curves"]), d["couple_point"]["log10_I_A"]
    ([-0.963, -0.563], 1, -7.0)
    """
    marks = [r.E_eq_V for el in electrodes for r in el.reactions] + [E_mixed]
    marks += [f[0] for f in free if f is not None]
    low, high = potential_range(marks)
    curves = []
    for el in electrodes:
        for r in el.reactions:
            for branch, slope in (("anodic", r.b_a), ("cathodic", r.b_c)):
                if slope:
                    curves.append({"electrode": el.name, "reaction": r.name, "branch": branch,
                                   "points": branch_points(r, el.area_cm2, low, high, branch)})
    points = [{"electrode": el.name, "E_V": f[0], "log10_I_A": math.log10(f[1] * el.area_cm2)}
              for el, f in zip(electrodes, free) if f is not None and f[1] > 0.0]
    totals = []
    for branch in ("anodic", "cathodic"):
        count = sum(1 for c in curves if c["branch"] == branch)
        if count:
            totals.append({"branch": branch, "count": count, "points": total_points(electrodes, low, high, branch)})
    exchange = [{"electrode": el.name, "reaction": r.name, "E_V": r.E_eq_V,
                 "log10_I_A": math.log10(r.i0) + math.log10(el.area_cm2)} for el in electrodes for r in el.reactions]
    return {"range_V": [low, high], "curves": curves, "totals": totals, "exchange_points": exchange,
            "couple_point": {"E_V": E_mixed, "log10_I_A": math.log10(anodic_total_A)},
            "free_corrosion_points": points}
