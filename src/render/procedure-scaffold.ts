// Writes the text of a new procedure of a given kind: every section that kind needs, with TODO placeholders.
import type { Kind } from '../model/procedure.ts';
import { placeholderMarker as TODO } from '../model/placeholder.ts';

export interface ScaffoldOptions {
  kind: Kind;
  id: string;
  title?: string;
  /** Path from the new file's folder to schema/procedure.schema.json, for the editor modeline. */
  schemaPath?: string;
}

interface ScaffoldStep {
  id: string;
  do: string;
  phase?: string;
  confirm?: string;
  until?: string;
  set?: string;
  expect: string;
  signOff?: string;
}

interface KindPlan {
  /** Narrative sections beyond Purpose, Scope, References and Notes. */
  sections: Array<{ heading: string; text: string }>;
  steps: ScaffoldStep[];
  /** YAML text placed after the steps (a decision block), indented for the steps list. */
  after?: string;
  labSignal?: boolean;
  /** Front-matter lines the kind needs beyond the common ones. */
  keys?: string[];
}

const todo = (text: string) => `"${TODO}: ${text}"`;
const signal = `${TODO}-TI`;

const operate = (id: string, what: string): ScaffoldStep => ({
  id, do: todo(what), set: `{ ${signal}: 160 degC }`, until: `${signal} >= 150 degC`, expect: '20..30 min',
});
const check = (id: string, what: string, expect = '5 min'): ScaffoldStep => ({ id, do: todo(what), confirm: todo('the check that shows this step is done'), expect });

const plans: Record<Kind, KindPlan> = {
  normal: { sections: [], steps: [check('prepare', 'first action, starting with a verb'), operate('operate', 'main action'), check('finish', 'last action')] },
  batch: {
    sections: [],
    labSignal: true,
    steps: [
      { ...check('prepare', 'check the unit is ready for the batch'), phase: 'prepare' },
      { ...check('charge', 'charge the first material', '15..20 min'), phase: 'charge' },
      { ...operate('heat', 'heat to the reaction temperature'), phase: 'heat' },
      { ...check('sample', 'draw a sample and send it to the lab', '30..45 min'), phase: 'sample' },
    ],
    after: `  - choose:
      - when: ${TODO}-lab == pass
        steps:
          - step: discharge
            phase: transfer
            do: ${todo('discharge the batch')}
            confirm: ${todo('the check that shows the unit is empty')}
            expect: 20 min
      - when: ${TODO}-lab == fail
        goto: heat
        repeat: { expected: 0.5, max: 2 }
`,
  },
  startup: {
    sections: [{ heading: 'Before you start', text: `${TODO}: the conditions that must hold before start-up (permits closed, utilities available, interlocks tested).` }],
    steps: [check('pre-start-checks', 'check the unit is ready to start', '15 min'), check('line-up', 'line up valves for start-up', '10 min'), operate('start', 'start the equipment and bring it to its operating point'), { ...check('hand-over', 'hand the running unit over to the shift'), signOff: todo('role that accepts the running unit') }],
  },
  'startup-after-turnaround': {
    sections: [
      { heading: 'Pre-startup safety review', text: `${TODO}: list what the pre-startup safety review confirms (construction to design, procedures and training in place, changes reviewed).` },
      { heading: 'Before you start', text: `${TODO}: blinds removed, permits closed, equipment leak-tested and inerted where needed.` },
    ],
    steps: [{ ...check('safety-review', 'confirm the pre-startup safety review is signed', '10 min'), signOff: todo('role that signs the pre-startup safety review') }, check('remove-blinds', 'remove the turnaround blinds to the blind list', '60 min'), check('leak-test', 'leak-test the opened joints', '30..60 min'), operate('start', 'start the equipment and bring it to its operating point'), check('hand-over', 'hand the running unit over to the shift')],
  },
  shutdown: {
    sections: [],
    steps: [check('reduce', 'reduce the load or stop the feed'), { id: 'cool-down', do: todo('stop heating and cool down'), until: `${signal} <= 40 degC`, expect: '30..60 min' }, check('isolate', 'isolate the equipment'), check('make-safe', 'leave the unit in a safe state')],
  },
  'emergency-shutdown': {
    sections: [],
    keys: [
      'conditions-requiring:',
      `  - ${todo('a condition that requires this shutdown (an alarm, a reading or an event)')}`,
      `responsible: ${todo('who initiates the shutdown and who is in charge')}`,
    ],
    steps: [check('trip', 'press the emergency stop', '1 min'), { id: 'confirm-safe', do: todo('check the unit reaches its safe state'), until: `${signal} <= 100 degC`, expect: '5..15 min' }, check('report', 'report the shutdown to the shift supervisor')],
  },
  emergency: {
    sections: [
      { heading: 'When to use', text: `${TODO}: the event this procedure responds to and how it is recognised.` },
      { heading: 'Who is responsible', text: `${TODO}: who leads the response, and who is called.` },
    ],
    steps: [check('raise-alarm', 'raise the alarm', '1 min'), check('make-safe', 'make the area safe', '5..10 min'), check('report', 'report the event')],
  },
  temporary: {
    sections: [{ heading: 'Why temporary, and until when', text: `${TODO}: the reason for the temporary operation, its change-control reference and the date or condition that ends it.` }],
    steps: [check('prepare', 'prepare for the temporary operation'), operate('operate', 'main action'), check('restore', 'restore normal operation')],
  },
};

export function scaffoldProcedure(options: ScaffoldOptions): string {
  const plan = plans[options.kind];
  const firstStep = plan.steps[0].id;
  const lines: string[] = ['---'];
  if (options.schemaPath) lines.push(`# yaml-language-server: $schema=${options.schemaPath}`);
  lines.push(
    `id: ${options.id}`,
    `title: ${options.title ? JSON.stringify(options.title) : todo('what the procedure does, on which equipment')}`,
    `kind: ${options.kind}`,
    'revision: 0',
    'status: draft',
    `owner: ${todo('the responsible group')}`,
    `author: ${todo('your name')}`,
    'change: New procedure',
    ...(plan.keys ?? []),
    `equipment: [${TODO}-TAG]`,
    'ppe:',
    `  - ${todo('protective equipment required')}`,
    '',
    '# Every name a condition uses; replace the placeholder signal with the real tags.',
    'signals:',
    `  ${signal}: { text: ${todo('what the signal measures')}, unit: degC, range: [0, 300] }`,
    ...(plan.labSignal ? [`  ${TODO}-lab: { text: ${todo('the lab result that decides')}, values: [pass, fail] }`] : []),
    '',
    'limits:',
    `  ${signal}:`,
    '    low: 10 degC',
    '    high: 200 degC',
    `    consequence: ${todo('what happens outside the limit')}`,
    `    correction: ${todo('how to bring the value back')}`,
    '',
    'interlocks:',
    `  - tag: ${TODO}-TSHH`,
    `    trips-when: ${signal} >= 250 degC`,
    `    action: ${todo('what the safety system does when it trips')}`,
    '',
    'hazards:',
    '  - level: warning',
    `    hazard: ${todo('the hazard')}`,
    `    consequence: ${todo('what happens if it is not avoided')}`,
    `    avoid: ${todo('how to avoid it')}`,
    `    at: [${firstStep}]`,
    '',
    'steps:',
  );
  for (const step of plan.steps) lines.push(...stepLines(step));
  if (plan.after) lines.push(plan.after.trimEnd());
  lines.push('---', '');
  const sections = [
    { heading: 'Purpose', text: `${TODO}: why this procedure exists and the state the plant is in when it ends.` },
    { heading: 'Scope', text: `${TODO}: the equipment and situations it covers, and what it does not cover.` },
    ...plan.sections,
    { heading: 'References', text: `- ${TODO}: documents this procedure rests on (process safety information, drawings, standards).` },
    { heading: 'Notes', text: '- Site rules, training and local codes prevail over this procedure.' },
  ];
  for (const s of sections) lines.push(`## ${s.heading}`, '', s.text, '');
  return lines.join('\n');
}

function stepLines(step: ScaffoldStep): string[] {
  const out = [`  - step: ${step.id}`];
  if (step.phase) out.push(`    phase: ${step.phase}`);
  out.push(`    do: ${step.do}`);
  if (step.set) out.push(`    set: ${step.set}`);
  if (step.until) out.push(`    until: ${step.until}`);
  if (step.confirm) out.push(`    confirm: ${step.confirm}`);
  out.push(`    expect: ${step.expect}`);
  if (step.signOff) out.push(`    sign-off: ${step.signOff}`);
  return out;
}
