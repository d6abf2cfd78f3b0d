// The one schema of a procedure's front-matter: the CLI, the site and the editor's JSON Schema all use it.
import { z } from 'zod';
import { kinds } from './kinds.ts';
import { isCalendarDate, isoDatePattern } from './calendar-date.ts';

export const procedureIdPattern = /^[A-Z0-9][A-Z0-9-]*$/;
export const stepIdPattern = /^[a-z0-9][a-z0-9-]*$/;

export { kinds };
export const statuses = ['draft', 'in-review', 'approved', 'effective', 'superseded', 'retired'] as const;
export const hazardLevels = ['danger', 'warning', 'caution', 'notice'] as const;

const text = z.string().trim().min(1, 'must not be empty');
const date = z
  .string()
  .regex(isoDatePattern, 'must be a date written YYYY-MM-DD')
  .refine(isCalendarDate, 'is not a calendar date');
/** A quantity written as text, e.g. "238 degC"; its unit is checked by the rules, not here. */
const quantityText = z.union([z.string(), z.number()]);

/** A state an equipment or signal can be in: a declared value ("open", "running", true). */
const stateValue = z.union([z.string(), z.boolean(), z.number()]);

export const approvalSchema = z.strictObject({
  role: text.describe('The signer\'s role, e.g. "Process engineer", "Shift supervisor".'),
  name: text.describe('Printed name of the signer.'),
  date: date.describe('Date of the signature, YYYY-MM-DD.'),
  meaning: text.describe('What the signature attests, e.g. "Approved for use".'),
});

export const certificationSchema = z.strictObject({
  name: text.describe('Printed name of the person who certified the procedure current and accurate.'),
  role: text.describe('Their role, e.g. "Operations superintendent".'),
  date: date.describe('Date of the certification, YYYY-MM-DD.'),
});

export const signalSchema = z.strictObject({
  text: text.describe('What the signal is, in plant words.'),
  unit: z.string().optional().describe('Unit of measurement (for numeric signals).'),
  range: z.tuple([z.number(), z.number()]).optional().describe('Declared range [low, high] in the signal\'s unit.'),
  values: z.array(z.union([z.string(), z.boolean(), z.number()])).min(1).optional().describe('Allowed values of an enumerated or boolean signal.'),
});

export const limitSchema = z.strictObject({
  low: quantityText.optional().describe('Low operating limit, a quantity such as "15 degC".'),
  high: quantityText.optional().describe('High operating limit, a quantity such as "245 degC".'),
  consequence: z.string().optional().describe('Consequence of deviating from the limit.'),
  correction: z.string().optional().describe('Steps required to correct or avoid the deviation.'),
});

export const interlockSchema = z.strictObject({
  tag: text.describe('Tag of the safety system, e.g. TSHH-210.'),
  'trips-when': text.describe('The trip condition, e.g. "TI-210 >= 255 degC".'),
  action: text.describe('What the interlock does when it trips.'),
  latches: z.boolean().optional().describe('True when the trip stays in force until a step resets it.'),
  holds: z.record(z.string(), stateValue).optional()
    .describe('The outputs the trip forces, {signal: value}; a latched trip holds them until a reset step.'),
});

export const hazardSchema = z.strictObject({
  level: z.enum(hazardLevels).describe('Signal word: danger, warning, caution or notice.'),
  hazard: text.describe('The hazard.'),
  consequence: z.string().optional().describe('The consequence of not avoiding the hazard.'),
  avoid: z.string().optional().describe('How to avoid the hazard.'),
  at: z.array(z.string()).optional().describe('Step ids the message is repeated before.'),
  when: z.string().optional().describe('The plant state in which the hazard is present, as a condition; no step may be reachable with it true.'),
});

const doSchema = z.union([text, z.array(text).min(1)]);

/** A duration written as text, e.g. "30 s"; checked by the rules. */
const durationText = z.union([z.string(), z.number()]);

/** A lasting action: a plain value lasts until another step changes it; the long form says how long it lasts. */
export const stateActionSchema = z.union([
  stateValue,
  z.strictObject({
    to: stateValue.describe('The value the step gives the signal.'),
    lasts: durationText.optional()
      .describe('"step": only while the step is active; a duration: at most that long and never past the step; left out: until another step changes it.'),
    after: durationText.optional().describe('A delay: the value takes effect this long after the step starts, if the step is still active.'),
  }),
]);

export const verificationKinds = ['independent', 'peer-check', 'second-person'] as const;

export const stepSchema = z.strictObject({
  step: z.string().regex(stepIdPattern, 'must be lower-case letters, digits and hyphens, starting with a letter or digit')
    .describe('Step id, unique in the file, stable across revisions.'),
  do: doSchema.describe('The action: a sentence that starts with a verb, or a list of actions done together.'),
  phase: z.string().optional().describe('Equipment phase the step runs (ISA-88 sense), e.g. charge, heat.'),
  set: z.record(z.string(), quantityText).optional().describe('Setpoints {signal: quantity}.'),
  params: z.record(z.string(), z.union([z.string(), z.number(), z.boolean()])).optional().describe('Other phase parameters.'),
  until: z.string().optional().describe('The transition condition that ends the step.'),
  confirm: z.string().optional().describe('An operator check that ends the step when confirmed.'),
  expect: z.union([z.string(), z.number()]).optional().describe('Typical duration, e.g. "40 min" or "30..50 min".'),
  'sign-off': z.string().optional().describe('Role whose signature is needed before going on (a hold point).'),
  note: z.string().optional().describe('Extra information for the operator; never an action.'),
  waive: z.array(z.strictObject({
    rule: text.describe('Id of the rule waived on this step.'),
    reason: z.string().optional().describe('Why the rule does not apply here; required (a waiver without one is an error).'),
  })).optional().describe('Rules waived on this one step, each with a written reason.'),
  call: z.union([
    z.string().regex(procedureIdPattern, 'must be a procedure id, e.g. U2-K210-INERT-001'),
    z.strictObject({
      procedure: z.string().regex(procedureIdPattern, 'must be a procedure id, e.g. U2-K210-INERT-001').describe('Id of the called procedure.'),
      revision: z.number().int().min(0).optional().describe('The revision of the called procedure this step was written and reviewed against.'),
    }),
  ]).optional().describe('Runs another procedure (a shared operation) as this step; the step ends when that procedure ends.'),
  state: z.record(z.string(), stateActionSchema).optional()
    .describe('States the step puts equipment in, {signal: value}; they last until another step changes them unless the long form says otherwise.'),
  needs: z.string().optional().describe('A condition the step relies on; it must hold on every path that reaches the step.'),
  trips: z.array(z.string()).optional().describe('Interlocks the step trips on purpose (a trip test).'),
  resets: z.array(z.string()).optional().describe('Latched interlocks the step resets.'),
  performer: z.string().optional().describe('The role that does the step.'),
  verify: z.strictObject({
    kind: z.enum(verificationKinds).describe('independent: a second person checks separately afterwards; peer-check: a second person watches as it is done; second-person: a second person signs.'),
    role: text.describe('The role of the person who checks or signs.'),
  }).optional().describe('Who checks the step and how.'),
  'max-drop': z.record(z.string(), quantityText).optional()
    .describe('A hold test\'s acceptance criterion, {signal: quantity}: the most the signal may fall during the step for the test to pass.'),
  'time-limit': z.strictObject({
    max: durationText.describe('The longest the step may take, e.g. "15 min".'),
    then: text.describe('What to do when the step takes longer.'),
    goto: z.string().optional().describe('Step id to go to when the limit is exceeded.'),
  }).optional().describe('A maximum duration and what to do when it is exceeded.'),
  'if-not': z.strictObject({
    do: doSchema.optional().describe('The response: actions to take when the expected result does not come.'),
    goto: z.string().optional().describe('Step id to go to instead.'),
  }).refine((o) => o.do !== undefined || o.goto !== undefined, { message: "needs a response: 'do' with the actions to take, 'goto' with the step to go to, or both" })
    .optional().describe('What to do when the step\'s expected result does not come (a response with actions, or a jump).'),
});

export type StepInput = z.infer<typeof stepSchema>;

export interface ParallelInput {
  parallel: Record<string, SequenceItemInput[]>;
}
export interface BranchInput {
  when?: string;
  otherwise?: boolean;
  steps?: SequenceItemInput[];
  goto?: string;
  repeat?: { expected: number; max: number };
}
export interface ChooseInput {
  choose: BranchInput[];
}
export type SequenceItemInput = StepInput | ParallelInput | ChooseInput;

export const sequenceSchema: z.ZodType<SequenceItemInput[]> = z.lazy(() => z.array(sequenceItemSchema));

/** Messages of an empty parallel block and an empty branch (src/model/validate.ts gives them their hints). */
export const emptyParallelMessage = 'holds no branches: a parallel block runs two or more branches at once';
export const emptyBranchMessage = 'is an empty parallel branch: a branch needs at least one step';

export const parallelSchema: z.ZodType<ParallelInput> = z.strictObject({
  parallel: z.record(
    z.string().regex(stepIdPattern, 'branch names must be lower-case letters, digits and hyphens'),
    z.lazy(() => z.array(sequenceItemSchema).min(1, emptyBranchMessage)),
  ).refine((branches) => Object.keys(branches).length > 0, emptyParallelMessage)
    .describe('Branches that run at once; the block ends when every branch has ended.'),
});

export const branchSchema: z.ZodType<BranchInput> = z.strictObject({
  when: z.string().optional().describe('The condition that selects this branch.'),
  otherwise: z.literal(true).optional().describe('Taken when no other branch is true.'),
  steps: sequenceSchema.optional().describe('Steps of the branch; they rejoin after the block.'),
  goto: z.string().optional().describe('Step id to jump to after the branch (a loop).'),
  repeat: z.strictObject({
    expected: z.number().min(0).describe('Typical number of times the jump is taken in one run, e.g. 1.5.'),
    max: z.number().int().min(0).describe('Most times the jump can be taken in one run.'),
  }).optional().describe('How often a loop repeats, for cycle-time estimates.'),
});

export const chooseSchema: z.ZodType<ChooseInput> = z.strictObject({
  choose: z.array(branchSchema).min(1).describe('Alternative branches; exactly one is taken.'),
});

/** Picks the item schema by the key the author used, so errors speak about the intended kind of item. */
export const sequenceItemSchema: z.ZodType<SequenceItemInput> = z.lazy(() =>
  z.union([stepSchema, parallelSchema, chooseSchema]),
);

export const procedureSchema = z.strictObject({
  id: z.string().regex(procedureIdPattern, 'must be upper-case letters, digits and hyphens, e.g. U2-K210-BATCH-001')
    .describe('Document number, unique in the manual, used in URLs.'),
  title: text.describe('What the procedure does, on which equipment.'),
  kind: z.enum(kinds).describe('The operating phase the procedure covers.'),
  revision: z.number().int().min(0).describe('Bumped on every change of content.'),
  status: z.enum(statuses).describe('Life-cycle state.'),
  effective: date.optional().describe('When this revision took effect (required from approved on).'),
  'review-by': date.optional().describe('Next periodic review.'),
  owner: z.string().optional().describe('The responsible group.'),
  author: z.string().optional().describe('Who wrote this revision.'),
  change: z.string().optional().describe('Why this revision exists, with any change-control reference.'),
  approvals: z.array(approvalSchema).optional().describe('Sign-offs with printed name, date and meaning.'),
  equipment: z.array(z.string()).optional().describe('Equipment tags the procedure operates.'),
  ppe: z.array(z.string()).optional().describe('Protective equipment required.'),
  signals: z.record(z.string(), signalSchema).optional().describe('Everything a condition may name.'),
  limits: z.record(z.string(), limitSchema).optional().describe('Operating limits per signal.'),
  interlocks: z.array(interlockSchema).optional().describe('Safety systems and their functions.'),
  hazards: z.array(hazardSchema).optional().describe('Safety messages, pulled to the top and repeated before steps.'),
  'conditions-requiring': z.union([text, z.array(text)]).optional().describe('Emergency shutdown: the conditions that require it.'),
  responsible: z.string().optional().describe('Emergency shutdown: who initiates it and who is in charge.'),
  uses: z.array(text).optional().describe('Plant register entries the procedure uses: signals, safety functions, relief devices, chemicals, equipment.'),
  certifications: z.array(certificationSchema).optional().describe('Annual certifications that the procedure is current and accurate.'),
  expires: date.optional().describe('Temporary procedures: the last day the procedure may be used.'),
  modifies: z.array(z.string().regex(procedureIdPattern, 'must be a procedure id, e.g. U2-T230-CIP-001')).optional()
    .describe('Temporary procedures: ids of the procedures this one changes while it is in force.'),
  'line-up': z.array(text).optional().describe('Conditions that must hold before the first step, e.g. "XV-2101 == closed"; shown as a checklist.'),
  requires: z.array(z.string().regex(procedureIdPattern, 'must be a procedure id')).optional()
    .describe('Procedures that must have been completed before this one starts.'),
  steps: sequenceSchema.describe('The sequence: steps and blocks, run in order.'),
});

export type ProcedureInput = z.infer<typeof procedureSchema>;
