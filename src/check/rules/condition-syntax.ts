// Reports a transition, branch or trip condition that does not follow the condition language.
import { defineFileRule } from '../define-rule.ts';

export default defineFileRule(
  {
    id: 'condition-syntax',
    summary: 'A condition is not written in the condition language.',
    category: 'conditions',
    defaultSeverity: 'error',
    docs: `Conditions (\`until\`, \`when\`, \`trips-when\`) compare declared signals with values:
\`TI-210 >= 238 degC\`, \`lab-result == pass\`, combined with \`and\`, \`or\`, \`not\` and parentheses. The
built-ins \`done\` and \`elapsed\` (\`elapsed >= 90 min\`) are always available. A sentence for the operator
belongs in \`confirm\`, not in \`until\`. A unit written apart (\`6 bar g\`, \`6 kPa(g)\`, \`6 deg C\`) is reported as such,
with the one-word spelling to write (\`barg\`, \`kPag\`, \`degC\`).`,
    examples: { bad: 'until: kettle is hot', good: 'until: TI-210 >= 180 degC' },
  },
  (ctx) => {
    if (!ctx.facts) return;
    for (const site of ctx.facts.conditions) {
      if (site.fromRegister) continue;
      if (site.result.ok) continue;
      const { span, message, hint } = site.result.error;
      ctx.report({ range: ctx.source.rangeInScalar(site.path, span.from, Math.max(span.to, span.from + 1)), message, hint });
    }
  },
);
