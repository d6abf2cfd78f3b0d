// Facts derived once per procedure and shared by all rules: parsed conditions, the step index, the step graph.
import type { PathKey } from '../parse/read-source.ts';
import type { Procedure } from '../model/procedure.ts';
import { walkBlocks, walkSteps, type StepPlace } from '../model/walk-steps.ts';
import type { ConditionParseResult } from './conditions/ast.ts';
import { parseCondition } from './conditions/parse.ts';
import { resolveCondition, type ResolveProblem } from './conditions/resolve.ts';
import { compileStepGraph, type StepGraph } from './step-graph.ts';
import { collectQuantities, type QuantitySite } from './quantity-sites.ts';
import { analyseState, type StateAnalysis } from './state/analyse-state.ts';
import { stateInputOf } from './state/state-input.ts';
import { RuleMemo } from './rule-memo.ts';

/** The plant-state analysis of each procedure's facts: only rules read it (see rule-memo.ts). */
const stateMemo = new RuleMemo<ProcedureFacts, StateAnalysis>();

export interface ConditionSite {
  path: PathKey[];
  text: string;
  role: 'until' | 'when' | 'trips-when' | 'needs' | 'line-up' | 'hazard-when';
  /** The step the condition ends or needs, or the interlock tag. */
  owner?: string;
  result: ConditionParseResult;
  /** Undeclared names, unit mismatches ... (empty when the text did not parse). */
  problems: ResolveProblem[];
  /** The register entry the condition came from (its own problems are reported in the register file). */
  fromRegister?: string;
}

export interface ProcedureFacts {
  procedure: Procedure;
  steps: StepPlace[];
  stepById: Map<string, StepPlace>;
  conditions: ConditionSite[];
  conditionAt(path: readonly PathKey[]): ConditionSite | undefined;
  /** Setpoints and operating limits, parsed. */
  quantities: QuantitySite[];
  readonly graph: StepGraph;
  /** The plant state at every step, over every path (computed on first use). */
  readonly state: StateAnalysis;
}

/**
 * Parse results by condition text: a manual repeats the same conditions many times, and a parse result is
 * never changed after parsing, so procedures can share it. Bounded so that a long-running process stays small.
 */
const parsedByText = new Map<string, ReturnType<typeof parseCondition>>();

function parsedCondition(text: string): ReturnType<typeof parseCondition> {
  let result = parsedByText.get(text);
  if (!result) {
    result = parseCondition(text);
    if (parsedByText.size >= 20_000) parsedByText.clear();
    parsedByText.set(text, result);
  }
  return result;
}

export function collectFacts(procedure: Procedure): ProcedureFacts {
  const steps = walkSteps(procedure.steps);
  const stepById = new Map<string, StepPlace>();
  for (const s of steps) if (s.step.id && !stepById.has(s.step.id)) stepById.set(s.step.id, s);

  const conditions: ConditionSite[] = [];
  const signals = procedure.signals;
  const add = (text: string, path: PathKey[], role: ConditionSite['role'], owner?: string, fromRegister?: string) => {
    const result = parsedCondition(text);
    const problems = result.ok ? resolveCondition(result.condition, signals) : [];
    conditions.push({ path, text, role, owner, result, problems, ...(fromRegister ? { fromRegister } : {}) });
  };
  for (const s of steps) if (s.step.until) add(s.step.until.value, s.step.until.path, 'until', s.step.id);
  for (const block of walkBlocks(procedure.steps)) {
    if (block.kind !== 'choose') continue;
    for (const b of block.branches) if (b.when) add(b.when.value, b.when.path, 'when');
  }
  for (const i of procedure.interlocks) if (i.tripsWhen.value) add(i.tripsWhen.value, i.tripsWhen.path, 'trips-when', i.tag, i.from?.id);
  for (const s of steps) if (s.step.needs) add(s.step.needs.value, s.step.needs.path, 'needs', s.step.id);
  for (const l of procedure.lineUp ?? []) add(l.value, l.path, 'line-up');
  for (const h of procedure.hazards) if (h.when) add(h.when.value, h.when.path, 'hazard-when');
  // Register trips share the path of the `uses` item that brought them; the procedure's own sites come first.
  const byPath = new Map<string, ConditionSite>();
  for (const c of conditions) if (!byPath.has(c.path.join('\u0000'))) byPath.set(c.path.join('\u0000'), c);

  let graph: StepGraph | undefined;
  const graphOnce = () => (graph ??= compileStepGraph(procedure));
  const facts: ProcedureFacts = {
    procedure,
    steps,
    stepById,
    conditions,
    conditionAt: (path) => byPath.get(path.join('\u0000')),
    quantities: collectQuantities(procedure, steps),
    get graph() {
      return graphOnce();
    },
    get state() {
      let state = stateMemo.get(facts);
      if (!state) {
        // The conditions of latching trips that a step resets: reset-while-tripped asks whether they can hold there.
        const reset = new Set(steps.flatMap(({ step }) => (step.resets ?? []).map((r) => r.value)));
        const latching = new Set(procedure.interlocks.filter((i) => i.latches && reset.has(i.tag)).map((i) => i.tag));
        const extra = conditions.filter((c) => c.role === 'needs' || c.role === 'hazard-when' || (c.role === 'trips-when' && latching.has(c.owner!)))
          .map((c) => c.text);
        stateMemo.set(facts, (state = analyseState(stateInputOf(procedure, graphOnce()), extra)));
      }
      return state;
    },
  };
  return facts;
}
