// Reports a time-limit or if-not jump (goto) that does not lead the plant to a safe end: it leads back into the
// step that failed, or the procedure can end from it with equipment in a state it never ends in otherwise.
import type { StepGraph } from '../../analysis/step-graph.ts';
import { acceptedEndValues, enumValuesAt, enumeratedSignals, untilNames } from '../../analysis/state/end-states.ts';
import { walkSteps } from '../../model/walk-steps.ts';
import { defineFileRule } from '../define-rule.ts';
import { showPath } from '../state-path.ts';

export default defineFileRule(
  {
    id: 'contingency-goto-unsafe',
    summary: "A time limit's or if-not's jump leads back into the failed step, or lets the procedure end with equipment left in a state it never ends in otherwise.",
    category: 'safety',
    defaultSeverity: 'error',
    source: 'DOE-STD-1029-92 (contingency actions lead to a defined, safe condition); HSE HSG48 (plan for the expected failure); common practice',
    docs: `A step's \`time-limit\` and \`if-not\` may jump to another step (\`goto\`) when the step does not end as
expected. Stepwright follows that jump in the plant-state analysis, without the step's \`until\` holding (the
expected result did not come), so hazards, needs and latched trips are checked along it like any other path
(hazard-can-occur, step-need-unmet and latched-trip-holds-output report what goes wrong there, with the jump in the
path). This rule reports what only the jump itself shows:

- **it leads back into the failed step**: the response sends the operator round again with no limit — write a
  loop with a limit instead (a \`choose\` with \`goto\` and \`repeat\`), and send the time limit to a safe state;
- **it skips what makes the plant safe**: the procedure can end after the jump with equipment (a valve, a pump,
  a heater) in a state it is never left in when the procedure ends normally, and that is not the state the
  \`line-up\` finds it in (leaving the plant as it was found is safe) — for example, a time limit on the
  heat-up that jumps past the step that closes the hot-oil valve. The signals the failed step itself waits for
  are left out: the response is there because they did not move.

Fix it by jumping to the step that brings the plant to its safe state (stop heating, close the feed), or by
adding those actions to the response's own steps.`,
    examples: {
      bad: "- step: heat-up\n  state: { XV-2101: open }\n  time-limit: { max: 3 h, then: Stop, goto: write-log }   # skips close-hot-oil",
      good: "- step: heat-up\n  state: { XV-2101: open }\n  time-limit: { max: 3 h, then: Stop heating, goto: close-hot-oil }",
    },
  },
  (ctx) => {
    const p = ctx.procedure;
    if (!p || !ctx.facts) return;
    const jumping = ctx.facts.steps.filter(({ step }) => step.timeLimit?.goto || step.ifNot?.goto);
    if (!jumping.length) return;
    const graph = ctx.facts.graph;
    const analysis = ctx.facts.state;
    const stepById = new Map([...walkSteps(p.steps)].map(({ step }) => [step.id, step]));
    const enumerated = enumeratedSignals(p);
    // The plant may be left as the procedure normally leaves it, or as the line-up found it.
    const normalEnd = acceptedEndValues(analysis, p);
    for (const c of analysis.contingencies) {
      const step = stepById.get(c.step);
      if (!step) continue;
      const goto = c.kind === 'time-limit' ? step.timeLimit?.goto : step.ifNot?.goto;
      if (!goto) continue;
      const what = c.kind === 'time-limit' ? 'time limit' : 'if-not response';
      if (reaches(graph, analysis.contingencies, c.target, c.step)) {
        ctx.report({
          path: goto.path,
          message: `The ${what} of step '${c.step}' jumps to '${c.target}', which leads back to '${c.step}': the response repeats the failed step with no limit.`,
          hint: 'Jump to the step that makes the plant safe; to retry, write a loop with a limit (choose with goto and repeat: { expected, max }).',
        });
        continue;
      }
      const ends = analysis.endViews.get(c.step) ?? [];
      if (!ends.length || !normalEnd.size) continue;
      const waitedFor = untilNames(step);
      const after = enumValuesAt(ends, enumerated);
      const left: string[] = [];
      const odd = new Map<string, string[]>();
      for (const [signal, values] of after) {
        if (waitedFor.has(signal)) continue;
        const extra = [...values].filter((v) => !(normalEnd.get(signal) ?? new Set()).has(v));
        if (extra.length) {
          left.push(`${signal} ${extra.join(' or ')}`);
          odd.set(signal, extra);
        }
      }
      if (!left.length) continue;
      // The path to an end where one of those values holds.
      const view = ends.find(({ box }) => [...odd].some(([signal, extra]) => {
        const v = box.get(signal);
        return v?.kind === 'enum' && (v.set as string[]).some((w) => extra.includes(String(w)));
      })) ?? ends[0];
      const path = analysis.pathTo(view.node);
      ctx.report({
        path: goto.path,
        message: `After the ${what} of step '${c.step}' jumps to '${c.target}', the procedure can end with ${left.join(', ')}, which it never does when it runs normally and which is not how its line-up finds the plant. Path: ${showPath(path)}.`,
        hint: 'Jump to the step that brings the plant to its safe state (close the valve, stop the pump or heater), or add that action to the response.',
        trace: path,
      });
    }
  },
);

/** Whether `to` can be entered again after `from` is entered (through transitions and contingency jumps). */
function reaches(graph: StepGraph, jumps: Array<{ step: string; target: string }>, from: string, to: string): boolean {
  const start = graph.placeOfStep.get(from);
  const goal = graph.placeOfStep.get(to);
  if (!start || !goal) return false;
  if (start === goal) return true;
  const next = new Map<string, string[]>();
  for (const t of graph.transitions) for (const f of t.from) next.set(f, [...(next.get(f) ?? []), ...t.to]);
  for (const j of jumps) {
    const a = graph.placeOfStep.get(j.step);
    const b = graph.placeOfStep.get(j.target);
    if (a && b) next.set(a, [...(next.get(a) ?? []), b]);
  }
  const seen = new Set([start]);
  const queue = [start];
  while (queue.length) {
    const at = queue.shift()!;
    for (const n of next.get(at) ?? []) {
      if (n === goal) return true;
      if (!seen.has(n)) {
        seen.add(n);
        queue.push(n);
      }
    }
  }
  return false;
}
