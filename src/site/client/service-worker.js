// Keeps a copy of the manual on the tablet for use without a network, and brings it up to date file by file.
//
// The build publishes offline-manifest.json (the publication: version, date, size) and offline-files.json (every
// file with a content hash, its area, and whether it is an emergency procedure). Files are stored by their hash,
// so an update downloads only content the tablet does not hold yet, and a download cut off halfway resumes where
// it stopped. The copy in use is one record naming every file's hash: replacing that record is the switch from
// the old manual to the new, all at once. A page on screen keeps reading the copy it was shown from (its search
// index, its styles) until it is reloaded, so an old page never meets a new index.
//
// Everything is resolved against the worker's own scope: the manual may live under a sub-path such as /manual/.
/* global self, caches, fetch, Response, Request, URL, crypto */
const scope = new URL(self.registration.scope);
const at = (relative) => new URL(relative, scope).href;
const publicationUrl = at('offline-manifest.json');
const listUrl = at('offline-files.json');
const own = new Set(['sw.js', 'offline-manifest.json', 'offline-files.json']);
const statusPath = '__offline/status.json';
// Two manuals under two sub-paths of one site keep separate copies.
const filesCacheName = `stepwright-offline-files ${scope.pathname}`;
const stateCacheName = `stepwright-offline-state ${scope.pathname}`;
const legacyPrefix = 'stepwright-manual-';
const heldKey = at('__offline/held.json');
const settingsKey = at('__offline/settings.json');
const copyKey = (version) => at(`__offline/copy-${version}.json`);
const fileKey = (hash) => at(`__offline/file/${hash}`);
// On a weak plant Wi-Fi a page that does not arrive in this time is served from the offline copy.
const networkWaitMs = 3500;
// How long a page waits to learn whether a newer manual is published before it is shown from the copy.
const checkWaitMs = 1500;
// Files fetched at the same time during an update.
const parallel = 6;

/** @type {null | {version: string, builtAt: string, savedAt: string, files: any[], areas: any[], byUrl?: Map<string, any>}} */
let held = null;
let settings = defaults();
let loading = null;
let checking = null;
let updating = null;
let again = false;
let saving = Promise.resolve();
// The copy and choice last found complete in this run of the worker: nothing to look at until one changes.
let settled = '';
const retained = new Map();

function defaults() {
  return { choice: { mode: 'whole', areas: [] }, opened: [], latest: null, lastCheck: null, download: null, pins: {} };
}

self.addEventListener('install', () => { void self.skipWaiting(); });

self.addEventListener('activate', (event) => {
  event.waitUntil(self.clients.claim());
});

self.addEventListener('message', (event) => {
  const data = event.data ?? {};
  if (data.type === 'check') event.waitUntil(checkAndUpdate().catch(() => undefined));
  if (data.type === 'choose') {
    event.waitUntil((async () => {
      await load();
      const areas = Array.isArray(data.areas) ? data.areas.filter((a) => typeof a === 'string').sort() : [];
      settings.choice = data.mode === 'areas' ? { mode: 'areas', areas } : { mode: 'whole', areas: [] };
      await save();
      await tell({ type: 'offline-status' });
      await checkAndUpdate().catch(() => runUpdate().catch(() => undefined));
    })());
  }
});

self.addEventListener('fetch', (event) => {
  const request = event.request;
  if (request.method !== 'GET') return;
  const url = new URL(request.url);
  if (url.origin !== scope.origin) return;
  const rel = relativeOf(url);
  if (rel === null || own.has(rel)) return; // the publication and the worker are always asked of the network
  if (rel === statusPath) event.respondWith(load().then(() => statusResponse(event.clientId)));
  else if (request.mode === 'navigate') {
    // Work that goes on after the page is answered (keeping an opened page, the update) keeps the worker alive.
    const after = [];
    const answer = navigate(event, rel, after);
    event.respondWith(answer);
    event.waitUntil(answer.then(() => Promise.all(after)).catch(() => undefined));
    event.waitUntil(checkAndUpdate().catch(() => undefined));
  } else event.respondWith(subresource(event, rel));
});

/** A path inside the manual, relative to its root ("./" for the home page); null outside the manual. */
function relativeOf(url) {
  if (!url.pathname.startsWith(scope.pathname)) return null;
  let rel = url.pathname.slice(scope.pathname.length);
  try { rel = decodeURIComponent(rel); } catch { /* kept as asked */ }
  if (rel === '' || rel === 'index.html') return './';
  if (rel.endsWith('/index.html')) return rel.slice(0, -'index.html'.length);
  return rel;
}

function lookup(copy, rel) {
  if (!copy) return undefined;
  const entry = copy.byUrl.get(rel);
  if (entry || rel.endsWith('/') || /\.[a-z0-9]+$/i.test(rel)) return entry;
  return copy.byUrl.get(`${rel}/`);
}

/** Pages: from the copy when it is the newest manual known (or no answer came in time), else from the network. */
async function navigate(event, rel, after) {
  await load();
  const clientId = event.resultingClientId || event.clientId;
  const latest = await Promise.race([check().catch(() => null), sleep(checkWaitMs).then(() => null)]);
  const copy = held;
  const newer = latest !== null && (!copy || latest.version !== copy.version);
  const entry = lookup(copy, rel);
  const stored = entry ? await readFile(entry.hash) : undefined;
  if (stored && !newer) return served(stored, entry, copy.version, clientId);
  try {
    const fromNetwork = fetch(event.request);
    const response = await (stored ? Promise.race([fromNetwork, sleep(networkWaitMs).then(() => { throw new Error('slow network'); })]) : fromNetwork);
    if (response.ok || !stored) {
      await pin(clientId, newer || !copy ? 'network' : copy.version);
      if (response.ok && copy && !newer && entry) after.push(keepOpened(copy, entry, response.clone()).catch(() => undefined));
      return response;
    }
  } catch {
    /* no network, or too slow: the copy answers */
  }
  if (stored) return served(stored, entry, copy.version, clientId);
  const legacy = await fromLegacyCopy(event.request);
  return legacy ?? notInCopy(rel);
}

/** Styles, scripts and the search index: from the copy the page was shown from, so they always match it. */
async function subresource(event, rel) {
  await load();
  const pinned = settings.pins[event.clientId];
  if (pinned === 'network') {
    try {
      const response = await Promise.race([fetch(event.request), sleep(networkWaitMs).then(() => { throw new Error('slow network'); })]);
      if (response.ok) return response;
    } catch { /* the copy answers */ }
  }
  const copy = pinned && pinned !== 'network' && pinned !== held?.version ? (await retainedCopy(pinned)) ?? held : held;
  const entry = lookup(copy, rel);
  const stored = entry ? await readFile(entry.hash) : undefined;
  if (stored) return served(stored, entry, copy.version);
  try {
    return await fetch(event.request);
  } catch {
    const legacy = await fromLegacyCopy(event.request);
    return legacy ?? new Response('', { status: 503, statusText: 'Not in the offline copy' });
  }
}

function served(stored, entry, version, clientId) {
  if (clientId) void pin(clientId, version);
  const headers = new Headers(stored.headers);
  headers.set('x-offline-copy', version);
  return new Response(stored.body, { status: 200, headers });
}

/** Offline, a page that is not part of the copy still answers, and says where to go instead. */
function notInCopy(rel) {
  const path = (scope.pathname + (rel === './' ? '' : rel)).replace(/[&<>"]/g, '');
  const html = `<!doctype html><html lang="en"><meta charset="utf-8"><meta name="viewport" content="width=device-width, initial-scale=1">`
    + `<title>Not in the offline copy</title><body style="font: 1.2rem/1.5 system-ui, sans-serif; margin: 2rem; max-width: 40rem">`
    + `<h1>Not in the offline copy</h1><p>There is no network, and <code>${path}</code> is not part of the manual saved on this device.</p>`
    + `<p><a href="${scope.pathname}" style="display: inline-block; min-height: 44px; padding: 0.5rem 0">Open the procedure list</a></p></body></html>`;
  return new Response(html, { status: 503, headers: { 'content-type': 'text/html; charset=utf-8' } });
}

/** A copy saved by the earlier worker, which kept one cache per version: read until the first update is complete. */
async function fromLegacyCopy(request) {
  if (held) return undefined;
  for (const name of await caches.keys()) {
    if (!name.startsWith(legacyPrefix)) continue;
    const hit = await (await caches.open(name)).match(request, { ignoreSearch: true });
    if (hit) return hit;
  }
  return undefined;
}

// ---- State -------------------------------------------------------------------------------------------------

function load() {
  if (!loading) {
    loading = (async () => {
      const cache = await caches.open(stateCacheName);
      const record = await readJson(cache, heldKey);
      held = record ? indexed(record) : null;
      settings = { ...defaults(), ...((await readJson(cache, settingsKey)) ?? {}) };
      // A download cut off when the worker was stopped is shown as waiting, and resumes on the next check.
      if (settings.download) settings.download.active = false;
    })().catch((error) => { loading = null; throw error; });
  }
  return loading;
}

function indexed(record) {
  record.byUrl = new Map(record.files.map((e) => [e.url, e]));
  return record;
}

async function readJson(cache, key) {
  const hit = await cache.match(key);
  if (!hit) return null;
  try { return await hit.json(); } catch { return null; }
}

function jsonResponse(value, status = 200) {
  return new Response(JSON.stringify(value, (k, v) => (k === 'byUrl' ? undefined : v)), { status, headers: { 'content-type': 'application/json' } });
}

/** Settings are written one after another, in the order they changed. */
function save() {
  const snapshot = jsonResponse(settings);
  saving = saving.then(async () => { await (await caches.open(stateCacheName)).put(settingsKey, snapshot); }).catch(() => undefined);
  return saving;
}

async function pin(clientId, version) {
  if (!clientId || settings.pins[clientId] === version) return;
  settings.pins[clientId] = version;
  await save();
}

async function retainedCopy(version) {
  if (!retained.has(version)) {
    const record = await readJson(await caches.open(stateCacheName), copyKey(version));
    retained.set(version, record ? indexed(record) : null);
  }
  return retained.get(version) ?? undefined;
}

async function readFile(hash) {
  return (await caches.open(filesCacheName)).match(fileKey(hash));
}

async function storedHashes() {
  const keys = await (await caches.open(filesCacheName)).keys();
  return new Set(keys.map((r) => r.url.slice(r.url.lastIndexOf('/') + 1)));
}

// ---- Checking and updating ---------------------------------------------------------------------------------

/**
 * Reads the publication record (one small file). Calls while it is being read share the answer; a call after it
 * arrived reads it again, so a publication that appears between two pages is never missed.
 */
function check() {
  if (!checking) {
    checking = (async () => {
      await load();
      const now = new Date().toISOString();
      try {
        const response = await fetch(publicationUrl, { cache: 'no-store' });
        if (!response.ok) throw new Error(`the server answered ${response.status}`);
        const publication = await response.json();
        if (typeof publication?.version !== 'string') throw new Error('the publication record has no version');
        settings.latest = { version: publication.version, builtAt: publication.builtAt ?? null, files: publication.files, bytes: publication.bytes, seenAt: now };
        settings.lastCheck = { at: now, ok: true };
        await save();
        return settings.latest;
      } catch (error) {
        settings.lastCheck = { at: now, ok: false, message: String(error?.message ?? error) };
        await save();
        throw error;
      }
    })();
    const done = () => { checking = null; };
    checking.then(done, done);
  }
  return checking;
}

function checkAndUpdate() {
  return check().then(() => runUpdate());
}

/**
 * Brings the copy to the newest publication known and the tablet's choice; one run at a time. A call during a
 * run (a new choice, a newer publication) makes the run go round once more, so nothing asked for is dropped.
 */
function runUpdate() {
  if (updating) {
    again = true;
    return updating;
  }
  updating = (async () => {
    await load();
    for (let round = 0; round < 5; round++) {
      again = false;
      const target = settings.latest?.version ?? held?.version;
      if (!target) return;
      const list = held && held.version === target ? held : await fetchList(target);
      await bringTo(list);
      if (!again && (settings.latest?.version ?? target) === target) return;
    }
  })().finally(() => { updating = null; });
  return updating;
}

async function fetchList(version) {
  const response = await fetch(listUrl, { cache: 'no-store' });
  if (!response.ok) throw new Error(`the file list answered ${response.status}`);
  const list = await response.json();
  if (list.format !== 1 || !Array.isArray(list.files)) throw new Error('the file list is in an unknown format');
  // Published between the two reads (or the two files do not belong together): the next check starts again.
  if (list.version !== version) throw new Error('the file list belongs to another publication; publishing may be under way');
  return list;
}

/** What this tablet keeps of a publication: everything, or the frame, the emergency procedures, its areas and opened pages. */
function selection(list) {
  const choice = settings.choice;
  if (choice.mode !== 'areas') return list.files;
  const areas = new Set(choice.areas);
  const opened = new Set(settings.opened);
  return list.files.filter((e) => !e.area || e.always || areas.has(e.area) || opened.has(e.page ?? e.url));
}

async function bringTo(list) {
  const wanted = selection(list);
  const state = `${list.version} ${JSON.stringify(settings.choice)} ${settings.opened.length}`;
  if (held && held.version === list.version && settled === state) return;
  const have = await storedHashes();
  const missing = [];
  const queued = new Set();
  for (const e of wanted) {
    if (have.has(e.hash) || queued.has(e.hash)) continue;
    queued.add(e.hash);
    missing.push(e);
  }
  if (missing.length > 0) {
    const remaining = missing.reduce((n, e) => n + e.bytes, 0);
    const earlier = settings.download?.version === list.version ? settings.download : null;
    // A download that resumes keeps counting from where it stopped.
    const files = Math.max(earlier?.files ?? 0, missing.length);
    const bytes = Math.max(earlier?.bytes ?? 0, remaining);
    settings.download = {
      version: list.version, builtAt: list.builtAt, active: true, files, done: files - missing.length,
      bytes, doneBytes: bytes - remaining, failed: null, resumed: earlier !== null,
    };
    await save();
    await tell({ type: 'offline-status' });
    try {
      await fetchAll(missing, list.version);
    } catch (error) {
      settings.download.active = false;
      settings.download.failed = String(error?.message ?? error);
      await save();
      await tell({ type: 'offline-status' });
      throw error;
    }
  }
  const switched = !held || held.version !== list.version;
  if (switched) await switchTo(list);
  settings.download = null;
  await save();
  await collectGarbage();
  settled = state;
  await tell({ type: switched ? 'offline-ready' : 'offline-status', version: list.version });
}

async function fetchAll(entries, version) {
  const files = await caches.open(filesCacheName);
  let next = 0;
  let lastTold = 0;
  let stopped = false;
  const worker = async () => {
    while (next < entries.length && !stopped) {
      const entry = entries[next++];
      const { bytes, type } = await fetchChecked(entry, version);
      await files.put(fileKey(entry.hash), new Response(bytes, { headers: { 'content-type': type } }));
      settings.download.done++;
      settings.download.doneBytes += bytes.byteLength;
      if (Date.now() - lastTold > 250 || settings.download.done === entries.length) {
        lastTold = Date.now();
        await save();
        await tell({ type: 'offline-status' });
      }
    }
  };
  // The first failure stops the others from taking more files; files already saved stay for the next attempt.
  const results = await Promise.allSettled(Array.from({ length: Math.min(parallel, entries.length) }, () => worker().catch((error) => {
    stopped = true;
    throw error;
  })));
  const failure = results.find((r) => r.status === 'rejected');
  if (failure) throw failure.reason;
}

/** Fetches one file and checks it against its hash: a file replaced while the tablet saved it is never kept. */
async function fetchChecked(entry, version) {
  for (const cache of ['no-cache', 'reload']) {
    const response = await fetch(new Request(at(entry.url), { cache, headers: { 'x-stepwright-offline': version } }));
    if (!response.ok) throw new Error(`${entry.url} answered ${response.status}`);
    const bytes = await response.arrayBuffer();
    if ((await hashOf(bytes)) === entry.hash) return { bytes, type: response.headers.get('content-type') ?? 'application/octet-stream' };
  }
  throw new Error(`${entry.url} changed while it was saved; the next check starts again`);
}

async function hashOf(bytes) {
  const digest = new Uint8Array(await crypto.subtle.digest('SHA-256', bytes));
  return Array.from(digest, (b) => b.toString(16).padStart(2, '0')).join('').slice(0, 32);
}

/** The switch: every file of the new copy is stored; one write replaces the record pages are read from. */
async function switchTo(list) {
  const state = await caches.open(stateCacheName);
  const previous = held;
  if (previous) {
    // Pages on screen that were shown from the old copy keep reading it until they are closed.
    const live = await liveClients();
    if (Object.entries(settings.pins).some(([id, v]) => v === previous.version && live.has(id))) {
      await state.put(copyKey(previous.version), jsonResponse(previous));
    }
  }
  const record = { version: list.version, builtAt: list.builtAt, savedAt: new Date().toISOString(), files: list.files, areas: list.areas ?? [] };
  await state.put(heldKey, jsonResponse(record));
  held = indexed(record);
  for (const name of await caches.keys()) if (name.startsWith(legacyPrefix)) await caches.delete(name);
}

async function liveClients() {
  return new Set((await self.clients.matchAll({ includeUncontrolled: true, type: 'window' })).map((c) => c.id));
}

/** Deletes stored files no copy in use needs: gone from the manual, outside the choice, or left by closed pages. */
async function collectGarbage() {
  const live = await liveClients();
  for (const id of Object.keys(settings.pins)) if (!live.has(id)) delete settings.pins[id];
  await save();
  const needed = new Set(held ? selection(held).map((e) => e.hash) : []);
  const pinned = new Set(Object.values(settings.pins));
  const state = await caches.open(stateCacheName);
  for (const request of await state.keys()) {
    const version = /__offline\/copy-([0-9a-f]+)\.json$/.exec(request.url)?.[1];
    if (!version) continue;
    if (pinned.has(version) && version !== held?.version) {
      for (const e of (await retainedCopy(version))?.files ?? []) needed.add(e.hash);
    } else {
      await state.delete(request);
      retained.delete(version);
    }
  }
  const files = await caches.open(filesCacheName);
  for (const request of await files.keys()) {
    if (!needed.has(request.url.slice(request.url.lastIndexOf('/') + 1))) await files.delete(request);
  }
}

/** In a chosen-areas copy, a page opened from the network is kept, with its search fragment, from then on. */
async function keepOpened(copy, entry, response) {
  if (settings.choice.mode !== 'areas' || selection(copy).includes(entry)) return;
  const page = entry.page ?? entry.url;
  if (!settings.opened.includes(page)) {
    settings.opened.push(page);
    settings.opened.sort();
    await save();
  }
  const files = await caches.open(filesCacheName);
  const bytes = await response.arrayBuffer();
  if ((await hashOf(bytes)) === entry.hash) {
    await files.put(fileKey(entry.hash), new Response(bytes, { headers: { 'content-type': response.headers.get('content-type') ?? 'text/html' } }));
  }
  for (const fragment of copy.files) {
    if (fragment.page !== page || (await files.match(fileKey(fragment.hash)))) continue;
    const checked = await fetchChecked(fragment, copy.version);
    await files.put(fileKey(fragment.hash), new Response(checked.bytes, { headers: { 'content-type': checked.type } }));
  }
  await tell({ type: 'offline-status' });
}

// ---- What the pages are told -------------------------------------------------------------------------------

async function statusResponse(clientId) {
  const have = await storedHashes();
  let copy = null;
  if (held) {
    const kept = selection(held).filter((e) => have.has(e.hash));
    copy = {
      version: held.version, builtAt: held.builtAt, savedAt: held.savedAt,
      files: held.files.length, bytes: held.files.reduce((n, e) => n + e.bytes, 0),
      keptFiles: kept.length, keptBytes: kept.reduce((n, e) => n + e.bytes, 0),
    };
  }
  return jsonResponse({
    scope: scope.pathname, copy, page: settings.pins[clientId] ?? null, choice: settings.choice, areas: held?.areas ?? [], opened: settings.opened.length,
    latest: settings.latest, lastCheck: settings.lastCheck, download: settings.download,
  });
}

async function tell(message) {
  for (const client of await self.clients.matchAll({ includeUncontrolled: true })) client.postMessage(message);
}

function sleep(ms) {
  return new Promise((resolve) => setTimeout(resolve, ms));
}
