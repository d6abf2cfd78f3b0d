// Reports a step whose `needs` may be false when it is reached, on some path from the line-up.
import { unmetNeeds } from '../../analysis/state/state-findings.ts';
import { parseCondition } from '../../analysis/conditions/parse.ts';
import { conditionPressureNote } from '../../analysis/condition-pressure-note.ts';
import { defineFileRule } from '../define-rule.ts';
import { showPath } from '../state-path.ts';

export default defineFileRule(
  {
    id: 'step-need-unmet',
    summary: 'A step relies on a state that may not hold when it is reached.',
    category: 'sequence',
    defaultSeverity: 'error',
    source: 'OSHA 29 CFR 1910.119(f)(1)(i): steps for each operating phase; line-ups and preconditions: common practice',
    docs: `A step may say what it relies on with \`needs\` (\`needs: XV-2102 == open\`). The procedure's \`line-up\` says
what holds before the first step. Stepwright follows every path from the line-up through the steps, their
lasting actions and the conditions their transitions guarantee, and reports a step whose need may be false when
it is reached, with the path that leads there.

Fix it by adding the line-up item the procedure really starts from, or a step before that brings the plant into
the needed state. When a latched trip is what holds the state, latched-trip-holds-output reports it instead.`,
    examples: {
      bad: "line-up: ['XV-2102 == closed']\nsteps: [{ step: pressurise, needs: XV-2102 == open }]",
      good: "steps: [{ step: open-n2, state: { XV-2102: open } }, { step: pressurise, needs: XV-2102 == open }]",
    },
  },
  (ctx) => {
    if (!ctx.facts || !ctx.procedure) return;
    if (!ctx.facts.steps.some(({ step }) => step.needs)) return;
    const state = ctx.facts.state;
    const trips = ctx.procedure.interlocks.map((i) => ({ tag: i.tag, latches: i.latches, holds: i.holds }));
    for (const f of unmetNeeds(state, ctx.facts.graph, trips)) {
      if (f.trip) continue;
      const needs = parseCondition(f.step.needs!.value);
      const signals = ctx.procedure.signals;
      const note = needs.ok ? conditionPressureNote([needs.condition], (n) => signals[n]?.unit) : '';
      ctx.report({
        path: f.step.needs!.path,
        message: `Step '${f.step.id}' needs ${f.step.needs!.value}, but it may not hold when the step is reached (${f.values})${note}. Path: ${showPath(f.path)}.`,
        hint: 'Add the state to the line-up if the procedure starts from it, or add a step before this one that brings the plant into it.',
        trace: f.path,
      });
    }
  },
);
