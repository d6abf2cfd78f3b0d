// The chart on paper: parts that each fit a page, cut at transitions, and drawn by reference to the screen chart's
// shapes on the same page instead of a second copy of them.
import { readdirSync, readFileSync } from 'node:fs';
import { join } from 'node:path';
import { describe, expect, it } from 'vitest';
import { readProcedure } from '../../src/read/read-procedure.ts';
import { layoutChart } from '../../src/render/chart-layout.ts';
import { chartLayoutPrintParts, defaultPrintBox, planParts } from '../../src/render/chart-print.ts';
import { chartLayoutToSvg } from '../../src/render/chart-svg.ts';

const root = join(import.meta.dirname, '../../procedures');
const demo = readdirSync(root, { recursive: true, encoding: 'utf8' }).filter((f) => f.endsWith('.md') && !f.endsWith('README.md')).sort();
const layouts = demo.flatMap((f) => {
  const file = join(root, f);
  const procedure = readProcedure(file, readFileSync(file, 'utf8')).procedure;
  return procedure ? [{ name: f, layout: layoutChart(procedure) }] : [];
});
const viewBoxOf = (svg: string) => /^<svg [^>]*viewBox="([^"]+)"/.exec(svg)![1].split(' ').map(Number);

describe('chart print parts', () => {
  it('has long demo charts to cut', () => {
    expect(layouts.filter((l) => planParts(l.layout).length > 2).length).toBeGreaterThan(2);
  });

  it.each(layouts)('$name: each part shows its window of the screen chart\'s shapes, by reference, and the windows tile the chart', ({ layout }) => {
    const screen = chartLayoutToSvg(layout, { title: 'Chart', shapesId: 'chart-shapes-x' });
    const parts = chartLayoutPrintParts(layout, 'Chart', defaultPrintBox, 'chart-shapes-x');
    const plan = planParts(layout);
    if (plan.length < 2) {
      expect(parts).toEqual([]);
      return;
    }
    // The screen chart holds every shape in the group the parts name, and refers to nothing outside itself.
    expect(screen).toMatch(/^<svg [^>]*><g id="chart-shapes-x">.*<\/g><\/svg>$/s);
    expect(screen).not.toMatch(/url\(#|<marker/);
    expect(parts.map((p) => [p.y0, p.y1])).toEqual(plan);
    let bottom = 0;
    parts.forEach((part, i) => {
      expect(part.svg).toMatch(new RegExp(`^<svg [^>]*aria-label="Chart, part ${i + 1} of ${parts.length}"[^>]*><use href="#chart-shapes-x"/></svg>$`));
      const [x, y, width, height] = viewBoxOf(part.svg);
      expect([x, y, width, height]).toEqual([0, bottom, layout.width, part.y1 - part.y0]);
      // Scaled to the page width, a part fits the page height (a single step taller than a page is cut anyway).
      expect(height * Math.min(1, defaultPrintBox.width / width)).toBeLessThanOrEqual(defaultPrintBox.height + 1e-9);
      bottom = part.y1;
    });
    expect(bottom).toBe(layout.height);
    // Without an id to refer to, each part holds a copy of the shapes it shows, through the same window.
    const copies = chartLayoutPrintParts(layout, 'Chart');
    expect(copies.map((p) => viewBoxOf(p.svg))).toEqual(parts.map((p) => viewBoxOf(p.svg)));
    for (const copy of copies) {
      expect(copy.svg).not.toContain('<use');
      expect(copy.svg).toMatch(/<\/text>/);
    }
  });

  it('draws a jump\'s arrowhead as a shape that points down its link, to the target\'s label', () => {
    const withJump = layouts.find((l) => l.layout.shapes.some((s) => s.type === 'jump'));
    expect(withJump).toBeDefined();
    const svg = chartLayoutToSvg(withJump!.layout, { title: 'Chart' });
    const heads = [...svg.matchAll(/<path class="sfc-arrowhead" d="M([\d.-]+),([\d.-]+) L([\d.-]+),([\d.-]+) L([\d.-]+),([\d.-]+) z"/g)].map((m) => m.slice(1).map(Number));
    expect(heads.length).toBe(withJump!.layout.shapes.filter((s) => s.type === 'jump').length);
    for (const [x1, y1, x2, y2, tipX, tipY] of heads) {
      // A base across the link and a tip below it, in the middle.
      expect(y1).toBe(y2);
      expect(tipY).toBeGreaterThan(y1);
      expect(tipX).toBe((x1 + x2) / 2);
    }
  });
});
