// Validates front-matter data against the procedure schema and flattens the result into plain issues.
import type { z } from 'zod';
import type { PathKey } from '../parse/read-source.ts';
import { emptyBranchMessage, emptyParallelMessage, procedureSchema } from './schema.ts';

export type SchemaIssueCode = 'unknown-key' | 'missing-key' | 'bad-format' | 'bad-type' | 'bad-value';

export interface SchemaIssue {
  code: SchemaIssueCode;
  /** Path of the offending value (for unknown-key: of the unknown key itself). */
  path: PathKey[];
  message: string;
  /** For unknown-key and missing-key: the keys the mapping may hold. */
  knownKeys?: string[];
  /** For missing-key: the values the missing key takes, when it takes one of a set. */
  values?: string[];
  /** What to do, when the problem has a hint of its own. */
  hint?: string;
}

type RawIssue = z.core.$ZodIssue;

/** Whether front-matter data is a mapping of keys: the only data the schema checks and a procedure is built from. */
export function holdsKeys(data: unknown): data is Record<string, unknown> {
  return data !== null && typeof data === 'object' && !Array.isArray(data);
}

export function validateFrontMatter(data: unknown): SchemaIssue[] {
  const result = procedureSchema.safeParse(data);
  if (result.success) return [];
  const out: SchemaIssue[] = [];
  for (const issue of result.error.issues) flatten(issue, [], data, out);
  return dedupe(out);
}

function flatten(issue: RawIssue, base: PathKey[], root: unknown, out: SchemaIssue[]): void {
  const path = [...base, ...(issue.path as PathKey[])];
  const input = valueAt(root, path);
  const name = nameOf(path);
  switch (issue.code) {
    case 'unrecognized_keys':
      for (const key of issue.keys) {
        out.push({ code: 'unknown-key', path: [...path, key], message: `Unknown key '${key}'.`, knownKeys: knownKeysAt(root, path) });
      }
      return;
    case 'invalid_union': {
      if (input === undefined) {
        out.push({ code: 'missing-key', path, message: `The required key ${name} is missing.` });
        return;
      }
      const alternative = chooseAlternative(issue.errors, input);
      for (const sub of issue.errors[alternative] ?? []) flatten(sub, path, root, out);
      return;
    }
    case 'invalid_type':
      if (input === undefined) {
        out.push({ code: 'missing-key', path, message: `The required key ${name} is missing.` });
      } else {
        out.push({ code: 'bad-type', path, message: setpointProblem(path, input) ?? `${name} should be ${article(issue.expected)}, not ${describe(input)}.` });
      }
      return;
    case 'invalid_format':
      out.push({ code: 'bad-format', path, message: `${name} ${issue.message}.` });
      return;
    case 'invalid_value':
      if (input === undefined) {
        // A key that takes one of a set of values and is absent: say that it is missing, and which values it takes.
        out.push({ code: 'missing-key', path, message: `The required key ${name} is missing.`, values: issue.values.map((v) => String(v)) });
        return;
      }
      out.push({ code: 'bad-value', path, message: `${name} must be one of ${issue.values.map((v) => `'${String(v)}'`).join(', ')}, not ${describe(input)}.` });
      return;
    default:
      if (issue.message === emptyParallelMessage || issue.message === emptyBranchMessage) {
        const parallel = issue.message === emptyParallelMessage;
        out.push({
          code: 'bad-value', path,
          message: `${parallel ? 'This parallel block' : `Branch ${name}`} ${issue.message}.`,
          hint: parallel
            ? "Give 'parallel' a branch for each line of work that runs at the same time, each a list of steps (branch: [- step: ...]); steps that run one after another need no parallel block."
            : 'Add the steps of this branch, or remove the branch from the parallel block.',
        });
        return;
      }
      out.push({ code: 'bad-value', path, message: `${name} ${issue.message.replace(/^Invalid input: /, '')}.` });
  }
}

/** For a sequence item, follow the alternative the author meant (by its key); otherwise the closest one. */
function chooseAlternative(errors: RawIssue[][], input: unknown): number {
  if (input !== null && typeof input === 'object' && !Array.isArray(input)) {
    if ('parallel' in input && errors.length === 3) return 1;
    if ('choose' in input && errors.length === 3) return 2;
    if (errors.length === 3 && errors.some((alt) => alt.some((e) => e.path[0] === 'parallel'))) return 0;
  }
  if (Array.isArray(input)) {
    const arrayAlternative = errors.findIndex((alt) => !alt.some((e) => e.code === 'invalid_type' && e.path.length === 0));
    if (arrayAlternative >= 0) return arrayAlternative;
  }
  let best = 0;
  for (let i = 1; i < errors.length; i++) if (errors[i].length < errors[best].length) best = i;
  return best;
}

const keysByContext: Record<string, string[]> = {
  procedure: ['id', 'title', 'kind', 'revision', 'status', 'effective', 'review-by', 'owner', 'author', 'change', 'approvals', 'equipment', 'ppe', 'signals', 'limits', 'interlocks', 'hazards', 'steps', 'conditions-requiring', 'responsible', 'uses', 'certifications', 'expires', 'modifies'],
  certification: ['name', 'role', 'date'],
  step: ['step', 'do', 'phase', 'set', 'params', 'until', 'confirm', 'expect', 'sign-off', 'note', 'call', 'waive'],
  waiver: ['rule', 'reason'],
  branch: ['when', 'otherwise', 'steps', 'goto', 'repeat'],
  approval: ['role', 'name', 'date', 'meaning'],
  signal: ['text', 'unit', 'range', 'values'],
  limit: ['low', 'high', 'consequence', 'correction'],
  interlock: ['tag', 'trips-when', 'action'],
  hazard: ['level', 'hazard', 'consequence', 'avoid', 'at'],
};

/** Registers keys added by later features so that unknown-key suggestions know them. */
export function addKnownKeys(context: keyof typeof keysByContext, keys: string[]): void {
  for (const k of keys) if (!keysByContext[context].includes(k)) keysByContext[context].push(k);
}

function knownKeysAt(root: unknown, path: PathKey[]): string[] {
  if (path.length === 0) return keysByContext.procedure;
  const parent = String(path.at(-2) ?? '');
  const value = valueAt(root, path);
  if (parent === 'approvals') return keysByContext.approval;
  if (parent === 'certifications') return keysByContext.certification;
  if (parent === 'signals') return keysByContext.signal;
  if (parent === 'limits') return keysByContext.limit;
  if (parent === 'interlocks') return keysByContext.interlock;
  if (parent === 'hazards') return keysByContext.hazard;
  if (parent === 'choose') return keysByContext.branch;
  if (parent === 'waive') return keysByContext.waiver;
  if (value && typeof value === 'object' && ('parallel' in value || 'choose' in value)) return ['parallel', 'choose'];
  return keysByContext.step;
}

export function valueAt(root: unknown, path: readonly PathKey[]): unknown {
  let current = root;
  for (const key of path) {
    if (current === null || typeof current !== 'object') return undefined;
    current = (current as Record<string, unknown>)[key as string];
  }
  return current;
}

function nameOf(path: PathKey[]): string {
  const last = path.at(-1);
  if (last === undefined) return 'The front-matter';
  if (typeof last === 'number') return `Item ${last + 1} of '${String(path.at(-2) ?? 'the list')}'`;
  return `'${last}'`;
}

/** What is wrong with a value under a step's `set`, said as a setpoint (null when the path is not one). */
function setpointProblem(path: PathKey[], input: unknown): string | null {
  const signal = path.at(-1);
  if (path.at(-2) !== 'set' || typeof signal !== 'string') return null;
  const write = 'write a quantity with its unit, such as 180 degC, or one of the values of an enumerated signal';
  if (input === null) return `The setpoint of '${signal}' is empty: ${write}.`;
  return `The setpoint of '${signal}' is ${describe(input)}: ${write}.`;
}

function describe(value: unknown): string {
  if (value === null) return 'an empty value';
  if (Array.isArray(value)) return 'a list';
  if (typeof value === 'object') return 'a mapping';
  return `${typeof value} '${String(value)}'`;
}

function article(expected: string): string {
  const words: Record<string, string> = { string: 'text', number: 'a number', array: 'a list', object: 'a mapping', record: 'a mapping', boolean: 'true or false' };
  return words[expected] ?? expected;
}

function dedupe(issues: SchemaIssue[]): SchemaIssue[] {
  const seen = new Set<string>();
  return issues.filter((i) => {
    const key = i.code === 'unknown-key' ? `${i.path.join('.')}` : `value:${i.path.join('.')}`;
    if (seen.has(key)) return false;
    seen.add(key);
    return true;
  });
}
