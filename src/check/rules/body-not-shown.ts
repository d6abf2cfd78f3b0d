// Reports what the narrative says that the published page will not show: raw HTML, addresses the page removes, and
// link definitions and footnotes nothing refers to. The list comes from the tree the page is made from (analysis/body-losses.ts).
import { bodyLosses, type BodyLoss } from '../../analysis/body-losses.ts';
import { bodySchema } from '../../analysis/body-kept.ts';
import { defineFileRule, type FileContext } from '../define-rule.ts';

const mayLoseText = /[<[]|xmpp:/i;

const linkProtocols = (bodySchema.protocols?.href ?? []).join(', ');
const imageProtocols = (bodySchema.protocols?.src ?? []).join(', ');

export default defineFileRule(
  {
    id: 'body-not-shown',
    summary: 'Part of the narrative will not be shown on the published page.',
    category: 'syntax',
    defaultSeverity: 'warning',
    docs: `The narrative below the front-matter is published as the procedure's purpose, scope and notes. The manual
shows what markdown writes (headings, paragraphs, lists, tables, links, images, code, ~~struck~~ text, task lists,
footnotes) and leaves out anything that could run or restyle the page. This rule reports each place where text the
author wrote would silently not reach the reader, at the line and column where it is written:

- **Raw HTML**, as a block (\`<table>\`, \`<details>\`, \`<div>\` ... up to the next blank line) or inline
  (\`<br>\`, \`<span title="...">\`, \`<a href="...">\`): the page shows no raw HTML at all, and with a block
  everything written in it goes too. Write a markdown table (a header row \`| Valve | Position |\`, the line
  \`| --- | --- |\`, then one row per line), a list, or a heading with the text under it (\`## Emergency contacts\`:
  the page folds nothing away). An HTML comment (\`<!-- ... -->\`) is a note for authors and is not reported,
  unless it is never closed: then it hides everything after it.
- **An address the page removes**: links keep only ${linkProtocols} addresses and addresses within the manual;
  images keep only ${imageProtocols} and files of the manual (an image from another host becomes a link). A
  \`file:\` link to a network share, for example, is shown as its text alone. Write the address out as text, or
  link to a copy the manual can reach.
- **A link definition** (\`[label]: address\`) that no link uses, or that repeats an earlier label (the first is
  used): its address is shown nowhere.
- **A footnote** (\`[^label]: text\`) that nothing shown refers to, or that repeats an earlier label: its text is
  shown nowhere. Put \`[^label]\` in the text where it applies.

The list is made by the same steps that make the page, so what this rule does not report is on the page.`,
    examples: {
      bad: '<details><summary>Emergency contacts</summary>Control room: extension 5555</details>',
      good: '## Emergency contacts\n\nControl room: [extension 5555](tel:5555)',
    },
  },
  (ctx) => {
    // Every loss starts at a '<' (HTML, an address in angle brackets) or a '[' (a link, an image, a definition, a
    // footnote), or is a bare xmpp: address (the only bare address the page does not keep): a body with none of them
    // loses nothing, and its tree is not even read.
    if (!mayLoseText.test(ctx.source.bodyText)) return;
    for (const loss of bodyLosses(ctx.source.body)) report(ctx, loss);
  },
);

/** A short, one-line quotation of what was written. */
function quote(text: string, max = 60): string {
  const line = text.replace(/\s+/g, ' ').trim();
  return line.length > max ? `${line.slice(0, max - 1)}…` : line;
}

function report(ctx: FileContext, loss: BodyLoss): void {
  const range = loss.at;
  switch (loss.kind) {
    case 'html': {
      const { message, hint } = htmlWords(loss.html);
      ctx.report({ range, message, hint });
      return;
    }
    case 'address':
      ctx.report({
        range,
        message: loss.of === 'link'
          ? `The link address '${quote(loss.url)}' will not be on the published page (links keep ${linkProtocols} addresses and addresses within the manual); only the link's text is shown.`
          : `The image address '${quote(loss.url)}' will not be on the published page (images keep ${imageProtocols} addresses and files of the manual); the image is not shown, at most its description.`,
        hint: loss.of === 'link'
          ? 'Write the address out in the text (in backticks) so the reader can use it, or link to a copy the manual can reach.'
          : 'Put the image file in the manual\'s folder and link to it by its path, or give its full https:// address.',
      });
      return;
    case 'definition':
      ctx.report({
        range,
        message: loss.firstLine === undefined
          ? `No link uses the link definition [${loss.label}], so its address '${quote(loss.url)}' will not be shown on the published page.`
          : `The link definition [${loss.label}] repeats the one on line ${loss.firstLine}; only that one is used, so this address '${quote(loss.url)}' will not be shown.`,
        hint: `Refer to it in the text as [words][${loss.label}], or write the address out in the text; remove the definition if it is not needed.`,
      });
      return;
    case 'footnote':
      ctx.report({
        range,
        message: loss.firstLine === undefined
          ? `Nothing shown refers to the footnote [^${loss.label}], so its text will not be shown on the published page.`
          : `The footnote [^${loss.label}] repeats the one on line ${loss.firstLine}; only that one is shown, so this text will not be.`,
        hint: loss.firstLine === undefined
          ? `Put [^${loss.label}] in the text where the note applies, or write the note as a paragraph.`
          : 'Give the footnote its own label, and refer to it where it applies.',
      });
      return;
  }
}

/** What to write instead of an HTML element, by its name. */
const instead: Array<[RegExp, string]> = [
  [/^(table|thead|tbody|tfoot|tr|td|th|caption|col|colgroup)$/, 'Write a markdown table: a header row such as | Valve | Position |, the line | --- | --- |, then one row per line.'],
  [/^(details|summary)$/, 'Write a heading (## Emergency contacts) with the text under it: the page shows everything and folds nothing away.'],
  [/^(ul|ol|li|dl|dt|dd)$/, 'Write a markdown list: one item per line, starting with "- " (or "1. ").'],
  [/^h[1-6]$/, 'Write a markdown heading: "## " and the title.'],
  [/^br$/, 'End the line with a backslash (\\) to break it there, or start a new paragraph or list item.'],
  [/^(b|strong|i|em|u|mark)$/, 'Write **strong** or *emphasised* text in markdown.'],
  [/^(s|del|strike)$/, 'Write ~~struck-through~~ text in markdown.'],
  [/^a$/, 'Write a markdown link: [text](address).'],
  [/^img$/, 'Write a markdown image: ![what it shows](images/file.png).'],
  [/^(abbr|acronym|dfn)$/, 'Write the meaning out in the text, in brackets after the short form.'],
  [/^(code|pre|kbd|samp|tt)$/, 'Write `code` in backticks, or a fenced code block (```).'],
  [/^(p|div|span|section|center|font|blockquote)$/, 'Write the text as plain markdown: paragraphs, "> " for a quote.'],
];

function htmlWords(html: string): { message: string; hint: string } {
  const text = html.trim();
  if (text.startsWith('<!--')) {
    return {
      message: `The HTML comment '${quote(text, 40)}' is not closed, so everything after it in its block (or in the narrative) will not be shown on the published page.`,
      hint: 'Close the comment with -->, or remove it.',
    };
  }
  const name = /^<\/?([A-Za-z][A-Za-z0-9-]*)/.exec(text)?.[1]?.toLowerCase();
  const hint = (name && instead.find(([pattern]) => pattern.test(name))?.[1]) ?? 'Write it as markdown (text, a list, a table or a heading): the manual shows no raw HTML.';
  // One tag on its own (inline HTML is written a tag at a time): the text around it is shown, the tag is not.
  const oneTag = /^<\/?[A-Za-z][^<>]*>$/.test(text);
  if (oneTag) {
    const withValues = /\s[A-Za-z_:][\w.:-]*\s*=/.test(text);
    return {
      message: `The HTML tag '${quote(text)}' will not be shown on the published page${withValues ? ', nor what is written in it' : ''}; the text around it is shown without it.`,
      hint,
    };
  }
  return {
    message: `The HTML '${quote(text)}' will not be shown on the published page, nor anything written in it: the manual leaves raw HTML out.`,
    hint,
  };
}
