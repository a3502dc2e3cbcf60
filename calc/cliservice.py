"""The command-line options of a joint's service conditions and of a CP test post's readings, written once.

``joint``, ``matrix`` and ``measured`` take the service conditions of :mod:`calc.service` (each one
the entry point does not already get from another option); ``cp`` takes the other readings of the
test post and the way the IR drop of an on reading was considered (:mod:`calc.field.onreading`).
:mod:`calc.cli` adds the options and puts what was given into the request; calc decides what is
allowed (the bounds of :mod:`calc.bounds`, the words of the entry points).
"""

from .field.measured import MEASURED_SERVICE
from .matrix import MATRIX_SERVICE
from .o2supply import GEOMETRIES
from .oxygen import O2_SATURATION_MULTIPLE_MAX
from .service import AERATIONS, SERVICE_FIELDS

#: what is not given is the environment's (data/service_defaults.yaml), except where said here
DEFAULT_WORDS = "default the environment's"
OTHER_DEFAULTS = {"o2_mg_L": "default air saturation, or the environment's aeration",
                  "conductivity_S_per_m": "default the environment's, or from the salinity (PSS-78)",
                  "anode_area_cm2": "not given: no electrolyte-resistance term"}
#: request field -> (option, metavar, words, bound name in calc.bounds or None); options named as cli's others
SERVICE_OPTIONS = {
    "temp_C": ("--temp", "C", "service temperature [°C]", "temp_C"),
    "salinity": ("--salinity", "S", "salinity [g/kg]", "salinity"),
    "chloride_mg_per_L": ("--chloride", "MG_PER_L", "chloride instead of salinity [mg/L]", "chloride_mg_per_L"),
    "o2_mg_L": ("--o2", "MG_PER_L", f"dissolved oxygen measured [mg/L]; from 0 to {O2_SATURATION_MULTIPLE_MAX:g} "
                f"times air saturation at the service temperature and salinity, instead of --aeration", None),
    "aeration": ("--aeration", "WORD", "oxygen without a measurement: " + " or ".join(AERATIONS), None),
    "velocity_m_s": ("--velocity", "M_PER_S", "flow velocity [m/s]", "velocity_m_s"),
    "geometry": ("--geometry", "NAME", "what the flow acts on: " + ", ".join(GEOMETRIES)
                 + " (pipe needs --diameter, surface --length)", None),
    "diameter_m": ("--diameter", "M", "inside diameter of the pipe [m]", "diameter_m"),
    "length_m": ("--length", "M", "length of the surface in the flow direction [m]", "length_m"),
    "pH": ("--pH", "X", "pH of the water [unitless]", "pH"),
    "conductivity_S_per_m": ("--conductivity", "S_PER_M", "electrolyte conductivity at the service temperature [S/m]",
                             "conductivity_S_per_m"),
    "anode_area_cm2": ("--anode-area", "CM2", "wetted area of the anode, for the electrolyte-resistance term [cm²]",
                       "anode_area_cm2"),
}
#: command -> the service fields it takes as options here (measured has --temp, --salinity, --chloride already)
COMMAND_FIELDS = {"joint": SERVICE_FIELDS, "matrix": MATRIX_SERVICE, "measured": MEASURED_SERVICE}
#: the ways an IR drop may be considered (ids of data/cp_criteria.yaml ir_drop_methods; calc checks the value)
IR_METHOD_WORDS = "none, measured (with --ir-drop), history, characteristics or evidence"
#: request field of cp -> (option, metavar, words, bound name or None)
POST_OPTIONS = {
    "on_V": ("--on-reading", "V", "the on reading beside an instant-off one [V vs electrode]", "reading_V"),
    "native_V": ("--native-reading", "V", "the native (depolarised) potential, instead of --polarisation "
                                          "[V vs electrode]", "reading_V"),
    "ir_drop_method": ("--ir-drop-method", "NAME", "how the IR drop of an on reading was considered: "
                       + IR_METHOD_WORDS, None),
    "ir_drop_mV": ("--ir-drop", "MV", "the IR drop measured or calculated, subtracted from the on reading [mV]",
                   "ir_drop_mV"),
    "unit": ("--unit", "V|mV", "unit of the potentials in the texts (the numbers stay in V and mV)", None),
}
#: the fields that take a word; every other option takes a number
WORD_FIELDS = ("aeration", "geometry", "ir_drop_method", "unit")
#: prefix of the argparse destinations of these options (no other option of the command line uses it)
DEST = "sv__"


def _help(words, bound_name, bound, extra=""):
    text = bound(words, bound_name, extra) if bound_name else words + (f"; {extra}" if extra else "")
    return text.replace("%", "%%")


def add_service_options(parser, command, number, bound):
    """Add a command's service-condition options (or, for ``cp``, the test post's) to its parser.

    Args:
        parser: the command's argparse parser [unitless]
        command: ``joint``, ``matrix``, ``measured`` or ``cp`` [unitless]
        number: the argparse type that reads one number (the project's number rule) [unitless]
        bound: ``(words, bound name, extra) -> help`` with the bound's interval and unit [unitless]

    Returns:
        the request fields added, in the order of the entry point's fields

    References:
        Project convention (DESIGN.md: the command line and the page call the same entry points).

    >>> import argparse
    >>> add_service_options(argparse.ArgumentParser(), "cp", float, lambda w, n, e="": w)
    ['on_V', 'native_V', 'ir_drop_method', 'ir_drop_mV', 'unit']
    """
    table = POST_OPTIONS if command == "cp" else {k: SERVICE_OPTIONS[k] for k in COMMAND_FIELDS[command]}
    water = parser.add_mutually_exclusive_group() if "salinity" in table else None
    for field, (flag, metavar, words, bound_name) in table.items():
        extra = "" if command == "cp" else OTHER_DEFAULTS.get(field, DEFAULT_WORDS)
        target = water if field in ("salinity", "chloride_mg_per_L") else parser
        target.add_argument(flag, dest=DEST + field, type=str if field in WORD_FIELDS else number, metavar=metavar,
                            default=None, help=_help(words, bound_name, bound, extra))
    return list(table)


def service_request(ns):
    """The request fields of these options that were given on the command line.

    Args:
        ns: the parsed command line (argparse namespace) [unitless]

    Returns:
        dict request field -> value, in the order the options were added

    References:
        Project convention (an option not given leaves its field out of the request).

    >>> import argparse
    >>> service_request(argparse.Namespace(sv__temp_C=5.0, sv__pH=None, json=True))
    {'temp_C': 5.0}
    """
    return {key[len(DEST):]: value for key, value in vars(ns).items() if key.startswith(DEST) and value is not None}
