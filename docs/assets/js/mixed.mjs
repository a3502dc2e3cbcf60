// Mixed potential: electrodes and their reactions' kinetics in an editable table (measured or
// published polarization data), the mixed potential, the galvanic current, each electrode's net
// current and its reactions' current densities, the derivation and the Evans diagram (carried by
// the same result: result.evans, drawn by evanschart.mjs).
import { currentText, evansChart, potentialText } from "./evanschart.mjs";
import { runner } from "./runner.mjs";
import {
  assumptionsBox, begin, derivation, field, fieldText, fill, fmt, h, known, numberInput, readInto, select, sourcesLine,
  warningsList, writeUrl,
} from "./ui.mjs";

// The columns of a reaction row: request key, heading, unit, what the field holds (its label).
const COLUMNS = [
  { key: "name", head: "Reaction", unit: "", what: "reaction name", text: true },
  { key: "E_eq_V", head: "E_eq", unit: "V", what: "equilibrium potential E_eq (V)" },
  { key: "i0_A_per_cm2", head: "i0", unit: "A/cm²", what: "exchange current density i0 (A/cm²)" },
  { key: "b_anodic_V", head: "b anodic", unit: "V/decade", what: "anodic Tafel slope (V/decade)", optional: true },
  { key: "b_cathodic_V", head: "b cathodic", unit: "V/decade", what: "cathodic Tafel slope (V/decade)", optional: true },
  { key: "i_lim_A_per_cm2", head: "i_lim", unit: "A/cm², optional", what: "limiting current density of the cathodic branch (A/cm²)", optional: true },
];
const ALLOWED = {
  E_eq_V: "a potential in V", i0_A_per_cm2: "a current density in A/cm², e.g. 1e-7", b_anodic_V: "a slope in V/decade, e.g. 0.06, or empty",
  b_cathodic_V: "a slope in V/decade, e.g. 0.12, or empty", i_lim_A_per_cm2: "a current density in A/cm², or empty",
};
const URL_MAX_ITEMS = 20;

// A request's electrodes as the texts of their fields: [[name, area, [[name, E, i0, ba, bc, il]...]]...]
function textsOf(electrodes) {
  return electrodes.map((e) => [String(e.name ?? ""), fieldText(e.area_cm2),
    (e.reactions || []).map((r) => COLUMNS.map((c) => (c.text ? String(r[c.key] ?? "") : fieldText(r[c.key]))))]);
}

// The electrodes of a shared link, or an error in words.
function fromLink(text) {
  let v;
  try { v = JSON.parse(text); } catch { return { error: "it is not readable JSON" }; }
  const strings = (a, n) => Array.isArray(a) && a.length === n && a.every((x) => typeof x === "string");
  if (!Array.isArray(v) || !v.length || v.length > URL_MAX_ITEMS) return { error: "it does not list 1 to " + URL_MAX_ITEMS + " electrodes" };
  for (const e of v) {
    if (!Array.isArray(e) || e.length !== 3 || typeof e[0] !== "string" || typeof e[1] !== "string" || !Array.isArray(e[2])
      || !e[2].length || e[2].length > URL_MAX_ITEMS || !e[2].every((r) => strings(r, COLUMNS.length))) {
      return { error: "an electrode is not [name, area, reactions]" };
    }
  }
  return { texts: v };
}

// A current or current density with its SI prefix and sign: "−20.0 µA/cm²".
function si(x, unit) {
  if (typeof x !== "number" || !Number.isFinite(x)) return String(x);
  if (x === 0) return "0 " + unit;
  const t = currentText(Math.log10(Math.abs(x)));
  const [num, pre] = t.split(" ");
  return (x < 0 ? "\u2212" : "") + num + " " + pre.replace("A", unit);
}

let uid = 0;

export async function mixed(root) {
  const { ui, ds, start, params } = await begin(root, "Mixed potential", "mixed");
  const scales = ds.reference_electrodes.map((r) => ({ value: r.id, label: r.id }));
  const scaleIds = new Set(scales.map((o) => o.value));
  const scaleField = field("cw-mx-scale", "Potential scale of every E_eq (and of the results)",
    select(scales, known(scaleIds, params.get("scale"), "SHE")),
    "no conversion is made: give every E_eq on this one scale; the mixed potential comes out on it");
  scaleField.el.classList.add("cw-mx-scale");
  const list = h("div", { class: "cw-mx-electrodes" });
  const addElectrodeBtn = h("button", { type: "button", class: "cw-mx-btn", text: "+ Add an electrode" });
  ui.formBox.append(scaleField.el, list, h("div", { class: "cw-mx-actions" }, addElectrodeBtn),
    h("p", { class: "cw-mx-note", text: "Tafel slopes are positive. Give at least one per reaction: with one the reaction runs only in that " +
      "direction, with both it follows Butler–Volmer. i_lim limits the cathodic branch (1/i = 1/i_act + 1/i_L). Areas are wetted areas." }));
  const electrodes = []; // {id, el, name, area, body, reactions: [{id, row, fields}], addBtn, removeBtn}

  function electrodeLabel(e) { return e.name.control.value.trim() || "electrode " + (electrodes.indexOf(e) + 1); }

  function refreshButtons() {
    electrodes.forEach((e, i) => {
      e.legend.textContent = "Electrode " + (i + 1);
      e.removeBtn.disabled = electrodes.length < 2;
      e.removeBtn.setAttribute("aria-label", "Remove electrode " + (i + 1) + " (" + electrodeLabel(e) + ")");
      e.reactions.forEach((r, k) => {
        r.removeBtn.disabled = e.reactions.length < 2;
        r.removeBtn.setAttribute("aria-label", "Remove reaction " + (k + 1) + " of " + electrodeLabel(e));
      });
    });
  }

  function addReaction(e, texts) {
    const id = "cw-mx-r" + ++uid;
    const r = { id, fields: {} };
    const cells = COLUMNS.map((c, j) => {
      const control = c.text ? h("input", { type: "text", autocomplete: "off", value: texts[j] || "" }) : numberInput(texts[j] || "");
      const f = field(id + "-" + c.key, "", control);
      f.el.classList.add("cw-mx-cell");
      if (c.text) f.el.classList.add("cw-mx-name");
      r.fields[c.key] = f;
      return h("td", {}, f.el);
    });
    r.removeBtn = h("button", { type: "button", class: "cw-mx-btn cw-mx-x", "aria-label": "Remove this reaction", text: "Remove" });
    r.removeBtn.addEventListener("click", () => {
      if (e.reactions.length < 2) return;
      e.reactions.splice(e.reactions.indexOf(r), 1);
      r.row.remove();
      relabel(); changed();
    });
    r.row = h("tr", {}, cells, h("td", {}, r.removeBtn));
    e.body.append(r.row);
    e.reactions.push(r);
    return r;
  }

  // Labels name the electrode and the reaction, so a message or an "out of date" note says where.
  function relabel() {
    electrodes.forEach((e, i) => {
      const en = electrodeLabel(e);
      e.name.el.querySelector("label").textContent = "Electrode " + (i + 1) + " name";
      e.area.el.querySelector("label").textContent = "Wetted area of " + en + " (cm²)";
      e.reactions.forEach((r, k) => {
        const rn = r.fields.name.control.value.trim();
        for (const c of COLUMNS) {
          r.fields[c.key].el.querySelector("label").textContent = en + ", reaction " + (k + 1) + (rn && !c.text ? " (" + rn + ")" : "") + ": " + c.what;
        }
      });
    });
    refreshButtons();
  }

  function addElectrode(texts) {
    const id = "cw-mx-e" + ++uid;
    const e = { id, reactions: [] };
    e.name = field(id + "-name", "", h("input", { type: "text", autocomplete: "off", value: texts[0] || "" }));
    e.area = field(id + "-area", "", numberInput(texts[1] || ""), "above 0; the wetted area");
    e.legend = h("legend", {});
    e.removeBtn = h("button", { type: "button", class: "cw-mx-btn", text: "Remove this electrode" });
    e.removeBtn.addEventListener("click", () => {
      if (electrodes.length < 2) return;
      electrodes.splice(electrodes.indexOf(e), 1);
      e.el.remove();
      relabel(); changed();
    });
    e.body = h("tbody", {});
    const head = h("tr", {}, COLUMNS.map((c) => h("th", { scope: "col" }, c.head, c.unit ? h("span", { class: "cw-mx-unit" + (c.key === "E_eq_V" ? " cw-mx-eunit" : ""),
      text: c.key === "E_eq_V" ? "V vs " + scaleField.control.value : c.unit }) : null)),
      h("th", { scope: "col" }, h("span", { class: "cw-mx-unit", text: "remove" })));
    e.addBtn = h("button", { type: "button", class: "cw-mx-btn", text: "+ Add a reaction" });
    e.addBtn.addEventListener("click", () => {
      const r = addReaction(e, []);
      relabel(); changed();
      r.fields.name.control.focus();
    });
    e.el = h("fieldset", { class: "cw-mx-electrode" }, e.legend,
      h("div", { class: "cw-mx-head" }, e.name.el, e.area.el),
      h("table", { class: "cw-mx-table" }, h("thead", {}, head), e.body),
      h("div", { class: "cw-mx-actions" }, e.addBtn, e.removeBtn));
    for (const rt of texts[2] && texts[2].length ? texts[2] : [[]]) addReaction(e, rt);
    list.append(e.el);
    electrodes.push(e);
    return e;
  }

  addElectrodeBtn.addEventListener("click", () => {
    const e = addElectrode(["Electrode " + (electrodes.length + 1), "", [[]]]);
    relabel(); changed();
    e.area.control.focus();
  });

  // The electrodes the page opens with: a shared link's, else the demonstration's (calc.spec).
  let texts = textsOf(start.electrodes || []);
  if (params.has("e")) {
    const got = fromLink(params.get("e"));
    if (got.texts) texts = got.texts;
    else ui.formMsg.textContent = "The link's electrodes could not be read (" + got.error + "): the demonstration electrodes are shown instead.";
  }
  for (const t of texts) addElectrode(t);
  relabel();

  function collect() {
    let bad = false;
    const req = { electrodes: [] };
    for (const e of electrodes) {
      const item = { name: e.name.control.value.trim(), reactions: [] };
      bad = readInto(e.area, item, "area_cm2", "a wetted area in cm²") || bad;
      for (const r of e.reactions) {
        const rq = { name: r.fields.name.control.value.trim() };
        for (const c of COLUMNS) {
          if (c.text) continue;
          const f = r.fields[c.key];
          if (c.optional && f.control.value.trim() === "") { f.setError(""); continue; }
          bad = readInto(f, rq, c.key, ALLOWED[c.key]) || bad;
        }
        item.reactions.push(rq);
      }
      req.electrodes.push(item);
    }
    const p = new URLSearchParams();
    p.set("scale", scaleField.control.value);
    p.set("e", JSON.stringify(electrodes.map((e) => [e.name.control.value, e.area.control.value.trim(),
      e.reactions.map((r) => COLUMNS.map((c) => (c.text ? r.fields[c.key].control.value : r.fields[c.key].control.value.trim())))])));
    writeUrl(p);
    return { req, bad };
  }

  // calc names a field by its path: electrodes[i].area_cm2, electrodes[i].reactions[k].E_eq_V
  function fieldFor(name) {
    const m = /^electrodes\[(\d+)\]\.(name|area_cm2|reactions)(?:\[(\d+)\]\.(\w+))?/.exec(name || "");
    const e = m && electrodes[Number(m[1])];
    if (!e) return null;
    if (m[2] === "name") return e.name;
    if (m[2] === "area_cm2") return e.area;
    const r = m[3] !== undefined ? e.reactions[Number(m[3])] : null;
    return r && r.fields[m[4]] ? r.fields[m[4]] : null;
  }

  let last = null;
  function render(r) {
    last = r;
    const scale = scaleField.control.value;
    const on = " vs " + scale;
    const anodes = r.electrodes.filter((e) => e.net_current_A > 0 && r.galvanic_current_A > 0).map((e) => e.name);
    const cathodes = r.electrodes.filter((e) => e.net_current_A < 0 && r.galvanic_current_A > 0).map((e) => e.name);
    const scroll = (table) => h("div", { class: "cw-mx-scroll" }, table);
    const parts = h("table", { class: "cw-mx-out" },
      h("thead", {}, h("tr", {}, ["Electrode", "Area", "Role", "Net current", "Net current density", "Anodic attack",
        "On its own (free corrosion)", "Coupled ÷ alone"].map((t) => h("th", { scope: "col", text: t })))),
      h("tbody", {}, r.electrodes.map((e) => h("tr", {},
        h("th", { scope: "row", text: e.name }), h("td", { text: fmt(e.area_cm2, 4).replace(/\.?0+$/, "") + " cm²" }),
        h("td", { text: e.role }), h("td", { "data-cw-value": "net_current_A", text: si(e.net_current_A, "A") }),
        h("td", { text: si(e.net_current_density_A_per_cm2, "A/cm²") }),
        h("td", { text: si(e.dissolution_current_density_A_per_cm2, "A/cm²") }),
        h("td", { text: e.free_corrosion ? potentialText(e.free_corrosion.E_V) + ", " + si(e.free_corrosion.current_density_A_per_cm2, "A/cm²")
          : e.free_corrosion_note || "—" }),
        h("td", { text: e.dissolution_vs_free === null || e.dissolution_vs_free === undefined ? "—"
          : e.dissolution_vs_free === 0 ? "0 (no attack coupled)" : "× " + fmt(e.dissolution_vs_free, 3) }),
      ))));
    const reactions = h("details", { class: "cw-mx-reactions-out" }, h("summary", { text: "Each reaction at the mixed potential" }),
      scroll(h("table", { class: "cw-mx-out" },
        h("thead", {}, h("tr", {}, ["Electrode", "Reaction", "Model", "η = E − E_eq", "Current density", "Current", "Share of i_lim"]
          .map((t) => h("th", { scope: "col", text: t })))),
        h("tbody", {}, r.electrodes.flatMap((e) => e.reactions.map((x) => h("tr", {},
          h("td", { text: e.name }), h("td", { text: x.name }), h("td", { text: x.model }),
          h("td", { text: potentialText(x.overpotential_V) }),
          h("td", { "data-cw-value": "current_density_A_per_cm2", text: si(x.current_density_A_per_cm2, "A/cm²") }),
          h("td", { text: si(x.current_A, "A") }),
          h("td", { text: x.limited_fraction === null || x.limited_fraction === undefined ? "—" : fmt(100 * x.limited_fraction, 1) + " %" }))))))),
      h("p", { class: "cw-mx-note", text: "Current densities are positive when anodic (oxidation), negative when cathodic." }));
    fill(ui.result,
      h("p", { class: "cw-big" }, h("span", { class: "cw-big-label", text: "Mixed potential " }),
        h("span", { class: "cw-big-value", "data-cw-value": "E_mixed_V", text: potentialText(r.E_mixed_V).replace(" V", "") }),
        h("span", { class: "cw-unit", text: " V" + on })),
      h("p", { class: "cw-direction" }, "Galvanic current ",
        h("strong", { "data-cw-value": "galvanic_current_A", text: si(r.galvanic_current_A, "A") }),
        anodes.length ? " through the metallic connection, from " + anodes.join(", ") + " (net anodic) to " + cathodes.join(", ") + " (net cathodic)."
          : r.electrodes.length === 1 ? ": one electrode, no connection: it corrodes freely." : "."),
      warningsList(r.warnings), scroll(parts), reactions,
      h("h3", { text: "Evans diagram" }),
      evansChart(r.evans, { title: "Evans diagram of the electrodes", potentialLabel: "E (V" + on + ")" }),
      assumptionsBox(r.assumptions), derivation(r.steps),
      r.sources && r.sources.length ? sourcesLine(r.sources, r.data_version) : h("p", { class: "cw-sources" },
        "Every number above is computed from the kinetics entered (no dataset values are used).",
        h("span", { class: "cw-data-tag", text: " · data version " + r.data_version })));
    performance.mark("cw-chart-painted");
  }

  const run = runner(ui, "mixed", render, fieldFor);
  function changed() { const { req, bad } = collect(); run.schedule(req, bad); }
  ui.formBox.addEventListener("input", (ev) => {
    if (ev.target === scaleField.control) return; // a label only: no new calculation
    if (ev.target.matches("input[type=text]") && !ev.target.hasAttribute("inputmode")) relabel();
    changed();
  });
  scaleField.control.addEventListener("change", () => {
    for (const u of ui.formBox.querySelectorAll(".cw-mx-eunit")) u.textContent = "V vs " + scaleField.control.value;
    collect();
    if (last) render(last);
  });
  const first = collect();
  fill(ui.result, h("p", { class: "cw-pending", text: "Computing…" }));
  run.now(first.req, first.bad);
}
