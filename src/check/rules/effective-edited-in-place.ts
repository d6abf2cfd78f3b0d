// Reports an effective revision whose content changed without a new revision number.
import { changedContentAreas } from '../../analysis/document-content.ts';
import { defineFileRule } from '../define-rule.ts';
import { compareWithPrevious } from '../history-comparison.ts';

export default defineFileRule(
  {
    id: 'effective-edited-in-place',
    summary: 'An effective revision was edited without a new revision number.',
    category: 'history',
    defaultSeverity: 'error',
    source: 'OSHA 29 CFR 1910.119(l)(1)-(2) management of change; 1910.119(c)(3) procedures kept current',
    docs: `The effective revision is what operators follow, and its approvals cover exactly that content. Editing it in
place changes the instructions under the operators' hands without review, and loses the record of what they followed
before. Make the change as a new revision: bump \`revision\`, set the status to \`draft\`, state the reason in
\`change\`, and collect new approvals; the effective revision stays in force until the new one takes effect.
Changes to document control only (review date, a yearly certification under \`certifications\`, status to
\`superseded\` or \`retired\`) are not edits of content.`,
    examples: { bad: '# committed: revision: 4, status: effective\nrevision: 4   # cook temperature changed', good: 'revision: 5\nstatus: draft' },
  },
  (ctx) => {
    const c = compareWithPrevious(ctx);
    if (!c || c.after.revision !== c.before.revision || c.before.status !== 'effective') return;
    const areas = changedContentAreas(c.before, c.after);
    if (!areas.length) return;
    ctx.report({
      path: ['revision'],
      message: `Revision ${c.after.revision} is effective (at ${c.commit}) and its content changed in place (${areas.join(', ')}).`,
      hint: `Make the change a new revision: 'revision: ${c.before.revision + 1}', 'status: draft', a 'change' reason, and new approvals.`,
    });
  },
);
