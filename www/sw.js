// Nightfield service worker: precache the shell, the wasm engine and the catalogs in one
// versioned cache; serve from it first so the app works with no network after one visit.
// A new VERSION installs beside the old one and waits until the page says "reload now".
const VERSION = '0.1.0-5';
const CACHE = `nightfield-${VERSION}`;

self.addEventListener('install', (event) => {
  event.waitUntil((async () => {
    const list = await (await fetch('data-tiers.json', { cache: 'no-cache' })).json();
    const cache = await caches.open(CACHE);
    await cache.addAll(list.shell.map((u) => new Request(u, { cache: 'no-cache' })));
    for (const tier of list.tiers) {
      await cache.addAll(tier.catalogs.map((c) => new Request(c.file, { cache: 'no-cache' })));
    }
    // First install: take over at once. An update waits for the page to ask.
    if (!self.registration.active) await self.skipWaiting();
  })());
});

self.addEventListener('activate', (event) => {
  event.waitUntil((async () => {
    for (const name of await caches.keys()) {
      if (name.startsWith('nightfield-') && name !== CACHE) await caches.delete(name);
    }
    await self.clients.claim();
    for (const c of await self.clients.matchAll()) c.postMessage({ type: 'precached', version: VERSION });
  })());
});

self.addEventListener('message', (event) => {
  if (event.data === 'skip-waiting') self.skipWaiting();
  if (event.data === 'version' && event.source) event.source.postMessage({ type: 'version', version: VERSION });
});

self.addEventListener('fetch', (event) => {
  const req = event.request;
  if (req.method !== 'GET' || new URL(req.url).origin !== self.location.origin) return;
  event.respondWith((async () => {
    const cache = await caches.open(CACHE);
    const hit = await cache.match(req, { ignoreSearch: true });
    if (hit) return hit;
    if (req.mode === 'navigate') {
      const shell = await cache.match('index.html');
      try { return await fetch(req); } catch (e) { if (shell) return shell; throw e; }
    }
    return fetch(req);
  })());
});
