"""Electrode kinetics and the mixed-potential (Evans) solution of electrodes connected metallically.

Sign convention: a current density is positive when anodic (oxidation), negative when cathodic;
the overpotential of a reaction is η = E − E_eq [V]; Tafel slopes b [V/decade] are positive.

Models, each one function whose body is its equation:

- Tafel branch (:func:`tafel`): i = i0·10^(η/b), the inverse of η = b·log10(i/i0) (W. D. Callister and
  D. G. Rethwisch, *Fundamentals of Materials Science and Engineering*, 3rd ed., Wiley 2008, eq. 16.25).
- Butler–Volmer written with Tafel slopes (:func:`butler_volmer`): i = i0·(10^(η/b_a) − 10^(−η/b_c)),
  b = 2.303·R·T/(α·n·F) (A. J. Bard and L. R. Faulkner, *Electrochemical Methods*, 2nd ed., Wiley
  2001, eq. 3.4.11, from memory; D. A. Jones, *Principles and Prevention of Corrosion*, 2nd ed.,
  1996, ch. 3, from memory).
- a cathodic branch with a diffusion limit (:func:`diffusion_limited`): 1/i = 1/i_act + 1/i_L, the
  Koutecký–Levich combination (Bard & Faulkner 2001, section 9.3); it is also the cathodic Tafel
  region of Bard & Faulkner eq. 3.4.27 solved for i (from memory). Only the cathodic branch is
  limited; an anodic branch of metal dissolution is not.

A reaction given one Tafel slope runs only in that direction (a Tafel line at every potential);
given both it follows Butler–Volmer, its cathodic part limited by i_L when i_L is given.

Mixed-potential theory (C. Wagner and W. Traud, Z. Elektrochem. 44 (1938) 391, from memory; the
area relationships of F. Mansfeld, Corrosion 27 (1971) 436): electrodes connected metallically, with
no IR drop in the electrolyte, share one potential E at which Σ_electrodes A·Σ_reactions i(E) = 0.
Every term rises with E, so the root is unique when at least one reaction can run anodically and
one cathodically. :func:`mixed_potential` brackets it from the equilibrium potentials and bisects on
log10(Σ anodic currents) − log10(Σ cathodic currents), Tafel's logarithmic form, so no power of ten
overflows for any accepted input; the currents at the root come from the model functions.

The JSON entry point ``mixed`` (request, result, checks) is :mod:`calc.mixed`; the sampled Evans
diagram is :mod:`calc.evans`.
"""

import math
from dataclasses import dataclass

from .errors import InputError

#: the mixed potential is sought at most this far beyond the range of the equilibrium potentials [V]
SPAN_V = 10.0
#: current densities at a solution above this are outside what the model describes in water [A/cm²]
I_RESULT_MAX = 1.0e6


def tafel(i0, eta, b):
    """One Tafel branch: the partial current density of one direction of a reaction.

    Args:
        i0: exchange current density [A/cm²]
        eta: overpotential in the branch's own direction (η anodic, −η cathodic) [V]
        b: Tafel slope of that direction, positive [V/decade]

    Returns:
        the partial current density, positive [A/cm²]

    References:
        Callister & Rethwisch 2008, eq. 16.25 (η = ±b·log10(i/i0)), solved for i.

    >>> round(tafel(1e-7, 0.2, 0.1), 12)
    1e-05
    """
    return i0 * 10.0 ** (eta / b)


def log10_tafel(i0, eta, b):
    """One Tafel branch in its logarithmic form, log10 i = log10 i0 + η/b (never overflows).

    Args:
        i0: exchange current density [A/cm²]
        eta: overpotential in the branch's own direction [V]
        b: Tafel slope of that direction, positive [V/decade]

    Returns:
        log10 of the partial current density [log10(A/cm²)]

    References:
        Callister & Rethwisch 2008, eq. 16.25.

    >>> round(log10_tafel(1e-7, 0.2, 0.1), 9)
    -5.0
    """
    return math.log10(i0) + eta / b


def butler_volmer(i0, eta, b_a, b_c):
    """Net current density of a reaction by Butler–Volmer, written with its two Tafel slopes.

    Args:
        i0: exchange current density [A/cm²]
        eta: overpotential E − E_eq [V]
        b_a: anodic Tafel slope, positive [V/decade]
        b_c: cathodic Tafel slope, positive [V/decade]

    Returns:
        the net current density, positive anodic [A/cm²]

    References:
        Bard & Faulkner 2001, eq. 3.4.11 with b = 2.303·R·T/(α·n·F) (from memory); Jones 1996, ch. 3.

    >>> butler_volmer(1e-6, 0.0, 0.1, 0.1)
    0.0
    >>> round(butler_volmer(1e-6, 0.1, 0.1, 0.1) * 1e6, 6)
    9.9
    """
    return i0 * (10.0 ** (eta / b_a) - 10.0 ** (-eta / b_c))


def diffusion_limited(i_act, i_lim):
    """A cathodic current density under mixed activation and diffusion control, 1/i = 1/i_act + 1/i_L.

    Args:
        i_act: the activation-controlled (Tafel) cathodic current density, positive [A/cm²]
        i_lim: the diffusion-limited current density, positive [A/cm²]

    Returns:
        the cathodic current density, positive [A/cm²]

    References:
        Koutecký–Levich combination, Bard & Faulkner 2001, section 9.3; the cathodic Tafel region of
        their eq. 3.4.27 solved for i (from memory).

    >>> round(diffusion_limited(1e-3, 1e-5) * 1e5, 6)
    0.990099
    """
    return 1.0 / (1.0 / i_act + 1.0 / i_lim)


def _log10_sum(logs):
    """log10 of Σ 10^l over finite l, without overflow; −inf for none."""
    logs = [v for v in logs if v != -math.inf]
    if not logs:
        return -math.inf
    top = max(logs)
    return top + math.log10(sum(10.0 ** (v - top) for v in logs))


@dataclass(frozen=True)
class Reaction:
    """One electrode reaction: E_eq [V], i0 [A/cm²], slopes [V/decade] (None: that direction absent),
    i_lim [A/cm²] (None: no diffusion limit)."""

    name: str
    E_eq_V: float
    i0: float
    b_a: float
    b_c: float
    i_lim: float

    def log10_partials(self, E):
        """log10 of the anodic and the cathodic partial current densities at E (−inf: absent)."""
        eta = E - self.E_eq_V
        la = log10_tafel(self.i0, eta, self.b_a) if self.b_a else -math.inf
        lc = log10_tafel(self.i0, -eta, self.b_c) if self.b_c else -math.inf
        if self.b_c and self.i_lim:  # log form of diffusion_limited: l_act + l_L − log10(10^l_act + 10^l_L)
            ll = math.log10(self.i_lim)
            lc = lc + ll - _log10_sum([lc, ll])
        return la, lc

    def current_density(self, E):
        """Net current density at E [A/cm²], positive anodic, from the model functions."""
        eta = E - self.E_eq_V
        if self.b_a and self.b_c and not self.i_lim:
            return butler_volmer(self.i0, eta, self.b_a, self.b_c)
        anodic = tafel(self.i0, eta, self.b_a) if self.b_a else 0.0
        if not self.b_c:
            return anodic
        if not self.i_lim:
            return anodic - tafel(self.i0, -eta, self.b_c)
        try:  # an activation current beyond a double is infinitely fast: the limit alone remains
            activation = tafel(self.i0, -eta, self.b_c)
        except OverflowError:
            activation = math.inf
        return anodic - (diffusion_limited(activation, self.i_lim) if activation > 0.0 else 0.0)

    def model(self):
        """The equation this reaction follows, in words."""
        if self.b_a and self.b_c:
            words = "Butler–Volmer i = i0·(10^(η/b_a) − 10^(−η/b_c))"
        elif self.b_a:
            words = "anodic Tafel branch i = i0·10^(η/b_a)"
        else:
            words = "cathodic Tafel branch i = −i0·10^(−η/b_c)"
        return words + (", cathodic part limited by 1/i = 1/i_act + 1/i_L" if self.b_c and self.i_lim else "")


@dataclass(frozen=True)
class Electrode:
    """One electrode: a name, its wetted area [cm²] and its reactions."""

    name: str
    area_cm2: float
    reactions: tuple


def _balance(electrodes, E):
    """log10(Σ anodic currents) − log10(Σ cathodic currents) at E [decades]; rises with E."""
    anodic, cathodic = [], []
    for el in electrodes:
        la_area = math.log10(el.area_cm2)
        for r in el.reactions:
            la, lc = r.log10_partials(E)
            anodic.append(la + la_area)
            cathodic.append(lc + la_area)
    return _log10_sum(anodic) - _log10_sum(cathodic)


def can_balance(electrodes):
    """True when some reaction can run anodically and some cathodically (a mixed potential exists).

    Args:
        electrodes: the electrodes, each an :class:`Electrode` [unitless]

    Returns:
        True or False

    References:
        Mixed-potential theory (Wagner & Traud 1938, from memory): the anodic and the cathodic
        currents must be able to balance.

    >>> zn = Reaction("Zn", -0.763, 1e-7, 0.09, None, None)
    >>> can_balance([Electrode("Zn", 1.0, (zn,))])
    False
    """
    reactions = [r for el in electrodes for r in el.reactions]
    return any(r.b_a for r in reactions) and any(r.b_c for r in reactions)


def mixed_potential(electrodes):
    """The potential at which the currents of metallically connected electrodes balance.

    Args:
        electrodes: the electrodes, each an :class:`Electrode`, at one potential (no IR drop) [unitless]

    Returns:
        (E [V, on the scale of the E_eq given], number of halvings [unitless])

    References:
        Mixed-potential theory (Wagner & Traud 1938, from memory; Mansfeld 1971); bisection on a
        bracket in which the monotone balance changes sign.

    >>> zn = Reaction("Zn", -0.763, 1e-7, 0.09, None, None)
    >>> h = Reaction("H2", 0.0, 1e-10, None, 0.08, None)
    >>> round(mixed_potential([Electrode("Zn", 1.0, (zn, h))])[0], 4)
    -0.4861
    """
    if not can_balance(electrodes):
        raise InputError("electrodes", "(no anodic or no cathodic reaction)",
                         "at least one reaction with b_anodic_V and one with b_cathodic_V, so that the "
                         "currents can balance")
    e_eq = [r.E_eq_V for el in electrodes for r in el.reactions]
    lo, hi = min(e_eq), max(e_eq)
    for sign in (-1.0, 1.0):  # widen each end, doubling the step, until the balance changes sign
        step = 0.25
        while sign * _balance(electrodes, lo if sign < 0 else hi) <= 0.0:
            if sign < 0:
                lo -= step
            else:
                hi += step
            step *= 2.0
            if lo < min(e_eq) - SPAN_V or hi > max(e_eq) + SPAN_V:
                raise InputError("electrodes", "(these kinetics)", f"kinetics whose currents balance within "
                                 f"{SPAN_V:g} V of the equilibrium potentials given", "check the slopes and i0")
    halvings = 0
    while halvings < 200:
        mid = 0.5 * (lo + hi)
        if mid <= lo or mid >= hi:
            break
        if _balance(electrodes, mid) < 0.0:
            lo = mid
        else:
            hi = mid
        halvings += 1
    best = min((lo, hi), key=lambda e: abs(_balance(electrodes, e)))
    return best, halvings


def check_currents(electrodes, E):
    """Refuse a solution whose current densities are beyond anything in water (before any is computed).

    Args:
        electrodes: the electrodes, each an :class:`Electrode` [unitless]
        E: the potential of the solution [V]

    Returns:
        None; raises :class:`calc.errors.InputError` when a partial current density exceeds I_RESULT_MAX

    References:
        Project input rule (DESIGN.md: bad input gets a clear message, never a wrong number).

    >>> check_currents([Electrode("Zn", 1.0, (Reaction("Zn", -0.763, 1e-7, 0.09, None, None),))], -0.4)
    """
    top = math.log10(I_RESULT_MAX)
    for el in electrodes:
        for r in el.reactions:
            if max(r.log10_partials(E)) > top:
                raise InputError("electrodes", f"(reaction {r.name!r} of {el.name!r})",
                                 f"kinetics whose current densities stay below {I_RESULT_MAX:g} A/cm² at the "
                                 "potential they settle at",
                                 "far beyond any electrode in water: check i0 and the slopes")


def dissolution_density(electrode, E):
    """The anodic attack on an electrode at E: the sum of its net-anodic reaction current densities.

    Args:
        electrode: an :class:`Electrode` [unitless]
        E: its potential [V]

    Returns:
        the attack, its metal dissolution when its anodic reactions are its metal's [A/cm²]

    References:
        Mansfeld, Corrosion 27 (1971) 436, abstract: the dissolution rate of the anode (i_dA) is not its
        galvanic current density; its own cathodic reaction runs beside the dissolution.

    >>> zn = Reaction("Zn", -0.763, 1e-7, 0.09, None, None)
    >>> h = Reaction("H2", 0.0, 1e-10, None, 0.08, None)
    >>> round(dissolution_density(Electrode("Zn", 1.0, (zn, h)), -0.763) * 1e7, 6)
    1.0
    """
    return sum(max(r.current_density(E), 0.0) for r in electrode.reactions)


def free_corrosion(electrode):
    """The free-corrosion potential and rate of one electrode on its own, or None when it has none.

    Args:
        electrode: an :class:`Electrode` [unitless]

    Returns:
        (E_corr [V], i_corr [A/cm²]: the sum of its net-anodic reaction current densities), or None

    References:
        Mixed-potential theory (Wagner & Traud 1938, from memory); Callister & Rethwisch 2008,
        Example Problem 16.2.

    >>> zn = Reaction("Zn", -0.763, 1e-7, 0.09, None, None)
    >>> h = Reaction("H2", 0.0, 1e-10, None, 0.08, None)
    >>> e, i = free_corrosion(Electrode("Zn", 1.0, (zn, h)))
    >>> round(e, 3), round(i * 1e4, 2)
    (-0.486, 1.19)
    """
    if not can_balance([electrode]):
        return None
    E, _ = mixed_potential([electrode])
    check_currents([electrode], E)
    return E, dissolution_density(electrode, E)
