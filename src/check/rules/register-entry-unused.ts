// Reports register entries that no procedure uses.
import { defineManualRule } from '../define-rule.ts';
import { shellWord } from '../../model/shell-word.ts';

export default defineManualRule(
  {
    id: 'register-entry-unused',
    summary: 'A signal, safety function, relief device or chemical in the plant register is used by no procedure.',
    category: 'structure',
    defaultSeverity: 'info',
    docs: `A register entry that no procedure names may be left over from equipment that was removed, or may be a
safety function that the operating procedures never mention although operators must know it (OSHA 1910.119(f)(1)(iv)).
Either add it to the \`uses\` of the procedures that rely on it, or remove it from the register. Areas and equipment
are not reported: they describe the plant whether or not a procedure names them. When only part of the manual is
checked (some files of the procedures folder), entries are not judged: one note says so instead.`,
    source: 'OSHA 29 CFR 1910.119(f)(1)(iv): safety systems and their functions in the operating procedures',
    examples: { bad: 'safety-functions:\n  TSHH-299: { trips-when: TI-299 >= 90 degC, closes: [XV-2990] }   # no procedure uses it', good: 'uses: [TSHH-299]' },
  },
  (ctx) => {
    const register = ctx.register;
    if (!register || ctx.files.length === 0) return;
    if (ctx.partial) {
      // Another procedure of the manual may use any entry: say once that this was not looked at.
      const first = register.sources[0];
      if (!first) return;
      const files = ctx.partial.left === 1 ? '1 file' : `${ctx.partial.left} files`;
      ctx.reportInRegister(first.file, {
        path: [],
        message: `Register entries that no procedure uses were not looked for: ${files} in ${ctx.partial.folder.replace(/\/+$/, "")}/ were not checked, and they may use them.`,
        hint: `Check the whole procedures folder (stepwright check ${shellWord(ctx.partial.folder)}) to find unused register entries.`,
      });
      return;
    }
    const used = new Set<string>();
    for (const f of ctx.files) for (const u of f.procedure?.registerUses ?? []) used.add(u.id);
    // A safety function started by a used trip is used through it.
    for (const id of [...used]) {
      const fn = register.safetyFunctions.get(id);
      if (fn?.starts) used.add(fn.starts);
    }
    for (const entry of register.entries.values()) {
      if (entry.section === 'areas' || entry.section === 'equipment' || used.has(entry.id)) continue;
      ctx.reportInRegister(entry.file, {
        path: entry.path, part: 'key',
        message: `Register entry '${entry.id}' (${entry.section}) is used by no procedure.`,
        hint: "Add it to the 'uses' of the procedures that rely on it, or remove it from the register if the plant no longer has it.",
      });
    }
  },
);
