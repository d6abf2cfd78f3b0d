// Builds the typed Procedure from front-matter data, tolerating whatever the author wrote so checks still run.
import type { Root } from 'mdast';
import type { PathKey } from '../parse/read-source.ts';
import type {
  Approval, ChooseBlock, ChooseBranch, Hazard, Interlock, Limit, Located, ParallelBlock, Procedure, SequenceItem, Signal, StateAction,
  StateEntry, Step,
} from './procedure.ts';

type Data = Record<string, unknown>;

const stepKeys = new Set(['step', 'do', 'phase', 'set', 'params', 'until', 'confirm', 'expect', 'sign-off', 'note', 'waive',
  'state', 'needs', 'trips', 'resets', 'performer', 'verify', 'time-limit', 'if-not', 'max-drop']);
const branchKeys = new Set(['when', 'otherwise', 'steps', 'goto']);

export function buildProcedure(file: string, data: unknown, body: Root, bodyText: string): Procedure {
  const d = asRecord(data);
  return {
    file,
    id: asText(d.id) ?? '',
    title: asText(d.title) ?? '',
    kind: asText(d.kind) ?? '',
    revision: typeof d.revision === 'number' ? d.revision : Number.NaN,
    status: asText(d.status) ?? '',
    effective: asText(d.effective),
    reviewBy: asText(d['review-by']),
    owner: asText(d.owner),
    author: asText(d.author),
    change: asText(d.change),
    approvals: asArray(d.approvals).map((a, i) => buildApproval(a, ['approvals', i])),
    equipment: asArray(d.equipment).map((e) => String(e)),
    ppe: asArray(d.ppe).map((e) => String(e)),
    signals: buildSignals(d.signals),
    limits: Object.entries(asRecord(d.limits)).map(([signal, v]) => buildLimit(signal, v, ['limits', signal])),
    interlocks: asArray(d.interlocks).map((v, i) => buildInterlock(v, ['interlocks', i])),
    hazards: asArray(d.hazards).map((v, i) => buildHazard(v, ['hazards', i])),
    shutdownConditions: (Array.isArray(d['conditions-requiring']) ? d['conditions-requiring'] : [d['conditions-requiring']])
      .map(asText).filter((c): c is string => Boolean(c?.trim())),
    responsible: asText(d.responsible),
    lineUp: locatedList(d['line-up'], ['line-up']),
    requires: locatedList(d.requires, ['requires']),
    steps: buildSequence(d.steps, ['steps']),
    uses: asArray(d.uses).flatMap((u, i) => (u === null || typeof u === 'object' ? [] : [{ value: String(u), path: ['uses', i] }])),
    certifications: asArray(d.certifications).map((c, i) => {
      const r = asRecord(c);
      return { name: asText(r.name) ?? '', role: asText(r.role) ?? '', date: asText(r.date) ?? '', path: ['certifications', i] };
    }),
    expires: asText(d.expires),
    modifies: asArray(d.modifies).flatMap((u, i) => (u === null || typeof u === 'object' ? [] : [{ value: String(u), path: ['modifies', i] }])),
    body,
    bodyText,
    data: d,
  };
}

function buildApproval(value: unknown, path: PathKey[]): Approval {
  const a = asRecord(value);
  return { role: asText(a.role) ?? '', name: asText(a.name) ?? '', date: asText(a.date) ?? '', meaning: asText(a.meaning) ?? '', path };
}

function buildSignals(value: unknown): Record<string, Signal> {
  // No prototype: names such as valueOf or toString are declared only when the author declares them.
  const out: Record<string, Signal> = Object.create(null);
  for (const [name, v] of Object.entries(asRecord(value))) {
    const s = asRecord(v);
    const range = Array.isArray(s.range) && s.range.length === 2 && s.range.every((n) => typeof n === 'number')
      ? (s.range as [number, number]) : undefined;
    const values = Array.isArray(s.values) ? (s.values.filter((x) => ['string', 'number', 'boolean'].includes(typeof x)) as Signal['values']) : undefined;
    out[name] = { name, text: asText(s.text) ?? name, unit: asText(s.unit), range, values, path: ['signals', name] };
  }
  return out;
}

function buildLimit(signal: string, value: unknown, path: PathKey[]): Limit {
  const l = asRecord(value);
  return {
    signal,
    low: located(l.low, path, 'low'),
    high: located(l.high, path, 'high'),
    consequence: asText(l.consequence),
    correction: asText(l.correction),
    path,
  };
}

function buildInterlock(value: unknown, path: PathKey[]): Interlock {
  const l = asRecord(value);
  return {
    tag: asText(l.tag) ?? '',
    tripsWhen: located(l['trips-when'], path, 'trips-when') ?? { value: '', path: [...path, 'trips-when'] },
    action: asText(l.action) ?? '',
    latches: l.latches === true,
    holds: stateEntries(l.holds, [...path, 'holds']),
    path,
  };
}

function buildHazard(value: unknown, path: PathKey[]): Hazard {
  const h = asRecord(value);
  const at = Array.isArray(h.at) ? h.at : h.at === undefined ? [] : [h.at];
  return {
    level: (asText(h.level) ?? 'notice') as Hazard['level'],
    hazard: asText(h.hazard) ?? '',
    consequence: asText(h.consequence),
    avoid: asText(h.avoid),
    at: at.map((s, i) => ({ value: String(s), path: Array.isArray(h.at) ? [...path, 'at', i] : [...path, 'at'] })),
    when: located(h.when, path, 'when'),
    path,
  };
}

export function buildSequence(value: unknown, path: PathKey[]): SequenceItem[] {
  return asArray(value).flatMap((item, i): SequenceItem[] => {
    const itemPath = [...path, i];
    const r = asRecord(item);
    if ('parallel' in r) return [buildParallel(r, itemPath)];
    if ('choose' in r) return [buildChoose(r, itemPath)];
    if ('step' in r || 'do' in r) return [buildStep(r, itemPath)];
    return [];
  });
}

function buildStep(r: Data, path: PathKey[]): Step {
  const actions = Array.isArray(r.do) ? r.do.map((a) => String(a)) : r.do === undefined ? [] : [String(r.do)];
  const extra: Record<string, unknown> = {};
  for (const [k, v] of Object.entries(r)) if (!stepKeys.has(k)) extra[k] = v;
  return {
    kind: 'step',
    id: asText(r.step) ?? '',
    actions,
    phase: asText(r.phase),
    // An empty setpoint is reported by the schema check; it is not read again as the quantity 'null'.
    set: Object.entries(asRecord(r.set)).filter(([, q]) => q !== null && q !== undefined).map(([signal, q]) => ({ signal, quantity: String(q), path: [...path, 'set', signal] })),
    maxDrop: Object.entries(asRecord(r['max-drop'])).map(([signal, q]) => ({ signal, quantity: String(q), path: [...path, 'max-drop', signal] })),
    params: Object.entries(asRecord(r.params)).map(([name, v]) => ({
      name, value: typeof v === 'number' || typeof v === 'boolean' ? v : String(v), path: [...path, 'params', name],
    })),
    until: located(r.until, path, 'until'),
    confirm: located(r.confirm, path, 'confirm'),
    expect: located(r.expect, path, 'expect'),
    signOff: asText(r['sign-off']),
    note: asText(r.note),
    waivers: asArray(r.waive).map((w, i) => {
      const wr = asRecord(w);
      return { rule: asText(wr.rule) ?? '', reason: asText(wr.reason), path: [...path, 'waive', i] };
    }),
    state: r.state === undefined ? [] : stateActions(r.state, [...path, 'state']),
    needs: located(r.needs, path, 'needs'),
    trips: r.trips === undefined ? [] : locatedList(r.trips, [...path, 'trips']),
    resets: r.resets === undefined ? [] : locatedList(r.resets, [...path, 'resets']),
    performer: asText(r.performer),
    verify: r.verify && typeof r.verify === 'object' && !Array.isArray(r.verify)
      ? { kind: asText(asRecord(r.verify).kind) ?? '', role: asText(asRecord(r.verify).role) ?? '', path: [...path, 'verify'] } : undefined,
    timeLimit: r['time-limit'] === undefined ? undefined : timeLimitOf(r['time-limit'], [...path, 'time-limit']),
    ifNot: r['if-not'] === undefined ? undefined : ifNotOf(r['if-not'], [...path, 'if-not']),
    path,
    extra,
  };
}

function buildParallel(r: Data, path: PathKey[]): ParallelBlock {
  return {
    kind: 'parallel',
    branches: Object.entries(asRecord(r.parallel)).map(([name, seq]) => ({
      name, items: buildSequence(seq, [...path, 'parallel', name]), path: [...path, 'parallel', name],
    })),
    path,
  };
}

function buildChoose(r: Data, path: PathKey[]): ChooseBlock {
  return {
    kind: 'choose',
    branches: asArray(r.choose).map((b, i): ChooseBranch => {
      const bp = [...path, 'choose', i];
      const br = asRecord(b);
      const extra: Record<string, unknown> = {};
      for (const [k, v] of Object.entries(br)) if (!branchKeys.has(k)) extra[k] = v;
      return {
        when: located(br.when, bp, 'when'),
        otherwise: br.otherwise === true,
        items: 'steps' in br ? buildSequence(br.steps, [...bp, 'steps']) : undefined,
        goto: located(br.goto, bp, 'goto'),
        path: bp,
        extra,
      };
    }),
    path,
  };
}

function stateEntries(value: unknown, path: PathKey[]): StateEntry[] {
  return Object.entries(asRecord(value))
    .filter(([, v]) => v !== null && typeof v !== 'object')
    .map(([signal, v]) => ({ signal, value: String(v), path: [...path, signal] }));
}

function stateActions(value: unknown, path: PathKey[]): StateAction[] {
  return Object.entries(asRecord(value)).flatMap(([signal, v]): StateAction[] => {
    const at = [...path, signal];
    if (v === null || v === undefined) return [];
    if (typeof v !== 'object') return [{ signal, value: String(v), lasts: 'stored', path: at }];
    const o = asRecord(v);
    const to = asText(o.to);
    if (to === undefined) return [];
    const lasts = asText(o.lasts);
    const after = located(o.after, at, 'after');
    if (after) return [{ signal, value: to, lasts: 'delayed', duration: after, whileActive: lasts === 'step', path: at }];
    if (lasts === 'step') return [{ signal, value: to, lasts: 'step', path: at }];
    if (lasts !== undefined) return [{ signal, value: to, lasts: 'limited', duration: located(o.lasts, at, 'lasts'), path: at }];
    return [{ signal, value: to, lasts: 'stored', path: at }];
  });
}

function timeLimitOf(value: unknown, path: PathKey[]): Step['timeLimit'] {
  const t = asRecord(value);
  const max = located(t.max, path, 'max');
  if (!max) return undefined;
  return { max, then: asText(t.then) ?? '', goto: located(t.goto, path, 'goto'), path };
}

function ifNotOf(value: unknown, path: PathKey[]): Step['ifNot'] {
  if (value === undefined || value === null || typeof value !== 'object' || Array.isArray(value)) return undefined;
  const o = asRecord(value);
  const actions = Array.isArray(o.do) ? o.do.map(String) : o.do === undefined ? [] : [String(o.do)];
  return { actions, goto: located(o.goto, path, 'goto'), path };
}

function locatedList(value: unknown, path: PathKey[]): Located<string>[] {
  if (value === undefined || value === null) return [];
  const list = Array.isArray(value) ? value : [value];
  return list.flatMap((v, i) => located(v, Array.isArray(value) ? [...path, i] : path) ?? []);
}

/** The value with its path (`base`, then `key` when given); the path is made only for a value that is there. */
function located(value: unknown, base: PathKey[], key?: PathKey): Located<string> | undefined {
  if (value === undefined || value === null) return undefined;
  if (typeof value === 'object') return undefined;
  return { value: String(value), path: key === undefined ? base : [...base, key] };
}

function asRecord(value: unknown): Data {
  return value !== null && typeof value === 'object' && !Array.isArray(value) ? (value as Data) : {};
}

function asArray(value: unknown): unknown[] {
  return Array.isArray(value) ? value : [];
}

function asText(value: unknown): string | undefined {
  if (value === undefined || value === null || typeof value === 'object') return undefined;
  return String(value);
}
