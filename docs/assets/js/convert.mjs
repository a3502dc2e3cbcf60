// Reference-electrode conversion: a reading against one electrode expressed against another.
import { bindForm, runner } from "./runner.mjs";
import {
  allowed, begin, derivation, field, fieldMap, fill, fmt, h, hint, known, numberInput, readInto, select, signed,
  sourcesLine, warningsList, writeUrl,
} from "./ui.mjs";

export async function convert(root) {
  const { ui, ds, sp, start, params } = await begin(root, "Reference conversion", "convert");
  const refs = [...ds.reference_electrodes.map((r) => ({ value: r.id, label: r.id + " (" + signed(r.E_V_SHE, 4) + " V vs SHE at 25 °C)" })), { value: "RHE", label: "RHE (computed from pH)" }];
  const ids = new Set(refs.map((r) => r.value));
  const vField = field("cw-v", "Reading (V)", numberInput(params.get("v") ?? start.value_V), hint(sp, "value_V"));
  const fromField = field("cw-from", "Measured against", select(refs, known(ids, params.get("from"), start.from)));
  const toField = field("cw-to", "Express against", select(refs, known(ids, params.get("to"), start.to)));
  const tField = field("cw-t", "Electrode temperature (°C)", numberInput(params.get("t") ?? start.temp_C), hint(sp, "temp_C", "each electrode has its own valid range"));
  const phField = field("cw-ph", "pH (for RHE)", numberInput(params.get("pH") ?? start.pH), hint(sp, "pH"));
  ui.formBox.append(h("div", { class: "cw-row" }, vField.el, fromField.el, toField.el), h("div", { class: "cw-row" }, tField.el, phField.el));
  function collect() {
    let bad = false;
    const p = new URLSearchParams();
    const req = { from: fromField.control.value, to: toField.control.value };
    bad = readInto(vField, req, "value_V", allowed(sp, "value_V", "a reading in volts")) || bad;
    bad = readInto(tField, req, "temp_C", allowed(sp, "temp_C", "a temperature")) || bad;
    const rhe = req.from === "RHE" || req.to === "RHE";
    phField.el.hidden = !rhe;
    if (rhe) {
      bad = readInto(phField, req, "pH", allowed(sp, "pH", "a pH")) || bad;
      p.set("pH", phField.control.value.trim());
    }
    p.set("v", vField.control.value.trim()); p.set("from", req.from); p.set("to", req.to); p.set("t", tField.control.value.trim());
    writeUrl(p);
    return { req, bad };
  }
  const fieldFor = fieldMap({ "value*": vField, from: fromField, to: toField, "temp*": tField, pH: phField });
  function render(r) {
    fill(ui.result,
      h("p", { class: "cw-big" }, h("span", { class: "cw-big-value", "data-cw-value": "value_V", text: signed(r.value_V) }), h("span", { class: "cw-unit", text: " V vs " + r.to })),
      h("p", { class: "cw-direction", text: signed(r.input_V ?? Number(vField.control.value)) + " V vs " + r.from + " at " + fmt(r.temp_C, 1) + " °C is " + signed(r.value_V) + " V vs " + r.to + "." }),
      warningsList(r.warnings), derivation(r.steps), sourcesLine(r.sources, r.data_version));
  }
  bindForm(ui, runner(ui, "convert", render, fieldFor), collect);
}
