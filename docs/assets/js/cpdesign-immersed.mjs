// Immersed galvanic anodes (entry "anodes", the offshore method): the structure's zones or the
// design currents, life, climatic region or water temperature, anode alloy, type and dimensions,
// seawater resistivity and the structure's steel; the result with the current demand, net mass,
// count and what governs it, one anode's resistance and output, the checks, the zones' demand,
// the derivation, the cautions the result carries and its sources.
import { frame } from "./ui.mjs";
import { bindForm, runner } from "./runner.mjs";
import {
  catalogueOptions, cautions, checksList, choice, cpHint, derivation, figures, fill, governedBy, governsText, group, h, maybe, nameOf, need, numField,
  field, headline, ownParams, recalc, record, row, sig, stages, text, warningsList,
} from "./cpdesign-kit.mjs";
import { zoneFromUrl, zonesEditor } from "./cpdesign-zones.mjs";

const BY_TEMP = "by-temperature";
const MODES = [
  { value: "zones", label: "From the structure's zones (area, depth, coating)" },
  { value: "direct", label: "Design currents given directly (A)" },
];
// The dimensions each resistance formula needs (calc.cpdesign.anodes.resistance), by shape.
const DIMS = {
  "standoff": ["length_m", "radius_m", "standoff_m", "core_radius_m"],
  "short-standoff": ["length_m", "radius_m", "standoff_m"],
  "flush": ["length_m", "width_m"],
  "short-flush": ["area_m2"], "bracelet": ["area_m2"], "plate": ["area_m2"],
};
const FINAL = ["length_m", "radius_m", "width_m", "area_m2"];
const WORDS = {
  net_mass_kg: ["Net mass of one anode (kg)", "the anode alloy, without its steel core"],
  length_m: ["Length L (m)", "of the anode body"],
  radius_m: ["Radius r (m)", "or the radius of the same cross-section area"],
  standoff_m: ["Clearance to the structure (m)", "between anode and steel"],
  core_radius_m: ["Steel core radius (m, optional)", "for the consumed radius; empty: 0"],
  width_m: ["Width W (m)", "of the anode"],
  area_m2: ["Exposed area A (m²)", "the anode surface facing the water"],
};
// calc's bound of each dimension (calc/cpdesign/limits.py, as the engine checks it)
const BOUNDS = { net_mass_kg: "anode_mass_kg", length_m: "length_m", radius_m: "radius_m", standoff_m: "standoff_m", core_radius_m: "radius_m", width_m: "width_m", area_m2: "anode_area_m2" };
const URL_KEYS = { net_mass_kg: "m", length_m: "L", radius_m: "r", standoff_m: "so", core_radius_m: "rc", width_m: "w", area_m2: "A" };

export async function immersed(root, { ds, sp, prefill }) {
  const ui = frame(root, "Cathodic-protection design: immersed galvanic anodes");
  const bar = headline(ui);
  const start = (sp.openings || {}).anodes || {};
  const url = ownParams("i.");
  const pre = prefill && prefill.design === "immersed" ? prefill : null;
  const get = (k, fallback) => url.get(k) ?? fallback;
  const anodeStart = start.anode || {};

  // --- the structure
  const mode = field("cw-i-mode", "Current demand", choice(MODES, get("mode", pre && pre.kind === "fresh" ? "direct" : "zones"), "zones"));
  const zoneStart = url.has("z") ? url.getAll("z").map(zoneFromUrl) : (start.zones || []);
  const zones = zonesEditor(ds, zoneStart, () => recalc(ui));
  const cur = {
    initial: numField("cw-i-ci", "Initial current demand (A)", get("ci", ""), cpHint(sp, "current_A", "to polarise the structure at the start")),
    mean: numField("cw-i-cm", "Mean current demand (A)", get("cm", ""), cpHint(sp, "current_A", "over the design life: sets the net mass")),
    final: numField("cw-i-cf", "Final current demand (A, optional)", get("cf", ""), cpHint(sp, "current_A", "at the end of the life; empty: the final check is skipped")),
  };
  const direct = row(cur.initial, cur.mean, cur.final);
  const life = numField("cw-i-life", "Design life (years)", get("life", start.life_years), cpHint(sp, "life_years", "of the cathodic protection"));
  const regions = catalogueOptions(ds.cp_current_densities, (r) => r.zone === "seawater");
  const region = field("cw-i-reg", "Climatic region", choice([...regions, { value: BY_TEMP, label: "From the surface-water temperature…" }], get("reg", start.region), regions[0] && regions[0].value),
    "by the surface-water temperature of the site");
  const temp = numField("cw-i-t", "Surface-water temperature (°C)", get("t", ""), cpHint(sp, "water_temp_C", "the region follows from it"));
  const regionRow = row(life, region, temp);

  // --- the anodes
  const alloy = field("cw-i-alloy", "Anode alloy", choice(catalogueOptions(ds.cp_anode_alloys, (a) => a.seawater), get("alloy", start.alloy), "al-zn-in"));
  const types = ds.cp_anode_types || [];
  const type = field("cw-i-type", "Anode type", choice(catalogueOptions(types), get("type", start.anode_type), types[0] && types[0].id),
    "sets the resistance formula and the utilisation factor");
  // where the stand-off formula holds, as the anode type's record says (data/cp_anode_types.yaml)
  const rule = (types.find((t) => t.standoff) || {}).standoff;
  const help = (k) => cpHint(sp, BOUNDS[k], WORDS[k][1] + (k === "standoff_m" && rule ? "; the formula holds from " + rule.min_m + " m, ×" + rule.near_factor + " from " + rule.near_min_m + " m" : ""));
  const dims = {};
  for (const k of Object.keys(WORDS)) dims[k] = numField("cw-i-" + URL_KEYS[k], WORDS[k][0], get(URL_KEYS[k], anodeStart[k]), help(k));
  const fin = {};
  for (const k of FINAL) fin[k] = numField("cw-i-f" + URL_KEYS[k], "Final " + WORDS[k][0].replace(/^\w/, (c) => c.toLowerCase()), get("f" + URL_KEYS[k], ""), cpHint(sp, BOUNDS[k], "consumed; empty: calc's rule"));
  const finBox = h("details", { class: "cw-cpd-final" }, h("summary", { text: "Consumed (final) dimensions, optional" }),
    h("p", { class: "cw-field-help", text: "Empty: for a stand-off anode calc applies its rule for the consumed length and radius (recalled, shown in the derivation); for other types it uses the initial dimensions and says so." }),
    row(...FINAL.map((k) => fin[k])));
  if (FINAL.some((k) => url.get("f" + URL_KEYS[k]))) finBox.open = true;

  // --- water and structure
  const rho = numField("cw-i-rho", "Seawater resistivity (Ω·m)", get("rho", pre && pre.resistivity ? pre.resistivity : start.resistivity_ohm_m),
    cpHint(sp, "resistivity_ohm_m", "at the anodes; seawater about 0.2 to 0.3 Ω·m, higher in brackish and cold water"));
  const structure = field("cw-i-st", "Structure (for its potential limit)", choice(catalogueOptions(ds.cp_structures), get("st", start.structure), "carbon-steel"),
    "high-strength steels have a limit more negative potentials must not pass");

  ui.formBox.append(
    group("The structure", row(mode), zones.el, direct, regionRow),
    group("The anodes", row(alloy, type), row(dims.net_mass_kg, ...DIMS.standoff.map((k) => dims[k]), dims.width_m, dims.area_m2), finBox),
    group("Water and steel", row(rho, structure)));

  function shape() {
    const rec = types.find((t) => t.id === type.control.value);
    return rec ? rec.shape : null;
  }
  function showFields() {
    const direct_ = mode.control.value === "direct";
    zones.el.hidden = direct_;
    direct.hidden = !direct_;
    region.el.hidden = direct_;
    temp.el.hidden = direct_ || region.control.value !== BY_TEMP;
    const need_ = DIMS[shape()] || [];
    for (const k of Object.keys(WORDS)) if (k !== "net_mass_kg") dims[k].el.hidden = !need_.includes(k);
    for (const k of FINAL) fin[k].el.hidden = !need_.includes(k);
  }

  function collect() {
    showFields();
    let bad = false;
    const req = {};
    const isDirect = mode.control.value === "direct";
    if (isDirect) {
      for (const [s, noun] of [["initial", "the initial current demand in A"], ["mean", "the mean current demand in A"]]) {
        bad = need(cur[s], req, "current_" + s + "_A", noun) || bad;
      }
      bad = maybe(cur.final, req, "current_final_A", "the final current demand in A") || bad;
    } else {
      const z = zones.read();
      req.zones = z.zones;
      bad = z.bad || bad;
      if (region.control.value === BY_TEMP) bad = need(temp, req, "water_temp_C", "a surface-water temperature in °C") || bad;
      else req.region = region.control.value;
    }
    bad = need(life, req, "life_years", "a design life in years") || bad;
    req.alloy = alloy.control.value;
    req.anode_type = type.control.value;
    const anode = {};
    bad = need(dims.net_mass_kg, anode, "net_mass_kg", "the net mass of one anode in kg") || bad;
    const wanted = DIMS[shape()] || [];
    for (const k of wanted) {
      bad = (k === "core_radius_m" ? maybe : need)(dims[k], anode, k, WORDS[k][0].toLowerCase()) || bad;
    }
    const final = {};
    for (const k of FINAL) if (wanted.includes(k)) bad = maybe(fin[k], final, k, "the consumed " + WORDS[k][0].toLowerCase()) || bad;
    if (Object.keys(final).length) anode.final = final;
    req.anode = anode;
    bad = need(rho, req, "resistivity_ohm_m", "a resistivity in Ω·m") || bad;
    req.structure = structure.control.value;
    url.write([["mode", isDirect ? "direct" : ""], ...(isDirect ? [] : zones.urlValues().map((v) => ["z", v])),
      ["ci", isDirect ? text(cur.initial) : ""], ["cm", isDirect ? text(cur.mean) : ""], ["cf", isDirect ? text(cur.final) : ""],
      ["life", text(life)], ["reg", isDirect ? "" : region.control.value], ["t", !isDirect && region.control.value === BY_TEMP ? text(temp) : ""],
      ["alloy", req.alloy], ["type", req.anode_type], ["m", text(dims.net_mass_kg)],
      ...wanted.map((k) => [URL_KEYS[k], text(dims[k])]), ...FINAL.filter((k) => wanted.includes(k)).map((k) => ["f" + URL_KEYS[k], text(fin[k])]),
      ["rho", text(rho)], ["st", req.structure]]);
    return { req, bad };
  }

  const byName = {
    life_years: life, region, water_temp_C: temp, alloy, capacity_Ah_per_kg: alloy, closed_circuit_V: alloy, anode_type: type,
    utilisation: type, resistivity_ohm_m: rho, structure, protection_V: structure, current_initial_A: cur.initial,
    current_mean_A: cur.mean, current_final_A: cur.final, "anode": dims.net_mass_kg,
  };
  function fieldFor(name) {
    if (!name) return null;
    if (name.startsWith("zones")) return zones.fieldFor(name);
    const m = /^anode\.(final\.)?(\w+)$/.exec(name);
    if (m) return (m[1] ? fin[m[2]] : dims[m[2]]) || dims.net_mass_kg;
    return byName[name] || null;
  }

  function render(r, req) {
    const n = r.count;
    const each = req && req.anode ? req.anode.net_mass_kg : null;
    const alloyName = nameOf(ds.cp_anode_alloys, r.alloy);
    const typeName = nameOf(types, type.control.value);
    const res = r.resistance_ohm, out = r.output_A;
    bar(n === null ? "" : n + " anodes · " + governedBy(r.governed_by) + " · mean demand " + sig(r.current_demand_A.mean) + " A");
    fill(ui.result,
      h("p", { class: "cw-big" }, h("span", { class: "cw-big-value", "data-cw-value": "count", text: n === null ? "—" : String(n) }), " ",
        h("span", { class: "cw-big-label", text: (n === 1 ? "anode" : "anodes") + (n && each ? " of " + sig(each) + " kg net each" : "") })),
      h("p", { class: "cw-direction cw-cpd-governs", text: governsText(r.governed_by) }),
      checksList(r.checks),
      figures([
        ["Current demand", stages(r.current_demand_A, "A"), "current_demand_A"],
        ["Net anode mass for " + sig(r.life_years) + " years", sig(r.net_mass_kg, 5) + " kg", "net_mass_kg"],
        ["Number of anodes by each criterion", Object.entries(r.count_by || {}).map(([k, v]) => k + ": " + v).join(" · ") || "—"],
        res ? ["Resistance of one anode", stages(res, "Ω", ["initial", "final"]), "resistance_ohm"] : null,
        out ? ["Output of one anode", stages(out, "A", ["initial", "final"]), "output_A"] : null,
        r.driving_V !== null ? ["Driving voltage ΔE", sig(r.driving_V) + " V: protection " + sig(r.protection_V) + " V minus the anode's " + sig(r.closed_circuit_V) + " V (vs Ag/AgCl seawater)"] : null,
        ["Anode", alloyName + "; " + typeName + "; ε = " + sig(r.capacity_Ah_per_kg) + " A·h/kg, u = " + sig(r.utilisation)],
        r.life_of_count_years !== null ? ["Life of the anodes installed", sig(r.life_of_count_years) + " years"] : null,
      ]),
      warningsList(r.warnings),
      cautions(r),
      zonesTable(r.zones),
      derivation(r.steps),
      record(r));
  }

  function zonesTable(list) {
    if (!list || !list.length) return null;
    const coat = (id) => nameOf(ds.cp_coatings, id).split(":")[0];
    return h("details", { class: "cw-states cw-cpd-zone-demand" }, h("summary", { text: "Current demand zone by zone" }),
      h("div", { class: "cw-matrix-wrap" }, h("table", { class: "cw-compare" },
        h("thead", {}, h("tr", {}, ["Zone", "Where", "Coating", "Design current density (A/m²)", "Breakdown factor", "Current demand (A)"].map((t) => h("th", { text: t })))),
        h("tbody", {}, list.map((z) => h("tr", {},
          h("td", { text: z.name }), h("td", { text: nameOf(ds.cp_current_densities, z.region) + (z.zone === "seawater" ? ", " + sig(z.depth_m) + " m" : "") }),
          h("td", { text: coat(z.coating) }), h("td", { text: stages(z.current_density_A_per_m2, "") }),
          h("td", { text: stages(z.breakdown, "") }), h("td", { text: stages(z.current_A, "") })))))));
  }

  for (const c of [mode.control, type.control, region.control]) c.addEventListener("change", showFields);
  showFields();
  bindForm(ui, runner(ui, "anodes", render, fieldFor), collect);
}
