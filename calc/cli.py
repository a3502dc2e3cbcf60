"""The ``couplewise`` command line: a thin face over :mod:`calc.api`.

Human text by default, ``--json`` for one JSON object on stdout. Bad input of any kind: exit
status 2 and one line on stderr naming the field, the value and what is allowed.
"""

import argparse
import json
import re
import sys

from . import api, clicp, cliservice, dataset
from .activity import MODELS
from .bounds import BOUNDS
from .errors import DataError, InputError
from .clitext import format_text
from .numbers import NumberError, read_number
from .spec import OPENINGS

def _one_line(message, word_max=60):
    """An argparse message as one short line: control characters escaped, long words cut."""
    message = message.replace("\r", "\\r").replace("\n", "\\n")
    return re.sub(r"\S{%d,}" % (word_max + 1), lambda m: m.group(0)[:word_max] + f"… ({len(m.group(0))} characters)",
                  message)


class _Parser(argparse.ArgumentParser):
    def __init__(self, *args, **kwargs):
        kwargs.setdefault("allow_abbrev", False)  # "--pH" must not pass for "--pH-values"
        super().__init__(*args, **kwargs)

    def error(self, message):  # one line, exit 2, no usage dump
        message = _one_line(message)  # arguments are echoed in it: keep it one short line
        sys.stderr.write(f"couplewise: {message} (see 'couplewise {self.prog.split()[-1]} --help')\n"
                         if " " in self.prog else f"couplewise: {message} (see 'couplewise --help')\n")
        sys.exit(2)


def _number(text):
    """An option's number, read by the one rule (calc.numbers): argparse's type for every number."""
    try:
        return read_number(text)
    except NumberError as exc:
        raise argparse.ArgumentTypeError(str(exc)) from None


def _bound(words, name, extra=""):
    """An option's help: its words, then what calc allows (calc.bounds, the page's hints too)."""
    b = BOUNDS[name]
    low = "" if b.low is None else ("above " if b.low_open else "from ") + f"{b.low:g}"
    high = "" if b.high is None else (", up to " if b.low_open else " to ") + f"{b.high:g}"
    return f"{words}; {low}{high}{(' ' + b.unit) if b.unit else ''}" + (f", {extra}" if extra else "")


def _pairs(values, field, number=True):
    out = {}
    for item in values or []:
        if "=" not in item:
            raise InputError(field, item, "SPECIES=VALUE, e.g. Zn2+=0.1")
        key, _, val = item.partition("=")
        if number:
            out[key.strip()] = read_number(val, field=f"{field} {key.strip()}")
        else:
            out[key.strip()] = val
    return out


def _conditions(p, with_pH=True):
    p.add_argument("--temp", type=_number, default=None, metavar="C", help=_bound("temperature [°C]", "temp_C", "default 25"))
    p.add_argument("--activity", action="append", metavar="SP=A", help=_bound("activity of a species [unitless]", "activity"))
    p.add_argument("--molality", action="append", metavar="SP=M", help=_bound("molality of a species [mol/kg]", "molality"))
    g = p.add_mutually_exclusive_group()
    g.add_argument("--ionic-strength", type=_number, metavar="I", help=_bound("ionic strength [mol/kg]", "ionic_strength"))
    g.add_argument("--env", metavar="ENV", help="take the ionic strength from a named environment")
    p.add_argument("--model", metavar="NAME", help="activity model: " + ", ".join(MODELS))
    if with_pH:
        p.add_argument("--pH", type=_number, dest="pH", metavar="X", help=_bound("pH (sets a(H+) and a(OH-))", "pH"))
    else:
        p.set_defaults(pH=None)
    p.add_argument("--pressure", action="append", metavar="GAS=ATM", help=_bound("partial pressure of a gas [atm]", "pressure_atm"))


def _conditions_request(ns):
    req = {}
    if ns.temp is not None:
        req["temp_C"] = ns.temp
    for opt, key, field in (("activity", "activities", "--activity"), ("molality", "molalities", "--molality"),
                            ("pressure", "pressures", "--pressure")):
        vals = _pairs(getattr(ns, opt), field)
        if vals:
            req[key] = vals
    if ns.ionic_strength is not None:
        req["ionic_strength"] = ns.ionic_strength
    if ns.env:
        req["env"] = ns.env
    if ns.model:
        req["model"] = ns.model
    if ns.pH is not None:
        req["pH"] = ns.pH
    return req


def _water_options(p):
    g = p.add_mutually_exclusive_group()
    g.add_argument("--salinity", type=_number, metavar="S", help=_bound("salinity [g/kg]", "salinity"))
    g.add_argument("--chloride", type=_number, metavar="MG_PER_L", help=_bound("chloride instead of salinity [mg/L]", "chloride_mg_per_L"))


def _water_request(ns, req):
    if ns.salinity is not None:
        req["salinity"] = ns.salinity
    if ns.chloride is not None:
        req["chloride_mg_per_L"] = ns.chloride
    if ns.temp is not None:
        req["temp_C"] = ns.temp
    return req


def build_parser():
    """The argument parser with every sub-command."""
    p = _Parser(prog="couplewise", description="Galvanic couples, electrode potentials and joints, offline.")
    sub = p.add_subparsers(dest="command", parser_class=_Parser)

    e = sub.add_parser("electrode", help="corrected potential of one half-reaction")
    e.add_argument("id")
    _conditions(e)
    c = sub.add_parser("couple", help="which couple is the anode, cell potential, ΔG, K")
    c.add_argument("a")
    c.add_argument("b")
    _conditions(c)
    ep = sub.add_parser("eph", help="potentials of half-reactions across pH (the lines of an E–pH chart)")
    ep.add_argument("ids", nargs="+", metavar="ID", help="half-reaction ids, e.g. Zn2+/Zn O2/H2O")
    _conditions(ep, with_pH=False)
    ep.add_argument("--pH-values", dest="pH_values", metavar="X,Y,...", help="pH values, default 0,1,...,14")
    v = sub.add_parser("convert", help="convert a reading between reference electrodes")
    v.add_argument("value", type=_number, help=_bound("the reading [V]", "value_V"))
    v.add_argument("--from", dest="from_ref", required=True, metavar="REF")
    v.add_argument("--to", dest="to_ref", required=True, metavar="REF")
    v.add_argument("--temp", type=_number, default=None, metavar="C")
    v.add_argument("--pH", type=_number, dest="pH", metavar="X", help=_bound("pH, for RHE", "pH"))
    a = sub.add_parser("activity", help="activity coefficient of an ion")
    a.add_argument("species")
    a.add_argument("--ionic-strength", type=_number, required=True, metavar="I")
    a.add_argument("--model", metavar="NAME")
    a.add_argument("--temp", type=_number, default=None, metavar="C")
    j = sub.add_parser("joint", help="judge a dissimilar-metal joint in an environment")
    j.add_argument("a")
    j.add_argument("b")
    j.add_argument("--env", required=True)
    j.add_argument("--area-ratio", type=_number, metavar="CATHODE_TO_ANODE")
    cliservice.add_service_options(j, "joint", _number, _bound)
    m = sub.add_parser("matrix", help="every pair of materials in an environment")
    m.add_argument("--env", required=True)
    m.add_argument("--materials", metavar="A,B,...")
    m.add_argument("--csv", action="store_true", help="write CSV instead of text")
    cliservice.add_service_options(m, "matrix", _number, _bound)
    r = sub.add_parser("rate", help="ASTM G102 penetration and mass-loss rate from a current density")
    r.add_argument("--material", required=True)
    r.add_argument("--current-density", type=_number, required=True, metavar="UA_PER_CM2")
    ms = sub.add_parser("measured", help="judge a joint from two potentials measured on site")
    ms.add_argument("--a", dest="a_name", required=True, metavar="NAME", help="label of the first part")
    ms.add_argument("--a-reading", type=_number, required=True, metavar="V", help=_bound("its reading [V vs electrode]", "reading_V"))
    ms.add_argument("--b", dest="b_name", required=True, metavar="NAME", help="label of the second part")
    ms.add_argument("--b-reading", type=_number, required=True, metavar="V", help=_bound("its reading [V vs electrode]", "reading_V"))
    ms.add_argument("--electrode", required=True, metavar="REF", help="reference electrode of both readings")
    ms.add_argument("--env", required=True, metavar="ENV", help="environment (sets the allowable difference)")
    ms.add_argument("--temp", type=_number, default=None, metavar="C", help=_bound("electrode temperature [°C]", "temp_C", "default 25"))
    _water_options(ms)
    ms.add_argument("--a-material", metavar="MATERIAL", help="material of the first part, for the published series")
    ms.add_argument("--b-material", metavar="MATERIAL", help="material of the second part")
    cliservice.add_service_options(ms, "measured", _number, _bound)
    cp = sub.add_parser("cp", help="judge a cathodic-protection reading against the published criteria")
    cp.add_argument("value", type=_number, help=_bound("the reading [V vs electrode]", "reading_V"))
    cp.add_argument("--structure", required=True, metavar="ID", help="e.g. carbon-steel, aluminium")
    cp.add_argument("--setting", required=True, metavar="ID", help="e.g. soil-aerobic, seawater-aerobic")
    cp.add_argument("--electrode", required=True, metavar="REF")
    cp.add_argument("--kind", dest="reading_kind", required=True, metavar="on|instant-off",
                    help="on (current flowing) or instant-off (current just interrupted)")
    cp.add_argument("--temp", type=_number, default=None, metavar="C", help=_bound("electrode temperature [°C]", "temp_C", "default 25"))
    cp.add_argument("--structure-temp", type=_number, default=None, metavar="C", help=_bound("structure temperature [°C]", "structure_temp_C"))
    cp.add_argument("--polarisation", type=_number, default=None, metavar="MV", help=_bound("polarisation shift [mV]", "polarisation_mV"))
    _water_options(cp)
    cliservice.add_service_options(cp, "cp", _number, _bound)
    d = sub.add_parser("data", help="maintainer tools for the dataset")
    dsub = d.add_subparsers(dest="data_command", parser_class=_Parser)
    dc = dsub.add_parser("check", help="validate a data folder; every problem as file:record:field: message")
    dc.add_argument("dir", nargs="?", default=None)
    dsub.add_parser("bundle", help="validate data/ and write calc/dataset.json, the bundle the engine reads")
    ex = sub.add_parser("example", help="print a calculator's opening request (the page's demonstration inputs) as JSON")
    ex.add_argument("name", choices=sorted(OPENINGS))
    mx = sub.add_parser("mixed", help="mixed potential of metallically connected electrodes from their kinetics; "
                                      "the request as JSON on standard input")
    pv = sub.add_parser("passivity", help="PREN and pitting/crevice temperature estimates of a stainless or nickel alloy")
    for opt, what in (("--cr", "chromium"), ("--mo", "molybdenum"), ("--n", "nitrogen")):
        pv.add_argument(opt, type=_number, required=True, metavar="%", help=f"{what} [wt %%]")
    pv.add_argument("--w", type=_number, metavar="%", help="tungsten [wt %%]")
    pv.add_argument("--temp", type=_number, default=None, metavar="C", help=_bound("service temperature [°C]", "temp_C"))
    _water_options(pv)
    stdin_json = [mx, *clicp.add_parsers(sub, _number)]  # the design commands: options, or JSON on stdin
    wn = sub.add_parser("wenner", help="soil resistivity from a Wenner four-pin reading (ASTM G57: ρ = 2πaR)")
    wn.add_argument("--spacing-m", dest="spacing_m", type=_number, required=True, metavar="A", help="pin spacing [m]")
    wn.add_argument("--resistance-ohm", dest="resistance_ohm", type=_number, required=True, metavar="R",
                    help="the meter's resistance reading [Ω]")
    for sp in (e, c, ep, v, a, j, m, r, ms, cp, pv, wn, *stdin_json):
        sp.add_argument("--json", action="store_true", help="print one JSON object")
    return p


def _request(ns):
    cmd = ns.command
    if cmd == "electrode":
        return {"id": ns.id, **_conditions_request(ns)}
    if cmd == "couple":
        return {"a": ns.a, "b": ns.b, **_conditions_request(ns)}
    if cmd == "eph":
        cond = _conditions_request(ns)
        req = {"lines": [{"id": i, **{k: v for k, v in cond.items() if k != "temp_C"}} for i in ns.ids]}
        if "temp_C" in cond:
            req["temp_C"] = cond["temp_C"]
        if ns.pH_values is not None:
            req["pH_values"] = []
            for item in ns.pH_values.split(","):  # the comma separates the values: each has a point, if any
                req["pH_values"].append(read_number(item, field="--pH-values"))
        return req
    if cmd == "convert":
        req = {"value_V": ns.value, "from": ns.from_ref, "to": ns.to_ref}
        if ns.temp is not None:
            req["temp_C"] = ns.temp
        if ns.pH is not None:
            req["pH"] = ns.pH
        return req
    if cmd == "activity":
        req = {"species": ns.species, "ionic_strength": ns.ionic_strength}
        if ns.model:
            req["model"] = ns.model
        if ns.temp is not None:
            req["temp_C"] = ns.temp
        return req
    if cmd == "joint":
        req = {"a": ns.a, "b": ns.b, "env": ns.env}
        if ns.area_ratio is not None:
            req["area_ratio"] = ns.area_ratio
        return {**req, **cliservice.service_request(ns)}
    if cmd == "matrix":
        req = {"env": ns.env}
        if ns.materials:
            req["materials"] = [s.strip() for s in ns.materials.split(",") if s.strip()]
        if ns.csv:
            req["csv"] = True  # the CSV text is made only when asked for
        return {**req, **cliservice.service_request(ns)}
    if cmd == "rate":
        return {"material": ns.material, "current_density_uA_per_cm2": ns.current_density}
    if cmd == "measured":
        req = {"a_name": ns.a_name, "a_reading_V": ns.a_reading, "b_name": ns.b_name, "b_reading_V": ns.b_reading,
               "electrode": ns.electrode, "env": ns.env}
        for key in ("a_material", "b_material"):
            if getattr(ns, key):
                req[key] = getattr(ns, key)
        return _water_request(ns, {**req, **cliservice.service_request(ns)})
    if cmd == "cp":
        req = {"structure": ns.structure, "setting": ns.setting, "reading_V": ns.value, "electrode": ns.electrode,
               "reading_kind": ns.reading_kind}
        if ns.structure_temp is not None:
            req["structure_temp_C"] = ns.structure_temp
        if ns.polarisation is not None:
            req["polarisation_mV"] = ns.polarisation
        return _water_request(ns, {**req, **cliservice.service_request(ns)})
    if cmd in clicp.OPTIONS:
        return clicp.request_of(ns, sys.stdin)
    if cmd == "mixed":
        return clicp.read_stdin(sys.stdin)
    if cmd == "wenner":
        return {"spacing_m": ns.spacing_m, "resistance_ohm": ns.resistance_ohm}
    if cmd == "passivity":
        req = {"cr": ns.cr, "mo": ns.mo, "n": ns.n}
        if ns.w is not None:
            req["w"] = ns.w
        return _water_request(ns, req)
    raise InputError("command", cmd, "a known command")


def _data_check(directory):
    try:
        from sitebuild.validate import check_folder
    except ImportError:
        sys.stderr.write("couplewise: 'data check' needs the project's build tools (pyyaml, jsonschema): run it from the project's .venv\n")
        return 2
    problems = check_folder(directory)
    for prob in problems:
        print(prob)
    errors = [p for p in problems if not str(p).startswith("warning")]
    print(f"{len(errors)} problem(s), {len(problems) - len(errors)} warning(s)", file=sys.stderr)
    return 1 if errors else 0


def _data_bundle():
    try:
        from sitebuild.dataset import DataProblems, write_engine_bundle
    except ImportError:
        sys.stderr.write("couplewise: 'data bundle' needs the project's build tools (pyyaml, jsonschema): "
                         "run it from the project's .venv\n")
        return 2
    try:
        path = write_engine_bundle()
    except DataProblems as exc:
        for prob in exc.problems:
            print(prob)
        sys.stderr.write(f"couplewise: the data has {len(exc.problems)} problem(s); nothing was written\n")
        return 1
    print(f"wrote {path}", file=sys.stderr)
    return 0


def _fresh_bundle():
    """None when the engine's bundle is usable; rebuilt with the build tools when missing or
    stale (a checkout); else the message saying what to do."""
    try:
        dataset.current()
        return None
    except DataError as exc:
        problem = str(exc)
    try:
        from sitebuild.dataset import DataProblems, write_engine_bundle
    except ImportError:
        return problem
    try:
        write_engine_bundle()
        dataset.current()
    except DataProblems as exc:
        return (f"the project's data has {len(exc.problems)} problem(s); run 'couplewise data check': "
                + exc.problems[0])
    except DataError as exc:
        return str(exc)
    return None


def main(argv=None):
    """Run the command line; returns the exit status."""
    parser = build_parser()
    ns = parser.parse_args(argv)
    if ns.command is None:
        parser.print_help()
        return 2
    if ns.command == "data":
        if ns.data_command == "bundle":
            return _data_bundle()
        if ns.data_command != "check":
            sys.stderr.write("couplewise: data needs a sub-command: check or bundle\n")
            return 2
        return _data_check(ns.dir)
    if ns.command == "example":
        print(json.dumps(OPENINGS[ns.name], ensure_ascii=False))
        return 0
    problem = _fresh_bundle()
    if problem:
        sys.stderr.write(f"couplewise: {problem}\n")
        return 2
    try:
        request = _request(ns)
    except (InputError, NumberError) as exc:
        sys.stderr.write(f"couplewise: {exc}\n")
        return 2
    out = api.call(ns.command, request)
    if not out["ok"]:
        sys.stderr.write(f"couplewise: {out['error']['message']}\n")
        return 2
    result = out["result"]
    if getattr(ns, "json", False):
        print(json.dumps(result, ensure_ascii=False, allow_nan=False))
    elif ns.command == "matrix" and ns.csv:
        print(result.get("csv", ""), end="")
    else:
        print(format_text(ns.command, result))
    return 0


def run():  # console-script entry
    try:
        code = main()
        sys.stdout.flush()
    except BrokenPipeError:  # output piped into e.g. head, which closed early
        import os

        os.dup2(os.open(os.devnull, os.O_WRONLY), sys.stdout.fileno())
        code = 0
    except KeyboardInterrupt:
        code = 130
    sys.exit(code)


if __name__ == "__main__":  # pragma: no cover
    run()
