// The cathodic-protection pieces shared by the site-readings page (field.mjs) and the survey log
// (survey.mjs): the names and option lists of the data, potentials in the user's unit, the state
// badge of a judged reading and the judgement as the page shows it. The judging is calc's
// (entry "cp"); this module only shows what calc returned.
import { mathNodes } from "./math.mjs";
import { fmt, h, signed, sourceLink, warningsList } from "./ui.mjs";

// Names of the structures and settings (data/cp_structures.yaml, cp_settings.yaml); a test keeps
// the two in step.
export const STRUCTURE_NAMES = {
  "carbon-steel": "Carbon steel (C-Mn and low-alloy, yield strength up to 550 MPa)",
  "high-strength-steel": "High-strength steel (specified minimum yield strength above 550 MPa)",
  "stainless-pren-40": "Austenitic stainless steel, PREN 40 or more",
  "stainless-pren-below-40": "Austenitic stainless steel, PREN below 40",
  "copper-alloys": "Copper and copper alloys without aluminium",
  "aluminium": "Aluminium and aluminium alloys",
  "galvanized-steel": "Galvanized (zinc-coated) steel",
};
export const SETTING_NAMES = {
  "soil-aerobic": "Buried, aerobic soil, resistivity below 100 Ω·m",
  "soil-anaerobic": "Buried, anaerobic soil with sulfate-reducing bacteria",
  "soil-aerated-100-1000": "Buried, aerated sandy soil, 100 to 1000 Ω·m",
  "soil-aerated-above-1000": "Buried, aerated soil, 1000 Ω·m or more",
  "seawater-aerobic": "Immersed in aerobic seawater",
  "seawater-anaerobic": "In seawater sediment, anaerobic (sulfate-reducing bacteria)",
};
export const AGAGCL_SW = "Ag/AgCl seawater";

// The states of a judged reading (calc.field.cpwords.STATES), each a symbol and a word.
// "unconfirmed" is neutral: an on reading that meets a value only with its IR drop in it.
export const CP_SYMBOL = { "protected": "✓", "unconfirmed": "◌", "not protected": "✗", "over-protected": "⚠" };

export const KIND_OPTIONS = [
  { value: "instant-off", label: "instant-off (current just interrupted)" },
  { value: "on", label: "on (protective current flowing)" },
];
export const UNIT_OPTIONS = [{ value: "V", label: "volts (V)" }, { value: "mV", label: "millivolts (mV)" }];
export const NOT_CONSIDERED = "none";

// A potential [V], a shift [mV] and a number typed in the user's unit.
export function potText(v, unit) {
  return unit === "mV" ? signed(v * 1000, 0) + " mV" : signed(v, 3) + " V";
}
export function shiftText(mV, unit) {
  return unit === "V" ? fmt(mV / 1000, 3) + " V" : fmt(mV, 0) + " mV";
}
export function toVolts(x, unit) {
  return unit === "mV" ? x / 1000 : x;
}

// Field electrodes: every electrode of the dataset (RHE is not one).
export function electrodeOptions(ds) {
  return ds.reference_electrodes.map((r) => ({ value: r.id, label: r.id + " (" + signed(r.E_V_SHE, 4) + " V vs SHE at 25 °C)" }));
}

// Structures that have criteria, and the settings that have criteria for one structure.
export function structureOptions(ds) {
  const seen = [];
  for (const r of ds.cp_criteria || []) if (!seen.includes(r.structure)) seen.push(r.structure);
  return seen.map((id) => ({ value: id, label: STRUCTURE_NAMES[id] || id }));
}

export function settingOptions(ds, structure) {
  const seen = [];
  for (const r of ds.cp_criteria || []) {
    if (r.structure !== structure || r.kind === "shift-on") continue;
    for (const s of r.settings || []) if (!seen.includes(s)) seen.push(s);
  }
  const order = Object.keys(SETTING_NAMES);
  seen.sort((a, b) => order.indexOf(a) - order.indexOf(b));
  return seen.map((id) => ({ value: id, label: SETTING_NAMES[id] || id }));
}

export function fillSelect(sel, options, value) {
  sel.replaceChildren(...options.map((o) => h("option", { value: o.value, text: o.label })));
  if (options.some((o) => o.value === value)) sel.value = value;
  return sel.value;
}

// The criterion of a structure and setting that admits on readings (kind protection-on), or null.
export function onCriterion(ds, structure, setting) {
  return (ds.cp_criteria || []).find((r) => r.kind === "protection-on" && r.structure === structure &&
    (r.settings || []).includes(setting)) || null;
}

// The ways the IR drop of an on reading may be considered (the data's ir_drop_methods), and
// whether a method subtracts a measured drop.
export function irOptions(ds) {
  const seen = new Map();
  for (const r of ds.cp_criteria || []) for (const m of r.ir_drop_methods || []) if (!seen.has(m.id)) seen.set(m.id, m);
  return [{ value: NOT_CONSIDERED, label: "not considered" }, ...[...seen.values()].map((m) => ({ value: m.id, label: m.name }))];
}
export function irSubtracts(ds, id) {
  return (ds.cp_criteria || []).some((r) => (r.ir_drop_methods || []).some((m) => m.id === id && m.subtract));
}

// The badge of a state. A judgement kept from before the state "unconfirmed" existed (protected,
// not conclusive: an on reading) is shown as unconfirmed: never a check mark for an on reading.
export function cpBadge(verdict, conclusive) {
  const state = verdict === "protected" && conclusive === false ? "unconfirmed" : verdict;
  const open = conclusive === false && state !== "unconfirmed";
  return h("span", { class: "cw-verdict cw-cp cw-cp-" + state.replace(/\s+/g, "-") + (conclusive === false ? " cw-cp-open" : ""), "data-verdict": state },
    h("span", { class: "cw-v-symbol", "aria-hidden": "true", text: CP_SYMBOL[state] || "?" }), " ", state,
    open ? h("span", { class: "cw-cp-open-note", text: " (not conclusive)" }) : null);
}

// One criterion of a result as a row of the criteria table.
function criterionRow(c, unit) {
  let value = "", reading = "", result = "", needs = c.ir_free ? "instant-off" : "on";
  const pot = (v) => potText(v, unit);
  if (c.role === "protection") { value = "≤ " + pot(c.value_V) + " vs " + c.electrode; reading = pot(c.reading_V); result = c.met ? "met" : "not met"; }
  else if (c.role === "on") {
    value = "≤ " + pot(c.value_V) + " vs " + c.electrode + ", current applied"; needs = "on, IR drop considered";
    reading = c.reading_V === undefined ? "—" : pot(c.reading_V) + (c.judged_V !== c.reading_V ? "; less the IR drop " + pot(c.judged_V) : "");
    result = c.met === true ? "met" : c.met === false ? "not met" : c.value_met ? "value met; IR drop not considered" : "not for an instant-off reading";
  } else if (c.role === "limit") { value = "not below " + pot(c.value_V) + " vs " + c.electrode; reading = pot(c.reading_V); result = c.exceeded ? "beyond the limit" : "within the limit"; }
  else if (c.role === "polarisation") {
    value = "≥ " + shiftText(c.value_mV, unit); needs = "instant-off and native";
    reading = c.given_mV === null || c.given_mV === undefined ? "not given" : shiftText(c.given_mV, unit);
    result = c.met === null ? (c.applies ? "not checked" : "does not apply") : (c.met ? "met" : "not met");
  } else { value = "≥ " + shiftText(c.value_mV, unit) + " (current on)"; reading = "—"; result = "not checked"; }
  if (c.borderline) result += " (borderline)";
  if (c.conclusive === false && c.role !== "on") result += ", not conclusive";
  return h("tr", { "data-criterion": c.id, "data-role": c.role },
    h("td", {}, h("strong", {}, mathNodes(c.name)), c.provisional ? h("span", { class: "cw-badge cw-badge-prov", text: "provisional" }) : null),
    h("td", {}, c.standard + ", " + c.clause + " ", sourceLink(c.source), c.confidence === "recalled" ? h("span", { class: "cw-recalled-tag", text: " (recalled)" }) : null),
    h("td", { text: value }), h("td", { text: reading }), h("td", { class: "cw-crit-margin", text: c.margin_text || "—" }),
    h("td", { text: needs }), h("td", { class: "cw-crit-result", text: result }));
}

// The readings of the test post beside the one judged: the polarisation from the native
// potential (instant-off minus native) and the IR drop of an on/instant-off pair.
function postLines(r, unit) {
  const out = [];
  if (r.polarisation_from === "native" && r.native_V !== null && r.native_V !== undefined) {
    const shiftV = r.reading_V - r.native_V;
    out.push(h("li", { class: "cw-post-pol", text: "Polarisation: instant-off " + potText(r.reading_V, unit) + " minus native " +
      potText(r.native_V, unit) + " = " + potText(shiftV, unit) + (r.polarisation_mV >= 0
        ? ", a cathodic polarisation of " + shiftText(r.polarisation_mV, unit) + "." : ": no cathodic polarisation.") }));
  }
  if (r.ir_drop_V !== null && r.ir_drop_V !== undefined) {
    out.push(h("li", { class: "cw-post-ir", text: "IR drop at the post: on " + potText(r.on_V, unit) + " minus instant-off " +
      potText(r.reading_V, unit) + " = " + potText(r.ir_drop_V, unit) + "." }));
  }
  return out.length ? h("ul", { class: "cw-post" }, out) : null;
}

// Render one CP judgement (shared by the site-readings page and the survey log).
export function cpResultNodes(r, unit) {
  const on = (r.criteria || []).find((c) => c.role === "on");
  return [
    h("p", { class: "cw-big" }, cpBadge(r.verdict, r.conclusive)),
    h("p", { class: "cw-direction" }, mathNodes(r.verdict_text)),
    h("p", { class: "cw-ir" }, mathNodes(r.ir_drop)),
    postLines(r, unit),
    h("div", { class: "cw-matrix-wrap" }, h("table", { class: "cw-compare cw-criteria" },
      h("thead", {}, h("tr", {}, ["Criterion", "Standard and clause", "Value", "Your reading on its electrode", "Margin", "Admits", "Result"].map((t) => h("th", { text: t })))),
      h("tbody", {}, (r.criteria || []).map((c) => criterionRow(c, unit))))),
    on && on.condition ? h("p", { class: "cw-condition" }, h("strong", {}, mathNodes(on.name + ": ")), on.condition) : null,
    warningsList(r.warnings),
  ];
}
