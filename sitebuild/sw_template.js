// Couplewise service worker (generated at build time from sitebuild/sw_template.js).
// Precaches the whole built site (pages, runtime, calc wheel, dataset) under one cache named
// from the build's content hash, so data and calc can never be mixed across versions.
const VERSION = "__VERSION__";
const CACHE = "couplewise-" + VERSION;
const PRECACHE = __PRECACHE__;
const SCOPE = new URL("./", self.location).href;

self.addEventListener("install", (event) => {
  event.waitUntil(caches.open(CACHE).then((cache) => cache.addAll(PRECACHE.map((p) => new URL(p, SCOPE).href))));
});

self.addEventListener("activate", (event) => {
  event.waitUntil((async () => {
    for (const name of await caches.keys()) {
      if (name.startsWith("couplewise-") && name !== CACHE) await caches.delete(name);
    }
    await self.clients.claim();
  })());
});

self.addEventListener("message", (event) => {
  if (event.data && event.data.type === "activate-new-version") self.skipWaiting();
  if (event.data && event.data.type === "version" && event.ports[0]) event.ports[0].postMessage(VERSION);
});

self.addEventListener("fetch", (event) => {
  const req = event.request;
  if (req.method !== "GET") return;
  const url = new URL(req.url);
  if (url.origin !== self.location.origin || !url.href.startsWith(SCOPE)) return;
  event.respondWith((async () => {
    const cache = await caches.open(CACHE);
    let hit = await cache.match(req, { ignoreSearch: true, ignoreVary: true });
    if (!hit && url.pathname.endsWith("/index.html")) {
      hit = await cache.match(url.href.replace(/index\.html(\?.*)?$/, ""), { ignoreSearch: true });
    }
    if (!hit && !url.pathname.endsWith("/") && !/\.[a-z0-9]+$/i.test(url.pathname)) {
      hit = await cache.match(url.origin + url.pathname + "/", { ignoreSearch: true });
    }
    if (hit) return hit;
    try {
      return await fetch(req);
    } catch (err) {
      if (req.mode === "navigate") {
        const home = await cache.match(SCOPE);
        if (home) return home;
      }
      throw err;
    }
  })());
});
