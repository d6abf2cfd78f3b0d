// Reports procedure ids, step ids and branch names written in a form that cannot be used in URLs and diffs.
import { defineFileRule } from '../define-rule.ts';
import { describeCharacter, firstNonAscii } from '../../parse/suspicious-characters.ts';
import { valueAt } from '../../model/validate.ts';

const idKeys = new Set(['id', 'step']);

export default defineFileRule(
  {
    id: 'bad-id-format',
    summary: 'A procedure id, step id or branch name is not in the required form.',
    category: 'syntax',
    defaultSeverity: 'error',
    docs: `Procedure ids are document numbers: upper-case letters, digits and hyphens (\`U2-K210-BATCH-001\`).
Step ids and parallel branch names are lower-case letters, digits and hyphens (\`heat-up\`). Ids are used in
web addresses and keep revisions comparable, so they must be stable and plain.`,
    examples: { bad: 'step: Heat Up', good: 'step: heat-up' },
  },
  (ctx) => {
    for (const issue of ctx.schemaIssues) {
      if (issue.code !== 'bad-format') continue;
      const key = issue.path.at(-1);
      const isBranchName = issue.path.at(-2) === 'parallel';
      if (!idKeys.has(String(key)) && !isBranchName) continue;
      ctx.report({
        path: issue.path,
        part: isBranchName ? 'key' : 'value',
        message: (isBranchName ? `Branch name '${String(key)}' is not lower-case letters, digits and hyphens.` : issue.message)
          + oddCharacter(isBranchName ? String(key) : valueAt(ctx.source.data, issue.path)),
        hint: key === 'id'
          ? 'Write the document number in capitals, digits and hyphens, e.g. U2-K210-BATCH-001.'
          : 'Write ids in lower case with hyphens between words, e.g. heat-up.',
      });
    }
  },
);

/** Names the first character outside printable ASCII, so a look-alike or invisible one can be found. */
function oddCharacter(value: unknown): string {
  if (typeof value !== 'string') return '';
  const odd = firstNonAscii(value.replace(/ /g, '_'));
  return odd ? ` It holds ${describeCharacter(odd.char)} as character ${[...value.slice(0, odd.index)].length + 1}.` : '';
}
