// A material picker that works with a finger: a search box whose matches are buttons, the chosen
// materials as chips (tap to remove), and every material by family behind a disclosure. The
// choice keeps the dataset's order (most noble first), whatever order the taps came in.
import { field, h } from "./ui.mjs";

const MATCHES_SHOWN = 8;

// Lower case without spaces, hyphens or punctuation: "UNS S31600", "s31600" and "316" all match.
function squash(text) {
  return String(text || "").toLowerCase().replace(/[^a-z0-9]/g, "");
}

function label(m) {
  return m.name + (m.uns && m.uns.length ? " (" + m.uns.join(", ") + ")" : "");
}

// materials: the dataset's records offered; chosen: ids chosen at the start; onChange(ids) after
// every change. Returns {el, field, ids()} (field: the form field, for calc's messages).
export function materialPicker(materials, chosen, onChange, { id = "cw-m", title = "Materials", help = "" } = {}) {
  const order = new Map(materials.map((m, k) => [m.id, k]));
  const byId = new Map(materials.map((m) => [m.id, m]));
  const words = new Map(materials.map((m) => [m.id, [m.name, m.id, m.family, ...(m.aliases || []), ...(m.uns || [])].map(squash)]));
  const picked = new Set(chosen.filter((c) => byId.has(c)));
  const box = h("input", { type: "search", autocomplete: "off", spellcheck: "false", enterkeyhint: "done",
    placeholder: "Type a name, grade or UNS number" });
  const f = field(id, title, box, help);
  const chips = h("div", { class: "cw-chips", role: "list", "aria-label": "Chosen materials" });
  const matches = h("div", { class: "cw-matches", id: id + "-matches", "aria-live": "polite" });
  const families = h("div", { class: "cw-families" });
  const browse = h("details", { class: "cw-browse" }, h("summary", { text: "Every material, by family" }), families);
  const clear = h("button", { type: "button", class: "md-button cw-chip-clear", text: "Clear the choice" });
  box.setAttribute("aria-controls", matches.id);
  f.el.classList.add("cw-picker");
  f.el.insertBefore(chips, box);
  box.after(matches);
  f.el.append(h("div", { class: "cw-actions-row" }, clear), browse);

  const ids = () => [...picked].sort((x, y) => order.get(x) - order.get(y));
  const toggles = new Map();
  function changed() { paint(); onChange(ids()); }
  function toggle(mid) {
    if (picked.has(mid)) picked.delete(mid); else picked.add(mid);
    changed();
  }
  function paint() {
    chips.replaceChildren(...(picked.size ? ids().map((mid) => h("button", {
      type: "button", class: "cw-chip", role: "listitem", "data-material": mid, "aria-label": "Remove " + byId.get(mid).name,
      onclick: () => toggle(mid),
    }, h("span", { text: byId.get(mid).name }), h("span", { class: "cw-chip-x", "aria-hidden": "true", text: " ×" })))
      : [h("span", { class: "cw-chips-none", text: "None chosen: every material with data for this environment." })]));
    for (const [mid, b] of toggles) b.setAttribute("aria-pressed", picked.has(mid) ? "true" : "false");
    clear.hidden = !picked.size;
    showMatches();
  }
  function found() {
    const q = squash(box.value);
    if (!q) return [];
    return materials.filter((m) => words.get(m.id).some((w) => w.includes(q))).slice(0, MATCHES_SHOWN);
  }
  function showMatches() {
    const q = box.value.trim();
    const list = found();
    matches.replaceChildren(...(q && !list.length ? [h("span", { class: "cw-matches-none", text: "No material matches “" + q + "”." })] :
      list.map((m) => h("button", { type: "button", class: "cw-match", "aria-pressed": picked.has(m.id) ? "true" : "false",
        onclick: () => { toggle(m.id); box.focus(); } }, (picked.has(m.id) ? "✓ " : "+ ") + label(m)))));
  }
  box.addEventListener("input", showMatches);
  box.addEventListener("change", (e) => e.stopPropagation()); // typing a search is not an input of the calculation
  box.addEventListener("keydown", (e) => {
    if (e.key !== "Enter") return;
    e.preventDefault();
    const first = found()[0];
    if (first && !picked.has(first.id)) { toggle(first.id); box.value = ""; showMatches(); }
  });
  clear.addEventListener("click", () => { picked.clear(); changed(); });
  const fam = new Map();
  for (const m of materials) {
    const k = m.family || "other";
    if (!fam.has(k)) fam.set(k, []);
    fam.get(k).push(m);
  }
  for (const [name, list] of fam) {
    families.append(h("div", { class: "cw-family" }, h("span", { class: "cw-family-name", text: name }),
      ...list.map((m) => {
        const b = h("button", { type: "button", class: "cw-toggle", "data-material": m.id, onclick: () => toggle(m.id) }, label(m));
        toggles.set(m.id, b);
        return b;
      })));
  }
  paint();
  return { el: f.el, field: f, ids };
}
