// Matrix: every pair of a set of materials in one environment. Every cell shows the difference,
// the verdict's mark and pattern (our own tier language: couplewise.css), which of the two corrodes (an arrow to the row or the column) and, where
// the verdict is not the plain reading of the number, why (ranges, state, CP by design); tapping
// a cell explains its verdict and links to the joint page for that pair.
import { calculate } from "./site.mjs";
import { canonical, runner } from "./runner.mjs";
import {
  TIERS, begin, derivation, environmentOptions, field, fieldMap, fill, fmt, h, known, select, sourcesLine, tierMark,
  verdictBadge, warningsList, writeUrl,
} from "./ui.mjs";
import { environmentName, jointHref, materialName } from "./names.mjs";
import { materialPicker } from "./picker.mjs";
import { seriesCaveat } from "./caveat.mjs";
import { serviceForm, serviceUsed } from "./serviceform.mjs";
import { codedWarnings, servicePair } from "./jointmix.mjs";

// Sequential, colour-blind-safe, monotonic in lightness (readable in grey): light = small ΔE.
// The shades are the classes cw-heat-0 … cw-heat-6 in couplewise.css: no style attributes, so
// the site's Content-Security-Policy needs no 'unsafe-inline' for styles.
const HEAT_SHADES = 7;
// The mark under a cell's number: why its verdict is what it is, where the number alone does not say.
const WHY_MARK = { range: "range", state: "state" };
const BY_DESIGN_MARK = "CP";
// What each tier's mark and pattern show, in a few words (the meaning itself is calc's: r.tiers).
const TIER_GLOSS = {
  matched: "gauge nearly empty, plain: a negligible difference",
  compatible: "gauge half full, level lines: within the allowance",
  guarded: "gauge brimful under a dotted lid, diagonal hatching: within it as named, past it in a range or state",
  unsuited: "gauge overflowing, cross-hatching: beyond the allowance",
};

// One pair of the result as an object (the result lists columns: pair_fields, detail_fields).
function pairAt(r, k) {
  const p = r.pairs[k], d = (r.details || [])[k] || [];
  const o = {};
  r.pair_fields.forEach((f, i) => { o[f] = p[i]; });
  (r.detail_fields || []).forEach((f, i) => { o[f] = d[i]; });
  return o;
}

// The table of the materials shown: built once per list of materials (element by element,
// detached, inserted once); a new result for the same materials (another environment) only
// updates its cells in place.
function heatTable(names) {
  let shown = null; // { key, wrap, cells: n×n array of td (null on the diagonal), last: what each cell shows }
  function tableFor(ids) {
    const key = ids.join("\n");
    if (shown && shown.key === key) return shown;
    const n = ids.length;
    const table = h("table", { class: "cw-matrix" });
    table.append(h("thead", {}, h("tr", {}, h("th", { class: "cw-corner", text: "ΔE (V)" }),
      ids.map((id) => h("th", { scope: "col" }, h("span", { text: names(id) }))))));
    const body = document.createElement("tbody");
    const cell = document.createElement("td"); // a cell: ΔE, the tier's mark; below, the anode arrow and a mark of why
    cell.tabIndex = 0;
    cell.append(h("span", { class: "cw-d" }, ""), h("span", { class: "cw-tile", "aria-hidden": "true" }, h("span", { class: "cw-mark" })),
      h("span", { class: "cw-sub" }, h("span", { class: "cw-anode", "aria-hidden": "true" }, ""), h("span", { class: "cw-why" }, "")));
    const diag = h("td", { class: "cw-diag", text: "—" });
    const cells = new Array(n * n).fill(null);
    for (let i = 0; i < n; i++) {
      const tr = document.createElement("tr");
      const th = document.createElement("th");
      th.scope = "row";
      th.textContent = String(i + 1) + ". " + names(ids[i]);
      tr.append(th);
      for (let j = 0; j < n; j++) {
        const td = (i === j ? diag : cell).cloneNode(true);
        if (i !== j) { cells[i * n + j] = td; td.dataset.row = String(i); td.dataset.col = String(j); }
        tr.append(td);
      }
      body.append(tr);
    }
    table.append(body);
    shown = { key, wrap: h("div", { class: "cw-matrix-wrap" }, table), cells, last: new Array(n * n).fill("") };
    return shown;
  }
  // The result lists each pair once (upper triangle, indices into materials); the table shows
  // both halves. Returns the table's wrapper.
  return function update(r) {
    const ids = r.materials, n = ids.length;
    let max = 0.01;
    for (const p of r.pairs) if (p[2] > max) max = p[2];
    const { wrap, cells, last } = tableFor(ids);
    r.pairs.forEach((_, k) => {
      const p = pairAt(r, k);
      const shade = Math.min(HEAT_SHADES - 1, Math.floor((p.delta_E_V / max) * (HEAT_SHADES - 1) + 1e-9));
      const mark = p.by_design ? BY_DESIGN_MARK : (p.verdict === "guarded" && WHY_MARK[p.why]) || "";
      const cls = "cw-cell cw-heat-" + shade + " cw-v-" + p.verdict + (p.by_design ? " cw-by-design" : "");
      const text = fmt(p.delta_E_V, 2), tileCls = "cw-tile cw-v-" + p.verdict, markCls = "cw-mark cw-mark-" + p.verdict;
      for (const [row, col] of [[p.a, p.b], [p.b, p.a]]) {
        const at = row * n + col;
        const arrow = p.anode === null ? "=" : p.anode === row ? "←" : "↑";
        const who = p.anode === null ? "neither corrodes preferentially" : names(ids[p.anode]) + " corrodes";
        const aria = names(ids[row]) + " with " + names(ids[col]) + ": ΔE " + text + " V, " + p.verdict + "; " + who +
          (mark ? "; " + (p.by_design ? "sacrificial by design" : "verdict set by the " + mark) : "");
        const now = cls + "|" + text + "|" + arrow + "|" + mark + "|" + aria;
        if (last[at] === now) continue; // unchanged: no write, no style work
        last[at] = now;
        const td = cells[at];
        td.className = cls;
        td.dataset.k = String(k);
        td.setAttribute("aria-label", aria);
        td.children[0].textContent = text;
        td.children[1].className = tileCls;
        td.children[1].firstChild.className = markCls;
        td.children[2].children[0].textContent = arrow;
        td.children[2].children[1].textContent = mark ? " " + mark : "";
      }
    });
    return wrap;
  };
}

// What a tapped cell says: the pair, who corrodes, the numbers against the limit, why, the link.
function explain(r, k, names, ds) {
  const p = pairAt(r, k);
  const a = r.materials[p.a], b = r.materials[p.b];
  const index = r.basis === "anodic-index";
  const what = index ? "Anodic-index difference" : "ΔE";
  const nums = [what + " " + fmt(p.delta_E_V, 3) + " V"];
  if (!index && p.best_V !== undefined) nums.push("from the published ranges " + fmt(p.best_V, 3) + " to " + fmt(p.worst_V, 3) + " V");
  nums.push("allowable " + fmt(r.allowable_V, 2) + " V" + (r.negligible_V !== null && r.negligible_V !== undefined ? ", negligible below " + fmt(r.negligible_V, 2) + " V" : ""));
  const tier = (r.tiers || []).find((t) => t.id === p.verdict);
  const why = (r.why || {})[p.why];
  return [
    h("p", { class: "cw-explain-head" }, h("strong", { text: names(a) + " with " + names(b) }), " in " + environmentName(ds, r.env) + " ", verdictBadge(p.verdict)),
    h("p", { text: p.anode === null ? "Neither corrodes preferentially: the two sit at the same nominal potential." :
      names(r.materials[p.anode]) + " corrodes (the anode); " + names(p.anode === p.a ? b : a) + " is the cathode." }),
    h("p", { text: nums.join("; ") + "." }),
    why ? h("p", {}, h("strong", { text: "Why " + p.verdict + ": " }), why +
      (p.other_state_V !== null && p.other_state_V !== undefined ? " (the worst other state: " + fmt(p.other_state_V, 3) + " V)" : "") + ".") : null,
    tier ? h("p", { class: "cw-reason", text: "“" + p.verdict + "”: " + tier.meaning }) : null,
    p.by_design && r.by_design_rule ? h("p", { class: "cw-by-design-note" }, h("strong", { text: "CP by design: " }), r.by_design_rule.text) : null,
    servicePair(r, k, names),
    h("p", {}, h("a", { class: "md-button md-button--primary cw-open-joint", href: jointHref(a, b, r.env), text: "Open this joint" })),
  ];
}

export async function matrix(root) {
  const { ui, ds, sp, start, params } = await begin(root, "Matrix", "matrix");
  const eids = new Set(ds.environments.map((e) => e.id));
  const envField = field("cw-env", "Environment", select(environmentOptions(ds), known(eids, params.get("env"), start.env)));
  const chosen = params.has("m") ? params.get("m").split(",").filter(Boolean) : start.materials || [];
  const picker = materialPicker(ds.materials, chosen, () => changed(), { title: "Materials", help: "Tap a match to add it, a chip to remove it." });
  // The CSV is made by calc only when asked for (a click): the worker answers the same request
  // with "csv": true, and the link then holds it as a data: URL (no inline script under the CSP).
  const csvLink = h("a", { class: "md-button", download: "couplewise-matrix.csv", href: "#", text: "Download CSV" });
  ui.formBox.append(h("div", { class: "cw-row" }, envField.el), h("div", { class: "cw-row" }, picker.el), csvLink);
  const svc = serviceForm(ds, sp, { id: "cw-sc", get: (k) => params.get(k), envId: () => envField.control.value, onChange: () => changed() });
  csvLink.before(svc.el);
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
    const sel = picker.ids();
    const req = { env: envField.control.value };
    if (sel.length) req.materials = sel;
    const bad = svc.collect(req);
    const p = new URLSearchParams();
    p.set("env", req.env); p.set("m", sel.join(","));
    for (const [k, v] of svc.entries()) if (v) p.set(k, v);
    writeUrl(p);
    lastReq = req;
    if (csvFor !== canonical(req)) { csvFor = null; csvLink.href = "#"; }
    return { req, bad };
  }
  const fieldFor = fieldMap({ env: envField, "materials*": picker.field }, svc.fieldFor);
  const names = (id) => materialName(ds, id);
  const update = heatTable(names);
  const panel = h("div", { class: "cw-explain", "aria-live": "polite" });
  let shownResult = null, openCell = null;
  function show(td) {
    if (!td || td.dataset.k === undefined || !shownResult) return;
    if (openCell) openCell.classList.remove("cw-cell-open");
    openCell = td;
    td.classList.add("cw-cell-open");
    fill(panel, explain(shownResult, Number(td.dataset.k), names, ds));
    const link = panel.querySelector(".cw-open-joint"); // the joint opens at the same service conditions
    if (link) { const u = new URL(link.href); for (const [k, v] of svc.entries()) if (v) u.searchParams.set(k, v); link.href = u.href; }
    panel.scrollIntoView({ block: "nearest" });
  }
  ui.result.addEventListener("click", (e) => show(e.target.closest("td.cw-cell")));
  ui.result.addEventListener("keydown", (e) => {
    if ((e.key === "Enter" || e.key === " ") && e.target.matches("td.cw-cell")) { e.preventDefault(); show(e.target); }
  });
  function render(r) {
    const wrap = update(r);
    shownResult = r;
    if (openCell && !wrap.contains(openCell)) openCell = null;
    fill(panel, h("p", { class: "cw-explain-hint", text: "Tap a cell to see why it has its verdict and to open that joint." }));
    if (openCell) show(openCell);
    const legend = h("div", { class: "cw-legend" },
      h("p", {}, "Each cell: ΔE in volts (darker = larger), the verdict's mark and pattern:"),
      h("ul", { class: "cw-tier-legend" }, TIERS.map((t) => h("li", {},
        h("span", { class: "cw-tile cw-v-" + t, "aria-hidden": "true" }, tierMark(t)), h("strong", { text: " " + t }),
        h("span", { class: "cw-tier-gloss", text: " " + TIER_GLOSS[t] })))),
      h("p", {}, h("strong", { text: "← " }), "the row's material corrodes; ", h("strong", { text: "↑ " }), "the column's material corrodes; ",
        h("strong", { text: "= " }), "neither. ", h("strong", { text: "range" }), ": guarded because the published ranges reach past the limit; ",
        h("strong", { text: "state" }), ": guarded because the other passive/active state of a part fails; ",
        h("strong", { text: BY_DESIGN_MARK }), ": a sacrificial anode or zinc coating on steel, corroding by design."));
    const caveat = seriesCaveat(r.warnings);
    const before = [caveat.banner, legend, panel].filter(Boolean);
    const seen = new Set((r.warnings || []).map((w) => w.message));
    const rest = [codedWarnings((r.service_warnings || []).filter((w) => !seen.has(w.message))), serviceUsed(r.service_conditions, r.oxygen_supply),
      r.service_pairs_reason ? h("p", { class: "cw-reason", text: "At the service conditions: " + r.service_pairs_reason + "." }) : null, warningsList(caveat.rest), derivation(r.steps), sourcesLine(r.sources, r.data_version)].filter(Boolean);
    if (wrap.parentNode === ui.result) { // the same table stays in place: replace what is around it
      for (const c of [...ui.result.childNodes]) if (c !== wrap) c.remove();
      wrap.before(...before);
      wrap.after(...rest);
    } else fill(ui.result, ...before, wrap, rest);
  }
  const run = runner(ui, "matrix", render, fieldFor);
  function changed() { const { req, bad } = collect(); run.schedule(req, bad); }
  envField.control.addEventListener("change", changed);
  const first = collect();
  run.now(first.req, first.bad);
}
