// Reports a call pinned to a revision other than the called procedure's current one.
import { callSitesOf } from '../../analysis/inline-calls.ts';
import { defineManualRule, type FileContext } from '../define-rule.ts';

export default defineManualRule(
  {
    id: 'call-revision-mismatch',
    summary: 'A call is pinned to a revision that is not the called procedure\'s current revision.',
    category: 'document-control',
    defaultSeverity: 'warning',
    docs: `\`call: {procedure: ID, revision: N}\` records the revision of the shared operation that the caller was
written and reviewed against. When the called procedure moves on to another revision, the caller's expanded
sequence changes without the caller being reviewed. Review the caller against the new revision and update the
pin (or drop the pin to always follow the current revision).`,
    examples: {
      bad: 'call: { procedure: U2-K210-INERT-001, revision: 1 }   (current revision: 2)',
      good: 'call: { procedure: U2-K210-INERT-001, revision: 2 }',
    },
  },
  (ctx) => {
    const byId = new Map<string, FileContext>();
    for (const f of ctx.files) if (f.procedure?.id && !byId.has(f.procedure.id)) byId.set(f.procedure.id, f);
    for (const file of ctx.files) {
      if (!file.procedure) continue;
      for (const site of callSitesOf(file.procedure)) {
        if (site.revision === undefined) continue;
        const callee = byId.get(site.callee);
        const current = callee?.procedure?.revision;
        if (current === undefined || Number.isNaN(current) || current === site.revision) continue;
        ctx.report(file, {
          path: [...site.path, 'revision'],
          message: `Step '${site.step.id}' is pinned to revision ${site.revision} of '${site.callee}', which is now at revision ${current}.`,
          hint: `Review this procedure against revision ${current} of '${site.callee}', then change the pin to ${current}.`,
          related: [{ file: callee!.file, range: callee!.source.rangeOf(['revision']), message: `current revision ${current}` }],
        });
      }
    }
  },
);
