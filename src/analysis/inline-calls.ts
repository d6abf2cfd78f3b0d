// Shared operations: finds `call` steps, links callers and callees, finds call cycles, and expands a
// procedure with every call replaced by the called procedure's steps (ids prefixed by the call step's id).
import type { PathKey } from '../parse/read-source.ts';
import type { ChooseBranch, Hazard, Procedure, SequenceItem, Step } from '../model/procedure.ts';
import { walkSteps } from '../model/walk-steps.ts';

export interface CallSite {
  /** The procedure that calls. */
  caller: string;
  step: Step;
  callee: string;
  /** The revision the call is pinned to, if any. */
  revision?: number;
  /** Path of the `call` value in the caller's front-matter. */
  path: PathKey[];
}

export type ProcedureLookup = (id: string) => Procedure | undefined;

/** Separates the call step's id from the called step's id in an expanded procedure. */
export const inlineSeparator = '/';

/** The call a step makes, read from its `call` key (a procedure id, or {procedure, revision}). */
export function callOf(step: Step): { callee: string; revision?: number } | undefined {
  const call = step.extra.call;
  if (typeof call === 'string' && call.trim()) return { callee: call.trim() };
  if (call && typeof call === 'object' && !Array.isArray(call)) {
    const { procedure, revision } = call as { procedure?: unknown; revision?: unknown };
    if (typeof procedure !== 'string' || !procedure.trim()) return undefined;
    return { callee: procedure.trim(), ...(typeof revision === 'number' ? { revision } : {}) };
  }
  return undefined;
}

export function callSitesOf(procedure: Pick<Procedure, 'id' | 'steps'>): CallSite[] {
  return walkSteps(procedure.steps).flatMap(({ step }) => {
    const call = callOf(step);
    return call ? [{ caller: procedure.id, step, ...call, path: [...step.path, 'call'] }] : [];
  });
}

export interface CallLinks {
  /** Procedure id → the calls it makes. */
  calls: Map<string, CallSite[]>;
  /** Procedure id → the calls made to it (from other procedures' steps). */
  callers: Map<string, CallSite[]>;
}

export function linkCalls(procedures: Iterable<Pick<Procedure, 'id' | 'steps'>>): CallLinks {
  const calls = new Map<string, CallSite[]>();
  const callers = new Map<string, CallSite[]>();
  for (const p of procedures) {
    const sites = callSitesOf(p);
    calls.set(p.id, sites);
    for (const site of sites) callers.set(site.callee, [...(callers.get(site.callee) ?? []), site]);
  }
  return { calls, callers };
}

/**
 * A chain of procedure ids from `site.callee` back to `site.caller` (the call closes a cycle), or undefined.
 * The chain starts with the caller: [A, B, …, A].
 */
export function callCycleThrough(site: CallSite, lookup: ProcedureLookup): string[] | undefined {
  const seen = new Set<string>();
  const search = (id: string, trail: string[]): string[] | undefined => {
    if (id === site.caller) return [...trail, id];
    if (seen.has(id)) return undefined;
    seen.add(id);
    const p = lookup(id);
    if (!p) return undefined;
    for (const next of callSitesOf(p)) {
      const found = search(next.callee, [...trail, id]);
      if (found) return found;
    }
    return undefined;
  };
  return search(site.callee, [site.caller]);
}

export type InlineProblem =
  | { kind: 'unknown-procedure'; site: CallSite }
  | { kind: 'cycle'; site: CallSite; chain: string[] }
  /** Expanding the call would nest calls deeper than `limit`. */
  | { kind: 'too-deep'; site: CallSite; depth: number; limit: number }
  /** Expanding the call would give more than `limit` steps in all (`steps` counts them, calls multiplied out). */
  | { kind: 'too-large'; site: CallSite; steps: number; limit: number };

/** Deepest chain of calls expanded (a procedure that calls one that calls one … ). */
export const maxCallDepth = 12;
/** Most steps an expanded procedure may hold; a call that would pass it stays a call step and is reported. */
export const maxExpandedSteps = 5000;

export interface InlineResult {
  procedure: Procedure;
  problems: InlineProblem[];
  /** Procedures whose steps were inlined, in the order met. */
  inlined: string[];
}

/**
 * Expands every call (recursively). A call that cannot be expanded (unknown procedure, or one that would
 * recurse) stays as the call step. Called steps keep their own YAML paths, which point into the callee's file;
 * `extra.inlinedFrom` says which procedure and call step they came from; `extra.callTimeLimit` and
 * `extra.callIfNot` name the call step (the nearest one) whose time limit or if-not covers a called step.
 */
export function inlineCalls(procedure: Procedure, lookup: ProcedureLookup): InlineResult {
  const problems: InlineProblem[] = [];
  const inlined: string[] = [];
  const signals: typeof procedure.signals = Object.assign(Object.create(null), procedure.signals);
  const limits = [...procedure.limits];
  const interlocks = [...procedure.interlocks];
  const hazards = [...procedure.hazards];

  // Steps produced so far, and the size of each procedure fully expanded (calls multiplied out), so that a
  // call that would blow up (each procedure calling the next twice) is refused before any work is done.
  let produced = 0;
  const sizes = new Map<string, number>();
  const sizeOf = (p: Procedure, visiting: Set<string>): number => {
    const known = sizes.get(p.id);
    if (known !== undefined) return known;
    visiting.add(p.id);
    let total = 0;
    for (const { step } of walkSteps(p.steps)) {
      const call = callOf(step);
      const callee = call && !visiting.has(call.callee) ? lookup(call.callee) : undefined;
      total += callee ? sizeOf(callee, visiting) + 1 : 1;
      if (total > Number.MAX_SAFE_INTEGER) break;
    }
    visiting.delete(p.id);
    sizes.set(p.id, total);
    return total;
  };

  const expandSequence = (items: SequenceItem[], stack: string[], prefix: string): SequenceItem[] =>
    items.flatMap((item): SequenceItem[] => {
      if (item.kind === 'parallel') {
        return [{ ...item, branches: item.branches.map((b) => ({ ...b, items: expandSequence(b.items, stack, prefix) })) }];
      }
      if (item.kind === 'choose') {
        return [{ ...item, branches: item.branches.map((b): ChooseBranch => ({
          ...b,
          items: b.items ? expandSequence(b.items, stack, prefix) : undefined,
          goto: b.goto ? { ...b.goto, value: prefix + b.goto.value } : undefined,
        })) }];
      }
      const step: Step = { ...item, id: prefix + item.id };
      produced++;
      const call = callOf(item);
      if (!call) return [step];
      const site: CallSite = { caller: stack.at(-1)!, step: item, ...call, path: [...item.path, 'call'] };
      if (stack.includes(call.callee)) {
        problems.push({ kind: 'cycle', site, chain: [...stack.slice(stack.indexOf(call.callee)), call.callee] });
        return [step];
      }
      const callee = lookup(call.callee);
      if (!callee) {
        problems.push({ kind: 'unknown-procedure', site });
        return [step];
      }
      if (stack.length >= maxCallDepth) {
        problems.push({ kind: 'too-deep', site, depth: stack.length + 1, limit: maxCallDepth });
        return [step];
      }
      const size = sizeOf(callee, new Set(stack));
      if (produced + size > maxExpandedSteps) {
        problems.push({ kind: 'too-large', site, steps: produced + size, limit: maxExpandedSteps });
        return [step];
      }
      inlined.push(callee.id);
      const inner = `${step.id}${inlineSeparator}`;
      // Paths of called content point into the callee's file; put them under the call so they can
      // never collide with the caller's own paths (rules key conditions by path) and locate at the call.
      const base = site.path;
      for (const [name, s] of Object.entries(callee.signals)) signals[name] ??= rebasePaths(s, base);
      limits.push(...callee.limits.filter((l) => !limits.some((m) => m.signal === l.signal)).map((l) => rebasePaths(l, base)));
      interlocks.push(...callee.interlocks.filter((i) => !interlocks.some((j) => j.tag === i.tag)).map((i) => rebasePaths(i, base)));
      hazards.push(...callee.hazards.map((h): Hazard => rebasePaths({ ...h, at: h.at.map((a) => ({ ...a, value: inner + a.value })) }, base)));
      const calleeSteps = callee.steps.map((s) => rebasePaths(s, base));
      let body = expandSequence(calleeSteps, [...stack, callee.id], inner).map((s) => markOrigin(s, callee, step.id));
      // A time limit or if-not on the call step covers every called step: say so on each (the call step is gone).
      if (item.timeLimit || item.ifNot) body = body.map((s) => markCallContingency(s, step.id, item));
      // The call step's own transition still has to hold once the called procedure has ended.
      if (item.until || item.confirm) {
        body.push({ ...step, actions: [`End of ${callee.id}`], expect: undefined, extra: { ...step.extra, call: undefined } });
      }
      return body;
    });

  const steps = expandSequence(procedure.steps, [procedure.id], '');
  return {
    procedure: { ...procedure, steps, signals, limits, interlocks, hazards },
    problems,
    inlined,
  };
}

/** Copies a model value with every YAML path placed under `base`; raw `extra` data is left as written. */
function rebasePaths<T>(value: T, base: PathKey[]): T {
  if (Array.isArray(value)) return value.map((v) => rebasePaths(v, base)) as T;
  if (value === null || typeof value !== 'object') return value;
  const out: Record<string, unknown> = {};
  for (const [key, v] of Object.entries(value as Record<string, unknown>)) {
    if (key === 'path' && Array.isArray(v)) out[key] = [...base, ...v];
    else if (key === 'extra') out[key] = v;
    else out[key] = rebasePaths(v, base);
  }
  return out as T;
}

function markOrigin(item: SequenceItem, callee: Procedure, callStep: string): SequenceItem {
  if (item.kind === 'step') {
    return item.extra.inlinedFrom ? item : { ...item, extra: { ...item.extra, inlinedFrom: { procedure: callee.id, file: callee.file, callStep } } };
  }
  if (item.kind === 'parallel') return { ...item, branches: item.branches.map((b) => ({ ...b, items: b.items.map((s) => markOrigin(s, callee, callStep)) })) };
  return { ...item, branches: item.branches.map((b) => ({ ...b, items: b.items?.map((s) => markOrigin(s, callee, callStep)) })) };
}

/** Marks each step of called content with the call step whose time limit or if-not covers it (the nearest kept). */
function markCallContingency(item: SequenceItem, callStep: string, call: Step): SequenceItem {
  if (item.kind === 'step') {
    const extra = { ...item.extra };
    if (call.timeLimit) extra.callTimeLimit ??= callStep;
    if (call.ifNot && (call.ifNot.actions.length || call.ifNot.goto)) extra.callIfNot ??= callStep;
    return { ...item, extra };
  }
  if (item.kind === 'parallel') return { ...item, branches: item.branches.map((b) => ({ ...b, items: b.items.map((s) => markCallContingency(s, callStep, call)) })) };
  return { ...item, branches: item.branches.map((b) => ({ ...b, items: b.items?.map((s) => markCallContingency(s, callStep, call)) })) };
}
