// Reference-electrode conversion: a reading against one electrode expressed against another, in
// volts or millivolts, with the trade's working equivalent of the −0.85 V CSE criterion in seawater.
import { calculate } from "./site.mjs";
import { bindForm, runner } from "./runner.mjs";
import {
  allowed, begin, derivation, field, fieldMap, fieldText, fill, fmt, h, hint, known, numberInput, readNumber, select,
  signed, sourcesLine, warningsList, writeUrl,
} from "./ui.mjs";

const UNITS = [{ value: "V", label: "volts (V)" }, { value: "mV", label: "millivolts (mV)" }];
const PER_UNIT = { V: 1, mV: 1000 };
// The trade's working pair of seawater criteria (common practice): the note computes the exact
// conversion of the CSE value with calc and shows how far it is from the working figure.
const CSE_CRITERION_V = -0.85, SEAWATER_WORKING_V = -0.8, SEAWATER_REF = "Ag/AgCl seawater";

function inUnit(v, unit) {
  return unit === "mV" ? signed(v * 1000, 1) : signed(v);
}

// The note on −0.80 V vs Ag/AgCl (seawater) and −0.85 V vs CSE, with calc's exact conversion at 25 °C.
async function workingEquivalentNote(ids) {
  const note = h("aside", { class: "admonition note cw-working-note" });
  if (!ids.has("CSE") || !ids.has(SEAWATER_REF)) return note;
  const out = await calculate("convert", { value_V: CSE_CRITERION_V, from: "CSE", to: SEAWATER_REF, temp_C: 25 });
  if (!out.ok) return note;
  const r = out.result;
  const gap_mV = Math.round((r.value_V - SEAWATER_WORKING_V) * 1000);
  fill(note,
    h("p", { class: "admonition-title", text: "−0.80 V vs Ag/AgCl (seawater) and −0.85 V vs CSE" }),
    h("p", { text: "In seawater work, −0.80 V against a silver/silver chloride electrode in seawater is used as the working " +
      "equivalent of the −0.85 V criterion against copper/copper sulfate (common practice)." }),
    h("p", {}, "Converted exactly at 25 °C with this site's electrode values, −0.85 V vs CSE is ",
      h("strong", { class: "cw-working-exact", text: signed(r.value_V, 3) + " V vs " + SEAWATER_REF }),
      ": " + Math.abs(gap_mV) + " mV " + (gap_mV > 0 ? "less" : "more") + " negative than the working figure. The two electrodes sit at " +
      signed(r.E_from_V_SHE, 3) + " V (CSE) and " + signed(r.E_to_V_SHE, 3) + " V (" + SEAWATER_REF + ") against SHE; the working figure " +
      "rounds the difference to the protective (more negative) side, and the seawater electrode's own potential moves with " +
      "the salinity and temperature of the water it stands in by amounts of the same order."));
  return note;
}

export async function convert(root) {
  const { ui, ds, sp, start, params } = await begin(root, "Reference conversion", "convert");
  const refs = [...ds.reference_electrodes.map((r) => ({ value: r.id, label: r.id + " (" + signed(r.E_V_SHE, 4) + " V vs SHE at 25 °C)" })), { value: "RHE", label: "RHE (computed from pH)" }];
  const ids = new Set(refs.map((r) => r.value));
  const unit0 = params.get("u") === "mV" ? "mV" : "V";
  const v0 = params.get("v") ?? (unit0 === "mV" ? fieldText(start.value_V * 1000) : start.value_V);
  const vField = field("cw-v", "Reading (" + unit0 + ")", numberInput(v0), hint(sp, "value_V"));
  const fromField = field("cw-from", "Measured against", select(refs, known(ids, params.get("from"), start.from)));
  const toField = field("cw-to", "Express against", select(refs, known(ids, params.get("to"), start.to)));
  const tField = field("cw-t", "Electrode temperature (°C)", numberInput(params.get("t") ?? start.temp_C), hint(sp, "temp_C", "each electrode has its own valid range"));
  const phField = field("cw-ph", "pH (for RHE)", numberInput(params.get("pH") ?? start.pH), hint(sp, "pH"));
  const uField = field("cw-unit", "Unit of the reading and the result", select(UNITS, unit0));
  const unit = () => uField.control.value;
  // "−850" typed in volts: offered as −0.850 V when that is a reading calc accepts (its bound).
  const suggest = h("div", { class: "cw-suggest", "aria-live": "polite" });
  vField.control.after(suggest); // above the message: clearing the message on blur must not move it from under a finger
  const showError = vField.setError;
  vField.setError = (text) => { showError(text); offer(text); };
  let offeredFor = null; // the text typed that the offer shown answers
  function offer(text) {
    const typed = vField.control.value.trim();
    // The same number read again (the field's change on blur, when a finger goes to the offer):
    // the offer stays, so the tap on it is not lost.
    if (unit() === "V" && typed === offeredFor && (text === undefined || suggest.childElementCount)) return;
    suggest.replaceChildren();
    offeredFor = null;
    const b = sp.bounds && sp.bounds.value_V;
    const n = readNumber(vField.control, "").value;
    if (!text || unit() !== "V" || n === undefined || !b) return;
    const v = n / 1000;
    if (!(v >= b.low && v <= b.high)) return;
    offeredFor = typed;
    const again = () => { vField.control.dispatchEvent(new Event("change", { bubbles: true })); vField.control.focus(); };
    suggest.append(
      h("button", { type: "button", class: "md-button cw-suggest-button", onclick: () => { vField.control.value = v.toFixed(3); again(); } },
        "Did you mean " + signed(v, 3) + " V?"),
      h("button", { type: "button", class: "md-button cw-suggest-mv", onclick: () => { uField.control.value = "mV"; relabel(); again(); } },
        "The reading is in mV"));
  }
  function relabel() { vField.el.querySelector("label").textContent = "Reading (" + unit() + ")"; }
  ui.formBox.append(h("div", { class: "cw-row" }, vField.el, fromField.el, toField.el), h("div", { class: "cw-row" }, tField.el, phField.el, uField.el));
  uField.control.addEventListener("change", () => {  // the reading typed stays the same quantity
    const r = readNumber(vField.control, "");
    const from = unit() === "mV" ? "V" : "mV";
    if (r.value !== undefined) vField.control.value = fieldText(Number((r.value / PER_UNIT[from] * PER_UNIT[unit()]).toPrecision(12)));
    relabel();
  }, { capture: true });
  function collect() {
    let bad = false;
    const p = new URLSearchParams();
    const req = { from: fromField.control.value, to: toField.control.value };
    const r = readNumber(vField.control, allowed(sp, "value_V", "a reading in " + unit()));
    vField.setError(r.error);
    if (r.error) bad = true;
    else req.value_V = unit() === "mV" ? r.value / 1000 : r.value;
    const t = readNumber(tField.control, allowed(sp, "temp_C", "a temperature"));
    tField.setError(t.error);
    if (t.error) bad = true; else req.temp_C = t.value;
    const rhe = req.from === "RHE" || req.to === "RHE";
    phField.el.hidden = !rhe;
    if (rhe) {
      const ph = readNumber(phField.control, allowed(sp, "pH", "a pH"));
      phField.setError(ph.error);
      if (ph.error) bad = true; else req.pH = ph.value;
      p.set("pH", phField.control.value.trim());
    }
    p.set("v", vField.control.value.trim()); p.set("from", req.from); p.set("to", req.to); p.set("t", tField.control.value.trim());
    if (unit() === "mV") p.set("u", "mV");
    writeUrl(p);
    return { req, bad };
  }
  const fieldFor = fieldMap({ "value*": vField, from: fromField, to: toField, "temp*": tField, pH: phField });
  workingEquivalentNote(ids).then((n) => { if (n.childNodes.length) ui.result.after(n); });
  function render(r) {
    const u = unit();
    fill(ui.result,
      h("p", { class: "cw-big" }, h("span", { class: "cw-big-value", "data-cw-value": "value_V", text: inUnit(r.value_V, u) }), h("span", { class: "cw-unit", text: " " + u + " vs " + r.to })),
      h("p", { class: "cw-direction", text: inUnit(r.input_V ?? r.value_V + r.E_to_V_SHE - r.E_from_V_SHE, u) + " " + u + " vs " + r.from + " at " + fmt(r.temp_C, 1) + " °C is " + inUnit(r.value_V, u) + " " + u + " vs " + r.to + "." }),
      warningsList(r.warnings), derivation(r.steps), sourcesLine(r.sources, r.data_version));
  }
  bindForm(ui, runner(ui, "convert", render, fieldFor), collect);
}
