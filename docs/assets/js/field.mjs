// Site readings: two calculators over calc.field.
//   measured: a joint judged from the two parts' potentials measured on site (entry "measured");
//   cp:       one cathodic-protection reading against the published criteria (entry "cp"), with
//             the way the IR drop of an on reading was considered.
// They share a page, so their field ids and URL parameters carry a prefix of their own, and each
// writes only its own parameters. The CP pieces shared with the survey log are in cpview.mjs.
import {
  AGAGCL_SW, KIND_OPTIONS, NOT_CONSIDERED, cpResultNodes, electrodeOptions, fillSelect, irOptions, irSubtracts,
  onCriterion, settingOptions, structureOptions,
} from "./cpview.mjs";
import { bindForm, runner } from "./runner.mjs";
import { serviceForm } from "./serviceform.mjs";
import { atService } from "./jointmix.mjs";
import {
  allowed, assumptionsBox, begin, cautionsBox, derivation, environmentOptions, field, fieldMap, fill, fmt, h, hint,
  known, materialOptions, numberInput, readInto, select, signed, sourceLink, sourcesLine, verdictBadge, warningsList,
} from "./ui.mjs";

// A margin of the measured difference worded as what it is (margin = allowable − ΔE [V]).
function allowanceMargin(m) {
  if (Math.abs(m) < 0.0005) return "on the allowable difference";
  return fmt(Math.abs(m), 3) + " V " + (m > 0 ? "inside the allowable difference" : "beyond the allowable difference");
}

// URL state of one calculator on a shared page: only the keys with its prefix are written.
function ownParams(prefix) {
  const all = new URLSearchParams(location.search);
  return {
    get: (k) => all.get(prefix + k),
    write(entries) {
      const url = new URL(location.href);
      const p = new URLSearchParams(url.search);
      for (const k of [...p.keys()]) if (k.startsWith(prefix)) p.delete(k);
      for (const [k, v] of entries) if (v !== undefined && v !== null && v !== "") p.set(prefix + k, v);
      url.search = p.toString();
      history.replaceState(history.state, "", url.href);
    },
  };
}

// ---------------------------------------------------------------------------------------
// Measured joint.

// Demo scenario of our own: before a stainless access ladder is bolted to a steel sheet pile in
// a quiet dock, both are read on their own against a silver/silver-chloride seawater cell.
const MEASURED_START = { a: "sheet pile", av: "-0.680", b: "ladder", bv: "-0.120", el: AGAGCL_SW, t: "14", env: "seawater-quiescent", s: "", am: "carbon-steel", bm: "stainless-316-passive" };

export async function measured(root) {
  const { ui, ds, sp } = await begin(root, "Measured joint", "measured");
  const url = ownParams("m.");
  const get = (k) => url.get(k) ?? MEASURED_START[k];
  const elIds = new Set(ds.reference_electrodes.map((r) => r.id));
  const envIds = new Set(ds.environments.map((e) => e.id));
  const matIds = new Set(ds.materials.map((m) => m.id));
  const matOpts = [{ value: "", label: "— not given —" }, ...materialOptions(ds)];
  const aName = field("cw-m-a", "First part", h("input", { type: "text", autocomplete: "off", value: get("a"), maxlength: "100" }), "a label, e.g. sheet pile");
  const aRead = field("cw-m-av", "First part: reading (V)", numberInput(get("av")), "as read on the meter, against the electrode below");
  const bName = field("cw-m-b", "Second part", h("input", { type: "text", autocomplete: "off", value: get("b"), maxlength: "100" }), "a label, e.g. ladder");
  const bRead = field("cw-m-bv", "Second part: reading (V)", numberInput(get("bv")), "against the same electrode");
  const elField = field("cw-m-el", "Reference electrode", select(electrodeOptions(ds), known(elIds, get("el"), MEASURED_START.el)));
  const tField = field("cw-m-t", "Electrode temperature (°C)", numberInput(get("t")), hint(sp, "temp_C"));
  const envField = field("cw-m-env", "Environment", select(environmentOptions(ds), known(envIds, get("env"), MEASURED_START.env)));
  const sField = field("cw-m-s", "Salinity (g/kg)", numberInput(get("s")), "for the Ag/AgCl seawater electrode in brackish water; empty for full-strength seawater (35)");
  const amField = field("cw-m-am", "First part: material (optional)", select(matOpts, matIds.has(get("am")) ? get("am") : (url.get("am") === "-" ? "" : MEASURED_START.am)));
  const bmField = field("cw-m-bm", "Second part: material (optional)", select(matOpts, matIds.has(get("bm")) ? get("bm") : (url.get("bm") === "-" ? "" : MEASURED_START.bm)));
  ui.formBox.append(
    h("div", { class: "cw-row" }, aName.el, aRead.el, amField.el),
    h("div", { class: "cw-row" }, bName.el, bRead.el, bmField.el),
    h("div", { class: "cw-row" }, elField.el, tField.el, sField.el),
    h("div", { class: "cw-row" }, envField.el));
  const svc = serviceForm(ds, sp, { id: "cw-m-sc", get: (k) => url.get(k), envId: () => envField.control.value, omit: ["temp_C", "water"] });
  ui.formBox.append(svc.el);

  function collect() {
    let bad = false;
    const req = { electrode: elField.control.value, env: envField.control.value };
    for (const [f, key, what] of [[aName, "a_name", "a label for the first part"], [bName, "b_name", "a label for the second part"]]) {
      const v = f.control.value.trim();
      if (!v) { f.setError("Enter " + what + "."); bad = true; } else { f.setError(""); req[key] = v; }
    }
    for (const [f, key] of [[aRead, "a_reading_V"], [bRead, "b_reading_V"]]) {
      bad = readInto(f, req, key, allowed(sp, "reading_V", "a reading in volts")) || bad;
    }
    bad = readInto(tField, req, "temp_C", allowed(sp, "temp_C", "a temperature")) || bad;
    sField.el.hidden = req.electrode !== AGAGCL_SW;
    if (!sField.el.hidden && sField.control.value.trim() !== "") {
      bad = readInto(sField, req, "salinity", allowed(sp, "salinity", "a salinity")) || bad;
    } else sField.setError("");
    if (amField.control.value) req.a_material = amField.control.value;
    if (bmField.control.value) req.b_material = bmField.control.value;
    bad = svc.collect(req) || bad;
    url.write([...svc.entries(), ["a", aName.control.value.trim()], ["av", aRead.control.value.trim()], ["b", bName.control.value.trim()],
      ["bv", bRead.control.value.trim()], ["el", req.electrode], ["t", tField.control.value.trim()], ["env", req.env],
      ["s", sField.el.hidden ? "" : sField.control.value.trim()], ["am", amField.control.value || "-"], ["bm", bmField.control.value || "-"]]);
    return { req, bad };
  }
  const fieldFor = fieldMap({ a_name: aName, a_reading_V: aRead, b_name: bName, b_reading_V: bRead, electrode: elField,
    temp_C: tField, env: envField, salinity: sField, a_material: amField, b_material: bmField }, svc.fieldFor);
  function render(r) {
    const pub = r.published;
    const rows = [
      ["Anode (attacked)", r.anode || "neither (equal readings)"],
      ["Cathode", r.cathode || "—"],
      [r.a_name + ", as read", signed(r.a_reading_V, 3) + " V vs " + r.electrode],
      [r.b_name + ", as read", signed(r.b_reading_V, 3) + " V vs " + r.electrode],
      [r.a_name + " on the SCE scale", signed(r.a_V_SCE, 3) + " V vs SCE"],
      [r.b_name + " on the SCE scale", signed(r.b_V_SCE, 3) + " V vs SCE"],
    ];
    const table = h("table", { class: "cw-compare" }, h("tbody", {},
      rows.map(([k, v]) => h("tr", {}, h("th", { text: k }), h("td", { text: v }))),
      h("tr", {}, h("th", { text: "Measured difference ΔE" }), h("td", { "data-cw-value": "delta_E_V", text: fmt(r.delta_E_V, 3) + " V" })),
      h("tr", {}, h("th", { text: "Allowable ΔE in " + r.env_name }), h("td", {}, fmt(r.allowable_V, 2) + " V ", r.allowable_source ? sourceLink(r.allowable_source) : null)),
      h("tr", {}, h("th", { text: "Margin" }), h("td", { "data-cw-value": "margin_V", text: allowanceMargin(r.margin_V) }))));
    const pubBox = pub ? h("section", { class: "cw-published", "aria-label": "Published-series judgement" },
      h("h3", { text: "Beside it: the published galvanic series" }),
      h("p", {}, verdictBadge(pub.verdict), " ", pub.verdict_text),
      h("p", { class: r.agreement ? "cw-agree" : "cw-disagree", role: r.agreement ? null : "note", text: r.agreement_text }), atService(pub, ds)) : null;
    const states = (r.state_check || []).map((s) => h("li", { text: s.material + ": if it turns active (published drop " + fmt(s.drop_V, 3) + " V), ΔE would be " + fmt(s.delta_E_if_active_V, 3) + " V" + (s.fails ? ", beyond the allowable" : ", still within the allowable") }));
    fill(ui.result,
      h("p", { class: "cw-big" }, verdictBadge(r.verdict)),
      h("p", { class: "cw-direction", text: r.verdict_text }),
      h("p", { class: "cw-meaning", text: "“" + r.verdict + "”: " + r.verdict_meaning }),
      table, warningsList(r.warnings), pubBox,
      states.length ? h("details", { class: "cw-states", open: true }, h("summary", { text: "Passive and active states" }), h("ul", {}, states)) : null,
      assumptionsBox(r.assumptions), derivation(r.steps), cautionsBox(r.cautions), sourcesLine(r.sources, r.data_version));
  }
  bindForm(ui, runner(ui, "measured", render, fieldFor), collect);
}

// ---------------------------------------------------------------------------------------
// CP reading.

// Demo scenario of our own: an instant-off reading at a test post on a buried steel water main.
const CP_START = { st: "carbon-steel", set: "soil-aerobic", v: "-0.870", el: "CSE", k: "instant-off", t: "12", tst: "", p: "", s: "", ir: NOT_CONSIDERED, irv: "" };

export async function cp(root) {
  const { ui, ds, sp } = await begin(root, "CP reading", "cp");
  const url = ownParams("c.");
  const get = (k) => url.get(k) ?? CP_START[k];
  const elIds = new Set(ds.reference_electrodes.map((r) => r.id));
  const stOpts = structureOptions(ds);
  const irOpts = irOptions(ds);
  const stField = field("cw-c-st", "Structure", select(stOpts, known(new Set(stOpts.map((o) => o.value)), get("st"), CP_START.st)));
  const setField = field("cw-c-set", "Setting", select([], ""));
  fillSelect(setField.control, settingOptions(ds, stField.control.value), get("set"));
  const vField = field("cw-c-v", "Reading (V)", numberInput(get("v")), "structure-to-electrolyte potential as read, e.g. −0.870");
  const elField = field("cw-c-el", "Reference electrode", select(electrodeOptions(ds), known(elIds, get("el"), CP_START.el)));
  const kField = field("cw-c-k", "Reading taken", select(KIND_OPTIONS, known(new Set(KIND_OPTIONS.map((o) => o.value)), get("k"), CP_START.k)));
  const irField = field("cw-c-ir", "IR drop of the on reading", select(irOpts, known(new Set(irOpts.map((o) => o.value)), get("ir"), CP_START.ir)),
    "how it was considered: the −0.85 V criterion with the current applied counts only then");
  const irvField = field("cw-c-irv", "IR drop subtracted (mV)", numberInput(get("irv")), hint(sp, "ir_drop_mV", "its size, measured or calculated"));
  const tField = field("cw-c-t", "Electrode temperature (°C)", numberInput(get("t")), hint(sp, "temp_C"));
  const tsField = field("cw-c-tst", "Structure temperature (°C, optional)", numberInput(get("tst")), "empty: the electrode's; matters above 40 °C");
  const pField = field("cw-c-p", "Polarisation shift (mV, optional)", numberInput(get("p")), "instant-off minus depolarised potential, for the 100 mV criterion");
  const sField = field("cw-c-s", "Salinity (g/kg)", numberInput(get("s")), "Ag/AgCl seawater electrode in brackish water; empty for seawater (35)");
  ui.formBox.append(h("div", { class: "cw-row" }, stField.el, setField.el),
    h("div", { class: "cw-row" }, vField.el, elField.el, kField.el),
    h("div", { class: "cw-row" }, irField.el, irvField.el),
    h("div", { class: "cw-row" }, tField.el, tsField.el, pField.el, sField.el));
  // the IR-drop choice shows for an on reading where a criterion admits on readings
  function showIr() {
    irField.el.hidden = kField.control.value !== "on" || !onCriterion(ds, stField.control.value, setField.control.value);
    irvField.el.hidden = irField.el.hidden || !irSubtracts(ds, irField.control.value);
  }
  function collect() {
    let bad = false;
    showIr();
    const req = { structure: stField.control.value, setting: setField.control.value, electrode: elField.control.value, reading_kind: kField.control.value };
    bad = readInto(vField, req, "reading_V", allowed(sp, "reading_V", "a reading in volts")) || bad;
    bad = readInto(tField, req, "temp_C", allowed(sp, "temp_C", "a temperature")) || bad;
    for (const [f, key, noun] of [[tsField, "structure_temp_C", "a temperature"], [pField, "polarisation_mV", "a shift in mV"]]) {
      if (f.control.value.trim() === "") { f.setError(""); continue; }
      bad = readInto(f, req, key, allowed(sp, key, noun)) || bad;
    }
    if (!irField.el.hidden && irField.control.value !== NOT_CONSIDERED) req.ir_drop_method = irField.control.value;
    if (!irvField.el.hidden) bad = readInto(irvField, req, "ir_drop_mV", allowed(sp, "ir_drop_mV", "an IR drop in mV")) || bad;
    else irvField.setError("");
    sField.el.hidden = req.electrode !== AGAGCL_SW;
    if (!sField.el.hidden && sField.control.value.trim() !== "") {
      bad = readInto(sField, req, "salinity", allowed(sp, "salinity", "a salinity")) || bad;
    } else sField.setError("");
    url.write([["st", req.structure], ["set", req.setting], ["v", vField.control.value.trim()], ["el", req.electrode], ["k", req.reading_kind],
      ["t", tField.control.value.trim()], ["tst", tsField.control.value.trim()], ["p", pField.control.value.trim()], ["s", sField.el.hidden ? "" : sField.control.value.trim()],
      ["ir", irField.el.hidden || irField.control.value === NOT_CONSIDERED ? "" : irField.control.value], ["irv", irvField.el.hidden ? "" : irvField.control.value.trim()]]);
    return { req, bad };
  }
  const fieldFor = fieldMap({ structure: stField, setting: setField, reading_V: vField, electrode: elField, reading_kind: kField,
    temp_C: tField, structure_temp_C: tsField, polarisation_mV: pField, salinity: sField, chloride_mg_per_L: sField,
    ir_drop_method: irField, ir_drop_mV: irvField });
  function render(r) {
    fill(ui.result, ...cpResultNodes(r), assumptionsBox(r.assumptions), derivation(r.steps), cautionsBox(r.cautions), sourcesLine(r.sources, r.data_version));
  }
  stField.control.addEventListener("change", () => fillSelect(setField.control, settingOptions(ds, stField.control.value), setField.control.value));
  showIr();
  bindForm(ui, runner(ui, "cp", render, fieldFor), collect);
}
