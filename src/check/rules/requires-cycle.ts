// Reports procedures that require each other in a circle, so none of them can ever start.
import { defineManualRule } from '../define-rule.ts';
import { filesById, requiresOf } from '../requires-sites.ts';

export default defineManualRule(
  {
    id: 'requires-cycle',
    summary: "Procedures require each other in a circle ('requires'), so none of them can start.",
    category: 'sequence',
    defaultSeverity: 'error',
    source: 'Common practice: a prerequisite is completed before the procedure that needs it starts, so prerequisites form an order without circles',
    docs: `\`requires\` says which procedures are completed before this one starts. When A requires B and B (directly
or through others) requires A, neither can be started first, and an operator who follows the manual is stuck.
Usually one of the two only needs part of the other: move that part into a line-up condition (\`line-up\`) or a
shared procedure that both call, and keep requirements one-way.`,
    examples: {
      bad: 'U2-A-001 requires [U2-B-001], and U2-B-001 requires [U2-A-001]',
      good: 'U2-A-001 requires [U2-B-001]; U2-B-001 requires nothing that leads back',
    },
  },
  (ctx) => {
    const byId = filesById(ctx.files);
    const next = (id: string): string[] => {
      const p = byId.get(id)?.procedure;
      return p ? [...new Set(requiresOf(p).map((s) => s.id))] : [];
    };
    for (const file of ctx.files) {
      const p = file.procedure;
      if (!p?.id || byId.get(p.id) !== file) continue;
      for (const site of requiresOf(p)) {
        const chain = pathBack(site.id, p.id, next);
        if (!chain) continue;
        const circle = [p.id, ...chain];
        ctx.report(file, {
          path: [...site.path],
          message: circle.length === 2
            ? `${p.id} requires itself.`
            : `Requiring '${site.id}' closes a circle of requirements: ${circle.join(' → ')}.`,
          hint: 'Keep requirements one-way: state the part one procedure needs of the other as a line-up condition, or move it to a procedure both call.',
          trace: circle,
        });
      }
    }
  },
);

/** The shortest chain of requirements from `from` back to `to` (both included), or undefined. */
function pathBack(from: string, to: string, next: (id: string) => string[]): string[] | undefined {
  const parent = new Map<string, string | null>([[from, null]]);
  const queue = [from];
  while (queue.length) {
    const id = queue.shift()!;
    if (id === to) {
      const out: string[] = [];
      for (let at: string | null = id; at !== null; at = parent.get(at)!) out.unshift(at);
      return out;
    }
    for (const n of next(id)) if (!parent.has(n)) {
      parent.set(n, id);
      queue.push(n);
    }
  }
  return undefined;
}
