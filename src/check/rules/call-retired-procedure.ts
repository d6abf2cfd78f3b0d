// Reports a call to a procedure that is superseded or retired: the operator would be sent to an invalid document.
import { callSitesOf } from '../../analysis/inline-calls.ts';
import { defineManualRule, type FileContext } from '../define-rule.ts';

export default defineManualRule(
  {
    id: 'call-retired-procedure',
    summary: 'A step calls a procedure whose status is superseded or retired.',
    category: 'document-control',
    defaultSeverity: 'error',
    docs: `A superseded or retired procedure may no longer be used, so a step may not send the operator to it.
When a shared operation is replaced, update every caller to the replacing procedure (the site lists the callers
on the called procedure's page) and review them, since their expanded sequence changes.`,
    examples: {
      bad: 'call: U2-K210-INERT-001   (status: retired)',
      good: 'call: U2-K210-INERT-002   (status: effective)',
    },
  },
  (ctx) => {
    const byId = new Map<string, FileContext>();
    for (const f of ctx.files) if (f.procedure?.id && !byId.has(f.procedure.id)) byId.set(f.procedure.id, f);
    for (const file of ctx.files) {
      if (!file.procedure) continue;
      for (const site of callSitesOf(file.procedure)) {
        const callee = byId.get(site.callee);
        const status = callee?.procedure?.status;
        if (status !== 'superseded' && status !== 'retired') continue;
        ctx.report(file, {
          path: site.path,
          message: `Step '${site.step.id}' calls '${site.callee}', which is ${status}.`,
          hint: 'Call the procedure that replaces it, and have the caller reviewed.',
          related: [{ file: callee!.file, range: callee!.source.rangeOf(['status']), message: `'${site.callee}' is ${status} here` }],
        });
      }
    }
  },
);
