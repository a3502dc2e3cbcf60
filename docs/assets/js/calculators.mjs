// Calculator pages. Each setup(root) builds a labelled form, keeps every input in the URL,
// recalculates on change (no submit button), shows the result with its derivation, warnings
// and sources, and on bad input shows a message next to the field and greys the last result.
import { calculate, dataset, h, onRuntime, siteRoot } from "./couplewise.mjs";
import { lineChart } from "./charts.mjs";
import { FIELD_CALCULATORS } from "./field.mjs"; // site readings (circular: used only below, at CALCULATORS)
import { SURVEY_CALCULATORS } from "./survey.mjs";

const SPECIES_RE = /^(?:(\d+(?:\.\d+)?) )?(.+)\((aq|s|l|g)\)$/;

export function parseSpecies(text) {
  const m = SPECIES_RE.exec(String(text).trim());
  if (!m) return null;
  return { coeff: m[1] ? Number(m[1]) : 1, name: m[2], phase: m[3] };
}

export function sourceLink(id) {
  return h("a", { href: new URL("reference/sources/#src-" + encodeURIComponent(id), siteRoot).href, class: "cw-source" }, id);
}

export function fmt(x, digits = 4) {
  if (typeof x !== "number" || !Number.isFinite(x)) return String(x);
  const a = Math.abs(x);
  if (a !== 0 && (a < 1e-3 || a >= 1e6)) {
    const [m, e] = x.toExponential(3).split("e");
    return m + " × 10^" + String(Number(e)).replace("-", "−");
  }
  return x.toFixed(digits);
}

// Replace an element's children, skipping empty parts (null, undefined, false).
export function fill(el, ...children) {
  el.replaceChildren(...children.flat().filter((c) => c !== null && c !== undefined && c !== false));
  return el;
}

export function signed(x, digits = 4) {
  const s = fmt(x, digits);
  return x > 0 ? "+" + s : s.replace("-", "−");
}

// Parse a number typed by a user; returns {value} or {error}.
export function readNumber(input, { min = -Infinity, max = Infinity, positive = false, allowed }) {
  const raw = input.value.trim().replace(",", ".").replace("−", "-");
  if (raw === "") return { error: "Enter a value: " + allowed + "." };
  const v = Number(raw);
  if (!Number.isFinite(v)) return { error: "“" + input.value + "” is not a number: " + allowed + "." };
  if (positive && v <= 0) return { error: "Must be greater than zero: " + allowed + "." };
  if (v < min || v > max) return { error: "Out of range: " + allowed + "." };
  return { value: v };
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
    setError(text) {
      msg.textContent = text || "";
      control.classList.toggle("cw-invalid", !!text);
      control.setAttribute("aria-invalid", text ? "true" : "false");
    },
  };
}

export function numberInput(value, attrs = {}) {
  return h("input", { type: "text", inputmode: "decimal", autocomplete: "off", value: String(value), ...attrs });
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

// The frame shared by all calculators: status line, form, result, derivation, print button.
export function frame(root, title) {
  precomputedAnswers(); // start the small download while the form is built
  const status = h("div", { class: "cw-runtime", role: "status", "aria-live": "polite" });
  const formBox = h("form", { class: "cw-form", novalidate: true, onsubmit: (e) => e.preventDefault() });
  const formMsg = h("div", { class: "cw-form-msg", role: "alert" });
  const result = h("section", { class: "cw-result", "aria-live": "polite", "aria-label": title + " result" });
  const printBtn = h("button", { type: "button", class: "md-button cw-print", onclick: () => window.print(), text: "Print this record" });
  const printHead = h("div", { class: "cw-print-only cw-print-head" });
  const printFoot = h("div", { class: "cw-print-only cw-print-foot" },
    h("p", { class: "cw-print-cautions", text: "Cautions: a screening estimate, not a design approval. Films, flow, temperature, crevices, biofilm, coatings and geometry change real behaviour. For structural, pressure, potable-water or cathodic-protection decisions apply the governing codes and standards and have the result checked by a qualified corrosion professional." }));
  root.replaceChildren(printHead, status, formBox, formMsg, result, h("div", { class: "cw-actions" }, printBtn), printFoot);
  preparePrint(root, title, printHead);
  onRuntime((rt) => {
    const text = {
      idle: "Calculation runtime: not started",
      loading: "Calculation runtime: loading (" + rt.detail + ")…",
      ready: "Calculation runtime: ready",
      failed: "Calculation runtime failed to start: " + rt.detail,
    }[rt.stage] || rt.stage;
    status.textContent = text;
    status.dataset.stage = rt.stage;
  });
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
      const footer = document.querySelector(".cw-footer");
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
    list.append(h("li", {},
      h("strong", { text: st.title || "" }),
      st.formula ? h("div", { class: "cw-formula", text: st.formula }) : null,
      st.substituted ? h("div", { class: "cw-subst", text: st.substituted }) : null,
      st.result ? h("div", { class: "cw-step-result", text: st.result }) : null));
  }
  return h("details", { class: "cw-derivation" }, h("summary", { text: "Derivation (" + steps.length + " steps)" }), list);
}

export function warningsList(warnings) {
  if (!warnings || !warnings.length) return null;
  return h("ul", { class: "cw-warnings" }, warnings.map((w) =>
    h("li", { class: "cw-warning" }, h("span", { class: "cw-badge cw-badge-warn", text: "check" }), " ",
      typeof w === "string" ? w : w.message || JSON.stringify(w))));
}

export function sourcesLine(ids, dataVersion) {
  const parts = [];
  for (const id of ids || []) { if (parts.length) parts.push(", "); parts.push(sourceLink(id)); }
  return h("p", { class: "cw-sources" }, "Sources: ", ...parts,
    dataVersion ? h("span", { class: "cw-data-tag", text: " · data version " + dataVersion }) : null);
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

// Answers to each calculator's opening request, computed at build time (sitebuild/precompute.py),
// keyed by calculator name and canonical request JSON. Fetched once, as a page's form is built.
let precomputedPromise = null;
export function precomputedAnswers() {
  if (!precomputedPromise) {
    precomputedPromise = fetch(new URL("assets/data/precomputed.json", siteRoot))
      .then((r) => (r.ok ? r.json() : null)).catch(() => null);
  }
  return precomputedPromise;
}

// Canonical JSON: object keys sorted, no spaces (mirrors canonical() in sitebuild/precompute.py).
export function canonical(v) {
  if (Array.isArray(v)) return "[" + v.map(canonical).join(",") + "]";
  if (v && typeof v === "object") return "{" + Object.keys(v).sort().map((k) => JSON.stringify(k) + ":" + canonical(v[k])).join(",") + "}";
  return JSON.stringify(v === undefined ? null : v);
}

function runtimeStage() {
  let stage = "idle";
  onRuntime((rt) => { stage = rt.stage; })();
  return stage;
}

// Recalculation with stale-result greying and field errors. A change is sent at once when no
// calculation is running, otherwise the latest one waits for the running one (no fixed delay).
// The first request of a page shows the build-time answer at once when it is exactly the
// precomputed request, marked as such, until the runtime's own answer replaces it.
export function runner(ui, name, onResult, fieldFor) {
  let ticket = 0;
  let hasResult = false;
  let first = true;
  let early = null;
  let running = null;
  let queued = null;
  function setStale(stale) { ui.result.classList.toggle("cw-stale", stale && hasResult); }
  async function showEarly(my, request, answer) {
    // Settled by a real answer only: when the runtime cannot start (it may fail before the
    // precomputed answers have loaded), the build-time answer is still worth showing.
    let settled = false;
    answer.then((out) => { settled = !!out && (out.ok || !out.error || out.error.field !== "runtime"); });
    if (runtimeStage() === "ready") return;
    const data = await precomputedAnswers();
    const result = data && data.answers && data.answers[name] && data.answers[name][canonical(request)];
    if (!result || settled || my !== ticket) return;
    hasResult = true;
    onResult(result);
    early = h("p", { class: "cw-early-note", role: "status" },
      h("span", { class: "cw-badge", text: "build time" }), " Computed at build time for these inputs, refining…");
    ui.result.classList.add("cw-early");
    ui.result.prepend(early);
    performance.mark("cw-early-painted");
  }
  async function go(request, clientErrors) {
    const my = ++ticket;
    if (clientErrors) { setStale(true); return; }
    ui.result.setAttribute("aria-busy", "true");
    const answer = calculate(name, request);
    if (first) { first = false; await showEarly(my, request, answer); }
    const out = await answer;
    if (my !== ticket) return;
    ui.result.removeAttribute("aria-busy");
    if (out.ok) {
      ui.formMsg.textContent = "";
      hasResult = true;
      early = null;
      ui.result.classList.remove("cw-early");
      onResult(out.result);
      setStale(false);
      performance.mark("cw-result-painted");
    } else if (early && out.error.field === "runtime") {
      early.replaceChildren(h("span", { class: "cw-badge", text: "build time" }),
        " Computed at build time for these inputs; the calculation runtime could not start, so other inputs cannot be calculated here.");
      ui.formMsg.textContent = out.error.message;
    } else {
      const f = fieldFor ? fieldFor(out.error.field) : null;
      if (f) f.setError(out.error.message);
      else ui.formMsg.textContent = out.error.message;
      setStale(true);
      if (!hasResult) fill(ui.result, h("p", { class: "cw-pending", text: "No result yet: correct the input above." }));
    }
  }
  async function pump() {
    while (queued) {
      const [request, clientErrors] = queued;
      queued = null;
      running = go(request, clientErrors);
      await running;
    }
    running = null;
  }
  function schedule(request, clientErrors) {
    queued = [request, clientErrors];
    if (running) ticket++; // the running answer is for older inputs: do not paint it
    else pump();
  }
  return { schedule, now: schedule };
}

// ---------------------------------------------------------------------------------------
// Couple: two half-reactions at a temperature and activities; which is oxidised, E_cell, ΔG, K.

// Demo scenario of our own: a galvanised steel rainwater tank with a copper overflow pipe,
// warm roof water at 35 °C carrying traces of both metals' ions.
const COUPLE_DEFAULTS = { a: "Zn2+/Zn", b: "Cu2+/Cu", t: "35", act: { "Zn2+": "1e-5", "Cu2+": "1e-6" }, pH: "6.5" };

async function coupleCalc(root) {
  const ui = frame(root, "Couple");
  const ds = await dataset();
  const reactions = [...ds.half_reactions].sort((x, y) => x.E0_V - y.E0_V);
  const byId = new Map(reactions.map((r) => [r.id, r]));
  const params = urlState();
  const opts = reactions.map((r) => ({ value: r.id, label: r.id + "  (E° " + signed(r.E0_V, 3) + " V)" + (r.hypothetical ? " hypothetical" : "") }));
  const aField = field("cw-a", "First half-reaction", select(opts, byId.has(params.get("a")) ? params.get("a") : COUPLE_DEFAULTS.a));
  const bField = field("cw-b", "Second half-reaction", select(opts, byId.has(params.get("b")) ? params.get("b") : COUPLE_DEFAULTS.b));
  const tField = field("cw-t", "Temperature (°C)", numberInput(params.get("t") ?? COUPLE_DEFAULTS.t), "0 to 100 °C");
  const phField = field("cw-ph", "pH", numberInput(params.get("pH") ?? COUPLE_DEFAULTS.pH), "0 to 14");
  const condBox = h("fieldset", { class: "cw-conditions" });
  ui.formBox.append(h("div", { class: "cw-row" }, aField.el, bField.el), h("div", { class: "cw-row" }, tField.el, phField.el), condBox);
  let speciesFields = new Map();

  function conditionSpecies() {
    const seen = new Map();
    let needsPH = false;
    for (const id of [aField.control.value, bField.control.value]) {
      const r = byId.get(id);
      if (!r) continue;
      for (const s of [...r.oxidised, ...r.reduced]) {
        const sp = parseSpecies(s);
        if (!sp) continue;
        if (sp.name === "H+" || sp.name === "OH-") { needsPH = true; continue; }
        if (sp.phase === "aq" || sp.phase === "g") seen.set(sp.name, sp.phase);
      }
    }
    return { seen, needsPH };
  }

  function rebuildConditions() {
    const { seen, needsPH } = conditionSpecies();
    const old = speciesFields;
    speciesFields = new Map();
    condBox.replaceChildren(h("legend", { text: seen.size ? "Activities and pressures" : "No dissolved or gaseous species other than H+/OH-" }));
    for (const [name, phase] of seen) {
      const key = (phase === "g" ? "p." : "a.") + name;
      const prev = old.get(name);
      const val = prev ? prev.control.value : params.get(key) ?? COUPLE_DEFAULTS.act[name] ?? "1";
      const label = phase === "g" ? "Partial pressure of " + name + " (atm)" : "Activity of " + name;
      const f = field("cw-sp-" + name.replace(/[^A-Za-z0-9]/g, "_"), label, numberInput(val),
        phase === "g" ? "greater than 0; 1 atm is standard" : "greater than 0; 1 is standard");
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
    const t = readNumber(tField.control, { min: 0, max: 100, allowed: "a temperature from 0 to 100 °C" });
    tField.setError(t.error); if (t.error) bad = true; else req.temp_C = t.value;
    p.set("t", tField.control.value.trim());
    if (!phField.el.hidden) {
      const ph = readNumber(phField.control, { min: 0, max: 14, allowed: "a pH from 0 to 14" });
      phField.setError(ph.error); if (ph.error) bad = true; else req.pH = ph.value;
      p.set("pH", phField.control.value.trim());
    } else phField.setError("");
    req.activities = {}; req.pressures = {};
    for (const [name, f] of speciesFields) {
      const v = readNumber(f.control, { positive: true, max: 1000, allowed: f.phase === "g" ? "a pressure above 0 atm" : "an activity above 0 (1 is standard)" });
      f.setError(v.error);
      if (v.error) bad = true;
      else if (f.phase === "g") req.pressures[name] = v.value; else req.activities[name] = v.value;
      p.set((f.phase === "g" ? "p." : "a.") + name, f.control.value.trim());
    }
    writeUrl(p);
    return { req, bad };
  }

  function fieldFor(name) {
    if (!name) return null;
    if (name.startsWith("temp")) return tField;
    if (name === "pH") return phField;
    if (name === "a" || name.endsWith(".a")) return aField;
    if (name === "b" || name.endsWith(".b")) return bField;
    for (const [sp, f] of speciesFields) if (name.includes(sp)) return f;
    return null;
  }

  function render(r) {
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
    if (lastReq) drawEpH(lastReq, r);
  }

  // E–pH picture: the water stability lines and both couples' lines against pH at the
  // stated temperature and activities (pH-dependent couples show as slopes). Every point comes
  // from calc in ONE worker call (entry point "eph"), sent once the result is painted; a newer
  // result makes an older chart's answer be dropped, so the next change never waits behind it.
  const ephBox = h("div", { class: "cw-charts" });
  let ephTicket = 0;
  function lineFor(id, req) {
    const rec = byId.get(id);
    const names = new Set(rec ? [...rec.oxidised, ...rec.reduced].map((t) => (parseSpecies(t) || {}).name) : []);
    const line = { id };
    for (const k of ["activities", "pressures"]) {
      const kept = Object.fromEntries(Object.entries(req[k] || {}).filter(([n]) => names.has(n)));
      if (Object.keys(kept).length) line[k] = kept;
    }
    return line;
  }
  async function drawEpH(req, r) {
    const my = ++ephTicket;
    const lines = [
      { name: "H+/H2", line: { id: "H+/H2" }, dash: "2 4" },
      { name: "O2/H2O", line: { id: "O2/H2O" }, dash: "2 4" },
      { name: req.a, line: lineFor(req.a, req), dash: "none" },
      { name: req.b, line: lineFor(req.b, req), dash: "8 3" },
    ];
    const out = await calculate("eph", { lines: lines.map((ln) => ln.line), temp_C: req.temp_C });
    if (my !== ephTicket) return;
    if (!out.ok) {  // never leave the chart of other inputs standing
      ephBox.replaceChildren(h("p", { class: "cw-pending", text: "E–pH chart not drawn: " + out.error.message }));
      return;
    }
    const series = lines.map((ln, i) => ({ name: ln.name, dash: ln.dash,
      points: out.result.pH.map((pH, k) => [pH, out.result.lines[i].potential_V[k]]) }));
    const anode = r.anode_electrode || {};
    const phNow = req.pH !== undefined ? req.pH : 7;
    ephBox.replaceChildren(lineChart({
      title: "E–pH: water stability lines and the two couples", xLabel: "pH", yLabel: "E (V vs SHE)",
      desc: "Between the dotted H+/H2 and O2/H2O lines water is stable; a couple whose line lies below the H+/H2 line can reduce water to hydrogen at that pH.",
      series, legendRight: true, marker: anode.potential_V !== undefined ? [phNow, anode.potential_V] : null, markerLabel: "anode, your conditions",
    }));
    performance.mark("cw-chart-painted");
  }

  let lastReq = null;
  const run = runner(ui, "couple", render, fieldFor);
  function changed(rebuild) {
    if (rebuild) rebuildConditions();
    const { req, bad } = collect();
    lastReq = bad ? null : req;
    run.schedule(req, bad);
  }
  aField.control.addEventListener("change", () => changed(true));
  bField.control.addEventListener("change", () => changed(true));
  ui.formBox.addEventListener("input", (e) => { if (e.target.tagName === "INPUT") changed(false); });
  rebuildConditions();
  const { req, bad } = collect();
  lastReq = bad ? null : req;
  fill(ui.result, h("p", { class: "cw-pending", text: "Computing…" }));
  run.now(req, bad);
}

// ---------------------------------------------------------------------------------------
// Electrode: one half-reaction at a temperature, activities (or molalities through a model).

// Demo scenario of our own: a zinc anode block in a warm brackish cooling pond at 30 °C.
const ELECTRODE_DEFAULTS = { id: "Zn2+/Zn", t: "30", pH: "7.8", act: { "Zn2+": "2e-6" } };
const MODELS = [
  { value: "ideal", label: "ideal (γ = 1)" },
  { value: "limiting", label: "Debye–Hückel limiting law" },
  { value: "extended", label: "extended Debye–Hückel (Kielland sizes)" },
  { value: "davies", label: "Davies (0.3 I term)" },
];

function speciesOf(reactions) {
  const seen = new Map();
  let needsPH = false;
  for (const r of reactions) {
    if (!r) continue;
    for (const txt of [...r.oxidised, ...r.reduced]) {
      const sp = parseSpecies(txt);
      if (!sp) continue;
      if (sp.name === "H+" || sp.name === "OH-") { needsPH = true; continue; }
      if (sp.phase === "aq" || sp.phase === "g") seen.set(sp.name, sp.phase);
    }
  }
  return { seen, needsPH };
}

async function electrodeCalc(root) {
  const ui = frame(root, "Electrode potential");
  const ds = await dataset();
  const reactions = [...ds.half_reactions].sort((x, y) => x.E0_V - y.E0_V);
  const byId = new Map(reactions.map((r) => [r.id, r]));
  const params = urlState();
  const opts = reactions.map((r) => ({ value: r.id, label: r.id + "  (E° " + signed(r.E0_V, 3) + " V)" }));
  const idField = field("cw-id", "Half-reaction", select(opts, byId.has(params.get("id")) ? params.get("id") : ELECTRODE_DEFAULTS.id));
  const tField = field("cw-t", "Temperature (°C)", numberInput(params.get("t") ?? ELECTRODE_DEFAULTS.t), "0 to 100 °C");
  const phField = field("cw-ph", "pH", numberInput(params.get("pH") ?? ELECTRODE_DEFAULTS.pH), "0 to 14");
  const modeField = field("cw-mode", "Dissolved species given as", select([{ value: "activity", label: "activities" }, { value: "molality", label: "molalities (mol/kg) through an activity model" }], params.get("mode") === "molality" ? "molality" : "activity"));
  const modelField = field("cw-model", "Activity model", select(MODELS, MODELS.some((m) => m.value === params.get("model")) ? params.get("model") : "davies"));
  const envOpts = [{ value: "", label: "ionic strength typed below" }, ...ds.environments.filter((e) => e.ionic_strength_mol_per_kg).map((e) => ({ value: e.id, label: e.name + " (I ≈ " + e.ionic_strength_mol_per_kg + " mol/kg)" }))];
  const envField = field("cw-env", "Ionic strength from", select(envOpts, params.get("env") || ""));
  const iField = field("cw-i", "Ionic strength I (mol/kg)", numberInput(params.get("I") ?? "0.01"), "0 or more; each model has its own valid range");
  const condBox = h("fieldset", { class: "cw-conditions" });
  const modelRow = h("div", { class: "cw-row" }, modelField.el, envField.el, iField.el);
  ui.formBox.append(h("div", { class: "cw-row" }, idField.el, tField.el, phField.el), h("div", { class: "cw-row" }, modeField.el), modelRow, condBox);
  const charts = h("div", { class: "cw-charts" });
  let speciesFields = new Map();

  function rebuild() {
    const { seen, needsPH } = speciesOf([byId.get(idField.control.value)]);
    const old = speciesFields;
    speciesFields = new Map();
    const mol = modeField.control.value === "molality";
    condBox.replaceChildren(h("legend", { text: seen.size ? (mol ? "Molalities and pressures" : "Activities and pressures") : "No dissolved or gaseous species other than H+/OH-" }));
    for (const [name, phase] of seen) {
      const prev = old.get(name);
      const key = (phase === "g" ? "p." : mol ? "m." : "a.") + name;
      const val = prev && prev.mol === mol ? prev.control.value : params.get(key) ?? ELECTRODE_DEFAULTS.act[name] ?? "1";
      const label = phase === "g" ? "Partial pressure of " + name + " (atm)" : (mol ? "Molality of " + name + " (mol/kg)" : "Activity of " + name);
      const f = field("cw-sp-" + name.replace(/[^A-Za-z0-9]/g, "_"), label, numberInput(val), "greater than 0");
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
    const t = readNumber(tField.control, { min: 0, max: 100, allowed: "a temperature from 0 to 100 °C" });
    tField.setError(t.error); if (t.error) bad = true; else req.temp_C = t.value;
    p.set("t", tField.control.value.trim());
    if (!phField.el.hidden) {
      const ph = readNumber(phField.control, { min: 0, max: 14, allowed: "a pH from 0 to 14" });
      phField.setError(ph.error); if (ph.error) bad = true; else req.pH = ph.value;
      p.set("pH", phField.control.value.trim());
    }
    const mol = modeField.control.value === "molality";
    if (mol) {
      p.set("mode", "molality");
      req.model = modelField.control.value; p.set("model", req.model);
      if (envField.control.value) { req.env = envField.control.value; p.set("env", req.env); }
      else {
        const I = readNumber(iField.control, { min: 0, max: 10, allowed: "an ionic strength from 0 to 10 mol/kg" });
        iField.setError(I.error); if (I.error) bad = true; else req.ionic_strength = I.value;
        p.set("I", iField.control.value.trim());
      }
    }
    const acts = {}, mols = {}, press = {};
    for (const [name, f] of speciesFields) {
      const v = readNumber(f.control, { positive: true, max: 1000, allowed: f.phase === "g" ? "a pressure above 0 atm" : "a value above 0" });
      f.setError(v.error);
      if (v.error) bad = true;
      else if (f.phase === "g") press[name] = v.value; else if (mol) mols[name] = v.value; else acts[name] = v.value;
      p.set((f.phase === "g" ? "p." : mol ? "m." : "a.") + name, f.control.value.trim());
    }
    if (Object.keys(acts).length) req.activities = acts;
    if (Object.keys(mols).length) req.molalities = mols;
    if (Object.keys(press).length) req.pressures = press;
    writeUrl(p);
    return { req, bad };
  }

  function fieldFor(name) {
    if (!name) return null;
    if (name.startsWith("temp")) return tField;
    if (name === "pH") return phField;
    if (name === "id") return idField;
    if (name.startsWith("ionic")) return iField;
    if (name === "model") return modelField;
    if (name === "env") return envField;
    for (const [sp, f] of speciesFields) if (name.includes(sp)) return f;
    return null;
  }

  let chartTicket = 0;
  async function drawCharts(req, r) {
    const my = ++chartTicket;
    const temps = [0, 10, 20, 25, 30, 40, 50, 60, 70, 80, 90, 100];
    const tPts = [];
    for (const t of temps) {
      const out = await calculate("electrode", { ...req, temp_C: t });
      if (my !== chartTicket) return;
      if (out.ok) tPts.push([t, out.result.potential_V]);
    }
    const ion = [...speciesFields.entries()].find(([, f]) => f.phase === "aq");
    const nodes = [lineChart({ title: "Potential against temperature", xLabel: "temperature (°C)", yLabel: "E (V vs SHE)", series: [{ name: r.id, points: tPts }], marker: [req.temp_C, r.potential_V] })];
    if (ion && req.activities) {
      const [name] = ion;
      const aPts = [];
      for (let lg = -8; lg <= 0; lg += 1) {
        const out = await calculate("electrode", { ...req, activities: { ...req.activities, [name]: Math.pow(10, lg) } });
        if (my !== chartTicket) return;
        if (out.ok) aPts.push([lg, out.result.potential_V]);
      }
      nodes.push(lineChart({ title: "Potential against log activity of " + name, xLabel: "log₁₀ a(" + name + ")", yLabel: "E (V vs SHE)", series: [{ name, points: aPts }], marker: [Math.log10(req.activities[name]), r.potential_V] }));
    }
    charts.replaceChildren(...nodes);
  }

  let lastReq = null;
  function render(r) {
    fill(ui.result, 
      h("p", { class: "cw-big" }, h("span", { class: "cw-big-label", text: "E " }), h("span", { class: "cw-big-value", "data-cw-value": "potential_V", text: signed(r.potential_V) }), h("span", { class: "cw-unit", text: " V vs SHE" })),
      h("p", { class: "cw-direction", text: "E° at " + fmt(r.temp_C, 1) + " °C: " + signed(r.standard_potential_V) + " V vs SHE; your conditions shift it by " + signed(r.potential_V - r.standard_potential_V) + " V." }),
      r.hypothetical ? h("p", { class: "cw-warning", text: "Hypothetical couple: its ion is not stable in water; the value is a thermodynamic estimate." }) : null,
      warningsList(r.warnings), charts, derivation(r.steps), sourcesLine(r.sources, r.data_version));
    if (lastReq) drawCharts(lastReq, r);
  }
  const run = runner(ui, "electrode", render, fieldFor);
  function changed(rb) { if (rb) rebuild(); const { req, bad } = collect(); lastReq = bad ? null : req; run.schedule(req, bad); }
  for (const f of [idField, modeField, envField, modelField]) f.control.addEventListener("change", () => changed(true));
  ui.formBox.addEventListener("input", (e) => { if (e.target.tagName === "INPUT") changed(false); });
  rebuild();
  const first = collect();
  lastReq = first.bad ? null : first.req;
  run.now(first.req, first.bad);
}

// ---------------------------------------------------------------------------------------
// Reference-electrode conversion.

// Demo scenario of our own: a diver's reading on a jetty pile taken with a seawater
// silver/silver-chloride cell, to be logged against a copper/copper-sulfate survey.
const CONVERT_DEFAULTS = { v: "-0.930", from: "Ag/AgCl seawater", to: "CSE", t: "18", pH: "7" };

async function convertCalc(root) {
  const ui = frame(root, "Reference conversion");
  const ds = await dataset();
  const params = urlState();
  const refs = [...ds.reference_electrodes.map((r) => ({ value: r.id, label: r.id + " (" + signed(r.E_V_SHE, 4) + " V vs SHE at 25 °C)" })), { value: "RHE", label: "RHE (computed from pH)" }];
  const ids = new Set(refs.map((r) => r.value));
  const vField = field("cw-v", "Reading (V)", numberInput(params.get("v") ?? CONVERT_DEFAULTS.v), "the potential as read on the meter, in volts");
  const fromField = field("cw-from", "Measured against", select(refs, ids.has(params.get("from")) ? params.get("from") : CONVERT_DEFAULTS.from));
  const toField = field("cw-to", "Express against", select(refs, ids.has(params.get("to")) ? params.get("to") : CONVERT_DEFAULTS.to));
  const tField = field("cw-t", "Electrode temperature (°C)", numberInput(params.get("t") ?? CONVERT_DEFAULTS.t), "0 to 100 °C; each electrode has its own valid range");
  const phField = field("cw-ph", "pH (for RHE)", numberInput(params.get("pH") ?? CONVERT_DEFAULTS.pH), "0 to 14");
  ui.formBox.append(h("div", { class: "cw-row" }, vField.el, fromField.el, toField.el), h("div", { class: "cw-row" }, tField.el, phField.el));
  function collect() {
    let bad = false;
    const p = new URLSearchParams();
    const req = { from: fromField.control.value, to: toField.control.value };
    const v = readNumber(vField.control, { min: -5, max: 5, allowed: "a reading from −5 to +5 V" });
    vField.setError(v.error); if (v.error) bad = true; else req.value_V = v.value;
    const t = readNumber(tField.control, { min: 0, max: 100, allowed: "a temperature from 0 to 100 °C" });
    tField.setError(t.error); if (t.error) bad = true; else req.temp_C = t.value;
    const rhe = req.from === "RHE" || req.to === "RHE";
    phField.el.hidden = !rhe;
    if (rhe) {
      const ph = readNumber(phField.control, { min: 0, max: 14, allowed: "a pH from 0 to 14" });
      phField.setError(ph.error); if (ph.error) bad = true; else req.pH = ph.value;
      p.set("pH", phField.control.value.trim());
    }
    p.set("v", vField.control.value.trim()); p.set("from", req.from); p.set("to", req.to); p.set("t", tField.control.value.trim());
    writeUrl(p);
    return { req, bad };
  }
  function fieldFor(name) {
    if (!name) return null;
    if (name.startsWith("value")) return vField;
    if (name === "from") return fromField;
    if (name === "to") return toField;
    if (name.startsWith("temp")) return tField;
    if (name === "pH") return phField;
    return null;
  }
  function render(r) {
    fill(ui.result, 
      h("p", { class: "cw-big" }, h("span", { class: "cw-big-value", "data-cw-value": "value_V", text: signed(r.value_V) }), h("span", { class: "cw-unit", text: " V vs " + r.to })),
      h("p", { class: "cw-direction", text: signed(r.input_V ?? Number(vField.control.value)) + " V vs " + r.from + " at " + fmt(r.temp_C, 1) + " °C is " + signed(r.value_V) + " V vs " + r.to + "." }),
      warningsList(r.warnings), derivation(r.steps), sourcesLine(r.sources, r.data_version));
  }
  const run = runner(ui, "convert", render, fieldFor);
  function changed() { const { req, bad } = collect(); run.schedule(req, bad); }
  ui.formBox.addEventListener("input", changed);
  ui.formBox.addEventListener("change", changed);
  const first = collect();
  run.now(first.req, first.bad);
}

// ---------------------------------------------------------------------------------------
// Activity coefficient of one ion.

// Demo scenario of our own: zinc ions in a moderately hard process water, I = 0.02 mol/kg, 40 °C.
const ACTIVITY_DEFAULTS = { sp: "Zn2+", I: "0.02", model: "extended", t: "40" };

async function activityCalc(root) {
  const ui = frame(root, "Activity coefficient");
  const ds = await dataset();
  const params = urlState();
  const ions = ds.ions.map((i) => ({ value: i.species, label: i.species + " (z = " + i.charge + ", å = " + i.size_angstrom + " Å)" }));
  const known = new Set(ions.map((i) => i.value));
  const spField = field("cw-sp", "Ion", select(ions, known.has(params.get("sp")) ? params.get("sp") : ACTIVITY_DEFAULTS.sp));
  const iField = field("cw-i", "Ionic strength I (mol/kg)", numberInput(params.get("I") ?? ACTIVITY_DEFAULTS.I), "0 or more; each model has its own valid range");
  const modelField = field("cw-model", "Model", select(MODELS, MODELS.some((m) => m.value === params.get("model")) ? params.get("model") : ACTIVITY_DEFAULTS.model));
  const tField = field("cw-t", "Temperature (°C)", numberInput(params.get("t") ?? ACTIVITY_DEFAULTS.t), "0 to 100 °C");
  ui.formBox.append(h("div", { class: "cw-row" }, spField.el, iField.el), h("div", { class: "cw-row" }, modelField.el, tField.el));
  const charts = h("div", { class: "cw-charts" });
  function collect() {
    let bad = false;
    const p = new URLSearchParams();
    const req = { species: spField.control.value, model: modelField.control.value };
    const I = readNumber(iField.control, { min: 0, max: 10, allowed: "an ionic strength from 0 to 10 mol/kg" });
    iField.setError(I.error); if (I.error) bad = true; else req.ionic_strength = I.value;
    const t = readNumber(tField.control, { min: 0, max: 100, allowed: "a temperature from 0 to 100 °C" });
    tField.setError(t.error); if (t.error) bad = true; else req.temp_C = t.value;
    p.set("sp", req.species); p.set("I", iField.control.value.trim()); p.set("model", req.model); p.set("t", tField.control.value.trim());
    writeUrl(p);
    return { req, bad };
  }
  function fieldFor(name) {
    if (!name) return null;
    if (name.startsWith("ionic")) return iField;
    if (name.startsWith("temp")) return tField;
    if (name === "model") return modelField;
    if (name === "species") return spField;
    return null;
  }
  let lastReq = null, ticket = 0;
  async function drawChart(req, r) {
    const my = ++ticket;
    const series = [];
    for (const m of MODELS) {
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
  function render(r) {
    fill(ui.result, 
      h("p", { class: "cw-big" }, h("span", { class: "cw-big-label", text: "γ " }), h("span", { class: "cw-big-value", "data-cw-value": "gamma", text: fmt(r.gamma, 4) })),
      h("p", { class: "cw-direction", text: "Debye–Hückel A = " + fmt(r.A, 4) + " kg^½ mol^−½, B = " + fmt(r.B, 4) + " kg^½ mol^−½ Å^−1 at " + fmt(r.temp_C, 1) + " °C." }),
      warningsList(r.warnings), charts, derivation(r.steps), sourcesLine(r.sources, r.data_version));
    if (lastReq) drawChart(lastReq, r);
  }
  const run = runner(ui, "activity", render, fieldFor);
  function changed() { const { req, bad } = collect(); lastReq = bad ? null : req; run.schedule(req, bad); }
  ui.formBox.addEventListener("input", changed);
  ui.formBox.addEventListener("change", changed);
  const first = collect();
  lastReq = first.bad ? null : first.req;
  run.now(first.req, first.bad);
}

// ---------------------------------------------------------------------------------------
// Joint: two materials in a named environment; the decision.

export const VERDICT_SYMBOL = { matched: "◎", compatible: "○", guarded: "△", unsuited: "✕" };

// Demo scenario of our own: stainless hinge pins on an aluminium hatch of a workboat.
const JOINT_DEFAULTS = { a: "aluminium-5083", b: "stainless-316-passive", env: "seawater-quiescent", ar: "0.2" };

// The galvanic series chart (made at build time) as a page node: fetched and parsed once per
// page; each joint calculator keeps one copy and only changes which bars are highlighted.
let seriesSvgPromise = null;
function seriesSvgTemplate() {
  if (!seriesSvgPromise) {
    seriesSvgPromise = (async () => {
      const r = await fetch(new URL("reference/galvanic-series.svg", siteRoot));
      const text = r.ok ? await r.text() : "";
      if (!text) return null;
      const svg = new DOMParser().parseFromString(text, "image/svg+xml").documentElement;
      if (svg.nodeName !== "svg") return null;
      svg.removeAttribute("width"); svg.removeAttribute("height");
      svg.classList.add("cw-series-inline");
      return document.importNode(svg, true);
    })().catch(() => null);
  }
  return seriesSvgPromise;
}

function seriesChartView() {
  let node = null;
  return async function show(highlight) {
    if (!node) {
      const template = await seriesSvgTemplate();
      if (!template) return null;
      node = template.cloneNode(true);
    }
    for (const g of node.querySelectorAll("[data-material]")) {
      const on = highlight.includes(g.getAttribute("data-material"));
      g.classList.toggle("cw-hl", on);
      g.classList.toggle("cw-dim", !on);
    }
    return node;
  };
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

export function verdictBadge(verdict) {
  return h("span", { class: "cw-verdict cw-v-" + verdict, "data-verdict": verdict },
    h("span", { class: "cw-v-symbol", "aria-hidden": "true", text: VERDICT_SYMBOL[verdict] || "?" }), " ", verdict);
}

async function jointCalc(root) {
  const ui = frame(root, "Joint");
  const ds = await dataset();
  const params = urlState();
  const mids = new Set(ds.materials.map((m) => m.id));
  const eids = new Set(ds.environments.map((e) => e.id));
  const mopts = materialOptions(ds);
  const aField = field("cw-a", "First material", select(mopts, mids.has(params.get("a")) ? params.get("a") : JOINT_DEFAULTS.a));
  const bField = field("cw-b", "Second material", select(mopts, mids.has(params.get("b")) ? params.get("b") : JOINT_DEFAULTS.b));
  const envField = field("cw-env", "Environment", select(ds.environments.map((e) => ({ value: e.id, label: e.name })), eids.has(params.get("env")) ? params.get("env") : JOINT_DEFAULTS.env));
  const arField = field("cw-ar", "Wetted area ratio, cathode : anode", numberInput(params.get("ar") ?? JOINT_DEFAULTS.ar), "greater than 0; e.g. 0.1 for a small noble fastener in a large plate, 10 for the reverse; empty for equal areas");
  ui.formBox.append(h("div", { class: "cw-row" }, aField.el, bField.el), h("div", { class: "cw-row" }, envField.el, arField.el));
  function collect() {
    let bad = false;
    const p = new URLSearchParams();
    const req = { a: aField.control.value, b: bField.control.value, env: envField.control.value };
    if (arField.control.value.trim() !== "") {
      const ar = readNumber(arField.control, { positive: true, max: 1e6, allowed: "a ratio above 0 (cathode area over anode area)" });
      arField.setError(ar.error); if (ar.error) bad = true; else req.area_ratio = ar.value;
    } else arField.setError("");
    p.set("a", req.a); p.set("b", req.b); p.set("env", req.env); p.set("ar", arField.control.value.trim());
    writeUrl(p);
    return { req, bad };
  }
  function fieldFor(name) {
    if (!name) return null;
    if (name === "a") return aField;
    if (name === "b") return bField;
    if (name === "env") return envField;
    if (name.startsWith("area")) return arField;
    return null;
  }
  const seriesChart = seriesChartView();
  async function render(r) {
    const range = r.delta_E_range_V || [];
    const rate = r.rate_mm_per_year;
    const rows = (r.states || []).map((st) => h("tr", {},
      h("td", { text: st.a }), h("td", { text: st.b }), h("td", { text: st.anode || "—" }),
      h("td", { text: fmt(st.delta_E_V, 3) }), h("td", { text: (st.delta_E_range_V || []).map((v) => fmt(v, 3)).join(" to ") }), h("td", {}, verdictBadge(st.verdict))));
    const chart = h("div", { class: "cw-series-box" });
    fill(ui.result,
      h("p", { class: "cw-big" }, verdictBadge(r.verdict)),
      h("p", { class: "cw-direction", text: r.verdict_text }),
      h("p", { class: "cw-meaning", text: "“" + r.verdict + "”: " + r.verdict_meaning }),
      h("table", { class: "cw-compare" }, h("tbody", {},
        h("tr", {}, h("th", { text: "Anode (attacked)" }), h("td", { text: r.anode_name || r.anode || "—" })),
        h("tr", {}, h("th", { text: "Cathode" }), h("td", { text: r.cathode_name || r.cathode || "—" })),
        h("tr", {}, h("th", { text: "Basis" }), h("td", {}, r.basis_description || r.basis, " ", sourceLink(r.basis_source))),
        h("tr", {}, h("th", { text: "Potential difference ΔE, nominal" }), h("td", { "data-cw-value": "delta_E_V", text: fmt(r.delta_E_V, 3) + " V" })),
        h("tr", {}, h("th", { text: "ΔE best to worst case" }), h("td", { text: range.map((v) => fmt(v, 3)).join(" to ") + " V" })),
        h("tr", {}, h("th", { text: "Allowable ΔE in this environment" }), h("td", {}, fmt(r.allowable_V, 2) + " V ", sourceLink(r.allowable_source))),
        h("tr", {}, h("th", { text: "Area effect" }), h("td", { text: r.area_effect || "" })),
        h("tr", {}, h("th", { text: "Extra attack on the anode (screening)" }), h("td", { "data-cw-value": "rate_mm_per_year", text: rate ? fmt(rate[0], 3) + " to " + fmt(rate[1], 3) + " mm/year" : "not estimated: " + (r.rate_reason || "") })))),
      warningsList(r.warnings),
      rows.length > 1 ? h("details", { class: "cw-states", open: true }, h("summary", { text: "Passive and active states compared" }),
        h("table", {}, h("thead", {}, h("tr", {}, ["First", "Second", "Anode", "ΔE (V)", "range (V)", "verdict"].map((t) => h("th", { text: t })))), h("tbody", {}, rows))) : null,
      h("h3", { text: "What to do" }),
      h("ul", { class: "cw-mitigations" }, (r.mitigations || []).map((m) => h("li", {}, h("strong", { text: m.text }), h("br"), h("span", { class: "cw-reason", text: "Why here: " + m.reason })))),
      h("h3", { text: "Closer-matched materials" }),
      ...(r.alternatives || []).map((alt) => h("details", { class: "cw-alts" }, h("summary", { text: alt.text + " (" + alt.count + " pass)" }),
        h("ol", {}, alt.options.map((o) => h("li", {}, o.name + ": ΔE " + fmt(o.delta_E_V, 3) + " V, margin " + fmt(o.margin_V, 3) + " V ", verdictBadge(o.verdict)))))),
      h("h3", { text: "Where the pair sits in the series" }), chart,
      h("details", { class: "cw-assumptions" }, h("summary", { text: "Assumptions" }), h("ul", {}, (r.assumptions || []).map((a) => h("li", { text: a })))),
      derivation(r.steps),
      h("div", { class: "admonition warning" }, h("p", { class: "admonition-title", text: "Cautions" }), h("ul", {}, (r.cautions || []).map((c) => h("li", { text: c })))),
      sourcesLine(r.sources, r.data_version));
    const svg = await seriesChart([r.a, r.b, ...((r.states || []).flatMap((st) => [st.a, st.b]))]);
    if (svg) chart.replaceChildren(svg);
  }
  const run = runner(ui, "joint", render, fieldFor);
  function changed() { const { req, bad } = collect(); run.schedule(req, bad); }
  ui.formBox.addEventListener("input", changed);
  ui.formBox.addEventListener("change", changed);
  const first = collect();
  run.now(first.req, first.bad);
}

// ---------------------------------------------------------------------------------------
// Matrix: every pair of a set of materials in one environment, as a heat map with numbers.

// Demo scenario of our own: the metals on a harbour pontoon, in quiescent seawater.
const MATRIX_DEFAULTS = { env: "seawater-quiescent", m: "zinc,aluminium-5083,carbon-steel,cast-iron,copper,cuni-90-10,nickel-aluminium-bronze,stainless-316-passive,stainless-316-active,titanium" };

// Sequential, colour-blind-safe, monotonic in lightness (readable in grey): light = small ΔE.
// The shades are the classes cw-heat-0 … cw-heat-6 in couplewise.css: no style attributes, so
// the site's Content-Security-Policy needs no 'unsafe-inline' for styles.
const HEAT_SHADES = 7;

async function matrixCalc(root) {
  const ui = frame(root, "Matrix");
  const ds = await dataset();
  const params = urlState();
  const eids = new Set(ds.environments.map((e) => e.id));
  const envField = field("cw-env", "Environment", select(ds.environments.map((e) => ({ value: e.id, label: e.name })), eids.has(params.get("env")) ? params.get("env") : MATRIX_DEFAULTS.env));
  const listBox = h("select", { multiple: true, size: "10" });
  for (const g of materialOptions(ds)) {
    const og = h("optgroup", { label: g.group });
    for (const o of g.options) og.append(h("option", { value: o.value, text: o.label }));
    listBox.append(og);
  }
  const chosen = new Set((params.get("m") ?? MATRIX_DEFAULTS.m).split(",").filter(Boolean));
  for (const o of listBox.options) o.selected = chosen.has(o.value);
  const mField = field("cw-m", "Materials (select several; none = all with data)", listBox);
  // The CSV is made by calc only when asked for (a click): the worker answers the same request
  // with "csv": true, and the link then holds it as a data: URL (no inline script under the CSP).
  const csvLink = h("a", { class: "md-button", download: "couplewise-matrix.csv", href: "#", text: "Download CSV" });
  ui.formBox.append(h("div", { class: "cw-row" }, envField.el, mField.el), csvLink);
  let lastReq = null;
  let csvFor = null; // canonical request whose CSV the link holds
  let csvBusy = false;
  csvLink.addEventListener("click", async (e) => {
    const req = lastReq;
    const key = req ? canonical(req) : null;
    if (key && csvFor === key) return; // the link holds this table's CSV: the browser saves it
    e.preventDefault();
    if (!req || csvBusy) return;
    csvBusy = true;
    csvLink.setAttribute("aria-busy", "true");
    const out = await calculate("matrix", { ...req, csv: true });
    csvBusy = false;
    csvLink.removeAttribute("aria-busy");
    if (!out.ok) { ui.formMsg.textContent = out.error.message; return; }
    csvLink.href = "data:text/csv;charset=utf-8," + encodeURIComponent(out.result.csv);
    csvFor = key;
    csvLink.click();
  });
  function collect() {
    const sel = [...listBox.selectedOptions].map((o) => o.value);
    const req = { env: envField.control.value };
    if (sel.length) req.materials = sel;
    const p = new URLSearchParams();
    p.set("env", req.env); p.set("m", sel.join(","));
    writeUrl(p);
    lastReq = req;
    if (csvFor !== canonical(req)) { csvFor = null; csvLink.href = "#"; }
    return { req, bad: false };
  }
  function fieldFor(name) {
    if (name === "env") return envField;
    if (name && name.startsWith("materials")) return mField;
    return null;
  }
  const names = new Map(ds.materials.map((m) => [m.id, m.name]));
  // The table of the materials shown: built once per list of materials (element by element,
  // detached, inserted once); a new result for the same materials (another environment) only
  // updates its cells in place.
  let shown = null; // { key, wrap, cells: n×n array of td (null on the diagonal), last: what each cell shows }
  function tableFor(ids) {
    const key = ids.join("\n");
    if (shown && shown.key === key) return shown;
    const n = ids.length;
    const table = h("table", { class: "cw-matrix" });
    table.append(h("thead", {}, h("tr", {}, h("th", { text: "ΔE (V)" }), ids.map((id, j) => h("th", { scope: "col", title: names.get(id) || id }, h("span", { text: String(j + 1) + ". " + id }))))));
    const body = document.createElement("tbody");
    const cell = document.createElement("td"); // a cell: its ΔE text, then the verdict symbol
    cell.append("", h("span", { class: "cw-v-symbol" }, ""));
    const diag = h("td", { class: "cw-diag", text: "—" });
    const cells = new Array(n * n).fill(null);
    for (let i = 0; i < n; i++) {
      const tr = document.createElement("tr");
      const th = document.createElement("th");
      th.scope = "row";
      th.textContent = String(i + 1) + ". " + (names.get(ids[i]) || ids[i]);
      tr.append(th);
      for (let j = 0; j < n; j++) {
        const td = (i === j ? diag : cell).cloneNode(true);
        if (i !== j) cells[i * n + j] = td;
        tr.append(td);
      }
      body.append(tr);
    }
    table.append(body);
    shown = { key, wrap: h("div", { class: "cw-matrix-wrap" }, table), cells, last: new Array(n * n).fill("") };
    return shown;
  }
  // The result lists each pair once (upper triangle: [a, b, ΔE, verdict, anode], indices into
  // materials); the table shows both halves.
  function render(r) {
    const ids = r.materials, n = ids.length;
    let max = 0.01;
    for (const p of r.pairs) if (p[2] > max) max = p[2];
    const { wrap, cells, last } = tableFor(ids);
    for (const p of r.pairs) {
      const d = p[2], v = p[3], a = p[4];
      const k = Math.min(HEAT_SHADES - 1, Math.floor((d / max) * (HEAT_SHADES - 1) + 1e-9));
      const cls = "cw-cell cw-heat-" + k + " cw-v-" + v;
      const title = (a !== null ? "anode: " + ids[a] + "; " : "") + v;
      const text = fmt(d, 2), sym = " " + (VERDICT_SYMBOL[v] || "");
      const now = cls + "|" + title + "|" + text;
      for (const at of [p[0] * n + p[1], p[1] * n + p[0]]) {
        if (last[at] === now) continue; // unchanged: no write, no style work
        last[at] = now;
        const td = cells[at];
        td.className = cls;
        td.title = title;
        td.firstChild.data = text;
        const span = td.lastChild;
        span.setAttribute("aria-label", v);
        span.firstChild.data = sym;
      }
    }
    const legend = h("p", { class: "cw-legend" }, "Cells: ΔE in volts (darker = larger), with the verdict symbol: ",
      ...Object.entries(VERDICT_SYMBOL).map(([v, sym]) => h("span", { class: "cw-legend-item", text: sym + " " + v + "  " })));
    const rest = [warningsList(r.warnings), derivation(r.steps), sourcesLine(r.sources, r.data_version)].filter(Boolean);
    if (wrap.parentNode === ui.result) { // the same table stays in place: replace what is around it
      for (const c of [...ui.result.childNodes]) if (c !== wrap) c.remove();
      wrap.before(legend);
      wrap.after(...rest);
    } else fill(ui.result, legend, wrap, rest);
  }
  const run = runner(ui, "matrix", render, fieldFor);
  function changed() { const { req, bad } = collect(); run.schedule(req, bad); }
  ui.formBox.addEventListener("change", changed);
  const first = collect();
  run.now(first.req, first.bad);
}

export const CALCULATORS = { couple: coupleCalc, electrode: electrodeCalc, convert: convertCalc, activity: activityCalc, joint: jointCalc, matrix: matrixCalc, ...FIELD_CALCULATORS, ...SURVEY_CALCULATORS };
