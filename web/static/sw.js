// Fieldfit service worker: keeps every file of one release on the device
// so that the tool starts with no network, and replaces the whole set when
// a new release arrives. The bundle builder fills in the version and the
// file list; the cache name follows the content hash, so two releases never
// share a cache.
"use strict";

const VERSION = "__FIELDFIT_VERSION__";
const FILES = __FIELDFIT_FILES__;
const PREFIX = "fieldfit-shell-";
const CACHE = PREFIX + VERSION;

self.addEventListener("install", (event) => {
  event.waitUntil(
    caches.open(CACHE).then((cache) =>
      // cache: "reload" skips the HTTP cache, so the set is all of this release.
      cache.addAll(FILES.map((name) => new Request(name, { cache: "reload" })))
    )
  );
});

self.addEventListener("activate", (event) => {
  event.waitUntil(
    caches.keys()
      .then((keys) => Promise.all(
        keys.filter((key) => key.startsWith(PREFIX) && key !== CACHE).map((key) => caches.delete(key))
      ))
      .then(() => self.clients.claim())
  );
});

// The page asks a waiting release to take over when the user says so.
self.addEventListener("message", (event) => {
  if (event.data && event.data.type === "fieldfit-activate") {
    self.skipWaiting();
  }
});

self.addEventListener("fetch", (event) => {
  const request = event.request;
  if (request.method !== "GET") {
    return;
  }
  const url = new URL(request.url);
  if (url.origin !== self.location.origin) {
    return;
  }
  event.respondWith(respond(request, url));
});

async function respond(request, url) {
  const cache = await caches.open(CACHE);
  const scope = new URL(self.registration.scope);
  let hit;
  if (request.mode === "navigate" || url.pathname === scope.pathname) {
    hit = await cache.match(new URL("index.html", scope).href);
  } else {
    hit = await cache.match(request);
  }
  if (hit) {
    return hit;
  }
  try {
    return await fetch(request);
  } catch (err) {
    return new Response("Fieldfit is offline, and " + url.pathname + " is not stored on this device.\n", {
      status: 503,
      headers: { "Content-Type": "text/plain; charset=utf-8" },
    });
  }
}
