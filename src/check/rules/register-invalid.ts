// Reports a register file that cannot be read or does not fit the register's shape.
import { defineManualRule } from '../define-rule.ts';

export default defineManualRule(
  {
    id: 'register-invalid',
    summary: 'A plant register file is not valid YAML, or holds a key or value the register does not know.',
    category: 'syntax',
    defaultSeverity: 'error',
    docs: `The plant register is a folder of YAML files (see docs/register.md). Each file is a mapping of sections:
\`areas\`, \`equipment\`, \`signals\`, \`safety-functions\`, \`relief-devices\` and \`chemicals\`. A file with a YAML
error, an unknown key or a value of the wrong kind is reported at its place, and the entries it could not read are
not loaded: procedures that use them are then reported as using an unknown entry, so nothing is silently skipped.`,
    examples: { bad: 'signals:\n  TI-210: { txt: Kettle temperature }', good: 'signals:\n  TI-210: { text: Kettle temperature, unit: degC, range: [0, 300] }' },
  },
  (ctx) => {
    for (const d of ctx.register?.diagnostics ?? []) {
      if (d.rule === 'register-invalid') ctx.reportInRegister(d.file, { range: d, message: d.message, hint: d.hint });
    }
  },
);
