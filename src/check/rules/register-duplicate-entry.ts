// Reports a tag or id defined twice in the plant register.
import { defineManualRule } from '../define-rule.ts';

export default defineManualRule(
  {
    id: 'register-duplicate-entry',
    summary: 'A tag or id is defined more than once in the plant register.',
    category: 'structure',
    defaultSeverity: 'error',
    source: 'OSHA 29 CFR 1910.119(d): process safety information kept as one record of the process',
    docs: `Every tag is defined once in the whole register, whichever file and section it is in: two definitions of
TI-210 could say different things, and a procedure would silently get one of them. The first definition (in file
order) is kept; the second is reported and left out.`,
    examples: { bad: 'signals:\n  TI-210: { text: Kettle temperature }\nequipment:\n  TI-210: { text: Thermometer }', good: 'signals:\n  TI-210: { text: Kettle temperature }' },
  },
  (ctx) => {
    for (const d of ctx.register?.diagnostics ?? []) {
      if (d.rule === 'register-duplicate-entry') ctx.reportInRegister(d.file, { range: d, message: d.message, hint: d.hint, related: d.related?.map((r) => ({ file: r.file, range: { line: r.line, column: r.column, endLine: r.line, endColumn: r.column }, message: r.message })) });
    }
  },
);
