// Document-control rules, one by one, each against the OSHA paragraph it rests on: the review date, the yearly
// certification, overdue reviews and temporary procedures with their end date.
import { describe, expect, it } from 'vitest';
import { checkSources } from '../../src/check/run-checks.ts';

const today = '2026-12-01';

interface Options {
  kind?: string;
  status?: string;
  extra?: string;
  interval?: number;
}

function procedure({ kind = 'normal', status = 'effective', extra = '' }: Options): string {
  return `---
id: FX-DC-010
title: Drain the hot-oil header
kind: ${kind}
revision: 1
status: ${status}
effective: 2026-03-10
approvals:
  - { role: Process engineer, name: A. Writer, date: 2026-03-01, meaning: Authored }
  - { role: Operations manager, name: B. Signer, date: 2026-03-05, meaning: Approved for use }
${extra}
steps:
  - step: drain
    do: Open the header drain.
    confirm: Drain is open
---
`;
}

function found(rule: string, options: Options) {
  return checkSources([{ file: 'p.md', text: procedure(options) }], { today, certificationIntervalMonths: options.interval })
    .diagnostics.filter((d) => d.rule === rule);
}

describe('review-date-missing', () => {
  // Source: OSHA 29 CFR 1910.119(f)(3): operating procedures are certified annually as current and accurate.
  it('is an error for an effective or approved procedure without review-by', () => {
    for (const status of ['effective', 'approved']) {
      const d = found('review-date-missing', { status });
      expect(d, status).toHaveLength(1);
      expect(d[0].severity).toBe('error');
      expect(d[0].message).toContain('yearly certification');
    }
  });
  it('is silent once review-by is given, and for procedures not in use', () => {
    expect(found('review-date-missing', { extra: 'review-by: 2027-03-10' })).toEqual([]);
    for (const status of ['draft', 'in-review', 'superseded', 'retired']) expect(found('review-date-missing', { status }), status).toEqual([]);
  });
});

describe('review-interval-too-long', () => {
  // Source: OSHA 29 CFR 1910.119(f)(3): certified annually, so at most 12 months between certifications.
  it('refuses a review date six years away', () => {
    const d = found('review-interval-too-long', { extra: 'review-by: 2032-03-10' });
    expect(d).toHaveLength(1);
    expect(d[0].severity).toBe('error');
    expect(d[0].message).toContain('due by 2027-03-10');
  });
  it('allows exactly 12 months after the effective date, not a day more', () => {
    expect(found('review-interval-too-long', { extra: 'review-by: 2027-03-10' })).toEqual([]);
    expect(found('review-interval-too-long', { extra: 'review-by: 2027-03-11' })).toHaveLength(1);
  });
  it('counts from the newest certification record, which is separate from the approvals', () => {
    const certified = 'certifications:\n  - { name: C. Certifier, role: Operations superintendent, date: 2026-11-02 }\n';
    expect(found('review-interval-too-long', { extra: `${certified}review-by: 2027-11-02` })).toEqual([]);
    expect(found('review-interval-too-long', { extra: `${certified}review-by: 2027-11-03` })[0].message).toContain('certified 2026-11-02');
    // Approvals are not certifications: a later signature does not move the due date.
    const lateApproval = procedure({ extra: 'review-by: 2027-11-02' }).replace('date: 2026-03-05', 'date: 2026-11-02');
    const d = checkSources([{ file: 'p.md', text: lateApproval }], { today }).diagnostics.filter((x) => x.rule === 'review-interval-too-long');
    expect(d).toHaveLength(1);
  });
  it('takes a shorter interval from the configuration', () => {
    expect(found('review-interval-too-long', { extra: 'review-by: 2027-03-10', interval: 6 })[0].message).toContain('due by 2026-09-10');
  });
});

describe('review-overdue', () => {
  // Source: OSHA 29 CFR 1910.119(f)(3): the yearly certification lapses once its date has passed.
  it('warns after the review date, not on it', () => {
    const d = found('review-overdue', { extra: 'review-by: 2026-11-30' });
    expect(d).toHaveLength(1);
    expect(d[0].severity).toBe('warning');
    expect(found('review-overdue', { extra: `review-by: ${today}` })).toEqual([]);
    expect(found('review-overdue', { status: 'superseded', extra: 'review-by: 2026-11-30' })).toEqual([]);
  });
});

describe('temporary procedures', () => {
  // Source: OSHA 29 CFR 1910.119(f)(1)(i)(C): procedures for temporary operations; (l)(2)(iv): the time period of a temporary change.
  it('temporary-without-end: a temporary procedure in review or in use needs an end date', () => {
    for (const status of ['in-review', 'approved', 'effective']) {
      const d = found('temporary-without-end', { kind: 'temporary', status, extra: 'review-by: 2027-03-10\nmodifies: [U2-K210-BATCH-001]' });
      expect(d, status).toHaveLength(1);
      expect(d[0].severity).toBe('error');
    }
    expect(found('temporary-without-end', { kind: 'temporary', status: 'draft' })).toEqual([]);
    expect(found('temporary-without-end', { kind: 'temporary', extra: 'review-by: 2027-01-15\nexpires: 2027-01-15' })).toEqual([]);
    // Only temporary procedures carry an end date.
    expect(found('temporary-without-end', { extra: 'review-by: 2027-03-10' })).toEqual([]);
  });

  it('the issue case: no end date and a review date six years away gives both errors', () => {
    const options = { kind: 'temporary', extra: 'review-by: 2032-12-01' };
    expect(found('temporary-without-end', options)).toHaveLength(1);
    expect(found('review-interval-too-long', options)).toHaveLength(1);
  });

  it('temporary-expired: an error the day after the end date, while approved or effective', () => {
    const expired = { kind: 'temporary', extra: 'review-by: 2027-03-10\nexpires: 2026-11-30' };
    const d = found('temporary-expired', expired);
    expect(d).toHaveLength(1);
    expect(d[0].severity).toBe('error');
    expect(d[0].message).toContain('expired on 2026-11-30');
    expect(found('temporary-expired', { ...expired, extra: `review-by: 2027-03-10\nexpires: ${today}` })).toEqual([]);
    expect(found('temporary-expired', { ...expired, status: 'retired' })).toEqual([]);
  });
});

describe('modifies-unknown-procedure', () => {
  // Source: OSHA 29 CFR 1910.119(f)(1)(i)(C): procedures for temporary operations; the procedures they change show it (common practice).
  const temporary = (modifies: string, kind = 'temporary') => procedure({ kind, extra: `review-by: 2027-01-15\nexpires: 2027-01-15\nmodifies: [${modifies}]` })
    .replace('id: FX-DC-010', 'id: FX-DC-020');
  const normal = (id: string, status = 'effective') => procedure({ status, extra: 'review-by: 2027-03-10' }).replace('id: FX-DC-010', `id: ${id}`);
  const run = (files: string[], partial?: { folder: string; left: number }) => checkSources(files.map((text, i) => ({ file: `p${i}.md`, text })), { today, partial })
    .diagnostics.filter((d) => d.rule === 'modifies-unknown-procedure');

  it('accepts a temporary procedure that modifies a procedure of the manual', () => {
    expect(run([temporary('FX-DC-011'), normal('FX-DC-011')])).toEqual([]);
  });
  it('is an error for a number not in the manual, with the near one as hint', () => {
    const d = run([temporary('FX-DC-111'), normal('FX-DC-011')]);
    expect(d).toHaveLength(1);
    expect(d[0]).toMatchObject({ severity: 'error', file: 'p0.md' });
    expect(d[0].message).toContain("modifies 'FX-DC-111', which is not in the manual");
    expect(d[0].hint).toBe("Did you mean 'FX-DC-011'?");
    // Part of the manual: the procedure may be among the files not checked.
    expect(run([temporary('FX-DC-111'), normal('FX-DC-011')], { folder: 'procedures', left: 2 })).toEqual([]);
  });
  it('warns when the modified procedure is no longer in use, and refuses modifies on a procedure that is not temporary', () => {
    const superseded = run([temporary('FX-DC-011'), normal('FX-DC-011', 'superseded')]);
    expect(superseded).toHaveLength(1);
    expect(superseded[0].severity).toBe('warning');
    const notTemporary = run([temporary('FX-DC-011', 'normal'), normal('FX-DC-011')]);
    expect(notTemporary).toHaveLength(1);
    expect(notTemporary[0].message).toContain("is a 'normal' procedure");
  });
});

describe('the yearly certification is document control, not an edit', () => {
  // Source: OSHA 29 CFR 1910.119(f)(3): certifying that procedures are current and accurate confirms them as they are;
  // a change of content goes through management of change, 1910.119(l).
  it('recording a certification and the next review date on an effective revision needs no new revision', () => {
    const before = procedure({ extra: 'review-by: 2027-03-10' });
    const after = procedure({ extra: 'review-by: 2027-11-20\ncertifications:\n  - { name: C. Certifier, role: Operations superintendent, date: 2026-11-20 }' });
    const previous = () => ({ text: before, commit: 'abc1234' });
    const rules = (text: string) => checkSources([{ file: 'p.md', text }], { today, previous }).diagnostics
      .filter((d) => d.rule === 'effective-edited-in-place' || d.rule === 'revision-not-bumped');
    expect(rules(after)).toEqual([]);
    // A content change made together with the certification is still caught.
    expect(rules(after.replace('Open the header drain.', 'Open the header drain fully.')).map((d) => d.rule)).toContain('effective-edited-in-place');
  });
});

describe('certification-in-future', () => {
  // Source: OSHA 29 CFR 1910.119(f)(3): a certification records that the procedures were found current and accurate; it cannot precede the fact.
  const certifiedOn = (date: string, reviewBy: string) => ({ extra: `review-by: ${reviewBy}\ncertifications:\n  - { name: C. Certifier, role: Operations superintendent, date: ${date} }` });
  it('is an error for a certification dated after today, which then does not move the next one out', () => {
    const typo = certifiedOn('2062-11-02', '2063-11-02');
    const d = found('certification-in-future', typo);
    expect(d).toHaveLength(1);
    expect(d[0].message).toContain('dated 2062-11-02, after today (2026-12-01)');
    expect(found('review-interval-too-long', typo)[0].message).toContain('due by 2027-03-10');
  });
  it('accepts a certification dated today', () => {
    expect(found('certification-in-future', certifiedOn(today, '2027-12-01'))).toEqual([]);
    expect(found('review-interval-too-long', certifiedOn(today, '2027-12-01'))).toEqual([]);
  });
});
