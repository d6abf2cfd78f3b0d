// Reports a path given to the checker that could not be read as a UTF-8 text file.
import { defineFileRule } from '../define-rule.ts';

export default defineFileRule(
  {
    id: 'unreadable-file',
    summary: 'A procedure file could not be read (missing, not permitted, or not UTF-8 text).',
    category: 'syntax',
    defaultSeverity: 'error',
    docs: `Every path given to \`stepwright check\` must be a readable UTF-8 text file or a folder of them. A file that
cannot be read is reported and the other files are still checked.`,
    examples: { bad: 'stepwright check procedures/missing.md', good: 'stepwright check procedures/k-210-resin/' },
  },
  (ctx) => {
    if (ctx.readError === undefined) return;
    ctx.report({ range: { line: 1, column: 1, endLine: 1, endColumn: 1 }, message: `The file could not be read: ${ctx.readError}`, hint: /^it is (a second name|a link)/.test(ctx.readError ?? '') ? 'Remove the link: each procedure is read once, under its own name.' : 'Check that the file exists, is readable and is UTF-8 text.' });
  },
);
