// Reports two procedure files in one manual that claim the same document number.
import { defineManualRule } from '../define-rule.ts';

export default defineManualRule(
  {
    id: 'duplicate-procedure-id',
    summary: 'Two procedures in the manual have the same id.',
    category: 'structure',
    defaultSeverity: 'error',
    docs: `A procedure id is its document number and its web address: it must be unique across the whole manual.
A new revision of a procedure is the same file with a higher \`revision\`, not a second file with the same id.`,
    examples: { bad: 'two files with id: U2-H220-SU-001', good: 'one file per id; revisions kept in history' },
  },
  (ctx) => {
    const seen = new Map<string, (typeof ctx.files)[number]>();
    for (const file of ctx.files) {
      const id = file.procedure?.id;
      if (!id) continue;
      const first = seen.get(id);
      if (!first) {
        seen.set(id, file);
        continue;
      }
      const at = first.source.rangeOf(['id']);
      ctx.report(file, {
        path: ['id'],
        message: `Procedure id '${id}' is already used by ${first.file}.`,
        hint: 'Give this procedure its own document number, or merge the two files.',
        related: [{ file: first.file, range: at, message: `'${id}' first used here` }],
      });
    }
  },
);
