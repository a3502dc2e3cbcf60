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


def format_text(command, result):
    """Human-readable text of a result: headline numbers, derivation, warnings, sources."""
    lines = []
    for key in HEADLINE.get(command, []):
        if key in result:
            lines.append(f"{key}: {_fmt(result[key])}")
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
