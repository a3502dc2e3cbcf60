// The survey log as the page shows it: one row per test post and time, its readings in the
// user's unit (V or mV; stored in V), the polarisation shift and the IR drop calc computed, the
// state badge with its judgement, and the ISO 8601 time. Shows what is stored; judges nothing.
import { SETTING_NAMES, STRUCTURE_NAMES, cpBadge, potText } from "./cpview.mjs";
import { mathNodes } from "./math.mjs";
import { h } from "./ui.mjs";

// The readings of a record in words: on, instant-off, native; then what calc computed from them.
export function readingsText(r, unit) {
  const parts = [];
  if (r.on_V !== null) parts.push("on " + potText(r.on_V, unit));
  if (r.off_V !== null) parts.push("instant-off " + potText(r.off_V, unit));
  if (r.native_V !== null) parts.push("native " + potText(r.native_V, unit));
  return parts.join(" · ") + " vs " + r.electrode + " (" + r.temp_C + " °C)";
}

export function computedText(r, unit, irNames) {
  const j = r.judgement;
  const parts = [];
  const size = (v) => potText(v, unit).replace(/^[+]/, "");
  if (j && j.polarisation_from === "native") parts.push("polarisation " + potText(-j.polarisation_V, unit) + " (instant-off − native)");
  else if (r.polarisation_V !== null) parts.push("polarisation given " + size(r.polarisation_V));
  if (j && j.ir_drop_V !== null && j.ir_drop_V !== undefined) parts.push("IR drop " + potText(j.ir_drop_V, unit) + " (on − instant-off)");
  if (r.off_V === null && r.ir_drop_method) {
    parts.push("IR drop " + (irNames[r.ir_drop_method] || r.ir_drop_method) +
      (r.ir_subtracted_V !== null ? " (" + size(r.ir_subtracted_V) + ")" : ""));
  } else if (r.off_V === null) parts.push("IR drop not considered");
  return parts.join(" · ");
}

function verdictCell(r, dataVersion, unit) {
  const j = r.judgement;
  if (!j) return h("td", {}, h("span", { class: "cw-badge", text: "not judged yet" }));
  const worded = j.unit && j.unit !== unit ? " (worded in " + j.unit + " when it was judged)" : "";
  const det = h("details", { class: "cw-log-verdict" }, h("summary", {}, cpBadge(j.verdict, j.conclusive)),
    h("p", {}, mathNodes(j.text + worded)),
    j.warnings.length ? h("ul", {}, j.warnings.map((w) => h("li", {}, mathNodes(w)))) : null,
    h("p", { class: "cw-data-tag", text: "judged with data version " + j.data_version + (j.data_version !== dataVersion ? " (not the current one)" : "") }));
  return h("td", {}, det);
}

// One row of the log.
export function logRow(r, { unit, dataVersion, irNames }) {
  const computed = computedText(r, unit, irNames);
  return h("tr", { "data-id": r.id },
    h("td", { class: "cw-log-time" }, h("time", { datetime: r.time, text: r.time })),
    h("td", { class: "cw-log-location", text: r.location }),
    h("td", { class: "cw-log-readings" }, h("span", { class: "cw-log-values", text: readingsText(r, unit) }),
      computed ? h("span", { class: "cw-log-computed", text: "; " + computed }) : null),
    h("td", { text: (STRUCTURE_NAMES[r.structure] || r.structure).split(" (")[0] + "; " + (SETTING_NAMES[r.setting] || r.setting) }),
    verdictCell(r, dataVersion, unit),
    h("td", { class: "cw-log-notes", text: r.notes }));
}

export const LOG_HEAD = ["Time (ISO 8601)", "Location", "Readings", "Structure and setting", "State", "Notes"];
