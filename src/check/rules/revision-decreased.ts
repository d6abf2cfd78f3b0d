// Reports a revision number lower than the previous committed version's.
import { defineFileRule } from '../define-rule.ts';
import { compareWithPrevious } from '../history-comparison.ts';

export default defineFileRule(
  {
    id: 'revision-decreased',
    summary: 'The revision number is lower than in the previous committed version.',
    category: 'history',
    defaultSeverity: 'error',
    source: 'ISO 9001:2015 7.5.3.2 (control of changes, identification of revisions)',
    docs: `Revision numbers only go up: each one names a content that was, or will be, signed and used. A lower number
than before usually means an old copy was pasted over the current one, or two branches were merged the wrong way.
Restoring an old content is a change like any other: give it the next revision number and say why in \`change\`.`,
    examples: { bad: '# committed: revision: 5\nrevision: 4', good: 'revision: 6\nchange: Restores the rev 4 steps (MOC-…)' },
  },
  (ctx) => {
    const c = compareWithPrevious(ctx);
    if (!c || c.after.revision >= c.before.revision) return;
    ctx.report({
      path: ['revision'],
      message: `Revision ${c.after.revision} is lower than revision ${c.before.revision} at ${c.commit}; revision numbers never go down.`,
      hint: `Use revision ${c.before.revision + 1} (or keep ${c.before.revision}), and explain a restored content in 'change'.`,
    });
  },
);
