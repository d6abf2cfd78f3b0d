// Reports a required procedure (`requires`) whose id no procedure in the manual has.
import { closest, distance } from 'fastest-levenshtein';
import { defineManualRule } from '../define-rule.ts';
import { filesById, requiresOf } from '../requires-sites.ts';
import { shellWord } from '../../model/shell-word.ts';

export default defineManualRule(
  {
    id: 'requires-unknown-procedure',
    summary: "A procedure under 'requires' is not in the manual.",
    category: 'structure',
    defaultSeverity: 'error',
    source: 'OSHA 29 CFR 1910.119(f)(1): clear instructions for each operating phase (a prerequisite the operator cannot find is not an instruction); common practice',
    docs: `\`requires\` lists the procedures that must be completed before this one starts (inerting before a batch,
a line-up before a start-up). Each must be a procedure of the same manual, under its document number, so that the
operator can find and follow it and the manual can link to it. A misspelt number or a procedure that was never
added to the manual leaves the operator with a prerequisite nobody can carry out.
When only some files of the procedures folder are checked, a procedure that is not among them is reported as not
checked (info) rather than as unknown.`,
    examples: {
      bad: 'requires: [U2-K210-INERT-009]   # no such procedure',
      good: 'requires: [U2-K210-INERT-001]',
    },
  },
  (ctx) => {
    const byId = filesById(ctx.files);
    const ids = [...byId.keys()];
    for (const file of ctx.files) {
      if (!file.procedure) continue;
      for (const site of requiresOf(file.procedure)) {
        if (byId.has(site.id)) continue;
        if (ctx.partial) {
          // Part of the manual: the required procedure may be among the files not checked.
          const left = ctx.partial.left === 1 ? '1 file' : `${ctx.partial.left} files`;
          ctx.report(file, {
            path: [...site.path], severity: 'info',
            message: `${file.procedure.id || 'This procedure'} requires '${site.id}', which is not among the files checked, so the requirement was not checked (${left} in ${ctx.partial.folder.replace(/\/+$/, '')}/ were not checked).`,
            hint: `Check the whole procedures folder (stepwright check ${shellWord(ctx.partial.folder)}) to check it.`,
          });
          continue;
        }
        const guess = ids.length ? closest(site.id, ids) : undefined;
        const close = guess !== undefined && distance(site.id, guess) <= 3;
        ctx.report(file, {
          path: [...site.path],
          message: `${file.procedure.id || 'This procedure'} requires '${site.id}', which is not in the manual.`,
          hint: close ? `Did you mean '${guess}'?` : 'Check the document number, or add the required procedure to the manual.',
        });
      }
    }
  },
);
