// Buried galvanic anodes (entry "buried", the method of MIL-HDBK-1004/10): the current the
// structure needs (given, or from its area, the current density of bare steel and the coating
// efficiency), the soil resistivity (or a Wenner reading), the anode alloy and the handbook's
// anode, the structure potential and the life; the result with the number of anodes and what
// governs it, the output of one anode, the mass for the life and the life of the anodes installed.
import { frame } from "./ui.mjs";
import { bindForm, runner } from "./runner.mjs";
import {
  cautions, checksList, choice, cpHint, derivation, field, figures, fill, governedBy, governsText, group, h, headline, maybe, nameOf, need, numField,
  ownParams, recalc, record, row, sig, text, warningsList,
} from "./cpdesign-kit.mjs";
import { wennerHelper } from "./cpdesign-wenner.mjs";

const MODES = [
  { value: "area", label: "From the surface area, current density and coating" },
  { value: "given", label: "Current required given (A)" },
];
// The output constant's coating choice of the magnesium anodes (calc.cpdesign.buried._constant).
const COATINGS = [
  { value: "well-coated", label: "Well coated structure" },
  { value: "bare", label: "Bare or poorly coated structure" },
];

function sizeTable(ds) {
  return ((ds.cp_design_tables || []).find((t) => t.id === "anode-size-factor") || { rows: [] }).rows;
}

export async function buried(root, { ds, sp, prefill }) {
  const ui = frame(root, "Cathodic-protection design: buried galvanic anodes");
  const bar = headline(ui);
  const start = (sp.openings || {}).buried || {};
  const url = ownParams("b.");
  const get = (k, fallback) => url.get(k) ?? fallback;
  const mode = field("cw-b-mode", "Current required", choice(MODES, get("mode", start.current_A !== undefined ? "given" : "area"), "area"));
  const area = numField("cw-b-area", "Surface area of the structure (m²)", get("area", start.area_m2), cpHint(sp, "area_m2", "the steel surface in contact with the soil"));
  const dens = numField("cw-b-dens", "Current density for bare steel (mA/m²)", get("dens", start.current_density_mA_per_m2), cpHint(sp, "current_density_mA_per_m2", "for the soil, from the governing standard or a survey"));
  const ce = numField("cw-b-ce", "Coating efficiency (0 to below 1)", get("ce", start.coating_efficiency), cpHint(sp, "coating_efficiency", "the share of the surface the coating insulates, e.g. 0.95; empty: 0 (bare)"));
  const amps = numField("cw-b-i", "Current required (A)", get("i", start.current_A ?? ""), cpHint(sp, "current_A", "from a current-requirement test, for example"));
  const rho = numField("cw-b-rho", "Soil resistivity (Ω·m)", get("rho", start.resistivity_ohm_m), cpHint(sp, "resistivity_ohm_m", "measured near the anodes; 1 Ω·m = 100 Ω·cm"));
  const wenner = wennerHelper("bw", (sp.openings || {}).wenner || {}, rho, () => recalc(ui), sp);
  const alloys = (ds.cp_anode_alloys || []).filter((a) => a.buried);
  const alloy = field("cw-b-alloy", "Anode alloy", choice(alloys.map((a) => ({ value: a.id, label: a.name })), get("alloy", start.alloy), "magnesium"));
  const anodes = sizeTable(ds).map((r) => ({ value: r.id, label: r.mass_lb + " lb, " + r.group + ", f = " + r.f }));
  const anode = field("cw-b-anode", "Anode (the handbook's sizes)", choice(anodes, get("anode", start.anode), anodes[0] && anodes[0].value),
    "its size factor f enters the output; its mass the life");
  const coating = field("cw-b-coat", "Structure coating (magnesium output constant)", choice(COATINGS, get("coat", start.coating), "well-coated"));
  const pot = numField("cw-b-pot", "Structure potential (V vs CSE)", get("pot", start.structure_potential_V_CSE), "the potential to hold, as the criterion of the standard in use gives it");
  const life = numField("cw-b-life", "Design life (years)", get("life", start.life_years), cpHint(sp, "life_years"));
  const given = row(amps);
  const fromArea = row(area, dens, ce);
  ui.formBox.append(
    group("The structure", row(mode), fromArea, given, row(pot, life)),
    group("The soil", row(rho), wenner),
    group("The anodes", row(alloy, anode, coating)));

  function showFields() {
    const g = mode.control.value === "given";
    given.hidden = !g;
    fromArea.hidden = g;
    coating.el.hidden = !/magnesium/.test(alloy.control.value);
  }

  function collect() {
    showFields();
    let bad = false;
    const req = {};
    const g = mode.control.value === "given";
    if (g) bad = need(amps, req, "current_A", "the current required in A") || bad;
    else {
      bad = need(area, req, "area_m2", "a surface area in m²") || bad;
      bad = need(dens, req, "current_density_mA_per_m2", "a current density in mA/m²") || bad;
      bad = maybe(ce, req, "coating_efficiency", "a coating efficiency from 0 to below 1") || bad;
    }
    bad = need(rho, req, "resistivity_ohm_m", "a resistivity in Ω·m") || bad;
    req.alloy = alloy.control.value;
    req.anode = anode.control.value;
    if (!coating.el.hidden) req.coating = coating.control.value;
    bad = need(pot, req, "structure_potential_V_CSE", "a potential in V vs CSE") || bad;
    bad = need(life, req, "life_years", "a design life in years") || bad;
    url.write([["mode", g ? "given" : ""], ["i", g ? text(amps) : ""], ["area", g ? "" : text(area)], ["dens", g ? "" : text(dens)],
      ["ce", g ? "" : text(ce)], ["rho", text(rho)], ["alloy", req.alloy], ["anode", req.anode], ["coat", req.coating || ""],
      ["pot", text(pot)], ["life", text(life)]]);
    return { req, bad };
  }
  const byName = {
    current_A: amps, area_m2: area, current_density_mA_per_m2: dens, coating_efficiency: ce, resistivity_ohm_m: rho,
    alloy, anode, size_factor: anode, anode_mass_kg: anode, coating, output_constant: coating,
    structure_potential_V_CSE: pot, life_years: life,
  };
  const fieldFor = (name) => byName[name] || null;

  function render(r) {
    const row_ = sizeTable(ds).find((x) => x.id === r.anode);
    bar(r.count + " anodes · " + governedBy(r.governed_by) + " · " + sig(r.anode_output_mA) + " mA each");
    fill(ui.result,
      h("p", { class: "cw-big" }, h("span", { class: "cw-big-value", "data-cw-value": "count", text: String(r.count) }), " ",
        h("span", { class: "cw-big-label", text: (r.count === 1 ? "anode" : "anodes") + (row_ ? " of " + row_.mass_lb + " lb (" + sig(r.anode_mass_kg, 3) + " kg)" : "") + ", " + nameOf(ds.cp_anode_alloys, r.alloy) })),
      h("p", { class: "cw-direction cw-cpd-governs", text: governsText(r.governed_by) }),
      checksList(r.checks),
      figures([
        ["Current required", sig(r.current_required_A * 1000) + " mA", "current_required_A"],
        ["Output of one anode", sig(r.anode_output_mA) + " mA: i = C·f·y/ρ with C = " + sig(r.output_constant, 6) + " mA·Ω·cm, f = " + sig(r.size_factor) + ", y = " + sig(r.potential_factor) + ", ρ = " + sig(r.resistivity_ohm_cm, 5) + " Ω·cm", "anode_output_mA"],
        ["Anodes for the current", "I/i = " + sig(r.count_exact) + " → " + r.count_for_output],
        ["Anode mass for " + sig(r.life_years) + " years", sig(r.mass_required_kg) + " kg" + (r.count_for_life !== null ? ", that is " + r.count_for_life + " anodes" : "")],
        r.life_of_count_years !== null ? ["Life of the " + r.count + " anodes installed", sig(r.life_of_count_years) + " years", "life_of_count_years"] : null,
      ]),
      warningsList(r.warnings),
      cautions(r),
      derivation(r.steps),
      record(r));
  }
  for (const c of [mode.control, alloy.control]) c.addEventListener("change", showFields);
  showFields();
  bindForm(ui, runner(ui, "buried", render, fieldFor), collect);
}
