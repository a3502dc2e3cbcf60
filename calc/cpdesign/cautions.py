"""The cautions every cathodic-protection design result carries, written once.

Each calculator adds the ones for its method (offshore galvanic anodes, buried galvanic anodes,
impressed current) to the common ones.
"""

#: said beside every design result: the governing standard and a qualified engineer, over-protection
#: (hydrogen embrittlement of high-strength steels, coatings), interference with other structures
COMMON = (
    "Safety-relevant: cathodic protection keeps pipelines, tanks, jetties, ships and offshore structures whose "
    "failure can hurt people and the environment. These are design estimates from published hand methods; the "
    "design is made under the governing standard by a qualified cathodic-protection engineer, who also checks it "
    "by survey after it is energised.",
    "Over-protection harms: potentials more negative than the structure's limit can embrittle high-strength "
    "steels by hydrogen (and some stainless and duplex steels), and can blister or disbond coatings. Check the "
    "anode's closed-circuit potential, or the rectifier setting, against the limit of the standard.",
    "Interference: a cathodic-protection system changes the potentials of other metal in the same soil or water "
    "(pipelines, cables, tanks, piles, sheet piling, moored vessels); where its current leaves such a structure, "
    "that structure corrodes there. Find the neighbouring structures, test them once the system is energised, and "
    "agree bonds or other measures with their owners.",
    "Several design values of the dataset are recalled, not re-read in the standard; each is flagged in its "
    "record and in the sources: check them against the edition in use before relying on them.",
)
#: offshore and marine galvanic-anode design
OFFSHORE = (
    "Offshore and marine structures: design to DNV-RP-B401, ISO 15589-2 (pipelines), EN 12474 or ISO 24656 as "
    "the project requires; their current densities, coating constants and anode data govern over the values here.",
)
#: galvanic anodes for buried structures
BURIED = (
    "Buried structures: design to ISO 15589-1, NACE SP0169 or EN 12954 as applicable; the anode output equation "
    "assumes a soil resistivity above 500 Ω·cm and about 10 ft (3 m) between anode and structure, and measured "
    "soil resistivity along the route governs.",
)
#: impressed-current groundbeds
IMPRESSED = (
    "Impressed current: a groundbed drives far more current through the soil than galvanic anodes and so "
    "interferes more: site it away from other buried metal, and test neighbouring pipelines, cables and tanks.",
    "Electrical safety: rectifiers are mains equipment; anode cables and groundbeds can carry dangerous voltages. "
    "Install to the electrical code with the anode lead and the structure connection the right way round: a "
    "reversed connection makes the structure the anode and corrodes it fast.",
)

#: impressed current inside water storage tanks
TANK = (
    "Drinking water: anodes, wires, fittings and coatings in contact with potable water must be of materials "
    "approved for it under the regulations that apply; design and install them with the water utility.",
    "Ice: where the water can freeze, suspended anodes and their wires are torn away by ice; the handbooks' "
    "freezing-tank example uses anodes fixed to the tank instead (UFC 3-570-02A, Appendix D).",
    IMPRESSED[1],
)

#: method -> its cautions, common ones first
_BY_METHOD = {"offshore": COMMON + OFFSHORE, "buried": COMMON + BURIED, "impressed": COMMON + IMPRESSED,
              "tank": COMMON + TANK,
              "resistivity": ("A Wenner reading gives the average resistivity to a depth about equal to the pin "
                              "spacing; measure at several spacings and along the route, and use the lower "
                              "values for anode output.",)}


def cautions(method):
    """The cautions of one design method, as a list of sentences.

    Args:
        method: ``offshore``, ``buried``, ``impressed``, ``tank`` or ``resistivity`` [unitless]

    Returns:
        list of plain-words cautions

    References:
        Project convention (DESIGN.md, Cautions: keep the existing cautions where work can hurt someone).

    >>> len(cautions("offshore")) == len(COMMON) + len(OFFSHORE)
    True
    """
    return list(_BY_METHOD[method])
