// Reports a procedure that tests some of the trips protecting an item of equipment but not all of them.
import { namesIn, parseCondition } from '../../analysis/conditions/parse.ts';
import type { PlantRegister, RegisterSafetyFunction } from '../../model/register.ts';
import { walkSteps } from '../../model/walk-steps.ts';
import { defineFileRule } from '../define-rule.ts';

export default defineFileRule(
  {
    id: 'trip-test-incomplete',
    summary: 'The procedure tests some of the trips that protect an item of equipment, but leaves others of the same item untested.',
    category: 'safety',
    defaultSeverity: 'error',
    source: 'OSHA 29 CFR 1910.119(j)(4): inspection and testing of safety systems; IEC 61511-1 (2016) clause 16.3, proof testing of each safety instrumented function (from memory); common practice: a trip test after a turnaround covers every trip of the unit',
    docs: `A step with \`trips: [...]\` trips interlocks on purpose, as in a trip test. When a procedure tests trips of
an item of equipment (a kettle, a tank), it should test every trip the plant register lists for that item: a
turnaround start-up that proves two of five kettle trips lets the kettle start with three unproven ones, while
the step text and the sign-off form may say "all trips tested".

Which trips protect which item comes from the register: a safety function protects the equipment of the
signals its \`trips-when\` names (\`TI-210\` is on \`K-210\`). Add the missing trips to the procedure's \`uses\` and to
the test step's \`trips\` (and the latching ones to the reset step's \`resets\`). When another procedure or a work
order tests them, waive this rule on the test step and say which one in the reason. Without a plant register
the rule cannot tell which trips belong together and does nothing.`,
    examples: {
      bad: 'uses: [TSHH-210, PSHH-210]\nsteps: [{ step: test-trips, trips: [TSHH-210, PSHH-210] }]   # register: five K-210 trips',
      good: 'uses: [TSHH-210, PSHH-210, AAH-210, LSHH-210, HS-2190]\nsteps: [{ step: test-trips, trips: [TSHH-210, PSHH-210, AAH-210, LSHH-210, HS-2190] }]',
    },
  },
  (ctx) => {
    const p = ctx.procedure;
    const register = ctx.register;
    if (!p || !register || !register.safetyFunctions.size) return;
    const testing = walkSteps(p.steps).filter(({ step }) => (step.trips ?? []).length > 0);
    if (!testing.length) return;
    const tested = new Set(testing.flatMap(({ step }) => step.trips!.map((t) => t.value)));
    const byEquipment = tripsByEquipment(register);
    const reported = new Set<string>();
    for (const { step } of testing) {
      for (const trip of step.trips!) {
        const fn = register.safetyFunctions.get(trip.value);
        if (!fn) continue;
        for (const item of equipmentOf(fn, register)) {
          if (reported.has(item)) continue;
          const all = byEquipment.get(item) ?? [];
          const missing = all.filter((f) => !tested.has(f.id));
          if (!missing.length) continue;
          reported.add(item);
          const done = all.length - missing.length;
          ctx.report({
            path: [...step.path, 'trips'],
            message: `The procedure tests ${done} of the ${all.length} trips the plant register lists for ${item}; not tested: ${missing.map((f) => f.id).join(', ')}.`,
            hint: `Add ${missing.map((f) => f.id).join(', ')} to 'uses' and to this step's 'trips' (latching ones also to the reset step), or waive this rule here and name the procedure or work order that tests them.`,
            related: missing.slice(0, 3).map((f) => ({ file: f.file, range: register.sources.find((s) => s.file === f.file)?.source.rangeOf(f.path, 'key'), message: `${f.id} (${f.text ?? 'trip'}) is not tested` }))
              .filter((r): r is { file: string; range: NonNullable<typeof r.range>; message: string } => r.range !== undefined),
          });
        }
      }
    }
  },
);

/** The equipment a safety function protects: the equipment of the signals its trip condition names. */
function equipmentOf(fn: RegisterSafetyFunction, register: PlantRegister): string[] {
  if (!fn.tripsWhen) return [];
  const parsed = parseCondition(fn.tripsWhen.value);
  if (!parsed.ok) return [];
  const out = new Set<string>();
  for (const n of namesIn(parsed.condition)) {
    const item = register.signals.get(n.name)?.equipment;
    if (item) out.add(item);
  }
  return [...out];
}

function tripsByEquipment(register: PlantRegister): Map<string, RegisterSafetyFunction[]> {
  const out = new Map<string, RegisterSafetyFunction[]>();
  for (const fn of register.safetyFunctions.values()) {
    for (const item of equipmentOf(fn, register)) out.set(item, [...(out.get(item) ?? []), fn]);
  }
  return out;
}
