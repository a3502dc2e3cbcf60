// Couplewise service worker, written at build time from sitebuild/sw_template.js by
// sitebuild/offline.py. It precaches every file of the built site (pages, search index, the
// Pyodide runtime, the calc wheel, the dataset) under one cache per version and serves only
// from that cache, so the data and calc of two versions are never mixed. The cache name
// carries the site's path, so two copies of the site on one server keep apart.
const META = __META__; // {data_version, data_date, build, version, files, bytes}: version hashes every file
const PRECACHE = __PRECACHE__; // [[URL relative to the site root, "sha256-..." of its bytes or ""], ...]
const SCOPE = new URL("./", self.location).href;
const PREFIX = "couplewise:" + new URL(SCOPE).pathname + ":";
const CACHE = PREFIX + META.version;
const PARALLEL = 6;

// One file of the precache, at the lowest fetch priority (the install runs beside the page's
// first use). A file with a digest is first taken from the browser's HTTP cache whatever its age:
// on a first visit the page has just downloaded the runtime's files (about 16 MB), and the digest
// proves the copy is this build's. Only when there is no such copy, or it is another build's
// (the digest check fails), is the server asked again, revalidating (never a stale copy); a
// server caught between two versions then fails the install, which is retried later. A file
// without a digest always comes from the server.
async function fetchForCache(url, integrity) {
  const init = { credentials: "same-origin", priority: "low" };
  if (integrity) {
    try {
      const cached = await fetch(new Request(url, { ...init, cache: "force-cache", integrity }));
      if (cached.ok) return cached;
    } catch (err) { /* no copy, or not this build's bytes: ask the server */ }
    init.integrity = integrity;
  }
  return fetch(new Request(url, { ...init, cache: "no-cache" }));
}

async function precache() {
  const cache = await caches.open(CACHE);
  const queue = PRECACHE.slice();
  let failed = false;
  async function next() {
    for (let item = queue.shift(); item && !failed; item = queue.shift()) {
      const [path, integrity] = item;
      const url = new URL(path, SCOPE).href;
      let response = await fetchForCache(url, integrity);
      if (!response.ok) throw new Error(url + ": HTTP " + response.status);
      if (response.redirected) {
        // A redirected response cannot answer a navigation: keep the body and headers only.
        response = new Response(await response.blob(), { status: response.status, headers: response.headers });
      }
      await cache.put(url, response);
    }
  }
  try {
    await Promise.all(Array.from({ length: PARALLEL }, next));
  } catch (err) {
    failed = true;
    await caches.delete(CACHE);
    throw err;
  }
}

self.addEventListener("install", (event) => {
  event.waitUntil(precache());
});

self.addEventListener("activate", (event) => {
  event.waitUntil((async () => {
    for (const name of await caches.keys()) {
      if (name.startsWith(PREFIX) && name !== CACHE) await caches.delete(name);
    }
    await self.clients.claim();
  })());
});

self.addEventListener("message", (event) => {
  const data = event.data || {};
  if (data.type === "activate-new-version") self.skipWaiting();
  else if (data.type === "version" && event.ports[0]) event.ports[0].postMessage(META);
});

// The cache key of a URL: no query or fragment (calculator pages keep their inputs in the query),
// folder URLs for index pages.
function cacheKey(url) {
  let path = url.pathname;
  if (path.endsWith("/index.html")) path = path.slice(0, -"index.html".length);
  return url.origin + path;
}

function offlinePage() {
  const html = "<!doctype html><html lang=\"en\"><meta charset=\"utf-8\">" +
    "<meta name=\"viewport\" content=\"width=device-width, initial-scale=1\"><title>Not available offline</title>" +
    "<body style=\"font-family: system-ui, sans-serif; margin: 2rem; max-width: 40rem\">" +
    "<h1>Not in the offline copy</h1><p>This address is not part of the offline copy of Couplewise, " +
    "and the server cannot be reached.</p><p><a href=\"" + SCOPE + "\">Open the Couplewise start page</a></p></body></html>";
  return new Response(html, { status: 503, headers: { "Content-Type": "text/html; charset=utf-8" } });
}

// mkdocs writes absolute addresses into sitemap.xml from `site_url` (mkdocs.yml), which names no
// real host (the same build serves any host and sub-path). Material's instant navigation needs
// the sitemap to list the pages at their real addresses: rewrite them to this copy's scope.
const SITEMAP_BASE = "https://couplewise.invalid/";

async function sitemapHere(response) {
  const text = (await response.text()).split(SITEMAP_BASE).join(SCOPE);
  return new Response(text, { status: 200, headers: { "Content-Type": "application/xml; charset=utf-8" } });
}

async function respond(request, url) {
  const cache = await caches.open(CACHE);
  const key = cacheKey(url);
  // ignoreVary: a server that compresses sends "Vary: Accept-Encoding", which is not a reason to
  // miss the precached copy.
  let hit = await cache.match(key, { ignoreVary: true });
  if (hit && key === SCOPE + "sitemap.xml") return sitemapHere(hit);
  if (hit) return hit;
  if (!url.pathname.endsWith("/") && !/\.[A-Za-z0-9]+$/.test(url.pathname)) {
    // A folder without its slash: send the browser to the folder, so relative links resolve.
    hit = await cache.match(key + "/", { ignoreVary: true });
    if (hit) return Response.redirect(key + "/" + url.search + url.hash, 301);
  }
  try {
    return await fetch(request);
  } catch (err) {
    if (request.mode === "navigate") return offlinePage();
    throw err;
  }
}

self.addEventListener("fetch", (event) => {
  const request = event.request;
  if (request.method !== "GET") return; // only same-origin GETs inside the site are answered
  const url = new URL(request.url);
  if (url.origin !== self.location.origin || !url.href.startsWith(SCOPE)) return;
  event.respondWith(respond(request, url));
});
