// Reports a verification done by the same role that performs the step: it is not a second person's check.
import { walkSteps } from '../../model/walk-steps.ts';
import { defineFileRule } from '../define-rule.ts';

export default defineFileRule(
  {
    id: 'independent-check-by-performer',
    summary: 'A step\'s verification is given to the role that performs it.',
    category: 'safety',
    defaultSeverity: 'error',
    source: 'DOE-STD-1029-92 (verification steps and sign-offs); HSE HSG48 (checking by a second person)',
    docs: `A step can name who does it (\`performer\`) and who checks it and how (\`verify: { kind, role }\`):
\`independent\` (a second person checks separately, afterwards), \`peer-check\` (a second person watches as it is
done) or \`second-person\` (a second person signs). The table and the chart show both. A check by the role that
did the step is not a second person's check: the same assumptions and the same slip repeat. Name a different
role.`,
    examples: {
      bad: 'performer: Field operator\nverify: { kind: independent, role: Field operator }',
      good: 'performer: Field operator\nverify: { kind: independent, role: Shift supervisor }',
    },
  },
  (ctx) => {
    if (!ctx.procedure) return;
    for (const { step } of walkSteps(ctx.procedure.steps)) {
      if (!step.verify || !step.performer) continue;
      if (step.verify.role.trim().toLowerCase() !== step.performer.trim().toLowerCase()) continue;
      ctx.report({
        path: [...step.verify.path, 'role'],
        message: `Step '${step.id}' is checked (${step.verify.kind}) by ${step.verify.role}, the same role that performs it.`,
        hint: 'A check by a second person needs another role, e.g. the shift supervisor or a second operator.',
      });
    }
  },
);
