// Reads stepwright.config.yaml: each rule's severity (or off), with overrides for folders or globs.
import { isMap, isScalar, isSeq, LineCounter, parseDocument, type Document } from 'yaml';
import { z } from 'zod';
import { closest } from 'fastest-levenshtein';
import picomatch from 'picomatch';
import type { Diagnostic, Severity } from '../parse/diagnostic.ts';
import type { SeverityPolicy } from './run-checks.ts';
import { parseBase } from '../model/site-base.ts';
import { configFileName } from '../model/config-file-name.ts';

export { configFileName };

const level = z.enum(['error', 'warning', 'info', 'off']);
type Level = z.infer<typeof level>;

const configSchema = z.strictObject({
  rules: z.record(z.string(), level).optional(),
  overrides: z.array(z.strictObject({
    files: z.union([z.string().min(1), z.array(z.string().min(1)).min(1)]),
    rules: z.record(z.string(), level),
  })).optional(),
  register: z.string().min(1).optional(),
  // Read by the commands (src/cli/project.ts): the procedures folder, relative to this file.
  procedures: z.string().min(1).optional(),
  // Read by build, dev and serve (src/engine/project.ts): the path the manual is served under, e.g. /manual/.
  base: z.string().optional(),
  'document-control': z.strictObject({
    'certification-interval-months': z.number().int().min(1).max(120).optional(),
  }).optional(),
  // Read by `stepwright review` (src/history/approval-policy.ts), which reports its own problems.
  'review-policy': z.unknown().optional(),
});

export interface StepwrightConfig {
  rules: Record<string, Level>;
  overrides: Array<{ files: string[]; rules: Record<string, Level> }>;
  /** The plant register folder as written, relative to the configuration file. */
  register?: string;
  /** Longest time between two certifications of a procedure in use, in months (OSHA 1910.119(f)(3): 12). */
  certificationIntervalMonths?: number;
  /** `review-policy` as written, for `stepwright review` (history/approval-policy.ts reads and checks it). */
  reviewPolicy?: unknown;
}

export interface LoadedConfig {
  config: StepwrightConfig;
  diagnostics: Diagnostic[];
}

export const emptyConfig: StepwrightConfig = { rules: {}, overrides: [] };

/**
 * Parses the configuration text. Problems become diagnostics against the config file (rule `bad-config`, an error).
 * A file that does not fit the schema is not applied at all; an unknown rule id is reported and the rest still applies.
 */
export function parseConfig(file: string, text: string, knownRules: readonly string[]): LoadedConfig {
  const lines = new LineCounter();
  const doc = parseDocument(text, { lineCounter: lines, prettyErrors: false });
  const diagnostics: Diagnostic[] = [];
  const at = (offset: number, end = offset, message: string, hint: string) => {
    const a = lines.linePos(offset);
    const b = lines.linePos(Math.max(end, offset));
    diagnostics.push({ file, line: a.line, column: a.col, endLine: b.line, endColumn: b.col, severity: 'error', rule: 'bad-config', message, hint });
  };
  for (const e of doc.errors) at(e.pos[0], e.pos[1], `The configuration is not valid YAML: ${e.message.split('\n')[0]}`, 'Fix the YAML syntax at this place.');
  if (doc.errors.length) return { config: emptyConfig, diagnostics };

  let data: unknown;
  try {
    data = doc.toJS() ?? {};
  } catch (error) {
    // e.g. an alias before its anchor: the YAML parses but has no value.
    at(0, 0, `The configuration cannot be read: ${(error as Error).message}`, 'Fix the YAML at the place the message names.');
    return { config: emptyConfig, diagnostics };
  }
  const parsed = configSchema.safeParse(data);
  if (!parsed.success) {
    for (const issue of parsed.error.issues) {
      const path = issue.path as Array<string | number>;
      const unknown = issue.code === 'unrecognized_keys';
      const range = rangeOf(doc, unknown ? [...path, issue.keys[0]] : path, unknown);
      const what = issue.code === 'unrecognized_keys'
        ? `Unknown key '${issue.keys[0]}' in the configuration.`
        : `${path.length ? `'${path.join('.')}'` : 'The configuration'}: ${issue.message.replace(/^Invalid input: /, '')}.`;
      at(range[0], range[1], what, "The configuration holds 'procedures' (a folder), 'base' (the path the manual is served under), 'rules' ({rule-id: error|warning|info|off}), 'overrides' ([{files, rules}]), 'register' (a folder) and 'document-control' ({certification-interval-months}).");
    }
    return { config: emptyConfig, diagnostics };
  }

  const config: StepwrightConfig = {
    rules: parsed.data.rules ?? {},
    overrides: (parsed.data.overrides ?? []).map((o) => ({ files: Array.isArray(o.files) ? o.files : [o.files], rules: o.rules })),
    ...(parsed.data.register ? { register: parsed.data.register } : {}),
    ...(parsed.data['document-control']?.['certification-interval-months'] ? { certificationIntervalMonths: parsed.data['document-control']['certification-interval-months'] } : {}),
    ...(parsed.data['review-policy'] !== undefined ? { reviewPolicy: parsed.data['review-policy'] } : {}),
  };
  const checkIds = (rules: Record<string, Level>, path: Array<string | number>) => {
    for (const id of Object.keys(rules)) {
      if (knownRules.includes(id)) continue;
      const range = rangeOf(doc, [...path, id], true);
      at(range[0], range[1], `'${id}' is not a Stepwright rule.`, `Did you mean '${closest(id, [...knownRules])}'?`);
    }
  };
  if (parsed.data.base !== undefined) {
    const base = parseBase(parsed.data.base);
    if ('problem' in base) {
      const range = rangeOf(doc, ['base'], false);
      at(range[0], range[1], `'base': ${base.problem}`, "Write the path the manual is served under, such as 'base: /manual/', or leave 'base' out to serve it at the site's root.");
    }
  }
  checkIds(config.rules, ['rules']);
  config.overrides.forEach((o, i) => checkIds(o.rules, ['overrides', i, 'rules']));
  return { config, diagnostics };
}

/**
 * The severity policy checkSources takes: the last matching override wins over the top-level rules.
 * `files` patterns are relative to the folder that holds the configuration file; `locate` turns a file name as
 * the check gives it (relative to the working folder) into that form, so that the same file gets the same
 * severity from whichever folder the check runs in. Without it, names are matched as given.
 */
export function severityPolicy(config: StepwrightConfig, locate: (file: string) => string = (file) => file): SeverityPolicy {
  const overrides = config.overrides.map((o) => ({ matchers: o.files.map(fileMatcher), rules: o.rules }));
  return (rule, file) => {
    let chosen: Level | undefined = config.rules[rule];
    if (!overrides.length) return chosen as Severity | 'off' | undefined;
    const path = normalise(locate(file));
    for (const o of overrides) if (o.rules[rule] && o.matchers.some((m) => m(path))) chosen = o.rules[rule];
    return chosen as Severity | 'off' | undefined;
  };
}

/**
 * A folder prefix ("procedures/utilities" or "procedures/utilities/"), or a glob in the usual syntax
 * (`*`, `**`, `?`, `[abc]`, `{a,b}`, `!(x)`), matched against the file path relative to the folder that holds
 * the configuration file (see severityPolicy).
 */
export function fileMatcher(pattern: string): (file: string) => boolean {
  const p = normalise(pattern);
  if (!picomatch.scan(p).isGlob) {
    const folder = p.replace(/\/$/, '');
    return (file) => file === folder || file.startsWith(`${folder}/`);
  }
  const matches = picomatch(p, { dot: true });
  return (file) => matches(normalise(file));
}

function normalise(path: string): string {
  return path.replace(/\\/g, '/').replace(/^\.\//, '');
}

function rangeOf(doc: Document, path: Array<string | number>, key = false): [number, number] {
  let node: unknown = doc.contents;
  let range: [number, number] = [0, 0];
  for (const k of path) {
    if (isMap(node)) {
      const pair = node.items.find((p) => (isScalar(p.key) ? p.key.value : p.key) === k);
      if (!pair) break;
      const target = key ? pair.key : pair.value;
      const r = (target as { range?: [number, number, number] } | null)?.range ?? (pair.key as { range?: [number, number, number] }).range;
      if (r) range = [r[0], r[1]];
      node = pair.value;
    } else if (isSeq(node) && typeof k === 'number') {
      const item = node.items[k] as { range?: [number, number, number] } | undefined;
      if (!item) break;
      if (item.range) range = [item.range[0], item.range[1]];
      node = item;
    } else break;
  }
  return range;
}
