// Reports a step whose time limit is shorter than the step itself says it takes: a hold that cannot end
// before the limit, or an expected duration that runs past it.
import { formatSeconds } from '../../analysis/cycle-time.ts';
import { expectedLongest, timeLimitSeconds, untilShortest } from '../../analysis/step-durations.ts';
import { walkSteps } from '../../model/walk-steps.ts';
import { defineFileRule } from '../define-rule.ts';

export default defineFileRule(
  {
    id: 'time-limit-below-expected',
    summary: "A step's time limit is shorter than the time the step itself waits for or is expected to take.",
    category: 'sequence',
    defaultSeverity: 'error',
    source: 'DOE-STD-1029-92 (time-dependent steps and contingency actions); common practice: a limit is set above the normal duration so that it marks an abnormal one',
    docs: `\`time-limit: { max, then, goto }\` says what to do when a step takes too long. The limit must lie beyond
what the step needs in normal running, or the response fires every time:

- a step that waits for time (\`until: elapsed >= 60 min and TI-210 >= 225 degC\`) cannot end before 60 min, so a
  \`max\` of 30 min always runs out;
- a step expected to take \`90..120 min\` reaches a \`max\` of 100 min in a normal batch.

Durations are compared in one unit, so \`2 h\` and \`120 min\` are equal; a \`max\` without a time unit is reported
by state-reference-unknown. Fix the limit (or the expected duration, if that is what is wrong).`,
    examples: {
      bad: 'until: elapsed >= 60 min\ntime-limit: { max: 30 min, then: Tell the shift supervisor }',
      good: 'until: elapsed >= 60 min\nexpect: 60..75 min\ntime-limit: { max: 90 min, then: Tell the shift supervisor }',
    },
  },
  (ctx) => {
    if (!ctx.procedure) return;
    for (const { step } of walkSteps(ctx.procedure.steps)) {
      const max = timeLimitSeconds(step);
      if (max === undefined) continue;
      const hold = untilShortest(step);
      if (hold && (max < hold.seconds || (max === hold.seconds && hold.strict))) {
        ctx.report({
          path: step.timeLimit!.max.path,
          message: `Step '${step.id}' cannot end before ${formatSeconds(hold.seconds)} (its until waits for elapsed time), but its time limit is ${step.timeLimit!.max.value}: the limit always runs out.`,
          hint: 'Set the time limit above the hold time and the expected duration, or shorten the hold if that is what is wrong.',
          related: [{ path: step.until!.path, message: 'the hold time' }],
        });
        continue;
      }
      const expected = expectedLongest(step);
      if (expected !== undefined && expected > max) {
        ctx.report({
          path: step.timeLimit!.max.path,
          message: `Step '${step.id}' is expected to take up to ${formatSeconds(expected)}, longer than its time limit of ${step.timeLimit!.max.value}: the limit runs out in normal running.`,
          hint: 'Set the time limit above the longest expected duration, or correct the expected duration.',
          related: [{ path: step.expect!.path, message: 'the expected duration' }],
        });
      }
    }
  },
);
