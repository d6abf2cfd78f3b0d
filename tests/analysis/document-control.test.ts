// Document control: months between certifications, the configurable interval, temporary procedures in force.
import { describe, expect, it } from 'vitest';
import { addMonths, lastCertification, temporaryProceduresInForce } from '../../src/analysis/document-control.ts';
import { checkSources, readProcedure } from '../../src/check/run-checks.ts';

const base = (extra: string, kind = 'normal') => `---
id: FX-DC-001
title: Drain the header
kind: ${kind}
revision: 1
status: effective
effective: 2026-03-10
approvals:
  - { role: Engineer, name: A. Writer, date: 2026-03-01, meaning: Authored }
  - { role: Manager, name: B. Signer, date: 2026-03-05, meaning: Approved for use }
${extra}
steps:
  - step: drain
    do: Open the drain.
    confirm: Drain is open
---
`;

describe('document control', () => {
  it('adds calendar months and clamps the day to the month end', () => {
    expect(addMonths('2026-03-10', 12)).toBe('2027-03-10');
    expect(addMonths('2026-08-31', 6)).toBe('2027-02-28');
    expect(addMonths('2027-08-31', 6)).toBe('2028-02-29');
    expect(addMonths('2026-12-15', 1)).toBe('2027-01-15');
  });

  it('the last certification is the newest certification record, else the effective date', () => {
    const p = readProcedure('a.md', base('certifications:\n  - { name: C. Cert, role: Superintendent, date: 2026-11-02 }\n  - { name: C. Cert, role: Superintendent, date: 2026-10-01 }')).procedure!;
    expect(lastCertification(p)).toEqual({ date: '2026-11-02', by: 'certification' });
    expect(lastCertification(readProcedure('b.md', base('')).procedure!)).toEqual({ date: '2026-03-10', by: 'effective' });
  });

  it('holds review-by to 12 months after the last certification by default, and to a configured interval', () => {
    // Source: OSHA 29 CFR 1910.119(f)(3): operating procedures certified annually as current and accurate.
    const text = base('review-by: 2027-03-10');
    const rule = (months?: number) => checkSources([{ file: 'a.md', text }], { today: '2026-12-01', certificationIntervalMonths: months })
      .diagnostics.filter((d) => d.rule === 'review-interval-too-long');
    expect(rule()).toEqual([]);
    expect(rule(6)).toHaveLength(1);
    expect(rule(6)[0].message).toContain('due by 2026-09-10');
  });

  it('lists temporary procedures in force over the procedures they modify, until their end date', () => {
    const temp = readProcedure('t.md', base('expires: 2027-01-15\nmodifies: [U2-A-001, U2-B-001]', 'temporary')).procedure!;
    const inForce = temporaryProceduresInForce([temp], '2027-01-15');
    expect(inForce.get('U2-A-001')).toEqual([{ id: 'FX-DC-001', title: 'Drain the header', file: 't.md', expires: '2027-01-15' }]);
    expect(inForce.get('U2-B-001')).toHaveLength(1);
    expect(temporaryProceduresInForce([temp], '2027-01-16').size).toBe(0);
  });

  it('does not count a temporary procedure before its effective date', () => {
    // Source: OSHA 29 CFR 1910.119(f)(1)(i)(C) (temporary operations): a procedure applies only while in force.
    const text = base('expires: 2027-01-15\nmodifies: [U2-A-001]', 'temporary').replace('status: effective', 'status: approved').replace('effective: 2026-03-10', 'effective: 2026-12-20');
    const temp = readProcedure('t.md', text).procedure!;
    expect(temp.effective).toBe('2026-12-20');
    expect(temporaryProceduresInForce([temp], '2026-12-19').size).toBe(0);
    expect(temporaryProceduresInForce([temp], '2026-12-20').get('U2-A-001')).toHaveLength(1);
  });
});
