// Generates a corpus of hostile procedure folders: each case is a file (or a few) that once crashed, hung,
// exhausted memory or passed in silence, with the rule the check must now report for it. Run it alone to
// write the corpus somewhere for a look: `node tests/robustness/attack-corpus.ts <folder>`.
import { execFileSync } from 'node:child_process';
import { mkdirSync, readFileSync, symlinkSync, writeFileSync } from 'node:fs';
import { join } from 'node:path';

export interface AttackCase {
  /** Folder of the case inside the corpus, and what it attacks. */
  name: string;
  what: string;
  /** Rules that must be reported for a file of this case (any one of them per listed file). */
  expect: Array<{ file: string; rule: string }>;
}

const base = readFileSync(join(import.meta.dirname, '../fixtures/rules/front-matter-not-mapping/valid-base.md'), 'utf8');
/** The base procedure with a new id, so that cases never clash. */
const proc = (id: string, edit: (text: string) => string = (t) => t) => edit(base.replace('id: FX-K210-001', `id: ${id}`));

export function writeAttackCorpus(root: string): AttackCase[] {
  const cases: AttackCase[] = [];
  const add = (name: string, what: string, files: Record<string, string | Buffer>, expect: Array<[string, string]>, extra?: (dir: string) => void) => {
    const dir = join(root, name);
    mkdirSync(dir, { recursive: true });
    for (const [file, text] of Object.entries(files)) {
      mkdirSync(join(dir, file, '..'), { recursive: true });
      writeFileSync(join(dir, file), text);
    }
    extra?.(dir);
    cases.push({ name, what, expect: expect.map(([file, rule]) => ({ file, rule })) });
  };
  const secondSignal = (name: string) => (t: string) => t
    .replace('  TI-210: { text: Kettle temperature, unit: degC, range: [0, 300] }\n', `  TI-210: { text: Kettle temperature, unit: degC, range: [0, 300] }\n  "${name}": { text: Kettle temperature, unit: degC, range: [0, 300] }\n`)
    .replace('    set: { TI-210: 180 degC }', `    set: { "${name}": 260 degC }`);

  add('cyrillic-signal', 'a signal name with a Cyrillic letter, used for a setpoint at the trip', { 'p.md': proc('AT-001', secondSignal('T\u0406-210')) }, [['p.md', 'name-format']]);
  add('zero-width-signal', 'a signal name followed by a zero-width space', { 'p.md': proc('AT-002', secondSignal('TI-210\u200B')) }, [['p.md', 'name-format']]);
  add('bidi-text', 'a right-to-left override inside a step', { 'p.md': proc('AT-003', (t) => t.replace('Draw a sample', 'Draw a \u202Esample')) }, [['p.md', 'hidden-character']]);
  add('prototype-name', "a setpoint on 'valueOf'", { 'p.md': proc('AT-004', (t) => t.replace('set: { TI-210: 180 degC }', 'set: { valueOf: 180 degC }')) }, [['p.md', 'undeclared-name']]);
  add('extra-fence', "one extra '---' line at the top", { 'p.md': `---\n${proc('AT-005')}` }, [['p.md', 'front-matter-not-mapping']]);
  add('empty-front-matter', 'empty, list and scalar front-matter', { 'empty.md': '---\n---\n# Notes\n', 'list.md': '---\n- id: AT-006\n---\n', 'scalar.md': '---\nAT-006\n---\n' },
    [['empty.md', 'front-matter-not-mapping'], ['list.md', 'front-matter-not-mapping'], ['scalar.md', 'front-matter-not-mapping']]);
  add('huge-duration', "'expect: 1e9 h' and '1e309 h'", { 'a.md': proc('AT-007', (t) => t.replace('    until: TI-210 >= 180 degC', '    until: TI-210 >= 180 degC\n    expect: 1e9 h')), 'b.md': proc('AT-008', (t) => t.replace('    until: TI-210 >= 180 degC', '    until: TI-210 >= 180 degC\n    expect: 1e309 h')) },
    [['a.md', 'expect-invalid'], ['b.md', 'expect-invalid']]);
  add('nested-brackets', '2,000 nested brackets in a condition', { 'p.md': proc('AT-009', (t) => t.replace('until: TI-210 >= 180 degC', `until: ${'('.repeat(2000)}TI-210 >= 180 degC${')'.repeat(2000)}`)) }, [['p.md', 'condition-syntax']]);
  add('deep-yaml', '5,000 levels of flow collections in the front-matter', { 'p.md': proc('AT-010', (t) => t.replace('ppe: [Face shield, Heat-resistant gloves]', `ppe: ${'['.repeat(5000)}${']'.repeat(5000)}`)) }, [['p.md', 'yaml-syntax']]);
  add('alias-bomb', 'YAML aliases that expand to billions of copies', { 'p.md': proc('AT-011', (t) => t.replace('owner: Unit 2 process engineering', `owner: Unit 2\nx0: &a0 [lol, lol, lol, lol, lol, lol, lol, lol, lol]\n${Array.from({ length: 9 }, (_, i) => `x${i + 1}: &a${i + 1} [${Array(9).fill(`*a${i}`).join(', ')}]`).join('\n')}`)) }, [['p.md', 'yaml-syntax']]);
  const chain = (levels: number) => Object.fromEntries(Array.from({ length: levels }, (_, i) => {
    const id = `AT-CH-${String(i).padStart(3, '0')}`;
    const next = `AT-CH-${String(i + 1).padStart(3, '0')}`;
    const steps = i === levels - 1 ? '  - step: check\n    do: Check that XV-1 is closed\n    confirm: XV-1 shows closed\n'
      : `  - step: first\n    do: Run the shared operation\n    call: ${next}\n  - step: second\n    do: Run the shared operation\n    call: ${next}\n`;
    return [`c${i}.md`, `---\nid: ${id}\ntitle: Chain level ${i}\nkind: normal\nrevision: 0\nstatus: draft\nsteps:\n${steps}---\n`];
  }));
  add('doubling-calls', '25 levels of procedures that each call the next twice', chain(25), [['c0.md', 'call-expansion-problem']]);
  add('link-references', '50,000 markdown link reference definitions', { 'p.md': `${proc('AT-012')}\n${Array.from({ length: 50000 }, (_, i) => `[r${i}]: a`).join('\n')}\n` }, [['p.md', 'body-too-large']]);
  add('huge-narrative', 'a narrative over 1 MB', { 'p.md': `${proc('AT-013')}\n${'Keep the drain closed. '.repeat(60000)}\n` }, [['p.md', 'unreadable-file']]);
  add('many-combinations', 'four yes/no signals, 15 of the 16 combinations covered', {
    'p.md': (() => {
      const names = ['sa', 'sb', 'sc', 'sd'];
      const combos = Array.from({ length: 16 }, (_, n) => names.map((s, i) => `${s} == ${(n >> i) & 1 ? 'on' : 'off'}`).join(' and ')).filter((_, n) => n !== 9);
      return `---\nid: AT-014\ntitle: Decision\nkind: normal\nrevision: 0\nstatus: draft\nsignals:\n${names.map((s) => `  ${s}: { text: Switch ${s}, values: [on, off] }\n`).join('')}steps:\n  - { step: a, do: Read the switches, confirm: Read }\n  - choose:\n${combos.map((w, i) => `      - when: ${w}\n        steps:\n          - { step: b${i}, do: Open XV-${i}, confirm: Open }\n`).join('')}---\n`;
    })(),
  }, [['p.md', 'uncovered-values']]);
  add('reserved-tag', "an equipment tag 'index.html'", { 'p.md': proc('AT-015', (t) => t.replace('equipment: [K-210, XV-2101]', 'equipment: [K-210, index.html]')) }, [['p.md', 'name-format']]);
  add('long-id', 'a 300-character procedure id', { 'p.md': proc(`AT-${'X'.repeat(297)}`) }, [['p.md', 'name-format']]);
  add('special-files', 'link loops, a FIFO, a link to /dev/zero, a dangling link and a second name of a file', { 'real.md': proc('AT-016') }, [
    ['x', 'unreadable-file'], ['y', 'unreadable-file'], ['loop.md', 'unreadable-file'], ['pipe.md', 'unreadable-file'], ['zero.md', 'unreadable-file'], ['alias.md', 'unreadable-file'], ['gone.md', 'unreadable-file'],
  ], (dir) => {
    symlinkSync('.', join(dir, 'x'));
    symlinkSync('.', join(dir, 'y'));
    symlinkSync('loop.md', join(dir, 'loop.md'));
    symlinkSync('/dev/zero', join(dir, 'zero.md'));
    symlinkSync('real.md', join(dir, 'alias.md'));
    symlinkSync('nothing-here.md', join(dir, 'gone.md'));
    execFileSync('mkfifo', [join(dir, 'pipe.md')]);
  });
  add('not-utf8', 'bytes that are not UTF-8', { 'p.md': Buffer.from([0x2d, 0x2d, 0x2d, 0x0a, 0xff, 0xfe, 0x0a]) }, [['p.md', 'unreadable-file']]);
  return cases;
}

if (process.argv[1] && import.meta.filename === process.argv[1]) {
  const out = process.argv[2];
  if (!out) {
    process.stderr.write('Usage: node tests/robustness/attack-corpus.ts <folder>\n');
    process.exit(2);
  }
  for (const c of writeAttackCorpus(out)) process.stdout.write(`${c.name}: ${c.what}\n`);
}
