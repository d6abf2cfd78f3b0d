// Reports calls that lead back to the calling procedure (a procedure that, through its calls, runs itself).
import { callCycleThrough, callSitesOf } from '../../analysis/inline-calls.ts';
import type { Procedure } from '../../model/procedure.ts';
import { defineManualRule } from '../define-rule.ts';

export default defineManualRule(
  {
    id: 'call-cycle',
    summary: 'Procedures call each other in a circle, so the expanded sequence never ends.',
    category: 'sequence',
    defaultSeverity: 'error',
    docs: `A called procedure runs to its end before the calling step ends. When procedure A calls B and B (directly
or through others) calls A again, expanding the calls never finishes and neither would the operator. Repeat an
operation with a loop (a choose branch with \`goto\` and \`repeat\`) instead, and keep calls one-way: shared
operations are called, and call nothing that calls back.`,
    examples: {
      bad: 'U2-A-001 step "purge" calls U2-B-001, and U2-B-001 step "prepare" calls U2-A-001',
      good: 'U2-A-001 calls U2-B-001; U2-B-001 calls nothing',
    },
  },
  (ctx) => {
    const byId = new Map<string, Procedure>();
    for (const f of ctx.files) if (f.procedure?.id && !byId.has(f.procedure.id)) byId.set(f.procedure.id, f.procedure);
    for (const file of ctx.files) {
      if (!file.procedure) continue;
      for (const site of callSitesOf(file.procedure)) {
        const chain = callCycleThrough(site, (id) => byId.get(id));
        if (!chain) continue;
        ctx.report(file, {
          path: site.path,
          message: chain.length === 2
            ? `Step '${site.step.id}' calls its own procedure '${site.caller}'.`
            : `Step '${site.step.id}' closes a circle of calls: ${chain.join(' → ')}.`,
          hint: 'Repeat an operation with a loop (choose with goto and repeat), not by calling back; a called procedure must not call its caller.',
          trace: chain,
        });
      }
    }
  },
);
