// The unit library is loaded on first use and shared by every copy of the units module in one process: the
// site's pages run a bundled copy next to the command's own, and the second copy must convert exactly as the
// first (it once failed to define its units a second time and every duration read as unknown).
import { describe, expect, it, vi } from 'vitest';

describe('unit library loading', () => {
  it('gives the same answers from a second copy of the module in the same process', async () => {
    const first = await import('../../src/analysis/units.ts');
    const a = first.parseQuantity('100 psig');
    vi.resetModules();
    const second = await import('../../src/analysis/units.ts');
    expect(second).not.toBe(first);
    expect(second.parseQuantity('100 psig')).toEqual(a);
    expect(second.parseDuration('90 min')).toEqual({ ok: true, min: 5400, max: 5400 });
    expect(second.isKnownUnit('percent')).toBe(true);
    expect(first.isKnownUnit('ppm')).toBe(true);
  });
});
