// fast-check generators of procedure files: grammar-based (plausible structure, odd values) and mutations of real files.
import fc from 'fast-check';
import { stringify } from 'yaml';

const signalNames = ['TI-210', 'PI-210', 'FQ-211', 'LI-230', 'lab-result', 'agitator-on', 'acid-value', 'XV-2107'];
const units = ['degC', 'K', 'degF', 'kPa', 'bar', 'mmHg', 'kg', 't', 'percent', '%', 'min', 's', 'h', 'mg/g', 'm3/h', 'furlong', ''];
const stepIds = ['heat-up', 'cook', 'sample', 'await-lab', 'cool', 'transfer', 'a', 'b-1', 'Bad Id', ''];
const words = ['Heat', 'Open', 'Close', 'Check', 'the', 'kettle', 'K-210', 'valve', 'XV-2101', 'slowly', 'if', 'then',
  'and', 'Do', 'not', 'as required', 'approximately', 'TBD', '???', 'DANGER', 'Caution:', '180 degC', 'until', 'hot oil'];

/** Odd text: the characters and fragments that break readers — quotes, YAML and markdown punctuation, controls, bidi. */
export const oddText = fc.oneof(
  { weight: 40, arbitrary: fc.array(fc.constantFrom(...words), { maxLength: 12 }).map((w) => w.join(' ')) },
  { weight: 20, arbitrary: fc.string({ maxLength: 40 }) },
  { weight: 10, arbitrary: fc.string({ unit: 'binary', maxLength: 20 }) },
  { weight: 20, arbitrary: fc.constantFrom('', ' ', '\t', '"', "'", ':', ': ', '#', '- ', '? ', '|', '>', '*a', '&a', '!!binary',
    '!!js/function', '{', '[', '}', ']', '---', '...', '%YAML 1.2', '\u202e', '\u200b', '\ufeff', '\u0000', '\r\n', '\\',
    '<script>x</script>', '[x](javascript:y)', '**', '__', '`', '~~~', '<!--', '1e309', 'NaN', '.inf', '-0', 'null', '~',
    'true', 'no', 'on', '0x1F', '2026-02-30', '9999-99-99') },
  { weight: 1, arbitrary: fc.constantFrom('x'.repeat(2000), 'Heat '.repeat(300)) },
);

const number = fc.oneof(fc.integer({ min: -1000, max: 1000 }), fc.double({ noNaN: false }), fc.constantFrom(0, -1, 1e308, Number.MAX_SAFE_INTEGER));
const quantity = fc.oneof(
  { weight: 4, arbitrary: fc.tuple(number, fc.constantFrom(...units)).map(([v, u]) => `${v} ${u}`.trim()) },
  { weight: 1, arbitrary: oddText },
  { weight: 1, arbitrary: number },
);

/** Conditions from the condition grammar, with wrong pieces mixed in. */
export const condition: fc.Arbitrary<string> = fc.letrec<{ cond: string }>((tie) => ({
  cond: fc.oneof(
    { depthSize: 'small', withCrossShrink: true },
    fc.tuple(fc.constantFrom(...signalNames, 'elapsed', 'done', 'undeclared-x'), fc.constantFrom('==', '!=', '<', '<=', '>', '>=', '=', '=>', ''), quantity)
      .map(([s, op, q]) => `${s} ${op} ${q}`),
    fc.constantFrom('done', 'elapsed >= 90 min', 'lab-result == pass', 'agitator-on == true', 'not', '()', '(((', 'and or'),
    fc.tuple(tie('cond'), fc.constantFrom('and', 'or', 'AND', '&&'), tie('cond')).map(([a, op, b]) => `${a} ${op} ${b}`),
    tie('cond').map((c) => `not (${c})`),
    tie('cond').map((c) => `(${c}`),
  ),
})).cond;

const stepId = fc.oneof({ weight: 3, arbitrary: fc.constantFrom(...stepIds) }, { weight: 1, arbitrary: oddText });

const step = fc.record({
  step: stepId,
  do: fc.oneof(oddText, fc.array(oddText, { maxLength: 3 })),
  phase: fc.constantFrom('charge', 'heat', 'react', 'transfer'),
  set: fc.dictionary(fc.constantFrom(...signalNames, 'unknown'), quantity, { maxKeys: 2 }),
  params: fc.dictionary(fc.constantFrom('speed', 'supply'), fc.oneof(quantity, fc.boolean()), { maxKeys: 2 }),
  until: condition,
  confirm: oddText,
  expect: fc.oneof(quantity, fc.constant('30..50 min'), fc.constant('50..30 min')),
  'sign-off': oddText,
  note: oddText,
  waive: fc.array(fc.record({ rule: fc.constantFrom('vague-term', 'no-such-rule', 'yaml-syntax'), reason: oddText }, { requiredKeys: ['rule'] }), { maxLength: 1 }),
  call: fc.oneof(fc.constantFrom('U2-K210-INERT-001', 'U2-NOPE-001', 'bad id'), fc.record({ procedure: fc.constantFrom('U2-K210-INERT-001', 'X'), revision: fc.integer({ min: -1, max: 9 }) })),
}, { requiredKeys: [] });

/** Sequences of steps, parallel blocks and choose blocks, nested a few levels. */
export const sequence: fc.Arbitrary<unknown[]> = fc.letrec<{ seq: unknown[]; item: unknown }>((tie) => ({
  seq: fc.array(tie('item'), { maxLength: 5 }),
  item: fc.oneof(
    { depthSize: 'small', withCrossShrink: true },
    { weight: 5, arbitrary: step },
    { weight: 1, arbitrary: fc.dictionary(fc.constantFrom('left', 'right', 'Bad Branch', 'c'), tie('seq'), { maxKeys: 3 }).map((p) => ({ parallel: p })) },
    {
      weight: 1,
      arbitrary: fc.array(fc.record({
        when: condition, otherwise: fc.constantFrom(true, false, 'yes'), steps: tie('seq'), goto: stepId,
        repeat: fc.record({ expected: number, max: number }),
      }, { requiredKeys: [] }), { maxLength: 3 }).map((c) => ({ choose: c })),
    },
    { weight: 1, arbitrary: fc.oneof(oddText, number, fc.constant(null)) },
  ),
})).seq;

const date = fc.oneof(fc.constantFrom('2026-01-10', '2026-12-01', '2027-06-30', '2025-02-29', 'yesterday'), fc.date({ noInvalidDate: true }).map((d) => d.toISOString().slice(0, 10)));

export const frontMatter = fc.record({
  id: fc.oneof(fc.constantFrom('U2-K210-BATCH-001', 'U2-K210-INERT-001', 'lower-case', ''), oddText),
  title: oddText,
  kind: fc.constantFrom('normal', 'batch', 'startup', 'startup-after-turnaround', 'shutdown', 'emergency-shutdown', 'emergency', 'temporary', 'other'),
  revision: fc.oneof(fc.integer({ min: -2, max: 20 }), oddText),
  status: fc.constantFrom('draft', 'in-review', 'approved', 'effective', 'superseded', 'retired', 'lost'),
  effective: date,
  'review-by': date,
  owner: oddText,
  author: oddText,
  change: oddText,
  approvals: fc.array(fc.record({ role: oddText, name: fc.constantFrom('A. Berg', 'C. Dunmore', ''), date, meaning: oddText }, { requiredKeys: [] }), { maxLength: 3 }),
  equipment: fc.array(oddText, { maxLength: 3 }),
  ppe: fc.array(oddText, { maxLength: 3 }),
  signals: fc.dictionary(fc.constantFrom(...signalNames), fc.record({
    text: oddText, unit: fc.constantFrom(...units), range: fc.tuple(number, number), values: fc.array(fc.oneof(oddText, fc.boolean(), number), { maxLength: 3 }),
  }, { requiredKeys: [] }), { maxKeys: 6 }),
  limits: fc.dictionary(fc.constantFrom(...signalNames), fc.record({ low: quantity, high: quantity, consequence: oddText, correction: oddText }, { requiredKeys: [] }), { maxKeys: 3 }),
  interlocks: fc.array(fc.record({ tag: oddText, 'trips-when': condition, action: oddText }, { requiredKeys: [] }), { maxLength: 2 }),
  hazards: fc.array(fc.record({
    level: fc.constantFrom('danger', 'warning', 'caution', 'notice', 'DANGER', 'meh'), hazard: oddText, consequence: oddText, avoid: oddText, at: fc.array(stepId, { maxLength: 2 }),
  }, { requiredKeys: [] }), { maxLength: 3 }),
  'conditions-requiring': fc.oneof(oddText, fc.array(oddText, { maxLength: 2 })),
  responsible: oddText,
  steps: sequence,
  [`unknown-${'k'}`]: oddText,
}, { requiredKeys: ['id', 'steps'] });

const bodyFragment = fc.oneof(
  oddText,
  fc.constantFrom('## Purpose', '## Scope', '- item', '  - nested', '1. first', '> quote', '```', '| a | b |\n|---|---|\n| 1 | 2 |',
    '[link](https://example.invalid)', '![img](x.png)', '<div onclick="x()">', '$$ x $$', '[^1]: note', '***', '<!-- expect: x -->'),
);
const body = fc.array(bodyFragment, { maxLength: 12 }).map((lines) => lines.join('\n'));

/** Whole files written from a generated front-matter object, in block or flow style, with a markdown body. */
export const grammarFile = fc.tuple(frontMatter, fc.boolean(), body).map(([data, flow, text]) => {
  let yaml: string;
  try {
    yaml = stringify(data, { collectionStyle: flow ? 'flow' : 'any', lineWidth: 0 });
  } catch {
    yaml = 'id: X\n';
  }
  return `---\n${yaml}---\n${text}\n`;
});

export type Mutation =
  | { kind: 'delete'; at: number; length: number }
  | { kind: 'insert'; at: number; text: string }
  | { kind: 'duplicate'; at: number; length: number; to: number }
  | { kind: 'indent'; line: number; by: number }
  | { kind: 'swap-lines'; a: number; b: number }
  | { kind: 'truncate'; at: number };

const position = fc.double({ min: 0, max: 1, noNaN: true });
export const mutation: fc.Arbitrary<Mutation> = fc.oneof(
  fc.record({ kind: fc.constant('delete' as const), at: position, length: fc.integer({ min: 1, max: 40 }) }),
  fc.record({ kind: fc.constant('insert' as const), at: position, text: oddText }),
  fc.record({ kind: fc.constant('duplicate' as const), at: position, length: fc.integer({ min: 1, max: 200 }), to: position }),
  fc.record({ kind: fc.constant('indent' as const), line: position, by: fc.integer({ min: -4, max: 4 }) }),
  fc.record({ kind: fc.constant('swap-lines' as const), a: position, b: position }),
  fc.record({ kind: fc.constant('truncate' as const), at: position }),
);

/** Applies mutations in order; positions are fractions of the current text so any mutation fits any file. */
export function mutate(text: string, mutations: Mutation[]): string {
  let t = text;
  for (const m of mutations) {
    const at = (f: number) => Math.floor(f * t.length);
    switch (m.kind) {
      case 'delete': t = t.slice(0, at(m.at)) + t.slice(at(m.at) + m.length); break;
      case 'insert': t = t.slice(0, at(m.at)) + m.text + t.slice(at(m.at)); break;
      case 'duplicate': {
        const piece = t.slice(at(m.at), at(m.at) + m.length);
        t = t.slice(0, at(m.to)) + piece + t.slice(at(m.to));
        break;
      }
      case 'truncate': t = t.slice(0, at(m.at)); break;
      case 'indent': case 'swap-lines': {
        const lines = t.split('\n');
        const pick = (f: number) => Math.min(lines.length - 1, Math.floor(f * lines.length));
        if (m.kind === 'indent') {
          const i = pick(m.line);
          lines[i] = m.by >= 0 ? ' '.repeat(m.by) + lines[i] : lines[i].replace(new RegExp(`^ {0,${-m.by}}`), '');
        } else {
          const [a, b] = [pick(m.a), pick(m.b)];
          [lines[a], lines[b]] = [lines[b], lines[a]];
        }
        t = lines.join('\n');
        break;
      }
    }
  }
  return t;
}
