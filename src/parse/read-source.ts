// Reads a procedure file: the front-matter's data with a table of where each value is written, and an mdast tree of the body.
import { deserialize, serialize } from 'node:v8';
import { LineCounter, parseDocument, isMap, isSeq, type Document } from 'yaml';
import type { Root } from 'mdast';
import type { Diagnostic, SourceRange } from './diagnostic.ts';
import { splitFrontMatter } from './split-front-matter.ts';
import { prescanBodyNesting, prescanBodySize, prescanYamlNesting } from './nesting-prescan.ts';
import { groupDigits } from './group-digits.ts';
import { parseNarrative } from './narrative-markdown.ts';
import { quickYamlData } from './fast-yaml.ts';
import { quickPositionTable } from './quick-positions.ts';
import { locateIn, positionTable, trimTrailingSpace, type PathKey, type PositionTable } from './yaml-positions.ts';

export type { PathKey, PositionTable } from './yaml-positions.ts';

export interface ParsedSource {
  file: string;
  text: string;
  /** The YAML document, or null when the file has no front-matter (read from the text when first asked for). */
  doc: Document.Parsed | null;
  /** Plain data of the front-matter (null when it could not be read). */
  data: unknown;
  body: Root;
  bodyText: string;
  /** 1-based line where the markdown body starts. */
  bodyStartLine: number;
  /** Problems found while reading: YAML syntax, missing front-matter, too deep or too many aliases. */
  diagnostics: Diagnostic[];
  /** Where the value (or, with part 'key', the key) at a path of the front-matter is written. */
  rangeOf(path: readonly PathKey[], part?: 'key' | 'value'): SourceRange;
  /** Where characters [from, to) of the scalar string at a path are written. */
  rangeInScalar(path: readonly PathKey[], from: number, to: number): SourceRange;
  /**
   * Lets go of a YAML document read through `doc` and of the table of positions; a later `doc` or position reads the
   * same front-matter again (the same text read the same way: the same answers).
   */
  release(): void;
}

/**
 * What reading a file finds, in plain data that can be sent to another thread: no YAML document, no functions.
 * A source made from these parts (readSource's `given`) answers positions from their table.
 */
export interface SourceParts {
  data: unknown;
  body: Root;
  diagnostics: Diagnostic[];
  /** The front-matter text the YAML document is read from; null when the file has none. */
  yamlText: string | null;
  /** Where each node of the YAML document is written (null when the file has no front-matter). */
  positions: PositionTable | null;
}

const limits = { maxAliasCount: 100, maxDepth: 200 };
/** How every front-matter is read (a line counter besides changes no node's range). */
const documentOptions = { prettyErrors: false, uniqueKeys: true, strict: true } as const;

type Split = ReturnType<typeof splitFrontMatter>;
type At = (offset: number, endOffset?: number) => SourceRange;

/** The file's lines, and the range of a span of it. */
function positionsIn(text: string): { split: Split; at: At; bodyStartLine: number } {
  const split = splitFrontMatter(text);
  const fileLines = createOffsetToPosition(text);
  const at = (offset: number, endOffset = offset): SourceRange => {
    const s = fileLines(offset);
    const e = fileLines(Math.max(offset, endOffset));
    return { line: s.line, column: s.column, endLine: e.line, endColumn: e.column };
  };
  return { split, at, bodyStartLine: fileLines(split.bodyOffset).line };
}

/**
 * When the table of positions is made: 'now', as the file is read (a file the rules will check: nearly every one
 * gets a diagnostic, with a position), or 'when-asked' (a file read for its model alone, such as a file whose check
 * results come from the cache: the front-matter is read again for the table the first time a position is asked for).
 */
export type PositionsWhen = 'now' | 'when-asked';

/**
 * Reads a file; with `given` (the parts another thread read from the same text, or parts kept from an earlier run),
 * only assembles the source. `onRead` is given the parts when they were read here.
 */
export function readSource(file: string, text: string, given?: ReadParts, positions: PositionsWhen = 'when-asked', onRead?: (parts: ReadParts) => void): ParsedSource {
  const where = positionsIn(text);
  let parts = given;
  if (!parts) {
    parts = readParts(file, text, where, positions === 'now');
    onRead?.(parts);
  }
  // The document itself is let go at once: positions come from the parts' table.
  return assemble(file, text, where, parts);
}

/**
 * The parts of a file as readSource reads them, for sending to another thread: with the table of positions, except
 * for a front-matter read without a document of nodes (the table is then made when a position is first asked for).
 */
export function readSourceParts(file: string, text: string): ReadParts {
  return readParts(file, text, positionsIn(text), true);
}

/** Parts whose table of positions may be left to be made when first asked for (undefined). */
export type ReadParts = Omit<SourceParts, 'positions'> & { positions: PositionTable | null | undefined };

/**
 * The parts without their table of positions, as bytes (the structured clone that threads send each other), so
 * that they can be kept between runs: the same text read by the same code gives the same parts. The table is made
 * again from the text when a position is first asked for.
 */
export function partsToBytes(parts: ReadParts): Uint8Array {
  return serialize({ data: parts.data, body: parts.body, diagnostics: parts.diagnostics, yamlText: parts.yamlText, positions: parts.positions === null ? null : undefined });
}

/** Parts from partsToBytes, or undefined when the bytes do not hold parts of that shape. */
export function partsFromBytes(bytes: Uint8Array): ReadParts | undefined {
  let value: unknown;
  try {
    value = deserialize(bytes);
  } catch {
    return undefined;
  }
  if (!value || typeof value !== 'object' || !('data' in value)) return undefined;
  const v = value as Record<string, unknown>;
  const body = v.body as { type?: unknown; children?: unknown } | null;
  if (!body || typeof body !== 'object' || body.type !== 'root' || !Array.isArray(body.children)) return undefined;
  if (!Array.isArray(v.diagnostics) || !(v.yamlText === null || typeof v.yamlText === 'string')) return undefined;
  if (!(v.positions === undefined || (v.positions === null && v.yamlText === null))) return undefined;
  return value as ReadParts;
}

/**
 * The front-matter's data and the narrative's text, without reading the narrative's markdown or making a table of
 * positions: what the document control of a committed version and the comparison of its content need. The data is
 * the data readSource gives for the same text.
 */
export function readFrontMatter(file: string, text: string): { data: unknown; bodyText: string } {
  const where = positionsIn(text);
  return { data: readParts(file, text, where, false, false).data, bodyText: where.split.body };
}

function readParts(file: string, text: string, { split, at, bodyStartLine }: ReturnType<typeof positionsIn>, tableNow: boolean, narrative = true): ReadParts {
  const diagnostics: Diagnostic[] = [];
  let doc: Document.Parsed | null = null;
  let data: unknown = null;
  const fileLines = (offset: number) => at(offset);

  // The markdown parser slows steeply with nesting and can overflow the stack, so absurd bodies are refused first.
  const bodyProblem = narrative ? prescanBodyNesting(split.body) : null;
  const bodySize = bodyProblem || !narrative ? null : prescanBodySize(split.body);
  let body: Root = { type: 'root', children: [] };
  if (!narrative) {
    // Left unread.
  } else if (bodySize) {
    diagnostics.push({
      file, ...at(split.bodyOffset + bodySize.offset), severity: 'error', rule: 'body-too-large',
      message: `The narrative text has ${groupDigits(bodySize.found)} ${bodySize.what}; the limit is ${groupDigits(bodySize.limit)}. It was not read.`,
      hint: 'A procedure\'s narrative holds its purpose, scope and notes. Move reference material to its own document and link to it.',
    });
  } else if (bodyProblem) {
    diagnostics.push({
      file, ...at(split.bodyOffset + bodyProblem.offset), severity: 'error', rule: 'body-too-deep',
      message: `The narrative text nests quotes or lists ${bodyProblem.depth} columns deep; it was not read.`,
      hint: 'A procedure\'s narrative needs only a few levels of lists and quotes. Flatten them.',
    });
  } else {
    try {
      body = parseBody(split.body, bodyStartLine);
    } catch (error) {
      diagnostics.push({
        file, ...at(split.bodyOffset), severity: 'error', rule: 'body-too-deep',
        message: `The narrative text could not be read: ${firstLine((error as Error)?.message ?? String(error))}.`,
        hint: 'Simplify the markdown below the front-matter: fewer nested lists, quotes and emphasis marks.',
      });
    }
  }

  const misplaced = split.yaml === null ? misplacedFrontMatter(text) : null;
  if (misplaced) {
    diagnostics.push({ file, ...at(misplaced.offset), severity: 'error', rule: 'front-matter-not-mapping', message: misplaced.message, hint: misplaced.hint });
  } else if (split.yaml === null) {
    diagnostics.push({
      file, ...at(0), severity: 'error', rule: 'missing-front-matter',
      message: 'The file has no YAML front-matter, so it holds no procedure.',
      hint: 'Start the file with a line "---", the procedure keys (id, title, kind, steps, ...), and a closing "---".',
    });
  } else {
    if (split.unclosed) {
      diagnostics.push({
        file, ...at(0, 3), severity: 'error', rule: 'yaml-syntax',
        message: 'The front-matter opened with "---" is never closed.',
        hint: 'Add a line "---" after the last front-matter key, before the narrative text.',
      });
    }
    const lineCounter = new LineCounter();
    // The YAML library recurses once per level and overflows the stack on thousands of levels: refuse those first.
    const tooDeep = prescanYamlNesting(split.yaml);
    if (tooDeep) {
      diagnostics.push({
        file, ...at(split.yamlOffset + tooDeep.offset), severity: 'error', rule: 'yaml-syntax',
        message: `The front-matter nests deeper than ${limits.maxDepth} levels; it was not read.`,
        hint: 'A procedure needs only a few levels of nesting. Flatten the blocks or split the procedure.',
      });
    }
    const yamlText = tooDeep ? '' : split.yaml;
    // Most front-matters are read first without a document of nodes (fast-yaml.ts); the table of positions is then
    // made when a position is first asked for (for a file with a finding; never for a clean one). What is not read
    // so (errors, deep nesting, forms the two libraries may read differently) is read with the document.
    const quick = tooDeep ? undefined : quickYamlData(yamlText);
    if (quick) {
      data = quick.data;
    } else {
      doc = parseDocument(yamlText, { lineCounter, ...documentOptions });
      const yamlLineOffset = fileLines(split.yamlOffset).line - 1;
      // Only the first error: later ones are nearly always knock-on effects of it.
      for (const error of doc.errors.slice(0, 1)) {
        const pos = lineCounter.linePos(error.pos[0]);
        const end = lineCounter.linePos(error.pos[1]);
        diagnostics.push({
          file, line: pos.line + yamlLineOffset, column: pos.col, endLine: end.line + yamlLineOffset, endColumn: end.col,
          severity: 'error', rule: 'yaml-syntax',
          message: `The front-matter is not valid YAML: ${firstLine(error.message)}`,
          hint: yamlHint(error.code),
        });
      }
      if (doc.errors.length === 0) {
        const depth = maxDepth(doc.contents, limits.maxDepth);
        if (depth > limits.maxDepth) {
          diagnostics.push({
            file, ...at(split.yamlOffset), severity: 'error', rule: 'yaml-syntax',
            message: `The front-matter nests deeper than ${limits.maxDepth} levels; it was not read.`,
            hint: 'A procedure needs only a few levels of nesting. Flatten the blocks or split the procedure.',
          });
        } else {
          try {
            data = doc.toJS({ maxAliasCount: limits.maxAliasCount });
          } catch (error) {
            diagnostics.push({
              file, ...at(split.yamlOffset), severity: 'error', rule: 'yaml-syntax',
              message: `The front-matter could not be expanded: ${firstLine((error as Error).message)}`,
              hint: 'Avoid YAML aliases (*name) that expand to many copies; write the values out.',
            });
          }
        }
      }
    }
    // (Every error of the document is a yaml-syntax diagnostic.)
    const notMapping = data !== undefined && !diagnostics.some((d) => d.rule === 'yaml-syntax')
      ? frontMatterShapeProblem(data, split.yaml, split.body)
      : null;
    if (notMapping) diagnostics.push({ file, ...at(0, 3), severity: 'error', rule: 'front-matter-not-mapping', ...notMapping });
    return { data, body, diagnostics, yamlText, positions: tableNow && doc ? positionTable(doc) : undefined };
  }
  return { data, body, diagnostics, yamlText: null, positions: null };
}

/**
 * The source with its positions. Positions come from the table of the YAML document's nodes, which answers as the
 * document would; the document itself is not kept (it is read again from the same text if asked for).
 */
function assemble(file: string, text: string, { split, at, bodyStartLine }: ReturnType<typeof positionsIn>, parts: ReadParts): ParsedSource {
  const { data, body, diagnostics, yamlText } = parts;
  if (yamlText === null || parts.positions === null || split.yaml === null) {
    const rangeOf = (): SourceRange => at(0);
    return { file, text, doc: null, data, body, bodyText: split.body, bodyStartLine, diagnostics, rangeOf, rangeInScalar: rangeOf, release() {} };
  }
  const yaml = split.yaml;
  // Positions in the table are offsets into the YAML text; shift them into the file.
  const base = split.yamlOffset;
  let kept: Document.Parsed | null = null;
  // The same text read with the same options gives the same document, and so the same table.
  let table = parts.positions;
  // Made from js-yaml's quicker reading where it answers as `yaml`'s document would (quick-positions.ts).
  const positions = (): PositionTable => (table ??= quickPositionTable(yamlText) ?? positionTable(parseDocument(yamlText, documentOptions)));
  const rangeOf = (path: readonly PathKey[], part: 'key' | 'value' = 'value'): SourceRange => {
    const { node, key } = locateIn(positions(), path, part);
    const r = (part === 'key' && key ? key : node)?.r;
    if (!r) return at(base);
    return at(base + r[0], base + trimTrailingSpace(yaml, r[0], r[1]));
  };
  const rangeInScalar = (path: readonly PathKey[], from: number, to: number): SourceRange => {
    const { node } = locateIn(positions(), path, 'value');
    // Not a scalar, no range, or a block scalar (its characters are not where the string's are): the whole value.
    if (!node || node.t === 0 || node.t === 3 || !node.r) return rangeOf(path);
    const start = base + node.r[0] + (node.t === 2 ? 1 : 0);
    return at(start + from, start + to);
  };
  return {
    file, text, data, body, bodyText: split.body, bodyStartLine, diagnostics, rangeOf, rangeInScalar,
    // The same text read with the same options gives the same document.
    get doc() { return (kept ??= parseDocument(yamlText, documentOptions)); },
    release() {
      kept = null;
      table = undefined;
    },
  };
}

function parseBody(markdown: string, startLine: number): Root {
  const tree = parseNarrative(markdown);
  // Shift body positions so they point into the whole file.
  const shift = startLine - 1;
  if (shift > 0) {
    const visit = (node: { position?: { start: { line: number }; end: { line: number } }; children?: unknown[] }) => {
      if (node.position) {
        node.position.start.line += shift;
        node.position.end.line += shift;
      }
      for (const child of node.children ?? []) visit(child as typeof node);
    };
    visit(tree as unknown as Parameters<typeof visit>[0]);
  }
  return tree;
}

function createOffsetToPosition(text: string) {
  const starts = [0];
  for (let i = 0; i < text.length; i++) if (text.charCodeAt(i) === 10) starts.push(i + 1);
  return (offset: number) => {
    const o = Math.max(0, Math.min(offset, text.length));
    let lo = 0;
    let hi = starts.length - 1;
    while (lo < hi) {
      const mid = (lo + hi + 1) >> 1;
      if (starts[mid] <= o) lo = mid;
      else hi = mid - 1;
    }
    return { line: lo + 1, column: o - starts[lo] + 1 };
  };
}

function maxDepth(node: unknown, limit: number): number {
  // Iterative so that absurdly deep input cannot overflow the stack.
  let deepest = 0;
  const stack: Array<[unknown, number]> = [[node, 1]];
  while (stack.length > 0) {
    const [current, depth] = stack.pop()!;
    if (depth > deepest) deepest = depth;
    if (deepest > limit) return deepest;
    if (isMap(current)) for (const pair of current.items) stack.push([pair.value, depth + 1]);
    else if (isSeq(current)) for (const item of current.items) stack.push([item, depth + 1]);
  }
  return deepest;
}

/**
 * A file without front-matter on its first line that still looks like a procedure: the "---" fence comes
 * after blank lines, or procedure keys (id:, steps: ...) are written without the opening fence. Such a file
 * must be an error, never taken for a plain note.
 */
function misplacedFrontMatter(text: string): { offset: number; message: string; hint: string } | null {
  const head = text.slice(0, 4000);
  const late = /^(?:[ \t]*\r?\n)+---[ \t]*\r?$/m.exec(head);
  if (late && late.index === 0) {
    const line = head.slice(0, late.index + late[0].length).split('\n').length;
    return {
      offset: late[0].lastIndexOf('---'),
      message: `The front-matter starts on line ${line}, not on the first line, so it is not read and the file holds no procedure.`,
      hint: 'Remove the blank lines above the first "---": it must be the very first line of the file.',
    };
  }
  const keys = head.match(/^(?:id|title|kind|revision|status|steps):[ \t]/gm) ?? [];
  if (keys.length >= 2 && /^---[ \t]*\r?$/m.test(head)) {
    return {
      offset: 0,
      message: `The file holds procedure keys (${[...new Set(keys.map((k) => k.trim()))].join(' ')}) but does not start with a "---" line, so they are not read and the file holds no procedure.`,
      hint: 'Add a line "---" as the first line of the file, above the keys.',
    };
  }
  return null;
}

/**
 * Front-matter that parses but holds no mapping of procedure keys: empty, a list or a single value. Such a
 * file looks like a procedure and must never be dropped in silence.
 */
function frontMatterShapeProblem(data: unknown, yaml: string, body: string): { message: string; hint: string } | null {
  if (data !== null && typeof data === 'object' && !Array.isArray(data)) return null;
  const keysBelow = /^[A-Za-z][\w-]*:(\s|$)/m.test(body.split(/^(?:---|\.\.\.)[ \t]*\r?$/m)[0] ?? '') && /^---[ \t]*\r?$/m.test(body);
  if (data === null && yaml.trim() === '' && keysBelow) {
    return {
      message: 'The front-matter is empty: the second line "---" closes it at once, so the procedure keys below are read as narrative text.',
      hint: 'Remove the extra "---" line at the top; the file starts with one "---", then the keys, then one closing "---".',
    };
  }
  if (data === null) {
    return {
      message: 'The front-matter between the "---" lines is empty, so the file holds no procedure.',
      hint: 'Write the procedure keys (id, title, kind, revision, status, steps, ...) between the two "---" lines.',
    };
  }
  const shape = Array.isArray(data) ? 'a list' : `a single value (${typeof data})`;
  return {
    message: `The front-matter is ${shape}, not a mapping of procedure keys, so the file holds no procedure.`,
    hint: 'Write one key per line, "key: value" (id: ..., title: ..., steps: ...), without a leading "- ".',
  };
}

function firstLine(message: string): string {
  return message.split('\n')[0].trim();
}

function yamlHint(code: string): string {
  switch (code) {
    case 'DUPLICATE_KEY':
      return 'Each key may appear once in a mapping; remove or rename the repeated key.';
    case 'BAD_INDENT':
    case 'MISSING_CHAR':
      return 'Check the indentation: items of one list or mapping start in the same column.';
    case 'BLOCK_AS_IMPLICIT_KEY':
    case 'MULTILINE_IMPLICIT_KEY':
      return 'A key must fit on one line and end with ": ". Quote text that contains ": ".';
    case 'TAB_AS_INDENT':
      return 'Indent with spaces, not tabs.';
    default:
      return 'Quote text that contains ":", "#", "[" or "{", and keep the indentation consistent.';
  }
}
