// Calculator pages. Each setup(root) builds a labelled form, keeps every input in the URL,
// recalculates on change (no submit button), shows the result with its derivation, warnings
// and sources, and on bad input shows a message next to the field and greys the last result.
import { calculate, dataset, h, onRuntime, siteRoot } from "./couplewise.mjs";

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
  if (a !== 0 && (a < 1e-3 || a >= 1e6)) return x.toExponential(3).replace("e", "×10^");
  return x.toFixed(digits);
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
  const status = h("div", { class: "cw-runtime", role: "status", "aria-live": "polite" });
  const formBox = h("form", { class: "cw-form", novalidate: true, onsubmit: (e) => e.preventDefault() });
  const formMsg = h("div", { class: "cw-form-msg", role: "alert" });
  const result = h("section", { class: "cw-result", "aria-live": "polite", "aria-label": title + " result" });
  const printBtn = h("button", { type: "button", class: "md-button cw-print", onclick: () => window.print(), text: "Print this record" });
  root.replaceChildren(status, formBox, formMsg, result, h("div", { class: "cw-actions" }, printBtn));
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

// Debounced recalculation with stale-result greying and field errors.
export function runner(ui, name, onResult, fieldFor) {
  let ticket = 0;
  let timer = null;
  let hasResult = false;
  function setStale(stale) { ui.result.classList.toggle("cw-stale", stale && hasResult); }
  async function go(request, clientErrors) {
    const my = ++ticket;
    if (clientErrors) { setStale(true); return; }
    ui.result.setAttribute("aria-busy", "true");
    const out = await calculate(name, request);
    if (my !== ticket) return;
    ui.result.removeAttribute("aria-busy");
    if (out.ok) {
      ui.formMsg.textContent = "";
      hasResult = true;
      onResult(out.result);
      setStale(false);
      performance.mark("cw-result-painted");
    } else {
      const f = fieldFor ? fieldFor(out.error.field) : null;
      if (f) f.setError(out.error.message);
      else ui.formMsg.textContent = out.error.message;
      setStale(true);
      if (!hasResult) ui.result.replaceChildren(h("p", { class: "cw-pending", text: "No result yet: correct the input above." }));
    }
  }
  return {
    schedule(request, clientErrors) {
      clearTimeout(timer);
      timer = setTimeout(() => go(request, clientErrors), 60);
    },
    now: go,
  };
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
    ui.result.replaceChildren(
      h("p", { class: "cw-big" }, h("span", { class: "cw-big-label", text: "E cell " }), h("span", { class: "cw-big-value", "data-cw-value": "cell_potential_V", text: signed(r.cell_potential_V) }), h("span", { class: "cw-unit", text: " V" })),
      h("p", { class: "cw-direction" }, h("strong", { text: an }), " is oxidised (the anode); ", h("strong", { text: ca }), " is reduced (the cathode)."),
      h("p", { class: "cw-reaction" }, "Overall: ", h("span", { class: "cw-formula", text: r.overall_reaction })),
      warningsList(r.warnings), tbl, derivation(r.steps), sourcesLine(r.sources, r.data_version));
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
  ui.result.replaceChildren(h("p", { class: "cw-pending", text: "Computing…" }));
  run.now(req, bad);
}

export const CALCULATORS = { couple: coupleCalc };
