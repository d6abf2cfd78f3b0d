// Reports a step's `expect` duration that cannot be read, is not finite or is longer than one step can take.
import { defineFileRule } from '../define-rule.ts';
import { maxDurationSeconds, parseDuration } from '../../analysis/units.ts';
import { walkSteps } from '../../model/walk-steps.ts';

export default defineFileRule(
  {
    id: 'expect-invalid',
    summary: "A step's expected duration cannot be read, or is longer than one step can take.",
    category: 'structure',
    defaultSeverity: 'error',
    docs: `\`expect\` gives the typical duration of a step (\`40 min\`, \`2 h\`, \`30..50 min\`); the cycle time and the
timeline of the published page are built from it. A duration that cannot be read counts as 0 on the page, so
the estimate is short without saying so. A duration longer than ${maxDurationSeconds / 86400} days (\`1e9 h\`) is a typing error, and
one that is not finite (\`1e309 h\`) cannot be drawn at all.`,
    examples: { bad: 'expect: 1e9 h', good: 'expect: 30..50 min' },
  },
  (ctx) => {
    if (!ctx.procedure) return;
    for (const { step } of walkSteps(ctx.procedure.steps)) {
      if (!step.expect) continue;
      const parsed = parseDuration(step.expect.value);
      if (parsed.ok) continue;
      ctx.report({ path: step.expect.path, message: `Step '${step.id}': ${parsed.message}`, hint: parsed.hint });
    }
  },
);
