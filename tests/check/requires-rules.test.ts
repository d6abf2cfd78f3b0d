// The `requires` rules: unknown, not in force, and circles of required procedures.
import fc from 'fast-check';
import { describe, expect, it } from 'vitest';
import { checkSources } from '../../src/check/run-checks.ts';
import { rules } from '../../src/check/rules/index.ts';

const today = '2026-12-01';

function procedure(id: string, status: string, requires: string[], extra = ''): { file: string; text: string } {
  return {
    file: `${id}.md`,
    text: `---
id: ${id}
title: Procedure ${id}
kind: normal
revision: 1
status: ${status}
effective: 2026-03-01
${extra}${requires.length ? `requires: [${requires.join(', ')}]\n` : ''}steps:
  - step: check
    do: Check that XV-1 is closed
    confirm: XV-1 shows closed
---
`,
  };
}

const of = (ruleId: string, files: Array<{ file: string; text: string }>) =>
  checkSources(files, { today }).diagnostics.filter((d) => d.rule === ruleId);

describe('requires', () => {
  it('cites its sources', () => {
    // Source: OSHA 29 CFR 1910.119(f)(1) clear instructions; (f)(3) procedures reflect current practice
    expect(rules['requires-unknown-procedure'].meta.source).toMatch(/1910\.119\(f\)\(1\)/);
    expect(rules['requires-not-in-force'].meta.source).toMatch(/1910\.119\(f\)\(3\)/);
    // Source: common practice (prerequisites are completed first, so they are ordered without circles)
    expect(rules['requires-cycle'].meta.source).toMatch(/common practice/i);
    // Source: OSHA 29 CFR 1910.119(f)(1)(i) steps for each operating phase; line-ups: common practice
    expect(rules['line-up-contradicts-required'].meta.source).toMatch(/1910\.119\(f\)\(1\)\(i\).*common practice/);
  });

  it('an unknown id suggests the near one', () => {
    const found = of('requires-unknown-procedure', [procedure('U2-A-001', 'effective', ['U2-B-01']), procedure('U2-B-001', 'effective', [])]);
    expect(found).toHaveLength(1);
    expect(found[0].hint).toContain("'U2-B-001'");
    expect(found[0].line).toBe(8);
  });

  it('a retired requirement is an error even from a draft; a draft requirement only warns a draft', () => {
    const files = [
      procedure('U2-A-001', 'draft', ['U2-R-001', 'U2-D-001']),
      procedure('U2-B-001', 'effective', ['U2-D-001']),
      procedure('U2-R-001', 'retired', []),
      procedure('U2-D-001', 'draft', []),
    ];
    const found = of('requires-not-in-force', files).map((d) => `${d.file} ${d.severity} ${d.message}`);
    expect(found.sort()).toEqual([
      "U2-A-001.md error U2-A-001 requires 'U2-R-001', which is retired.",
      "U2-A-001.md warning U2-A-001 requires 'U2-D-001', which is 'draft', not yet in force.",
      "U2-B-001.md error U2-B-001 requires 'U2-D-001', which is 'draft', not yet in force.",
    ].sort());
  });

  it('an effective date after today and an expired temporary procedure are not in force', () => {
    const later = procedure('U2-L-001', 'effective', []);
    later.text = later.text.replace('effective: 2026-03-01', 'effective: 2027-01-10');
    const temporary = procedure('U2-T-001', 'effective', [], 'expires: 2026-11-30\n');
    temporary.text = temporary.text.replace('kind: normal', 'kind: temporary');
    const found = of('requires-not-in-force', [procedure('U2-A-001', 'effective', ['U2-L-001', 'U2-T-001']), later, temporary]);
    expect(found.map((d) => d.message).sort()).toEqual([
      "U2-A-001 requires 'U2-L-001', which is in force only from 2027-01-10.",
      "U2-A-001 requires 'U2-T-001', which is a temporary procedure that expired on 2026-11-30.",
    ]);
  });

  it('a circle is reported at each requirement that closes it, with the chain', () => {
    const found = of('requires-cycle', [
      procedure('U2-A-001', 'effective', ['U2-B-001']),
      procedure('U2-B-001', 'effective', ['U2-C-001']),
      procedure('U2-C-001', 'effective', ['U2-A-001']),
      procedure('U2-D-001', 'effective', ['U2-A-001']),
    ]);
    expect(found.map((d) => d.file).sort()).toEqual(['U2-A-001.md', 'U2-B-001.md', 'U2-C-001.md']);
    expect(found.find((d) => d.file === 'U2-A-001.md')!.trace).toEqual(['U2-A-001', 'U2-B-001', 'U2-C-001', 'U2-A-001']);
  });

  it('a line-up that the required procedure always leaves false is reported; one it leaves open is not', () => {
    const required = procedure('U2-R-001', 'effective', [], 'signals:\n  XV-1: { text: Chute valve, values: [open, closed] }\n  XV-2: { text: Vent valve, values: [open, closed] }\nline-up: [XV-1 == closed]\n');
    required.text = required.text.replace("    do: Check that XV-1 is closed\n    confirm: XV-1 shows closed", "    do: Open chute valve XV-1\n    state: { XV-1: open }\n    until: XV-1 == open");
    const signals = 'signals:\n  XV-1: { text: Chute valve, values: [open, closed] }\n  XV-2: { text: Vent valve, values: [open, closed] }\n';
    const a = procedure('U2-A-001', 'effective', ['U2-R-001'], `${signals}line-up: [XV-1 == closed, XV-2 == closed]\n`);
    const b = procedure('U2-B-001', 'effective', ['U2-R-001'], `${signals}line-up: [XV-1 == open]\n`);
    const found = of('line-up-contradicts-required', [required, a, b]);
    expect(found.map((d) => `${d.file} ${d.message}`)).toEqual([
      "U2-A-001.md The line-up says XV-1 == closed, but U2-R-001, which this procedure requires, always ends with XV-1 = open.",
    ]);
  });

  it('a line-up whose conditions can each hold after the required procedure, but never together, is reported as a whole', () => {
    const signals = 'signals:\n  XV-1: { text: Chute valve, values: [open, closed] }\n  XV-2: { text: Vent valve, values: [open, closed] }\n  lab-result: { text: Lab release, values: [pass, fail] }\n';
    // The required procedure ends with the chute valve open (lab pass) or with the vent valve open (lab fail).
    const required = procedure('U2-R-001', 'effective', [], `${signals}line-up: [XV-1 == closed, XV-2 == closed]\n`);
    required.text = required.text.replace(/^steps:[\s\S]*(?=^---)/m, `steps:
  - step: await-lab
    do: Wait for the lab result
    confirm: Lab result received
  - choose:
      - when: lab-result == pass
        steps:
          - step: open-chute
            do: Open chute valve XV-1
            state: { XV-1: open }
            until: XV-1 == open
      - when: lab-result == fail
        steps:
          - step: open-vent
            do: Open vent valve XV-2
            state: { XV-2: open }
            until: XV-2 == open
`);
    const both = procedure('U2-A-001', 'effective', ['U2-R-001'], `${signals}line-up: [XV-1 == closed, XV-2 == closed]\n`);
    const one = procedure('U2-B-001', 'effective', ['U2-R-001'], `${signals}line-up: [XV-1 == closed]\n`);
    const either = procedure('U2-C-001', 'effective', ['U2-R-001'], `${signals}line-up: [XV-1 == open or XV-2 == open, XV-1 == closed]\n`);
    const found = of('line-up-contradicts-required', [required, both, one, either]);
    expect(found.map((d) => `${d.file}:${d.line} ${d.message}`)).toEqual([
      'U2-A-001.md:12 The line-up\'s conditions XV-1 == closed, XV-2 == closed can each hold when U2-R-001, which this procedure requires, has ended, but never all together: it ends with XV-1 = open and XV-2 = closed; or XV-1 = closed and XV-2 = open.',
    ]);
  });

  it('takes a signal moved to a threshold to end near it: names the value, and passes a line-up within a reading of it (property)', () => {
    // A vent stopped at PI-1 <= sp leaves a reading near sp. A line-up 1 kPa below it can be met (1 % of the
    // 600 kPa range is 6 kPa); one 10 kPa below cannot.
    fc.assert(fc.property(fc.integer({ min: 20, max: 580 }), fc.constantFrom('kPa', 'kPaa'), (setpoint, unit) => {
      const signals = `signals:\n  PI-1: { text: Kettle pressure, unit: ${unit}, range: [0, 600] }\n`;
      const required = procedure('U2-R-001', 'effective', [], `${signals}line-up: [PI-1 >= ${setpoint + 15} ${unit}]\n`);
      required.text = required.text.replace(/^steps:[\s\S]*(?=^---)/m, `steps:
  - step: vent
    do: Vent the kettle down to ${setpoint} ${unit}
    set: { PI-1: ${setpoint} ${unit} }
    until: PI-1 <= ${setpoint} ${unit}
`);
      const far = procedure('U2-A-001', 'effective', ['U2-R-001'], `${signals}line-up: [PI-1 <= ${setpoint - 10} ${unit}]\n`);
      const near = procedure('U2-B-001', 'effective', ['U2-R-001'], `${signals}line-up: [PI-1 <= ${setpoint - 1} ${unit}]\n`);
      const found = of('line-up-contradicts-required', [required, far, near]);
      expect(found.map((d) => `${d.file} ${d.message}`)).toEqual([`U2-A-001.md The line-up says PI-1 <= ${setpoint - 10} ${unit}, but U2-R-001, which this procedure requires, always ends with PI-1 = ${setpoint} ${unit}.`]);
    }), { numRuns: 30 });
  });

  it('reports exactly the requirements that lie on a circle, on random manuals (checked against a transitive closure)', () => {
    const graph = fc.integer({ min: 1, max: 6 }).chain((n) => fc.tuple(fc.constant(n), fc.array(fc.tuple(fc.nat(n - 1), fc.nat(n - 1)), { maxLength: 10 })));
    fc.assert(fc.property(graph, ([n, edges]) => {
      const id = (i: number) => `U2-P-00${i}`;
      const out = Array.from({ length: n }, (_, i) => [...new Set(edges.filter(([a]) => a === i).map(([, b]) => b))]);
      const files = out.map((targets, i) => procedure(id(i), 'effective', targets.map(id)));
      // reach[a][b]: b can be reached from a by one or more requirements.
      const reach = Array.from({ length: n }, (_, a) => Array.from({ length: n }, (_, b) => out[a].includes(b)));
      for (let k = 0; k < n; k++) for (let a = 0; a < n; a++) for (let b = 0; b < n; b++) if (reach[a][k] && reach[k][b]) reach[a][b] = true;
      const expected = out.flatMap((targets, a) => targets.filter((b) => b === a || reach[b][a]).map((b) => `${id(a)}.md>${id(b)}`)).sort();
      const found = of('requires-cycle', files).map((d) => `${d.file}>${d.trace![1]}`).sort();
      expect(found).toEqual(expected);
    }), { numRuns: 100 });
  });
});
