// Reports an approved or effective procedure that carries no approvals.
import { defineFileRule } from '../define-rule.ts';

const needsApproval = new Set(['approved', 'effective']);

export default defineFileRule(
  {
    id: 'approval-missing',
    summary: 'An approved or effective procedure has no approvals.',
    category: 'document-control',
    defaultSeverity: 'error',
    source: '21 CFR Part 11 §11.50 (signature manifestation); OSHA 29 CFR 1910.119(f)(3)',
    docs: `A procedure may only be \`approved\` or \`effective\` once the people responsible have signed it. Each
approval records the printed name, the date and what the signature means.`,
    examples: { bad: 'status: effective\n# no approvals', good: 'approvals:\n  - {role: Operations manager, name: R. Okafor, date: 2026-03-02, meaning: Approved for use}' },
  },
  (ctx) => {
    const p = ctx.procedure;
    if (!p || !needsApproval.has(String(p.status)) || p.approvals.length > 0) return;
    ctx.report({
      path: ['status'],
      message: `The procedure is '${p.status}' but carries no approvals.`,
      hint: "Add the sign-offs under 'approvals' (role, name, date, meaning), or set the status back to draft or in-review.",
    });
  },
);
