// A register safety function that may be bypassed is tied to a procedure of the manual that is still in use.
import { readFileSync } from 'node:fs';
import { join } from 'node:path';
import { describe, expect, it } from 'vitest';
import { checkSources } from '../../src/check/run-checks.ts';
import { rules } from '../../src/check/rules/index.ts';
import { buildRegister } from '../../src/model/register.ts';
import { readYamlSource } from '../../src/parse/read-yaml-source.ts';

const fixtures = join(import.meta.dirname, '../fixtures/rules/bypass-procedure-unknown');
const procedure = (id: string, status = 'effective') => readFileSync(join(fixtures, 'valid-base.md'), 'utf8')
  .replace('id: FX-K210-001', `id: ${id}`).replace('status: effective', `status: ${status}`);
const plant = readFileSync(join(fixtures, 'register', 'plant.yaml'), 'utf8');

function messages(bypass: string, files = [procedure('FX-K210-001'), procedure('FX-K210-002')], partial?: { folder: string; left: number }) {
  const text = plant.replace('safety-functions:\n', `safety-functions:\n  TSH-211:\n    trips-when: TI-210 >= 250 degC\n    closes: [XV-2101]\n    bypass: ${bypass}\n`);
  const register = buildRegister('register', [{ file: 'register/plant.yaml', source: readYamlSource('register/plant.yaml', text) }]);
  expect(register.safetyFunctions.get('TSH-211')?.bypass).toBeDefined();
  return checkSources(files.map((t, i) => ({ file: `p${i}.md`, text: t })), { today: '2026-12-01', register, partial })
    .diagnostics.filter((d) => d.rule === 'bypass-procedure-unknown').map((d) => `${d.file}:${d.line} ${d.message} | ${d.hint}`);
}

describe('bypass-procedure-unknown', () => {
  it('cites its source', () => {
    // Source: OSHA 29 CFR 1910.119(f)(1)(iv): safety systems and their functions; IEC 61511-1 bypass under written procedures (from memory)
    expect(rules['bypass-procedure-unknown'].meta.source).toMatch(/1910\.119\(f\)\(1\)\(iv\).*IEC 61511-1/);
  });

  it('accepts a bypass under a procedure of the manual, and no bypass at all', () => {
    expect(messages('{ allowed: true, procedure: FX-K210-002 }')).toEqual([]);
    expect(messages('{ allowed: false }')).toEqual([]);
  });

  it('reports each way the bypass is not tied to a usable procedure, at the register entry', () => {
    const [none] = messages('{ allowed: true }');
    expect(none).toMatch(/^register\/plant\.yaml:\d+ TSH-211 may be bypassed, but the register names no procedure/);
    expect(messages('{ allowed: true, procedure: FX-K210-092 }')[0]).toContain("'FX-K210-092', which is not in the manual. | Did you mean 'FX-K210-002'?");
    expect(messages('{ allowed: false, procedure: FX-K210-002 }')[0]).toContain('may not be bypassed (allowed: false), yet names');
    const retired = messages('{ allowed: true, procedure: FX-K210-002 }', [procedure('FX-K210-001'), procedure('FX-K210-002', 'superseded')]);
    expect(retired[0]).toContain('under FX-K210-002, which is superseded.');
  });

  it('with only part of the manual checked, a procedure not among the files is not called missing', () => {
    const partial = { folder: 'procedures', left: 3 };
    expect(messages('{ allowed: true, procedure: FX-K210-092 }', undefined, partial)).toEqual([]);
    // What does not depend on the other files is still reported.
    expect(messages('{ allowed: true }', undefined, partial)).toHaveLength(1);
  });
});
