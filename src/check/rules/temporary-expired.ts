// Reports a temporary procedure still approved or effective after its end date.
import { defineFileRule } from '../define-rule.ts';

const inUse = new Set(['approved', 'effective']);

export default defineFileRule(
  {
    id: 'temporary-expired',
    summary: "A temporary procedure is still in use after its 'expires' date.",
    category: 'document-control',
    defaultSeverity: 'error',
    dated: true,
    source: 'OSHA 29 CFR 1910.119(f)(1)(i)(C) temporary operations, and (l)(2)(iv) the time period for a temporary change',
    docs: `A temporary procedure may be used up to and including its \`expires\` date. After that it must not be on the
plant floor as approved or effective: retire it (status \`retired\`), or, through management of change, issue a new
revision with a new end date. Until then the check fails, so an expired temporary operation cannot be published as
if it were current.`,
    examples: { bad: 'kind: temporary\nstatus: effective\nexpires: 2026-06-30   # today 2026-12-01', good: 'kind: temporary\nstatus: retired\nexpires: 2026-06-30' },
  },
  (ctx) => {
    const p = ctx.procedure;
    if (!p || p.kind !== 'temporary' || !inUse.has(String(p.status)) || !p.expires || p.expires >= ctx.today) return;
    ctx.report({
      path: ['expires'],
      message: `Temporary procedure ${p.id} expired on ${p.expires} but is still '${p.status}'.`,
      hint: "Retire it (status: retired), or extend it through management of change with a new revision and a new 'expires' date.",
    });
  },
);
