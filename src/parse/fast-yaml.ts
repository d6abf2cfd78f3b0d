// A quick first reading of a front-matter's data. The YAML library the check keeps positions with (`yaml`) builds a
// whole document of nodes, which is most of a large manual's reading time; `js-yaml` reads the same plain data about
// ten times faster but keeps no positions. So a front-matter is read here first, and its table of positions is made
// only when a position is asked for (nearly always for a file with a finding; never for a clean one): from js-yaml's
// reading again where that places every node as `yaml` does (quick-positions.ts), else from `yaml`'s document.
//
// The two libraries must never disagree, so this reading answers only for what both read the same way, and says
// "not here" (undefined) for everything else, which is then read by `yaml` as before:
// - any error (the errors a user sees, and where, are always `yaml`'s own), and nesting deeper than 100 levels;
// - tags, anchors, aliases, directives and explicit keys ("?"), where the two schemas and limits differ;
// - keys whose text differs between the two (a null key, a collection as a key, `__proto__`).
// Plain scalars are resolved with `yaml`'s own YAML 1.2 core schema (copied below), not with js-yaml's, which
// reads more forms as numbers (`1_000`, `0b101`).
import { FAILSAFE_SCHEMA, load, Type } from 'js-yaml';

/**
 * YAML 1.2 core schema, as `yaml` resolves plain scalars (its schema/core and schema/common modules): each form is
 * tried in `yaml`'s order. js-yaml keeps one type per tag, so the forms of a tag share one type.
 */
const coreScalars = [
  scalarType('tag:yaml.org,2002:null', [[/^(?:~|[Nn]ull|NULL)?$/, () => null]]),
  scalarType('tag:yaml.org,2002:bool', [[/^(?:[Tt]rue|TRUE|[Ff]alse|FALSE)$/, (s) => s[0] === 't' || s[0] === 'T']]),
  scalarType('tag:yaml.org,2002:int', [
    [/^0o[0-7]+$/, (s) => parseInt(s.substring(2), 8)],
    [/^[-+]?[0-9]+$/, (s) => parseInt(s, 10)],
    [/^0x[0-9a-fA-F]+$/, (s) => parseInt(s.substring(2), 16)],
  ]),
  scalarType('tag:yaml.org,2002:float', [
    [/^(?:[-+]?\.(?:inf|Inf|INF)|\.nan|\.NaN|\.NAN)$/,
      (s) => (s.slice(-3).toLowerCase() === 'nan' ? Number.NaN : s[0] === '-' ? Number.NEGATIVE_INFINITY : Number.POSITIVE_INFINITY)],
    [/^[-+]?(?:\.[0-9]+|[0-9]+(?:\.[0-9]*)?)[eE][-+]?[0-9]+$/, (s) => parseFloat(s)],
    [/^[-+]?(?:\.[0-9]+|[0-9]+\.[0-9]*)$/, (s) => parseFloat(s)],
  ]),
];

function scalarType(tag: string, forms: Array<[RegExp, (s: string) => unknown]>): Type {
  // An empty node reaches the resolver as null: the null type takes it, as `yaml` reads an empty value as null.
  const formOf = (data: string | null) => forms.find(([test]) => test.test(data ?? ''));
  return new Type(tag, {
    kind: 'scalar',
    resolve: (data: string | null) => formOf(data) !== undefined,
    construct: (data: string | null) => formOf(data)![1](data ?? ''),
  });
}

const schema = FAILSAFE_SCHEMA.extend({ implicit: coreScalars });

/**
 * A tag ("!"), an anchor ("&") or an alias ("*") where a node may start, a directive ("%" opening a line), an
 * explicit key ("?" and a space where a node may start), or a flow collection as a key ("[a, b]: c"). Matches more
 * than these (such a character after a space in running text): that only sends the front-matter to the slower reading.
 */
const notReadHere = /(?:^|[\s[\]{},])[!&*]|^%|(?:^|[\s[\]{},-])\?(?:[\s[\]{},]|$)|[\]}][ \t]*:(?:[\s[\]{},]|$)/m;

/**
 * A flow collection that may be a key inside a flow mapping ("{ a: 1, [b]: 2 }"): js-yaml and `yaml` write such keys
 * differently. Matches every collection that follows "{" or "," (also one inside a flow sequence, which is a value).
 */
const collectionAsKey = /[{,][ \t]*[[{]/;

/**
 * Forms where js-yaml reads what `yaml` refuses, or reads it otherwise (found by comparing the two on many altered
 * front-matters, tests/parse/fast-yaml.test.ts):
 * - a sequence opening on the line of its parent's item ("- - a"): js-yaml may take the next item as its own;
 * - an item whose line holds only "-" or "-" and a comment (its content below it, or none): js-yaml lets it, or the
 *   item after it, be indented as `yaml` does not;
 * - a comment straight after a quote or a bracket (`"a"#b`), which `yaml` refuses;
 * - a line opening with "---" or "..." (a document marker), a tab anywhere, a carriage return not before a line feed;
 * - a block scalar that keeps its final line breaks ("|+"): js-yaml keeps more of them when no line has content.
 */
const readOtherwise = /-[ \t]+-(?:[ \t]|$)|(?:^|[ \t])-(?:[ \t]*|[ \t]+#.*)$|["'\]}]#|^(?:---|\.\.\.)|\t|\r(?!\n)|[|>](?:[1-9]?\+|\+[1-9])(?=[ \t]|$)/m;

/** Where a quoted scalar may open: at a line's start, after an item's "- ", a ":" or a flow indicator. */
const quoteOpening = /(?:^|[-:[{,])[ \t]*(["'])/gm;

/**
 * Whether a quoted scalar runs on past the end of its line: `yaml` holds its later lines to indentation rules
 * js-yaml does not. Looks at every quote where a scalar may open (some are inside plain text: more often yes than
 * needed, never less).
 */
function quotedAcrossLines(text: string): boolean {
  quoteOpening.lastIndex = 0;
  for (let m = quoteOpening.exec(text); m; m = quoteOpening.exec(text)) {
    const quote = m[1];
    let i = m.index + m[0].length;
    for (; i < text.length; i++) {
      const c = text[i];
      if (c === '\n' || c === '\r') return true;
      if (quote === '"' && c === '\\') {
        // An escaped line break continues the scalar on the next line.
        if (text[i + 1] === '\n' || text[i + 1] === '\r') return true;
        i++;
      } else if (c === quote) {
        if (quote === "'" && text[i + 1] === "'") i++;
        else break;
      }
    }
    if (i >= text.length) return true;
    quoteOpening.lastIndex = i + 1;
  }
  return false;
}

/**
 * Whether a flow collection ("[...]" or "{...}") runs on past the end of a line: `yaml` holds its later lines to
 * indentation rules js-yaml does not. Counts brackets anywhere (in quoted text too), so it says yes more often than
 * needed, never less.
 */
function flowAcrossLines(text: string): boolean {
  let depth = 0;
  for (let i = 0; i < text.length; i++) {
    const c = text.charCodeAt(i);
    if (c === 0x5b || c === 0x7b) depth++;
    else if (c === 0x5d || c === 0x7d) depth--;
    else if (c === 0x0a) {
      if (depth > 0) return true;
      depth = 0;
    }
  }
  return depth > 0;
}

/**
 * Deeper front-matters are left to `yaml` (js-yaml stops with an error): the check's own limit of 200 levels, and its
 * message, are then `yaml`'s reading's (parse/read-source.ts).
 */
const quickDepthLimit = 100;

/** How js-yaml reads (its maxDepth option is newer than its published types). */
const loadOptions = { schema, json: false, maxDepth: quickDepthLimit };

/** Keys js-yaml and `yaml` write differently into plain data. */
const keysReadDifferently = new Set(['', '~', 'null', 'Null', 'NULL', '__proto__']);

/** Told where js-yaml starts and stops composing each node (its state then: position, kind and result). */
export type ComposeListener = (event: 'open' | 'close', state: { position: number; kind: 'scalar' | 'mapping' | 'sequence' | null; result: unknown }) => void;

/**
 * The front-matter's plain data as `yaml` would read it (`parseDocument(text, { uniqueKeys: true }).toJS()`), or
 * undefined when it is not read here (an error, or something the two libraries may read differently).
 * `{ data: null }` for an empty front-matter. `listener` is told of each node js-yaml composes (quick-positions.ts).
 */
export function quickYamlData(text: string, listener?: ComposeListener): { data: unknown } | undefined {
  if (notReadHere.test(text) || collectionAsKey.test(text) || readOtherwise.test(text) || flowAcrossLines(text) || quotedAcrossLines(text)) {
    return undefined;
  }
  let data: unknown;
  try {
    data = load(text, listener ? { ...loadOptions, listener } as typeof loadOptions : loadOptions);
  } catch {
    return undefined;
  }
  return keysAgree(data) ? { data: data ?? null } : undefined;
}

/** Whether every key of every mapping in the data is one both libraries write the same (walked without recursion). */
function keysAgree(data: unknown): boolean {
  const stack: unknown[] = [data];
  while (stack.length) {
    const value = stack.pop();
    if (Array.isArray(value)) {
      for (const item of value) if (item !== null && typeof item === 'object') stack.push(item);
    } else if (value !== null && typeof value === 'object') {
      for (const key of Object.keys(value)) {
        // A mapping used as a key reaches js-yaml's data as "[object Object]" (a written one is not read here at all).
        if (keysReadDifferently.has(key) || key.includes('[object ')) return false;
        const item = (value as Record<string, unknown>)[key];
        if (item !== null && typeof item === 'object') stack.push(item);
      }
    }
  }
  return true;
}
