// Says plainly when the plant-state checks could not look at all of a procedure.
import { defineFileRule } from '../define-rule.ts';

export default defineFileRule(
  {
    id: 'state-not-analysed',
    summary: 'The plant-state checks could not analyse part of the procedure.',
    category: 'sequence',
    defaultSeverity: 'warning',
    source: 'Common practice: a check that could not run says so',
    docs: `Hazard conditions, step needs, latched trips and the trips a step resets are checked against the plant state at every step. When
a condition cannot be analysed exactly (a name that is not declared, a unit that does not convert, too many
cases) or the procedure has more combinations of steps and states than the check explores, the rest of the
procedure was not checked for them, and this rule says which part. Fix the reported condition, or split the
procedure.`,
    examples: { bad: "hazards: [{ when: 'M-21O == running' }]  # a letter O, not a zero", good: "hazards: [{ when: 'M-210 == running' }]" },
  },
  (ctx) => {
    if (!ctx.facts || !ctx.procedure) return;
    const p = ctx.procedure;
    const usesState = p.hazards.some((h) => h.when) || p.interlocks.some((i) => i.latches && i.holds.length)
      || ctx.facts.steps.some(({ step }) => step.needs || (step.resets ?? []).some((r) => p.interlocks.some((i) => i.latches && i.tag === r.value)));
    if (!usesState) return;
    const gaps = ctx.facts.state.gaps;
    if (!gaps.length) return;
    ctx.report({
      path: ['steps'],
      part: 'key',
      message: `The plant-state checks (hazard conditions, needs, latched trips) did not cover everything: ${[...new Set(gaps)].slice(0, 3).join('; ')}${gaps.length > 3 ? ` and ${gaps.length - 3} more` : ''}.`,
      hint: 'Correct the conditions named here; until then, hazards, needs and latched trips are checked only where they can be.',
    });
  },
);
