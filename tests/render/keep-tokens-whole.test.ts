import { describe, expect, it } from 'vitest';
import fc from 'fast-check';
import { keepTokensWhole, keepTokensWholeInBytes } from '../../src/render/keep-tokens-whole.ts';

describe('keepTokensWhole', () => {
  it('wraps tags, document ids and dates in the body text only', () => {
    const html = '<html><head><title>U2-K210-ESD-001</title><meta content="2026-04-06"></head><body><p data-x="AI-210">Check AI-210 on 2026-04-06, see U2-K210-ESD-001.</p><svg><text>TI-210</text></svg><script>const a = "XV-2107";</script></body></html>';
    const out = keepTokensWhole(html);
    expect(out).toContain('<title>U2-K210-ESD-001</title>');
    expect(out).toContain('<p data-x="AI-210">Check <span class="nb">AI-210</span> on <span class="nb">2026-04-06</span>, see <span class="nb">U2-K210-ESD-001</span>.</p>');
    expect(out).toContain('<svg><text>TI-210</text></svg>');
    expect(out).toContain('const a = "XV-2107";');
  });
  it('copies a whole chart, nested symbols included, without touching its text', () => {
    const svg = '<svg class="c"><text>TI-210</text><g><svg class="alert-symbol"><path d="M1 2"/></svg></g><text>FV-211</text><path/></svg>';
    expect(keepTokensWhole(`<body><p>K-210</p>${svg}<p>P-211</p></body>`)).toBe(`<body><p><span class="nb">K-210</span></p>${svg}<p><span class="nb">P-211</span></p></body>`);
  });
  it('never touches an attribute value, even one holding a ">" (a condition in a data attribute)', () => {
    const html = '<body><div hidden data-plan="{&quot;until&quot;:&quot;TI-210 >= 250 degC&quot;, &quot;d&quot;: &quot;2026-01-02&quot;}">K-210</div><p title=\'a > XV-1\'>XV-2</p></body>';
    expect(keepTokensWhole(html)).toBe('<body><div hidden data-plan="{&quot;until&quot;:&quot;TI-210 >= 250 degC&quot;, &quot;d&quot;: &quot;2026-01-02&quot;}"><span class="nb">K-210</span></div><p title=\'a > XV-1\'><span class="nb">XV-2</span></p></body>');
  });
  it('leaves words with hyphens and lower-case ids alone', () => {
    expect(keepTokensWhole('<body>heat-up and agitator-on, ARC-U and K-210A</body>')).toBe('<body>heat-up and agitator-on, ARC-U and <span class="nb">K-210A</span></body>');
  });
  it('changes nothing but the added spans (property)', () => {
    fc.assert(fc.property(fc.array(fc.constantFrom('K-210', ' ', 'a-b', '<b>', '</b>', '2026-01-02', 'x', '<i title="P-1">', '-', '<br/>', '<svg><text>XV-1</text></svg>', '<svg><svg>Q-1</svg>T-2</svg>'), { maxLength: 30 }), (parts) => {
      const html = `<body>${parts.join('')}</body>`;
      expect(keepTokensWhole(html).replace(/<span class="nb">|<\/span>/g, '')).toBe(html);
    }));
  });
  it('gives on a page\'s bytes exactly the bytes of wrapping the decoded page (property)', () => {
    // Characters of one, two, three and four bytes in UTF-8 beside the tokens, the tags and the whitespace that
    // closes a tag, Unicode spaces included (U+00A0 is also the last byte of "à" in UTF-8).
    const piece = fc.constantFrom('K-210', ' ', 'é', 'à', '\u00a0', '—', '≥', '°C', '𝜇', '\u2028', 'ÄB-1', 'TI-2101·', '<p>', '</p>',
      '<script>x = "XV-1";</script\u00a0>', '</script >', '<style>a{}</style>', '<svg><text>Q-1 —</text></svg>', '2026-01-02', '<!-- P-1 -->', '<b title="à > K-1">', 'x');
    fc.assert(fc.property(fc.array(piece, { maxLength: 40 }), (parts) => {
      const html = `<html><head><title>T-1 —</title></head><body>${parts.join('')}</body></html>`;
      const bytes = Buffer.from(html, 'utf8');
      expect(keepTokensWholeInBytes(bytes).equals(Buffer.from(keepTokensWhole(html), 'utf8'))).toBe(true);
    }), { numRuns: 500 });
  });
  it('hands back the very same bytes when there is nothing to wrap', () => {
    const page = Buffer.from('<body><p>Nothing here — at 25 °C.</p></body>', 'utf8');
    expect(keepTokensWholeInBytes(page)).toBe(page);
  });
});
