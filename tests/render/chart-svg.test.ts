import { readdirSync, readFileSync } from 'node:fs';
import { join } from 'node:path';
import fc from 'fast-check';
import { describe, expect, it } from 'vitest';
import { readProcedure } from '../../src/read/read-procedure.ts';
import { compileStepGraph, type StepGraph } from '../../src/analysis/step-graph.ts';
import { walkSteps } from '../../src/model/walk-steps.ts';
import type { Procedure } from '../../src/model/procedure.ts';
import { layoutChart, type Rect, type Shape } from '../../src/render/chart-layout.ts';
import { renderChartSvg } from '../../src/render/chart-svg.ts';
import { buildStepTable } from '../../src/render/step-table.ts';
import { readTestProcedure } from './procedure-text.ts';

/** Transitions the chart must draw as bars: each step's end, each decision branch, and a join that leads to a step. */
function drawnTransitions(graph: StepGraph): number {
  const stepPlaces = new Set(graph.places.filter((p) => p.kind === 'step').map((p) => p.id));
  return graph.transitions.filter((t) => t.fromStep !== undefined || t.guard.length > 0 || (t.kind === 'join' && t.to.every((to) => stepPlaces.has(to)))).length;
}

function rectsOf(shapes: Shape[]): Array<{ what: string; rect: Rect }> {
  const out: Array<{ what: string; rect: Rect }> = [];
  for (const s of shapes) {
    if (s.type === 'step') out.push({ what: `step ${s.id}`, rect: s.rect });
    if (s.type === 'end') out.push({ what: 'end', rect: s.rect });
    if (s.type === 'bar') {
      out.push({ what: `bar ${s.from ?? ''}`, rect: { x: s.x - 16, y: s.y - 2, w: 32, h: 4 } });
      out.push({ what: `label ${s.label.join(' ')}`, rect: s.labelRect });
    }
    if (s.type === 'jump') out.push({ what: `jump ${s.label}`, rect: s.labelRect });
    if (s.type === 'branch-label') out.push({ what: `branch ${s.text}`, rect: s.rect });
  }
  return out;
}

function overlapping(rects: Array<{ what: string; rect: Rect }>): string[] {
  const found: string[] = [];
  for (let i = 0; i < rects.length; i++) {
    for (let j = i + 1; j < rects.length; j++) {
      const a = rects[i].rect;
      const b = rects[j].rect;
      if (a.x < b.x + b.w && b.x < a.x + a.w && a.y < b.y + b.h && b.y < a.y + a.h) found.push(`${rects[i].what} × ${rects[j].what}`);
    }
  }
  return found;
}

function expectSoundChart(procedure: Procedure): void {
  const layout = layoutChart(procedure);
  const steps = walkSteps(procedure.steps).map((s) => s.step.id);
  const nodes = layout.shapes.filter((s) => s.type === 'step').map((s) => (s as { id: string }).id);
  expect([...nodes].sort()).toEqual([...steps].sort());
  expect(layout.shapes.filter((s) => s.type === 'bar')).toHaveLength(drawnTransitions(compileStepGraph(procedure)));
  expect(overlapping(rectsOf(layout.shapes))).toEqual([]);
  for (const { rect } of rectsOf(layout.shapes)) {
    expect(rect.x).toBeGreaterThanOrEqual(0);
    expect(rect.y).toBeGreaterThanOrEqual(0);
    expect(rect.x + rect.w).toBeLessThanOrEqual(layout.width);
    expect(rect.y + rect.h).toBeLessThanOrEqual(layout.height);
  }
}

const demoDir = join(process.cwd(), 'procedures');
const demoFiles = readdirSync(demoDir, { recursive: true, encoding: 'utf8' }).filter((f) => f.endsWith('.md')).sort();

describe('sequence chart of the demo manual', () => {
  it.each(demoFiles)('%s: one node per step, one bar per transition, nothing overlaps', (file) => {
    const path = join(demoDir, file);
    const { procedure } = readProcedure(path, readFileSync(path, 'utf8'));
    expectSoundChart(procedure!);
  });
});

const s = (step: string, extra: Record<string, unknown> = {}) => ({ step, do: `Do ${step}`, until: 'done', ...extra });

describe('sequence chart layout', () => {
  const procedure = readTestProcedure({
    hazards: [
      { level: 'warning', hazard: 'Hot', at: ['b'] },
      { level: 'danger', hazard: 'Very hot', at: ['b'] },
    ],
    steps: [
      s('a'),
      { parallel: { left: [s('l1'), s('l2')], right: [s('r1')] } },
      s('b', { 'sign-off': 'Shift supervisor' }),
      { step: 'wait', do: 'Wait for the lab' },
      { choose: [{ when: 'done', steps: [s('ok')] }, { otherwise: true, goto: 'b' }] },
      s('c', { confirm: 'Valve is closed' }),
    ],
  });

  it('draws branches side by side: parallel branches share a row, the double lines open and close them', () => {
    const layout = layoutChart(procedure);
    const step = (id: string) => layout.shapes.find((x) => x.type === 'step' && x.id === id) as Extract<Shape, { type: 'step' }>;
    expect(step('l1').rect.y).toBe(step('r1').rect.y);
    expect(step('r1').rect.x).toBeGreaterThan(step('l1').rect.x + step('l1').rect.w);
    expect(layout.shapes.filter((x) => x.type === 'double')).toHaveLength(2);
    expect(layout.shapes.filter((x) => x.type === 'single')).toHaveLength(2);
  });

  it('marks the initial step, hazard steps with the worst signal word, and sign-off steps, in text', () => {
    const layout = layoutChart(procedure);
    const step = (id: string) => layout.shapes.find((x) => x.type === 'step' && x.id === id) as Extract<Shape, { type: 'step' }>;
    expect(step('a').initial).toBe(true);
    expect(step('b').initial).toBe(false);
    expect(step('b').markers).toContain('⚠ DANGER');
    expect(step('b').markers.join(' ')).toContain('SIGN-OFF: Shift supervisor');
  });

  it('ends a jump in a labelled marker naming the target step number', () => {
    const layout = layoutChart(procedure);
    const jump = layout.shapes.find((x) => x.type === 'jump') as Extract<Shape, { type: 'jump' }>;
    expect(jump.target).toBe('b');
    expect(jump.label).toBe('go to 3 b');
  });

  it('links every step box to its table row and draws one bar per transition in the SVG', () => {
    const svg = renderChartSvg(procedure, { title: 'Chart' });
    const links = [...svg.matchAll(/<a class="sfc-step" href="#step-([a-z0-9-]+)"/g)].map((m) => m[1]);
    expect(links.sort()).toEqual(['a', 'b', 'c', 'l1', 'l2', 'ok', 'r1', 'wait']);
    expect(svg.match(/class="sfc-bar"/g)).toHaveLength(drawnTransitions(compileStepGraph(procedure)));
    expect(svg).not.toContain('<script');
  });

  it('is deterministic: the same procedure gives the same bytes', () => {
    expect(renderChartSvg(procedure, { title: 'Chart' })).toBe(renderChartSvg(readTestProcedure({ ...procedureFront() }), { title: 'Chart' }));
  });

  it('escapes text from the procedure', () => {
    const tricky = readTestProcedure({ steps: [s('x', { do: 'Open <script>alert(1)</script> & "close"' })] });
    const svg = renderChartSvg(tricky, { title: 'a "title" <b>' });
    expect(svg).not.toContain('<script>');
    expect(svg).toContain('&lt;script&gt;');
    expect(svg).toContain('aria-label="a &quot;title&quot; &lt;b&gt;"');
  });

  function procedureFront() {
    return {
      hazards: [
        { level: 'warning', hazard: 'Hot', at: ['b'] },
        { level: 'danger', hazard: 'Very hot', at: ['b'] },
      ],
      steps: [
        s('a'),
        { parallel: { left: [s('l1'), s('l2')], right: [s('r1')] } },
        s('b', { 'sign-off': 'Shift supervisor' }),
        { step: 'wait', do: 'Wait for the lab' },
        { choose: [{ when: 'done', steps: [s('ok')] }, { otherwise: true, goto: 'b' }] },
        s('c', { confirm: 'Valve is closed' }),
      ],
    };
  }
});

// Random well-formed sequences: steps, parallel blocks and decisions (branches of plain steps, some jumping back).
type Item = Record<string, unknown>;
function sequenceArbitrary() {
  const word = fc.constantFrom('Open the valve', 'Start pump P-101 on the recirculation line', 'Check', 'Record the reading on the batch sheet and tell the supervisor', 'Heat');
  const cond = fc.constantFrom('done', 'elapsed >= 5 min', 'confirm', 'TI-210 >= 205 degC and PI-210 <= 250 kPa');
  const step = fc.record({ do: word, c: cond });
  const tree = fc.letrec((tie) => ({
    seq: fc.array(tie('item'), { minLength: 1, maxLength: 4 }),
    item: fc.oneof({ depthSize: 'small', withCrossShrink: true }, { arbitrary: step, weight: 4 }, { arbitrary: fc.record({ par: fc.array(tie('seq'), { minLength: 2, maxLength: 3 }) }), weight: 1 }, { arbitrary: fc.record({ choose: fc.array(fc.record({ steps: fc.array(step, { maxLength: 2 }), back: fc.boolean() }), { minLength: 2, maxLength: 3 }) }), weight: 1 }),
  }));
  return tree.seq;
}

function toSteps(seq: unknown[], counter: { n: number }): Item[] {
  const out: Item[] = [];
  const made: string[] = [];
  for (const raw of seq) {
    const item = raw as { do?: string; c?: string; par?: unknown[][]; choose?: Array<{ steps: Array<{ do: string; c: string }>; back: boolean }> };
    const prev = out[out.length - 1];
    if (item.choose) {
      // A decision follows a step here (never another decision, never first), so its branches are that step's transitions.
      if (!prev || !('step' in prev)) {
        const id = `s${counter.n++}`;
        out.push({ step: id, do: 'Wait' });
        made.push(id);
      } else delete (out[out.length - 1] as Item).until;
      const target = made[0];
      out.push({
        choose: item.choose.map((b, i) => {
          const steps = b.steps.map((x) => {
            const id = `s${counter.n++}`;
            return x.c === 'confirm' ? { step: id, do: x.do, confirm: 'It is done' } : { step: id, do: x.do, until: x.c };
          });
          const branch: Item = i === item.choose!.length - 1 ? { otherwise: true } : { when: `elapsed >= ${i + 1} min` };
          if (steps.length) branch.steps = steps;
          if (b.back && target) branch.goto = target;
          return branch;
        }),
      });
    } else if (item.par) {
      const branches: Record<string, Item[]> = {};
      item.par.forEach((b, i) => (branches[`branch-${i}`] = toSteps(b, counter)));
      out.push({ parallel: branches });
    } else {
      const id = `s${counter.n++}`;
      made.push(id);
      out.push(item.c === 'confirm' ? { step: id, do: item.do, confirm: 'It is done' } : { step: id, do: item.do, until: item.c });
    }
  }
  return out;
}

describe('sequence chart on random sequences', () => {
  it('keeps one node per step, one bar per transition, no overlaps', () => {
    fc.assert(
      fc.property(sequenceArbitrary(), (seq) => {
        const procedure = readTestProcedure({ steps: toSteps(seq as unknown[], { n: 1 }) });
        expectSoundChart(procedure);
      }),
      { numRuns: 150 },
    );
  });
});

describe('hazard marks in the chart', () => {
  it('never puts the safety alert triangle on a NOTICE step', async () => {
    // Source: ANSI Z535.4 — NOTICE addresses property damage and is used without the safety alert symbol (common practice)
    const file = join(import.meta.dirname, '../../procedures/k-210-resin/u2-k210-batch-001.md');
    const procedure = readProcedure(file, readFileSync(file, 'utf8')).procedure!;
    const svg = renderChartSvg(procedure, { title: 'Chart' });
    expect(svg).toContain('■ NOTICE');
    expect(svg).not.toContain('▲');
    // WARNING steps draw the safety alert symbol (a triangle with an exclamation mark) before the word.
    expect(svg).toMatch(/<g class="sfc-alert" data-level="warning"><svg class="alert-symbol"[^>]*>.*?<circle[^>]*\/><\/svg><\/g><text[^>]*>WARNING<\/text>/);
    expect(svg).not.toMatch(/data-level="notice"/);
  });

  it('numbers every decision and parallel branch in the chart as the step table does', () => {
    const file = join(import.meta.dirname, '../../procedures/k-210-resin/u2-k210-batch-001.md');
    const procedure = readProcedure(file, readFileSync(file, 'utf8')).procedure!;
    const svg = renderChartSvg(procedure, { title: 'Chart' });
    const branchLabels = [...svg.matchAll(/<text class="sfc-branch"[^>]*>([^<]*)<\/text>/g)].map((m) => m[1].split(' · ')[0]);
    const rows = buildStepTable(procedure);
    const blocks = rows.flatMap((r) => (r.kind === 'decision' || r.kind === 'parallel-start' ? [r.number] : []));
    // The batch has a parallel charge block and a decision on the lab result.
    expect(rows.some((r) => r.kind === 'decision')).toBe(true);
    expect(rows.some((r) => r.kind === 'parallel-start')).toBe(true);
    // A decision n has branches na and nb in the chart; a parallel block n has nA, nB …, as in the table.
    for (const n of blocks) expect(branchLabels.filter((l) => l.startsWith(n)).length).toBeGreaterThanOrEqual(2);
    for (const r of rows) if (r.kind === 'branch') expect(branchLabels).toContain(r.number);
    const stepNumbers = [...svg.matchAll(/<a class="sfc-step"[^>]*data-step="([^"]+)"><rect[^>]*\/>(?:<rect[^>]*\/>)*<text[^>]*>([^ <]+)  /g)].map((m) => [m[1], m[2]] as const);
    const tableNumbers = rows.flatMap((r) => (r.kind === 'step' ? [[r.id, r.number] as const] : []));
    expect(new Map(stepNumbers)).toEqual(new Map(tableNumbers));
  });
});

describe('chart: who does and who checks a step', () => {
  it('marks the performer and the verification in the step box, inside the box', () => {
    // Source: DOE-STD-1029 (performer and verification shown with the step); labels are our own.
    const p = readTestProcedure({
      steps: [
        { step: 'close', do: 'Close XV-1', until: 'done', performer: 'Board operator', verify: { kind: 'second-person', role: 'Shift supervisor' } },
        { step: 'open', do: 'Open XV-2', until: 'done' },
      ],
    });
    const layout = layoutChart(p);
    const close = layout.shapes.find((s): s is Extract<Shape, { type: 'step' }> => s.type === 'step' && s.id === 'close')!;
    const open = layout.shapes.find((s): s is Extract<Shape, { type: 'step' }> => s.type === 'step' && s.id === 'open')!;
    // Long markers wrap inside the box.
    expect(close.markers.join(' ')).toBe('BY: Board operator SECOND-PERSON SIGN-OFF: Shift supervisor');
    expect(open.markers).toEqual([]);
    expect(close.rect.h).toBeGreaterThan(open.rect.h);
    const svg = renderChartSvg(p, { title: 'x' });
    for (const m of close.markers) expect(svg).toContain(`>${m}</text>`);
  });
});
