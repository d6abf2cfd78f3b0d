// Reports a goto whose target step does not exist in the procedure.
import { closest } from 'fastest-levenshtein';
import { defineFileRule } from '../define-rule.ts';

export default defineFileRule(
  {
    id: 'goto-unknown-step',
    summary: 'A goto names a step that does not exist.',
    category: 'sequence',
    defaultSeverity: 'error',
    docs: 'The target of a `goto` must be the id of a step in the same procedure.',
    examples: { bad: 'goto: cooking', good: 'goto: cook' },
  },
  (ctx) => {
    if (!ctx.facts) return;
    const ids = [...ctx.facts.stepById.keys()];
    const seen = new Set<string>();
    for (const t of ctx.facts.graph.transitions) {
      if (!t.jump || t.jump.resolved) continue;
      const key = t.jump.path.join('.');
      if (seen.has(key)) continue;
      seen.add(key);
      ctx.report({
        path: t.jump.path,
        message: `goto '${t.jump.target}' names no step of this procedure.`,
        hint: ids.length ? `Did you mean '${closest(t.jump.target, ids)}'?` : 'Add the step, or jump to an existing step id.',
      });
    }
  },
);
