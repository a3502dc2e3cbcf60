// Electrode: one half-reaction at a temperature, activities (or molalities through a model).
import { lineChart } from "./charts.mjs";
import { mathText } from "./math.mjs";
import { runner } from "./runner.mjs";
import {
  ACTIVITY_MODELS, allowed, begin, derivation, field, fieldMap, fieldText, fill, fmt, h, hint, known, numberInput,
  readInto, select, signed, sourcesLine, speciesField, speciesOf, warningsList, writeUrl,
} from "./ui.mjs";

const KINDS = {  // how a species is given: request key, URL prefix, bound, label, noun
  g: { key: "pressures", prefix: "p.", bound: "pressure_atm", label: (n) => "Partial pressure of " + n + " (atm)", noun: "a pressure" },
  molality: { key: "molalities", prefix: "m.", bound: "molality", label: (n) => "Molality of " + n + " (mol/kg)", noun: "a molality" },
  activity: { key: "activities", prefix: "a.", bound: "activity", label: (n) => "Activity of " + n, noun: "an activity" },
};

export async function electrode(root) {
  const { ui, ds, sp, start, params } = await begin(root, "Electrode potential", "electrode");
  const reactions = [...ds.half_reactions].sort((x, y) => x.E0_V - y.E0_V);
  const byId = new Map(reactions.map((r) => [r.id, r]));
  const opts = reactions.map((r) => ({ value: r.id, label: mathText(r.id) + "  (E° " + signed(r.E0_V, 3) + " V)" }));
  const models = new Set(ACTIVITY_MODELS.map((m) => m.value));
  const mode = params.get("mode") ?? (start.molalities ? "molality" : "activity");
  const idField = field("cw-id", "Half-reaction", select(opts, known(new Set(byId.keys()), params.get("id"), start.id)));
  const tField = field("cw-t", "Temperature (°C)", numberInput(params.get("t") ?? start.temp_C), hint(sp, "temp_C"));
  const phField = field("cw-ph", "pH", numberInput(params.get("pH") ?? start.pH), hint(sp, "pH"));
  const modeField = field("cw-mode", "Dissolved species given as", select([{ value: "activity", label: "activities" }, { value: "molality", label: "molalities (mol/kg) through an activity model" }], mode === "molality" ? "molality" : "activity"));
  // model and ionic strength: shown in molality mode only (the opening request sends activities)
  const modelField = field("cw-model", "Activity model", select(ACTIVITY_MODELS, known(models, params.get("model"), start.model ?? "davies")));
  const envOpts = [{ value: "", label: "ionic strength typed below" }, ...ds.environments.filter((e) => e.ionic_strength_mol_per_kg).map((e) => ({ value: e.id, label: e.name + " (I ≈ " + e.ionic_strength_mol_per_kg + " mol/kg)" }))];
  const envField = field("cw-env", "Ionic strength from", select(envOpts, params.get("env") || start.env || ""));
  const iField = field("cw-i", "Ionic strength I (mol/kg)", numberInput(params.get("I") ?? start.ionic_strength ?? 0.01), hint(sp, "ionic_strength"));
  const condBox = h("fieldset", { class: "cw-conditions" });
  const modelRow = h("div", { class: "cw-row" }, modelField.el, envField.el, iField.el);
  ui.formBox.append(h("div", { class: "cw-row" }, idField.el, tField.el, phField.el), h("div", { class: "cw-row" }, modeField.el), modelRow, condBox);
  const charts = h("div", { class: "cw-charts" });
  let speciesFields = new Map();

  function kindOf(phase, mol) { return KINDS[phase === "g" ? "g" : mol ? "molality" : "activity"]; }

  function rebuild() {
    const { seen, needsPH } = speciesOf([byId.get(idField.control.value)]);
    const old = speciesFields;
    speciesFields = new Map();
    const mol = modeField.control.value === "molality";
    condBox.replaceChildren(h("legend", { text: seen.size ? (mol ? "Molalities and pressures" : "Activities and pressures") : "No dissolved or gaseous species other than H+/OH-" }));
    for (const [name, phase] of seen) {
      const kind = kindOf(phase, mol);
      const prev = old.get(name);
      const opening = (start[kind.key] || {})[name] ?? (start.activities || {})[name] ?? 1;
      const val = prev && prev.mol === mol ? prev.control.value : params.get(kind.prefix + name) ?? fieldText(opening);
      const f = field("cw-sp-" + name.replace(/[^A-Za-z0-9]/g, "_"), kind.label(name), numberInput(val), hint(sp, kind.bound));
      f.phase = phase; f.mol = mol;
      speciesFields.set(name, f);
      condBox.append(f.el);
    }
    phField.el.hidden = !needsPH;
    modelRow.hidden = !mol;
    iField.el.hidden = !mol || envField.control.value !== "";
  }

  function collect() {
    let bad = false;
    const p = new URLSearchParams();
    const req = { id: idField.control.value };
    p.set("id", req.id);
    bad = readInto(tField, req, "temp_C", allowed(sp, "temp_C", "a temperature")) || bad;
    p.set("t", tField.control.value.trim());
    if (!phField.el.hidden) {
      bad = readInto(phField, req, "pH", allowed(sp, "pH", "a pH")) || bad;
      p.set("pH", phField.control.value.trim());
    }
    const mol = modeField.control.value === "molality";
    if (mol) {
      p.set("mode", "molality");
      req.model = modelField.control.value; p.set("model", req.model);
      if (envField.control.value) { req.env = envField.control.value; p.set("env", req.env); }
      else {
        bad = readInto(iField, req, "ionic_strength", allowed(sp, "ionic_strength", "an ionic strength")) || bad;
        p.set("I", iField.control.value.trim());
      }
    }
    const given = {};
    for (const [name, f] of speciesFields) {
      const kind = kindOf(f.phase, mol);
      given[kind.key] = given[kind.key] || {};
      bad = readInto(f, given[kind.key], name, allowed(sp, kind.bound, kind.noun)) || bad;
      p.set(kind.prefix + name, f.control.value.trim());
    }
    for (const kind of [KINDS.activity, KINDS.molality, KINDS.g]) {
      if (given[kind.key] && Object.keys(given[kind.key]).length) req[kind.key] = given[kind.key];
    }
    writeUrl(p);
    return { req, bad };
  }

  const fieldFor = fieldMap({ "temp*": tField, pH: phField, id: idField, "ionic*": iField, model: modelField, env: envField },
    (name) => speciesField(speciesFields, name));

  // Potential against temperature and against the first ion's activity: the curves come with the
  // result (calc computes them with the potential), so one change of input is one calculation.
  function drawCharts(req, r) {
    const c = r.curves || {};
    const pts = (xs, ys) => xs.map((x, k) => [x, ys[k]]).filter((p) => typeof p[1] === "number");
    const nodes = [];
    if (c.temperature) {
      nodes.push(lineChart({ title: "Potential against temperature", xLabel: "temperature (°C)", yLabel: "E (V vs SHE)",
        series: [{ name: r.id, points: pts(c.temperature.temp_C, c.temperature.potential_V) }], marker: [r.temp_C, r.potential_V] }));
    }
    const a = c.activity;
    if (a && req.activities && req.activities[a.species] !== undefined) {
      nodes.push(lineChart({ title: "Potential against log activity of " + a.species, xLabel: "log₁₀ a(" + a.species + ")", yLabel: "E (V vs SHE)",
        series: [{ name: a.species, points: pts(a.log10_activity, a.potential_V) }], marker: [Math.log10(req.activities[a.species]), r.potential_V] }));
    }
    charts.replaceChildren(...nodes);
  }

  // The result on the scales field engineers read (calc's potential_vs, each electrode at the
  // request's temperature), with calc's notes on those electrodes.
  function scalesTable(r) {
    const vs = r.potential_vs || {};
    const ids = Object.keys(vs);
    const detail = r.potential_vs_detail || {};
    if (!ids.length) return warningsList(detail.warnings);
    return h("div", { class: "cw-scales" },
      h("p", { class: "cw-scales-title", text: "On the scales of field work (each electrode at " + fmt(r.temp_C, 1) + " °C):" }),
      h("table", { class: "cw-compare" },
        h("thead", {}, h("tr", {}, h("th", { text: "Against" }), h("th", { text: "E (V)" }))),
        h("tbody", {}, ids.map((id) => h("tr", {}, h("th", { scope: "row", text: id }),
          h("td", { "data-cw-scale": id, text: signed(vs[id]) }))))),
      warningsList(detail.warnings));
  }

  function render(r, req) {
    const more = r.potential_vs_detail || {};
    fill(ui.result,
      h("p", { class: "cw-big" }, h("span", { class: "cw-big-label", text: "E " }), h("span", { class: "cw-big-value", "data-cw-value": "potential_V", text: signed(r.potential_V) }), h("span", { class: "cw-unit", text: " V vs SHE" })),
      h("p", { class: "cw-direction", text: "E° at " + fmt(r.temp_C, 1) + " °C: " + signed(r.standard_potential_V) + " V vs SHE; your conditions shift it by " + signed(r.potential_V - r.standard_potential_V) + " V." }),
      r.hypothetical ? h("p", { class: "cw-warning", text: "Hypothetical couple: its ion is not stable in water; the value is a thermodynamic estimate." }) : null,
      warningsList(r.warnings), scalesTable(r), charts, derivation([...(r.steps || []), ...(more.steps || [])]),
      sourcesLine([...new Set([...(r.sources || []), ...(more.sources || [])])], r.data_version));
    drawCharts(req, r);
  }
  const run = runner(ui, "electrode", render, fieldFor);
  function changed(rb) { if (rb) rebuild(); const { req, bad } = collect(); run.schedule(req, bad); }
  for (const f of [idField, modeField, envField, modelField]) f.control.addEventListener("change", () => changed(true));
  ui.formBox.addEventListener("input", (e) => { if (e.target.tagName === "INPUT") changed(false); });
  rebuild();
  const first = collect();
  run.now(first.req, first.bad);
}
