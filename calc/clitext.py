"""The command line's human-readable text of a result (the ``--json`` output is the result itself)."""

# fields printed first, in this order, by the text output of each command
HEADLINE = {
    "electrode": ["id", "potential_V", "standard_potential_V", "temp_C"],
    "couple": ["anode", "cathode", "cell_potential_V", "standard_cell_potential_V", "n_electrons",
               "delta_G_kJ_per_mol", "equilibrium_constant", "overall_reaction"],
    "convert": ["value_V", "from", "to", "temp_C"],
    "activity": ["species", "gamma", "A", "B", "ionic_strength", "model"],
    "joint": ["anode", "cathode", "basis", "delta_E_V", "delta_E_range_V", "allowable_V", "verdict",
              "verdict_text", "rate_mm_per_year"],
    "matrix": ["env", "materials"],
    "eph": ["temp_C"],
    "rate": ["material", "penetration_mm_per_year", "mass_loss_g_per_m2_day"],
    "measured": ["anode", "cathode", "delta_E_V", "allowable_V", "verdict", "verdict_text", "a_V_SCE", "b_V_SCE",
                 "agreement_text"],
    "cp": ["verdict_label", "verdict_text", "reading_kind", "ir_drop"],
    "mixed": ["E_mixed_V", "galvanic_current_A"],
    "passivity": ["pren", "pren_formula", "cpt_C", "cct_C", "holds", "reason"],
    "anodes": ["net_mass_kg", "count", "governed_by", "driving_V", "life_of_count_years"],
    "anode-resistance": ["shape", "resistance_ohm", "formula"],
    "buried": ["current_required_A", "anode_output_mA", "count", "governed_by", "life_of_count_years"],
    "groundbed": ["resistance_ohm", "single_anode_ohm", "count", "life_years"],
    "wenner": ["resistivity_ohm_m", "resistivity_ohm_cm", "depth_m"],
    "tank": ["resistance_ohm", "single_anode_ohm", "current_required_A", "count_for_rating"],
}


def _fmt(value):
    if isinstance(value, float):
        return f"{value:.6g}"
    if isinstance(value, list):
        return "[" + ", ".join(_fmt(v) for v in value) + "]"
    if value is None:
        return "n/a"
    return str(value)


def _short(value, unit=""):
    """A number in three significant figures with its unit; a [low, high] pair as one value or a span."""
    if isinstance(value, list) and len(value) == 2 and value[0] == value[1]:
        value = value[0]
    if isinstance(value, list):
        return " to ".join(_short(v) for v in value) + (f" {unit}" if unit else "")
    text = f"{value:.3g}" if isinstance(value, float) else _fmt(value)
    return text + (f" {unit}" if unit and value is not None else "")


def _conditions(conds):
    """The service conditions used, each with where its value came from (the user, the environment, computed)."""
    out = []
    for key, v in (conds or {}).items():
        if isinstance(v, dict):
            out.append(f"{key} {_short(v['value'], v.get('unit', ''))} ({v['from']})")
    return ["service conditions: " + (conds or {}).get("electrolyte", "") + ("; " if out else "") + "; ".join(out)]


def _at_service(result):
    """A joint at its service conditions: the mixed-potential answer, then the upper-bound screen."""
    a = result.get("assessment")
    if "assessment" not in result:
        return []
    if a is None:
        lines = [f"at the service conditions: no mixed-potential judgement ({result.get('assessment_reason')})"]
    else:
        lines = [f"at the service conditions (mixed potential): anode {a['anode']}, couple potential "
                 f"{_short(a['couple_potential_V_SCE'], 'V vs SCE')}, galvanic current on the anode "
                 f"{_short(a['galvanic_current_density_on_anode_uA_per_cm2'], 'µA/cm²')}"]
        anode = next((p for p in a.get("parts") or [] if p.get("role") == "anode"), {})
        lines.append(f"attack_mm_per_year: {_short(result.get('attack_mm_per_year'))} (the anode coupled; "
                     f"uncoupled {_short(anode.get('free_penetration_mm_per_year'), 'mm/y')})")
        lines += _conditions(result.get("service_conditions"))
    rate = result.get("rate")
    if rate:
        lines.append(f"upper-bound screen ({rate['formula']}, O2 limit from the {rate['limiting_current_from']}): "
                     f"{_short(rate['penetration_mm_per_year'], 'mm/y')} on {rate['anode']}; {rate['note']}")
    elif result.get("rate_reason"):
        lines.append(f"upper-bound screen: none ({result['rate_reason']})")
    return lines + [f"effect: {e}" for e in result.get("effects") or []]


def _cp_post(result):
    """A CP reading: the readings of its test post, the IR drop considered, then each criterion's state."""
    lines = []
    if result.get("polarisation_mV") is not None:
        lines.append(f"polarisation: {_short(result['polarisation_mV'], 'mV')} "
                     + ("(instant-off − native)" if result.get("polarisation_from") == "native" else "(as given)"))
    if result.get("ir_drop_V") is not None:
        lines.append(f"IR drop at the post (on − instant-off): {_short(result['ir_drop_V'], 'V')}")
    if result.get("ir_drop_method"):
        size = "" if result.get("ir_drop_mV") is None else f", {_short(result['ir_drop_mV'], 'mV')} subtracted"
        lines.append(f"IR drop considered: {result['ir_drop_method']}{size}")
    for c in result.get("criteria") or []:
        state = ("met" if c.get("met") else "not met" if c.get("met") is False else
                 "value met, IR drop not considered" if c.get("value_met") else
                 "not checked" if c.get("role") == "not checked" else "not judged")
        margin = f"; {c['margin_text']}" if c.get("margin_text") else ""
        if c.get("role") == "limit":  # its margin says within or beyond
            state, margin = ("beyond the limit" if c.get("exceeded") else "within the limit"), ""
            state = c.get("margin_text") or state
        lines.append(f"criterion: {c['name']} ({c['standard']}, {c['clause']}): {state}{margin}")
    return lines


#: command -> the readable lines it adds after its headline fields
EXTRA = {"joint": _at_service, "cp": _cp_post,
         "matrix": lambda r: _matrix_service(r),
         "measured": lambda r: _at_service_measured((r.get("published") or {}).get("at_service"))}


def _matrix_service(result):
    """A pair table at the service conditions: the conditions, each pair's mixed-potential answer, warnings."""
    if not result.get("service_conditions"):
        return [f"service warning: {w['message']}" for w in result.get("service_warnings") or []]
    lines = _conditions(result["service_conditions"])
    mats = result.get("materials") or []
    for (a, b, *_), row in zip(result.get("pairs") or [], result.get("service_pairs") or []):
        answer = "no polarization data" if row is None else (
            f"anode {mats[row[0]]}, couple potential {_short(row[1], 'V vs SCE')}, attack {_short(row[2], 'mm/y')} "
            f"(uncoupled {_short(row[3], 'mm/y')})")
        lines.append(f"at the service conditions, {mats[a]} with {mats[b]}: {answer}")
    if result.get("service_pairs_reason"):
        lines.append(f"at the service conditions: {result['service_pairs_reason']}")
    return lines + [f"service warning: {w['message']}" for w in result.get("service_warnings") or []]


def _at_service_measured(at):
    """The published judgement of a measured joint at its service conditions (None: none)."""
    if not at:
        return []
    return [f"published, at the service conditions (mixed potential): anode {at['anode']}, couple potential "
            f"{_short(at['couple_potential_V_SCE'], 'V vs SCE')}, attack {_short(at['attack_mm_per_year'], 'mm/y')}"
            ] + _conditions(at.get("service_conditions"))


def format_text(command, result):
    """Human-readable text of a result: headline numbers, derivation, warnings, sources."""
    lines = []
    for key in HEADLINE.get(command, []):
        if key in result:
            lines.append(f"{key}: {_fmt(result[key])}")
    lines += EXTRA[command](result) if command in EXTRA else []
    if command == "eph":  # the lines as a table: one row per pH, one column per half-reaction
        cols = result.get("lines") or []
        lines.append("E vs SHE [V] at each pH:")
        lines.append("\t".join(["pH"] + [c["id"] for c in cols]))
        for k, ph in enumerate(result.get("pH") or []):
            lines.append("\t".join([_fmt(ph)] + [f"{c['potential_V'][k]:.4f}" for c in cols]))
    steps = result.get("steps") or []
    if steps:
        lines.append("")
        lines.append("Derivation:")
        for i, st in enumerate(steps, 1):
            lines.append(f"  {i}. {st.get('title', '')}")
            for part in ("formula", "substituted", "result"):
                if st.get(part):
                    lines.append(f"       {st[part]}")
    for w in result.get("warnings") or []:
        lines.append(f"warning: {w.get('message', w) if isinstance(w, dict) else w}")
    for c in result.get("cautions") or []:
        lines.append(f"caution: {c}")
    if result.get("sources"):
        lines.append("sources: " + ", ".join(result["sources"]))
    if result.get("data_version"):
        lines.append(f"data version: {result['data_version']}")
    return "\n".join(lines)
