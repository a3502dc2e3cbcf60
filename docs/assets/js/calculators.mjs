// The calculators of the site: the name a page gives (data-cw-calc) -> the module that holds it.
// A page loads only the module of its own calculator (dynamic import of a same-origin module,
// allowed by the site's script-src 'self'); each module exports its calculator under this name
// as an async function setup(root).
export const CALCULATORS = {
  couple: "couple.mjs",
  electrode: "electrode.mjs",
  convert: "convert.mjs",
  activity: "activity.mjs",
  joint: "joint.mjs",
  matrix: "matrix.mjs",
  measured: "field.mjs",
  cp: "field.mjs",
  survey: "survey.mjs",
  cpdesign: "cpdesign.mjs",
  mixed: "mixed.mjs",
  passivity: "passivity.mjs",
};

// A promise of the setup function of a calculator, or null for a name the site does not have.
export function loadCalculator(name) {
  if (!Object.hasOwn(CALCULATORS, name)) return null;
  return import(new URL(CALCULATORS[name], import.meta.url).href).then((mod) => {
    if (typeof mod[name] !== "function") throw new Error(CALCULATORS[name] + " has no calculator " + name);
    return mod[name];
  });
}
