// Reports status changes that break the document life-cycle (e.g. draft → effective with no approval, retired → effective).
import { defineFileRule } from '../define-rule.ts';
import { compareWithPrevious } from '../history-comparison.ts';

/** Within one revision a document moves forward only; in-review may go back to draft when review sends it back. */
const order = ['draft', 'in-review', 'approved', 'effective', 'superseded', 'retired'];
const needsSignatures = new Set(['approved', 'effective']);

export default defineFileRule(
  {
    id: 'status-lifecycle',
    summary: 'A status change breaks the life-cycle draft → in-review → approved → effective → superseded/retired.',
    category: 'history',
    defaultSeverity: 'error',
    source: 'ISO 9001:2015 7.5.2-7.5.3 (review and approval, control of documented information); OSHA 29 CFR 1910.119(l)',
    docs: `Within one revision the status only moves forward: \`draft\` → \`in-review\` → \`approved\` → \`effective\` →
\`superseded\` or \`retired\` (an \`in-review\` revision may go back to \`draft\`). A superseded or retired revision
never comes back: bring the content back as a new revision. A revision that reaches \`approved\` or \`effective\`
must carry approvals; a new revision number cannot reuse the previous revision's signatures as its own. The rule
compares with the previous committed version and is silent without git.`,
    examples: { bad: '# committed: status: retired\nstatus: effective', good: 'revision: 7\nstatus: draft' },
  },
  (ctx) => {
    const c = compareWithPrevious(ctx);
    if (!c) return;
    const was = String(c.before.status);
    const now = String(c.after.status);
    const from = order.indexOf(was);
    const to = order.indexOf(now);
    if (from < 0 || to < 0) return;
    const report = (message: string, hint: string) => ctx.report({ path: ['status'], message, hint });

    if (c.after.revision === c.before.revision) {
      if (was === now) return;
      if ((was === 'superseded' || was === 'retired') && now !== 'retired') {
        return report(`Revision ${c.after.revision} was '${was}' at ${c.commit} and cannot become '${now}'.`, `Bring the content back as revision ${c.before.revision + 1} with status 'draft'.`);
      }
      if (to < from && !(was === 'in-review' && now === 'draft')) {
        return report(`Status went back from '${was}' to '${now}' within revision ${c.after.revision} (at ${c.commit}).`, `A change after ${was} is a new revision: 'revision: ${c.before.revision + 1}', 'status: draft'.`);
      }
      if (needsSignatures.has(now) && !needsSignatures.has(was) && c.after.approvals.length === 0) {
        return report(`Status went from '${was}' to '${now}' with no approval.`, "Record the sign-offs under 'approvals' before the status moves on.");
      }
      return;
    }
    if (c.after.revision < c.before.revision || !needsSignatures.has(now) || c.after.approvals.length === 0) return;
    const signature = (a: { role: string; name: string; date: string }) => `${a.role}|${a.name}|${a.date}`;
    const old = new Set(c.before.approvals.map(signature));
    if (c.after.approvals.every((a) => old.has(signature(a)))) {
      report(
        `Revision ${c.after.revision} is '${now}' but carries only the approvals of revision ${c.before.revision}.`,
        `Signatures cover one revision: collect new approvals for revision ${c.after.revision}, or set its status to 'draft' or 'in-review'.`,
      );
    }
  },
);
