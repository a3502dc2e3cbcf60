// A joint at its service conditions, as the joint page shows it below the series verdict (the
// quick first look): the mixed-potential answer (couple potential, galvanic current, each part's
// attack against its free corrosion and the change), the upper-bound screen beside it and named
// as such, the parts with the state they were judged in and their passivity in words, the
// effects of the conditions in sentences, and the Evans diagram (evanschart.mjs) of the result's
// own `evans`. Also the coded warnings with their sources (any page), a matrix pair at the
// service conditions and the measured joint's published judgement at them.
import { evansChart } from "./evanschart.mjs";
import { mathNodes } from "./math.mjs";
import { materialName } from "./names.mjs";
import { serviceUsed, sig } from "./serviceform.mjs";
import { fmt, h, sourceLink } from "./ui.mjs";

const mm = (x) => (typeof x === "number" ? sig(x) + " mm/year" : "—");
const volts = (x) => fmt(x, 3) + " V vs SCE";

// A current with its prefix: 2.94 µA, 0.189 mA.
function amps(x) {
  const a = Math.abs(x);
  const [f, u] = a >= 1 ? [1, "A"] : a >= 1e-3 ? [1e-3, "mA"] : a >= 1e-6 ? [1e-6, "µA"] : [1e-9, "nA"];
  return sig(x / f) + " " + u;
}

// The warnings of a result, each with its code and its source (or the basis it quotes).
export function codedWarnings(warnings) {
  if (!warnings || !warnings.length) return null;
  return h("ul", { class: "cw-warnings" }, warnings.map((w) => {
    const text = typeof w === "string" ? w : w.message || "";
    const whence = w && w.code ? h("span", { class: "cw-warn-code" }, " (", h("code", { text: w.code }),
      w.source ? [": ", sourceLink(w.source)] : w.basis ? [": " + w.basis] : null, ")") : null;
    return h("li", { class: "cw-warning", "data-code": w && w.code ? w.code : null },
      h("span", { class: "cw-badge cw-badge-warn", text: "check" }), " ", mathNodes(text), whence);
  }));
}

// A part's state and passivity in plain words.
function passivityWords(p, ds) {
  const pv = p.passivity || {};
  const nums = [pv.pren !== null && pv.pren !== undefined ? "PREN " + sig(pv.pren) : null,
    pv.cpt_C !== null && pv.cpt_C !== undefined ? "CPT about " + sig(pv.cpt_C) + " °C" : null,
    pv.cct_C !== null && pv.cct_C !== undefined ? "CCT about " + sig(pv.cct_C) + " °C" : null].filter(Boolean).join(", ");
  let head;
  if (p.state_used !== p.id) head = "Judged in its active state (" + materialName(ds, p.state_used) + "): its passivity does not hold at these conditions.";
  else if (pv.holds === true) head = "Stays passive at these conditions.";
  else if (pv.holds === false) head = "Not passive at these conditions.";
  else head = "No passivity judgement: the data hold one state of it.";
  return h("div", { class: "cw-passivity" + (p.state_used !== p.id ? " cw-judged-active" : "") },
    h("strong", { text: head }), nums ? " " + nums + "." : null,
    pv.reason && pv.holds !== null && pv.holds !== undefined ? h("details", { class: "cw-why-passive" },
      h("summary", { text: "Why" }), h("p", {}, mathNodes(pv.reason))) : null);
}

// A part's name short enough for a label on the chart: its state first, no other parenthesis.
function chartName(name) {
  const state = /\((active|passive)\)/.exec(name);
  const base = name.replace(/\s*\([^)]*\)/g, "").replace(/^(Austenitic|Ferritic|Martensitic) /, "").replace("stainless steel", "stainless");
  return state ? state[1] + " " + base : base;
}

// The evans object with the parts' names in place of their ids (labels and key read as words).
function named(ev, ds) {
  const ids = Object.keys(ev.areas_cm2 || {});
  for (const c of ev.curves || []) if (!ids.includes(c.electrode)) ids.push(c.electrode);
  const nm = (id) => chartName(materialName(ds, id));
  const reaction = (t) => ids.reduce((s, id) => s.replace(" on " + id, "").replace(id + " ", ""), t);
  return { ...ev,
    curves: ev.curves.map((c) => ({ ...c, electrode: nm(c.electrode), reaction: reaction(c.reaction) })),
    exchange_points: (ev.exchange_points || []).map((p) => ({ ...p, electrode: nm(p.electrode), reaction: reaction(p.reaction) })),
    free_corrosion_points: (ev.free_corrosion_points || []).map((p) => ({ ...p, electrode: nm(p.electrode) })) };
}

function evansFigure(r, ds) {
  const ev = r.evans;
  if (!ev) return null;
  const areas = Object.entries(ev.areas_cm2 || {}).map(([id, a]) => materialName(ds, id) + " " + sig(a) + " cm²").join(", ");
  const given = r.service_conditions && r.service_conditions.anode_area_cm2;
  return evansChart(named(ev, ds), {
    title: "Evans diagram of the joint at its service conditions",
    potentialLabel: "E (" + (ev.scale || "V vs SCE") + ")",
    caption: "Each branch is its part's current density × its wetted area (" + areas + (given ? "" : "; the anode taken as the unit area, the cathode by the area ratio") +
      "). The kinetics are the dataset's polarization estimates (mostly recalled, see below): a picture of the judgement, not a measurement.",
  });
}

// The parts of the answer, one card each (readable on a tablet): role, area, the state it was
// judged in and its passivity in words, its attack coupled and alone, and the change.
function partsList(r, ds) {
  const a = r.assessment;
  const byId = new Map((a.parts || []).map((p) => [p.id, p]));
  return h("ul", { class: "cw-parts" }, (r.parts || []).map((p) => {
    const q = byId.get(p.id) || {};
    return h("li", { class: "cw-part", "data-part": p.id },
      h("p", { class: "cw-part-head" }, h("strong", { text: p.name || materialName(ds, p.id) }),
        " — " + (q.role || "") + (q.area_cm2 ? ", " + sig(q.area_cm2) + " cm²" : "")),
      passivityWords(p, ds),
      h("p", { class: "cw-part-rates" }, "Attack coupled ", h("strong", { "data-cw-value": "penetration_mm_per_year", text: mm(q.penetration_mm_per_year) }),
        "; on its own " + mm(q.free_penetration_mm_per_year) + "; coupled ÷ alone ",
        h("strong", { "data-cw-value": "change_ratio", text: typeof q.change_ratio === "number" ? "× " + sig(q.change_ratio) : "—" })));
  }));
}

// Where the polarization data came from (read, recalled, computed), with their sources.
function kineticsLine(a, ds) {
  const recs = a.kinetics || [];
  if (!recs.length) return null;
  const sources = [...new Set(recs.flatMap((k) => (k.lines || []).map((l) => l.source)).filter(Boolean))];
  return h("p", { class: "cw-reason" }, "Polarization data: " + recs.map((k) => materialName(ds, k.id) + " " + (k.confidence || "")).join("; ") + " (",
    ...sources.flatMap((s, i) => (i ? [", ", sourceLink(s)] : [sourceLink(s)])), ").");
}

function screenText(r) {
  const rate = r.rate_mm_per_year;
  if (!rate) return "not estimated" + (r.rate_reason ? ": " + r.rate_reason : "");
  return rate[0] === rate[1] ? mm(rate[0]) : sig(rate[0]) + " to " + mm(rate[1]);
}

// The section of the joint's result at its service conditions (null where it has none).
export function jointMix(r, ds) {
  if (!r.service_conditions && !r.assessment_reason) return null;
  const head = h("h3", { text: "At the service conditions: the mixed-potential answer" });
  const a = r.assessment;
  if (!a) {
    return h("section", { class: "cw-mix", "aria-label": "Joint at the service conditions" }, head,
      h("p", { class: "cw-pending", text: "No mixed-potential judgement: " + (r.assessment_reason || "") + "." }),
      serviceUsed(r.service_conditions, r.oxygen_supply));
  }
  const anode = (a.parts || []).find((p) => p.role === "anode");
  const ir = a.with_ir;
  const rows = [
    ["Couple potential", volts(a.couple_potential_V_SCE), "couple_potential_V_SCE"],
    ["Galvanic current", amps(a.galvanic_current_A) + " (" + sig(a.galvanic_current_density_on_anode_uA_per_cm2) + " µA/cm² on the anode)", "galvanic_current_A"],
    ["Anode (attacked)", anode ? materialName(ds, anode.state_used) : "—", null],
    anode ? ["Its attack coupled, and alone", mm(anode.penetration_mm_per_year) + "; alone " + mm(anode.free_penetration_mm_per_year) +
      (typeof anode.change_ratio === "number" ? " (× " + sig(anode.change_ratio) + ")" : ""), null] : null,
    ir ? ["With the electrolyte's resistance", mm(ir.anode_penetration_mm_per_year) + " away from the line of contact (" + sig(100 * ir.attack_ratio_to_metallic_contact) +
      " % of the metallic-contact answer); R " + sig(ir.resistance_ohm) + " Ω, IR drop " + sig(1000 * ir.ir_drop_V) + " mV", "with_ir"] : null,
  ].filter(Boolean);
  return h("section", { class: "cw-mix", "aria-label": "Joint at the service conditions" }, head,
    h("div", { class: "cw-mix-answer" },
      h("div", { class: "cw-mix-main" },
        h("p", { class: "cw-mix-label", text: "Attack on the anode at these conditions" }),
        h("p", { class: "cw-mix-value", "data-cw-value": "attack_mm_per_year", text: mm(r.attack_mm_per_year) }),
        h("p", { class: "cw-reason", text: "Mixed potential of the two parts' kinetics: its own oxygen reduction included." })),
      h("div", { class: "cw-mix-screen" },
        h("p", { class: "cw-mix-label", text: "Upper-bound screen" }),
        h("p", { class: "cw-mix-value", "data-cw-value": "rate_mm_per_year", text: screenText(r) }),
        h("p", { class: "cw-reason", text: "i_L·(1 + A_c/A_a): all the oxygen-limited current taken to leave through the anode. An upper bound, not a prediction." }))),
    h("table", { class: "cw-mix-table" }, h("tbody", {}, rows.map(([k, v, key]) =>
      h("tr", {}, h("th", { text: k }), h("td", { "data-cw-value": key, text: v }))))),
    serviceUsed(r.service_conditions, r.oxygen_supply),
    h("h4", { text: "The parts" }), partsList(r, ds),
    r.effects && r.effects.length ? [h("h4", { text: "What the conditions do" }),
      h("ul", { class: "cw-effects" }, r.effects.map((e) => h("li", {}, mathNodes(e))))] : null,
    h("h4", { text: "Evans diagram" }), evansFigure(r, ds), kineticsLine(a, ds),
    a.assumptions && a.assumptions.length ? h("details", { class: "cw-assumptions" }, h("summary", { text: "Assumptions of the mixed-potential answer" }),
      h("ul", {}, a.assumptions.map((t) => h("li", {}, mathNodes(t))))) : null);
}

// A matrix pair at the service conditions (result.service_pairs[k]), for the cell's panel.
export function servicePair(r, k, names) {
  if (!("service_pairs" in r) && !r.service_pairs_reason) return null;
  const row = r.service_pairs ? r.service_pairs[k] : null;
  if (!row) {
    return h("p", { class: "cw-sc-pair" }, h("strong", { text: "At the service conditions: " }),
      "not computed" + (r.service_pairs_reason ? ": " + r.service_pairs_reason : "") + ".");
  }
  const o = {};
  (r.service_pair_fields || []).forEach((f, i) => { o[f] = row[i]; });
  return h("p", { class: "cw-sc-pair" }, h("strong", { text: "At the service conditions (equal areas, mixed potential): " }),
    names(r.materials[o.anode]) + " is the anode at " + volts(o.couple_potential_V_SCE) + ", attacked at ",
    h("span", { "data-cw-value": "anode_attack_mm_per_year", text: mm(o.anode_attack_mm_per_year) }),
    typeof o.anode_uncoupled_mm_per_year === "number" ? " (alone " + mm(o.anode_uncoupled_mm_per_year) + ")." : ".");
}

// The measured joint's published judgement at the service conditions (published.at_service).
export function atService(pub, ds) {
  const s = pub && pub.at_service;
  if (!s) return null;
  return h("div", { class: "cw-at-service" },
    h("p", {}, h("strong", { text: "At the service conditions (mixed potential of the published kinetics): " }),
      materialName(ds, s.anode) + " is the anode at " + volts(s.couple_potential_V_SCE) + ", attacked at ",
      h("span", { "data-cw-value": "attack_mm_per_year", text: mm(s.attack_mm_per_year) }), "."),
    serviceUsed(s.service_conditions, null));
}
