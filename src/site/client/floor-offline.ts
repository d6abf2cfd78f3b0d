// Registers the service worker and tells the reader how old the offline copy is, and whether a newer manual exists.
interface OfflineMeta { version: string; builtAt: string | null; cachedAt: string; files: number }
interface Published { version: string; builtAt: string; seenAt?: string }

const seenKey = 'stepwright:published-seen';

export function setUpOffline(root: Document = document): void {
  const found = root.querySelector<HTMLElement>('[data-offline-status]');
  const stale = root.querySelector<HTMLElement>('[data-offline-stale]');
  if (!('serviceWorker' in navigator) || !found) return;
  const status: HTMLElement = found;
  const say = (text: string) => { status.textContent = text; status.hidden = false; };

  navigator.serviceWorker.addEventListener('message', (event) => {
    const data = event.data as { type?: string; stored?: number; total?: number; version?: string };
    if (data.type === 'offline-progress') say(`Saving the manual for offline use: ${data.stored} of ${data.total} files`);
    if (data.type === 'offline-ready') {
      const before = status.dataset.offlineVersion;
      void refresh().then(() => {
        // The page on screen came from the older manual: say so until it is reloaded.
        if (stale && before && data.version && data.version !== before) {
          stale.textContent = 'A newer manual has been saved on this device. Reload the page to read the current revision.';
          stale.hidden = false;
        }
      });
    }
  });
  navigator.serviceWorker.register('/sw.js', { scope: '/', updateViaCache: 'none' }).catch(() => {
    say('This browser cannot keep an offline copy of the manual.');
  });

  async function refresh(): Promise<void> {
    const meta = await readMeta();
    const published = await readPublished();
    if (!meta) {
      if (navigator.serviceWorker.controller === null) say('No offline copy on this device yet. Keep this page open while it is saved.');
      return;
    }
    say(`Offline copy made ${formatTime(meta.cachedAt)}${meta.builtAt ? ` (manual of ${formatTime(meta.builtAt)})` : ''}.`);
    status.dataset.offlineVersion = meta.version;
    if (!stale) return;
    // Another version that is not known to be older counts as newer: two publications on one build date
    // carry the same date, and a copy that differs from what the server publishes is never the safe one.
    const older = published !== null && published.version !== meta.version && !(meta.builtAt && published.builtAt < meta.builtAt);
    stale.hidden = !older;
    if (older) {
      stale.textContent = `This offline copy is older than the published manual seen ${formatTime(published.seenAt ?? published.builtAt)} `
        + `(manual of ${formatTime(published.builtAt)}). Check the revision of a procedure before use; `
        + 'connect to the plant network and reload to update the offline copy.';
    }
  }
  void refresh();
}

async function readMeta(): Promise<OfflineMeta | null> {
  try {
    const response = await fetch('/__offline/meta.json', { cache: 'no-store' });
    return response.ok ? ((await response.json()) as OfflineMeta | null) : null;
  } catch {
    return null;
  }
}

/** The newest published manual: asked of the server when it answers, else the last one seen on this device. */
async function readPublished(): Promise<Published | null> {
  let remembered: Published | null = null;
  try { remembered = JSON.parse(localStorage.getItem(seenKey) ?? 'null') as Published | null; } catch { /* none */ }
  try {
    const response = await fetch('/offline-manifest.json', { cache: 'no-store' });
    if (!response.ok) return remembered;
    const fresh = (await response.json()) as Published;
    const seen = { version: fresh.version, builtAt: fresh.builtAt, seenAt: new Date().toISOString() };
    if (!remembered || remembered.version !== seen.version || remembered.builtAt <= seen.builtAt) {
      try { localStorage.setItem(seenKey, JSON.stringify(seen)); } catch { /* private mode */ }
      return seen;
    }
    return remembered;
  } catch {
    return remembered;
  }
}

/** Local date and time; a build date (midnight UTC, no time of day) is shown as a date only. */
export function formatTime(iso: string): string {
  const d = new Date(iso);
  if (Number.isNaN(d.getTime())) return iso;
  if (/T00:00:00(\.000)?Z$/.test(iso)) return iso.slice(0, 10);
  const pad = (n: number) => String(n).padStart(2, '0');
  return `${d.getFullYear()}-${pad(d.getMonth() + 1)}-${pad(d.getDate())} ${pad(d.getHours())}:${pad(d.getMinutes())}`;
}
