// Impressed-current groundbed (entry "groundbed": Dwight's formula, the handbooks' paralleling
// factor or Sunde's formula, the circuit, the rectifier and the anode life): the soil resistivity
// (or a Wenner reading), the anodes or backfill columns and their layout, the design current and
// the circuit, the anode material and mass; the result with the groundbed resistance, the circuit,
// the rectifier's output and rating, the life, the checks, the derivation, cautions and sources.
import { frame } from "./ui.mjs";
import { bindForm, runner } from "./runner.mjs";
import {
  cautions, checksList, choice, cpHint, derivation, field, figures, fill, group, h, headline, maybe, nameOf, need, numField, ownParams,
  recalc, record, row, sig, source, text, warningsList,
} from "./cpdesign-kit.mjs";
import { wennerHelper } from "./cpdesign-wenner.mjs";

const ORIENTATIONS = [
  { value: "vertical", label: "Vertical (Dwight 1936)" },
  { value: "horizontal", label: "Horizontal, at a depth (recalled formula)" },
];
const PARALLELING = [
  { value: "table", label: "The handbooks' paralleling factor P (table)" },
  { value: "sunde", label: "Sunde's formula (vertical anodes)" },
];

const BOUNDS = {
  resistivity_ohm_m: "resistivity_ohm_m", depth_m: "depth_m", length_m: "length_m", diameter_m: "diameter_m", spacing_m: "spacing_m",
  current_A: "current_A", cable_length_m: "length_m", cable_ohm_per_km: "cable_ohm_per_km", structure_resistance_ohm: "circuit_ohm",
  margin: "margin", back_emf_V: "back_emf_V", max_resistance_ohm: "resistance_ohm", anode_mass_kg: "anode_mass_kg",
  life_years: "life_years", anode_rating_A: "current_A",
};

export async function groundbed(root, { ds, sp }) {
  const ui = frame(root, "Cathodic-protection design: impressed-current groundbed");
  const bar = headline(ui);
  const start = (sp.openings || {}).groundbed || {};
  const url = ownParams("g.");
  const get = (k, fallback) => url.get(k) ?? fallback;
  // calc's bound of a field (calc/cpdesign/limits.py, as the engine checks it), shown in its hint
  const f = (key, id, label, help) => numField("cw-g-" + id, label, get(id, start[key] ?? ""), cpHint(sp, BOUNDS[key], help));
  const rho = f("resistivity_ohm_m", "rho", "Soil resistivity (Ω·m)", "measured at the groundbed's depth; 1 Ω·m = 100 Ω·cm");
  const wenner = wennerHelper("gw", (sp.openings || {}).wenner || {}, rho, () => recalc(ui), sp);
  const orient = field("cw-g-or", "Orientation", choice(ORIENTATIONS, get("or", start.orientation), "vertical"));
  const depth = f("depth_m", "dep", "Depth of the anode's axis (m)", "horizontal anodes only");
  const length = f("length_m", "L", "Length of one anode or backfill column (m)", "with backfill: the column's length");
  const diam = f("diameter_m", "d", "Diameter (m)", "with backfill: the column's diameter");
  const count = f("count", "n", "Number of anodes", "in one line");
  const spacing = f("spacing_m", "s", "Spacing between anodes (m)", "centre to centre");
  const par = field("cw-g-par", "Paralleling", choice(PARALLELING, get("par", start.paralleling), "table"), "calc says which it used, and whether the table's value was read or recalled");
  const amps = f("current_A", "i", "Design current (A, optional)", "the current the structure needs: the rectifier and the life need it");
  const cableL = f("cable_length_m", "cl", "Cable length (m, optional)", "anode and structure leads together");
  const cableR = f("cable_ohm_per_km", "cr", "Cable resistance (Ω/km)", "of the conductor, from its data sheet");
  const struct = f("structure_resistance_ohm", "rs", "Structure-to-earth resistance (Ω, optional)", "empty: 0");
  const margin = f("margin", "mg", "Rectifier current margin (fraction)", "0.25 adds 25 %; empty: calc assumes one and says so");
  const back = f("back_emf_V", "be", "Back voltage (V)", "between anodes and steel; empty: calc assumes one and says so");
  const target = f("max_resistance_ohm", "rmax", "Largest groundbed resistance wanted (Ω, optional)", "calc finds the fewest anodes that reach it");
  const materials = (ds.cp_anode_alloys || []).filter((a) => a.impressed);
  const mat = field("cw-g-mat", "Anode material", choice([{ value: "", label: "— not given (no life computed) —" }, ...materials.map((a) => ({ value: a.id, label: a.name }))],
    get("mat", start.anode_material ?? "") === "-" ? "" : get("mat", start.anode_material ?? ""), ""));
  const mass = f("anode_mass_kg", "m", "Mass of one anode (kg)", "for the life of a consumed material");
  const life = f("life_years", "life", "Life wanted (years, optional)", "the life is checked against it");
  const rating = f("anode_rating_A", "ra", "Rated current of one anode (A, optional)", "ceramic (mixed-metal-oxide) anodes: the maker's rating");
  ui.formBox.append(
    group("The soil", row(rho), wenner),
    group("The anodes", row(orient, depth), row(length, diam), row(count, spacing, par)),
    group("Circuit and rectifier", row(amps, target), row(cableL, cableR, struct), row(margin, back)),
    group("Anode life", row(mat, mass), row(life, rating)));

  function showFields() {
    const n = Number(text(count).replace(",", "."));
    depth.el.hidden = orient.control.value !== "horizontal";
    const one = n === 1;
    spacing.el.hidden = one;
    par.el.hidden = one;
  }

  function collect() {
    showFields();
    let bad = false;
    const req = {};
    bad = need(rho, req, "resistivity_ohm_m", "a resistivity in Ω·m") || bad;
    req.orientation = orient.control.value;
    if (!depth.el.hidden) bad = need(depth, req, "depth_m", "a depth in m") || bad;
    bad = need(length, req, "length_m", "a length in m") || bad;
    bad = need(diam, req, "diameter_m", "a diameter in m") || bad;
    bad = need(count, req, "count", "a whole number of anodes") || bad;
    if (!spacing.el.hidden) {
      bad = need(spacing, req, "spacing_m", "a spacing in m") || bad;
      req.paralleling = par.control.value;
    }
    for (const [fld, key, noun] of [[amps, "current_A", "a current in A"], [target, "max_resistance_ohm", "a resistance in Ω"],
      [struct, "structure_resistance_ohm", "a resistance in Ω"], [margin, "margin", "a fraction, e.g. 0.25"], [back, "back_emf_V", "a voltage in V"],
      [life, "life_years", "a life in years"], [rating, "anode_rating_A", "a current in A"]]) {
      bad = maybe(fld, req, key, noun) || bad;
    }
    if (text(cableL) !== "") {
      bad = need(cableL, req, "cable_length_m", "a length in m") || bad;
      bad = need(cableR, req, "cable_ohm_per_km", "a cable resistance in Ω/km") || bad;
    } else cableR.setError("");
    if (mat.control.value) {
      req.anode_material = mat.control.value;
      bad = need(mass, req, "anode_mass_kg", "the mass of one anode in kg") || bad;
    } else mass.setError("");
    url.write([["rho", text(rho)], ["or", req.orientation], ["dep", depth.el.hidden ? "" : text(depth)], ["L", text(length)], ["d", text(diam)],
      ["n", text(count)], ["s", text(spacing)], ["par", par.control.value], ["i", text(amps)], ["cl", text(cableL)], ["cr", text(cableR)],
      ["rs", text(struct)], ["mg", text(margin)], ["be", text(back)], ["rmax", text(target)], ["mat", mat.control.value || "-"],
      ["m", text(mass)], ["life", text(life)], ["ra", text(rating)]]);
    return { req, bad };
  }
  const byName = {
    resistivity_ohm_m: rho, orientation: orient, depth_m: depth, length_m: length, diameter_m: diam, count, spacing_m: spacing,
    paralleling: par, current_A: amps, max_resistance_ohm: target, cable_length_m: cableL, cable_ohm_per_km: cableR,
    cable_resistance_ohm: cableR, structure_resistance_ohm: struct, margin, back_emf_V: back, anode_material: mat,
    consumption_kg_per_A_yr: mat, anode_mass_kg: mass, life_years: life, anode_rating_A: rating,
  };
  const fieldFor = (name) => byName[name] || null;

  function render(r, req) {
    const c = r.circuit_ohm || {};
    const rect = r.rectifier;
    const p = r.paralleling;
    const parText = !p ? "one anode: none" : p.method === "table" ? "the handbooks' table, P = " + sig(p.factor) + " (" + p.confidence + ")" : "Sunde's formula (recalled)";
    const failed = (r.checks || []).filter((x) => !x.passed);
    bar("groundbed " + sig(r.resistance_ohm) + " Ω · circuit " + sig(c.total) + " Ω" + (rect ? " · rectifier " + sig(rect.voltage_V) + " V at " + sig(rect.current_A) + " A" : ""));
    fill(ui.result,
      h("p", { class: "cw-big" }, h("span", { class: "cw-big-value", "data-cw-value": "resistance_ohm", text: sig(r.resistance_ohm) + " Ω" }), " ",
        h("span", { class: "cw-big-label", text: "groundbed of " + r.count + (r.count === 1 ? " anode" : " anodes") + ", " + r.orientation })),
      h("p", { class: "cw-direction cw-cpd-governs", text: failed.length ? "Not met: " + failed.map((x) => x.name).join(", ") + ". Change the layout (more or longer anodes, wider spacing) and check again."
        : rect ? "The circuit resistance sets the rectifier: V = I·R_T + back voltage. With " + sig(rect.current_A) + " A through " + sig(c.total) + " Ω the rectifier gives " + sig(rect.voltage_V) + " V."
          : "Give the design current for the rectifier's voltage and the anodes' life." }),
      checksList(r.checks),
      figures([
        ["Resistance of one anode", sig(r.single_anode_ohm) + " Ω"],
        ["Paralleling", parText, null, p && p.source ? source(p.source) : null],
        ["Circuit resistance", "groundbed " + sig(c.groundbed) + " Ω + cable " + sig(c.cable) + " Ω + structure " + sig(c.structure) + " Ω = " + sig(c.total) + " Ω", "circuit_ohm"],
        rect ? ["Rectifier", sig(rect.voltage_V) + " V at " + sig(rect.current_A) + " A; rated " + sig(rect.rated_current_A) + " A at " + sig(rect.rated_voltage_V) + " V (margin " + sig(rect.margin * 100) + " %, back voltage " + sig(rect.back_emf_V) + " V)", "rectifier"] : null,
        r.life_years !== null ? ["Life of the anodes", sig(r.life_years) + " years, " + nameOf(ds.cp_anode_alloys, req.anode_material), "life_years"] : null,
        r.count_for_resistance ? ["Fewest anodes for the resistance wanted", r.count_for_resistance.count ? r.count_for_resistance.count + " (" + sig(r.count_for_resistance.resistance_ohm) + " Ω)" : "none of the table's counts reaches it"] : null,
        r.count_for_rating !== null ? ["Anodes for their rated current", String(r.count_for_rating)] : null,
      ]),
      warningsList(r.warnings),
      cautions(r),
      derivation(r.steps),
      record(r));
  }
  for (const c of [orient.control, count.control]) c.addEventListener("input", showFields);
  orient.control.addEventListener("change", showFields);
  showFields();
  bindForm(ui, runner(ui, "groundbed", render, fieldFor), collect);
}
