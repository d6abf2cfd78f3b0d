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

/** The mdast tree of a narrative (or of a rule's docs), with positions counted from the start of `markdown`. */
export function parseNarrative(markdown: string): Root {
  return narrativeParser.parse(markdown) as Root;
}
