// A usage error is recognised whichever copy of its module made it: the installed package bundles each command
// into one file, with a copy of its own.
import { describe, expect, it } from 'vitest';
import { isUsageError, UsageError } from '../../src/engine/usage-error.ts';

describe('usage errors', () => {
  it('are told apart from other errors, also when made by another copy of the class', async () => {
    expect(isUsageError(new UsageError('bad option'))).toBe(true);
    // A second copy of the module, as a bundle holds one (a fresh module instance through a query string).
    const copy = (await import('../../src/engine/usage-error.ts?copy' as string)) as typeof import('../../src/engine/usage-error.ts');
    expect(copy.UsageError).not.toBe(UsageError);
    expect(new copy.UsageError('bad date') instanceof UsageError).toBe(false);
    expect(isUsageError(new copy.UsageError('bad date'))).toBe(true);
    for (const other of [new Error('boom'), Object.assign(new Error('x'), { name: 'UsageError' }), null, 'UsageError', {}]) expect(isUsageError(other)).toBe(false);
  });
});
