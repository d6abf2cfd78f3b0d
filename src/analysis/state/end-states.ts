// How a procedure leaves the plant: the values each enumerated signal can have when the procedure ends, read from
// the plant-state analysis, and the values the line-up finds it in. Shared by the rules that judge the end state
// (a contingency jump that skips the safe state; ordinary paths that end differently).
import type { Procedure, Step } from '../../model/procedure.ts';
import { namesIn, parseCondition } from '../conditions/parse.ts';
import type { StateAnalysis, StateView } from './analyse-state.ts';
import { storedActions } from './state-input.ts';

/** The enumerated signals of a procedure (those with `values`). */
export function enumeratedSignals(procedure: Pick<Procedure, 'signals'>): string[] {
  return Object.entries(procedure.signals).filter(([, s]) => (s.values?.length ?? 0) > 0).map(([n]) => n);
}

/** Every value each of `names` (enumerated) can have in the views. */
export function enumValuesAt(views: ReadonlyArray<Pick<StateView, 'box'>>, names: readonly string[]): Map<string, Set<string>> {
  const out = new Map<string, Set<string>>();
  for (const { box } of views) {
    for (const n of names) {
      const v = box.get(n);
      if (!v || v.kind !== 'enum') continue;
      const set = out.get(n) ?? new Set<string>();
      for (const w of v.set) set.add(String(w));
      out.set(n, set);
    }
  }
  return out;
}

/**
 * The values the line-up finds each enumerated signal in, for the signals it says something about (a signal the
 * line-up leaves free, with every value possible, is left out).
 */
export function lineUpValues(analysis: Pick<StateAnalysis, 'start'>, procedure: Pick<Procedure, 'signals'>): Map<string, Set<string>> {
  const names = enumeratedSignals(procedure);
  const out = enumValuesAt(analysis.start.map((box) => ({ box })), names);
  for (const [signal, values] of out) if (values.size >= (procedure.signals[signal].values?.length ?? 0)) out.delete(signal);
  return out;
}

/**
 * The values the plant may safely be left in: as the procedure ends when it runs normally (no contingency jump),
 * or as the line-up found it.
 */
export function acceptedEndValues(analysis: Pick<StateAnalysis, 'start' | 'endViews'>, procedure: Pick<Procedure, 'signals'>): Map<string, Set<string>> {
  const out = enumValuesAt(analysis.endViews.get('') ?? [], enumeratedSignals(procedure));
  for (const [signal, values] of lineUpValues(analysis, procedure)) for (const v of values) out.get(signal)?.add(v);
  return out;
}

/** The signals a step waits for (its until), by name. */
export function untilNames(step: Step): Set<string> {
  const out = new Set<string>();
  if (step.until) {
    const parsed = parseCondition(step.until.value);
    if (parsed.ok) for (const n of namesIn(parsed.condition)) out.add(n.name);
  }
  return out;
}

/**
 * The signals a step moves for good: its stored `state` actions, its setpoints (`set`) and what its `until`
 * waits for (the analysis moves a signal a step drives to the value its until waits for).
 */
export function signalsMovedBy(step: Step): Set<string> {
  const out = untilNames(step);
  for (const a of storedActions(step)) out.add(a.signal);
  for (const s of step.set) out.add(s.signal);
  return out;
}
