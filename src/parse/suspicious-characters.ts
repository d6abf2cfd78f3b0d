// Finds characters a reader cannot see or cannot tell apart from plain ASCII: invisible and format
// characters, bidirectional overrides, control characters and letters of other scripts that look Latin.

export type CharacterKind = 'invisible' | 'bidi' | 'control' | 'look-alike' | 'other';

export interface CharacterFinding {
  /** Offset (UTF-16 units) in the scanned text. */
  index: number;
  codePoint: number;
  kind: CharacterKind;
}

/** Bidirectional embedding, override and isolate controls, and the implicit marks. */
const bidi = /[\u061C\u200E\u200F\u202A-\u202E\u2066-\u2069]/u;
/** Characters with no visible shape: zero-width, word joiners, fillers, variation selectors, tag characters. */
const invisible = /[\u00AD\u034F\u115F\u1160\u17B4\u17B5\u180B-\u180F\u200B-\u200D\u2060-\u2064\u206A-\u206F\u3164\uFE00-\uFE0F\uFEFF\uFFA0\u{E0000}-\u{E007F}\u{E0100}-\u{E01EF}]/u;
/** C0 controls except tab, line feed and carriage return; DEL; C1 controls; line and paragraph separators. */
const control = /[\u0000-\u0008\u000B\u000C\u000E-\u001F\u007F-\u009F\u2028\u2029]/u;

/** Look-alikes of ASCII letters, digits and marks common in plant tags (a short list; the script check catches the rest). */
const lookAlikes: Record<string, string> = {
  // Cyrillic
  'А': 'A', 'В': 'B', 'Е': 'E', 'К': 'K', 'М': 'M', 'Н': 'H', 'О': 'O', 'Р': 'P', 'С': 'C', 'Т': 'T', 'Х': 'X', 'І': 'I', 'Ј': 'J', 'Ѕ': 'S', 'Ү': 'Y', 'Ԛ': 'Q', 'Ԝ': 'W',
  'а': 'a', 'е': 'e', 'о': 'o', 'р': 'p', 'с': 'c', 'у': 'y', 'х': 'x', 'і': 'i', 'ј': 'j', 'ѕ': 's', 'һ': 'h', 'ԁ': 'd', 'ԛ': 'q', 'ԝ': 'w',
  // Greek
  'Α': 'A', 'Β': 'B', 'Ε': 'E', 'Ζ': 'Z', 'Η': 'H', 'Ι': 'I', 'Κ': 'K', 'Μ': 'M', 'Ν': 'N', 'Ο': 'O', 'Ρ': 'P', 'Τ': 'T', 'Υ': 'Y', 'Χ': 'X',
  'ο': 'o', 'ν': 'v', 'ι': 'i', 'κ': 'k', 'α': 'a', 'ρ': 'p',
  // Dashes, minus signs and digits from other blocks
  '\u2010': '-', '\u2011': '-', '\u2012': '-', '\u2013': '-', '\u2014': '-', '\u2015': '-', '\u2212': '-', '\uFE63': '-', '\uFF0D': '-',
  '\u0660': '0', '\u06F0': '0', '\u07C0': '0', '\u09E6': '0',
};

export function classify(char: string): CharacterKind | null {
  if (bidi.test(char)) return 'bidi';
  if (invisible.test(char)) return 'invisible';
  if (control.test(char)) return 'control';
  const cp = char.codePointAt(0)!;
  if (cp < 0x80) return null;
  if (lookAlikes[char] !== undefined || (cp >= 0xFF01 && cp <= 0xFF5E) || (cp >= 0x1D400 && cp <= 0x1D7FF)) return 'look-alike';
  return 'other';
}

/** The ASCII character a look-alike imitates, if known. */
export function imitated(char: string): string | undefined {
  if (lookAlikes[char] !== undefined) return lookAlikes[char];
  const cp = char.codePointAt(0)!;
  if (cp >= 0xFF01 && cp <= 0xFF5E) return String.fromCharCode(cp - 0xFF01 + 0x21);
  const folded = char.normalize('NFKC');
  return folded !== char && /^[\x21-\x7e]$/.test(folded) ? folded : undefined;
}

/** "U+0406", the way Unicode writes a code point. */
export function codePointLabel(codePoint: number): string {
  return `U+${codePoint.toString(16).toUpperCase().padStart(4, '0')}`;
}

const scripts = ['Cyrillic', 'Greek', 'Armenian', 'Cherokee', 'Arabic', 'Hebrew', 'Han', 'Latin'] as const;

/** A plain-English description of one character, e.g. "U+0406 (a Cyrillic letter that looks like 'I')". */
export function describeCharacter(char: string): string {
  const cp = char.codePointAt(0)!;
  const label = codePointLabel(cp);
  switch (classify(char)) {
    case 'bidi': return `${label} (an invisible control that reverses or reorders the text around it)`;
    case 'invisible': return `${label} (an invisible character${cp === 0x200B ? ', zero-width space' : cp === 0xFEFF ? ', zero-width no-break space' : cp === 0x00AD ? ', soft hyphen' : ''})`;
    case 'control': return `${label} (a control character)`;
    case 'look-alike':
    case 'other': {
      const like = imitated(char);
      const script = scripts.find((s) => new RegExp(`\\p{Script=${s}}`, 'u').test(char));
      const what = script && script !== 'Latin' ? `a ${script} character` : /\p{L}/u.test(char) ? 'a non-ASCII letter' : 'a non-ASCII character';
      return `${label} (${what}${like ? ` that looks like '${like}'` : ''})`;
    }
    default: return label;
  }
}

/** Every invisible, bidirectional or control character in a text (not look-alikes: prose may use any script). */
export function findHiddenCharacters(text: string, limit = Infinity): CharacterFinding[] {
  const out: CharacterFinding[] = [];
  const pattern = new RegExp(`${bidi.source.slice(0, -1)}${invisible.source.slice(1, -1)}${control.source.slice(1)}`, 'gu');
  for (const m of text.matchAll(pattern)) {
    // Tab, newline and carriage return are excluded by the class; a byte-order mark at the very start is harmless.
    if (m.index === 0 && m[0] === '\uFEFF') continue;
    out.push({ index: m.index, codePoint: m[0].codePointAt(0)!, kind: classify(m[0])! });
    if (out.length >= limit) break;
  }
  return out;
}

/** The first character of a name that is not printable ASCII, with its offset. */
export function firstNonAscii(name: string): { index: number; char: string } | null {
  let index = 0;
  for (const char of name) {
    const cp = char.codePointAt(0)!;
    if (cp < 0x21 || cp > 0x7e) return { index, char };
    index += char.length;
  }
  return null;
}
