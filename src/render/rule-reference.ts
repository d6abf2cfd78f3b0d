// The rule reference for the site, generated from each rule's own metadata so docs and code cannot drift.
import { unified } from 'unified';
import remarkParse from 'remark-parse';
import type { Root } from 'mdast';
import type { RuleCategory } from '../check/define-rule.ts';
import { rules } from '../check/rules/index.ts';
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
  docsHtml: string;
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

const parser = unified().use(remarkParse);

export function ruleReferences(base: SiteBase = rootBase): RuleReference[] {
  return Object.entries(rules)
    .map(([id, rule]) => ({
      id,
      url: siteUrl(base, pagePath.rule(id)),
      summary: rule.meta.summary,
      category: rule.meta.category,
      defaultSeverity: rule.meta.defaultSeverity,
      severityNote: /\*\*warning\*\* while the procedure is a `draft`/.test(rule.meta.docs) ? 'warning in draft, error from in-review on' : undefined,
      docsHtml: renderBodyHtml(parser.parse(rule.meta.docs) as Root, 1),
      source: rule.meta.source,
      examples: rule.meta.examples,
    }))
    .sort((a, b) => a.id.localeCompare(b.id));
}

export function rulesByCategory(base: SiteBase = rootBase): Array<{ category: RuleCategory; title: string; rules: RuleReference[] }> {
  const all = ruleReferences(base);
  return (Object.keys(categoryTitles) as RuleCategory[])
    .map((category) => ({ category, title: categoryTitles[category], rules: all.filter((r) => r.category === category) }))
    .filter((g) => g.rules.length > 0);
}
