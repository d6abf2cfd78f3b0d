// The build date never comes from the clock: STEPWRIGHT_TODAY, the last commit, or dates that have happened.
import { describe, expect, it } from 'vitest';
import { buildDate } from '../../src/site-data/manual.ts';
import { tempFolder } from '../temp-folder.ts';

const text = `---\nid: X\neffective: 2026-03-01\nreview-by: 2028-01-01\napprovals:\n  - { role: a, name: b, date: 2026-02-20, meaning: c }\n---\n`;

describe('build date', () => {
  it('takes STEPWRIGHT_TODAY first', () => {
    expect(buildDate({ cwd: process.cwd(), env: { STEPWRIGHT_TODAY: '2030-05-06' } }, [])).toEqual({ today: '2030-05-06', source: 'STEPWRIGHT_TODAY' });
  });

  it('outside git, takes the newest effective or approval date, never a review-by date', () => {
    const outside = tempFolder('stepwright-date-');
    expect(buildDate({ cwd: outside, env: {} }, [{ file: 'a.md', text }])).toEqual({ today: '2026-03-01', source: 'procedure dates' });
  });

  it('in a git checkout, takes the date of the last commit', () => {
    const found = buildDate({ cwd: process.cwd(), env: {} }, [{ file: 'a.md', text }]);
    expect(found.source).toBe('last commit');
    expect(found.today).toMatch(/^\d{4}-\d{2}-\d{2}$/);
  });
});
