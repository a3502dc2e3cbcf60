// Couple: two half-reactions at a temperature and activities; which is oxidised, E_cell, ΔG, K,
// and the E–pH chart of the two couples between the water lines (carried by the same result).
import { lineChart } from "./charts.mjs";
import { mathNodes, mathText } from "./math.mjs";
import { runner } from "./runner.mjs";
import {
  allowed, begin, derivation, field, fieldMap, fieldText, fill, fmt, h, hint, known, numberInput, readInto, select,
  signed, sourcesLine, speciesField, speciesOf, warningsList, writeUrl,
} from "./ui.mjs";

// The end of a clipped line: the point at the pH where it stops (between two of the chart's pH
// values, read off the line), and the solid that takes over there.
function clippedEnd(pHs, ln) {
  const x = ln.meaningful_up_to_pH;
  if (x === null || x === undefined || x < pHs[0] || x > pHs[pHs.length - 1]) return null;
  let k = 0;
  while (k < pHs.length - 2 && pHs[k + 1] < x) k++;
  const f = (x - pHs[k]) / (pHs[k + 1] - pHs[k]);
  const y = ln.potential_V[k] + f * (ln.potential_V[k + 1] - ln.potential_V[k]);
  return { at: [x, y], label: (ln.not_meaningful[0] || {}).solid || "" };
}

export async function couple(root) {
  const { ui, ds, sp, start, params } = await begin(root, "Couple", "couple");
  const reactions = [...ds.half_reactions].sort((x, y) => x.E0_V - y.E0_V);
  const byId = new Map(reactions.map((r) => [r.id, r]));
  const ids = new Set(byId.keys());
  const opts = reactions.map((r) => ({ value: r.id, label: mathText(r.id) + "  (E° " + signed(r.E0_V, 3) + " V)" + (r.hypothetical ? " hypothetical" : "") }));
  const aField = field("cw-a", "First half-reaction", select(opts, known(ids, params.get("a"), start.a)));
  const bField = field("cw-b", "Second half-reaction", select(opts, known(ids, params.get("b"), start.b)));
  const tField = field("cw-t", "Temperature (°C)", numberInput(params.get("t") ?? start.temp_C), hint(sp, "temp_C"));
  const phField = field("cw-ph", "pH", numberInput(params.get("pH") ?? start.pH), hint(sp, "pH"));
  const condBox = h("fieldset", { class: "cw-conditions" });
  ui.formBox.append(h("div", { class: "cw-row" }, aField.el, bField.el), h("div", { class: "cw-row" }, tField.el, phField.el), condBox);
  let speciesFields = new Map();
  let owners = new Map(); // species -> ids of the half-reactions of the pair that hold it
  const openingPair = (a, b) => a === start.a && b === start.b;

  // The species fields of the pair. On opening they take the URL's values (or the opening
  // request's, for the opening pair); when the pair changes, a species keeps its value only while
  // a half-reaction that holds it stays in the pair: the others start at the standard value, 1.
  function rebuildConditions(first) {
    const recs = [byId.get(aField.control.value), byId.get(bField.control.value)];
    const { seen, needsPH } = speciesOf(recs);
    const held = new Map();
    for (const rec of recs) {
      for (const x of (rec && rec.species) || []) {
        if (!held.has(x.name)) held.set(x.name, new Set());
        held.get(x.name).add(rec.id);
      }
    }
    const old = speciesFields, oldOwners = owners;
    speciesFields = new Map();
    owners = held;
    let reset = false;
    const legend = h("legend", { text: seen.size ? "Activities and pressures" : "No dissolved or gaseous species other than H+/OH-" });
    condBox.replaceChildren(legend);
    for (const [name, phase] of seen) {
      const gas = phase === "g";
      const prev = old.get(name);
      const opening = (openingPair(aField.control.value, bField.control.value) ? (gas ? start.pressures : start.activities) : null) || {};
      let val;
      if (first) val = params.get((gas ? "p." : "a.") + name) ?? fieldText(opening[name] ?? 1);
      else if (prev && [...(oldOwners.get(name) || [])].some((id) => held.get(name).has(id))) val = prev.control.value;
      else { val = fieldText(1); reset = true; }
      const label = gas ? "Partial pressure of " + name + " (atm)" : "Activity of " + name;
      const f = field("cw-sp-" + name.replace(/[^A-Za-z0-9]/g, "_"), label, numberInput(val),
        gas ? hint(sp, "pressure_atm", "1 atm is standard") : hint(sp, "activity"));
      f.phase = phase;
      speciesFields.set(name, f);
      condBox.append(f.el);
    }
    if (reset) legend.textContent += " (the new half-reaction's species start at the standard value, 1)";
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
    // A line stops where calc says it means nothing (a hydroxide or oxide is the stable solid there).
    const series = eph.lines.map((ln, i) => ({ name: ln.id, dash: DASHES[i], end: clippedEnd(eph.pH, ln),
      points: eph.pH.map((pH, k) => [pH, ln.potential_V[k]]).filter((_, k) => !ln.meaningful || ln.meaningful[k]) }));
    for (const se of series) if (se.end) se.points.push(se.end.at);
    const anode = r.anode_electrode || {};
    const phNow = req.pH !== undefined ? req.pH : 7;
    const stops = eph.lines.flatMap((ln) => ln.not_meaningful || []);
    const reasons = stops.map((nm) => nm.reason.charAt(0).toUpperCase() + nm.reason.slice(1) + ".");
    const caveats = [...new Set(stops.flatMap((nm) => nm.caveats || []))];
    ephBox.replaceChildren(h("figure", { class: "cw-eph" }, lineChart({
      title: "E–pH: water stability lines and the two couples", xLabel: "pH", yLabel: "E (V vs SHE)",
      desc: "Between the dotted H+/H2 and O2/H2O lines water is stable; a couple whose line lies below the H+/H2 line can reduce water to hydrogen at that pH.",
      series, legendRight: true, xRange: [eph.pH[0], eph.pH[eph.pH.length - 1]],
      marker: anode.potential_V !== undefined ? [phNow, anode.potential_V] : null, markerLabel: "anode, your conditions",
    }), reasons.length ? h("figcaption", { class: "cw-eph-caption" }, h("strong", { text: "Where a line stops (the bar at its end): " }),
      ...reasons.map((t) => h("span", { class: "cw-eph-reason" }, mathNodes(t + " "))),
      caveats.length ? h("span", { class: "cw-eph-caveat" }, mathNodes("Note: " + caveats.join("; ") + ".")) : null) : null));
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
  rebuildConditions(true);
  const { req, bad } = collect();
  fill(ui.result, h("p", { class: "cw-pending", text: "Computing…" }));
  run.now(req, bad);
}
