// Reports procedure files in one manual that claim the same document number.
import { defineManualRule } from '../define-rule.ts';

export default defineManualRule(
  {
    id: 'duplicate-procedure-id',
    summary: 'Two procedures in the manual have the same id.',
    category: 'structure',
    defaultSeverity: 'error',
    docs: `A procedure id is its document number and its web address: it must be unique across the whole manual.
A new revision of a procedure is the same file with a higher \`revision\`, not a second file with the same id.
Every file that shares the id is reported, with the others listed.`,
    examples: { bad: 'two files with id: U2-H220-SU-001', good: 'one file per id; revisions kept in history' },
  },
  (ctx) => {
    const byId = new Map<string, (typeof ctx.files)[number][]>();
    for (const file of ctx.files) {
      const id = file.procedure?.id;
      if (!id) continue;
      byId.set(id, [...(byId.get(id) ?? []), file]);
    }
    for (const [id, files] of byId) {
      if (files.length < 2) continue;
      for (const file of files) {
        const others = files.filter((f) => f !== file);
        ctx.report(file, {
          path: ['id'],
          message: `Procedure id '${id}' is also used by ${others.map((o) => o.file).join(', ')}.`,
          hint: 'Give each procedure its own document number, or merge the files.',
          related: others.map((o) => ({ file: o.file, range: o.source.rangeOf(['id']), message: `'${id}' also used here` })),
        });
      }
    }
  },
);
