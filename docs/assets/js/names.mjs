// Names instead of ids: the dataset's own names of materials and environments, looked up once per
// dataset, and the link to a joint's page (the matrix opens a pair there).
import { siteRoot } from "./site.mjs";

const cache = new WeakMap();

function tables(ds) {
  if (!cache.has(ds)) {
    cache.set(ds, {
      materials: new Map(ds.materials.map((m) => [m.id, m.name || m.id])),
      environments: new Map(ds.environments.map((e) => [e.id, e.name || e.id])),
    });
  }
  return cache.get(ds);
}

// The name of a material id (the id itself when the dataset has no such material).
export function materialName(ds, id) {
  if (id === null || id === undefined) return "—";
  return tables(ds).materials.get(id) || id;
}

export function environmentName(ds, id) {
  return tables(ds).environments.get(id) || id;
}

// The address of the joint page for two materials in an environment (its form reads a, b, env).
export function jointHref(a, b, env) {
  const url = new URL("calculators/joint/", siteRoot);
  url.search = new URLSearchParams({ a, b, env }).toString();
  return url.href;
}
