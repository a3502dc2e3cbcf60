// The form kit of the calculator pages: fields with a message slot, number reading (a field
// holds a number or it does not: what is allowed is calc's to decide), the frame every
// calculator sits in (runtime status, form, result, print view), the parts of a result
// (derivation, warnings, sources, verdict badge) and the URL state. Text only ever as text.
import { mathNodes, numberText } from "./math.mjs";
import { problemText, readDecimal, visible } from "./numbers.mjs";
import { dataset, h, precomputedAnswers, runtimeStatus, siteRoot, spec } from "./site.mjs";

export { h };

export function sourceLink(id) {
  return h("a", { href: new URL("reference/sources/#src-" + encodeURIComponent(id), siteRoot).href, class: "cw-source" }, id);
}

// A number as the page shows it (the one rule, math.mjs): m × 10ⁿ for very small or large
// magnitudes, a true minus sign.
export function fmt(x, digits = 4) {
  return numberText(x, digits);
}

export function signed(x, digits = 4) {
  const s = fmt(x, digits);
  return x > 0 ? "+" + s : s;
}

// Replace an element's children, skipping empty parts (null, undefined, false).
export function fill(el, ...children) {
  el.replaceChildren(...children.flat().filter((c) => c !== null && c !== undefined && c !== false));
  return el;
}

// A number of a request as a field shows it: small values in exponent form, as a user types them.
export function fieldText(x) {
  if (typeof x !== "number") return x === undefined || x === null ? "" : String(x);
  return x !== 0 && Math.abs(x) < 1e-3 ? x.toExponential() : String(x);
}

// Typed text in a message: in its own bidirectional isolate (<bdi>), so it cannot turn the words
// around it; control and format characters shown as \uXXXX; cut after numbers.mjs' ECHO_MAX
// characters, with its length. isolated(): as a name is shown; echo(): quoted, as text read.
function echoNode(shown) {
  const el = h("bdi", { class: "cw-echo", text: shown });
  el.style.overflowWrap = "anywhere"; // a long run without spaces wraps inside a narrow field
  return el;
}

export function isolated(raw) {
  const { shown, cut, count } = visible(raw);
  return [echoNode(shown), cut ? "… (" + count + " characters)" : null];
}

export function echo(raw) {
  const { shown, cut, count } = visible(raw);
  return ["“", echoNode(shown), cut ? "…” (" + count + " characters)" : "”"];
}

// Read a number typed by a user (the one rule: numbers.mjs); returns {value} or {error, kind}:
// the error says what was read and what to write. Only "is it a number" is checked here: calc
// checks the range and its message is shown at the field (see runner.mjs).
export function readNumber(input, allowed) {
  const r = readDecimal(input.value);
  if (r.value !== undefined) return { value: r.value };
  if (r.kind === "empty") return { error: "Enter a value: " + allowed + ".", kind: r.kind };
  return { error: [...echo(r.text), " " + problemText(r) + ". Allowed: " + allowed + "."], kind: r.kind };
}

// Read field f into req[key]; shows the message at the field; returns true when it is not a number.
export function readInto(f, req, key, allowed) {
  const r = readNumber(f.control, allowed);
  f.setError(r.error);
  if (r.error) return true;
  req[key] = r.value;
  return false;
}

// The hint under a field: calc's words for the bound (spec.json), then the page's own example.
export function hint(sp, bound, extra) {
  const b = sp.bounds && sp.bounds[bound];
  return [b ? b.text : null, extra].filter(Boolean).join("; ");
}

// What a field accepts, for its "not a number" message: "a temperature, 0 to 100 °C".
export function allowed(sp, bound, noun) {
  const b = sp.bounds && sp.bounds[bound];
  return b ? noun + ", " + b.text : noun;
}

// The values a calculator's form opens with: its opening request (exactly what collect() sends
// on an untouched page, so the build-time answer is found) and the values of fields it does not send.
export function startValues(sp, name) {
  return { ...((sp.form || {})[name] || {}), ...((sp.openings || {})[name] || {}) };
}

// The start of every calculator: its frame, then the dataset and calc's spec (each fetched once
// per page), the values its form opens with, and the URL's parameters.
export async function begin(root, title, name) {
  const ui = frame(root, title);
  const [ds, sp] = await Promise.all([dataset(), spec()]);
  return { ui, ds, sp, start: startValues(sp, name), params: urlState() };
}

// A form's fieldFor: the field that calc's error names -> the form's field. A key is an exact
// name, or a prefix ending in "*"; others(name) is asked when no key matches.
export function fieldMap(map, others) {
  const keys = Object.entries(map);
  return (name) => {
    if (!name) return null;
    for (const [k, f] of keys) if (k.endsWith("*") ? name.startsWith(k.slice(0, -1)) : name === k) return f;
    return others ? others(name) : null;
  };
}

// One labelled field with a message slot next to it.
export function field(id, labelText, control, help) {
  const msg = h("div", { class: "cw-field-msg", id: id + "-msg", role: "alert", "aria-live": "polite" });
  control.id = id;
  control.setAttribute("aria-describedby", id + "-msg");
  return {
    el: h("div", { class: "cw-field" }, h("label", { for: id, text: labelText }), control,
      help ? h("div", { class: "cw-field-help", text: help }) : null, msg),
    control, msg,
    setError(text) { // a string, or parts (text and nodes, e.g. an echo) of one message
      if (Array.isArray(text)) fill(msg, ...text);
      else msg.textContent = text || "";
      control.classList.toggle("cw-invalid", !!text);
      control.setAttribute("aria-invalid", text ? "true" : "false");
    },
  };
}

export function numberInput(value, attrs = {}) {
  return h("input", { type: "text", inputmode: "decimal", autocomplete: "off", value: fieldText(value), ...attrs });
}

export function select(options, value) {
  const el = h("select", {});
  for (const opt of options) {
    if (opt.group) {
      const g = h("optgroup", { label: opt.group });
      for (const o of opt.options) g.append(h("option", { value: o.value, text: o.label }));
      el.append(g);
    } else el.append(h("option", { value: opt.value, text: opt.label }));
  }
  el.value = value;
  return el;
}

// v when it is one of the known values, else the fallback.
export function known(values, v, fallback) {
  return values.has(v) ? v : fallback;
}

export const ACTIVITY_MODELS = [
  { value: "ideal", label: "ideal (γ = 1)" },
  { value: "limiting", label: "Debye–Hückel limiting law" },
  { value: "extended", label: "extended Debye–Hückel (Kielland sizes)" },
  { value: "davies", label: "Davies (0.3 I term)" },
];

export function environmentOptions(ds) {
  return ds.environments.map((e) => ({ value: e.id, label: e.name }));
}

export function materialOptions(ds) {
  const fam = new Map();
  for (const m of ds.materials) {
    const f = m.family || "other";
    if (!fam.has(f)) fam.set(f, []);
    fam.get(f).push({ value: m.id, label: m.name + (m.uns && m.uns.length ? " (" + m.uns.join(", ") + ")" : "") });
  }
  return [...fam.entries()].map(([group, options]) => ({ group, options }));
}

// The dissolved and gaseous species of some half-reactions (parsed in the bundle: rec.species),
// as name -> phase, and whether H+ or OH- take part (then the form asks for the pH).
export function speciesOf(reactions) {
  const seen = new Map();
  let needsPH = false;
  for (const r of reactions) {
    for (const sp of (r && r.species) || []) {
      if (sp.name === "H+" || sp.name === "OH-") { needsPH = true; continue; }
      if (sp.phase === "aq" || sp.phase === "g") seen.set(sp.name, sp.phase);
    }
  }
  return { seen, needsPH };
}

// The field of a species that a calc error names ("activities.Zn2+"), or null.
export function speciesField(fields, name) {
  const bare = name.replace(/^(activities|pressures|molalities)\./, "");
  if (fields.has(bare)) return fields.get(bare);
  for (const [sp, f] of fields) if (name.includes(sp)) return f;
  return null;
}

// The frame shared by all calculators: status line, form, result, derivation, print button.
export function frame(root, title) {
  precomputedAnswers(); // start the small download while the form is built
  const status = root.querySelector(":scope > .cw-runtime") || runtimeStatus();
  const formBox = h("form", { class: "cw-form", novalidate: true, onsubmit: (e) => e.preventDefault() });
  const formMsg = h("div", { class: "cw-form-msg", role: "alert" });
  const result = h("section", { class: "cw-result", "aria-live": "polite", "aria-label": title + " result" });
  const printBtn = h("button", { type: "button", class: "md-button cw-print", onclick: () => window.print(), text: "Print this record" });
  const printHead = h("div", { class: "cw-print-only cw-print-head" });
  const printFoot = h("div", { class: "cw-print-only cw-print-foot" },
    h("p", { class: "cw-print-cautions", text: "Cautions: a screening estimate, not a design approval. Films, flow, temperature, crevices, biofilm, coatings and geometry change real behaviour. For structural, pressure, potable-water or cathodic-protection decisions apply the governing codes and standards and have the result checked by a qualified corrosion professional." }));
  root.replaceChildren(printHead, status, formBox, formMsg, result, h("div", { class: "cw-actions" }, printBtn), printFoot);
  preparePrint(root, title, printHead);
  return { status, formBox, formMsg, result };
}

// Print view: a one-page record with the inputs (the form prints its values), the result,
// every derivation step (details opened for printing), the data version, build and cautions.
const printHooks = new Set();
window.addEventListener("beforeprint", () => { for (const fn of printHooks) fn(true); });
window.addEventListener("afterprint", () => { for (const fn of printHooks) fn(false); });

function preparePrint(root, title, head) {
  let opened = [];
  const hook = (before) => {
    if (!root.isConnected) { printHooks.delete(hook); return; }
    if (before) {
      const footer = document.querySelector(".cw-footer .cw-record"); // data version and build
      fill(head,
        h("p", { class: "cw-print-title", text: "Couplewise record: " + title }),
        h("p", { text: "Printed " + new Date().toISOString().replace("T", " ").slice(0, 16) + " UTC. Reproduce it at: " + location.href }),
        footer ? h("p", { text: footer.textContent.replace(/\s+/g, " ").trim() }) : null);
      opened = [...root.querySelectorAll("details:not([open])")];
      for (const d of opened) d.open = true;
    } else {
      for (const d of opened) d.open = false;
      opened = [];
    }
  };
  printHooks.add(hook);
}

export function derivation(steps) {
  if (!steps || !steps.length) return null;
  const list = h("ol", { class: "cw-steps" });
  for (const st of steps) {
    // the engine's plain-text markup (exponents, signs) set by the one rule of math.mjs
    list.append(h("li", {},
      h("strong", {}, mathNodes(st.title || "")),
      st.formula ? h("div", { class: "cw-formula" }, mathNodes(st.formula)) : null,
      st.substituted ? h("div", { class: "cw-subst" }, mathNodes(st.substituted)) : null,
      st.result ? h("div", { class: "cw-step-result" }, mathNodes(st.result)) : null));
  }
  return h("details", { class: "cw-derivation" }, h("summary", { text: "Derivation (" + steps.length + " steps)" }), list);
}

export function warningsList(warnings) {
  if (!warnings || !warnings.length) return null;
  return h("ul", { class: "cw-warnings" }, warnings.map((w) =>
    h("li", { class: "cw-warning" }, h("span", { class: "cw-badge cw-badge-warn", text: "check" }), " ",
      mathNodes(typeof w === "string" ? w : w.message || JSON.stringify(w)))));
}

export function sourcesLine(ids, dataVersion) {
  const parts = [];
  for (const id of ids || []) { if (parts.length) parts.push(", "); parts.push(sourceLink(id)); }
  return h("p", { class: "cw-sources" }, "Sources: ", ...parts,
    dataVersion ? h("span", { class: "cw-data-tag", text: " · data version " + dataVersion }) : null);
}

export function cautionsBox(cautions) {
  if (!cautions || !cautions.length) return null;
  return h("div", { class: "admonition warning" }, h("p", { class: "admonition-title", text: "Cautions" }),
    h("ul", {}, cautions.map((c) => h("li", {}, mathNodes(c)))));
}

export function assumptionsBox(items) {
  if (!items || !items.length) return null;
  return h("details", { class: "cw-assumptions" }, h("summary", { text: "Assumptions" }), h("ul", {}, items.map((a) => h("li", {}, mathNodes(a)))));
}

// A verdict tier's mark (the allowance gauge, drawn by couplewise.css: .cw-mark-<tier>); its
// pattern comes with the class cw-v-<tier>. The word is calc's tier id.
export const TIERS = ["matched", "compatible", "guarded", "unsuited"];

export function tierMark(verdict) {
  return h("span", { class: "cw-mark cw-mark-" + verdict, "aria-hidden": "true" });
}

export function verdictBadge(verdict) {
  return h("span", { class: "cw-verdict cw-v-" + verdict, "data-verdict": verdict }, tierMark(verdict), h("span", { class: "cw-v-word", text: verdict }));
}

// URL state: read on load, write (replaceState) on every change.
export function urlState() {
  return new URLSearchParams(location.search);
}

export function writeUrl(params) {
  const url = new URL(location.href);
  url.search = params.toString();
  history.replaceState(history.state, "", url.href);
}
