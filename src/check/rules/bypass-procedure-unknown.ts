// Reports a register safety function whose bypass is not tied to a procedure of the manual that can be used.
import { closest, distance } from 'fastest-levenshtein';
import { notInForce } from '../../analysis/document-control.ts';
import { defineManualRule } from '../define-rule.ts';
import { filesById } from '../requires-sites.ts';

export default defineManualRule(
  {
    id: 'bypass-procedure-unknown',
    summary: 'A safety function that may be bypassed names no procedure of the manual to bypass it under.',
    category: 'safety',
    defaultSeverity: 'error',
    dated: true,
    source: 'OSHA 29 CFR 1910.119(f)(1)(iv): safety systems and their functions; a bypass of a safety function made only under a written procedure (IEC 61511-1, from memory); common practice',
    docs: `A safety function in the plant register says under \`bypass\` whether it may be bypassed at all and, if so,
under which procedure: \`bypass: { allowed: true, procedure: U2-T230-TMP-001 }\`. That procedure carries the
compensating measures and the time limit of the bypass, so it must be a procedure of this manual. Reported, at the
register entry:

- \`allowed: true\` without a \`procedure\`: nothing says how the function is bypassed safely;
- a \`procedure\` that is not in the manual (with the closest document number, when one is near);
- a \`procedure\` that is superseded or retired: the bypass would be made under an instruction no longer in use;
- \`allowed: false\` together with a \`procedure\`: the entry contradicts itself.

When only part of the manual is checked, a procedure that is not among the files checked is not reported.`,
    examples: {
      bad: 'bypass: { allowed: true }',
      good: 'bypass: { allowed: true, procedure: U2-T230-TMP-001 }',
    },
  },
  (ctx) => {
    const register = ctx.register;
    if (!register || ctx.files.length === 0) return;
    const byId = filesById(ctx.files);
    const ids = [...byId.keys()];
    for (const fn of register.safetyFunctions.values()) {
      const bypass = fn.bypass;
      if (!bypass) continue;
      const at = bypass.procedure !== undefined ? [...fn.path, 'bypass', 'procedure'] : [...fn.path, 'bypass'];
      if (!bypass.allowed) {
        if (bypass.procedure === undefined) continue;
        ctx.reportInRegister(fn.file, {
          path: at,
          message: `${fn.id} may not be bypassed (allowed: false), yet names bypass procedure '${bypass.procedure}'.`,
          hint: "Either allow the bypass under that procedure (allowed: true), or remove 'procedure'.",
        });
        continue;
      }
      if (bypass.procedure === undefined) {
        ctx.reportInRegister(fn.file, {
          path: at,
          message: `${fn.id} may be bypassed, but the register names no procedure to bypass it under.`,
          hint: "Add 'procedure: <document number>' naming the procedure with the compensating measures, or set 'allowed: false'.",
        });
        continue;
      }
      const file = byId.get(bypass.procedure);
      // With part of the manual checked, a procedure not among the files may still be in the folder.
      if (!file?.procedure && ctx.partial) continue;
      if (!file?.procedure) {
        const guess = ids.length ? closest(bypass.procedure, ids) : undefined;
        const close = guess !== undefined && distance(bypass.procedure, guess) <= 3;
        ctx.reportInRegister(fn.file, {
          path: at,
          message: `${fn.id} may be bypassed under '${bypass.procedure}', which is not in the manual.`,
          hint: close ? `Did you mean '${guess}'?` : 'Check the document number, or add the bypass procedure to the manual.',
        });
        continue;
      }
      const status = String(file.procedure.status);
      if (status === 'superseded' || status === 'retired') {
        ctx.reportInRegister(fn.file, {
          path: at,
          message: `${fn.id} may be bypassed under ${bypass.procedure}, which is ${notInForce(file.procedure, ctx.today)}.`,
          hint: 'Name the procedure that replaced it, or set allowed: false if the bypass is no longer permitted.',
        });
      }
    }
  },
);
