// Reports a `modifies` entry that cannot show on any page: a procedure not in the manual, one no longer in use, or
// `modifies` on a procedure that is not temporary.
import { closest, distance } from 'fastest-levenshtein';
import { defineManualRule } from '../define-rule.ts';
import { filesById } from '../requires-sites.ts';

export default defineManualRule(
  {
    id: 'modifies-unknown-procedure',
    summary: "A procedure under 'modifies' is not in the manual, is no longer in use, or 'modifies' is on a procedure that is not temporary.",
    category: 'document-control',
    defaultSeverity: 'error',
    source: 'OSHA 29 CFR 1910.119(f)(1)(i)(C) temporary operations, and (l)(2)(iv) the time period for a temporary change; common practice',
    docs: `A temporary procedure names under \`modifies\` the procedures it changes while it is in force, and the pages of
those procedures say that it is in force. A document number that is not in the manual (a typing error, a procedure
renumbered) puts that notice on no page at all: the operator reads the normal procedure without knowing that a
temporary one overrides it. Reported:

- a number under \`modifies\` that no procedure of the manual has (an error, with the closest number when one is near);
- a modified procedure that is superseded or retired (a warning: name the revision now in use);
- \`modifies\` on a procedure whose kind is not \`temporary\` (an error: only temporary procedures are shown as in force).

When only part of the manual is checked, a number that is not among the files checked is not reported.`,
    examples: {
      bad: 'kind: temporary\nmodifies: [U2-T230-CIP-020]   # no such procedure',
      good: 'kind: temporary\nmodifies: [U2-T230-CIP-002]',
    },
  },
  (ctx) => {
    const byId = filesById(ctx.files);
    const ids = [...byId.keys()];
    for (const file of ctx.files) {
      const p = file.procedure;
      if (!p || !p.modifies.length) continue;
      if (p.kind !== 'temporary') {
        ctx.report(file, {
          path: ['modifies'], part: 'key',
          message: `${p.id || 'This procedure'} lists procedures under 'modifies' but is a '${p.kind}' procedure, so no page shows it as in force over them.`,
          hint: "Use 'kind: temporary' for a procedure that changes others for a limited time, or remove 'modifies'.",
        });
        continue;
      }
      for (const target of p.modifies) {
        const modified = byId.get(target.value)?.procedure;
        if (!modified) {
          if (ctx.partial) continue;
          const guess = ids.length ? closest(target.value, ids.filter((id) => id !== p.id)) : undefined;
          const close = guess !== undefined && distance(target.value, guess) <= 3;
          ctx.report(file, {
            path: target.path,
            message: `${p.id} modifies '${target.value}', which is not in the manual, so no page says that this temporary procedure is in force.`,
            hint: close ? `Did you mean '${guess}'?` : 'Check the document number of the procedure this one changes.',
          });
          continue;
        }
        const status = String(modified.status);
        if (status === 'superseded' || status === 'retired') {
          ctx.report(file, {
            path: target.path, severity: 'warning',
            message: `${p.id} modifies ${target.value}, which is ${status}: the procedure in use does not show this temporary procedure.`,
            hint: 'Name the procedure that replaced it.',
          });
        }
      }
    }
  },
);
