// Reports a step that has no way to end: no until, no confirm, and no decision right after it.
import { defineFileRule } from '../define-rule.ts';

export default defineFileRule(
  {
    id: 'step-without-transition',
    summary: 'A step has no transition (no until, no confirm, and no choose block after it).',
    category: 'sequence',
    defaultSeverity: 'error',
    source: 'IEC 61131-3, sequential function charts: steps and transitions alternate',
    docs: `In a sequence, steps and transitions alternate: every step ends when a transition becomes true. A
step needs \`until\` (a condition on signals), \`confirm\` (an operator check), or a \`choose\` block directly
after it whose branch conditions end it. Otherwise nobody can tell when the step is finished. A step with
\`call\` runs another procedure and ends when that procedure ends, so it needs no transition of its own.`,
    examples: {
      bad: '- step: heat-up\n  do: Heat K-210 to 180 degC',
      good: '- step: heat-up\n  do: Heat K-210 to 180 degC\n  until: TI-210 >= 180 degC',
    },
  },
  (ctx) => {
    if (!ctx.facts) return;
    const reported = new Set<string>();
    for (const t of ctx.facts.graph.transitions) {
      if (!t.missing || !t.fromStep || reported.has(t.fromStep)) continue;
      const place = ctx.facts.stepById.get(t.fromStep);
      if (!place) continue;
      // A step that calls another procedure ends when that procedure ends.
      if (place.step.extra.call !== undefined) continue;
      reported.add(t.fromStep);
      ctx.report({
        path: [...place.step.path, 'step'],
        message: `Step '${t.fromStep}' has no transition: nothing says when it is finished.`,
        hint: "Add 'until: <condition>' or 'confirm: <operator check>', or follow the step with a choose block.",
      });
    }
  },
);
