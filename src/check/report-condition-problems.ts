// Reports the problems of one kind found in conditions and quantities, at their exact columns.
import type { FileContext } from './define-rule.ts';

export function reportProblemsOfKind(ctx: FileContext, kinds: string[]): void {
  if (!ctx.facts) return;
  // Sites the register supplied are checked once, in the register file (rule register-entry-invalid).
  for (const site of ctx.facts.conditions) {
    if (site.fromRegister) continue;
    for (const p of site.problems) {
      if (!kinds.includes(p.kind)) continue;
      ctx.report({ range: ctx.source.rangeInScalar(site.path, p.span.from, p.span.to), message: p.message, hint: p.hint });
    }
  }
  for (const site of ctx.facts.quantities) {
    if (site.fromRegister) continue;
    for (const p of site.problems) {
      if (!kinds.includes(p.kind)) continue;
      const path = p.kind === 'undeclared-name' && site.role === 'setpoint' ? site.path : site.path;
      ctx.report({ path, part: p.kind === 'undeclared-name' ? 'key' : 'value', message: p.message, hint: p.hint });
    }
  }
}
