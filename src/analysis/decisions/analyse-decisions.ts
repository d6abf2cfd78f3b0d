// For every choose block: the part of the signal space each branch takes, the pairs of branches that can be
// true at once (with a witness), and the values no branch takes. A step's own `until` joins each branch's `when`.
import type { PathKey } from '../../parse/read-source.ts';
import type { ChooseBlock } from '../../model/procedure.ts';
import { walkBlocks } from '../../model/walk-steps.ts';
import type { Condition } from '../conditions/ast.ts';
import type { ProcedureFacts } from '../procedure-facts.ts';
import { NotAnalysable, SignalSpace, type Box, type Region, type SpaceOptions } from './signal-space.ts';
import { RuleMemo } from '../rule-memo.ts';

export interface BranchRegion {
  index: number;
  /** The `when` text, or "otherwise". */
  label: string;
  /** Where the branch's condition is written. */
  path: PathKey[];
  /** Values for which the branch is taken (with the step's own until). */
  region: Region;
}

export interface ChooseAnalysis {
  block: ChooseBlock;
  /** The until of the step the decision ends, when there is one. */
  before?: { text: string; path: PathKey[] };
  space?: SignalSpace;
  branches: BranchRegion[];
  overlaps: Array<{ a: number; b: number; box: Box; witness: string[] }>;
  /** Values for which no branch is true (none when a branch says `otherwise`). */
  gap: Region;
  /** Why the decision was not analysed (a condition that does not parse, an undeclared name ...). */
  skipped?: string;
}

function boundedElapsed(box: Box): boolean {
  const time = box.get('elapsed');
  return time?.kind === 'number' && time.set.length > 0 && Number.isFinite(time.set[time.set.length - 1].hi);
}

const samePath = (a: readonly PathKey[], b: readonly PathKey[]) => a.length === b.length && a.every((x, i) => x === b[i]);

function parsed(facts: ProcedureFacts, path: PathKey[]): Condition {
  const site = facts.conditionAt(path);
  if (!site || !site.result.ok) throw new NotAnalysable('condition does not parse');
  if (site.problems.length) throw new NotAnalysable(site.problems[0].message);
  return site.result.condition;
}

/** The until conditions in force when the decision is taken: the same for every way into it, or none. */
function untilBefore(facts: ProcedureFacts, block: ChooseBlock): { text: string; path: PathKey[] } | undefined {
  const prefixes = new Set<string>();
  let found: { text: string; path: PathKey[] } | undefined;
  for (const t of facts.graph.transitions) {
    if (!t.choose || !samePath(t.choose.path, block.path) || t.choose.branch !== 0) continue;
    const untils = t.guard.filter((g) => g.kind === 'until');
    prefixes.add(untils.map((g) => g.path.join('.')).join('|'));
    if (untils.length === 1) found = { text: untils[0].text, path: untils[0].path };
    if (untils.length > 1) return undefined;
  }
  return prefixes.size === 1 ? found : undefined;
}

export function analyseChoose(facts: ProcedureFacts, block: ChooseBlock, options: SpaceOptions = { useRanges: true }): ChooseAnalysis {
  const result: ChooseAnalysis = { block, branches: [], overlaps: [], gap: [] };
  try {
    if (block.branches.some((b) => !b.when && !b.otherwise)) throw new NotAnalysable('a branch has no condition');
    const before = untilBefore(facts, block);
    result.before = before;
    const whens = block.branches.map((b) => (b.when ? parsed(facts, b.when.path) : undefined));
    const prior = before ? parsed(facts, before.path) : undefined;
    const conditions = [...whens, prior].filter((c): c is Condition => c !== undefined);
    const space = new SignalSpace(facts.procedure.signals, conditions, options);
    result.space = space;
    const start: Region = prior ? space.regionOf(prior) : [new Map()];
    const hasOtherwise = block.branches.some((b) => b.otherwise);
    let taken: Region = [];
    block.branches.forEach((branch, index) => {
      const when = whens[index];
      if (!when) return;
      const region = space.and(start, space.regionOf(when));
      result.branches.push({ index, label: branch.when!.value, path: branch.when!.path, region });
      taken = space.or(taken, region);
    });
    for (let i = 0; i < result.branches.length; i++) {
      for (let j = i + 1; j < result.branches.length; j++) {
        const both = space.and(result.branches[i].region, result.branches[j].region);
        if (both.length) result.overlaps.push({ a: result.branches[i].index, b: result.branches[j].index, box: both[0], witness: space.witness(both[0]) });
      }
    }
    const rest = space.and(start, space.not(taken));
    const otherwise = block.branches.findIndex((b) => b.otherwise);
    if (hasOtherwise) result.branches.push({ index: otherwise, label: 'otherwise', path: [...block.branches[otherwise].path, 'otherwise'], region: rest });
    // Time in the step only grows: values that hold only while `elapsed` is below a bound are a wait, not a gap.
    else result.gap = facts.procedure.signals.elapsed ? rest : rest.filter((box) => !boundedElapsed(box));
    result.branches.sort((a, b) => a.index - b.index);
  } catch (error) {
    if (!(error instanceof NotAnalysable)) throw error;
    result.skipped = error.message;
  }
  return result;
}

const cache = new RuleMemo<ProcedureFacts, ChooseAnalysis[]>();

/** Every decision of the procedure, analysed once and shared by the rules and --explain. */
export function analyseDecisions(facts: ProcedureFacts): ChooseAnalysis[] {
  let found = cache.get(facts);
  if (!found) {
    found = walkBlocks(facts.procedure.steps).filter((b): b is ChooseBlock => b.kind === 'choose').map((b) => analyseChoose(facts, b));
    cache.set(facts, found);
  }
  return found;
}
