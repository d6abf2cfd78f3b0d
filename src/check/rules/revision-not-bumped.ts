// Reports content changed since the last committed version of a released revision, with the same revision number.
import { changedContentAreas } from '../../analysis/document-content.ts';
import { defineFileRule } from '../define-rule.ts';
import { compareWithPrevious, editableStatuses } from '../history-comparison.ts';

export default defineFileRule(
  {
    id: 'revision-not-bumped',
    summary: 'The content changed since the last committed version, but the revision number did not.',
    category: 'history',
    defaultSeverity: 'error',
    source: 'OSHA 29 CFR 1910.119(l)(1) management of change; ISO 9001:2015 7.5.3.2 control of changes',
    docs: `A revision number names one content. Once a revision has left review (\`approved\`, \`superseded\`,
\`retired\`), its signatures cover exactly that content: a change to steps, limits, interlocks, hazards, signals,
equipment, protective equipment or the narrative needs a new revision number, a change reason and new approvals.
Drafts and revisions in review may change freely. Changes to document control only (status, dates, approvals,
change reason, owner) need no new revision. An \`effective\` revision edited in place is reported by
\`effective-edited-in-place\` instead. The rule compares with the previous committed version (\`stepwright check\`:
the last commit with different text; \`stepwright review\`: the base of the pull request); without git it is silent.`,
    examples: { bad: '# committed: revision: 3, status: approved\nrevision: 3   # steps edited', good: 'revision: 4\nstatus: draft' },
  },
  (ctx) => {
    const c = compareWithPrevious(ctx);
    if (!c || c.after.revision !== c.before.revision) return;
    const was = String(c.before.status);
    if (editableStatuses.has(was) || was === 'effective') return;
    const areas = changedContentAreas(c.before, c.after);
    if (!areas.length) return;
    ctx.report({
      path: ['revision'],
      message: `Revision ${c.after.revision} was '${was}' at ${c.commit}, and its content changed since (${areas.join(', ')}) without a new revision number.`,
      hint: `Set 'revision: ${c.before.revision + 1}', status 'draft', and say why in 'change'; the new revision needs its own approvals.`,
    });
  },
);
