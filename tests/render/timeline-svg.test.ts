// The timeline chart: one row per bar, bars placed by their start and typical duration, text escaped.
import { readFileSync } from 'node:fs';
import { join } from 'node:path';
import { describe, expect, it } from 'vitest';
import { estimateCycleTime } from '../../src/analysis/cycle-time.ts';
import { readProcedure } from '../../src/read/read-procedure.ts';
import { renderTimelineSvg } from '../../src/render/timeline-svg.ts';
// jsdom ships no type declarations; type the one constructor used here.
const { JSDOM } = (await import('jsdom' as string)) as { JSDOM: new (html: string, options?: { contentType?: string }) => { window: Window & typeof globalThis } };


function svgOf(steps: string) {
  const text = `---\nid: U2-TL-001\ntitle: Timeline case\nkind: normal\nrevision: 0\nstatus: draft\nsteps:\n${steps}\n---\n`;
  const cycle = estimateCycleTime(readProcedure('case.md', text).procedure!);
  const svg = renderTimelineSvg(cycle, { title: 'Timeline <case>' });
  return { cycle, svg, doc: new JSDOM(svg, { contentType: 'image/svg+xml' }).window.document };
}

describe('renderTimelineSvg', () => {
  it('draws one bar per step, in time order, with widths in proportion to the typical durations', () => {
    const { doc } = svgOf(`
  - { step: a, do: Open XV-1, confirm: Open, expect: 10 min }
  - { step: b, do: Heat K-1 <fast>, confirm: Hot, expect: 20..40 min }
  - { step: c, do: Close XV-1, confirm: Closed, expect: 10 min }`);
    expect(doc.documentElement.getAttribute('aria-label')).toBe('Timeline <case>');
    const rects = [...doc.querySelectorAll('rect')].filter((r) => r.querySelector('title'));
    expect(rects).toHaveLength(3);
    const [a, b, c] = rects.map((r) => ({ x: Number(r.getAttribute('x')), w: Number(r.getAttribute('width')) }));
    expect(b.x).toBeCloseTo(a.x + a.w, 0);
    expect(c.x).toBeCloseTo(b.x + b.w, 0);
    expect(b.w / a.w).toBeCloseTo(3, 1);
    expect(doc.querySelector('a')!.getAttribute('href')).toBe('#step-a');
    expect([...doc.querySelectorAll('text')].some((t) => t.textContent!.includes('Heat K-1 <fast>'))).toBe(true);
  });

  it('places parallel branches side by side in time and draws loop repeats as their own bar', () => {
    const { svg, doc } = svgOf(`
  - parallel:
      x: [ { step: x1, do: Charge A, confirm: Done, expect: 10 min } ]
      y: [ { step: y1, do: Charge B, confirm: Done, expect: 30 min } ]
  - { step: read, do: Read AI-1, confirm: Read, expect: 5 min }
  - choose:
      - when: done
      - otherwise: true
        goto: read
        repeat: { expected: 2, max: 4 }`);
    const rects = [...doc.querySelectorAll('rect')].filter((r) => r.querySelector('title'));
    expect(rects).toHaveLength(4);
    expect(rects[0].getAttribute('x')).toBe(rects[1].getAttribute('x'));
    expect(rects[3].getAttribute('stroke-dasharray')).toBe('3 2');
    expect(rects[3].querySelector('title')!.textContent).toContain('typical 10 min, at most 20 min');
    expect(svg).not.toContain('NaN');
  });

  it('draws the demo batch procedure without NaN or overflow', () => {
    const file = join(import.meta.dirname, '..', '..', 'procedures', 'k-210-resin', 'u2-k210-batch-001.md');
    const { procedure } = readProcedure(file, readFileSync(file, 'utf8'));
    const svg = renderTimelineSvg(estimateCycleTime(procedure!), { title: 'batch' });
    const doc = new JSDOM(svg, { contentType: 'image/svg+xml' }).window.document;
    const width = Number(doc.documentElement.getAttribute('width'));
    for (const r of doc.querySelectorAll('rect')) expect(Number(r.getAttribute('x')) + Number(r.getAttribute('width'))).toBeLessThanOrEqual(width);
    expect(svg).not.toContain('NaN');
  });
});
