// Reports a required procedure that is superseded, retired or otherwise not in force.
import { notInForce } from '../../analysis/document-control.ts';
import { defineManualRule } from '../define-rule.ts';
import { filesById, requiresOf } from '../requires-sites.ts';

const inUse = new Set(['approved', 'effective']);

export default defineManualRule(
  {
    id: 'requires-not-in-force',
    summary: "A procedure under 'requires' is superseded, retired or not in force.",
    category: 'document-control',
    defaultSeverity: 'error',
    dated: true,
    source: 'OSHA 29 CFR 1910.119(f)(3): procedures reviewed as often as necessary to ensure they reflect current operating practice; common practice',
    docs: `A procedure may only send the operator to a procedure that may be used. A required procedure that is
superseded or retired is reported always: point \`requires\` at the procedure that replaced it. One that is not
yet in force (a draft, in review, approved with a later effective date, or a temporary procedure past its end
date) is an **error** when the requiring procedure is approved or effective, and a **warning** while it is itself
still being written, so that both can go through review together.`,
    examples: {
      bad: 'requires: [U2-K210-INERT-001]   # status: superseded',
      good: 'requires: [U2-K210-INERT-002]   # status: effective',
    },
  },
  (ctx) => {
    const byId = filesById(ctx.files);
    for (const file of ctx.files) {
      const p = file.procedure;
      if (!p) continue;
      for (const site of requiresOf(p)) {
        const required = byId.get(site.id);
        if (!required?.procedure || required === file) continue;
        const why = notInForce(required.procedure, ctx.today);
        if (!why) continue;
        const replaced = why === 'superseded' || why === 'retired';
        ctx.report(file, {
          path: [...site.path],
          severity: replaced || inUse.has(String(p.status)) ? 'error' : 'warning',
          message: `${p.id || 'This procedure'} requires '${site.id}', which is ${why}.`,
          hint: replaced
            ? 'Require the procedure that replaces it, and have this procedure reviewed.'
            : 'Bring the required procedure into force first (or together with this one), or require one that is in force.',
          related: [{ file: required.file, range: required.source.rangeOf(['status']), message: `'${site.id}' is ${String(required.procedure.status)} here` }],
        });
      }
    }
  },
);
