// Reports, in emergency and emergency-shutdown procedures, a step that checks equipment moved without saying
// what to do when it did not.
import type { Procedure, Step } from '../../model/procedure.ts';
import { walkSteps } from '../../model/walk-steps.ts';
import { comparisonsIn, parseCondition } from '../../analysis/conditions/parse.ts';
import { defineFileRule } from '../define-rule.ts';
import { emergencyKinds } from '../../model/kinds.ts';

const movedWords = /\b(open|opened|closed|shut|stopped|running|started|isolated|tripped|moved|in position)\b/i;
const stateWords = /^(open|opened|closed|shut|stopped|running|started|on|off|isolated|tripped|latched|cip|product)$/i;
/** A plant tag: letters, a hyphen, digits (XV-2101, M-210, P-221A). */
const plantTag = /^[A-Z]{1,5}-\d/;

export default defineFileRule(
  {
    id: 'contingency-missing',
    summary: 'An emergency step that checks equipment moved does not say what to do if it did not.',
    category: 'safety',
    defaultSeverity: 'error',
    inCallExpansion: true,
    source: 'DOE-STD-1029-92, Writer\'s Guide for Technical Procedures (contingency actions); HSE HSG48 (plan for the expected failure)',
    docs: `In an emergency the valve that should close sometimes does not. Every step of an \`emergency\` or
\`emergency-shutdown\` procedure that checks that equipment moved (its \`until\` compares a valve, motor or other
equipment state, or its \`confirm\` says a thing is open, closed, stopped or running) needs an \`if-not\`: the
response with its own actions (\`do\`), or a jump to another step (\`goto\`), or both. The step table shows it in a
second column and placekeeping offers it.

\`\`\`yaml
- step: confirm-hot-oil-closed
  do: Confirm hot-oil valve XV-2101 is closed
  until: XV-2101 == closed
  if-not:
    do: [Close hand valve HV-2101 upstream of XV-2101, Tell the shift supervisor]
\`\`\`

The steps an emergency procedure runs through a \`call\` are held to the same rule, call after call: the called
procedure may be a \`normal\` shared operation that is fine in normal use, but in the emergency its stuck valve is
the emergency's. Such a step is reported at the call step of the emergency procedure, under
\`call-expansion-problem\`, naming the called procedure and step. Give the called step an \`if-not\`, or give the
call step one (a response for the whole called operation, which then covers each of its steps).`,
    examples: {
      bad: 'kind: emergency-shutdown\nsteps: [{ step: check-closed, until: XV-2101 == closed }]',
      good: "steps: [{ step: check-closed, until: XV-2101 == closed, if-not: { do: Close hand valve HV-2101 } }]",
    },
  },
  (ctx) => {
    if (!ctx.procedure || !emergencyKinds.has(ctx.procedure.kind)) return;
    for (const { step } of walkSteps(ctx.procedure.steps)) {
      if (step.ifNot && (step.ifNot.actions.length || step.ifNot.goto)) continue;
      // A step run through a call (checked with the calls expanded) whose call step has an if-not is covered by it.
      if (step.extra.callIfNot) continue;
      const why = checksMovement(step, ctx.procedure);
      if (!why) continue;
      ctx.report({
        path: [...step.path, 'step'],
        message: `Emergency step '${step.id}' checks that ${why}, but does not say what to do if it did not.`,
        hint: step.extra.inlinedFrom
          ? 'Add if-not with the response (do: the actions, e.g. close the hand valve upstream) to the called step, or to the call step for the whole called operation.'
          : 'Add if-not with the response (do: the actions, e.g. close the hand valve upstream) or a goto to the step to go to.',
      });
    }
  },
);

function checksMovement(step: Step, procedure: Procedure): string | undefined {
  if (step.until) {
    const parsed = parseCondition(step.until.value);
    if (parsed.ok) {
      for (const cmp of comparisonsIn(parsed.condition)) {
        const signal = procedure.signals[cmp.name.name];
        if (!signal?.values?.length || cmp.value.kind !== 'word') continue;
        if (plantTag.test(cmp.name.name) || stateWords.test(String(cmp.value.value))) return `${cmp.name.name} is ${cmp.op === '!=' ? 'not ' : ''}${cmp.value.value}`;
      }
    }
  }
  const m = step.confirm?.value.match(movedWords);
  if (m) return `"${step.confirm!.value}"`;
  return undefined;
}
