import { describe, expect, it } from 'vitest';
import { revisionBanner } from '../../src/render/revision-banner.ts';

const current = { id: 'U2-T230-CIP-001', revision: 5, status: 'effective', url: '/procedures/u2-t230-cip-001/', owner: 'Unit 2 Operations, Blending' };

describe('banner over a committed revision page', () => {
  it('says a newer revision replaces an earlier one, names it and links to the current page', () => {
    const banner = revisionBanner({
      entry: { revision: 3, status: 'effective', superseded: true },
      revisions: [{ revision: 3, status: 'effective' }, { revision: 4, status: 'effective' }, { revision: 5, status: 'effective' }],
      current,
    });
    expect(banner.tone).toBe('stop');
    expect(banner.title).toBe('SUPERSEDED — REVISION 3 — DO NOT USE');
    expect(banner.text).toContain('revision 4, took effect and replaces this one');
    expect(banner.link).toEqual({ href: '/procedures/u2-t230-cip-001/', text: 'Go to the current U2-T230-CIP-001' });
  });

  it('does not invent a newer revision for the last revision, marked superseded by another document', () => {
    const banner = revisionBanner({
      entry: { revision: 5, status: 'superseded', superseded: true },
      revisions: [{ revision: 4, status: 'effective' }, { revision: 5, status: 'superseded' }],
      current: { ...current, status: 'superseded' },
    });
    expect(banner.tone).toBe('stop');
    expect(banner.title).toBe('SUPERSEDED — REVISION 5 — DO NOT USE');
    expect(banner.text).toContain('This revision is superseded and must not be used.');
    expect(banner.text).not.toMatch(/earlier revision|newer revision|current revision/i);
    expect(banner.text).toContain('does not record which document replaces it');
    expect(banner.link.text).toBe('Go to the page of U2-T230-CIP-001');
  });

  it('for an earlier revision of a procedure now superseded, says both what replaced it and that the procedure is out of use', () => {
    const banner = revisionBanner({
      entry: { revision: 4, status: 'effective', superseded: true },
      revisions: [{ revision: 4, status: 'effective' }, { revision: 5, status: 'superseded' }],
      current: { ...current, status: 'superseded' },
    });
    expect(banner.text).toContain('revision 5, took effect and replaces this one');
    expect(banner.text).toContain('The procedure itself is now superseded');
    expect(banner.link.text).toBe('Go to the page of U2-T230-CIP-001');
  });

  it('calls a retired last revision retired, not superseded', () => {
    const banner = revisionBanner({
      entry: { revision: 2, status: 'retired', superseded: true },
      revisions: [{ revision: 1, status: 'effective' }, { revision: 2, status: 'retired' }],
      current: { ...current, revision: 2, status: 'retired' },
    });
    expect(banner.title).toBe('RETIRED — REVISION 2 — DO NOT USE');
    expect(banner.text).not.toMatch(/newer revision|replace/i);
  });

  it('keeps an earlier revision in force while the newer one has not taken effect', () => {
    const banner = revisionBanner({
      entry: { revision: 4, status: 'effective', superseded: false },
      revisions: [{ revision: 4, status: 'effective' }, { revision: 5, status: 'in-review' }],
      current: { ...current, status: 'in-review' },
    });
    expect(banner.tone).toBe('hold');
    expect(banner.title).toBe('RECORD COPY OF REVISION 4, STILL IN FORCE');
    expect(banner.link.text).toBe('See revision 5');
  });

  it('a record copy of the current revision sends the reader to the procedure page', () => {
    const banner = revisionBanner({ entry: { revision: 5, status: 'effective', superseded: false }, revisions: [{ revision: 5, status: 'effective' }], current });
    expect(banner.title).toBe('RECORD COPY OF REVISION 5');
    expect(banner.tone).toBe('hold');
  });
});
