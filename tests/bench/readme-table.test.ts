// The README's table of benchmark figures: written between its markers from bench/results.json, never by hand.
import { mkdtempSync, readFileSync, rmSync, writeFileSync } from 'node:fs';
import { tmpdir } from 'node:os';
import { join } from 'node:path';
import { describe, expect, it } from 'vitest';
import { benchTable, tableEnd, tableStart, writeReadmeTable } from '../../bench/readme-table.ts';

const results = {
  date: '2026-12-02T16:00:00.000Z',
  quick: false,
  machine: { cpus: 2, cpu: 'Test CPU', node: 'v24.0.0', loadAtStart: [3.5, 2, 1], loadAverage: [4, 3, 2] },
  figures: {
    'site/500/full-build': { value: 40, unit: 's' },
    'site/500/ratio': { value: 2.5, unit: 'x', goal: '<= 1.3', met: false, measured: { at: '2026-12-02T15:40:00.000Z', loadAtStart: [0.8, 1, 1], loadAtEnd: [1.9, 1, 1] } },
    'check/1001/cold': { value: 1.5, unit: 's', goal: '< 2', met: true },
    'check/1001/cold-ratio': { value: 1.8, unit: 'x', goal: '<= 2', met: true },
    'startup/version': { value: 240, unit: 'ms', goal: '<= 200 ms', met: false },
    'startup/check-demo': { value: 930, unit: 'ms', goal: '<= 1000 ms', met: true },
    'startup/check-demo-floor-ratio': { value: 12.9, unit: 'x' },
  },
};

describe('bench table', () => {
  it('shows each figure with its ratio, goal and whether it was met, and the load of the run', () => {
    const table = benchTable(results);
    expect(table).toContain('load average 3.5 2 1 at the start and 4 3 2 at the end');
    // Each row says when its figure was measured and how busy the machine was then.
    expect(table).toContain('| Full build vs bare Astro build of the same pages | 500 | 40 s | 2.5x | <= 1.3x | **no** | 2026-12-02 15:40 (0.8) |');
    expect(table).toContain('| check, cold, vs read + front-matter parse with positions | 1,001 | 1.5 s | 1.8x | <= 2x | yes | — |');
    expect(table).toContain('| check, cold, whole process | 1,001 | 1.5 s | — | < 2 s | yes | — |');
    // A goal not met shows as not met; a goal that names its unit is not given it twice.
    expect(table).toContain('| `stepwright --version` (installed package); ratio to `node -e 0` | — | 240 ms | — | <= 200 ms | **no** | — |');
    // A start-up time is shown with its ratio to starting Node itself; the goal stays the time's.
    expect(table).toContain('| `stepwright check` of the demo manual, cold: no result cache, compile cache of an earlier run (installed package); ratio to `node -e 0` | 13 | 930 ms | 12.9x | <= 1000 ms | yes | — |');
    // A figure the run did not measure is shown as missing, not as met.
    expect(table).toMatch(/\| Rebuild after one changed procedure vs full build \| 2,000 \| — \| — \| — \| — \| — \|/);
  });

  it('replaces only the text between the markers, and adds them once when missing', () => {
    const dir = mkdtempSync(join(tmpdir(), 'stepwright-readme-'));
    try {
      const readme = join(dir, 'README.md');
      writeFileSync(readme, '# Title\n\nBefore.\n\n## The procedure format\n\nAfter.\n');
      writeReadmeTable(readme, results);
      writeReadmeTable(readme, { ...results, figures: { ...results.figures, 'site/500/full-build': { value: 30, unit: 's' } } });
      const text = readFileSync(readme, 'utf8');
      expect(text.split(tableStart).length).toBe(2);
      expect(text.split(tableEnd).length).toBe(2);
      expect(text).toContain('| 30 s |');
      expect(text).not.toContain('| 40 s |');
      expect(text.startsWith('# Title\n\nBefore.\n')).toBe(true);
      expect(text.endsWith('## The procedure format\n\nAfter.\n')).toBe(true);
    } finally {
      rmSync(dir, { recursive: true, force: true });
    }
  });
});
