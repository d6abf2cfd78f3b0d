// Sizes an author controls never make the check or the build hang, run out of memory or crash: condition
// nesting, durations, call chains that multiply, link references and huge narratives all end in a diagnostic
// that names the limit.
import { readFileSync } from 'node:fs';
import { join } from 'node:path';
import { describe, expect, it } from 'vitest';
import { estimateCycleTime } from '../../src/analysis/cycle-time.ts';
import { inlineCalls, maxCallDepth, maxExpandedSteps } from '../../src/analysis/inline-calls.ts';
import { checkSources, readProcedure } from '../../src/check/run-checks.ts';
import { bodyLimits } from '../../src/parse/nesting-prescan.ts';
import { renderTimelineSvg, tickSpacing } from '../../src/render/timeline-svg.ts';

const base = readFileSync(join(import.meta.dirname, '../fixtures/rules/front-matter-not-mapping/valid-base.md'), 'utf8');
const today = '2026-12-01';
const check = (...texts: string[]) => checkSources(texts.map((text, i) => ({ file: `p${i}.md`, text })), { today }).diagnostics;

describe('conditions nested without end', () => {
  for (const [label, condition] of [
    ['2,000 nested brackets', `${'('.repeat(2000)}TI-210 >= 180 degC${')'.repeat(2000)}`],
    ['5,000 nots', `${'not '.repeat(5000)}TI-210 >= 180 degC`],
    ['a condition of 20,000 parts', Array.from({ length: 5000 }, () => 'TI-210 >= 180 degC').join(' and ')],
  ]) {
    it(`${label} is a condition-syntax error naming the limit, not a stack overflow`, () => {
      const found = check(base.replace('until: TI-210 >= 180 degC', `until: ${condition}`));
      const syntax = found.filter((d) => d.rule === 'condition-syntax');
      expect(syntax).toHaveLength(1);
      expect(syntax[0].message).toMatch(/limit is|more than \d+ levels/);
      expect(found.some((d) => /could not finish/.test(d.message))).toBe(false);
    });
  }
  it('the same nesting in an interlock trip condition is reported too', () => {
    const found = check(base.replace('trips-when: TI-210 >= 255 degC', `trips-when: ${'('.repeat(3000)}TI-210 >= 255 degC${')'.repeat(3000)}`));
    expect(found.filter((d) => d.rule === 'condition-syntax')).toHaveLength(1);
  });
});

describe('durations', () => {
  for (const expectText of ['1e9 h', '1e309 h', '40 min..1e12 h']) {
    it(`expect: ${expectText} is an error naming the limit`, () => {
      const found = check(base.replace('    until: TI-210 >= 180 degC', `    until: TI-210 >= 180 degC\n    expect: ${expectText}`));
      const bad = found.filter((d) => d.rule === 'expect-invalid');
      expect(bad).toHaveLength(1);
      expect(bad[0].message).toMatch(/31 days|not a finite time/);
    });
  }
  it('a timeline of a loop repeated a million times over 31-day steps draws at most nine ticks', () => {
    const text = `---\nid: U2-TL-001\ntitle: Long loop\nkind: normal\nrevision: 0\nstatus: draft\nsteps:
  - { step: a, do: Hold K-1, confirm: Held, expect: 744 h }
  - choose:
      - when: again == yes
        goto: a
        repeat: { expected: 1000000, max: 1000000000 }
      - otherwise: true
---\n`;
    const cycle = estimateCycleTime(readProcedure('loop.md', text).procedure!);
    expect(cycle.typical).toBeGreaterThan(1e12);
    const svg = renderTimelineSvg(cycle, { title: 'Long loop' });
    const ticks = svg.match(/<text [^>]*font-size="11">[^<]*<\/text>/g)!.length - 4; // four legend texts
    expect(ticks).toBeGreaterThan(1);
    expect(ticks).toBeLessThanOrEqual(9);
  });
  it('tick spacing gives at most nine ticks for any span, and stays finite', () => {
    for (const span of [60, 3600, 86400 * 30, 3.6e12, 1e300, Number.MAX_VALUE]) {
      const minutes = tickSpacing(span);
      expect(span / (minutes * 60)).toBeLessThanOrEqual(8.0001);
    }
  });
});

/** Procedures 0..n-1 where each calls the next twice. */
function doublingChain(levels: number): string[] {
  return Array.from({ length: levels }, (_, i) => {
    const id = `U2-FIX-CH-${String(i).padStart(3, '0')}`;
    const next = `U2-FIX-CH-${String(i + 1).padStart(3, '0')}`;
    const steps = i === levels - 1
      ? '  - step: check\n    do: Check that XV-1 is closed\n    confirm: XV-1 shows closed\n'
      : `  - step: first\n    do: Run the shared operation\n    call: ${next}\n  - step: second\n    do: Run the shared operation\n    call: ${next}\n`;
    return `---\nid: ${id}\ntitle: Chain level ${i}\nkind: normal\nrevision: 0\nstatus: draft\nsteps:\n${steps}---\n`;
  });
}

describe('calls that multiply', () => {
  it('25 levels of procedures that each call the next twice are checked quickly, with a warning giving the sizes', () => {
    const started = performance.now();
    const found = check(...doublingChain(25));
    const seconds = (performance.now() - started) / 1000;
    const limited = found.filter((d) => d.rule === 'call-expansion-problem' && /limit is|at most/.test(d.message));
    expect(limited.length).toBeGreaterThan(0);
    expect(limited[0].severity).toBe('warning');
    expect(limited.some((d) => d.message.includes(maxExpandedSteps.toLocaleString('en-GB')))).toBe(true);
    // Not a timing assertion on the machine: 2^25 steps would take minutes and gigabytes; bounded work takes seconds.
    expect(seconds).toBeLessThan(120);
  });
  it('expansion stops at the depth and size limits', () => {
    const texts = doublingChain(30);
    const procedures = texts.map((t, i) => readProcedure(`p${i}.md`, t).procedure!);
    const byId = new Map(procedures.map((p) => [p.id, p]));
    const result = inlineCalls(procedures[0], (id) => byId.get(id));
    expect(result.problems.some((p) => p.kind === 'too-large' || p.kind === 'too-deep')).toBe(true);
    let steps = 0;
    const count = (items: typeof result.procedure.steps): void => {
      for (const item of items) {
        if (item.kind === 'step') steps++;
        else for (const b of item.branches) if (b.items) count(b.items);
      }
    };
    count(result.procedure.steps);
    expect(steps).toBeLessThanOrEqual(maxExpandedSteps);
    // A straight chain deeper than the depth limit stops at the limit.
    const straight = Array.from({ length: maxCallDepth + 5 }, (_, i) => readProcedure(`s${i}.md`, `---\nid: U2-FIX-ST-${i}\ntitle: s\nkind: normal\nrevision: 0\nstatus: draft\nsteps:\n  - step: a\n    do: Run it\n    ${i < maxCallDepth + 4 ? `call: U2-FIX-ST-${i + 1}` : 'confirm: Done'}\n---\n`).procedure!);
    const straightById = new Map(straight.map((p) => [p.id, p]));
    const deep = inlineCalls(straight[0], (id) => straightById.get(id));
    expect(deep.problems.find((p) => p.kind === 'too-deep')).toMatchObject({ limit: maxCallDepth });
  });
});

describe('narratives', () => {
  it('50,000 link references are refused before the markdown reader sees them', () => {
    const refs = Array.from({ length: 50000 }, (_, i) => `[r${i}]: a`).join('\n');
    const found = check(`${base}\n${refs}\n`).filter((d) => d.rule === 'body-too-large');
    expect(found).toHaveLength(1);
    expect(found[0].message).toMatch(/limit is/);
  });
  it('a narrative over the size limit is refused, and one of many short lines too', () => {
    const big = check(`${base}\n${'Keep the drain closed. '.repeat(Math.ceil(bodyLimits.bytes / 20))}\n`).filter((d) => d.rule === 'body-too-large');
    expect(big[0]?.message).toMatch(/characters; the limit/);
    const lines = check(`${base}\n${'x\n'.repeat(bodyLimits.lines + 1)}`).filter((d) => d.rule === 'body-too-large');
    expect(lines[0]?.message).toMatch(/lines; the limit/);
  });
});
