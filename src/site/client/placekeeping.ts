// Placekeeping on a procedure page: one step at a time or the full table with a current-step marker.
// Marks stay on this device only; the panel says plainly that they are not a record of execution.
import type { HazardLevel } from '../../model/procedure.ts';
import type { PlacekeepingPlan, PlanHazard } from '../../render/placekeeping-plan.ts';
import { alertSymbolSvg } from '../../render/signal-words.ts';
import { compileFlow, decisionAfter, decisionByKey, markDone, replay, stepsReachedBy, undoMark, type Mark, type Next, type Place, type Token } from './placekeeping-state.ts';

type Mode = 'step' | 'table';
interface Saved { on: boolean; mode: Mode; marks: Mark[]; view?: string; /** Line-up items ticked on this device. */ lineUp?: string[] }

const levelWords: Record<string, string> = { danger: 'DANGER', warning: 'WARNING', caution: 'CAUTION', notice: 'NOTICE' };
const levelRank = ['danger', 'warning', 'caution', 'notice'];
const alertLevels = { danger: 1, warning: 1, caution: 1 };

/** The manual's one time format: 24-hour, hours and minutes (ISO 8601), in the tablet's local time. */
export function isoClock(d: Date): string {
  return `${String(d.getHours()).padStart(2, '0')}:${String(d.getMinutes()).padStart(2, '0')}`;
}

export function storageKey(plan: Pick<PlacekeepingPlan, 'id' | 'revision'>): string {
  return `stepwright:placekeeping:${plan.id}:rev${plan.revision}`;
}

export function setUpPlacekeeping(root: Document = document): void {
  const host = root.querySelector<HTMLElement>('[data-step-plan]');
  const firstRow = root.querySelector<HTMLElement>('tr[data-step]');
  const found = firstRow?.closest('table');
  if (!host || !found) return;
  const table: HTMLTableElement = found;
  let plan: PlacekeepingPlan;
  try { plan = JSON.parse(host.dataset.stepPlan ?? '') as PlacekeepingPlan; } catch { return; }
  // The table's scroll wrapper is what the one-step view hides.
  (table.closest('.scroll-x') ?? table).setAttribute('data-pk-table', '');
  const flow = compileFlow(plan);
  const key = storageKey(plan);
  let saved = load(key);
  let place = replay(flow, saved.marks);

  const el = <K extends keyof HTMLElementTagNameMap>(tag: K, attrs: Record<string, string> = {}, text?: string) => {
    const node = root.createElement(tag);
    for (const [k, v] of Object.entries(attrs)) node.setAttribute(k, v);
    if (text !== undefined) node.textContent = text;
    return node;
  };

  const panel = el('section', { class: 'pk', 'aria-labelledby': 'pk-title', 'data-placekeeping': '' });
  const title = el('h2', { id: 'pk-title' }, 'Placekeeping');
  const disclaimer = el('p', { class: 'pk-disclaimer' },
    'Placekeeping only: these marks help you keep your place and stay on this device. '
    + 'They are not a record of execution, are not sent anywhere and do not replace sign-offs or logs.');
  const start = el('button', { type: 'button', class: 'pk-start' }, 'Start placekeeping');
  const modes = el('div', { class: 'pk-modes', role: 'group', 'aria-label': 'Placekeeping view' });
  const oneStep = el('button', { type: 'button', 'data-mode': 'step' }, 'One step');
  const fullTable = el('button', { type: 'button', 'data-mode': 'table' }, 'Full table');
  modes.append(oneStep, fullTable);
  const branches = el('div', { class: 'pk-branches', role: 'group', 'aria-label': 'Parallel branches in progress' });
  const card = el('div', { class: 'pk-card', 'aria-live': 'polite' });
  const progress = el('p', { class: 'pk-progress' });
  const reset = el('button', { type: 'button', class: 'pk-reset' }, 'Reset placekeeping');
  const body = el('div', { class: 'pk-body' });
  body.append(modes, branches, card, progress, reset);
  panel.append(title, disclaimer, start, body);

  // The large next/back controls and the current hazards stay on screen in both views.
  const dock = el('div', { class: 'pk-dock', role: 'region', 'aria-label': 'Placekeeping controls' });
  const dockHazards = el('div', { class: 'pk-dock-hazards' });
  const dockNav = el('div', { class: 'pk-nav' });
  dock.append(dockHazards, dockNav);

  const anchor = table.closest('section') ?? table;
  anchor.parentElement?.insertBefore(panel, anchor);
  root.body.append(dock);

  const save = () => { try { localStorage.setItem(key, JSON.stringify(saved)); } catch { /* private mode */ } };
  const update = (next: Partial<Saved>) => { saved = { ...saved, ...next }; save(); render(); };

  // The line-up checklist at the top of the page: ticks kept with the placekeeping marks, on this device only.
  const lineUpChecks = [...root.querySelectorAll<HTMLInputElement>('input[data-line-up-check]')];
  const lineUpStatus = root.querySelector<HTMLElement>('[data-line-up-status]');
  for (const box of lineUpChecks) {
    box.checked = (saved.lineUp ?? []).includes(box.dataset.lineUpCheck!);
    box.addEventListener('change', () => update({ lineUp: lineUpChecks.filter((b) => b.checked).map((b) => b.dataset.lineUpCheck!) }));
  }
  const openLineUp = () => lineUpChecks.filter((b) => !b.checked);

  start.addEventListener('click', () => update({ on: true }));
  for (const b of [oneStep, fullTable]) b.addEventListener('click', () => update({ mode: b.dataset.mode as Mode }));
  reset.addEventListener('click', () => {
    if (!confirm('Clear all placekeeping marks for this procedure on this device?')) return;
    try { localStorage.removeItem(key); } catch { /* private mode */ }
    saved = { on: false, mode: saved.mode, marks: [] };
    for (const box of lineUpChecks) box.checked = false;
    place = replay(flow, []);
    render();
  });

  const act = (mark: Mark) => {
    const next = markDone(flow, place, { ...mark, at: Date.now() });
    if (!next) return;
    place = next;
    update({ marks: place.marks });
    focusCurrent();
  };
  const back = () => {
    place = replay(flow, undoMark(place.marks, viewed()?.path));
    update({ marks: place.marks });
    focusCurrent();
  };

  const viewed = (): Token | undefined => {
    const open = place.tokens.filter((t) => t.at.k !== 'end');
    return open.find((t) => t.path === saved.view) ?? open.find((t) => t.at.k !== 'join') ?? open[0];
  };

  const rowOf = (id: string) => table.querySelector<HTMLTableRowElement>(`tr[data-step="${CSS.escape(id)}"]`);
  const numberOf = (id: string) => plan.numbers[id] ?? id;

  function focusCurrent(): void {
    const tok = viewed();
    if (saved.mode === 'table' && tok?.at.k === 'step') rowOf(tok.at.id)?.scrollIntoView({ block: 'center' });
    // In the one-step view the card's top must be on screen after every move, above the dock.
    if (saved.mode === 'step' && card.getBoundingClientRect().top < 0) card.scrollIntoView({ block: 'start' });
  }

  function render(): void {
    if (lineUpStatus && lineUpChecks.length) {
      lineUpStatus.hidden = false;
      lineUpStatus.textContent = `${lineUpChecks.length - openLineUp().length} of ${lineUpChecks.length} confirmed on this device. `
        + 'Ticks here help you keep your place; they are not a record and do not replace the line-up sheet or a permit.';
    }
    panel.dataset.on = String(saved.on);
    start.hidden = saved.on;
    body.hidden = !saved.on;
    dock.hidden = !saved.on || place.finished;
    root.documentElement.classList.toggle('pk-one-step', saved.on && saved.mode === 'step');
    oneStep.setAttribute('aria-pressed', String(saved.mode === 'step'));
    fullTable.setAttribute('aria-pressed', String(saved.mode === 'table'));
    markTable();
    if (!saved.on) return;
    renderBranches();
    renderCard();
    renderNav();
    const marked = Object.keys(place.done).length;
    const last = place.marks[place.marks.length - 1];
    progress.textContent = `${marked} of ${flow.order.length} steps marked`
      + (last?.at ? `; last mark ${isoClock(new Date(last.at))}` : '') + '.';
  }

  function markTable(): void {
    const current = new Set(saved.on ? place.tokens.flatMap((t) => (t.at.k === 'step' ? [t.at.id] : [])) : []);
    for (const row of table.querySelectorAll<HTMLTableRowElement>('tr[data-step]')) {
      const id = row.dataset.step!;
      const isCurrent = current.has(id);
      row.classList.toggle('pk-current', isCurrent);
      row.classList.toggle('pk-done', saved.on && (place.done[id] ?? 0) > 0 && !isCurrent);
      if (isCurrent) row.setAttribute('aria-current', 'step'); else row.removeAttribute('aria-current');
      let badge = row.querySelector<HTMLElement>('.pk-badge');
      const text = !saved.on ? '' : isCurrent ? 'Current step' : place.done[id] ? `Marked${place.done[id] > 1 ? ` ×${place.done[id]}` : ''}` : '';
      if (text && !badge) {
        badge = el('span', { class: 'pk-badge' });
        (row.cells[0] ?? row).append(badge);
      }
      if (badge) { badge.textContent = text; badge.hidden = !text; }
    }
  }

  function branchLabel(path: string): string {
    const last = path.slice(path.lastIndexOf('/') + 1);
    const [blockKey, name] = last.split(':');
    const find = (items: PlacekeepingPlan['items']): string | undefined => {
      for (const item of items) {
        if ('parallel' in item) {
          if (item.parallel === blockKey) {
            const b = item.branches.find((x) => x.name === name);
            if (b) return `Branch ${item.number}${b.letter} (${b.name})`;
          }
          for (const b of item.branches) { const f = find(b.items); if (f) return f; }
        } else if ('choose' in item) for (const b of item.branches) { const f = b.items && find(b.items); if (f) return f; }
      }
      return undefined;
    };
    return path ? find(plan.items) ?? name ?? path : 'Main sequence';
  }

  function tokenText(t: Token): string {
    if (t.at.k === 'step') return `step ${numberOf(t.at.id)}`;
    if (t.at.k === 'join') return 'finished, waiting for the other branches';
    if (t.at.k === 'choose') return 'decision';
    return 'end';
  }

  function renderBranches(): void {
    const open = place.tokens.filter((t) => t.path !== '');
    branches.replaceChildren();
    branches.hidden = open.length === 0;
    if (!open.length) return;
    branches.append(el('p', { class: 'pk-branches-note' }, 'These branches run at the same time; each keeps its own place.'));
    const current = viewed();
    for (const t of open) {
      const b = el('button', { type: 'button', 'aria-pressed': String(t === current) }, `${branchLabel(t.path)}: ${tokenText(t)}`);
      b.addEventListener('click', () => update({ view: t.path }));
      branches.append(b);
    }
  }

  function hazardsAt(step: string): PlanHazard[] {
    return plan.hazards.filter((h) => h.at.includes(step)).sort((a, b) => levelRank.indexOf(a.level) - levelRank.indexOf(b.level));
  }

  function hazardBox(h: PlanHazard, compact: boolean): HTMLElement {
    const box = el('div', { class: `pk-hazard pk-hazard-${h.level}`, role: 'note' });
    const word = el('strong', { class: `pk-signal-word signal-word level-${h.level}` }, levelWords[h.level] ?? h.level.toUpperCase());
    // DANGER, WARNING and CAUTION carry the safety alert symbol here as on the rest of the page; NOTICE never does.
    if (h.level in alertLevels) word.insertAdjacentHTML('afterbegin', alertSymbolSvg(h.level as HazardLevel, 16));
    box.append(word, root.createTextNode(` ${h.hazard}`));
    if (!compact) {
      if (h.consequence) box.append(el('span', { class: 'pk-hazard-line' }, `Consequence: ${h.consequence}`));
      if (h.avoid) box.append(el('span', { class: 'pk-hazard-line' }, `Avoid: ${h.avoid}`));
    }
    return box;
  }

  function renderCard(): void {
    card.replaceChildren();
    const tok = viewed();
    if (place.finished || !tok) {
      card.append(el('p', { class: 'pk-finished' }, 'Every step is marked. This is the end of the procedure.'));
      return;
    }
    const heading = el('h3', { class: 'pk-card-title' });
    card.append(heading);
    if (tok.path) card.append(el('p', { class: 'pk-card-branch' }, branchLabel(tok.path)));
    if (tok.at.k === 'join') { heading.textContent = 'Branch finished'; card.append(el('p', {}, 'Waiting for the other branches of this block.')); return; }
    if (tok.at.k !== 'step') { heading.textContent = 'Decision'; return; }
    const id = tok.at.id;
    heading.textContent = `Step ${numberOf(id)}`;
    if (place.marks.length === 0 && lineUpChecks.length) card.append(lineUpReminder());
    for (const h of hazardsAt(id)) card.append(hazardBox(h, false));
    const row = rowOf(id);
    if (row) card.append(describeRow(row));
  }

  /** Before the first mark: how much of the line-up is confirmed, and what is still open. */
  function lineUpReminder(): HTMLElement {
    const open = openLineUp();
    const box = el('div', { class: `pk-line-up${open.length ? ' pk-line-up-open' : ''}`, role: 'note', 'data-pk-line-up': String(open.length) });
    if (!open.length) {
      box.append(el('p', {}, `Line-up: all ${lineUpChecks.length} items confirmed.`));
      return box;
    }
    const p = el('p');
    p.append(el('strong', {}, `Line-up: ${open.length} of ${lineUpChecks.length} items not confirmed yet.`), root.createTextNode(' Do not start until each is confirmed. '));
    const link = el('a', { href: '#line-up' }, 'Go to the line-up checklist');
    p.append(link);
    box.append(p);
    const list = el('ul');
    for (const b of open) list.append(el('li', {}, b.closest('label')?.textContent?.replace(/\s+/g, ' ').trim() ?? ''));
    box.append(list);
    return box;
  }

  /** The table row as a list of "column heading: cell" pairs, so the one-step view says what the table says. */
  function describeRow(row: HTMLTableRowElement): HTMLElement {
    const heads = [...(row.closest('table')?.querySelectorAll('thead th') ?? [])].map((th) => th.textContent?.trim() ?? '');
    const list = el('dl', { class: 'pk-fields' });
    [...row.cells].forEach((cell, i) => {
      // The number is already the card's heading.
      if (i === 0 && /^\s*[0-9]+[A-Za-z0-9.]*\s*$/.test(cell.textContent ?? '')) return;
      const copy = cell.cloneNode(true) as HTMLElement;
      copy.querySelectorAll('.pk-badge').forEach((b) => b.remove());
      copy.querySelectorAll('[id]').forEach((n) => n.removeAttribute('id'));
      if (!copy.textContent?.trim()) return;
      const dd = el('dd');
      dd.append(...copy.childNodes);
      list.append(el('dt', {}, heads[i] || ''), dd);
    });
    return list;
  }

  function targetText(next: Next): string {
    const steps = stepsReachedBy(next);
    if (steps.length) return `go to step ${steps.map(numberOf).join(' and ')}`;
    if (next.k === 'end') return 'go to the end of the procedure';
    if (next.k === 'join') return 'end this branch';
    return 'decide again';
  }

  function renderNav(): void {
    dockNav.replaceChildren();
    dockHazards.replaceChildren();
    const tok = viewed();
    const backButton = el('button', { type: 'button', class: 'pk-back' }, '◀ Back');
    backButton.disabled = place.marks.length === 0;
    backButton.addEventListener('click', back);
    dockNav.append(backButton);
    if (!tok || place.finished) return;
    const stepId = tok.at.k === 'step' ? tok.at.id : undefined;
    if (stepId) for (const h of hazardsAt(stepId)) dockHazards.append(hazardBox(h, true));
    const decision = stepId ? decisionAfter(flow, stepId) : tok.at.k === 'choose' ? decisionByKey(flow, tok.at.key) : undefined;
    const label = stepId ? `step ${numberOf(stepId)}` : 'decision';
    if (decision) {
      const group = el('div', { class: 'pk-decision', role: 'group', 'aria-label': `Which branch after ${label}?` });
      decision.options.forEach((o, i) => {
        const b = el('button', { type: 'button', class: 'pk-next' }, `${o.otherwise ? 'Otherwise' : `If ${o.when}`}: ${targetText(o.to)}`);
        b.addEventListener('click', () => act({ step: stepId ?? (tok.at as { key: string }).key, pick: i, path: tok.path }));
        group.append(b);
      });
      dockNav.append(group);
    } else if (stepId) {
      const b = el('button', { type: 'button', class: 'pk-next' }, `Mark ${label} done ▶`);
      b.addEventListener('click', () => act({ step: stepId, path: tok.path }));
      dockNav.append(b);
    }
    // The step's contingency sends the operator elsewhere when the expected result does not come.
    const contingency = stepId ? flow.ifNot.get(stepId) : undefined;
    if (stepId && contingency) {
      const b = el('button', { type: 'button', class: 'pk-if-not', 'data-pk-if-not': stepId }, `Not as expected: response done, go to step ${numberOf(contingency)}`);
      b.addEventListener('click', () => act({ step: stepId, ifNot: true, path: tok.path }));
      dockNav.append(b);
    }
  }

  render();
}

function load(key: string): Saved {
  try {
    const data = JSON.parse(localStorage.getItem(key) ?? 'null') as Partial<Saved> | null;
    if (data && Array.isArray(data.marks)) {
      const lineUp = Array.isArray(data.lineUp) ? data.lineUp.filter((k): k is string => typeof k === 'string') : [];
      return { on: data.on === true, mode: data.mode === 'table' ? 'table' : 'step', marks: data.marks, view: data.view, lineUp };
    }
  } catch { /* unreadable: start afresh */ }
  return { on: false, mode: 'step', marks: [] };
}

export type { Place };
