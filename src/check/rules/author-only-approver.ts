// Reports approvals that come only from the author: a procedure needs an independent check.
import { defineFileRule } from '../define-rule.ts';

const normal = (s: string) => s.trim().toLowerCase().replace(/\s+/g, ' ');

export default defineFileRule(
  {
    id: 'author-only-approver',
    summary: 'Every approval is signed by the author of the revision.',
    category: 'document-control',
    defaultSeverity: 'error',
    source: 'OSHA 29 CFR 1910.119(l) management of change: authorization; common practice: independent review',
    docs: `The author may sign for authorship, but at least one approval must come from someone else: an
independent reviewer is the point of review. The author is the \`author\` key, or, without it, signers whose role
or meaning is authorship.`,
    examples: {
      bad: 'author: D. Marsh\napprovals:\n  - {role: Process engineer, name: D. Marsh, ...}',
      good: 'approvals:\n  - {role: Process engineer, name: D. Marsh, ...}\n  - {role: Operations manager, name: R. Okafor, ...}',
    },
  },
  (ctx) => {
    const p = ctx.procedure;
    if (!p || p.approvals.length === 0) return;
    const isAuthor = (a: (typeof p.approvals)[number]) =>
      p.author ? normal(a.name) === normal(p.author) : /author/i.test(a.role) || /author/i.test(a.meaning);
    if (!p.approvals.every(isAuthor)) return;
    ctx.report({
      path: ['approvals'],
      part: 'key',
      message: `All approvals are by the author${p.author ? ` (${p.author})` : ''}; nobody independent has signed.`,
      hint: 'Have a second qualified person review and approve this revision.',
    });
  },
);
