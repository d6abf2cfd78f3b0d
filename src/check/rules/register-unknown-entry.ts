// Reports a name under `uses` that the plant register does not define.
import { closest, distance } from 'fastest-levenshtein';
import { defineFileRule } from '../define-rule.ts';

export default defineFileRule(
  {
    id: 'register-unknown-entry',
    summary: "A procedure's 'uses' names an entry the plant register does not define.",
    category: 'structure',
    defaultSeverity: 'error',
    docs: `\`uses\` lists the register entries a procedure relies on: signals, safety functions, relief devices,
chemicals and equipment. Each must be defined in the register folder. A name the register does not know brings
nothing into the procedure, so the trips and limits the author meant are not checked. Without a register,
\`uses\` itself is reported: there is nothing to use.`,
    examples: { bad: 'uses: [TSHH-201]', good: 'uses: [TSHH-210]' },
  },
  (ctx) => {
    const p = ctx.procedure;
    if (!p || p.uses.length === 0) return;
    if (!ctx.register) {
      ctx.report({
        path: ['uses'], part: 'key',
        message: "The procedure lists register entries under 'uses', but the plant has no register, so none of them was checked.",
        hint: "Create the register folder (register/ next to stepwright.config.yaml, or name it with 'register:' there), or declare the signals and interlocks in the procedure.",
      });
      return;
    }
    const ids = [...ctx.register.entries.keys()];
    for (const u of p.uses) {
      if (ctx.register.entries.has(u.value)) continue;
      const near = ids.length ? closest(u.value, ids) : undefined;
      ctx.report({
        path: u.path,
        message: `'${u.value}' is not defined in the plant register (${ctx.register.folder}).`,
        hint: near && distance(near, u.value) <= Math.max(2, Math.floor(u.value.length / 3)) ? `Did you mean '${near}'?` : 'Add the entry to the register, or correct the name.',
      });
    }
  },
);
