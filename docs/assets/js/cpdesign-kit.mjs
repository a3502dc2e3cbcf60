// What the three designs of the cathodic-protection design page share: their own URL parameters
// (each design a prefix), fields with their units, catalogue choices by name, numbers read by the
// one rule (ui.mjs readInto), and the parts of a result (the figures, the checks, the governing
// criterion in words, the cautions the result carries, its sources and data version).
import {
  cautionsBox, derivation, field, fieldText, fill, fmt, h, hint, numberInput, readInto, sourceLink, sourcesLine, warningsList,
} from "./ui.mjs";

export { derivation, field, fill, h, warningsList };

// URL state of one design: only the keys with its prefix are read and written; the others
// (the chosen design, the joint's environment, the other designs) are kept.
export function ownParams(prefix) {
  const all = new URLSearchParams(location.search);
  return {
    get: (k) => all.get(prefix + k),
    getAll: (k) => all.getAll(prefix + k),
    has: (k) => all.has(prefix + k),
    write(entries) {
      const url = new URL(location.href);
      const p = new URLSearchParams(url.search);
      for (const k of [...p.keys()]) if (k.startsWith(prefix)) p.delete(k);
      for (const [k, v] of entries) if (v !== undefined && v !== null && v !== "") p.append(prefix + k, v);
      url.search = p.toString();
      history.replaceState(history.state, "", url.href);
    },
  };
}

// A field for a number, its unit in its label; the value is text (as typed or as a link holds it).
export function numField(id, label, value, help) {
  return field(id, label, numberInput(typeof value === "number" ? fieldText(value) : value ?? ""), help);
}

// The hint under a design field: calc's range for it (spec.json cp_bounds, written from
// calc/cpdesign/limits.py), then the page's own words, as ui.mjs hint() does for the other pages.
export function cpHint(sp, bound, extra) {
  return hint({ bounds: (sp && sp.cp_bounds) || {} }, bound, extra);
}

// Read a number field into req[key] (required): false when it holds a number, true (and a
// message at the field) when not. `noun` says what it holds, with its unit.
export function need(f, req, key, noun) {
  return readInto(f, req, key, noun);
}

// The same for a field that may stay empty (then nothing is sent and calc uses its own rule).
export function maybe(f, req, key, noun) {
  if (f.control.value.trim() === "") { f.setError(""); return false; }
  return readInto(f, req, key, noun);
}

// The text of a field (trimmed), for the URL.
export const text = (f) => f.control.value.trim();

// A choice among named options. A value that is not among them (a shared link with a typo) is
// kept as an option of its own, marked, so that calc's message about it shows at the field.
export function choice(options, value, fallback) {
  const el = h("select", {});
  const known = options.some((o) => o.value === value);
  for (const o of options) el.append(h("option", { value: o.value, text: o.label }));
  if (value && !known) el.append(h("option", { value, text: "“" + value + "” (not in the dataset)" }));
  el.value = value || fallback;
  return el;
}

// Options from a catalogue of the dataset: its records by name (ids only as the values sent).
export function catalogueOptions(records, keep = () => true) {
  return (records || []).filter(keep).map((r) => ({ value: r.id, label: r.name || r.id }));
}

export function nameOf(records, id) {
  const r = (records || []).find((x) => x.id === id);
  return r ? r.name || r.id : id;
}

// A figure to four significant digits (true minus sign; tiny and huge ones in exponent form).
export function sig(x, n = 4) {
  if (typeof x !== "number" || !Number.isFinite(x)) return x === null || x === undefined ? "—" : String(x);
  if (x === 0) return "0";
  const a = Math.abs(x);
  if (a < 1e-3 || a >= 1e6) return fmt(x, 3);
  return String(Number(x.toPrecision(n))).replace("-", "−");
}

// The initial / mean / final triple of a result, with its unit.
export function stages(obj, unit, keys = ["initial", "mean", "final"]) {
  if (!obj) return "—";
  return keys.filter((k) => obj[k] !== undefined && obj[k] !== null).map((k) => k + " " + sig(obj[k]) + (unit ? " " + unit : "")).join(" · ");
}

// The result's figures: rows of [label, value text, key of data-cw-value (optional), extra node].
export function figures(rows) {
  return h("table", { class: "cw-compare cw-cpd-figures" }, h("tbody", {}, rows.filter(Boolean).map(([k, v, key, extra]) =>
    h("tr", {}, h("th", { scope: "row", text: k }), h("td", key ? { "data-cw-value": key } : {}, v, extra ? " " : null, extra || null)))));
}

// The checks of a design (net mass, initial and final current, groundbed resistance, rating).
export function checksList(checks) {
  if (!checks || !checks.length) return null;
  return h("ul", { class: "cw-cpd-checks" }, checks.map((c) => h("li", { class: c.passed ? "cw-cpd-pass" : "cw-cpd-fail" },
    h("span", { class: "cw-cpd-mark", "aria-hidden": "true", text: c.passed ? "✓" : "✗" }), " ",
    h("strong", { text: c.name + ": " + (c.passed ? "met" : "not met") }), " ", c.words)));
}

// What governs the number of anodes, in plain words (governed_by of the anodes and buried results).
const GOVERNS = {
  "mass": "The anode mass governs: this many anodes hold the net mass that the mean current demand consumes over the design life; the initial and final current checks have room to spare.",
  "final current output": "The final current output governs: at the end of the life the consumed anodes are smaller and their resistance higher, and they must still deliver the final current demand; that needs more anodes than the mass alone.",
  "initial current output": "The initial current output governs: the new anodes must deliver the initial current that polarises the structure at the start; that needs more anodes than the mass alone.",
  "current output": "The current output governs: in this soil the anodes' combined output must reach the current the structure needs, which takes more anodes than the mass for the life.",
  "anode life": "The anode life governs: more anodes are needed to hold the material consumed over the design life than to deliver the current.",
};

// The same, short, for the headline: "governed by the anode mass".
export function governedBy(key) {
  return key ? "governed by the " + (key === "mass" ? "anode mass" : key) : "";
}

export function governsText(key) {
  if (!key) return "The number of anodes was not computed: give the mass and the dimensions of one anode.";
  return GOVERNS[key] || "Governed by the " + key + ".";
}

// The cautions the result carries, beside it (the safety ones first, as calc orders them).
export function cautions(r) {
  return cautionsBox(r.cautions);
}

export function record(r) {
  return sourcesLine(r.sources, r.data_version);
}

export function source(id) {
  return id ? sourceLink(id) : null;
}

// A group of fields under a heading, as a tablet shows it (one box per topic).
export function group(legend, ...children) {
  return h("fieldset", { class: "cw-conditions cw-cpd-group" }, h("legend", { text: legend }), ...children);
}

export function row(...fields) {
  return h("div", { class: "cw-row" }, fields.filter(Boolean).map((f) => f.el || f));
}

// Recalculate after a change the form's own events do not carry (a row added or removed).
export function recalc(ui) {
  ui.formBox.dispatchEvent(new Event("input", { bubbles: true }));
}

// The result's headline at the foot of the screen while the result is out of view (a tablet shows
// the form or the result, rarely both): a tap scrolls to the result. It repeats what the result
// says, so it is hidden from screen readers (the result itself is a live region).
export function headline(ui) {
  const words = h("span", {});
  const bar = h("a", { class: "cw-cpd-bar cw-cpd-bar-off", href: "#", "aria-hidden": "true", tabindex: "-1" },
    words, h("span", { class: "cw-cpd-bar-go", text: " ↓ result" }));
  bar.addEventListener("click", (e) => { e.preventDefault(); ui.result.scrollIntoView({ behavior: "smooth", block: "start" }); });
  ui.formBox.after(bar);
  const paint = () => bar.classList.toggle("cw-cpd-bar-stale", ui.result.classList.contains("cw-stale"));
  new MutationObserver(paint).observe(ui.result, { attributes: true, attributeFilter: ["class"] });
  let inView = true;
  new IntersectionObserver(([e]) => { inView = e.isIntersecting; bar.classList.toggle("cw-cpd-bar-off", inView || !words.textContent); })
    .observe(ui.result);
  return (text) => { words.textContent = text; bar.classList.toggle("cw-cpd-bar-off", inView || !text); paint(); };
}

// A field that calc's error names, for messages about a whole list (e.g. "zones").
export function listMessage(id) {
  const msg = h("div", { class: "cw-field-msg", id: id + "-msg", role: "alert", "aria-live": "polite" });
  return { el: msg, msg, control: msg, setError(t) { if (Array.isArray(t)) fill(msg, ...t); else msg.textContent = t || ""; } };
}
