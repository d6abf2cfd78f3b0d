// Compiles a procedure's sequence, parallel, choose and goto into one graph of steps and transitions
// (IEC 61131-3 SFC: steps and transitions alternate; simultaneous and selective divergence/convergence).
// Virtual places mark the start, the end, and the entry and completion of parallel branches, so the
// graph is a workflow net: one token in "start", and a sound procedure always ends with one token in "end".
import type { PathKey } from '../parse/read-source.ts';
import type { ChooseBlock, ParallelBlock, Procedure, SequenceItem, Step } from '../model/procedure.ts';
import { parallelScopeKey } from '../model/walk-steps.ts';

export type PlaceKind = 'start' | 'end' | 'step' | 'branch-start' | 'branch-done';

export interface Place {
  id: string;
  kind: PlaceKind;
  step?: Step;
  label: string;
  /** Parallel branches the place is inside, outermost first. */
  scope: string[];
}

export interface GuardPart {
  kind: 'until' | 'confirm' | 'when' | 'otherwise';
  text: string;
  path: PathKey[];
}

export type TransitionKind = 'begin' | 'step' | 'fork' | 'join' | 'enter-branch' | 'leave-branch' | 'jump' | 'finish';

export interface Transition {
  id: string;
  from: string[];
  to: string[];
  /** All parts must hold for the transition to fire; an empty guard fires at once. */
  guard: GuardPart[];
  kind: TransitionKind;
  /** True when a real step has no way to end (no until, confirm or following decision). */
  missing: boolean;
  /** The step whose end this transition is, when there is one. */
  fromStep?: string;
  /** Set on a transition that jumps (goto). */
  jump?: { target: string; path: PathKey[]; resolved: boolean };
  /** Set on a transition that takes a branch of a choose block. */
  choose?: { path: PathKey[]; branch: number };
}

export interface StepGraph {
  places: Place[];
  transitions: Transition[];
  start: string;
  end: string;
  /** Step id → place id (the first step with that id when ids repeat). */
  placeOfStep: Map<string, string>;
}

interface Pending {
  from: string[];
  guard: GuardPart[];
  missing: boolean;
  fromStep?: string;
  choose?: { path: PathKey[]; branch: number };
  kind: TransitionKind;
}

export function compileStepGraph(procedure: Pick<Procedure, 'steps'>): StepGraph {
  const places: Place[] = [];
  const transitions: Transition[] = [];
  const placeOfStep = new Map<string, string>();
  const placeOfNode = new Map<Step, string>();
  const usedIds = new Set<string>();

  const addPlace = (wanted: string, kind: PlaceKind, label: string, scope: string[], step?: Step): string => {
    let id = wanted;
    for (let n = 2; usedIds.has(id); n++) id = `${wanted}#${n}`;
    usedIds.add(id);
    places.push({ id, kind, label, scope, step });
    return id;
  };
  const addTransition = (p: Pending, to: string[], extra: Partial<Transition> = {}): Transition => {
    const t: Transition = {
      id: `t${transitions.length + 1}`, from: p.from, to, guard: p.guard, kind: p.kind, missing: p.missing,
      fromStep: p.fromStep, choose: p.choose, ...extra,
    };
    transitions.push(t);
    return t;
  };

  const start = addPlace('(start)', 'start', 'start', []);
  // First pass: a place for every step, so that jumps and forks can name places not compiled yet.
  const assign = (items: SequenceItem[], scope: string[]) => {
    for (const item of items) {
      if (item.kind === 'step') {
        const id = addPlace(item.id || '(unnamed step)', 'step', item.id, scope, item);
        placeOfNode.set(item, id);
        if (item.id && !placeOfStep.has(item.id)) placeOfStep.set(item.id, id);
      } else if (item.kind === 'parallel') {
        for (const b of item.branches) assign(b.items, [...scope, parallelScopeKey(item, b.name)]);
      } else {
        for (const b of item.branches) if (b.items) assign(b.items, scope);
      }
    }
  };
  assign(procedure.steps, []);
  const end = addPlace('(end)', 'end', 'end', []);

  const stepGuard = (step: Step): GuardPart[] => {
    const parts: GuardPart[] = [];
    if (step.until) parts.push({ kind: 'until', text: step.until.value, path: step.until.path });
    if (step.confirm) parts.push({ kind: 'confirm', text: step.confirm.value, path: step.confirm.path });
    return parts;
  };

  /** Compiles a sequence; `entry` transitions lead into it, or 'connected' when a fork already leads to its first step. */
  const compileSequence = (items: SequenceItem[], entry: Pending[] | 'connected', scope: string[]): Pending[] => {
    let pending: Pending[] = entry === 'connected' ? [] : entry;
    items.forEach((item, index) => {
      if (item.kind === 'step') {
        const place = placeOfNode.get(item)!;
        if (!(entry === 'connected' && index === 0)) for (const p of pending) addTransition(p, [place]);
        const own = stepGuard(item);
        const next = items[index + 1];
        pending = [{ from: [place], guard: own, missing: own.length === 0 && next?.kind !== 'choose', fromStep: item.id, kind: 'step' }];
      } else if (item.kind === 'choose') {
        pending = compileChoose(item, pending, scope);
      } else {
        pending = compileParallel(item, pending, scope);
      }
    });
    return pending;
  };

  const compileChoose = (block: ChooseBlock, pending: Pending[], scope: string[]): Pending[] => {
    const exits: Pending[] = [];
    block.branches.forEach((branch, index) => {
      const own: GuardPart[] = branch.otherwise
        ? [{ kind: 'otherwise', text: 'otherwise', path: [...branch.path, 'otherwise'] }]
        : branch.when ? [{ kind: 'when', text: branch.when.value, path: branch.when.path }] : [];
      const choose = { path: block.path, branch: index };
      const entry = pending.map((p): Pending => ({
        from: p.from, guard: [...p.guard, ...own], missing: own.length === 0 && p.guard.length === 0, fromStep: p.fromStep, choose, kind: p.kind,
      }));
      const branchExits = branch.items ? compileSequence(branch.items, entry, scope) : entry;
      if (branch.goto) {
        const target = placeOfStep.get(branch.goto.value);
        for (const e of branchExits) {
          addTransition(e, target ? [target] : [], {
            kind: e.kind === 'step' && branch.items?.length ? 'step' : e.kind,
            jump: { target: branch.goto.value, path: branch.goto.path, resolved: target !== undefined },
          });
        }
      } else exits.push(...branchExits);
    });
    return exits;
  };

  const compileParallel = (block: ParallelBlock, pending: Pending[], scope: string[]): Pending[] => {
    const heads: string[] = [];
    const entries: Array<Pending[] | 'connected'> = [];
    for (const branch of block.branches) {
      const first = branch.items[0];
      if (first?.kind === 'step') {
        heads.push(placeOfNode.get(first)!);
        entries.push('connected');
      } else {
        const key = parallelScopeKey(block, branch.name);
        const head = addPlace(`(${branch.name} begins)`, 'branch-start', `${branch.name} begins`, [...scope, key]);
        heads.push(head);
        entries.push([{ from: [head], guard: [], missing: false, kind: 'enter-branch' }]);
      }
    }
    for (const p of pending) addTransition(p, heads, { kind: p.kind === 'step' ? 'step' : 'fork' });
    const done: string[] = [];
    block.branches.forEach((branch, i) => {
      const key = parallelScopeKey(block, branch.name);
      const exits = compileSequence(branch.items, entries[i], [...scope, key]);
      const doneId = addPlace(`(${branch.name} done)`, 'branch-done', `${branch.name} done`, [...scope, key]);
      for (const e of exits) addTransition(e, [doneId], { kind: e.kind === 'step' ? 'step' : 'leave-branch' });
      done.push(doneId);
    });
    return [{ from: done, guard: [], missing: false, kind: 'join' }];
  };

  const exits = compileSequence(procedure.steps, [{ from: [start], guard: [], missing: false, kind: 'begin' }], []);
  for (const e of exits) addTransition(e, [end], { kind: e.kind === 'step' ? 'step' : 'finish' });
  return { places, transitions, start, end, placeOfStep };
}
