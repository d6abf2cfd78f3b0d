// Reports, in emergency and emergency-shutdown procedures, a step that waits for a process signal with no time limit.
import { namesIn } from '../../analysis/conditions/parse.ts';
import { defineFileRule } from '../define-rule.ts';
import { emergencyKinds } from '../../model/kinds.ts';

/** Built-in names that are no process signal: time in the step, and the step's own actions done. */
const notProcess = new Set(['elapsed', 'done']);

export default defineFileRule(
  {
    id: 'emergency-wait-without-time-limit',
    summary: 'An emergency step waits for a process signal with no time limit.',
    category: 'safety',
    defaultSeverity: 'warning',
    inCallExpansion: true,
    source: 'Common practice: an emergency step that waits for a plant response says how long to wait and what to do when it does not come (DOE-STD-1029-92, Writer\'s Guide for Technical Procedures, contingency actions)',
    docs: `In an \`emergency\` or \`emergency-shutdown\` procedure, a step whose \`until\` waits for a process signal (a
valve position, a temperature, a level, a flow) may wait for ever: the valve is stuck, the transmitter has failed,
the cooling does not bite. An operator must not be left waiting, in an emergency, for a value that may never come.
Each such step needs a \`time-limit\`: the longest wait (\`max\`) and what to do then (\`then\`, and a \`goto\` where
the response is a step of the procedure).

A wait for elapsed time alone (\`until: elapsed >= 5 min\`) or for the step's own actions (\`until: done\`) ends by
itself and is not reported; a wait that names a signal is, even when joined with \`elapsed\`. Steps that end with a
\`confirm\` only, and the decisions of a \`choose\` block, are not judged here. It is a warning: the step may rightly
wait as long as it takes once the plant is safe, and the reviewer decides; write the time limit even then, with the
hand-over words the operator needs.

\`\`\`yaml
- step: dump-to-drown-tank
  do: Open drown valve XV-2109 to dump K-210 into T-219
  until: LI-210 <= 5 percent
  expect: 8..12 min
  time-limit: { max: 20 min, then: Treat XV-2109 as blocked and tell the shift supervisor }
\`\`\`

The steps an emergency procedure runs through a \`call\` are held to the same rule, call after call: a \`normal\`
shared operation may rightly wait without a limit in normal use, not inside an emergency. Such a step is reported at
the call step of the emergency procedure, under \`call-expansion-problem\`, naming the called procedure and step. A
\`time-limit\` on the call step bounds the whole called operation and covers its steps.`,
    examples: {
      bad: 'kind: emergency-shutdown\nsteps: [{ step: cool-kettle, until: TI-210 <= 180 degC }]',
      good: "steps: [{ step: cool-kettle, until: TI-210 <= 180 degC, time-limit: { max: 90 min, then: Tell the shift supervisor } }]",
    },
  },
  (ctx) => {
    if (!ctx.procedure || !ctx.facts || !emergencyKinds.has(ctx.procedure.kind)) return;
    for (const { step } of ctx.facts.steps) {
      if (!step.until || step.timeLimit) continue;
      // A step run through a call (checked with the calls expanded) whose call step has a time limit is bounded by it.
      if (step.extra.callTimeLimit) continue;
      const site = ctx.facts.conditionAt(step.until.path);
      // A condition that does not read is condition-syntax's.
      if (!site?.result.ok) continue;
      const signals = [...new Set(namesIn(site.result.condition).map((n) => n.name).filter((n) => !notProcess.has(n)))];
      if (!signals.length) continue;
      ctx.report({
        path: site.path,
        message: `Emergency step '${step.id}' waits until ${site.text}, on ${signals.join(', ')}, with no time limit: if the value never comes, the operator waits for ever.`,
        hint: step.extra.inlinedFrom
          ? 'Add time-limit: { max: the longest wait, then: what the operator does when it has passed } to the called step, or to the call step for the whole called operation.'
          : 'Add time-limit: { max: the longest wait, then: what the operator does when it has passed } (and a goto if the response is another step).',
      });
    }
  },
);
