// The loud caveat of a joint or matrix judged on a galvanic series measured in another
// electrolyte (soil or fresh water on the seawater series): calc marks that warning with the
// code "series-other-electrolyte" and its basis (ASTM G82 §5); the page shows it as a banner
// above the verdict instead of one line among the others.
import { h } from "./ui.mjs";

export const OTHER_ELECTROLYTE = "series-other-electrolyte";

// Split a result's warnings: the banner (or null) and the warnings left for the ordinary list.
export function seriesCaveat(warnings) {
  const all = warnings || [];
  const loud = all.filter((w) => w && w.code === OTHER_ELECTROLYTE);
  const rest = all.filter((w) => !(w && w.code === OTHER_ELECTROLYTE));
  if (!loud.length) return { banner: null, rest };
  const banner = h("div", { class: "admonition danger cw-caveat", role: "note" },
    h("p", { class: "admonition-title", text: "Judged on a galvanic series measured in another electrolyte" }),
    ...loud.map((w) => h("p", { class: "cw-caveat-text", text: w.message.charAt(0).toUpperCase() + w.message.slice(1) + "." })),
    h("p", { class: "cw-caveat-basis" }, h("strong", { text: "Basis: " }), loud[0].basis || ""),
    h("p", { class: "cw-caveat-do", text: "Treat the verdict as a rough first screen: where the joint matters, measure the two " +
      "potentials in this electrolyte (site readings, measured joint) or use a series measured in it." }));
  return { banner, rest };
}
