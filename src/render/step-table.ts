// Turns the step sequence into the rows of the numbered step table: hazards repeated before the steps they
// name (DOE-STD-1029 practice), parallel blocks spelled out, decisions as "IF … THEN go to step N", loops marked.
import type { Hazard, HazardLevel, Procedure, SequenceItem, StateAction, Step } from '../model/procedure.ts';
import { honouredWaivers } from '../check/waivers.ts';
import { callOf } from '../analysis/inline-calls.ts';
import { conditionInWords } from './condition-words.ts';
import { hazardRank } from './signal-words.ts';
import { verifyLabel } from './step-roles.ts';
import { numberSteps, type StepNumbers } from './step-numbers.ts';

export interface StepRow {
  kind: 'step';
  id: string;
  number: string;
  actions: string[];
  phase?: string;
  setpoints: Array<{ signal: string; quantity: string; text?: string }>;
  params: Array<{ name: string; value: string }>;
  until?: string;
  /** `until` in plant words from the signals' texts, when every name in it has a text. */
  untilWords?: string;
  confirm?: string;
  expect?: string;
  signOff?: string;
  note?: string;
  /** Numbers of the steps that jump back here (a loop starts at this step). */
  loopFrom: string[];
  /** The worst hazard level named at this step, if any. */
  hazard?: HazardLevel;
  /** Rules set aside at this step, each with its written reason (the same waivers the checker honours). */
  waivers: Array<{ rule: string; reason: string }>;
  /** The role that does the step. */
  performer?: string;
  /** Who checks it, and how (independent verification, peer check, second-person sign-off). */
  verify?: { kind: string; label: string; role: string };
  /** A hold test's acceptance: the most each signal may fall during the step (`max-drop`). */
  maxDrop?: Array<{ signal: string; quantity: string }>;
  /** The longest the step may take, and what to do when it is exceeded. */
  timeLimit?: { max: string; then: string; goto?: StepTarget };
  /** What to do when the expected result does not come (the contingency). */
  ifNot?: { actions: string[]; goto?: StepTarget };
  /** A condition that must hold before the step starts (`needs`), and the same in plant words when it can be said. */
  needs?: string;
  needsWords?: string;
  /** The states the step puts equipment in (`state`), each in words: "Leaves XV-2107 open". */
  state?: StateWords[];
  /** Interlocks the step trips on purpose (a trip test). */
  trips?: string[];
  /** Latched interlocks the step resets. */
  resets?: string[];
  /** For each of them whose reset instruction a source gives (the plant register), that instruction. */
  resetHow?: ResetHow[];
  /** The shared operation the step runs (`call`): the step ends when that procedure has ended. */
  call?: { procedure: string; revision?: number };
  /** True when a decision directly follows the step: its branch conditions end the step. */
  decisionFollows?: boolean;
}

/** A lasting action in words, in parts so a page can link the tag: `${verb} ${signal} ${value} ${tail}`. */
export interface StateWords {
  verb: 'Leaves' | 'Holds';
  signal: string;
  value: string;
  /** How long it lasts or when it starts, e.g. "during this step", "for 30 s at most"; empty for a stored state. */
  tail: string;
  /** The whole sentence. */
  words: string;
}

/** A lasting action (`state` entry) in words an operator reads. */
export function stateWords(action: Pick<StateAction, 'signal' | 'value' | 'lasts' | 'duration' | 'whileActive'>): StateWords {
  const duration = action.duration ? formatDuration(action.duration.value) : '';
  const [verb, tail]: [StateWords['verb'], string] =
    action.lasts === 'step' ? ['Holds', 'during this step']
      : action.lasts === 'limited' ? ['Holds', `for ${duration} at most, not past this step`]
        : action.lasts === 'delayed' ? (action.whileActive ? ['Holds', `from ${duration} into this step until it ends`] : ['Leaves', `from ${duration} into this step`])
          : ['Leaves', ''];
  return { verb, signal: action.signal, value: action.value, tail, words: [verb, action.signal, action.value, tail].filter(Boolean).join(' ') };
}

/** What ends a call step in words: "When U2-K210-INERT-001 has ended". */
export function callEndWords(procedure: string): string {
  return `When ${procedure} has ended`;
}

/** How a trip is reset: the instruction, and the function it belongs to when that is one the trip starts. */
export interface ResetInstruction {
  text: string;
  through?: string;
}

/** The reset instruction of one trip a step resets. */
export interface ResetHow extends ResetInstruction {
  tag: string;
}

/** A step a contingency or time limit sends the operator to. */
export interface StepTarget { id: string; number?: string }

export interface HazardRow {
  kind: 'hazard';
  level: HazardLevel;
  hazard: string;
  consequence?: string;
  avoid?: string;
  /** The step the hazard is repeated before. */
  beforeStep: string;
}

export interface BlockRow {
  kind: 'parallel-start' | 'parallel-end' | 'branch';
  number: string;
  text: string;
}

export interface DecisionRow {
  kind: 'decision';
  number: string;
  /** The step whose end the decision waits for, with that step's own condition, when there is one. */
  after?: { number: string; id: string; condition?: string; conditionWords?: string };
  choices: Array<{ text: string; targetNumber?: string; targetId?: string; condition?: string; conditionWords?: string; otherwise?: boolean; where?: string }>;
}

export interface JumpRow {
  kind: 'jump';
  number: string;
  targetId: string;
  targetNumber?: string;
  /** True when the jump goes back to an earlier step: a loop. */
  loop: boolean;
}

export type TableRow = StepRow | HazardRow | BlockRow | DecisionRow | JumpRow;

/** Human form of an expected duration: `30..50 min` reads `30–50 min`. */
export function formatDuration(text: string): string {
  return text.replace(/\s*\.\.\s*/g, '–');
}

/**
 * The rows of the step table. `resetsByTag` gives the reset instruction of trips by tag (render/trip-latching.ts):
 * a step that resets one of them shows it.
 */
export function buildStepTable(
  procedure: Pick<Procedure, 'steps' | 'hazards' | 'signals'>,
  numbers: StepNumbers = numberSteps(procedure.steps),
  resetsByTag: ReadonlyMap<string, ResetInstruction> = new Map(),
): TableRow[] {
  const rows: TableRow[] = [];
  const hazardsAt = new Map<string, Hazard[]>();
  for (const h of procedure.hazards) for (const at of h.at) hazardsAt.set(at.value, [...(hazardsAt.get(at.value) ?? []), h]);
  for (const list of hazardsAt.values()) list.sort((a, b) => hazardRank(a.level) - hazardRank(b.level));

  // Document order of step numbers, to tell a loop (a jump back) from a jump forward.
  const order = new Map<string, number>();
  let counter = 0;
  const collectOrder = (items: SequenceItem[]) => {
    for (const item of items) {
      if (item.kind === 'step') order.set(item.id, counter++);
      else for (const b of item.branches) if (b.items) collectOrder(b.items);
    }
  };
  collectOrder(procedure.steps);

  const loopFrom = new Map<string, string[]>();

  const stepRow = (step: Step, decisionFollows: boolean): StepRow => ({
    kind: 'step', id: step.id, number: numbers.ofStep.get(step.id) ?? '?', actions: step.actions, phase: step.phase,
    setpoints: step.set.map((s) => ({ signal: s.signal, quantity: s.quantity, text: procedure.signals[s.signal]?.text })),
    params: step.params.map((p) => ({ name: p.name, value: String(p.value) })),
    until: step.until?.value, untilWords: step.until ? conditionInWords(step.until.value, procedure.signals) : undefined, confirm: step.confirm?.value, expect: step.expect ? formatDuration(step.expect.value) : undefined,
    signOff: step.signOff, note: step.note, loopFrom: [],
    hazard: hazardsAt.get(step.id)?.[0]?.level,
    waivers: honouredWaivers(step).map((w) => ({ rule: w.rule, reason: w.reason })),
    ...(step.performer ? { performer: step.performer } : {}),
    ...(step.verify ? { verify: { kind: step.verify.kind, label: verifyLabel(step.verify.kind), role: step.verify.role } } : {}),
    ...(step.maxDrop?.length ? { maxDrop: step.maxDrop.map((d) => ({ signal: d.signal, quantity: d.quantity })) } : {}),
    ...(step.timeLimit ? { timeLimit: { max: formatDuration(step.timeLimit.max.value), then: step.timeLimit.then, ...(step.timeLimit.goto ? { goto: target(step.timeLimit.goto.value) } : {}) } } : {}),
    ...(step.ifNot ? { ifNot: { actions: step.ifNot.actions, ...(step.ifNot.goto ? { goto: target(step.ifNot.goto.value) } : {}) } } : {}),
    ...(step.needs ? { needs: step.needs.value, ...withWords('needsWords', conditionInWords(step.needs.value, procedure.signals)) } : {}),
    ...(step.state?.length ? { state: step.state.map(stateWords) } : {}),
    ...(step.trips?.length ? { trips: step.trips.map((t) => t.value) } : {}),
    ...(step.resets?.length ? { resets: step.resets.map((t) => t.value), ...resetHowOf(step.resets.map((t) => t.value), resetsByTag) } : {}),
    ...callOfRow(step),
    ...(decisionFollows ? { decisionFollows: true } : {}),
  });
  const target = (id: string): StepTarget => ({ id, number: numbers.ofStep.get(id) });

  /** `next` names where the flow goes after this sequence ends: a step number, or a phrase. */
  const visit = (items: SequenceItem[], next: { number?: string; id?: string; text: string }) => {
    items.forEach((item, index) => {
      const after = nextOf(items, index, next);
      if (item.kind === 'step') {
        for (const h of hazardsAt.get(item.id) ?? []) {
          rows.push({ kind: 'hazard', level: h.level, hazard: h.hazard, consequence: h.consequence, avoid: h.avoid, beforeStep: item.id });
        }
        rows.push(stepRow(item, items[index + 1]?.kind === 'choose'));
        return;
      }
      const own = numbers.ofBlock.get(item)!;
      if (item.kind === 'parallel') {
        const names = item.branches.map((b, i) => `${own}${numbers.letterOf(item, i)} (${b.name})`);
        rows.push({ kind: 'parallel-start', number: own, text: `Do branches ${joinWords(names)} at the same time.` });
        item.branches.forEach((b, i) => {
          const letter = numbers.letterOf(item, i);
          rows.push({ kind: 'branch', number: `${own}${letter}`, text: `Branch ${own}${letter}: ${b.name}` });
          visit(b.items, { text: `the end of branch ${own}${letter}` });
        });
        rows.push({ kind: 'parallel-end', number: own, text: `Go on to ${after.number ? `step ${after.number}` : after.text} only when every branch of ${own} is done.` });
        return;
      }
      const previous = items[index - 1];
      const decision: DecisionRow = {
        kind: 'decision', number: own, choices: [],
        after: previous?.kind === 'step'
          ? {
            number: numbers.ofStep.get(previous.id) ?? '?', id: previous.id,
            condition: [previous.until?.value, previous.confirm ? `confirm: ${previous.confirm.value}` : undefined].filter(Boolean).join(' and ') || undefined,
            conditionWords: previous.until && !previous.confirm ? conditionInWords(previous.until.value, procedure.signals) : undefined,
          }
          : undefined,
      };
      item.branches.forEach((b) => {
        const condition = b.otherwise ? 'OTHERWISE' : `IF ${b.when?.value ?? '(no condition)'} THEN`;
        const first = b.items?.length ? numbers.firstIn(b.items) : undefined;
        const target = first
          ? { number: first, id: b.items![0].kind === 'step' ? (b.items![0] as Step).id : undefined }
          : b.goto ? { number: numbers.ofStep.get(b.goto.value), id: b.goto.value } : { number: after.number, id: after.id };
        const where = target.number ? `go to step ${target.number}${target.id ? ` (${target.id})` : ''}` : `go to ${after.text}`;
        decision.choices.push({
          text: `${condition} ${where}`, targetNumber: target.number, targetId: target.id, where, otherwise: b.otherwise || undefined,
          condition: b.when?.value, conditionWords: b.when ? conditionInWords(b.when.value, procedure.signals) : undefined,
        });
      });
      rows.push(decision);
      item.branches.forEach((b, i) => {
        if (!b.items?.length && !b.goto) return;
        if (b.items?.length) visit(b.items, b.goto ? { text: '' } : after);
        if (b.goto) {
          const targetNumber = numbers.ofStep.get(b.goto.value);
          const fromNumber = b.items?.length ? lastNumber(b.items, numbers) ?? own : `${own}${numbers.letterOf(item, i)}`;
          const loop = (order.get(b.goto.value) ?? Infinity) < (b.items?.length ? (order.get(lastStepId(b.items) ?? '') ?? 0) + 1 : orderBefore(items, index));
          if (loop) loopFrom.set(b.goto.value, [...(loopFrom.get(b.goto.value) ?? []), fromNumber]);
          rows.push({ kind: 'jump', number: fromNumber, targetId: b.goto.value, targetNumber, loop });
        }
      });
    });
  };

  const orderBefore = (items: SequenceItem[], index: number): number => {
    for (let i = index - 1; i >= 0; i--) {
      const id = lastStepId([items[i]]);
      if (id) return (order.get(id) ?? 0) + 1;
    }
    return 0;
  };

  visit(procedure.steps, { text: 'the end of the procedure' });
  for (const row of rows) if (row.kind === 'step') row.loopFrom = loopFrom.get(row.id) ?? [];
  return rows;

  function nextOf(items: SequenceItem[], index: number, next: { number?: string; id?: string; text: string }) {
    const following = items[index + 1];
    if (!following) return next;
    const number = numbers.firstIn([following]);
    return { number, id: following.kind === 'step' ? following.id : undefined, text: `step ${number}` };
  }
}

function lastStepId(items: SequenceItem[]): string | undefined {
  for (let i = items.length - 1; i >= 0; i--) {
    const item = items[i];
    if (item.kind === 'step') return item.id;
    for (let b = item.branches.length - 1; b >= 0; b--) {
      const branch = item.branches[b];
      const id = branch.items ? lastStepId(branch.items) : undefined;
      if (id) return id;
    }
  }
  return undefined;
}

function lastNumber(items: SequenceItem[], numbers: StepNumbers): string | undefined {
  const id = lastStepId(items);
  return id ? numbers.ofStep.get(id) : undefined;
}

function withWords(key: 'needsWords', words: string | undefined): { needsWords?: string } {
  return words ? { [key]: words } : {};
}

function resetHowOf(tags: string[], resetsByTag: ReadonlyMap<string, ResetInstruction>): { resetHow?: ResetHow[] } {
  const how = tags.flatMap((tag) => {
    const known = resetsByTag.get(tag);
    return known ? [{ tag, text: known.text, ...(known.through ? { through: known.through } : {}) }] : [];
  });
  return how.length ? { resetHow: how } : {};
}

function callOfRow(step: Step): { call?: StepRow['call'] } {
  const call = callOf(step);
  return call ? { call: { procedure: call.callee, ...(call.revision !== undefined ? { revision: call.revision } : {}) } } : {};
}

function joinWords(words: string[]): string {
  if (words.length <= 1) return words.join('');
  return `${words.slice(0, -1).join(', ')} and ${words[words.length - 1]}`;
}
