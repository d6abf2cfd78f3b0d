// Durations a step states about itself, in seconds: the shortest time its transition can take (from
// `elapsed` in its until), its expected duration, and its time limit.
import type { Condition } from './conditions/ast.ts';
import { parseCondition } from './conditions/parse.ts';
import { parseDuration, parseQuantity, toBase, unitDimension } from './units.ts';
import type { Step } from '../model/procedure.ts';

export interface Bound {
  seconds: number;
  /** True when the bound itself is excluded (elapsed > 60 min). */
  strict: boolean;
}

/** The least time the condition needs to become true by `elapsed` alone; 0 when it does not depend on it. */
export function shortestElapsed(condition: Condition): Bound {
  switch (condition.kind) {
    case 'compare': {
      if (condition.name.name !== 'elapsed' || condition.value.kind !== 'quantity') return none;
      if (condition.op !== '>=' && condition.op !== '>' && condition.op !== '==') return none;
      const s = toBase(condition.value.value, condition.value.unit);
      return s === null || !Number.isFinite(s) ? none : { seconds: s, strict: condition.op === '>' };
    }
    case 'and':
      return condition.operands.map(shortestElapsed).reduce((a, b) => (b.seconds > a.seconds || (b.seconds === a.seconds && b.strict) ? b : a), none);
    case 'or':
      return condition.operands.map(shortestElapsed).reduce((a, b) => (b.seconds < a.seconds || (b.seconds === a.seconds && !b.strict) ? b : a));
    default:
      return none;
  }
}

const none: Bound = { seconds: 0, strict: false };

/** The time limit's maximum in seconds, when it is a duration with a time unit (anything else is reported elsewhere). */
export function timeLimitSeconds(step: Step): number | undefined {
  if (!step.timeLimit) return undefined;
  const q = parseQuantity(step.timeLimit.max.value);
  if (!q.ok || unitDimension(q.unit) !== 'time' || q.value < 0) return undefined;
  const s = toBase(q.value, q.unit);
  return s === null || !Number.isFinite(s) ? undefined : s;
}

/** The shortest time the step's until can take, when it waits for elapsed time. */
export function untilShortest(step: Step): Bound | undefined {
  if (!step.until) return undefined;
  const parsed = parseCondition(step.until.value);
  if (!parsed.ok) return undefined;
  const b = shortestElapsed(parsed.condition);
  return b.seconds > 0 ? b : undefined;
}

/** The longest expected duration, when `expect` can be read. */
export function expectedLongest(step: Step): number | undefined {
  if (!step.expect) return undefined;
  const d = parseDuration(step.expect.value);
  return d.ok ? d.max : undefined;
}
