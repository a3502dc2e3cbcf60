// The structure of the immersed design as an editable table of zones: one row a surface (its name,
// whether it is in seawater or in the seabed, its depth, its area and its coating category from the
// dataset), rows added and removed with large buttons. A table on a tablet or laptop, one card per
// zone on a phone (cpdesign.css); every cell has its own label and message slot, so calc's message
// about "zones[2].area_m2" shows at that cell.
import { catalogueOptions, choice, field, h, listMessage, maybe, need, numField, text } from "./cpdesign-kit.mjs";

// Where a zone's surface is (the kinds the engine reads, calc.cpdesign.zones.ZONE_KINDS), in words.
const WHERE = [
  { value: "seawater", label: "Seawater" },
  { value: "seabed", label: "Seabed sediment" },
];
const COLUMNS = ["Zone", "Where", "Depth (m)", "Area (m²)", "Coating", ""];

// One zone in a URL: name|where|depth|area|coating ("|" and "%" in a name escaped).
const esc = (s) => String(s ?? "").replace(/%/g, "%25").replace(/\|/g, "%7C");
function unesc(s) {
  try { return decodeURIComponent(s); } catch { return s; }
}

export function zoneFromUrl(s) {
  const [name = "", zone = "seawater", depth = "", area = "", coating = "bare"] = String(s).split("|").map(unesc);
  return { name, zone, depth_m: depth, area_m2: area, coating };
}

let made = 0;

// The editor: {el, read() -> {zones, bad}, fieldFor(calc field), urlValues(), count()}.
// start: zones as the opening request or a URL gives them; changed(): after a row is added or removed.
export function zonesEditor(ds, start, changed) {
  const coatings = catalogueOptions(ds.cp_coatings);
  const rows = [];
  const body = h("tbody", {});
  const whole = listMessage("cw-i-zones");
  const addBtn = h("button", { type: "button", class: "md-button md-button--primary cw-touch cw-cpd-add", text: "+ Add a zone" });

  function makeRow(z) {
    const id = "cw-i-z" + ++made;
    const r = {
      name: field(id + "-name", "Zone", h("input", { type: "text", autocomplete: "off", maxlength: "100", value: z.name ?? "" })),
      zone: field(id + "-zone", "Where", choice(WHERE, z.zone, "seawater")),
      depth_m: numField(id + "-depth", "Depth (m)", z.depth_m),
      area_m2: numField(id + "-area", "Area (m²)", z.area_m2),
      coating: field(id + "-coating", "Coating", choice(coatings, z.coating, "bare")),
      remove: h("button", { type: "button", class: "md-button cw-touch cw-cpd-remove" }, h("span", { class: "cw-cpd-remove-words", text: "Remove" })),
    };
    r.tr = h("tr", { class: "cw-cpd-zone" },
      ...["name", "zone", "depth_m", "area_m2", "coating"].map((k) => h("td", { class: "cw-cpd-" + k.replace("_", "-") }, r[k].el)),
      h("td", { class: "cw-cpd-zone-x" }, r.remove));
    r.remove.addEventListener("click", () => {
      if (rows.length <= 1) return;
      const at = rows.indexOf(r);
      rows.splice(at, 1);
      r.tr.remove();
      relabel();
      changed();
      (rows[Math.min(at, rows.length - 1)].remove.disabled ? addBtn : rows[Math.min(at, rows.length - 1)].remove).focus();
    });
    return r;
  }

  // Each cell's label names its zone (a screen reader, the card layout and the "correct …" note say which).
  function relabel() {
    rows.forEach((r, i) => {
      const n = "Zone " + (i + 1);
      for (const [k, words] of [["name", "Name"], ["zone", "Where"], ["depth_m", "Depth (m)"], ["area_m2", "Area (m²)"], ["coating", "Coating"]]) {
        r[k].el.querySelector("label").replaceChildren(h("span", { class: "cw-cpd-zn", text: n + ": " }), words);
      }
      const nm = text(r.name);
      r.remove.setAttribute("aria-label", "Remove zone " + (i + 1) + (nm ? " (" + nm + ")" : ""));
      r.remove.disabled = rows.length <= 1;
    });
  }

  function add(z) {
    const r = makeRow(z);
    rows.push(r);
    body.append(r.tr);
    relabel();
    return r;
  }

  for (const z of start.length ? start : [{ zone: "seawater", coating: "bare" }]) add(z);
  addBtn.addEventListener("click", () => {
    const last = rows[rows.length - 1];
    const r = add({ name: "", zone: last.zone.control.value, depth_m: text(last.depth_m), area_m2: "", coating: last.coating.control.value });
    changed();
    r.area_m2.control.focus();
  });
  body.addEventListener("input", (e) => { if (e.target.closest("td.cw-cpd-name")) relabel(); });

  const el = h("div", { class: "cw-cpd-zones" },
    h("div", { class: "cw-matrix-wrap" }, h("table", { class: "cw-cpd-zone-table" },
      h("caption", { text: "The structure's surfaces, zone by zone" }),
      h("thead", {}, h("tr", {}, COLUMNS.map((t) => h("th", { scope: "col", text: t })))), body)),
    whole.el,
    h("div", { class: "cw-actions-row" }, addBtn,
      h("span", { class: "cw-field-help cw-cpd-zones-help", text: "Depth below the water surface picks the depth band of the current densities and coating constants; area in m² of steel surface; the coating's category sets how it breaks down with age." })));

  function read() {
    let bad = false;
    const zones = rows.map((r) => {
      const z = { zone: r.zone.control.value, coating: r.coating.control.value };
      const nm = text(r.name);
      if (nm) z.name = nm;
      bad = maybe(r.depth_m, z, "depth_m", "a depth below the water surface in m (empty: 0 m)") || bad;
      bad = need(r.area_m2, z, "area_m2", "the zone's steel surface area in m²") || bad;
      return z;
    });
    return { zones, bad };
  }

  function fieldFor(name) {
    const m = /^zones\[(\d+)\](?:\.(\w+))?/.exec(name);
    if (!m) return name === "zones" ? whole : null;
    const r = rows[Number(m[1])];
    return r ? r[m[2]] || r.area_m2 : whole;
  }

  const urlValues = () => rows.map((r) => [text(r.name), r.zone.control.value, text(r.depth_m), text(r.area_m2), r.coating.control.value].map(esc).join("|"));
  return { el, read, fieldFor, urlValues, count: () => rows.length };
}
