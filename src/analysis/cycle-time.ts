// Cycle time from `expect` durations: sequences add, parallel blocks take their longest branch, decisions give
// a range, loops repeat by the count declared on their jump; also the critical path and a typical-run timeline.
import type { PathKey } from '../parse/read-source.ts';
import type { ChooseBlock, ChooseBranch, Procedure, SequenceItem, Step } from '../model/procedure.ts';
import { parseDuration } from './units.ts';

/** Seconds. `longest` is Infinity when a loop declares no maximum count. */
export interface TimeRange {
  shortest: number;
  typical: number;
  longest: number;
}

export interface TimelineBar extends TimeRange {
  kind: 'step' | 'loop';
  /** Step id, or for a loop the id of the step it jumps back to. */
  id: string;
  label: string;
  /** Start in the typical run, seconds from the start of the procedure. */
  start: number;
  /** On the critical path (the run that gives the typical time). */
  critical: boolean;
  /** Nesting of parallel branches, for indenting the chart. */
  lane: string[];
}

export type CycleTimeNoteKind = 'no-expect' | 'bad-expect' | 'loop-without-repeat' | 'jump-not-estimated';

export interface CycleTimeNote {
  kind: CycleTimeNoteKind;
  message: string;
  path: PathKey[];
}

export interface CycleTime extends TimeRange {
  /** Step ids on the path that gives the typical time, in order. */
  criticalPath: string[];
  timeline: TimelineBar[];
  /** What the estimate could not take into account. */
  notes: CycleTimeNote[];
  /** Steps with a usable `expect`, and all steps. */
  stepsTimed: number;
  stepsTotal: number;
}

interface Measured extends TimeRange {
  path: string[];
  /** Bars of the typical run, relative to the start of this part. */
  bars: TimelineBar[];
}

/** One open sequence on the way down to the current item: the item index we are in. */
interface Frame {
  items: SequenceItem[];
  index: number;
}

const zero = (): Measured => ({ shortest: 0, typical: 0, longest: 0, path: [], bars: [] });

export function estimateCycleTime(procedure: Pick<Procedure, 'steps'>): CycleTime {
  const notes: CycleTimeNote[] = [];
  let stepsTimed = 0;
  let stepsTotal = 0;
  const stepRange = new Map<Step, TimeRange>();

  const durationOf = (step: Step): TimeRange => {
    const known = stepRange.get(step);
    if (known) return known;
    stepsTotal++;
    let range: TimeRange = { shortest: 0, typical: 0, longest: 0 };
    if (!step.expect) {
      notes.push({ kind: 'no-expect', path: [...step.path, 'step'], message: `Step '${step.id}' has no 'expect' duration; it counts as 0.` });
    } else {
      const parsed = parseDuration(step.expect.value);
      if (parsed.ok) {
        range = { shortest: parsed.min, typical: (parsed.min + parsed.max) / 2, longest: parsed.max };
        stepsTimed++;
      } else {
        notes.push({ kind: 'bad-expect', path: step.expect.path, message: `Step '${step.id}': ${parsed.message} It counts as 0.` });
      }
    }
    stepRange.set(step, range);
    return range;
  };

  const measureSequence = (items: SequenceItem[], frames: Frame[], lane: string[]): Measured => {
    const total = zero();
    items.forEach((item, index) => {
      const here = [...frames, { items, index }];
      const part = measureItem(item, here, lane);
      total.bars.push(...part.bars.map((b) => ({ ...b, start: b.start + total.typical })));
      total.shortest += part.shortest;
      total.typical += part.typical;
      total.longest += part.longest;
      total.path.push(...part.path);
    });
    return total;
  };

  const measureItem = (item: SequenceItem, frames: Frame[], lane: string[]): Measured => {
    if (item.kind === 'step') {
      const d = durationOf(item);
      return { ...d, path: [item.id], bars: [{ kind: 'step', id: item.id, label: item.actions[0] ?? item.id, start: 0, ...d, critical: true, lane }] };
    }
    if (item.kind === 'parallel') {
      const branches = item.branches.map((b) => measureSequence(b.items, [], [...lane, b.name]));
      if (!branches.length) return zero();
      const slowest = branches.reduce((a, b) => (b.typical > a.typical ? b : a));
      return {
        shortest: Math.max(...branches.map((b) => b.shortest)),
        typical: slowest.typical,
        longest: Math.max(...branches.map((b) => b.longest)),
        path: slowest.path,
        bars: branches.flatMap((b) => b.bars.map((bar) => ({ ...bar, critical: bar.critical && b === slowest }))),
      };
    }
    return measureChoose(item, frames, lane);
  };

  const measureChoose = (block: ChooseBlock, frames: Frame[], lane: string[]): Measured => {
    const exits: Measured[] = [];
    const loops: Array<{ branch: ChooseBranch; body: Measured; target: string }> = [];
    for (const branch of block.branches) {
      const own = measureSequence(branch.items ?? [], frames, lane);
      if (!branch.goto) {
        exits.push(own);
        continue;
      }
      const target = branch.goto.value;
      const before = pathBackTo(target, frames);
      if (!before) {
        notes.push({ kind: 'jump-not-estimated', path: branch.goto.path, message: `The jump to '${target}' is not a loop back to an earlier step of this sequence; its time is not included.` });
        continue;
      }
      const body = measureSequence(before, [], lane);
      loops.push({ branch, target, body: { ...body, shortest: body.shortest + own.shortest, typical: body.typical + own.typical, longest: body.longest + own.longest } });
    }
    const chosen = exits.length ? exits.reduce((a, b) => (b.typical > a.typical ? b : a)) : zero();
    const result: Measured = {
      shortest: exits.length ? Math.min(...exits.map((e) => e.shortest)) : 0,
      typical: 0,
      longest: exits.length ? Math.max(...exits.map((e) => e.longest)) : 0,
      path: [],
      bars: [],
    };
    for (const loop of loops) {
      const repeat = repeatOf(loop.branch);
      if (!repeat) {
        notes.push({ kind: 'loop-without-repeat', path: loop.branch.goto!.path, message: `The loop back to '${loop.target}' declares no 'repeat' count; the typical time counts no repeat and the longest time has no bound.` });
        result.longest = Number.POSITIVE_INFINITY;
        continue;
      }
      const typical = repeat.expected * loop.body.typical;
      result.bars.push({
        kind: 'loop', id: loop.target, label: `repeat from '${loop.target}' × ${repeat.expected} (at most ${repeat.max})`,
        start: result.typical, shortest: 0, typical, longest: repeat.max * loop.body.longest, critical: true, lane,
      });
      result.typical += typical;
      result.longest += repeat.max * loop.body.longest;
    }
    result.bars.push(...chosen.bars.map((b) => ({ ...b, start: b.start + result.typical })));
    result.typical += chosen.typical;
    result.path = chosen.path;
    return result;
  };

  const whole = measureSequence(procedure.steps, [], []);
  return {
    shortest: whole.shortest, typical: whole.typical, longest: whole.longest,
    criticalPath: whole.path, timeline: whole.bars, stepsTimed, stepsTotal,
    notes: onceEach(notes),
  };
}

/** A loop body is measured again for its repeats: each note is kept once, where it first came. */
function onceEach(notes: CycleTimeNote[]): CycleTimeNote[] {
  const seen = new Set<string>();
  return notes.filter((n) => {
    const key = `${n.kind}\u0000${n.path.join('.')}`;
    if (seen.has(key)) return false;
    seen.add(key);
    return true;
  });
}

/**
 * The items run again when a jump goes back to `target`: from the target (a step at the top of one of the
 * enclosing sequences) up to the decision, through every enclosing sequence in between. Undefined when the
 * target is not an earlier step of an enclosing sequence (a forward jump, or into another block).
 */
function pathBackTo(target: string, frames: Frame[]): SequenceItem[] | undefined {
  for (let f = frames.length - 1; f >= 0; f--) {
    const { items, index } = frames[f];
    const k = items.findIndex((item) => item.kind === 'step' && item.id === target);
    if (k < 0) continue;
    if (k > index) return undefined;
    const out = items.slice(k, index);
    // Deeper frames are choose branches entered on the way to the decision: their items before it run too.
    for (let g = f + 1; g < frames.length; g++) out.push(...frames[g].items.slice(0, frames[g].index));
    return out;
  }
  return undefined;
}

function repeatOf(branch: ChooseBranch): { expected: number; max: number } | undefined {
  const r = branch.extra.repeat as { expected?: unknown; max?: unknown } | undefined;
  if (!r || typeof r !== 'object') return undefined;
  const expected = typeof r.expected === 'number' && r.expected >= 0 ? r.expected : undefined;
  const max = typeof r.max === 'number' && r.max >= 0 ? r.max : undefined;
  if (expected === undefined || max === undefined) return undefined;
  return { expected: Math.min(expected, max), max };
}

/** "1 h 35 min", "40 min", "45 s"; rounded to the minute above an hour. */
export function formatSeconds(seconds: number): string {
  if (!Number.isFinite(seconds)) return 'no bound';
  if (seconds < 60) return `${Math.round(seconds)} s`;
  const minutes = Math.round(seconds / 60);
  if (minutes < 60) return `${minutes} min`;
  const h = Math.floor(minutes / 60);
  const m = minutes % 60;
  return m ? `${h} h ${m} min` : `${h} h`;
}
