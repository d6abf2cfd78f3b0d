// `stepwright export`: JSON of the model and mermaid flowcharts that mermaid's own parser accepts.
import { mkdirSync, writeFileSync } from 'node:fs';
import { join } from 'node:path';
import { beforeAll, describe, expect, it } from 'vitest';
import { main } from '../../src/cli/main.ts';
import type { CliIo } from '../../src/cli/io.ts';
import { findProcedureFiles } from '../../src/cli/read-procedure-files.ts';
import { readProcedure } from '../../src/read/read-procedure.ts';
import { readFileSync } from 'node:fs';
import { tempFolder } from '../temp-folder.ts';
// jsdom ships no type declarations; type the one constructor used here.
const { JSDOM } = (await import('jsdom' as string)) as { JSDOM: new (html: string, options?: { contentType?: string }) => { window: Window & typeof globalThis } };


const root = join(import.meta.dirname, '..', '..');
type Mermaid = { parse(text: string): Promise<unknown> };
let mermaid: Mermaid;

beforeAll(async () => {
  // Mermaid's parser needs a DOM; jsdom provides one in Node (see docs/toolchain notes).
  (globalThis as { window?: unknown }).window = new JSDOM('').window;
  mermaid = (await import('mermaid')).default as unknown as Mermaid;
});

async function run(argv: string[], cwd = root) {
  const out: string[] = [];
  const err: string[] = [];
  const io: CliIo = { stdout: { write: (t: string) => out.push(t) }, stderr: { write: (t: string) => err.push(t) }, cwd, env: { STEPWRIGHT_TODAY: '2026-12-01' } };
  const code = await main(argv, io);
  return { code, out: out.join(''), err: err.join('') };
}

const demoIds = findProcedureFiles([join(root, 'procedures')], root)
  .map((f) => readProcedure(f.file, readFileSync(f.absolute, 'utf8')).procedure?.id)
  .filter((id): id is string => Boolean(id));

function manual(files: Record<string, string>): string {
  const dir = tempFolder('sw-export-');
  mkdirSync(join(dir, 'procedures'));
  for (const [name, text] of Object.entries(files)) writeFileSync(join(dir, 'procedures', name), text);
  return dir;
}
const doc = (id: string, steps: string) => `---\nid: ${id}\ntitle: Export case ${id}\nkind: normal\nrevision: 1\nstatus: draft\nsteps:\n${steps}\n---\n\n## Purpose\n\nShows export.\n`;

describe('stepwright export', () => {
  it('finds the demo manual, and the parser rejects broken mermaid', async () => {
    expect(demoIds.length).toBeGreaterThan(0);
    await expect(mermaid.parse('flowchart TD\n  a["open --> b')).rejects.toThrow();
  });

  it.each(demoIds)('exports %s as a mermaid flowchart that mermaid parses', async (id) => {
    const { code, out } = await run(['export', id, '--format', 'mermaid', '--force']);
    expect(code).toBe(0);
    expect(out.startsWith('flowchart')).toBe(true);
    await expect(mermaid.parse(out)).resolves.toBeTruthy();
  });

  it('exports the model as JSON with the step tree, the body and the cycle time', async () => {
    const dir = manual({ 'a.md': doc('U2-EX-001', '  - { step: open, do: Open XV-1, confirm: Open, expect: 10 min }\n  - { step: close, do: Close XV-1, confirm: Closed, expect: 5..15 min }') });
    const { code, out } = await run(['export', 'U2-EX-001'], dir);
    expect(code).toBe(0);
    const json = JSON.parse(out);
    expect(json.format).toBe('stepwright-procedure');
    expect(json.steps.map((s: { id: string }) => s.id)).toEqual(['open', 'close']);
    expect(json.steps[1].confirm).toEqual({ value: 'Closed', path: ['steps', 1, 'confirm'] });
    expect(json.body).toContain('## Purpose');
    expect(json.cycleTime.seconds).toEqual({ shortest: 900, typical: 1200, longest: 1500 });
    expect(json.data).toBeUndefined();
  });

  it('expands calls with --inline, in JSON and in mermaid', async () => {
    const dir = manual({
      'caller.md': doc('U2-EX-010', '  - { step: prep, do: Check the line, confirm: Checked }\n  - { step: inert, do: Inert the line, call: U2-EX-011 }'),
      'callee.md': doc('U2-EX-011', '  - { step: purge, do: Purge with nitrogen, confirm: Purged }\n  - { step: vent, do: Vent, confirm: Vented }'),
    });
    const json = JSON.parse((await run(['export', 'U2-EX-010', '--inline'], dir)).out);
    expect(json.steps.map((s: { id: string }) => s.id)).toEqual(['prep', 'inert/purge', 'inert/vent']);
    const { out } = await run(['export', 'U2-EX-010', '--inline', '--format', 'mermaid'], dir);
    expect(out).toContain('inert/purge');
    await expect(mermaid.parse(out)).resolves.toBeTruthy();
  });

  it('refuses a procedure with check errors unless forced, and names an unknown id', async () => {
    const dir = manual({ 'bad.md': doc('U2-EX-020', '  - { step: open, do: Open XV-1 }') });
    const refused = await run(['export', 'U2-EX-020'], dir);
    expect(refused.code).toBe(1);
    expect(refused.out).toBe('');
    expect(refused.err).toContain('step-without-transition');
    expect((await run(['export', 'U2-EX-020', '--force'], dir)).code).toBe(0);
    const unknown = await run(['export', 'U2-EX-021'], dir);
    expect([unknown.code, unknown.err]).toEqual([1, expect.stringContaining("Did you mean 'U2-EX-020'?")]);
    expect((await run(['export', 'U2-EX-020', '--format', 'pdf'], dir)).code).toBe(2);
  });
});
