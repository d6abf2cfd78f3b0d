// Each plant-state rule rests on a published source or is marked as common practice, and says so.
import { describe, expect, it } from 'vitest';
import { rules } from '../../src/check/rules/index.ts';

describe('plant-state rules cite their source', () => {
  it('hazard-can-occur', () => {
    // Source: OSHA 29 CFR 1910.119(f)(1)(ii)-(iii): consequences of deviation, steps to correct or avoid it, precautions
    expect(rules['hazard-can-occur'].meta.source).toMatch(/1910\.119\(f\)/);
  });
  it('latched-trip-holds-output', () => {
    // Source: OSHA 29 CFR 1910.119(f)(1)(iv) safety systems and their functions; IEC 61131-3 action qualifiers S and R
    expect(rules['latched-trip-holds-output'].meta.source).toMatch(/1910\.119\(f\)\(1\)\(iv\).*IEC 61131-3/);
  });
  it('step-need-unmet', () => {
    // Source: OSHA 29 CFR 1910.119(f)(1)(i) steps for each operating phase; line-ups: common practice
    expect(rules['step-need-unmet'].meta.source).toMatch(/1910\.119\(f\)\(1\)\(i\).*common practice/);
  });
  it('end-state-differs', () => {
    // Source: common practice (one known state whichever way the procedure went); OSHA 29 CFR 1910.119(f)(1)(i) steps for each operating phase
    expect(rules['end-state-differs'].meta.source).toMatch(/Common practice.*1910\.119\(f\)\(1\)\(i\)/);
  });
  it('contingency-missing', () => {
    // Source: DOE-STD-1029-92 contingency actions; HSE HSG48
    expect(rules['contingency-missing'].meta.source).toMatch(/DOE-STD-1029.*HSG48/);
  });
  it('independent-check-by-performer', () => {
    // Source: DOE-STD-1029-92 verification and sign-off steps; HSE HSG48 checking by a second person
    expect(rules['independent-check-by-performer'].meta.source).toMatch(/DOE-STD-1029.*HSG48/);
  });
  it('state-reference-unknown', () => {
    // Source: IEC 61131-3 SFC action qualifiers N, S, R, L, D (named in the rule's docs in our own words)
    expect(rules['state-reference-unknown'].meta.source).toMatch(/IEC 61131-3/);
    for (const q of [/stored, S;/, /reset, R\)/, /\(N\)/, /\(L\)/, /\(D, or SD/]) expect(rules['state-reference-unknown'].meta.docs).toMatch(q);
  });
  it('retry-without-limit and state-not-analysed', () => {
    // Source: common practice
    expect(rules['retry-without-limit'].meta.source).toMatch(/common practice/i);
    expect(rules['state-not-analysed'].meta.source).toMatch(/common practice/i);
  });
  it('trip-left-latched', () => {
    // Source: IEC 61131-3 SFC action qualifiers S and R: a stored action lasts until it is reset; OSHA 29 CFR 1910.119(f)(1)(iv)
    expect(rules['trip-left-latched'].meta.source).toMatch(/1910\.119\(f\)\(1\)\(iv\).*IEC 61131-3/);
  });
  it('trip-shares-alarm-sensor', () => {
    // Source: OSHA 29 CFR 1910.119(f)(1)(iv) safety systems and their functions; ISA-5.1 loop numbering;
    // independence of protection layers that share a sensor: common practice (IEC 61511-1, from memory)
    expect(rules['trip-shares-alarm-sensor'].meta.source).toMatch(/1910\.119\(f\)\(1\)\(iv\).*ISA-5\.1.*common practice/);
  });
  it('hold-test-beyond-criterion', () => {
    // Source: OSHA 29 CFR 1910.119(f)(1)(i) steps for each operating phase (start-up after a turnaround);
    // a leak test passes only within its stated allowed drop: common practice
    expect(rules['hold-test-beyond-criterion'].meta.source).toMatch(/1910\.119\(f\)\(1\)\(i\).*common practice/);
  });
  it('correction-causes-hazard', () => {
    // Source: OSHA 29 CFR 1910.119(f)(1)(ii)(B) steps required to correct or avoid deviation;
    // a correction must not create another hazard: common practice
    expect(rules['correction-causes-hazard'].meta.source).toMatch(/1910\.119\(f\)\(1\)\(ii\)\(B\).*common practice/);
  });
});
