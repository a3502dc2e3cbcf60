// The service conditions of a joint, a matrix or a measured joint: temperature, salinity or
// chloride, oxygen, flow and the geometry it acts on, pH, conductivity and (joint) the anode's
// wetted area for the IR term. A field left empty is not sent: calc takes the environment's
// default (data/service_defaults.yaml), and the field shows that default as its hint. Collapsed,
// the section is one line with the values that will be used; the result's service_conditions
// say, value by value, whether the user or the environment gave it (serviceUsed()).
// Numbers are read by the one rule of ui.mjs (readInto): calc decides what is allowed and its
// message is shown at the field it names (fieldFor()).
import { allowed, field, fill, fmt, h, numberInput, readInto, select, sourceLink } from "./ui.mjs";

const AERATION = [
  { value: "air-saturated", label: "air-saturated (computed at the temperature and salinity)" },
  { value: "deaerated", label: "deaerated (no dissolved oxygen)" },
  { value: "measured", label: "a measured value, in mg/L" },
];
const GEOMETRY = [
  { value: "still", label: "still water" },
  { value: "surface", label: "along an open surface" },
  { value: "pipe", label: "inside a pipe" },
];
const WATER = [{ value: "salinity", label: "salinity (g/kg)" }, { value: "chloride_mg_per_L", label: "chloride (mg/L)" }];
// request key -> [URL key, label, spec bound, noun of the "not a number" message, unit]
const NUMBERS = {
  temp_C: ["sc-t", "Water temperature (°C)", "temp_C", "a temperature", "°C"],
  water: ["sc-w", "", null, "", ""],
  o2_mg_L: ["sc-o2v", "Dissolved oxygen (mg/L)", null, "a dissolved oxygen in mg/L, e.g. 6.5", "mg/L"],
  velocity_m_s: ["sc-v", "Flow velocity (m/s)", "velocity_m_s", "a flow velocity in m/s", "m/s"],
  length_m: ["sc-L", "Surface length L in the flow direction (m)", "length_m", "a length in m", "m"],
  diameter_m: ["sc-D", "Pipe inside diameter D (m)", "diameter_m", "a diameter in m", "m"],
  pH: ["sc-ph", "pH", "pH", "a pH", ""],
  conductivity_S_per_m: ["sc-k", "Conductivity (S/m, optional)", "conductivity_S_per_m", "a conductivity in S/m", "S/m"],
  anode_area_cm2: ["sc-aa", "Anode wetted area (cm², optional: adds the IR term)", "anode_area_cm2", "an area in cm²", "cm²"],
};
// the words of a result's service_conditions: key -> label
const USED_LABELS = {
  temp_C: "Temperature", salinity: "Salinity", chloride_mg_per_L: "Chloride", aeration: "Oxygen", o2_mg_L: "Dissolved O₂",
  velocity_m_s: "Flow velocity", geometry: "Flow geometry", diameter_m: "Pipe diameter D", length_m: "Surface length L",
  pH: "pH", conductivity_S_per_m: "Conductivity", anode_area_cm2: "Anode wetted area",
};
const FROM_WORDS = { user: "yours", environment: "environment default", computed: "computed" };
const GEOMETRY_WORDS = { still: "still water", surface: "along an open surface", pipe: "inside a pipe" };

// The defaults record of an environment (data/service_defaults.yaml, in the page's dataset), or null.
export function serviceDefaults(ds, envId) {
  return (ds.service_defaults || []).find((r) => r.id === envId) || null;
}

// A number to 3 significant digits, trailing zeros dropped, by the one rule of ui.mjs (fmt):
// 20, 35, 0.00342, 10.3, 1.64 × 10⁻⁹.
export function sig(x) {
  if (typeof x !== "number" || !Number.isFinite(x)) return String(x);
  const a = Math.abs(x);
  if (a === 0) return "0";
  if (a < 1e-3 || a >= 1e6) return fmt(x, 3);
  const text = fmt(Number(x.toPrecision(3)), Math.max(0, 2 - Math.floor(Math.log10(a))));
  return text.includes(".") ? text.replace(/0+$/, "").replace(/\.$/, "") : text;
}
const num = sig;

// The flow in a few words: "still", "3 m/s along a 1 m surface", "2 m/s in a 0.1 m pipe".
function flowWords(geo, v, L, D) {
  if (geo === "still") return "still";
  return num(v) + " m/s " + (geo === "pipe" ? "in a pipe of D " + num(D) + " m" : "along a surface of L " + num(L) + " m");
}

// opts: {id: field id prefix, get(urlKey): the link's value, envId(): the environment chosen,
// omit: ["temp_C", "water"] (fields the page already has), anodeArea: bool, onChange()}.
// Returns {el, collect(req) -> bad, entries() -> [[urlKey, value]], fieldFor(name), refresh()}.
export function serviceForm(ds, sp, opts) {
  const id = opts.id || "cw-sc";
  const get = (k) => opts.get(k) ?? "";
  const omit = new Set(opts.omit || []);
  const fields = {};
  const numberField = (key) => {
    const [uk, label] = NUMBERS[key];
    const f = field(id + "-" + uk.slice(3), label, numberInput(get(uk)));
    f.help = h("div", { class: "cw-field-help" });
    f.msg.before(f.help);
    f.urlKey = uk;
    fields[key] = f;
    return f;
  };
  const waterKind = field(id + "-wk", "Salt content given as", select(WATER, get("sc-wk") === "cl" ? "chloride_mg_per_L" : "salinity"));
  const water = field(id + "-w", "Salinity (g/kg)", numberInput(get("sc-w")));
  water.help = h("div", { class: "cw-field-help" });
  water.msg.before(water.help);
  const o2Mode = field(id + "-o2", "Oxygen", select(AERATION, "air-saturated"));
  const geo = field(id + "-geo", "Flow", select(GEOMETRY, "still"));
  for (const k of ["temp_C", "o2_mg_L", "velocity_m_s", "length_m", "diameter_m", "pH", "conductivity_S_per_m", "anode_area_cm2"]) numberField(k);
  let touchedWater = !!get("sc-wk"), touchedO2 = !!get("sc-o2"), touchedGeo = !!get("sc-geo");
  const line = h("span", { class: "cw-sc-line" });
  const change = h("span", { class: "cw-sc-change", "aria-hidden": "true", text: "change" });
  const summary = h("summary", { class: "cw-sc-summary" }, h("span", { class: "cw-sc-title", text: "Service conditions: " }), line, " ", change);
  const none = h("p", { class: "cw-sc-none", hidden: true });
  const note = h("p", { class: "cw-sc-note", text: "Empty fields take the environment's default, shown under each; what you type is sent instead, and the result says which value came from where." });
  const row = (...els) => h("div", { class: "cw-row cw-sc-row" }, ...els.filter(Boolean).map((f) => f.el));
  const body = h("div", { class: "cw-sc-body" }, note,
    row(omit.has("temp_C") ? null : fields.temp_C, fields.pH),
    omit.has("water") ? null : row(waterKind, water),
    row(o2Mode, fields.o2_mg_L),
    row(geo, fields.velocity_m_s, fields.length_m, fields.diameter_m),
    row(fields.conductivity_S_per_m, opts.anodeArea ? fields.anode_area_cm2 : null));
  const box = h("details", { class: "cw-sc" }, summary, body);
  const el = h("section", { class: "cw-sc-section", "aria-label": "Service conditions" }, box, none);
  let envShown = null, rec = null;

  // The environment's defaults into the fields' hints and the choices' starting values.
  function refresh() {
    const env = opts.envId();
    if (env === envShown) return;
    envShown = env;
    rec = serviceDefaults(ds, env);
    box.hidden = !rec;
    none.hidden = !!rec;
    const envName = (ds.environments.find((e) => e.id === env) || {}).name || env;
    if (!rec) {
      none.textContent = "Service conditions: " + envName + " has no service model (the mixed-potential judgement is for immersed water), so none are asked for here.";
      return;
    }
    if (!touchedWater) waterKind.control.value = rec.chloride_mg_per_L !== undefined && rec.salinity_g_per_kg === undefined ? "chloride_mg_per_L" : "salinity";
    if (!touchedO2) o2Mode.control.value = rec.aeration === "deaerated" ? "deaerated" : "air-saturated";
    if (!touchedGeo) geo.control.value = rec.geometry || "still";
    const dflt = (key, words) => { fields[key].help.textContent = words; };
    const shown = { temp_C: rec.temp_C, velocity_m_s: rec.velocity_m_s, length_m: rec.length_m, diameter_m: rec.diameter_m, pH: rec.pH_value };
    for (const [key, v] of Object.entries(shown)) fields[key].control.placeholder = v === undefined || v === null ? "" : num(v);
    const hintOf = (key, v) => [(sp.bounds[NUMBERS[key][2]] || {}).text, v === undefined || v === null ? null : "empty: " + num(v) + " (environment)"].filter(Boolean).join("; ");
    dflt("temp_C", hintOf("temp_C", rec.temp_C));
    dflt("velocity_m_s", hintOf("velocity_m_s", rec.velocity_m_s));
    dflt("length_m", hintOf("length_m", rec.length_m));
    dflt("diameter_m", hintOf("diameter_m", rec.diameter_m));
    dflt("pH", hintOf("pH", rec.pH_value));
    dflt("conductivity_S_per_m", rec.conductivity_S_per_m !== undefined ? "empty: " + num(rec.conductivity_S_per_m) + " S/m at 25 °C, corrected to the temperature (environment)"
      : "empty: computed from the salinity and temperature (PSS-78)");
    dflt("o2_mg_L", "what a meter reads; calc refuses far above saturation");
    dflt("anode_area_cm2", (sp.bounds.anode_area_cm2 || {}).text || "");
  }

  function showParts() {
    const chloride = waterKind.control.value === "chloride_mg_per_L";
    water.el.querySelector("label").textContent = chloride ? "Chloride (mg/L)" : "Salinity (g/kg)";
    const d = rec ? (chloride ? rec.chloride_mg_per_L : rec.salinity_g_per_kg) : undefined;
    water.control.placeholder = d === undefined ? "" : num(d);
    water.help.textContent = [(sp.bounds[chloride ? "chloride_mg_per_L" : "salinity"] || {}).text,
      d === undefined ? (rec ? "empty: the environment's " + (chloride ? "salinity" : "chloride") + " is used" : null) : "empty: " + num(d) + " (environment)"].filter(Boolean).join("; ");
    fields.o2_mg_L.el.hidden = o2Mode.control.value !== "measured";
    const g = geo.control.value;
    fields.velocity_m_s.el.hidden = g === "still";
    fields.length_m.el.hidden = g !== "surface";
    fields.diameter_m.el.hidden = g !== "pipe";
  }

  // Read one number field into req when it holds text; a hidden or empty one is not sent.
  function readOne(f, req, key, bound, noun) {
    if (f.el.hidden || f.control.value.trim() === "") { f.setError(""); return false; }
    return readInto(f, req, key, bound ? allowed(sp, bound, noun) : noun);
  }

  // The values of the section into req; true when a field does not hold a number.
  function collect(req) {
    refresh();
    showParts();
    if (!rec) { for (const f of [...Object.values(fields), water]) f.setError(""); paintLine(req); return false; }
    let bad = false;
    if (!omit.has("temp_C")) bad = readOne(fields.temp_C, req, "temp_C", "temp_C", "a temperature") || bad;
    if (!omit.has("water")) {
      const key = waterKind.control.value;
      bad = readOne(water, req, key, key, key === "salinity" ? "a salinity in g/kg" : "a chloride content in mg/L") || bad;
    }
    const mode = o2Mode.control.value;
    if (mode === "measured") bad = readOne(fields.o2_mg_L, req, "o2_mg_L", null, NUMBERS.o2_mg_L[3]) || bad;
    else if (mode !== (rec.aeration || "air-saturated")) req.aeration = mode;
    if (geo.control.value !== (rec.geometry || "still")) req.geometry = geo.control.value;
    for (const key of ["velocity_m_s", "length_m", "diameter_m", "pH", "conductivity_S_per_m"].concat(opts.anodeArea ? ["anode_area_cm2"] : [])) {
      bad = readOne(fields[key], req, key, NUMBERS[key][2], NUMBERS[key][3]) || bad;
    }
    paintLine(req);
    return bad;
  }

  // The one line of the collapsed section: the values that will be used, the user's in bold.
  function paintLine(req) {
    if (!rec) { fill(line); return; }
    const part = (text, mine) => (mine ? h("strong", { class: "cw-sc-mine", text }) : text);
    const parts = [];
    const pick = (key, d) => (req[key] !== undefined ? [req[key], true] : [d, false]);
    const [t, tMine] = pick("temp_C", rec.temp_C);
    if (!omit.has("temp_C")) parts.push(part(num(t) + " °C", tMine));
    if (!omit.has("water")) {
      if (req.salinity !== undefined) parts.push(part(num(req.salinity) + " g/kg", true));
      else if (req.chloride_mg_per_L !== undefined) parts.push(part(num(req.chloride_mg_per_L) + " mg/L chloride", true));
      else parts.push(rec.salinity_g_per_kg !== undefined ? num(rec.salinity_g_per_kg) + " g/kg" : num(rec.chloride_mg_per_L) + " mg/L chloride");
    }
    if (req.o2_mg_L !== undefined) parts.push(part(num(req.o2_mg_L) + " mg/L O₂", true));
    else parts.push(part(req.aeration || rec.aeration || "air-saturated", !!req.aeration));
    const g = req.geometry || rec.geometry || "still";
    const [v, vMine] = pick("velocity_m_s", rec.velocity_m_s);
    const [L, lMine] = pick("length_m", rec.length_m);
    const [D, dMine] = pick("diameter_m", rec.diameter_m);
    parts.push(part(flowWords(g, v ?? 0, L ?? "?", D ?? "?"), !!req.geometry || (g !== "still" && (vMine || lMine || dMine))));
    const [ph, phMine] = pick("pH", rec.pH_value);
    if (ph !== undefined) parts.push(part("pH " + num(ph), phMine));
    if (req.conductivity_S_per_m !== undefined) parts.push(part(num(req.conductivity_S_per_m) + " S/m", true));
    if (req.anode_area_cm2 !== undefined) parts.push(part("anode " + num(req.anode_area_cm2) + " cm² (IR term)", true));
    const envName = (ds.environments.find((e) => e.id === envShown) || {}).name || envShown;
    const joined = [];
    parts.forEach((p, k) => { if (k) joined.push(", "); joined.push(p); });
    fill(line, envName + ": ", ...joined, omit.size ? "; temperature and salinity as above" : null);
    change.textContent = box.open ? "hide" : "change";
  }

  // The section's URL state: only what differs from the environment's defaults or was typed.
  function entries() {
    const out = [];
    for (const f of Object.values(fields)) out.push([f.urlKey, f.el.hidden ? "" : f.control.value.trim()]);
    out.push(["sc-w", water.control.value.trim()], ["sc-wk", touchedWater ? (waterKind.control.value === "salinity" ? "s" : "cl") : ""],
      ["sc-o2", touchedO2 ? o2Mode.control.value : ""], ["sc-geo", touchedGeo ? geo.control.value : ""]);
    return out;
  }

  // calc's field names -> the section's fields (opening the section so the message is seen).
  const byName = { temp_C: fields.temp_C, salinity: water, chloride_mg_per_L: water, o2_mg_L: fields.o2_mg_L, aeration: o2Mode,
    velocity_m_s: fields.velocity_m_s, geometry: geo, diameter_m: fields.diameter_m, length_m: fields.length_m, pH: fields.pH,
    conductivity_S_per_m: fields.conductivity_S_per_m, anode_area_cm2: fields.anode_area_cm2 };
  function fieldFor(name) {
    const f = byName[name];
    if (!f || box.hidden) return null;
    if (f.el.hidden && name === "o2_mg_L") return o2Mode;
    if (f.el.hidden) return geo;
    box.open = true;
    return f;
  }

  waterKind.control.addEventListener("change", () => { touchedWater = true; });
  o2Mode.control.addEventListener("change", () => { touchedO2 = true; });
  geo.control.addEventListener("change", () => { touchedGeo = true; });
  if (get("sc-o2")) o2Mode.control.value = get("sc-o2");
  if (get("sc-geo")) geo.control.value = get("sc-geo");
  box.addEventListener("toggle", () => { change.textContent = box.open ? "hide" : "change"; });
  if (opts.onChange) { body.addEventListener("input", opts.onChange); body.addEventListener("change", opts.onChange); }
  for (const f of Object.values(fields)) if (f.control.value.trim()) box.open = true;
  refresh();
  return { el, collect, entries, fieldFor, refresh };
}

// The conditions a result was worked out at, value by value: what, the value, where it came from.
export function serviceUsed(sc, oxygen, { title = "Service conditions used" } = {}) {
  if (!sc) return null;
  const rows = [];
  for (const [key, label] of Object.entries(USED_LABELS)) {
    const c = sc[key];
    if (!c) continue;
    const value = typeof c.value === "number" ? num(c.value) + (c.unit ? " " + c.unit : "") : key === "geometry" ? GEOMETRY_WORDS[c.value] || c.value : String(c.value);
    rows.push(h("tr", { "data-cw-from": c.from, "data-cw-key": key }, h("th", { scope: "row", text: label }), h("td", { text: value }),
      h("td", { class: "cw-sc-from cw-sc-from-" + c.from }, FROM_WORDS[c.from] || c.from, c.source ? [" ", sourceLink(c.source)] : null)));
  }
  if (oxygen && typeof oxygen.i_L_uA_per_cm2 === "number") {
    rows.push(h("tr", { "data-cw-from": "computed", "data-cw-key": "i_L" }, h("th", { scope: "row", text: "O₂ limiting current i_L" }),
      h("td", { "data-cw-value": "i_L_uA_per_cm2", text: num(oxygen.i_L_uA_per_cm2) + " µA/cm²" }),
      h("td", { class: "cw-sc-from cw-sc-from-computed", text: "computed (" + (oxygen.correlation || "") + ")" })));
  }
  return h("details", { class: "cw-sc-used" }, h("summary", { text: title + " (" + (sc.electrolyte || "") + ")" }),
    h("div", { class: "cw-sc-scroll" }, h("table", { class: "cw-sc-table" },
      h("thead", {}, h("tr", {}, ["Quantity", "Value", "From"].map((t) => h("th", { scope: "col", text: t })))), h("tbody", {}, rows))));
}
