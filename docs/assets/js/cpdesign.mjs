// Cathodic-protection design page: a choice of three designs, each a calculator of its own
// (immersed galvanic anodes, buried galvanic anodes, impressed-current groundbed with the Wenner
// helper for the soil resistivity), each started when first chosen. The page reads ?design= and,
// from the joint page's advice, ?env= (with the joint's a and b): the environment picks the design
// and its resistivity (cpdesignlink.mjs) and the page says what it took from it.
import { dataset, h, spec } from "./site.mjs";
import { DESIGNS, environmentPrefill } from "./cpdesignlink.mjs";
import { environmentName, jointHref, materialName } from "./names.mjs";
import { immersed } from "./cpdesign-immersed.mjs";
import { buried } from "./cpdesign-buried.mjs";
import { groundbed } from "./cpdesign-groundbed.mjs";

const SETUP = { immersed, buried, groundbed };
const CHOICES = {
  immersed: ["Immersed galvanic anodes", "Piles, jetties, hulls and offshore structures in seawater: zones, coating, life, anodes."],
  buried: ["Buried galvanic anodes", "Pipelines and tanks in soil: magnesium or zinc anodes by the MIL-HDBK-1004/10 method."],
  groundbed: ["Impressed-current groundbed", "Anode bed, cable and rectifier; soil resistivity from a Wenner reading."],
};

function setDesignParam(design) {
  const url = new URL(location.href);
  url.searchParams.set("design", design);
  history.replaceState(history.state, "", url.href);
}

// What the page took from the link it was opened with (the joint page's environment).
function prefillNote(ds, params, prefill) {
  const id = params.get("env");
  if (!id) return null;
  if (!prefill) {
    return h("p", { class: "cw-cpd-prefill cw-warning", role: "note" },
      "The link names an environment the dataset does not have (", h("bdi", { text: id }), "): the page opens with its own demonstration.");
  }
  const a = params.get("a"), b = params.get("b");
  const mids = new Set(ds.materials.map((m) => m.id));
  const joint = a && b && mids.has(a) && mids.has(b);
  return h("div", { class: "cw-cpd-prefill", role: "note" },
    h("p", {}, h("strong", { text: "From the joint page: " }), h("span", { class: "cw-cpd-env", "data-env": id, text: environmentName(ds, id) }),
      joint ? ", the joint of " + materialName(ds, a) + " and " + materialName(ds, b) + ". " : ". ",
      prefill.design ? "Design chosen: " + CHOICES[prefill.design][0].toLowerCase() + ". " : "",
      joint ? h("a", { href: jointHref(a, b, id), text: "Back to the joint" }) : null),
    prefill.note ? h("p", { class: "cw-reason", text: prefill.note }) : null);
}

export async function cpdesign(root) {
  const status = root.querySelector(":scope > .cw-runtime");
  const [ds, sp] = await Promise.all([dataset(), spec()]);
  const params = new URLSearchParams(location.search);
  const prefill = environmentPrefill(ds, params.get("env"));
  const asked = params.get("design");
  let chosen = DESIGNS.includes(asked) ? asked : (prefill && prefill.design) || "immersed";
  const boxes = {}, buttons = {}, started = {};
  const chooser = h("div", { class: "cw-cpd-choose", role: "group", "aria-label": "Design" });
  for (const d of DESIGNS) {
    buttons[d] = h("button", { type: "button", class: "cw-toggle cw-cpd-choice", "data-design": d, "aria-pressed": "false", onclick: () => show(d, true) },
      h("strong", { text: CHOICES[d][0] }), h("span", { class: "cw-cpd-choice-what", text: CHOICES[d][1] }));
    chooser.append(buttons[d]);
    boxes[d] = h("div", { class: "cw-cpd-design", "data-design": d, hidden: true });
  }
  root.replaceChildren(...[status, prefillNote(ds, params, prefill), chooser, ...DESIGNS.map((d) => boxes[d])].filter(Boolean));

  function show(d, byUser) {
    chosen = d;
    for (const x of DESIGNS) {
      buttons[x].setAttribute("aria-pressed", String(x === d));
      boxes[x].hidden = x !== d;
    }
    if (byUser) setDesignParam(d);
    if (!started[d]) {
      started[d] = SETUP[d](boxes[d], { ds, sp, prefill }).catch((err) => {
        boxes[d].append(h("p", { class: "cw-error", role: "alert", text: "This design could not start: " + String(err && err.message ? err.message : err) }));
      });
    }
  }
  show(chosen, false);
}
