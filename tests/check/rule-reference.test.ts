// Every safety and writing rule cites a published source and shows a bad and a good example on the site.
import { describe, expect, it } from 'vitest';
import { ruleReferences, rulesByCategory } from '../../src/render/rule-reference.ts';
import { rules } from '../../src/check/rules/index.ts';

describe('rule reference', () => {
  const refs = ruleReferences();
  it('has a page per rule, in id order', () => {
    expect(refs.map((r) => r.id)).toEqual(Object.keys(rules).sort());
    expect(rulesByCategory().flatMap((g) => g.rules).length).toBe(refs.length);
  });

  it('safety and writing rules cite their source and carry examples', () => {
    const cited = ['required-content-missing', 'limit-incomplete', 'ppe-missing', 'safety-message-incomplete', 'notice-for-injury',
      'caution-for-serious-injury', 'caution-holds-action', 'step-starts-with-verb', 'one-action-per-step', 'note-holds-action',
      'sentence-too-long', 'number-without-unit', 'vague-term', 'mixed-and-or'];
    for (const r of refs.filter((x) => cited.includes(x.id))) {
      expect(r.source, r.id).toMatch(/OSHA|ANSI|DOE-STD-1029|HSG48|ASD-STE100/);
      expect(r.examples?.bad, r.id).toBeTruthy();
      expect(r.examples?.good, r.id).toBeTruthy();
      expect(r.examples?.good).not.toBe(r.examples?.bad);
    }
  });

  it('renders docs to safe HTML', () => {
    const page = refs.find((r) => r.id === 'required-content-missing')!;
    expect(page.docsHtml).toContain('<li>');
    expect(page.severityNote).toBe('warning in draft, error from in-review on');
    expect(refs.every((r) => !/<script/i.test(r.docsHtml))).toBe(true);
  });
});
