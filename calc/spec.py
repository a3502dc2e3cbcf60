"""What the page needs to know of the engine besides the data: bounds and opening requests.

Each calculator page opens with a demonstration request (a scenario of our own, not a check
against any published value). :data:`OPENINGS` holds each one exactly as the page's form sends
it when opened with no parameters; :data:`FORM` holds the values its form shows in fields that
request does not send (the pH field of a pair that needs no pH). The build writes both, with the
bounds of :mod:`calc.bounds`, to ``assets/data/spec.json`` (:func:`page_spec`); the page fills its
forms from it, the build computes their answers in advance from it
(``sitebuild/precompute.py``), and ``couplewise example NAME`` prints one.
"""

import copy

from . import bounds

#: calculator name -> the request its page sends on opening (demonstration values, ours)
OPENINGS = {
    "couple": {"a": "Zn2+/Zn", "b": "Cu2+/Cu", "temp_C": 35.0, "activities": {"Zn2+": 1e-05, "Cu2+": 1e-06},
               "pressures": {}},
    "electrode": {"id": "Zn2+/Zn", "temp_C": 30.0, "activities": {"Zn2+": 2e-06}},
    "convert": {"from": "Ag/AgCl seawater", "to": "CSE", "value_V": -0.93, "temp_C": 18.0},
    "activity": {"species": "Zn2+", "model": "extended", "ionic_strength": 0.02, "temp_C": 40.0},
    "joint": {"a": "aluminium-5083", "b": "stainless-316-passive", "env": "seawater-quiescent", "area_ratio": 0.2},
    "matrix": {"env": "seawater-quiescent",  # materials in the dataset's order, as the page's picker keeps them
               "materials": ["titanium", "stainless-316-passive", "stainless-316-active", "nickel-aluminium-bronze",
                             "cuni-90-10", "copper", "carbon-steel", "cast-iron", "aluminium-5083", "zinc"]},
}

#: calculator name -> values shown in fields that its opening request does not send
FORM = {
    "couple": {"pH": 6.5},
    "electrode": {"pH": 7.8},
    "convert": {"pH": 7.0},
}


def opening(name):
    """A calculator's opening request (a copy, safe to change).

    Args:
        name: calculator name, e.g. ``couple`` [unitless]

    Returns:
        the request dict

    References:
        Project convention (demonstration inputs, not a published example).

    >>> opening("convert")["to"]
    'CSE'
    """
    return copy.deepcopy(OPENINGS[name])


def page_spec():
    """The page's copy of the bounds and the opening requests, as plain JSON-ready data.

    Returns:
        ``{"bounds": {...}, "openings": {...}, "form": {...}}``

    References:
        Project convention (DESIGN.md: one rule, one place; nothing parses JavaScript as text).

    >>> sorted(page_spec())
    ['bounds', 'form', 'openings']
    """
    return {"bounds": bounds.as_data(), "openings": copy.deepcopy(OPENINGS), "form": copy.deepcopy(FORM)}
