// Reports a condition that mixes `and` and `or` without parentheses, which readers group differently.
import type { Condition } from '../../analysis/conditions/ast.ts';
import { defineFileRule } from '../define-rule.ts';

export default defineFileRule(
  {
    id: 'mixed-and-or',
    summary: 'A condition mixes and/or without parentheses.',
    category: 'writing',
    defaultSeverity: 'warning',
    source: 'DOE-STD-1029-92, Writer\'s Guide for Technical Procedures: do not combine AND and OR in one logic statement without making the grouping explicit (from memory)',
    docs: `\`a and b or c\` is read by Stepwright as \`(a and b) or c\`, but an operator may read it as
\`a and (b or c)\`. Where both appear, write the parentheses so that the grouping is on the page.`,
    examples: {
      bad: 'until: TI-210 <= 60 degC and PI-210 <= 110 kPa or elapsed >= 2 h',
      good: 'until: (TI-210 <= 60 degC and PI-210 <= 110 kPa) or elapsed >= 2 h',
    },
  },
  (ctx) => {
    if (!ctx.facts) return;
    for (const site of ctx.facts.conditions) {
      if (site.fromRegister) continue;
      if (!site.result.ok) continue;
      for (const node of mixedNodes(site.result.condition)) {
        ctx.report({
          range: ctx.source.rangeInScalar(site.path, node.span.from, node.span.to),
          message: `'${site.text.slice(node.span.from, node.span.to)}' mixes '${node.kind}' with '${node.kind === 'and' ? 'or' : 'and'}' without parentheses.`,
          hint: 'Add parentheses around the part that belongs together, e.g. "(a and b) or c".',
        });
      }
    }
  },
);

/** Each and/or node that has an operand of the other kind not written in parentheses. */
function mixedNodes(c: Condition): Condition[] {
  const out: Condition[] = [];
  const visit = (node: Condition) => {
    if (node.kind === 'and' || node.kind === 'or') {
      const other = node.kind === 'and' ? 'or' : 'and';
      if (node.operands.some((o) => o.kind === other && !o.parenthesized)) out.push(node);
      node.operands.forEach(visit);
    } else if (node.kind === 'not') visit(node.operand);
  };
  visit(c);
  return out;
}
