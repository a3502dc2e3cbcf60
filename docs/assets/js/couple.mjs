// Couple: two half-reactions at a temperature and activities; which is oxidised, E_cell, ΔG, K,
// and the E–pH chart of the two couples between the water lines (carried by the same result).
import { lineChart } from "./charts.mjs";
import { runner } from "./runner.mjs";
import {
  allowed, begin, derivation, field, fieldMap, fieldText, fill, fmt, h, hint, known, numberInput, readInto, select,
  signed, sourcesLine, speciesField, speciesOf, warningsList, writeUrl,
} from "./ui.mjs";

export async function couple(root) {
  const { ui, ds, sp, start, params } = await begin(root, "Couple", "couple");
  const reactions = [...ds.half_reactions].sort((x, y) => x.E0_V - y.E0_V);
  const byId = new Map(reactions.map((r) => [r.id, r]));
  const ids = new Set(byId.keys());
  const opts = reactions.map((r) => ({ value: r.id, label: r.id + "  (E° " + signed(r.E0_V, 3) + " V)" + (r.hypothetical ? " hypothetical" : "") }));
  const aField = field("cw-a", "First half-reaction", select(opts, known(ids, params.get("a"), start.a)));
  const bField = field("cw-b", "Second half-reaction", select(opts, known(ids, params.get("b"), start.b)));
  const tField = field("cw-t", "Temperature (°C)", numberInput(params.get("t") ?? start.temp_C), hint(sp, "temp_C"));
  const phField = field("cw-ph", "pH", numberInput(params.get("pH") ?? start.pH), hint(sp, "pH"));
  const condBox = h("fieldset", { class: "cw-conditions" });
  ui.formBox.append(h("div", { class: "cw-row" }, aField.el, bField.el), h("div", { class: "cw-row" }, tField.el, phField.el), condBox);
  let speciesFields = new Map();

  function rebuildConditions() {
    const { seen, needsPH } = speciesOf([byId.get(aField.control.value), byId.get(bField.control.value)]);
    const old = speciesFields;
    speciesFields = new Map();
    condBox.replaceChildren(h("legend", { text: seen.size ? "Activities and pressures" : "No dissolved or gaseous species other than H+/OH-" }));
    for (const [name, phase] of seen) {
      const gas = phase === "g";
      const prev = old.get(name);
      const opening = (gas ? start.pressures : start.activities) || {};
      const val = prev ? prev.control.value : params.get((gas ? "p." : "a.") + name) ?? fieldText(opening[name] ?? 1);
      const label = gas ? "Partial pressure of " + name + " (atm)" : "Activity of " + name;
      const f = field("cw-sp-" + name.replace(/[^A-Za-z0-9]/g, "_"), label, numberInput(val),
        gas ? hint(sp, "pressure_atm", "1 atm is standard") : hint(sp, "activity"));
      f.phase = phase;
      speciesFields.set(name, f);
      condBox.append(f.el);
    }
    phField.el.hidden = !needsPH;
  }

  function collect() {
    let bad = false;
    const req = { a: aField.control.value, b: bField.control.value };
    const p = new URLSearchParams();
    p.set("a", req.a); p.set("b", req.b);
    bad = readInto(tField, req, "temp_C", allowed(sp, "temp_C", "a temperature")) || bad;
    p.set("t", tField.control.value.trim());
    if (!phField.el.hidden) {
      bad = readInto(phField, req, "pH", allowed(sp, "pH", "a pH")) || bad;
      p.set("pH", phField.control.value.trim());
    } else phField.setError("");
    req.activities = {}; req.pressures = {};
    for (const [name, f] of speciesFields) {
      const gas = f.phase === "g";
      bad = readInto(f, gas ? req.pressures : req.activities, name,
        gas ? allowed(sp, "pressure_atm", "a pressure") : allowed(sp, "activity", "an activity")) || bad;
      p.set((gas ? "p." : "a.") + name, f.control.value.trim());
    }
    writeUrl(p);
    return { req, bad };
  }

  const fieldFor = fieldMap({ "temp*": tField, pH: phField, a: aField, b: bField },
    (name) => (name.endsWith(".a") ? aField : name.endsWith(".b") ? bField : speciesField(speciesFields, name)));

  // E–pH picture: the water stability lines and both couples' lines against pH at the stated
  // temperature and activities (pH-dependent couples show as slopes). calc computes the lines
  // with the couple itself (result.eph: H+/H2, O2/H2O, first, second): no second request.
  const ephBox = h("div", { class: "cw-charts" });
  const DASHES = ["2 4", "2 4", "none", "8 3"];
  function drawEpH(req, r) {
    const eph = r.eph;
    if (!eph) { ephBox.replaceChildren(); return; }
    if (eph.error) {  // never leave the chart of other inputs standing
      ephBox.replaceChildren(h("p", { class: "cw-pending", text: "E–pH chart not drawn: " + eph.error.message }));
      return;
    }
    const series = eph.lines.map((ln, i) => ({ name: ln.id, dash: DASHES[i],
      points: eph.pH.map((pH, k) => [pH, ln.potential_V[k]]) }));
    const anode = r.anode_electrode || {};
    const phNow = req.pH !== undefined ? req.pH : 7;
    ephBox.replaceChildren(lineChart({
      title: "E–pH: water stability lines and the two couples", xLabel: "pH", yLabel: "E (V vs SHE)",
      desc: "Between the dotted H+/H2 and O2/H2O lines water is stable; a couple whose line lies below the H+/H2 line can reduce water to hydrogen at that pH.",
      series, legendRight: true, marker: anode.potential_V !== undefined ? [phNow, anode.potential_V] : null, markerLabel: "anode, your conditions",
    }));
    performance.mark("cw-chart-painted");
  }

  function render(r, req) {
    const an = r.anode, ca = r.cathode;
    const tbl = h("table", { class: "cw-compare" },
      h("thead", {}, h("tr", {}, h("th", { text: "Quantity" }), h("th", { text: "At your conditions" }), h("th", { text: "At unit activities, same temperature" }))),
      h("tbody", {},
        h("tr", {}, h("td", { text: "Cell potential E (V)" }), h("td", { text: signed(r.cell_potential_V) }), h("td", { text: signed(r.standard_cell_potential_V) })),
        h("tr", {}, h("td", { text: "ΔG (kJ/mol of reaction)" }), h("td", { text: signed(r.delta_G_kJ_per_mol, 2) }), h("td", { text: r.standard_delta_G_kJ_per_mol !== undefined ? signed(r.standard_delta_G_kJ_per_mol, 2) : "" })),
        h("tr", {}, h("td", { text: "Electrons transferred n" }), h("td", { text: String(r.n_electrons) }), h("td", { text: String(r.n_electrons) })),
        h("tr", {}, h("td", { text: "Equilibrium constant K (from E° at this temperature)" }), h("td", { colspan: "2", text: r.equilibrium_constant !== null && r.equilibrium_constant !== undefined ? fmt(r.equilibrium_constant) + (r.log10_K !== undefined ? "  (log₁₀ K = " + fmt(r.log10_K, 2) + ")" : "") : (r.log10_K !== undefined ? "log₁₀ K = " + fmt(r.log10_K, 2) : "n/a") }))));
    fill(ui.result,
      h("p", { class: "cw-big" }, h("span", { class: "cw-big-label", text: "E cell " }), h("span", { class: "cw-big-value", "data-cw-value": "cell_potential_V", text: signed(r.cell_potential_V) }), h("span", { class: "cw-unit", text: " V" })),
      h("p", { class: "cw-direction" }, h("strong", { text: an }), " is oxidised (the anode); ", h("strong", { text: ca }), " is reduced (the cathode)."),
      h("p", { class: "cw-reaction" }, "Overall: ", h("span", { class: "cw-formula", text: r.overall_reaction })),
      warningsList(r.warnings), tbl, ephBox, derivation(r.steps), sourcesLine(r.sources, r.data_version));
    drawEpH(req, r);
  }

  const run = runner(ui, "couple", render, fieldFor);
  function changed(rebuild) {
    if (rebuild) rebuildConditions();
    const { req, bad } = collect();
    run.schedule(req, bad);
  }
  aField.control.addEventListener("change", () => changed(true));
  bField.control.addEventListener("change", () => changed(true));
  ui.formBox.addEventListener("input", (e) => { if (e.target.tagName === "INPUT") changed(false); });
  rebuildConditions();
  const { req, bad } = collect();
  fill(ui.result, h("p", { class: "cw-pending", text: "Computing…" }));
  run.now(req, bad);
}
