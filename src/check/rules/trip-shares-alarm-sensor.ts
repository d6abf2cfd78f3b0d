// Reports a trip that acts on the same measurement as an alarm a step sets, so that one sensor fault defeats both.
import { namesIn, parseCondition } from '../../analysis/conditions/parse.ts';
import type { Procedure, Step } from '../../model/procedure.ts';
import type { PlantRegister } from '../../model/register.ts';
import { walkSteps } from '../../model/walk-steps.ts';
import { defineFileRule, type Report } from '../define-rule.ts';
import { unnamedRegisterTrips } from '../register-trips.ts';

export default defineFileRule(
  {
    id: 'trip-shares-alarm-sensor',
    summary: 'A trip acts on the same measurement as an alarm the procedure sets, so the two are not independent.',
    category: 'safety',
    defaultSeverity: 'error',
    source: 'OSHA 29 CFR 1910.119(f)(1)(iv): safety systems and their functions; ISA-5.1 loop numbering (one loop number, one measurement); common practice: protection layers credited together must not share a sensor (IEC 61511-1 independence of layers, from memory)',
    docs: `A procedure that sets or changes an alarm (a step parameter whose name starts with \`alarm\`, such as
\`alarm-high: 75 percent\`) relies on that alarm as a layer of protection: the operator answers it before the
trip acts. When a trip of the procedure, or of the plant register, acts on **the same measurement**, one fault of
that transmitter (a frozen reading, a lost signal) silences the alarm and stops the trip at the same moment: the
two are one layer, not two. This matters most in a temporary procedure whose compensating measures count the
alarm and the trip separately.

The alarm's measurement is the signal the parameter is given to in the plant register (its \`params\`), or else
the declared signal that the step's \`do\` text names. Two signals are the same measurement when they are the same
signal, or when they share the measured variable (the first letter) and the loop number with its suffix, as
ISA-5.1 numbers a loop (\`LI-230B\` and \`LT-230B\`). A trip counts when its \`trips-when\` names such a signal.

Make the trip act on a sensor of its own (a separate level switch, a second transmitter), and name that sensor
in \`trips-when\`; or, if the two truly share a sensor, do not count them as separate layers and say so.`,
    examples: {
      bad: "interlocks:\n  - { tag: LSHH-230, trips-when: LI-230B >= 92 percent, action: Stops P-211 }\nsteps:\n  - step: lower-alarm\n    do: Set the high-level alarm on LI-230B to 75 percent\n    params: { alarm-high: 75 percent }",
      good: "interlocks:\n  - { tag: LSHH-230, trips-when: LS-230 == high, action: Stops P-211 }",
    },
  },
  (ctx) => {
    const p = ctx.procedure;
    if (!p) return;
    for (const { step } of walkSteps(p.steps)) {
      for (const param of step.params) {
        if (!/^alarm(?:-|$)/i.test(param.name)) continue;
        for (const signal of alarmSignals(p, step, param.name)) {
          const related: NonNullable<Report['related']> = [];
          const tags: string[] = [];
          for (const interlock of p.interlocks) {
            const parsed = parseCondition(interlock.tripsWhen.value);
            if (!parsed.ok) continue;
            const shared = namesIn(parsed.condition).find((n) => sameMeasurement(n.name, signal));
            if (!shared) continue;
            tags.push(`${interlock.tag} (on ${shared.name})`);
            related.push(interlock.from
              ? { file: interlock.from.file, ...registerRange(ctx.register, interlock.from.file, interlock.from.path), message: `${interlock.tag} in the plant register trips on ${shared.name}` }
              : { path: interlock.tripsWhen.path, message: `${interlock.tag} trips on ${shared.name}` });
          }
          const sameSignals = [signal, ...Object.keys(p.signals).filter((s) => s !== signal && sameMeasurement(s, signal))];
          for (const s of sameSignals) {
            for (const trip of unnamedRegisterTrips(ctx.register, p, s)) {
              if (tags.some((t) => t.startsWith(`${trip.tag} `))) continue;
              tags.push(`${trip.tag} of the plant register (on ${s})`);
              related.push(trip.related);
            }
          }
          if (!tags.length) continue;
          ctx.report({
            path: param.path,
            message: `Step '${step.id}' sets an alarm on ${signal}, and ${tags.join(', ')} trips on the same measurement: one fault of that sensor defeats the alarm and the trip together, so they are not independent layers.`,
            hint: `Give the trip a sensor of its own (a separate switch or transmitter) and name it in 'trips-when', or do not count the alarm and the trip as separate layers.`,
            related,
          });
        }
      }
    }
  },
);

/** The signal an alarm parameter belongs to: the register's binding of the parameter, else the declared signals the step's words name. */
function alarmSignals(p: Procedure, step: Step, param: string): string[] {
  const bound = p.paramSignals?.[param];
  if (bound) return [bound];
  if (p.signals[param]) return [param];
  const words = step.actions.join(' ');
  return Object.keys(p.signals).filter((s) => new RegExp(`(^|[^A-Za-z0-9-])${escape(s)}($|[^A-Za-z0-9-])`).test(words));
}

/** Where a register entry is written, so that a related place points into the register file. */
function registerRange(register: PlantRegister | undefined, file: string, path: readonly (string | number)[]) {
  const range = register?.sources.find((x) => x.file === file)?.source.rangeOf(path);
  return range ? { range } : {};
}

function escape(text: string): string {
  return text.replace(/[.*+?^${}()|[\]\\]/g, '\\$&');
}

/** Same signal, or same measured variable and loop number (ISA-5.1): LI-230B and LT-230B. */
export function sameMeasurement(a: string, b: string): boolean {
  if (a === b) return true;
  const la = loopOf(a);
  const lb = loopOf(b);
  return !!la && !!lb && la.variable === lb.variable && la.loop === lb.loop;
}

function loopOf(tag: string): { variable: string; loop: string } | undefined {
  const m = /^([A-Z])[A-Z]*-(\d+[A-Z]?)$/.exec(tag);
  return m ? { variable: m[1]!, loop: m[2]! } : undefined;
}
