// Matrix: every pair of a set of materials in one environment, as a heat map with numbers.
import { calculate } from "./site.mjs";
import { bindForm, canonical, runner } from "./runner.mjs";
import {
  VERDICT_SYMBOL, begin, derivation, environmentOptions, field, fieldMap, fill, fmt, h, known, materialOptions, select,
  sourcesLine, warningsList, writeUrl,
} from "./ui.mjs";

// Sequential, colour-blind-safe, monotonic in lightness (readable in grey): light = small ΔE.
// The shades are the classes cw-heat-0 … cw-heat-6 in couplewise.css: no style attributes, so
// the site's Content-Security-Policy needs no 'unsafe-inline' for styles.
const HEAT_SHADES = 7;

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
  // materials); the table shows both halves. Returns the table's wrapper.
  return function update(r) {
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
    return wrap;
  };
}

export async function matrix(root) {
  const { ui, ds, start, params } = await begin(root, "Matrix", "matrix");
  const eids = new Set(ds.environments.map((e) => e.id));
  const envField = field("cw-env", "Environment", select(environmentOptions(ds), known(eids, params.get("env"), start.env)));
  const listBox = h("select", { multiple: true, size: "10" });
  for (const g of materialOptions(ds)) {
    const og = h("optgroup", { label: g.group });
    for (const o of g.options) og.append(h("option", { value: o.value, text: o.label }));
    listBox.append(og);
  }
  const chosen = new Set(params.has("m") ? params.get("m").split(",").filter(Boolean) : start.materials || []);
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
  const fieldFor = fieldMap({ env: envField, "materials*": mField });
  const update = heatTable(new Map(ds.materials.map((m) => [m.id, m.name])));
  function render(r) {
    const wrap = update(r);
    const legend = h("p", { class: "cw-legend" }, "Cells: ΔE in volts (darker = larger), with the verdict symbol: ",
      ...Object.entries(VERDICT_SYMBOL).map(([v, sym]) => h("span", { class: "cw-legend-item", text: sym + " " + v + "  " })));
    const rest = [warningsList(r.warnings), derivation(r.steps), sourcesLine(r.sources, r.data_version)].filter(Boolean);
    if (wrap.parentNode === ui.result) { // the same table stays in place: replace what is around it
      for (const c of [...ui.result.childNodes]) if (c !== wrap) c.remove();
      wrap.before(legend);
      wrap.after(...rest);
    } else fill(ui.result, legend, wrap, rest);
  }
  bindForm(ui, runner(ui, "matrix", render, fieldFor), collect, ["change"]);
}
