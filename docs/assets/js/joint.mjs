// Joint: two materials in a named environment; the decision, what to do, and where the pair sits
// on its scale (the galvanic series, or the anodic index for the legacy basis).
import { siteRoot } from "./site.mjs";
import { scaleChart } from "./charts.mjs";
import { seriesCaveat } from "./caveat.mjs";
import { bindForm, runner } from "./runner.mjs";
import { materialName } from "./names.mjs";
import { cpDesignLink } from "./cpdesignlink.mjs";
import { serviceForm } from "./serviceform.mjs";
import { codedWarnings, jointMix } from "./jointmix.mjs";
import {
  allowed, assumptionsBox, begin, cautionsBox, derivation, environmentOptions, field, fieldMap, fill, fmt, h, hint,
  known, materialOptions, numberInput, readInto, select, sourceLink, sourcesLine, verdictBadge, writeUrl,
} from "./ui.mjs";

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

function statesTable(states, name) {
  const rows = states.map((st) => h("tr", {},
    h("td", { text: name(st.a) }), h("td", { text: name(st.b) }), h("td", { text: st.anode ? name(st.anode) : "—" }),
    h("td", { text: fmt(st.delta_E_V, 3) }), h("td", { text: (st.delta_E_range_V || []).map((v) => fmt(v, 3)).join(" to ") }), h("td", {}, verdictBadge(st.verdict))));
  if (rows.length <= 1) return null;
  return h("details", { class: "cw-states", open: true }, h("summary", { text: "Passive and active states compared" }),
    h("table", {}, h("thead", {}, h("tr", {}, ["First", "Second", "Anode (attacked)", "ΔE (V)", "range (V)", "verdict"].map((t) => h("th", { text: t })))), h("tbody", {}, rows)));
}

// Where the two parts sit on the basis of the judgement, from the result's positions: the
// galvanic series (ranges in V vs SCE) or the anodic index (one value per group; every group of
// the dataset marked on the scale).
function pairScale(r, ds, name) {
  const index = r.basis === "anodic-index";
  const ids = [...new Set([r.a, r.b])];
  const rows = ids.map((id) => {
    const p = (r.positions || {})[id];
    if (!p) return null;
    const [low, high] = p.range_V || [p.nominal_V, p.nominal_V];
    const role = id === r.anode ? "anode" : id === r.cathode ? "cathode" : "part";
    return { label: name(id) + (role === "part" ? "" : " (" + role + ")"), low, high, mid: p.nominal_V, role };
  }).filter(Boolean);
  if (!rows.length) return null;
  const context = index ? [...new Set(ds.materials.map((m) => m.anodic_index_V).filter((v) => typeof v === "number"))] : [];
  const what = index ? "anodic-index difference" : "ΔE";
  return scaleChart({
    title: index ? "The pair on the anodic-index scale" : "The pair in the galvanic series",
    desc: index ? "Anodic index of each part (V, gold = 0); the ticks on the axis are the index groups of the dataset."
      : "Published range of each part in V vs SCE, with its mid-point.",
    axisLabel: index ? "anodic index (V); gold = 0; ticks: the index groups" : "corrosion potential, V vs SCE",
    anodicEnd: index ? "high" : "low", rows, context, allowable: r.allowable_V,
    gapLabel: what + " " + fmt(r.delta_E_V, 3) + " V",
  });
}

// Which severity class of the legacy table the allowance is, from the environment's record; for an
// immersed or buried environment, that it takes the harsh class (docs/conventions.md).
function allowanceClass(ds, envId) {
  const e = ds.environments.find((x) => x.id === envId);
  if (!e || !e.severity) return null;
  const wet = e.basis === "galvanic-series";
  return h("div", { class: "cw-reason" }, (wet ? "the " + e.severity + " class of the anodic-index table, applied to " +
    (e.electrolyte === "soil" ? "burial" : "immersion") + ": never more lenient than the atmosphere (" : "the " + e.severity +
    " class of the anodic-index table ("),
  h("a", { href: new URL("conventions/#allowable-differences", siteRoot).href, text: "why" }), ")");
}

// The screening rate in words that say what it is: an upper bound of the galvanic attack.
function rateText(r) {
  const rate = r.rate_mm_per_year;
  if (!rate) return "not estimated: " + (r.rate_reason || "");
  return "upper bound " + fmt(rate[0], 3) + " to " + fmt(rate[1], 3) + " mm/year";
}

function adviceNodes(r) {
  return [
    h("h3", { text: "What to do" }),
    h("ul", { class: "cw-mitigations" }, (r.mitigations || []).map((m) => h("li", {}, h("strong", { text: m.text }), h("br"), h("span", { class: "cw-reason", text: "Why here: " + m.reason }), cpDesignLink(m, r)))),
    h("h3", { text: "Closer-matched materials" }),
    ...(r.alternatives || []).map((alt) => h("details", { class: "cw-alts" }, h("summary", { text: alt.text + " (" + alt.count + " pass)" }),
      h("ol", {}, alt.options.map((o) => h("li", {}, o.name + ": ΔE " + fmt(o.delta_E_V, 3) + " V, margin " + fmt(o.margin_V, 3) + " V ", verdictBadge(o.verdict)))))),
  ];
}

export async function joint(root) {
  const { ui, ds, sp, start, params } = await begin(root, "Joint", "joint");
  const mids = new Set(ds.materials.map((m) => m.id));
  const eids = new Set(ds.environments.map((e) => e.id));
  const mopts = materialOptions(ds);
  const aField = field("cw-a", "First material", select(mopts, known(mids, params.get("a"), start.a)));
  const bField = field("cw-b", "Second material", select(mopts, known(mids, params.get("b"), start.b)));
  const envField = field("cw-env", "Environment", select(environmentOptions(ds), known(eids, params.get("env"), start.env)));
  const arField = field("cw-ar", "Wetted area ratio, cathode : anode", numberInput(params.get("ar") ?? start.area_ratio),
    hint(sp, "area_ratio", "e.g. 0.1 for a small noble fastener in a large plate, 10 for the reverse"));
  ui.formBox.append(h("div", { class: "cw-row" }, aField.el, bField.el), h("div", { class: "cw-row" }, envField.el, arField.el));
  const svc = serviceForm(ds, sp, { id: "cw-sc", get: (k) => params.get(k), envId: () => envField.control.value, anodeArea: true });
  ui.formBox.append(svc.el);
  function collect() {
    let bad = false;
    const p = new URLSearchParams();
    const req = { a: aField.control.value, b: bField.control.value, env: envField.control.value };
    if (arField.control.value.trim() !== "") {
      bad = readInto(arField, req, "area_ratio", allowed(sp, "area_ratio", "a ratio of cathode area over anode area")) || bad;
    } else arField.setError("");
    p.set("a", req.a); p.set("b", req.b); p.set("env", req.env); p.set("ar", arField.control.value.trim());
    bad = svc.collect(req) || bad;
    for (const [k, v] of svc.entries()) if (v) p.set(k, v);
    writeUrl(p);
    return { req, bad };
  }
  const fieldFor = fieldMap({ a: aField, b: bField, env: envField, "area*": arField }, svc.fieldFor);
  const seriesChart = seriesChartView();
  const name = (id) => materialName(ds, id);
  async function render(r) {
    const range = r.delta_E_range_V || [];
    const index = r.basis === "anodic-index";
    const diff = index ? "Anodic-index difference" : "Potential difference ΔE";
    const chart = h("div", { class: "cw-series-box" });
    const whole = index ? null : h("details", { class: "cw-series-whole" }, h("summary", { text: "The whole galvanic series, the pair highlighted" }), chart);
    const caveat = seriesCaveat(r.warnings);
    fill(ui.result,
      caveat.banner,
      h("p", { class: "cw-big" }, verdictBadge(r.verdict)),
      h("p", { class: "cw-direction", text: r.verdict_text }),
      h("p", { class: "cw-meaning", text: "“" + r.verdict + "”: " + r.verdict_meaning }),
      jointMix(r, ds),
      h("table", { class: "cw-compare" }, h("tbody", {},
        h("tr", {}, h("th", { text: "Anode (attacked)" }), h("td", { text: r.anode_name || (r.anode ? name(r.anode) : "—") })),
        h("tr", {}, h("th", { text: "Cathode" }), h("td", { text: r.cathode_name || (r.cathode ? name(r.cathode) : "—") })),
        h("tr", {}, h("th", { text: "Basis" }), h("td", {}, r.basis_description || r.basis, " ", sourceLink(r.basis_source))),
        h("tr", {}, h("th", { text: diff + ", nominal" }), h("td", { "data-cw-value": "delta_E_V", text: fmt(r.delta_E_V, 3) + " V" })),
        index ? null : h("tr", {}, h("th", { text: "ΔE best to worst case" }), h("td", { text: range.map((v) => fmt(v, 3)).join(" to ") + " V" })),
        h("tr", {}, h("th", { text: "Allowable " + (index ? "index difference" : "ΔE") + " in this environment" }), h("td", {}, fmt(r.allowable_V, 2) + " V ", sourceLink(r.allowable_source),
          allowanceClass(ds, r.env))),
        h("tr", {}, h("th", { text: "Area effect" }), h("td", { text: r.area_effect || "" })),
        h("tr", {}, h("th", { text: "Galvanic attack on the anode, upper-bound screen" }), h("td", {},
          h("span", { "data-cw-value": "rate_mm_per_year", text: rateText(r) }),
          r.rate_mm_per_year ? h("div", { class: "cw-reason", text: "An upper bound, not a prediction: the cathode is taken to draw its full oxygen-limited current and all of it to leave through the anode. Real attack is usually less, and concentrated next to the joint." }) : null)))),
      codedWarnings(caveat.rest),
      statesTable(r.states || [], name),
      adviceNodes(r),
      h("h3", { text: index ? "Where the pair sits on the anodic-index scale" : "Where the pair sits in the series" }),
      pairScale(r, ds, name), whole,
      assumptionsBox(r.assumptions),
      derivation(r.steps),
      cautionsBox(r.cautions),
      sourcesLine(r.sources, r.data_version));
    if (index) return;
    const svg = await seriesChart([r.a, r.b, ...((r.states || []).flatMap((st) => [st.a, st.b]))]);
    if (svg) chart.replaceChildren(svg);
  }
  bindForm(ui, runner(ui, "joint", render, fieldFor), collect);
}
