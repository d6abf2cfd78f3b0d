// The source fingerprint on procedure pages: SHA-256 of the text as read, and the path inside the procedures folder.
import fc from 'fast-check';
import { describe, expect, it } from 'vitest';
import { sourceDigest, sourceKey } from '../../src/render/source-integrity.ts';

describe('sourceDigest', () => {
  it('is the SHA-256 of the UTF-8 text', () => {
    // Source: NIST FIPS 180-2, Appendix B.1 (SHA-256 of the one-block message "abc").
    expect(sourceDigest('abc')).toBe('ba7816bf8f01cfea414140de5dae2223b00361a396177a9cb410ff61f20015ad');
  });

  it('ignores a byte-order mark, which the file reader drops too', () => {
    fc.assert(fc.property(fc.string(), (text) => {
      expect(sourceDigest('\uFEFF' + text)).toBe(sourceDigest(text));
    }));
  });

  it('changes with any one-character change of the text', () => {
    fc.assert(fc.property(fc.string({ minLength: 1 }), fc.nat(), fc.string({ minLength: 1, maxLength: 1 }), (text, at, ch) => {
      const i = at % text.length;
      fc.pre(text[i] !== ch && !text.startsWith('\uFEFF') && !(i === 0 && ch === '\uFEFF'));
      const changed = text.slice(0, i) + ch + text.slice(i + 1);
      expect(sourceDigest(changed)).not.toBe(sourceDigest(text));
    }));
  });
});

describe('sourceKey', () => {
  it('names a file by its path inside the procedures folder, with forward slashes', () => {
    expect(sourceKey('procedures/k-210/u2-a.md', 'procedures')).toBe('k-210/u2-a.md');
    expect(sourceKey('./procedures/k-210/u2-a.md', 'procedures/')).toBe('k-210/u2-a.md');
    expect(sourceKey('procedures\\k-210\\u2-a.md', 'procedures')).toBe('k-210/u2-a.md');
    expect(sourceKey('k-210/u2-a.md', '')).toBe('k-210/u2-a.md');
    // A file outside the folder keeps its own path rather than a misleading one.
    expect(sourceKey('other/u2-a.md', 'procedures')).toBe('other/u2-a.md');
  });
});
