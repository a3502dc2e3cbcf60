// Activity coefficient of one ion at an ionic strength, by the model chosen, with the curves of
// every model against ionic strength.
import { calculate } from "./site.mjs";
import { lineChart } from "./charts.mjs";
import { mathNodes, mathText } from "./math.mjs";
import { bindForm, runner } from "./runner.mjs";
import {
  ACTIVITY_MODELS, allowed, begin, derivation, field, fieldMap, fill, fmt, h, hint, known, numberInput, readInto,
  select, sourcesLine, warningsList, writeUrl,
} from "./ui.mjs";

export async function activity(root) {
  const { ui, ds, sp, start, params } = await begin(root, "Activity coefficient", "activity");
  const ions = ds.ions.map((i) => ({ value: i.species, label: mathText(i.species + " (z = " + i.charge + ", å = " + i.size_angstrom + " Å)") }));
  const spField = field("cw-sp", "Ion", select(ions, known(new Set(ions.map((i) => i.value)), params.get("sp"), start.species)));
  const iField = field("cw-i", "Ionic strength I (mol/kg)", numberInput(params.get("I") ?? start.ionic_strength), hint(sp, "ionic_strength"));
  const modelField = field("cw-model", "Model", select(ACTIVITY_MODELS, known(new Set(ACTIVITY_MODELS.map((m) => m.value)), params.get("model"), start.model)));
  const tField = field("cw-t", "Temperature (°C)", numberInput(params.get("t") ?? start.temp_C), hint(sp, "temp_C"));
  ui.formBox.append(h("div", { class: "cw-row" }, spField.el, iField.el), h("div", { class: "cw-row" }, modelField.el, tField.el));
  const charts = h("div", { class: "cw-charts" });
  function collect() {
    let bad = false;
    const p = new URLSearchParams();
    const req = { species: spField.control.value, model: modelField.control.value };
    bad = readInto(iField, req, "ionic_strength", allowed(sp, "ionic_strength", "an ionic strength")) || bad;
    bad = readInto(tField, req, "temp_C", allowed(sp, "temp_C", "a temperature")) || bad;
    p.set("sp", req.species); p.set("I", iField.control.value.trim()); p.set("model", req.model); p.set("t", tField.control.value.trim());
    writeUrl(p);
    return { req, bad };
  }
  const fieldFor = fieldMap({ "ionic*": iField, "temp*": tField, model: modelField, species: spField });
  let ticket = 0;
  async function drawChart(req, r) {
    const my = ++ticket;
    const series = [];
    for (const m of ACTIVITY_MODELS) {
      const pts = [];
      for (let k = 0; k <= 20; k++) {
        const I = Math.pow(10, -4 + (k * 4.3) / 20);
        const out = await calculate("activity", { ...req, model: m.value, ionic_strength: I });
        if (my !== ticket) return;
        if (out.ok) pts.push([Math.log10(I), out.result.gamma]);
      }
      series.push({ name: m.value, points: pts });
    }
    charts.replaceChildren(lineChart({ title: "γ against ionic strength", xLabel: "log₁₀ I (mol/kg)", yLabel: "γ(" + req.species + ")", series, marker: req.ionic_strength > 0 ? [Math.log10(req.ionic_strength), r.gamma] : null }));
  }
  function render(r, req) {
    fill(ui.result,
      h("p", { class: "cw-big" }, h("span", { class: "cw-big-label", text: "γ " }), h("span", { class: "cw-big-value", "data-cw-value": "gamma", text: fmt(r.gamma, 4) })),
      h("p", { class: "cw-direction" }, mathNodes("Debye–Hückel A = " + fmt(r.A, 4) + " kg^1/2 mol^−1/2, B = " + fmt(r.B, 4) + " kg^1/2 mol^−1/2 Å^−1 at " + fmt(r.temp_C, 1) + " °C.")),
      warningsList(r.warnings), charts, derivation(r.steps), sourcesLine(r.sources, r.data_version));
    drawChart(req, r);
  }
  bindForm(ui, runner(ui, "activity", render, fieldFor), collect);
}
