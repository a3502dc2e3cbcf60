// Passivity: will a stainless steel or nickel alloy stay passive at the service temperature and
// chloride? PREN from the composition, the CPT and CCT estimates, and calc's judgement with the
// published rules it rests on (entry point "passivity").
import { bindForm, runner } from "./runner.mjs";
import {
  allowed, begin, cautionsBox, derivation, field, fieldMap, fieldText, fill, fmt, h, hint, numberInput, readInto, select,
  sourceLink, sourcesLine, warningsList, writeUrl,
} from "./ui.mjs";

const CAUTIONS = [
  "PREN, CPT and CCT here are screening estimates from the composition: they rank alloys, they do not qualify one. " +
    "The CPT and CCT formulas are recalled, not re-read in ASTM G48.",
  "Heat treatment, welds and their heat tint, surface finish, crevice geometry (gaskets, fasteners, deposits), biofilm, " +
    "chlorination and flow decide more than a point of PREN.",
  "Before relying on a passive state, test the actual material (ASTM G48, or the electrochemical CPT of ASTM G150) and " +
    "qualify it for the service under the applicable standards, with a corrosion specialist where safety is at stake.",
];
const COMPOSITION = [
  ["cr", "Chromium, Cr (wt %)"], ["mo", "Molybdenum, Mo (wt %)"], ["n", "Nitrogen, N (wt %)"],
  ["w", "Tungsten, W (wt %), optional"],
];

// The grades of the dataset whose composition holds chromium (one entry per alloy, its passive record).
function gradeOptions(ds) {
  const out = [];
  for (const m of ds.materials) {
    const c = m.composition_wt_pct;
    if (!c || !(c.Cr >= 10.5) || m.state === "active") continue;
    out.push({ value: m.id, label: m.name.replace(/ \(passive\)$/, "") + (m.uns && m.uns.length ? " (" + m.uns.join(", ") + ")" : ""), m });
  }
  return out;
}

export async function passivity(root) {
  const { ui, ds, sp, start, params } = await begin(root, "Passivity", "passivity");
  const grades = gradeOptions(ds);
  const gradeField = field("cw-pv-grade", "Fill the composition from a grade of the dataset (optional)",
    select([{ value: "", label: "— type the composition below —" }, ...grades.map(({ value, label }) => ({ value, label }))], ""));
  const gradeNote = h("p", { class: "cw-pv-grade-note", "aria-live": "polite" });
  const f = {};
  for (const [key, label] of COMPOSITION) {
    f[key] = field("cw-pv-" + key, label, numberInput(params.get(key) ?? start[key]), key === "w" ? "empty when none; then PREN without W" : "wt %");
  }
  const tField = field("cw-pv-t", "Service temperature (°C)", numberInput(params.get("t") ?? start.temp_C), hint(sp, "temp_C", "empty: 25 °C"));
  const waterKind = params.get("water") === "chloride" ? "chloride" : params.get("water") === "salinity" ? "salinity"
    : start.chloride_mg_per_L !== undefined ? "chloride" : "salinity";
  const kindField = field("cw-pv-water", "The water given as", select([
    { value: "salinity", label: "salinity (g/kg), seawater-type" }, { value: "chloride", label: "chloride (mg/L)" }], waterKind));
  const wvField = field("cw-pv-wv", "Salinity (g/kg)", numberInput(params.get("wv") ?? (waterKind === "chloride" ? start.chloride_mg_per_L : start.salinity)));
  const wvHelp = () => {
    const chloride = kindField.control.value === "chloride";
    wvField.el.querySelector("label").textContent = chloride ? "Chloride (mg/L)" : "Salinity (g/kg)";
    let help = wvField.el.querySelector(".cw-field-help");
    if (!help) { help = h("div", { class: "cw-field-help" }); wvField.msg.before(help); }
    help.textContent = hint(sp, chloride ? "chloride_mg_per_L" : "salinity", "empty: seawater of salinity 35");
  };
  wvHelp();
  ui.formBox.append(h("div", { class: "cw-row" }, gradeField.el), gradeNote,
    h("div", { class: "cw-row" }, f.cr.el, f.mo.el), h("div", { class: "cw-row" }, f.n.el, f.w.el),
    h("div", { class: "cw-row" }, tField.el, kindField.el, wvField.el));

  gradeField.control.addEventListener("change", () => {
    const g = grades.find((x) => x.value === gradeField.control.value);
    if (!g) { gradeNote.replaceChildren(); return; }
    const c = g.m.composition_wt_pct;
    f.cr.control.value = fieldText(c.Cr);
    f.mo.control.value = fieldText(c.Mo ?? 0);
    f.n.control.value = fieldText(c.N ?? 0);
    f.w.control.value = c.W !== undefined ? fieldText(c.W) : "";
    const missing = ["Mo", "N"].filter((k) => c[k] === undefined);
    fill(gradeNote, "Filled from ", h("strong", { text: g.label }), ": its nominal composition (" + (g.m.composition_confidence || "confidence not stated") + "; source ",
      g.m.composition_source ? sourceLink(g.m.composition_source) : "not given", ")" +
      (missing.length ? "; " + missing.join(" and ") + " not in the data, taken as 0" : "") +
      ". A grade's range is wide: enter the values of your material's certificate.");
  });
  for (const k of Object.keys(f)) {
    f[k].control.addEventListener("input", () => { if (gradeField.control.value) { gradeField.control.value = ""; gradeNote.replaceChildren(); } });
  }
  kindField.control.addEventListener("change", wvHelp);

  function collect() {
    let bad = false;
    const req = {};
    const p = new URLSearchParams();
    for (const [key] of COMPOSITION) {
      const text = f[key].control.value.trim();
      p.set(key, text);
      if (key === "w" && text === "") { f.w.setError(""); continue; }
      bad = readInto(f[key], req, key, "a share in wt %") || bad;
    }
    const t = tField.control.value.trim();
    p.set("t", t);
    if (t !== "") bad = readInto(tField, req, "temp_C", allowed(sp, "temp_C", "a temperature")) || bad;
    else tField.setError("");
    const chloride = kindField.control.value === "chloride";
    const wv = wvField.control.value.trim();
    p.set("water", kindField.control.value); p.set("wv", wv);
    if (wv !== "") {
      bad = readInto(wvField, req, chloride ? "chloride_mg_per_L" : "salinity",
        chloride ? allowed(sp, "chloride_mg_per_L", "a chloride content") : allowed(sp, "salinity", "a salinity")) || bad;
    } else wvField.setError("");
    writeUrl(p);
    return { req, bad };
  }
  const fieldFor = fieldMap({ cr: f.cr, mo: f.mo, n: f.n, w: f.w, "temp*": tField, salinity: wvField, chloride_mg_per_L: wvField });

  function render(r) {
    const holds = !!r.holds;
    const given = { given: "given", "from salinity": "from the salinity given" }[r.chloride_given] || r.chloride_given;
    const value = (name, text) => h("td", { "data-cw-value": name, text });
    fill(ui.result,
      h("p", { class: "cw-big" }, h("span", { class: "cw-pv-verdict " + (holds ? "cw-pv-holds" : "cw-pv-fails"), "data-cw-value": "holds" },
        holds ? "Judged passive" : "Judged not passive")),
      h("p", { class: "cw-direction", text: r.reason.replace(/^judged (not )?passive: /, "Why: ") }),
      h("table", { class: "cw-compare cw-pv-out" }, h("tbody", {},
        h("tr", {}, h("th", { text: r.pren_formula.startsWith("PREN_W") ? "PREN_W (with tungsten)" : "PREN" }), value("pren", fmt(r.pren, 2)),
          h("td", { class: "cw-reason", text: r.pren_formula + "; computed from the composition given" })),
        h("tr", {}, h("th", { text: "CPT, estimated" }), value("cpt_C", "≈ " + fmt(r.cpt_C, 1) + " °C"),
          h("td", { class: "cw-reason", text: "ASTM G48 Method E start temperature, estimate formula " + r.estimates_confidence })),
        h("tr", {}, h("th", { text: "CCT, estimated" }), value("cct_C", "≈ " + fmt(r.cct_C, 1) + " °C"),
          h("td", { class: "cw-reason", text: "ASTM G48 Method F start temperature, estimate formula " + r.estimates_confidence })),
        h("tr", {}, h("th", { text: "Service temperature" }), h("td", { text: fmt(r.temp_C, 1) + " °C" }),
          h("td", { class: "cw-reason", text: r.temp_given ? "given" : "not given: 25 °C assumed" })),
        h("tr", {}, h("th", { text: "Chloride" }), h("td", { text: Math.round(r.chloride_mg_per_L).toLocaleString("en-GB").replace(/,/g, "\u2009") + " mg/L" }),
          h("td", { class: "cw-reason", text: given })))),
      h("h3", { text: "The rules applied" }),
      r.checks && r.checks.length ? h("table", { class: "cw-pv-checks" },
        h("thead", {}, h("tr", {}, ["Rule", "Met?", "At these conditions"].map((t) => h("th", { scope: "col", text: t })))),
        h("tbody", {}, r.checks.map((c) => h("tr", {}, h("td", { text: c.rule }),
          h("td", { class: "cw-pv-met", text: c.passed ? "met" : "not met" }), h("td", { text: c.words }))))) : null,
      h("p", {}, h("strong", { text: "Published basis: " })),
      h("ul", { class: "cw-pv-basis" }, (r.basis || []).map((b) => h("li", { text: b }))),
      warningsList(r.warnings),
      cautionsBox(CAUTIONS),
      derivation(r.steps),
      r.sources && r.sources.length ? sourcesLine(r.sources, r.data_version) : h("p", { class: "cw-sources" },
        "Computed from the composition and conditions entered; the published basis of each rule is listed above.",
        h("span", { class: "cw-data-tag", text: " · data version " + r.data_version })));
  }
  bindForm(ui, runner(ui, "passivity", render, fieldFor), collect);
}
