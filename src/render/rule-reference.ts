// The rule reference for the site, generated from each rule's own metadata so docs and code cannot drift.
import type { RuleCategory } from '../check/define-rule.ts';
import { rules } from '../check/rules/index.ts';
import { parseNarrative } from '../parse/narrative-markdown.ts';
import { renderBodyHtml } from './body-html.ts';
import { pagePath, rootBase, siteUrl, type SiteBase } from './site-url.ts';

export interface RuleReference {
  id: string;
  url: string;
  summary: string;
  category: RuleCategory;
  defaultSeverity: string;
  /** Shown when the rule reports with a severity that follows the procedure's status. */
  severityNote?: string;
  readonly docsHtml: string;
  source?: string;
  examples?: { good: string; bad: string };
}

const categoryTitles: Record<RuleCategory, string> = {
  syntax: 'Syntax and schema',
  structure: 'Structure',
  sequence: 'Sequence logic',
  conditions: 'Conditions',
  limits: 'Limits and units',
  'document-control': 'Document control',
  safety: 'Safety content',
  writing: 'Writing',
  history: 'History',
};

const made = new Map<string, RuleReference[]>();

/**
 * Every rule's reference, made once per base. The docs are turned into HTML when a page first reads them: the list of
 * rules shows only the summaries, and a rebuild draws few rule pages, or none.
 */
export function ruleReferences(base: SiteBase = rootBase): RuleReference[] {
  const known = made.get(base);
  if (known) return known;
  const references = Object.entries(rules)
    .map(([id, rule]): RuleReference => {
      let docsHtml: string | undefined;
      return {
        id,
        url: siteUrl(base, pagePath.rule(id)),
        summary: rule.meta.summary,
        category: rule.meta.category,
        defaultSeverity: rule.meta.defaultSeverity,
        severityNote: /\*\*warning\*\* while the procedure is a `draft`/.test(rule.meta.docs) ? 'warning in draft, error from in-review on' : undefined,
        get docsHtml() {
          docsHtml ??= renderBodyHtml(parseNarrative(rule.meta.docs), 1);
          return docsHtml;
        },
        source: rule.meta.source,
        examples: rule.meta.examples,
      };
    })
    .sort((a, b) => a.id.localeCompare(b.id));
  made.set(base, references);
  return references;
}

export function rulesByCategory(base: SiteBase = rootBase): Array<{ category: RuleCategory; title: string; rules: RuleReference[] }> {
  const all = ruleReferences(base);
  return (Object.keys(categoryTitles) as RuleCategory[])
    .map((category) => ({ category, title: categoryTitles[category], rules: all.filter((r) => r.category === category) }))
    .filter((g) => g.rules.length > 0);
}
