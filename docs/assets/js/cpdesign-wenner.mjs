// The Wenner helper of the soil designs (entry "wenner", ASTM G57): a four-pin reading, its pin
// spacing and the meter's resistance, gives the soil resistivity ρ = 2π·a·R; one button puts it in
// the design's resistivity field. It calculates on its own (its inputs do not recalculate the
// design until its value is used) and keeps its own URL parameters.
import { calculate } from "./site.mjs";
import { cautions, cpHint, derivation, fill, h, need, numField, ownParams, sig, text, warningsList } from "./cpdesign-kit.mjs";

// prefix: the helper's URL prefix and id stem (e.g. "bw"); start: the opening request of "wenner";
// target: the design's resistivity field; use(): after the value is put there; sp: calc's spec (the bounds).
export function wennerHelper(prefix, start, target, use, sp) {
  const url = ownParams(prefix + ".");
  const a = numField("cw-" + prefix + "-a", "Pin spacing a (m)", url.get("a") ?? start.spacing_m, cpHint(sp, "spacing_m", "equal spacing of the four pins in a line; the reading averages the soil to about this depth"));
  const r = numField("cw-" + prefix + "-r", "Meter reading R (Ω)", url.get("r") ?? start.resistance_ohm, cpHint(sp, "resistance_ohm", "voltage between the inner pins over the current between the outer ones"));
  const out = h("div", { class: "cw-cpd-wenner-result", "aria-live": "polite" });
  const box = h("details", { class: "cw-cpd-wenner" },
    h("summary", { text: "Soil resistivity from a Wenner four-pin reading (ASTM G57)" }),
    h("div", { class: "cw-row" }, a.el, r.el), out);
  if (url.get("a") || url.get("r")) box.open = true;
  let ticket = 0;
  let value = null;

  async function run() {
    const req = {};
    const bad = [need(a, req, "spacing_m", "a pin spacing in m"), need(r, req, "resistance_ohm", "a reading in Ω")].some(Boolean);
    url.write([["a", text(a)], ["r", text(r)]]);
    const my = ++ticket;
    if (bad) { value = null; fill(out, h("p", { class: "cw-pending", text: "Correct the reading above." })); return; }
    const answer = await calculate("wenner", req);
    if (my !== ticket) return;
    if (!answer.ok) {
      value = null;
      const f = answer.error.field === "spacing_m" ? a : answer.error.field === "resistance_ohm" ? r : null;
      if (f) f.setError(answer.error.message);
      fill(out, h("p", { class: "cw-pending", text: f ? "Correct the reading above." : answer.error.message }));
      return;
    }
    const res = answer.result;
    value = sig(res.resistivity_ohm_m);
    const useBtn = h("button", { type: "button", class: "md-button md-button--primary cw-touch cw-cpd-use", text: "Use ρ = " + value + " Ω·m for the design" });
    useBtn.addEventListener("click", () => {
      target.control.value = value;
      target.setError("");
      use();
      target.control.focus();
    });
    fill(out,
      h("p", { class: "cw-cpd-wenner-value" }, h("strong", { "data-cw-value": "resistivity_ohm_m", text: "ρ = " + value + " Ω·m" }),
        " (" + sig(res.resistivity_ohm_cm) + " Ω·cm), the average to a depth of about " + sig(res.depth_m) + " m"),
      h("div", { class: "cw-actions-row" }, useBtn),
      warningsList(res.warnings), cautions(res), derivation(res.steps));
  }

  // The helper's own inputs stay with it (the design is recalculated when its value is used).
  for (const ev of ["input", "change"]) box.addEventListener(ev, (e) => { e.stopPropagation(); if (e.target !== box) run(); });
  box.addEventListener("toggle", () => { if (box.open && value === null) run(); });
  if (box.open) run();
  return box;
}
