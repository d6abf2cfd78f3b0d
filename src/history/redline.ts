// The redline between two revisions of one procedure: steps keyed by id (added, removed, moved, changed) with
// word-level text changes, and the changes to setpoints, transitions, hazards, limits and interlocks.
import { diffArrays, diffWords } from 'diff';
import { distance } from 'fastest-levenshtein';
import type { Hazard, Procedure, Step } from '../model/procedure.ts';
import { parseCondition, namesIn } from '../analysis/conditions/parse.ts';
import { changedContentAreas, type ContentArea } from '../analysis/document-content.ts';
import { layoutSteps, type StepSlot } from './step-layout.ts';

export interface WordPart {
  kind: 'same' | 'added' | 'removed';
  text: string;
}

export interface FieldChange {
  field: string;
  before?: string;
  after?: string;
  /** Word-level changes, for text fields present on both sides. */
  words?: WordPart[];
}

export type StepChangeKind = 'added' | 'removed' | 'moved' | 'changed' | 'renamed';

export interface StepRow {
  id: string;
  /** The id the step had before, when only its id changed (same content, new id). */
  renamedFrom?: string;
  /** Empty for an unchanged step. */
  kinds: StepChangeKind[];
  before?: StepSlot;
  after?: StepSlot;
  fields: FieldChange[];
}

export type ItemArea = 'setpoints' | 'transitions' | 'decisions' | 'limits' | 'interlocks' | 'hazards' | 'signals' | 'ppe' | 'equipment' | 'identity' | 'body';

export interface ItemChange {
  area: ItemArea;
  key: string;
  kind: 'added' | 'removed' | 'changed';
  fields: FieldChange[];
  /** Why a process-safety reviewer must look at it; absent when it is not safety-relevant. */
  safety?: string;
  /** What the new value sits between: the signal's operating limits and interlock trips in the new revision. */
  context?: string;
}

export interface Redline {
  before: Procedure;
  after: Procedure;
  revision: { before: number; after: number };
  status: { before: string; after: string };
  /** Document control: effective date, change reason, approvals, review date, owner, author. */
  control: FieldChange[];
  /** Every step of both revisions in one reading order; unchanged steps have no kinds. */
  steps: StepRow[];
  items: ItemChange[];
  areas: ContentArea[];
}

export function redline(before: Procedure, after: Procedure): Redline {
  const steps = stepRows(before, after);
  // Setpoints and transitions are keyed by step id: a renamed step keeps its key, so only real changes show.
  const renamed = new Map(steps.flatMap((s) => (s.renamedFrom ? [[s.renamedFrom, s.id] as const] : [])));
  const idNow = (id: string) => renamed.get(id) ?? id;
  const items = [
    ...setpointChanges(before, after, idNow),
    ...transitionChanges(before, after, idNow),
    ...limitChanges(before, after),
    ...interlockChanges(before, after),
    ...hazardChanges(before, after),
    ...signalChanges(before, after),
    ...listChanges('ppe', before.ppe, after.ppe, 'protective equipment protects against the hazards'),
    ...listChanges('equipment', before.equipment, after.equipment),
    ...identityChanges(before, after),
  ];
  return {
    before, after,
    revision: { before: before.revision, after: after.revision },
    status: { before: String(before.status), after: String(after.status) },
    control: controlChanges(before, after),
    steps, items,
    areas: changedContentAreas(before, after),
  };
}

export function wordDiff(before: string, after: string): WordPart[] {
  return diffWords(before, after).map((c) => ({ kind: c.added ? 'added' : c.removed ? 'removed' : 'same', text: c.value }));
}

function field(name: string, before: string | undefined, after: string | undefined): FieldChange | undefined {
  if (before === after) return undefined;
  const change: FieldChange = { field: name };
  if (before !== undefined) change.before = before;
  if (after !== undefined) change.after = after;
  if (before !== undefined && after !== undefined) change.words = wordDiff(before, after);
  return change;
}

function compact<T>(list: Array<T | undefined>): T[] {
  return list.filter((x): x is T => x !== undefined);
}

// ---- steps

function stepFields(a: Step | undefined, b: Step | undefined): FieldChange[] {
  const text = (s: Step | undefined, pick: (s: Step) => string | undefined) => (s ? pick(s) : undefined);
  const setOf = (s: Step | undefined) => new Map((s?.set ?? []).map((x) => [x.signal, x.quantity]));
  const paramsOf = (s: Step | undefined) => new Map((s?.params ?? []).map((x) => [x.name, String(x.value)]));
  const keyed = (prefix: string, x: Map<string, string>, y: Map<string, string>) =>
    [...new Set([...x.keys(), ...y.keys()])].map((k) => field(`${prefix} ${k}`, x.get(k), y.get(k)));
  const extraKeys = new Set([...Object.keys(a?.extra ?? {}), ...Object.keys(b?.extra ?? {})]);
  return compact([
    field('do', text(a, (s) => s.actions.join('; ')), text(b, (s) => s.actions.join('; '))),
    field('phase', text(a, (s) => s.phase), text(b, (s) => s.phase)),
    ...keyed('set', setOf(a), setOf(b)),
    ...keyed('param', paramsOf(a), paramsOf(b)),
    field('until', text(a, (s) => s.until?.value), text(b, (s) => s.until?.value)),
    field('confirm', text(a, (s) => s.confirm?.value), text(b, (s) => s.confirm?.value)),
    field('expect', text(a, (s) => s.expect?.value), text(b, (s) => s.expect?.value)),
    field('sign-off', text(a, (s) => s.signOff), text(b, (s) => s.signOff)),
    field('note', text(a, (s) => s.note), text(b, (s) => s.note)),
    ...[...extraKeys].map((k) => field(plainKey(k), a && k in a.extra ? plainValue(a.extra[k]) : undefined, b && k in b.extra ? plainValue(b.extra[k]) : undefined)),
  ]);
}

function stepRows(before: Procedure, after: Procedure): StepRow[] {
  const old = layoutSteps(before).steps;
  const now = layoutSteps(after).steps;
  const oldById = new Map(old.map((s) => [s.step.id, s]));
  const nowById = new Map(now.map((s) => [s.step.id, s]));

  // A step is moved when it left its container, or is not on the longest common order of the kept steps.
  const keptOld = old.filter((s) => nowById.has(s.step.id)).map((s) => s.step.id);
  const keptNow = now.filter((s) => oldById.has(s.step.id)).map((s) => s.step.id);
  const inOrder = new Set(diffArrays(keptOld, keptNow).filter((c) => !c.added && !c.removed).flatMap((c) => c.value));

  const rowFor = (id: string): StepRow => {
    const a = oldById.get(id);
    const b = nowById.get(id);
    const kinds: StepChangeKind[] = [];
    const fields = stepFields(a?.step, b?.step);
    if (!a) kinds.push('added');
    else if (!b) kinds.push('removed');
    else {
      if (a.container !== b.container || !inOrder.has(id)) kinds.push('moved');
      if (fields.length) kinds.push('changed');
    }
    return { id, kinds, ...(a ? { before: a } : {}), ...(b ? { after: b } : {}), fields: a && b ? fields : [] };
  };

  // Merge both orders: a kept step appears once, at its new place; a removed step at its old place.
  const rows: StepRow[] = [];
  const seen = new Set<string>();
  for (const change of diffArrays(old.map((s) => s.step.id), now.map((s) => s.step.id))) {
    for (const id of change.value) {
      if (change.removed && nowById.has(id)) continue;
      if (seen.has(id)) continue;
      seen.add(id);
      rows.push(rowFor(id));
    }
  }
  return pairRenamedSteps(rows);
}

/** Ids are the diff key, so a new id is a removal and an addition; when the content is the same, say it was renamed. */
function pairRenamedSteps(rows: StepRow[]): StepRow[] {
  const removed = rows.filter((r) => r.kinds.includes('removed'));
  const dropped = new Set<StepRow>();
  const out = rows.map((row) => {
    if (!row.kinds.includes('added') || !row.after) return row;
    const twin = removed.find((r) => !dropped.has(r) && r.before && stepFields(r.before.step, row.after!.step).length === 0);
    if (!twin) return row;
    dropped.add(twin);
    const kinds: StepChangeKind[] = ['renamed'];
    if (twin.before!.container !== row.after.container) kinds.push('moved');
    return { ...row, kinds, renamedFrom: twin.id, before: twin.before };
  });
  return out.filter((r) => !dropped.has(r));
}

// ---- safety content

/** Signals a reviewer must treat as safety-relevant: those with operating limits or named by an interlock trip. */
function guardedSignals(p: Procedure): Set<string> {
  const names = new Set(p.limits.map((l) => l.signal));
  for (const i of p.interlocks) for (const n of conditionNames(i.tripsWhen.value)) names.add(n);
  return names;
}

function conditionNames(text: string): string[] {
  const parsed = parseCondition(text);
  return parsed.ok ? namesIn(parsed.condition).map((n) => n.name) : [];
}

function setpointChanges(before: Procedure, after: Procedure, idNow: (id: string) => string): ItemChange[] {
  const collect = (p: Procedure, key: (id: string) => string) => {
    const map = new Map<string, string>();
    for (const s of layoutSteps(p).steps) for (const sp of s.step.set) map.set(`${key(s.step.id)}: ${sp.signal}`, sp.quantity);
    return map;
  };
  const a = collect(before, idNow);
  const b = collect(after, (id) => id);
  return [...new Set([...a.keys(), ...b.keys()])].flatMap((key): ItemChange[] => {
    const f = field('setpoint', a.get(key), b.get(key));
    if (!f) return [];
    const context = signalContext(after, key.slice(key.indexOf(': ') + 2));
    return [{ area: 'setpoints', key, kind: kindOf(a.has(key), b.has(key)), fields: [f], safety: 'setpoints are checked against operating limits and interlock trips', ...(context ? { context } : {}) }];
  });
}

function transitionChanges(before: Procedure, after: Procedure, idNow: (id: string) => string): ItemChange[] {
  const guarded = new Set([...guardedSignals(before), ...guardedSignals(after)]);
  const collect = (p: Procedure, key: (id: string) => string) => {
    const map = new Map<string, { area: ItemArea; text: string; goto?: string }>();
    const layout = layoutSteps(p);
    for (const s of layout.steps) if (s.step.until) map.set(`after ${key(s.step.id)}`, { area: 'transitions', text: s.step.until.value });
    for (const d of layout.decisions) map.set(d.key.split(' → ').map(key).join(' → '), { area: 'decisions', text: d.condition, goto: d.goto && key(d.goto) });
    return map;
  };
  const a = collect(before, idNow);
  const b = collect(after, (id) => id);
  return [...new Set([...a.keys(), ...b.keys()])].flatMap((key): ItemChange[] => {
    const x = a.get(key);
    const y = b.get(key);
    const fields = compact([field('condition', x?.text, y?.text), field('goto', x?.goto, y?.goto)]);
    if (!fields.length) return [];
    const names = [...conditionNames(x?.text ?? ''), ...conditionNames(y?.text ?? '')].filter((n) => guarded.has(n));
    const change: ItemChange = { area: (y ?? x)!.area, key, kind: kindOf(Boolean(x), Boolean(y)), fields };
    if (names.length) {
      const unique = [...new Set(names)];
      change.safety = `the condition uses ${unique.join(', ')}, which has operating limits or an interlock`;
      const context = unique.map((n) => signalContext(after, n)).filter(Boolean).join('; ');
      if (context) change.context = context;
    }
    return [change];
  });
}

function limitChanges(before: Procedure, after: Procedure): ItemChange[] {
  const describe = (p: Procedure) => new Map(p.limits.map((l) => [l.signal, {
    low: l.low?.value, high: l.high?.value, consequence: l.consequence, correction: l.correction,
  }]));
  return keyedChanges('limits', describe(before), describe(after), () => 'operating limits are process safety information')
    .map((c) => {
      const context = signalContext(after, c.key, { limits: false });
      return context ? { ...c, context } : c;
    });
}

/** "TI-210: operating limits 15 degC to 245 degC; TSHH-210 trips at TI-210 >= 255 degC", from the given revision. */
export function signalContext(p: Procedure, signal: string, show: { limits?: boolean } = {}): string | undefined {
  const parts: string[] = [];
  const limit = p.limits.find((l) => l.signal === signal);
  if (limit && show.limits !== false) parts.push(`operating limits ${limit.low?.value ?? '—'} to ${limit.high?.value ?? '—'}`);
  for (const i of p.interlocks) if (conditionNames(i.tripsWhen.value).includes(signal)) parts.push(`${i.tag} trips at ${i.tripsWhen.value}`);
  return parts.length ? `${signal}: ${parts.join('; ')}` : undefined;
}

function interlockChanges(before: Procedure, after: Procedure): ItemChange[] {
  const describe = (p: Procedure) => new Map(p.interlocks.map((i) => [i.tag, { 'trips-when': i.tripsWhen.value, action: i.action }]));
  return keyedChanges('interlocks', describe(before), describe(after), () => 'safety systems and their functions are process safety information');
}

function signalChanges(before: Procedure, after: Procedure): ItemChange[] {
  const guarded = new Set([...guardedSignals(before), ...guardedSignals(after)]);
  const describe = (p: Procedure) => new Map(Object.values(p.signals).map((s) => [s.name, {
    text: s.text, unit: s.unit, range: s.range ? `${s.range[0]}..${s.range[1]}` : undefined, values: s.values?.join(', '),
  }]));
  return keyedChanges('signals', describe(before), describe(after), (key) => (guarded.has(key) ? 'the signal has operating limits or an interlock' : undefined));
}

function hazardChanges(before: Procedure, after: Procedure): ItemChange[] {
  const describe = (h: Hazard) => ({ level: h.level, hazard: h.hazard, consequence: h.consequence, avoid: h.avoid, at: h.at.map((x) => x.value).join(', ') });
  // Hazards have no id: pair them by their text, then pair close rewordings, so a reworded hazard is "changed".
  const left = [...before.hazards];
  const right = [...after.hazards];
  const pairs: Array<[Hazard | undefined, Hazard | undefined]> = [];
  for (const h of [...left]) {
    const match = right.find((r) => r.hazard === h.hazard);
    if (match) {
      pairs.push([h, match]);
      left.splice(left.indexOf(h), 1);
      right.splice(right.indexOf(match), 1);
    }
  }
  for (const h of [...left]) {
    const match = right.find((r) => distance(r.hazard, h.hazard) <= Math.max(r.hazard.length, h.hazard.length) * 0.4);
    if (match) {
      pairs.push([h, match]);
      left.splice(left.indexOf(h), 1);
      right.splice(right.indexOf(match), 1);
    }
  }
  for (const h of left) pairs.push([h, undefined]);
  for (const h of right) pairs.push([undefined, h]);
  return pairs.flatMap(([a, b]): ItemChange[] => {
    const x = a ? describe(a) : undefined;
    const y = b ? describe(b) : undefined;
    const fields = compact((['level', 'hazard', 'consequence', 'avoid', 'at'] as const).map((k) => field(k, x?.[k], y?.[k])));
    if (!fields.length) return [];
    const kind = kindOf(Boolean(a), Boolean(b));
    const level = (b ?? a)!.level.toUpperCase();
    const safety = kind === 'removed' ? `a ${level} message is removed` : kind === 'added' ? `a ${level} message is added` : `a ${level} message changed`;
    return [{ area: 'hazards', key: `${level}: ${(b ?? a)!.hazard}`, kind, fields, safety }];
  });
}

function listChanges(area: ItemArea, before: string[], after: string[], safety?: string): ItemChange[] {
  const a = new Set(before);
  const b = new Set(after);
  return [
    ...before.filter((x) => !b.has(x)).map((x): ItemChange => ({ area, key: x, kind: 'removed', fields: [{ field: area, before: x }], ...(safety ? { safety } : {}) })),
    ...after.filter((x) => !a.has(x)).map((x): ItemChange => ({ area, key: x, kind: 'added', fields: [{ field: area, after: x }], ...(safety ? { safety } : {}) })),
  ];
}

function identityChanges(before: Procedure, after: Procedure): ItemChange[] {
  const fields = compact([field('id', before.id, after.id), field('title', before.title, after.title), field('kind', String(before.kind), String(after.kind))]);
  const out: ItemChange[] = fields.length ? [{ area: 'identity', key: 'identity', kind: 'changed', fields }] : [];
  const body = field('body', before.bodyText.trim(), after.bodyText.trim());
  if (body && before.bodyText.replace(/\s+/g, ' ').trim() !== after.bodyText.replace(/\s+/g, ' ').trim()) {
    out.push({ area: 'body', key: 'narrative', kind: 'changed', fields: [body] });
  }
  return out;
}

function controlChanges(before: Procedure, after: Procedure): FieldChange[] {
  const approvals = (p: Procedure) => p.approvals.map((a) => `${a.role}: ${a.name}, ${a.date} (${a.meaning})`).join('\n') || undefined;
  return compact([
    field('revision', String(before.revision), String(after.revision)),
    field('status', String(before.status), String(after.status)),
    field('effective', before.effective, after.effective),
    field('review-by', before.reviewBy, after.reviewBy),
    field('owner', before.owner, after.owner),
    field('author', before.author, after.author),
    field('change', before.change, after.change),
    field('approvals', approvals(before), approvals(after)),
  ]);
}

function keyedChanges(
  area: ItemArea,
  a: Map<string, Record<string, string | undefined>>,
  b: Map<string, Record<string, string | undefined>>,
  safety: (key: string) => string | undefined,
): ItemChange[] {
  return [...new Set([...a.keys(), ...b.keys()])].flatMap((key): ItemChange[] => {
    const x = a.get(key);
    const y = b.get(key);
    const names = [...new Set([...Object.keys(x ?? {}), ...Object.keys(y ?? {})])];
    const fields = compact(names.map((n) => field(n, x?.[n], y?.[n])));
    if (!fields.length) return [];
    const why = safety(key);
    return [{ area, key, kind: kindOf(Boolean(x), Boolean(y)), fields, ...(why ? { safety: why } : {}) }];
  });
}

function kindOf(inBefore: boolean, inAfter: boolean): ItemChange['kind'] {
  return inBefore && inAfter ? 'changed' : inAfter ? 'added' : 'removed';
}

/** The steps the redline marks, for charts: step id → the strongest change. */
export function stepMarks(r: Redline): Map<string, 'added' | 'moved' | 'changed'> {
  const marks = new Map<string, 'added' | 'moved' | 'changed'>();
  for (const row of r.steps) {
    if (!row.after) continue;
    if (row.kinds.includes('added')) marks.set(row.id, 'added');
    else if (row.kinds.includes('renamed')) marks.set(row.id, 'changed');
    else if (row.kinds.includes('changed')) marks.set(row.id, 'changed');
    else if (row.kinds.includes('moved')) marks.set(row.id, 'moved');
  }
  return marks;
}

/** A front-matter key as a reader says it: `sign-off` reads "sign off", `ends_when` reads "ends when". */
export function plainKey(key: string): string {
  return key.replace(/[-_]+/g, ' ').trim();
}

/**
 * A front-matter value in plain text, without JSON quotes or braces: lists joined with "; ", maps as
 * "key: value". Two different values always read differently (order is kept; nothing is dropped).
 */
export function plainValue(value: unknown): string {
  if (value === null || value === undefined) return '(empty)';
  if (typeof value === 'string') return value;
  if (typeof value === 'number' || typeof value === 'boolean' || typeof value === 'bigint') return String(value);
  if (value instanceof Date) return value.toISOString();
  if (Array.isArray(value)) return value.length ? value.map((v) => (isPlainObject(v) || Array.isArray(v) ? `(${plainValue(v)})` : plainValue(v))).join('; ') : '(none)';
  if (isPlainObject(value)) {
    const entries = Object.entries(value);
    return entries.length ? entries.map(([k, v]) => `${plainKey(k)}: ${isPlainObject(v) || Array.isArray(v) ? `(${plainValue(v)})` : plainValue(v)}`).join('; ') : '(none)';
  }
  return String(value);
}

function isPlainObject(v: unknown): v is Record<string, unknown> {
  return typeof v === 'object' && v !== null && !Array.isArray(v) && !(v instanceof Date);
}

/** One line of the step redline: a step row to show, or a run of unchanged steps folded away. */
export type RedlineLine = { kind: 'row'; row: StepRow; context: boolean } | { kind: 'folded'; count: number; rows: StepRow[] };

/**
 * The changed steps with `around` unchanged steps of context either side; longer runs of unchanged steps fold
 * into one line that names how many steps it holds (the page can still show every step).
 */
export function stepsWithContext(steps: StepRow[], around = 1): RedlineLine[] {
  const changed = steps.map((s) => s.kinds.length > 0);
  const keep = steps.map((_, i) => changed.slice(Math.max(0, i - around), i + around + 1).some(Boolean));
  const out: RedlineLine[] = [];
  let folded: StepRow[] = [];
  const flush = () => {
    if (folded.length) out.push({ kind: 'folded', count: folded.length, rows: folded });
    folded = [];
  };
  steps.forEach((row, i) => {
    if (keep[i]) {
      flush();
      out.push({ kind: 'row', row, context: !changed[i] });
    } else folded.push(row);
  });
  flush();
  return out;
}
