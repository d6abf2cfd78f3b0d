// Reports a step that calls a procedure the manual does not hold.
import { closest, distance } from 'fastest-levenshtein';
import { callSitesOf } from '../../analysis/inline-calls.ts';
import { defineManualRule } from '../define-rule.ts';
import { shellWord } from '../../model/shell-word.ts';

export default defineManualRule(
  {
    id: 'call-unknown-procedure',
    summary: 'A step calls a procedure id that no procedure in the manual has.',
    category: 'structure',
    defaultSeverity: 'error',
    docs: `A step with \`call: ID\` runs another procedure of the manual as one step (a shared operation written
once, such as nitrogen inerting). The called procedure must exist in the same manual, under its document number,
so that the checker can analyse the caller with the call expanded and the operator can follow it.
When only some files of the procedures folder are checked, a procedure that is not among them is reported as not
checked (info) rather than as unknown.`,
    examples: {
      bad: '- step: inert\n  do: Inert kettle K-210\n  call: U2-K210-INERT-009',
      good: '- step: inert\n  do: Inert kettle K-210\n  call: U2-K210-INERT-001',
    },
  },
  (ctx) => {
    const ids = ctx.files.flatMap((f) => (f.procedure?.id ? [f.procedure.id] : []));
    for (const file of ctx.files) {
      if (!file.procedure) continue;
      for (const site of callSitesOf(file.procedure)) {
        if (ids.includes(site.callee)) continue;
        if (ctx.partial) {
          // Part of the manual: the callee may be among the files not checked.
          ctx.report(file, {
            path: site.path, severity: 'info',
            message: `Step '${site.step.id}' calls procedure '${site.callee}', which is not among the files checked, so the call was not checked (${leftOut(ctx.partial)}).`,
            hint: `Check the whole procedures folder (stepwright check ${shellWord(ctx.partial.folder)}) to check the call.`,
          });
          continue;
        }
        const guess = ids.length ? closest(site.callee, ids) : undefined;
        const close = guess !== undefined && distance(site.callee, guess) <= 3;
        ctx.report(file, {
          path: site.path,
          message: `Step '${site.step.id}' calls procedure '${site.callee}', which is not in the manual.`,
          hint: close ? `Did you mean '${guess}'?` : 'Check the document number, or add the called procedure to the manual.',
        });
      }
    }
  },
);

function leftOut(partial: { folder: string; left: number }): string {
  return `${partial.left === 1 ? '1 file' : `${partial.left} files`} in ${partial.folder.replace(/\/+$/, '')}/ were not checked`;
}
