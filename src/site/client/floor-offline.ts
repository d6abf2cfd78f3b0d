// Registers the service worker and says in plain words what the tablet holds: which publication, when it last
// checked for a newer one, and what is downloading. On the offline-copy page it also offers the choice of what
// the tablet keeps (the whole manual or chosen areas), which the worker remembers across reloads.

export interface OfflineStatus {
  scope: string;
  copy: null | {
    version: string; builtAt: string | null; savedAt: string; files: number; bytes: number; keptFiles: number; keptBytes: number;
  };
  choice: { mode: 'whole' | 'areas'; areas: string[] };
  areas: Array<{ area: string; procedures: number; files: number; bytes: number }>;
  opened: number;
  /** The copy the page on screen was shown from, or "network". */
  page?: string;
  latest: null | { version: string; builtAt: string | null; seenAt: string; files?: number; bytes?: number };
  lastCheck: null | { at: string; ok: boolean; message?: string };
  download: null | {
    version: string; builtAt: string | null; active: boolean; files: number; done: number; bytes: number; doneBytes: number; failed: string | null;
  };
}

/** The manual's root, "/" or a sub-path such as "/manual/", as the site was built. */
export function manualBase(): string {
  const base = (import.meta as { env?: { BASE_URL?: string } }).env?.BASE_URL ?? '/';
  return base.endsWith('/') ? base : `${base}/`;
}

export function setUpOffline(root: Document = document): void {
  const found = root.querySelector<HTMLElement>('[data-offline-status]');
  const stale = root.querySelector<HTMLElement>('[data-offline-stale]');
  if (!found) return;
  const status: HTMLElement = found;
  const say = (text: string) => { status.textContent = text; status.hidden = false; };
  if (!('serviceWorker' in navigator)) {
    say('This browser cannot keep an offline copy of the manual.');
    return;
  }
  const base = manualBase();
  const choice = root.querySelector<HTMLElement>('[data-offline-choice]');
  const details = root.querySelector<HTMLElement>('[data-offline-details]');

  let showing = 0;
  async function show(): Promise<void> {
    const mine = ++showing;
    const s = await readStatus(base);
    if (mine !== showing) return;
    if (!s) {
      say(navigator.serviceWorker.controller ? 'No offline copy on this device yet.' : 'No offline copy on this device yet. Keep this page open while it is saved.');
      return;
    }
    say(statusLine(s));
    if (s.copy) status.dataset.offlineVersion = s.copy.version;
    if (stale) {
      const warning = staleWarning(s);
      stale.hidden = warning === null;
      if (warning) stale.textContent = warning;
    }
    if (details) details.replaceChildren(...detailLines(s).map((line) => Object.assign(root.createElement('li'), { textContent: line })));
    // The choice needs the list of areas, which comes with the first saved copy.
    if (choice && s.copy) renderChoice(choice, s, root);
  }

  navigator.serviceWorker.addEventListener('message', () => { void show(); });
  navigator.serviceWorker.addEventListener('controllerchange', () => { void show(); askForCheck(); });
  navigator.serviceWorker.register(`${base}sw.js`, { scope: base, updateViaCache: 'none' }).then(() => {
    askForCheck();
  }, () => {
    say('This browser cannot keep an offline copy of the manual.');
  });
  void show();
  // A tablet left on one page still learns of new publications, and a download cut off by the worker's time
  // limit goes on.
  setInterval(() => { if (root.visibilityState !== 'hidden') askForCheck(); }, 5 * 60_000);
}

function askForCheck(): void {
  void navigator.serviceWorker.ready.then((r) => r.active?.postMessage({ type: 'check' }));
}

async function readStatus(base: string): Promise<OfflineStatus | null> {
  try {
    const response = await fetch(`${base}__offline/status.json`, { cache: 'no-store' });
    if (!response.ok || !(response.headers.get('content-type') ?? '').includes('json')) return null;
    return (await response.json()) as OfflineStatus;
  } catch {
    return null;
  }
}

const count = (n: number, word: string) => `${n.toLocaleString('en-US')} ${word}${n === 1 ? '' : 's'}`;

export function formatBytes(bytes: number): string {
  if (bytes < 1024) return `${bytes} B`;
  if (bytes < 1024 * 1024) return `${(bytes / 1024).toFixed(1)} KB`;
  return `${(bytes / 1024 / 1024).toFixed(1)} MB`;
}

/** One line for the page header. */
export function statusLine(s: OfflineStatus): string {
  const d = s.download;
  if (d && d.active) {
    const what = s.copy ? `the newer manual${d.builtAt ? ` of ${formatTime(d.builtAt)}` : ''}` : 'the manual for offline use';
    return `Saving ${what}: ${d.done.toLocaleString('en-US')} of ${count(d.files, 'file')} (${formatBytes(d.doneBytes)} of ${formatBytes(d.bytes)}).`;
  }
  if (!s.copy) {
    if (d) return `Saving the manual stopped at ${d.done} of ${count(d.files, 'file')}; it goes on when the network returns.`;
    return 'No offline copy on this device yet.';
  }
  const checked = s.lastCheck ? ` Checked ${formatTime(s.lastCheck.at)}${s.lastCheck.ok ? '' : ' (no answer)'}.` : '';
  const paused = d ? ` Update stopped at ${d.done} of ${count(d.files, 'file')}; it goes on when the network returns.` : '';
  return `Offline copy: manual of ${formatTime(s.copy.builtAt ?? s.copy.savedAt)}, saved ${formatTime(s.copy.savedAt)}.${checked}${paused}`;
}

/** The alert under the header, or null: a newer manual exists than the one on screen. */
export function staleWarning(s: OfflineStatus): string | null {
  if (!s.copy) return null;
  if (s.page && s.page !== 'network' && s.page !== s.copy.version) {
    return 'A newer manual has been saved on this device. Reload the page to read the current revision.';
  }
  const latest = s.latest;
  if (!latest || latest.version === s.copy.version) return null;
  return `This offline copy is older than the published manual seen ${formatTime(latest.seenAt)}`
    + `${latest.builtAt ? ` (manual of ${formatTime(latest.builtAt)})` : ''}. Check the revision of a procedure before use; `
    + (s.download?.active ? 'the newer manual is being saved now.' : 'connect to the plant network and reload to update the offline copy.');
}

/** The offline-copy page's list: what is held, what was chosen, when checked, what is downloading. */
export function detailLines(s: OfflineStatus): string[] {
  const lines: string[] = [];
  if (s.copy) {
    lines.push(`This tablet holds the manual published ${formatTime(s.copy.builtAt ?? s.copy.savedAt)} (version ${s.copy.version}), saved ${formatTime(s.copy.savedAt)}.`);
    lines.push(s.choice.mode === 'whole'
      ? `It keeps the whole manual: ${count(s.copy.keptFiles, 'file')}, ${formatBytes(s.copy.keptBytes)}.`
      : `It keeps ${s.choice.areas.length ? `the areas ${s.choice.areas.join(', ')}` : 'no chosen area'}, every emergency procedure${s.opened ? ` and ${count(s.opened, 'page')} opened earlier` : ''}: `
        + `${count(s.copy.keptFiles, 'file')} of ${s.copy.files.toLocaleString('en-US')}, ${formatBytes(s.copy.keptBytes)} of ${formatBytes(s.copy.bytes)}.`);
  } else lines.push('This tablet holds no offline copy yet.');
  if (s.lastCheck) {
    lines.push(s.lastCheck.ok
      ? `Last checked for a newer manual ${formatTime(s.lastCheck.at)}.`
      : `Last tried to check for a newer manual ${formatTime(s.lastCheck.at)}: no answer from the server.`);
  } else lines.push('Not yet checked for a newer manual.');
  if (s.latest && s.copy && s.latest.version !== s.copy.version) {
    lines.push(`A newer manual is published${s.latest.builtAt ? ` (of ${formatTime(s.latest.builtAt)})` : ''}.`);
  }
  const d = s.download;
  if (d) {
    lines.push(d.active
      ? `Downloading: ${d.done.toLocaleString('en-US')} of ${count(d.files, 'file')}, ${formatBytes(d.doneBytes)} of ${formatBytes(d.bytes)}.`
      : `Download stopped at ${d.done} of ${count(d.files, 'file')} (${d.failed ?? 'the worker was stopped'}); it goes on at the next check with a network.`);
  } else lines.push('Nothing is downloading.');
  return lines;
}

/** The choice form: whole manual, or areas (emergency procedures always kept). */
function renderChoice(holder: HTMLElement, s: OfflineStatus, root: Document): void {
  if (holder.dataset.rendered === s.areas.map((a) => a.area).join('\n') + s.choice.mode + s.choice.areas.join('\n')) return;
  holder.dataset.rendered = s.areas.map((a) => a.area).join('\n') + s.choice.mode + s.choice.areas.join('\n');
  const el = (tag: string, props: Record<string, string | boolean> = {}, ...children: Array<Node | string>): HTMLElement => {
    const node = Object.assign(root.createElement(tag), props);
    node.append(...children);
    return node;
  };
  const radio = (value: 'whole' | 'areas', label: string) => {
    const input = el('input', { type: 'radio', name: 'offline-mode', value, checked: s.choice.mode === value });
    return el('label', { className: 'offline-option' }, input, ` ${label}`);
  };
  const total = s.copy ? `${count(s.copy.files, 'file')}, ${formatBytes(s.copy.bytes)}` : '';
  const boxes = s.areas.map((a) => el('label', { className: 'offline-option' },
    el('input', { type: 'checkbox', name: 'offline-area', value: a.area, checked: s.choice.areas.includes(a.area) }),
    ` ${a.area} (${count(a.procedures, 'procedure')}, ${formatBytes(a.bytes)})`));
  const saved = el('p', { className: 'offline-saved' });
  saved.setAttribute('role', 'status');
  const form = el('form', {},
    el('fieldset', {}, el('legend', {}, 'What this tablet keeps offline'),
      radio('whole', `The whole manual${total ? ` (${total})` : ''}`),
      radio('areas', 'Only the areas ticked below')),
    el('fieldset', {}, el('legend', {}, 'Areas'), ...boxes),
    el('p', {}, 'Every emergency and emergency-shutdown procedure is kept whatever is chosen. Any other page is saved when it is opened and kept from then on.'),
    el('button', { type: 'submit' }, 'Keep this choice'),
    saved);
  form.addEventListener('submit', (event) => {
    event.preventDefault();
    const mode = (form.querySelector<HTMLInputElement>('input[name="offline-mode"]:checked')?.value ?? 'whole') as 'whole' | 'areas';
    const areas = [...form.querySelectorAll<HTMLInputElement>('input[name="offline-area"]:checked')].map((i) => i.value);
    void navigator.serviceWorker.ready.then((r) => {
      r.active?.postMessage({ type: 'choose', mode, areas });
      saved.textContent = mode === 'whole' ? 'Kept: the whole manual.' : `Kept: ${areas.length ? areas.join(', ') : 'no area'} and the emergency procedures.`;
    });
  });
  holder.replaceChildren(form);
}

/** Local date and time; a build date (midnight UTC, no time of day) is shown as a date only. */
export function formatTime(iso: string): string {
  const d = new Date(iso);
  if (Number.isNaN(d.getTime())) return iso;
  if (/T00:00:00(\.000)?Z$/.test(iso)) return iso.slice(0, 10);
  const pad = (n: number) => String(n).padStart(2, '0');
  return `${d.getFullYear()}-${pad(d.getMonth() + 1)}-${pad(d.getDate())} ${pad(d.getHours())}:${pad(d.getMinutes())}`;
}
