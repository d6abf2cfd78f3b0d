// Keeps one complete, versioned copy of the manual for use without a network.
// self.OFFLINE_COPY = {version, files} is written above this code at build time.
/* global self, caches, fetch, Response, URL */
const copy = self.OFFLINE_COPY;
const prefix = 'stepwright-manual-';
const cacheName = prefix + copy.version;
const metaUrl = '/__offline/meta.json';
const manifestUrl = '/offline-manifest.json';
// On a weak plant Wi-Fi a page that does not arrive in this time is served from the offline copy.
const networkWaitMs = 3500;

self.addEventListener('install', (event) => {
  event.waitUntil((async () => {
    const cache = await caches.open(cacheName);
    let stored = 0;
    // Small batches: progress can be shown, and one slow file does not hold the rest.
    for (let i = 0; i < copy.files.length; i += 8) {
      const batch = copy.files.slice(i, i + 8);
      await Promise.all(batch.map(async (url) => {
        const response = await fetch(new Request(url, { cache: 'reload' }));
        if (!response.ok) throw new Error(`offline copy: ${url} answered ${response.status}`);
        await cache.put(url, response);
      }));
      stored += batch.length;
      await tell({ type: 'offline-progress', stored, total: copy.files.length });
    }
    let builtAt = null;
    try {
      const published = await (await fetch(manifestUrl, { cache: 'no-store' })).json();
      if (published.version === copy.version) builtAt = published.builtAt;
    } catch { /* the build time is extra information only */ }
    const meta = { version: copy.version, builtAt, cachedAt: new Date().toISOString(), files: copy.files.length };
    await cache.put(metaUrl, new Response(JSON.stringify(meta), { headers: { 'content-type': 'application/json' } }));
    await self.skipWaiting();
  })());
});

self.addEventListener('activate', (event) => {
  event.waitUntil((async () => {
    for (const name of await caches.keys()) if (name.startsWith(prefix) && name !== cacheName) await caches.delete(name);
    await self.clients.claim();
    await tell({ type: 'offline-ready', version: copy.version });
  })());
});

self.addEventListener('fetch', (event) => {
  const request = event.request;
  if (request.method !== 'GET') return;
  const url = new URL(request.url);
  if (url.origin !== self.location.origin) return;
  if (url.pathname === manifestUrl) return; // always asked of the network: it tells whether a newer manual exists
  if (url.pathname === metaUrl) {
    event.respondWith(fromCopy(url).then((r) => r || new Response('null', { status: 404, headers: { 'content-type': 'application/json' } })));
    return;
  }
  if (request.mode === 'navigate') event.respondWith(networkFirst(request, url));
  else event.respondWith(fromCopy(url).then((r) => r || fetch(request)));
});

/** Pages come from the network when it answers in time, so an online reader always sees the current revision. */
async function networkFirst(request, url) {
  const cached = fromCopy(url);
  try {
    const response = await Promise.race([
      fetch(request),
      new Promise((_, reject) => setTimeout(() => reject(new Error('slow network')), networkWaitMs)),
    ]);
    if (response.ok || !(await cached)) return response;
    return (await cached) || response;
  } catch {
    const hit = await cached;
    if (hit) return hit;
    return notInCopy(url);
  }
}

/** Offline, a page that is not part of the manual still answers, and says where to go instead. */
function notInCopy(url) {
  const path = url.pathname.replace(/[&<>"]/g, '');
  const html = `<!doctype html><html lang="en"><meta charset="utf-8"><meta name="viewport" content="width=device-width, initial-scale=1">`
    + `<title>Not in the offline copy</title><body style="font: 1.2rem/1.5 system-ui, sans-serif; margin: 2rem; max-width: 40rem">`
    + `<h1>Not in the offline copy</h1><p>There is no network, and <code>${path}</code> is not part of the manual saved on this device.</p>`
    + `<p><a href="/" style="display: inline-block; min-height: 44px; padding: 0.5rem 0">Open the procedure list</a></p></body></html>`;
  return new Response(html, { status: 503, headers: { 'content-type': 'text/html; charset=utf-8' } });
}

/** Looks a URL up in this version's copy, trying the forms a folder page can be asked for; search strings ignored. */
async function fromCopy(url) {
  const cache = await caches.open(cacheName);
  const path = url.pathname;
  const candidates = [path];
  if (path.endsWith('/index.html')) candidates.push(path.slice(0, -'index.html'.length));
  else if (!path.endsWith('/') && !/\.[a-z0-9]+$/i.test(path)) candidates.push(path + '/');
  for (const candidate of candidates) {
    const hit = await cache.match(new URL(candidate, url.origin).href, { ignoreSearch: true });
    if (hit) return hit;
  }
  return undefined;
}

async function tell(message) {
  for (const client of await self.clients.matchAll({ includeUncontrolled: true })) client.postMessage(message);
}
