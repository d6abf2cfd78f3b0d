// One running condition, two procedures: a batch parameter against the value the heater start-up brings it to.
import { readFileSync } from 'node:fs';
import { join } from 'node:path';
import { describe, expect, it } from 'vitest';
import { checkSources } from '../../src/check/run-checks.ts';
import { rules } from '../../src/check/rules/index.ts';
import { readRegisterFolder } from '../../src/cli/load-register.ts';
import { findProcedureFiles } from '../../src/cli/read-procedure-files.ts';

const root = join(import.meta.dirname, '..', '..');
const register = readRegisterFolder({ absolute: join(root, 'register'), named: true }, root);
const demo = findProcedureFiles(['procedures'], root).filter((f) => !f.missing).map((f) => ({ file: f.file, text: readFileSync(f.absolute, 'utf8') }));
const batchFile = 'procedures/k-210-resin/u2-k210-batch-001.md';

function found(edit: (text: string) => string) {
  const files = demo.map((f) => (f.file === batchFile ? { file: f.file, text: edit(f.text) } : f));
  return checkSources(files, { today: '2026-12-03', register }).diagnostics.filter((d) => d.rule === 'param-differs-from-duty');
}

describe('param-differs-from-duty on the demo manual', () => {
  it('cites its source', () => {
    // Source: OSHA 29 CFR 1910.119(f)(1)(ii): operating limits; (d)(3)(i): process safety information kept as one record
    expect(rules['param-differs-from-duty'].meta.source).toMatch(/1910\.119\(f\)\(1\)\(ii\)/);
  });

  it('is silent on the demo as published', () => {
    expect(found((t) => t)).toEqual([]);
  });

  it('reports the batch expecting hot oil at 270 degC while the heater start-up brings it to 280 degC', () => {
    const d = found((t) => t.replace('params: { hot-oil-supply: 280 degC }', 'params: { hot-oil-supply: 270 degC }'));
    expect(d).toHaveLength(1);
    expect(d[0]).toMatchObject({ file: batchFile, severity: 'warning' });
    expect(d[0].message).toBe("Step 'heat-up' expects parameter 'hot-oil-supply' (TI-221) at 270 degC, but start-up procedure U2-H220-SU-001 brings TI-221 to 280 degC (step 'ramp-to-duty').");
    // The same temperature in another unit is the same duty.
    expect(found((t) => t.replace('params: { hot-oil-supply: 280 degC }', 'params: { hot-oil-supply: 553.15 K }'))).toEqual([]);
  });
});
