// A check runs with V8's optimising compilers off while it is small, with them on once it is large and after it
// ends (failed or not), and never against the user's own choice on node's command line. Observed in a child
// process, with V8's own answer on whether a hot function was optimised.
import { spawnSync } from 'node:child_process';
import { join } from 'node:path';
import { describe, expect, it } from 'vitest';
import { optimisedFrom } from '../../src/cli/compile-tiers.ts';

const module = join(import.meta.dirname, '../../src/cli/compile-tiers.ts');

// Source: V8's test runtime function %GetOptimizationStatus (src/runtime/runtime-test.cc), bit 1 << 4 for an
// optimised function (from memory; the cases below that expect true check that the bit is set once V8 may optimise).
function run(files: number, options: { nodeFlags?: string[]; fails?: boolean } = {}): { during: boolean; after: boolean } {
  const child = `
const { withCompilersForSize } = await import(${JSON.stringify(module)});
const hot = () => function (a) { let s = 0; for (let i = 0; i < a.length; i++) s += a[i] * 2 + (a[i] >> 1); return s; };
const a = Array.from({ length: 200 }, (_, i) => i);
const optimised = async (f) => {
  for (let round = 0; round < 20; round++) {
    for (let k = 0; k < 2000; k++) f(a);
    await new Promise((done) => setTimeout(done, 5));
  }
  return (%GetOptimizationStatus(f) & 16) !== 0;
};
const seen = {};
try {
  await withCompilersForSize(async (sized) => {
    sized(${files});
    seen.during = await optimised(hot());
    if (${Boolean(options.fails)}) throw new Error('unreadable');
  });
} catch {}
seen.after = await optimised(hot());
console.log(JSON.stringify(seen));
`;
  const result = spawnSync(process.execPath, ['--allow-natives-syntax', ...(options.nodeFlags ?? []), '--input-type=module', '-e', child], { encoding: 'utf8', timeout: 60_000 });
  if (result.status !== 0) throw new Error(result.stderr);
  return JSON.parse(result.stdout);
}

describe('the check\'s optimising compilers', () => {
  it('are off for a small check and on again after it', () => {
    expect(run(13)).toEqual({ during: false, after: true });
  });

  it(`are on for a check of ${optimisedFrom} files or more`, () => {
    expect(run(optimisedFrom)).toEqual({ during: true, after: true });
    expect(run(optimisedFrom - 1)).toEqual({ during: false, after: true });
  });

  it('are on again after a check that failed', () => {
    expect(run(13, { fails: true })).toEqual({ during: false, after: true });
  });

  it('stay as the user set them on node\'s command line', () => {
    expect(run(optimisedFrom, { nodeFlags: ['--no-maglev', '--no-turbofan'] })).toEqual({ during: false, after: false });
  });
});
