// The demo manual is the model procedure set: it must check with zero errors and cover what the format offers.
import { describe, expect, it } from 'vitest';
import { join } from 'node:path';
import { checkSources } from '../src/check/run-checks.ts';
import { readProcedureFiles } from '../src/cli/read-procedure-files.ts';
import { kinds } from '../src/model/schema.ts';
import { walkBlocks } from '../src/model/walk-steps.ts';
import { unitDimension } from '../src/analysis/units.ts';
import { loadRegister } from '../src/cli/load-register.ts';

const root = join(import.meta.dirname, '..');
// The demo plant keeps its signals, trips and relief devices in the register folder next to procedures/.
const register = loadRegister(root, undefined, undefined);
const result = checkSources(readProcedureFiles(['procedures'], root), { today: '2026-12-01', register });
const procedures = result.files.flatMap((f) => (f.procedure ? [f.procedure] : []));

describe('demo manual', () => {
  it('checks with zero errors', () => {
    const errors = result.diagnostics.filter((d) => d.severity === 'error').map((d) => `${d.file}:${d.line} ${d.rule} ${d.message}`);
    expect(errors).toEqual([]);
  });

  it('reads the plant register, with no register problem and every K-210 trip described once', () => {
    expect(register).toBeDefined();
    expect(register!.diagnostics).toEqual([]);
    const esd = register!.safetyFunctions.get('ESD-210');
    expect(esd?.latches).toBe(true);
    // Every trip that starts the K-210 emergency shutdown shows the same description in every procedure.
    const descriptions = new Set(procedures.flatMap((p) => p.interlocks.filter((i) => ['TSHH-210', 'PSHH-210', 'HS-2190'].includes(i.tag)).map((i) => i.action.replace(/^.*?, which /, ''))));
    expect(descriptions.size).toBe(1);
  });

  it('has at least eight procedures and one of each kind', () => {
    expect(procedures.length).toBeGreaterThanOrEqual(8);
    expect(new Set(procedures.map((p) => p.kind))).toEqual(new Set(kinds));
  });

  it('uses parallel and choose blocks, a loop, and hazards at all four levels', () => {
    const blocks = procedures.flatMap((p) => walkBlocks(p.steps));
    expect(blocks.some((b) => b.kind === 'parallel')).toBe(true);
    expect(blocks.some((b) => b.kind === 'choose' && b.branches.some((br) => br.goto))).toBe(true);
    expect(new Set(procedures.flatMap((p) => p.hazards.map((h) => h.level)))).toEqual(new Set(['danger', 'warning', 'caution', 'notice']));
  });

  it('declares signals in at least four unit families', () => {
    const families = new Set(procedures.flatMap((p) => Object.values(p.signals).flatMap((s) => (s.unit ? [unitDimension(s.unit)] : []))));
    expect(families.size).toBeGreaterThanOrEqual(4);
  });
});
