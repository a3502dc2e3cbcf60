"""How a CP judgement is worded: the states of a reading, potentials in the user's unit, margins.

The states are this project's own words. A reading taken with the protective current applied
("on") includes the IR drop, so it may meet the value of a criterion stated for the polarised
(IR-free) potential without showing protection: it is then *unconfirmed*, a state of its own,
neither protected nor not protected, until an instant-off reading (or a criterion that admits on
readings, with the IR drop considered) decides.

A margin is worded as what it is: a reading more negative than a protection criterion by so
much, short of it by so much, or beyond a negative limit by so much; never a signed number the
reader has to interpret.
"""

from ..derivation import fmt

#: state -> (word shown, what it means) [unitless]
STATES = {
    "protected": ("Protected", "a criterion that admits this kind of reading is met"),
    "unconfirmed": ("Unconfirmed", "an on reading meets the value of a criterion that needs the polarised "
                                   "potential (or the IR drop considered): its IR drop may account for that, so "
                                   "protection is neither shown nor ruled out"),
    "not protected": ("Not protected", "no criterion that applies is met"),
    "over-protected": ("Over-protected", "beyond the negative limit"),
}
#: the units a judgement can be worded in (None: potentials in V, shifts in mV, as published)
UNITS = (None, "V", "mV")
#: a margin smaller than this is worded as lying on the value [V]
ON_THE_VALUE_V = 0.0005


def potential_text(value_V, unit=None):
    """A potential as the texts show it, in the user's unit.

    Args:
        value_V: the potential [V]
        unit: ``V``, ``mV`` or None (V) [unitless]

    Returns:
        text such as ``-0.912 V`` or ``-912 mV``

    References:
        Presentation only (no published method).

    >>> potential_text(-0.912), potential_text(-0.912, "mV")
    ('-0.912 V', '-912 mV')
    """
    if unit == "mV":
        return f"{fmt(round(value_V * 1000.0, 1), 4)} mV"
    return f"{fmt(value_V, 3)} V"


def shift_text(value_mV, unit=None):
    """A potential shift (polarisation, IR drop) as the texts show it, in the user's unit.

    Args:
        value_mV: the shift [mV]
        unit: ``V``, ``mV`` or None (mV, as the criteria are published) [unitless]

    Returns:
        text such as ``120 mV`` or ``0.120 V``

    References:
        Presentation only (no published method).

    >>> shift_text(120.0), shift_text(120.0, "V")
    ('120 mV', '0.120 V')
    """
    if unit == "V":
        return f"{value_mV / 1000.0:.3f} V"
    return f"{fmt(value_mV)} mV"


def _amount(margin_V, unit):
    return f"{abs(margin_V) * 1000.0:.0f} mV" if unit == "mV" else f"{abs(margin_V):.3f} V"


def margin_text(role, margin_V, unit=None):
    """A margin worded as what it is, never as a signed number.

    Args:
        role: ``protection`` (margin = criterion − reading: positive when the reading is more
            negative) or ``limit`` (margin = reading − limit: negative beyond the limit) [unitless]
        margin_V: the margin [V]
        unit: ``V``, ``mV`` or None (V) [unitless]

    Returns:
        text

    References:
        Presentation only (no published method); limits inclusive as in
        :mod:`calc.field.protection`.

    >>> margin_text("protection", 0.062)
    '0.062 V more negative than the criterion'
    >>> margin_text("protection", -0.021, "mV")
    '21 mV short of the criterion (less negative)'
    >>> margin_text("limit", -0.12)
    '0.120 V more negative than the limit: beyond it'
    >>> margin_text("limit", 0.25)
    '0.250 V less negative than the limit: within it'
    """
    if abs(margin_V) < ON_THE_VALUE_V:
        return "on the criterion" if role == "protection" else "on the limit: within it"
    amount = _amount(margin_V, unit)
    if role == "protection":
        return f"{amount} more negative than the criterion" if margin_V > 0 else \
            f"{amount} short of the criterion (less negative)"
    return f"{amount} less negative than the limit: within it" if margin_V > 0 else \
        f"{amount} more negative than the limit: beyond it"


def ir_text(kind, ir_needed, admits_on=False, method_name=None):
    """What the kind of reading means for the IR drop, in words.

    Args:
        kind: ``on`` or ``instant-off`` [unitless]
        ir_needed: whether a criterion used needs the IR-free potential [unitless]
        admits_on: whether a criterion of the structure and setting admits on readings [unitless]
        method_name: how the IR drop of the on reading was considered, or None [unitless]

    Returns:
        text

    References:
        49 CFR 192 Appendix D, Sections II and III; UFC 3-570-06 (2003) 6-3.1.1 and Chapter 7;
        common practice.

    >>> ir_text("instant-off", True).startswith("Given: an instant-off reading")
    True
    """
    if kind != "on":
        return ("Given: an instant-off reading, taken at the instant the protective current was interrupted, before "
                "the structure depolarises. It is free of the IR drop of the interrupted current, but not of currents "
                "that kept flowing (other rectifiers, bonded galvanic anodes, stray or telluric currents).")
    ir = ("Given: an on reading, taken with the protective current flowing. It includes the IR drop: the voltage "
          "lost by that current in the soil or water between the structure and the electrode, which makes the "
          "reading more negative than the structure's polarised potential. ")
    if not ir_needed:
        ir += "The criteria used here are stated for the on potential."
    else:
        ir += ("The criteria used here need the IR-free (polarised) potential: interrupt the current (switch the "
               "rectifier or disconnect the anodes) and read at that instant, before the structure depolarises "
               "(instant-off), or use a coupon. From an on reading a criterion that is not met is conclusive; one "
               "that is met is not, and a reading beyond the negative limit may be IR drop only.")
    if admits_on:
        ir += (f" The IR drop was considered: {method_name}." if method_name else
               " One criterion here admits an on reading if its IR drop is considered: say how it was.")
    return ir


def verdict_text(verdict, conclusive, implausible, reasons, admits_on=False):
    """The verdict in words, with what it rests on (an implausible reading is never conclusive).

    Args:
        verdict: a state of :data:`STATES` [unitless]
        conclusive: whether the reading decides it [unitless]
        implausible: whether the reading is implausible [unitless]
        reasons: the texts of the criteria it rests on [unitless]
        admits_on: whether a criterion here admits an on reading with its IR drop considered [unitless]

    Returns:
        text

    References:
        The states of this module (a decision of this project).

    >>> verdict_text("unconfirmed", False, False, []).startswith("Unconfirmed: this on reading")
    True
    """
    word, because = STATES[verdict][0], " ".join(reasons)
    if verdict == "unconfirmed":
        return ("Unconfirmed: this on reading meets the value of a criterion only with its IR drop included, which "
                "does not show protection: take an instant-off reading"
                + (", or say how the IR drop was considered (a criterion here admits on readings then)"
                   if admits_on else "") + ". " + because)
    if verdict == "over-protected" and not conclusive:
        return (f"{word} on this on reading, which may be IR drop only: take an instant-off reading to see whether "
                "the polarised potential is beyond the limit. " + because)
    if implausible:
        return f"{word} as read, but the reading is implausible (see the warnings). " + because
    return f"{word}. " + because


def verdict_label(verdict, conclusive, kind):
    """The short label of a verdict.

    Args:
        verdict: a state of :data:`STATES` [unitless]
        conclusive: whether the reading decides it [unitless]
        kind: ``on`` or ``instant-off`` [unitless]

    Returns:
        text

    References:
        The states of this module.

    >>> verdict_label("unconfirmed", False, "on"), verdict_label("protected", True, "instant-off")
    ('unconfirmed (on reading, IR drop included)', 'protected')
    """
    if verdict == "unconfirmed":
        return "unconfirmed (on reading, IR drop included)"
    return verdict if conclusive else f"{verdict} (not conclusive: {kind} reading)"
