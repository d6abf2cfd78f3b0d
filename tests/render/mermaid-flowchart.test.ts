// Mermaid flowcharts of procedures: every demo procedure's chart passes mermaid's own parser; marks and escapes hold.
import { readdirSync, readFileSync, statSync } from 'node:fs';
import { join } from 'node:path';
import { beforeAll, describe, expect, it } from 'vitest';
import { readProcedure } from '../../src/read/read-procedure.ts';
import { escapeLabel, mermaidFlowchart } from '../../src/render/mermaid-flowchart.ts';

let parse: (text: string) => Promise<unknown>;

beforeAll(async () => {
  // mermaid.parse runs in Node once a DOM window exists (see the toolchain notes).
  const { JSDOM } = (await import('jsdom' as string)) as { JSDOM: new (html: string) => { window: unknown } };
  (globalThis as { window?: unknown }).window ??= new JSDOM('').window;
  const mermaid = (await import('mermaid')).default;
  parse = (text) => mermaid.parse(text);
}, 120_000);

function procedureFiles(dir: string): string[] {
  return readdirSync(dir).flatMap((name) => {
    const full = join(dir, name);
    return statSync(full).isDirectory() ? procedureFiles(full) : name.endsWith('.md') ? [full] : [];
  });
}

const demo = procedureFiles(join(import.meta.dirname, '../../procedures'));

function read(file: string) {
  const p = readProcedure(file, readFileSync(file, 'utf8')).procedure;
  if (!p) throw new Error(`${file} did not read`);
  return p;
}

describe('mermaidFlowchart', () => {
  it.each(demo.map((f) => [f.slice(f.indexOf('procedures/'))]))('%s parses with mermaid', async (rel) => {
    const p = read(join(import.meta.dirname, '../..', rel));
    const text = mermaidFlowchart(p);
    await expect(parse(text)).resolves.toBeTruthy();
    // One box per step, plus start and end.
    const boxes = text.split('\n').filter((l) => /^ {2}s\d+\["/.test(l));
    expect(boxes).toHaveLength(countSteps(p.steps));
  });

  it('marks steps with a class and a word, and draws parallel blocks through fork bars', async () => {
    const batch = read(demo.find((f) => f.endsWith('u2-k210-batch-001.md'))!);
    const text = mermaidFlowchart(batch, { marks: new Map([['cook', 'changed'], ['heat-up', 'added']]) });
    expect(text).toMatch(/s\d+\["cook \[changed\]<br\/>/);
    expect(text).toMatch(/classDef changed /);
    expect(text).toMatch(/@\{ shape: fork/);
    // The loop back to cook (a goto) is drawn dashed.
    expect(text).toMatch(/-\.->\|"confirmed: [^"]*"\| s\d+/);
    await expect(parse(text)).resolves.toBeTruthy();
  });

  it('escapes what mermaid would read as syntax', async () => {
    expect(escapeLabel('a "b" <c> #d & e|f')).toBe('a #quot;b#quot; #60;c#62; #35;d #38; e#124;f');
    const p = read(demo[0]);
    const tricky = { ...p, steps: p.steps.map((s) => (s.kind === 'step' ? { ...s, actions: ['Open "XV-1" <fully> | check #2 & log `it`'] } : s)) };
    await expect(parse(mermaidFlowchart(tricky))).resolves.toBeTruthy();
  });
});

function countSteps(items: import('../../src/model/procedure.ts').SequenceItem[]): number {
  return items.reduce((n, item) => n + (item.kind === 'step' ? 1 : item.branches.reduce((m, b) => m + countSteps(b.items ?? []), 0)), 0);
}
