// Reports a temporary procedure in use that does not say when it ends.
import { defineFileRule } from '../define-rule.ts';

const inUse = new Set(['in-review', 'approved', 'effective']);

export default defineFileRule(
  {
    id: 'temporary-without-end',
    summary: "A temporary procedure has no end date ('expires').",
    category: 'document-control',
    defaultSeverity: 'error',
    source: 'OSHA 29 CFR 1910.119(f)(1)(i)(C) temporary operations, and (l)(2)(iv) the time period for a temporary change',
    docs: `A temporary operation runs for a limited time with a deviation from normal operation (a bypassed
instrument, a temporary line-up). Its procedure says when it ends with \`expires: YYYY-MM-DD\`, the last day it may be
used, and names the procedures it changes under \`modifies\`, so their pages show that a temporary procedure is in
force. After the end date the procedure is reported by \`temporary-expired\`.`,
    examples: { bad: 'kind: temporary\nstatus: effective', good: 'kind: temporary\nstatus: effective\nexpires: 2026-12-31\nmodifies: [U2-T230-CIP-001]' },
  },
  (ctx) => {
    const p = ctx.procedure;
    if (!p || p.kind !== 'temporary' || !inUse.has(String(p.status)) || p.expires) return;
    ctx.report({
      path: ['kind'],
      message: `Temporary procedure ${p.id || ''} has no end date, so it could stay in use for ever.`.replace('  ', ' '),
      hint: "Add 'expires: YYYY-MM-DD' (the last day it may be used) and 'modifies: [ids]' (the procedures it changes).",
    });
  },
);
