// Cheap linear scans that refuse absurd nesting before the YAML and markdown libraries recurse into it.

/** Deeper front-matter than this is refused before the YAML library sees it (its parser recurses per level). */
export const yamlPrescanLimit = 256;
/** Lines whose leading quote/list markers and indentation are wider than this many columns are refused. */
export const bodyPrefixLimit = 100;

export interface NestingProblem {
  /** Offset into the scanned text of the line where the limit was passed. */
  offset: number;
  depth: number;
}

/**
 * Estimates the nesting of YAML text: block levels from indentation and compact "- " indicators, plus the
 * depth of flow collections ([ and {), skipping quoted text, comments and block scalars. It never
 * under-counts real nesting; it can over-count only for odd plain text, and its limit sits above the
 * parsed-depth limit so that ordinary files are never refused here.
 */
export function prescanYamlNesting(yaml: string, limit = yamlPrescanLimit): NestingProblem | null {
  const indents: number[] = [];
  let flow = 0;
  let quote: '"' | "'" | null = null;
  let blockScalarIndent = -1;
  let pos = 0;
  while (pos <= yaml.length) {
    let end = yaml.indexOf('\n', pos);
    if (end === -1) end = yaml.length;
    const lineStart = pos;
    let i = pos;
    while (i < end && yaml.charCodeAt(i) === 32) i++;
    const indent = i - lineStart;
    const blank = i >= end || yaml[i] === '\r';

    if (blockScalarIndent >= 0) {
      if (blank || indent > blockScalarIndent) { pos = end + 1; continue; }
      blockScalarIndent = -1;
    }
    if (!blank && flow === 0 && quote === null) {
      if (yaml[i] === '#') { pos = end + 1; continue; }
      // A line is a run of levels: its indentation, then one more for each compact "- ", "? " or ": ".
      while (indents.length > 0 && indents[indents.length - 1] >= indent) indents.pop();
      indents.push(indent);
      while (i + 1 < end && (yaml[i] === '-' || yaml[i] === '?' || yaml[i] === ':') && (yaml[i + 1] === ' ' || yaml[i + 1] === '\t')) {
        i += 2;
        while (i < end && (yaml[i] === ' ' || yaml[i] === '\t')) i++;
        indents.push(i - lineStart);
      }
    }
    // Scan the rest of the line for quotes, comments and flow brackets.
    let valueStart = quote === null && flow === 0;
    for (; i < end; i++) {
      const c = yaml[i];
      if (quote !== null) {
        if (quote === '"' && c === '\\') i++;
        else if (c === quote) {
          if (quote === "'" && yaml[i + 1] === "'") i++;
          else quote = null;
        }
        continue;
      }
      if (c === '#' && (i === lineStart || yaml[i - 1] === ' ' || yaml[i - 1] === '\t')) break;
      if (c === ' ' || c === '\t') continue;
      const atValueStart = valueStart;
      valueStart = false;
      if ((c === '"' || c === "'") && (atValueStart || flow > 0)) { quote = c; continue; }
      if ((c === '[' || c === '{') && (atValueStart || flow > 0)) {
        flow++;
        valueStart = true;
      } else if ((c === ']' || c === '}') && flow > 0) {
        flow--;
      } else if (c === ',' && flow > 0) {
        valueStart = true;
      } else if ((c === ':' || c === '-' || c === '?') && (yaml[i + 1] === ' ' || yaml[i + 1] === '\t' || i + 1 >= end)) {
        valueStart = true;
      } else if ((c === '|' || c === '>') && atValueStart && flow === 0) {
        blockScalarIndent = indent;
        break;
      } else if ((c === '&' || c === '!') && atValueStart) {
        // An anchor or tag comes before the value it names.
        while (i + 1 < end && yaml[i + 1] !== ' ' && yaml[i + 1] !== '\t') i++;
        valueStart = true;
      }
      if (indents.length + flow > limit) return { offset: lineStart, depth: indents.length + flow };
    }
    if (indents.length + flow > limit) return { offset: lineStart, depth: indents.length + flow };
    pos = end + 1;
  }
  return null;
}

const containerPrefix = /^(?:[ \t]*(?:>|[-*+](?=[ \t]|$)|\d{1,9}[.)](?=[ \t]|$)))+/;

/**
 * Finds a markdown line whose block-quote and list markers (with their indentation) are wider than the
 * limit. The markdown parser takes time that grows steeply with list depth and overflows the stack on
 * thousands of nested quotes; a procedure's narrative never needs more than a few levels.
 */
export function prescanBodyNesting(markdown: string, limit = bodyPrefixLimit): NestingProblem | null {
  let pos = 0;
  while (pos < markdown.length) {
    let end = markdown.indexOf('\n', pos);
    if (end === -1) end = markdown.length;
    // Only the first few hundred characters can matter; this keeps the scan linear on long lines.
    const head = markdown.slice(pos, Math.min(end, pos + limit * 4 + 16));
    const match = containerPrefix.exec(head);
    if (match) {
      const width = columns(match[0]);
      if (width > limit) return { offset: pos, depth: width };
    }
    pos = end + 1;
  }
  return null;
}

function columns(prefix: string): number {
  let col = 0;
  for (const c of prefix) col = c === '\t' ? col + 4 - (col % 4) : col + 1;
  return col;
}

/** Limits on the narrative below the front-matter: the markdown reader's time grows with each of them. */
export const bodyLimits = { lines: 5000, linkDefinitions: 500, bytes: 512 * 1024 };

const linkDefinition = /^ {0,3}\[(?:[^\]\\\n]|\\.){1,999}\]:/gm;

/** The first narrative size limit the text passes, with where it is passed (offset of the line). */
export function prescanBodySize(markdown: string, limits = bodyLimits): { what: string; found: number; limit: number; offset: number } | null {
  if (markdown.length > limits.bytes) return { what: 'characters', found: markdown.length, limit: limits.bytes, offset: 0 };
  let lines = 1;
  for (let i = markdown.indexOf('\n'); i !== -1; i = markdown.indexOf('\n', i + 1)) {
    if (++lines > limits.lines) return { what: 'lines', found: markdown.split('\n').length, limit: limits.lines, offset: i + 1 };
  }
  let definitions = 0;
  for (const m of markdown.matchAll(linkDefinition)) {
    if (++definitions > limits.linkDefinitions) {
      return { what: 'link reference definitions ([name]: address)', found: [...markdown.matchAll(linkDefinition)].length, limit: limits.linkDefinitions, offset: m.index };
    }
  }
  return null;
}
