// The body-not-shown rule and the published page agree: what the rule says nothing about is on the page, and what
// the page leaves out is reported, where it is written.
import { describe, expect, it } from 'vitest';
import fc from 'fast-check';
import { checkSources } from '../../src/check/run-checks.ts';
import { rules } from '../../src/check/rules/index.ts';
import type { Diagnostic } from '../../src/parse/diagnostic.ts';
import { parseNarrative } from '../../src/parse/narrative-markdown.ts';
import { readSource } from '../../src/parse/read-source.ts';
import { renderBodyHtml } from '../../src/render/body-html.ts';
import { bodyLosses } from '../../src/analysis/body-losses.ts';

// jsdom ships no type declarations; type the one constructor used here.
const { JSDOM } = (await import('jsdom' as string)) as { JSDOM: new (html: string) => { window: Window & typeof globalThis } };
const { document } = new JSDOM('<!doctype html><body></body>').window;

const frontMatter = `---
id: U2-BNS-TEST-001
title: Line up feed pump P-902 to tank T-902
kind: normal
revision: 0
status: draft
steps:
  - step: open
    do: Open valve XV-902
---
`;

function check(body: string): { text: string; reports: Diagnostic[]; page: string } {
  const text = frontMatter + body;
  const result = checkSources([{ file: 'u2.md', text }], { today: '2026-12-01' });
  return { text, reports: result.diagnostics.filter((d) => d.rule === 'body-not-shown'), page: renderBodyHtml(readSource('u2.md', text).body) };
}

/** Everything a reader gets from the page: its text, and the addresses, descriptions and names of its elements. */
function pageContent(html: string): string {
  const page = document.createElement('div');
  page.innerHTML = html;
  const values: string[] = [page.textContent ?? ''];
  for (const el of page.querySelectorAll('*')) {
    for (const name of ['href', 'src', 'alt', 'title', 'aria-label']) {
      const value = el.getAttribute(name);
      if (value) values.push(value);
    }
  }
  return values.join('\n');
}

/** 1-based line and column of an offset. */
function placeOf(text: string, offset: number): { line: number; column: number } {
  const before = text.slice(0, offset).split('\n');
  return { line: before.length, column: before[before.length - 1].length + 1 };
}

/** Whether [offset, offset + length) lies within a report's range (its end column is just past the last character). */
function within(text: string, offset: number, length: number, d: Diagnostic): boolean {
  const s = placeOf(text, offset);
  const e = placeOf(text, offset + length);
  const afterStart = s.line > d.line || (s.line === d.line && s.column >= d.column);
  const beforeEnd = e.line < (d.endLine ?? d.line) || (e.line === (d.endLine ?? d.line) && e.column <= (d.endColumn ?? d.column));
  return afterStart && beforeEnd;
}

describe('body-not-shown on written bodies', () => {
  const cases: Array<{ name: string; body: string; lines: number[] }> = [
    { name: 'a GFM table', body: '| Valve | Position |\n| --- | --- |\n| XV-902 | LOCKED OPEN |\n', lines: [] },
    { name: 'an HTML table', body: '<table>\n<tr><td>XV-902</td><td>LOCKED OPEN</td></tr>\n</table>\n', lines: [11] },
    { name: 'folded emergency contacts', body: '<details><summary>Emergency contacts</summary>Call 5555</details>\n', lines: [11] },
    { name: 'an inline tag holding a value', body: 'Valve <span title="car-sealed open">XV-902</span> stays open.\n', lines: [11, 11] },
    { name: 'an author\'s comment', body: 'Text.\n\n<!-- reviewed with operations, 2026-11 -->\n', lines: [] },
    { name: 'a comment never closed', body: 'Text.\n\n<!-- draft\n\n## Notes\n\nKeep clear.\n', lines: [13] },
    { name: 'a used link definition', body: 'See [the plan][erp].\n\n[erp]: https://intranet.alder-reach.example/erp\n', lines: [] },
    { name: 'an unused link definition', body: 'See the plan.\n\n[erp]: https://intranet.alder-reach.example/erp\n', lines: [13] },
    { name: 'a repeated link definition', body: 'See [the plan][erp].\n\n[erp]: https://a.alder-reach.example/\n[erp]: https://b.alder-reach.example/\n', lines: [14] },
    { name: 'a used footnote', body: 'Call the control room[^radio].\n\n[^radio]: Channel 4.\n', lines: [] },
    { name: 'an unused footnote', body: 'Call the control room.\n\n[^radio]: Channel 4.\n', lines: [13] },
    { name: 'a footnote used only by an unused one', body: 'Text.\n\n[^a]: See[^b].\n\n[^b]: Channel 4.\n', lines: [13, 15] },
    { name: 'a file link and a tel link', body: '[Share](file://srv-u2/sops/) or [call 5555](tel:5555).\n', lines: [11] },
    { name: 'a reference to an address the page removes', body: 'See [the share][s].\n\n[s]: file://srv-u2/sops/\n', lines: [13] },
  ];
  for (const c of cases) {
    it(`${c.name}: reported on lines [${c.lines.join(', ')}]`, () => {
      const { reports } = check(c.body);
      expect(reports.map((d) => d.line)).toEqual(c.lines);
      for (const d of reports) expect(d.severity).toBe('warning');
    });
  }

  it('reports the column where the HTML starts, and says what to write instead', () => {
    const { reports } = check('Keep it <b>closed</b>.\n\n<details><summary>Emergency contacts</summary>Call 5555</details>\n');
    expect(reports.map((d) => [d.line, d.column])).toEqual([[11, 9], [11, 18], [13, 1]]);
    expect(reports[2].message).toContain('<details><summary>Emergency contacts</summary>');
    expect(reports[2].hint).toMatch(/heading/);
    expect(check('<table><tr><td>XV-902</td></tr></table>\n').reports[0].hint).toMatch(/\| --- \| --- \|/);
  });

  it('finds nothing to report in any rule\'s own docs, which the site renders the same way', () => {
    for (const [id, rule] of Object.entries(rules)) expect(bodyLosses(parseNarrative(rule.meta.docs)), id).toEqual([]);
  });
});

// Bodies made of markdown and HTML fragments. Each word is unique, so where it is written and whether the page shows
// it can both be told.
interface Made {
  body: string;
  /** Words written only inside closed HTML comments: hidden on purpose, and not reported. */
  hidden: string[];
  words: string[];
}

const piece = fc.constantFrom(
  'word', '**word**', '~~word~~', '`word`', '<b>word</b>', '<span title="word">word</span>', '<br>', '<!-- hidden -->',
  '[word](https://alder-reach.example/word)', '[word](tel:5555word)', '[word](file://srv/word)', '[word](javascript:word)',
  '![word](images/word.png)', '![word](https://alder-reach.example/word.png)', '![word](ftp://srv/word.png)',
  '[word][d1]', '[word][d2]', 'word[^f1]', 'word[^f2]', '<![CDATA[word]]>', '<?php word ?>',
);
const block = fc.oneof(
  fc.array(piece, { minLength: 1, maxLength: 5 }).map((ps) => ps.join(' ')),
  fc.constantFrom(
    '<details><summary>word</summary>word</details>', '<table><tr><td>word</td></tr></table>', '<div>\nword\n</div>', '<div>',
    '</div>', '<!-- hidden -->', '<!-- hidden --> word', '<!-- hidden\nhidden -->', '<!-- word', '| word | word |\n| --- | --- |\n| word | <b>word</b> |',
    '- word\n- [ ] word\n- [x] <i>word</i>', '> word <kbd>word</kbd>', '## word', '[d1]: https://alder-reach.example/word',
    '[d2]: file://srv/word', '[d1]: https://alder-reach.example/word', '[^f1]: word', '[^f2]: word[^f3]', '[^f3]: word', '[^f1]: word',
    '```\n<b>word</b>\n```', '    <i>word</i>',
    // Bare addresses: the page links them, and removes one it does not keep.
    'Call xmpp:word@alder-reach.example', 'See www.alder-reach.example/word', 'Mail word@alder-reach.example',
  ),
);
const bodies = fc.tuple(fc.array(block, { minLength: 1, maxLength: 8 }), fc.array(fc.constantFrom('\n', '\n\n'), { minLength: 8, maxLength: 8 })).map(([blocks, gaps]): Made => {
  let n = 0;
  const words: string[] = [];
  const hidden: string[] = [];
  const text = blocks.map((b, i) => b + gaps[i]).join('');
  const body = text.replace(/\bword\b|\bhidden\b/g, (m) => {
    const w = `q${n++}z${m === 'hidden' ? 'h' : 'w'}`;
    (m === 'hidden' ? hidden : words).push(w);
    return w;
  });
  return { body, words, hidden };
});

/**
 * Where the generated body has closed HTML comments: from each `<!--` to the next `-->` (the bodies put no comment
 * marks in code). Source: CommonMark Spec 0.31.2, section 6.6 Raw HTML (an HTML comment).
 */
function closedComments(body: string): Array<[number, number]> {
  const spans: Array<[number, number]> = [];
  for (let from = body.indexOf('<!--'); from >= 0; from = body.indexOf('<!--', from + 4)) {
    const end = body.indexOf('-->', from + 4);
    if (end < 0) break;
    spans.push([from, end + 3]);
    from = end - 1;
  }
  return spans;
}

describe('body-not-shown and the published page agree', () => {
  it('on generated bodies with HTML fragments: unreported text is on the page, and reported text is not', () => {
    fc.assert(
      fc.property(bodies, ({ body, words }) => {
        const { text, reports, page } = check(body);
        const shown = pageContent(page);
        const reportsOf = (word: string) => {
          const at = text.indexOf(word);
          return reports.filter((d) => within(text, at, word.length, d));
        };
        const commented = closedComments(body);
        for (const word of words) {
          // What the page leaves out is always reported, where it is written; only a closed comment (an author's note)
          // is left out without a word.
          const at = body.indexOf(word);
          if (commented.some(([from, to]) => at >= from && at < to)) continue;
          if (!shown.includes(word)) expect(reportsOf(word).length, `${word} is not on the page but not reported:\n${body}`).toBeGreaterThan(0);
        }
        for (const d of reports) {
          // And what is reported is left out: every word written inside reported HTML, a footnote or a definition,
          // and the address of a link or an image.
          const inside = words.filter((w) => within(text, text.indexOf(w), w.length, d));
          const address = /^The (?:link|image) address '([^']*)'/.exec(d.message)?.[1];
          const lost = address === undefined ? inside : inside.filter((w) => address.includes(w));
          for (const w of lost) expect(shown.includes(w), `${w} is reported (${d.message}) but on the page:\n${body}`).toBe(false);
        }
      }),
      { numRuns: Number(process.env.STEPWRIGHT_PROPERTY_RUNS ?? 300) },
    );
  });
});
