// Tags, document ids and dates must never break across lines ("AI-/210", "2026-04-/06" read wrong on a tablet).
// Browsers may break after any hyphen, so every such token in the text of a page's body is wrapped in a span
// that does not wrap. Markup, attributes, scripts, styles, SVG and the head are left exactly as they are.
//
// Every pattern here is written in ASCII (the whitespace that ends a closing tag is HTML's own, not any Unicode
// space), so the same function works on a page's UTF-8 bytes read as Latin-1 characters, one character per byte:
// no byte of a multi-byte character can match, and the spans it adds are ASCII. The build keeps tokens whole that
// way, which spares decoding and encoding every page (keepTokensWholeInBytes).

/** A plant tag or document id (upper-case letters and digits joined by hyphens, at least one digit), or a date. */
const token = /\d{4}-\d{2}-\d{2}(?:[T ]\d{2}:\d{2}(?::\d{2})?)?|(?<![\w-])[A-Z][A-Z0-9]*(?:-[A-Z0-9]+)+(?![\w-])/g;

/** Segments that are not text: whole elements whose content is not flowing text, comments, and single tags. */
const skip = /(<(script|style|title|textarea|template|noscript)\b[\s\S]*?<\/\2[ \t\n\f\r]*>|<!--[\s\S]*?-->|<(?:[^>"']|"[^"]*"|'[^']*')*>)/gi;

/** The end of the <svg> element opening at `from` (SVG may nest: a symbol drawn inside a chart). */
function svgEnd(html: string, from: number): number {
  const tags = /<(\/?)svg\b(?:[^>"']|"[^"]*"|'[^']*')*?(\/?)>/gi;
  tags.lastIndex = from;
  let depth = 0;
  for (let m = tags.exec(html); m; m = tags.exec(html)) {
    if (m[1]) depth--;
    else if (!m[2]) depth++;
    if (depth === 0) return m.index + m[0].length;
  }
  return html.length;
}

export const noBreakClass = 'nb';

export function keepTokensWhole(html: string): string {
  const bodyStart = html.search(/<body\b/i);
  if (bodyStart < 0) return html;
  const head = html.slice(0, bodyStart);
  const body = html.slice(bodyStart);
  let out = '';
  let last = 0;
  skip.lastIndex = 0;
  for (let m = skip.exec(body); m; m = skip.exec(body)) {
    out += wrapText(body.slice(last, m.index));
    // A whole <svg> (with any nested ones) is drawing, not text: copy it as it is.
    const end = /^<svg\b/i.test(m[0]) && !m[0].endsWith('/>') ? svgEnd(body, m.index) : m.index + m[0].length;
    out += body.slice(m.index, end);
    last = end;
    skip.lastIndex = end;
  }
  out += wrapText(body.slice(last));
  return head + out;
}

function wrapText(text: string): string {
  if (!text) return text;
  return text.replace(token, (t) => (/\d/.test(t) ? `<span class="${noBreakClass}">${t}</span>` : t));
}

/** keepTokensWhole on a page's UTF-8 bytes, without decoding them: the same bytes as decoding, wrapping and encoding. */
export function keepTokensWholeInBytes(page: Buffer): Buffer {
  const bytes = page.toString('latin1');
  const kept = keepTokensWhole(bytes);
  return kept === bytes ? page : Buffer.from(kept, 'latin1');
}
