// The one markdown reader of the narrative: CommonMark with GitHub's additions (tables, strikethrough, task lists,
// footnotes, bare web addresses). The check and the manual read every body with it, so the rules judge the very tree
// that is published.
import { unified } from 'unified';
import remarkParse from 'remark-parse';
import { gfm } from 'micromark-extension-gfm';
import { gfmFromMarkdown } from 'mdast-util-gfm';
import type { Root } from 'mdast';

/** One frozen processor for every body: building it costs as much as parsing a short body. */
const narrativeParser = unified()
  .use(remarkParse)
  .data('micromarkExtensions', [gfm()])
  .data('fromMarkdownExtensions', [gfmFromMarkdown()])
  .freeze();

/** CommonMark alone, for a body in which none of GitHub's additions can start. */
const commonMarkParser = unified().use(remarkParse).freeze();

/**
 * A character sequence every one of GitHub's additions needs: a table its `|` or, for a table of one column, a
 * delimiter row with a colon (`:--`, `--:`), strikethrough its `~`, a footnote `[^`, a task list item `[ ]` or `[x]`,
 * a bare address `www.`, `://` or (e-mail, mailto:, xmpp:) `@`. A body with none of them parses to the same tree
 * without the additions, at about half the cost (tests hold the two equal, on generated bodies and on every text of
 * up to seven characters from the characters these start with).
 */
const additionStart = /[|~@]|\[\^|\[[\sxX]\]|www\.|:\/\/|:-|-:/i;

/** Whether one of GitHub's additions may start in `markdown`; when not, it is read as CommonMark alone. */
export function mayHoldAdditions(markdown: string): boolean {
  return additionStart.test(markdown);
}

/** The mdast tree of a narrative (or of a rule's docs), with positions counted from the start of `markdown`. */
export function parseNarrative(markdown: string): Root {
  return (mayHoldAdditions(markdown) ? narrativeParser : commonMarkParser).parse(markdown) as Root;
}

/** The tree with GitHub's additions always on (for tests that hold parseNarrative to it). */
export function parseNarrativeInFull(markdown: string): Root {
  return narrativeParser.parse(markdown) as Root;
}
