// The way into the cathodic-protection design page from elsewhere: the link that the joint page's
// "protect the joint cathodically" advice carries (prefilled with the joint's environment), and
// what the design page makes of an environment of the dataset (which design, which resistivity).
// Small on purpose: the joint page imports it.
import { h, siteRoot } from "./site.mjs";

// The three designs of the page, in the order of its chooser.
export const DESIGNS = ["immersed", "buried", "groundbed"];

// Whether an environment is an immersed electrolyte: the same three tests, in the same order, as
// calc.series._immersed (the joint's basis), so the page and the joint agree.
function immersed(env) {
  if (env.immersed !== undefined && env.immersed !== null) return !!env.immersed;
  if (env.exposure === "immersed" || env.exposure === "atmospheric") return env.exposure === "immersed";
  return env.ionic_strength_mol_per_kg !== undefined && env.ionic_strength_mol_per_kg !== null;
}

// Which water the immersed method's catalogue was written for: seawater (its current densities and
// anode data); brackish and fresh water get a note that they are outside it.
function water(env) {
  const r = env.resistivity_ohm_m;
  const high = Array.isArray(r) ? r[r.length - 1] : r;
  if (typeof high !== "number") return "unknown";
  return high <= 1 ? "seawater" : high <= 10 ? "brackish" : "fresh";
}

// What the design page takes from an environment of the dataset (null for an unknown id):
// {env, design, resistivity (text for the field, or null), range, note}.
export function environmentPrefill(ds, id) {
  const env = id ? (ds.environments || []).find((e) => e.id === id) : null;
  if (!env) return null;
  const range = Array.isArray(env.resistivity_ohm_m) ? env.resistivity_ohm_m : null;
  if (immersed(env)) {
    const kind = water(env);
    const rho = range ? String(range[range.length - 1]) : null;
    const notes = {
      seawater: "",
      brackish: " The immersed method's current densities and anode data are for seawater: in brackish water check them against the governing standard (aluminium anodes lose capacity in low-salinity water).",
      fresh: " The immersed method's current densities and anode data are for seawater and do not hold in fresh water (aluminium-alloy anodes passivate there; magnesium anodes are the usual choice): give the design currents directly and check the anode data against the governing standard.",
      unknown: "",
    };
    return {
      env, design: "immersed", resistivity: rho, range, kind,
      note: (rho ? "Resistivity set to " + rho + " Ω·m, the upper end of this environment's range " + range.join(" to ") +
        " Ω·m: the higher resistivity gives the lower anode output, the safer side for the count." : "") + notes[kind],
    };
  }
  if (range && range[0] >= 1) {
    return {
      env, design: "buried", resistivity: null, range, kind: "soil",
      note: "Buried structures: soil resistivity spans " + range.join(" to ") + " Ω·m in this environment, too wide to design with: measure it along the route (the Wenner helper below turns a four-pin reading into a resistivity).",
    };
  }
  return {
    env, design: null, resistivity: null, range, kind: "air",
    note: "Cathodic protection needs the structure and the anodes in one electrolyte (water or soil); it does not protect in the atmosphere. The page opens with its own demonstration instead.",
  };
}

// The address of the design page for an environment (and the joint it came from).
export function cpDesignHref(env, a, b) {
  const url = new URL("calculators/cp-design/", siteRoot);
  const p = new URLSearchParams({ env });
  if (a && b) { p.set("a", a); p.set("b", b); }
  url.search = p.toString();
  return url.href;
}

// The link beside the joint page's cathodic-protection advice (null beside any other advice).
export function cpDesignLink(mitigation, result) {
  if (!mitigation || mitigation.id !== "cathodic-protection" || !result || !result.env) return null;
  return h("p", { class: "cw-cp-design-link" },
    h("a", { class: "md-button cw-open-cp-design", href: cpDesignHref(result.env, result.a, result.b), text: "Design the cathodic protection" }),
    h("span", { class: "cw-reason", text: " opens the design page set for this environment" }));
}
