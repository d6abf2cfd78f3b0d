// Reports signal names, equipment and interlock tags and ids that break their pattern, hold characters a
// reader cannot see or tell apart from ASCII, are too long for a web address, or are reserved by the site.
import { defineFileRule, type Report } from '../define-rule.ts';
import { describeCharacter, firstNonAscii } from '../../parse/suspicious-characters.ts';
import { walkSteps } from '../../model/walk-steps.ts';
import type { PathKey } from '../../parse/read-source.ts';
import { mergeKey } from '../../parse/merge-keys.ts';

/** The condition language reads names with this pattern; a signal named otherwise can never be tested. */
export const signalNamePattern = /^[A-Za-z][A-Za-z0-9_-]*$/;
/** Plant tags: letters, digits, and '-', '_', '.', '/' or single spaces between them. */
export const tagPattern = /^[A-Za-z0-9](?:[A-Za-z0-9_./-]| (?! ))*$/;
/** Longest id, step id, signal name or tag: each becomes one part of a web address and a file name (255 bytes at most on common file systems). */
export const maxNameLength = 100;
/** Tag pages are folders next to the tag index page; a tag that would become a file name of the site is refused. */
const reservedTagSlug = /^(?:index|404)?\.|\.(?:html?|xml|json|js|mjs|css|txt|webmanifest|svg|png|ico)$/i;

export function showName(name: string): string {
  let out = '';
  for (const char of name) {
    const cp = char.codePointAt(0)!;
    out += cp < 0x21 || cp > 0x7e ? (char === ' ' ? ' ' : `<U+${cp.toString(16).toUpperCase().padStart(4, '0')}>`) : char;
  }
  return out;
}

export default defineFileRule(
  {
    id: 'name-format',
    summary: 'A signal name, tag or id breaks its pattern, holds a look-alike or invisible character, is too long or is reserved.',
    category: 'syntax',
    defaultSeverity: 'error',
    docs: `Names are what the checks compare: a setpoint on \`PІ-201\` (with a Cyrillic \`І\`) or on \`PI-201\` followed
by an invisible zero-width space is a different signal from \`PI-201\`, so its limits and trips would never be
checked. Signal names (under \`signals\`, \`limits\` and \`set\`) start with an ASCII letter and hold ASCII letters,
digits, \`-\` and \`_\`. Equipment and interlock tags hold ASCII letters, digits, \`-\`, \`_\`, \`.\`, \`/\` and single
spaces. Every character outside these is reported with its code point (e.g. U+0406), so it can be found and
retyped. Ids, step ids, signal names and tags are at most ${maxNameLength} characters (each becomes part of a web address
and a file name), and a tag may not end like a file of the site (\`index.html\`).`,
    examples: { bad: 'signals:\n  PІ-201: { text: Header pressure, unit: bar }   # Cyrillic І', good: 'signals:\n  PI-201: { text: Header pressure, unit: bar }' },
  },
  (ctx) => {
    const p = ctx.procedure;
    if (!p) return;
    const reported = new Set<string>();
    const report = (r: Report) => {
      const key = `${(r.path ?? []).join('\u0000')}:${r.part ?? ''}`;
      if (reported.has(key)) return;
      reported.add(key);
      ctx.report(r);
    };
    const checkSignal = (name: string, path: PathKey[], what: string) => {
      if (name === mergeKey) return; // A YAML merge key, not a name: unknown-key says so.
      const problem = patternProblem(name, signalNamePattern, `${what} '${showName(name)}'`, "names are ASCII letters, digits, '-' and '_', starting with a letter");
      if (problem) report({ path, part: 'key', ...problem });
      else if (name.length > maxNameLength) report({ path, part: 'key', ...tooLong(`${what} '${name.slice(0, 20)}…'`, name.length) });
    };
    const checkTag = (tag: string, path: PathKey[], what: string) => {
      if (typeof tag !== 'string' || tag === '') return;
      const problem = patternProblem(tag, tagPattern, `${what} '${showName(tag)}'`, "tags are ASCII letters, digits, '-', '_', '.', '/' and single spaces");
      if (problem) report({ path, ...problem });
      else if (tag.length > maxNameLength) report({ path, ...tooLong(`${what} '${tag.slice(0, 20)}…'`, tag.length) });
      else if (reservedTagSlug.test(tag)) {
        report({
          path,
          message: `${what} '${tag}' ends like a file name of the published site; its tag page would collide with the site's own files.`,
          hint: "Write the tag as it is painted on the plant, without a file extension such as '.html'.",
        });
      }
    };

    for (const name of Object.keys(p.signals)) checkSignal(name, ['signals', name], 'Signal name');
    for (const limit of p.limits) checkSignal(limit.signal, limit.path, 'Limit signal');
    for (const { step } of walkSteps(p.steps)) {
      for (const s of step.set) checkSignal(s.signal, s.path, 'Setpoint signal');
      if (step.id.length > maxNameLength) report({ path: [...step.path, 'step'], ...tooLong(`Step id '${step.id.slice(0, 20)}…'`, step.id.length) });
    }
    p.equipment.forEach((tag, i) => checkTag(tag, ['equipment', i], 'Equipment tag'));
    for (const interlock of p.interlocks) checkTag(interlock.tag, [...interlock.path, 'tag'], 'Interlock tag');
    if (p.id.length > maxNameLength) report({ path: ['id'], ...tooLong(`Procedure id '${p.id.slice(0, 20)}…'`, p.id.length) });
  },
);

function patternProblem(name: string, pattern: RegExp, what: string, rule: string): { message: string; hint: string } | null {
  if (pattern.test(name)) return null;
  const odd = firstNonAscii(name.replace(/ /g, '_'));
  if (odd) {
    const position = [...name.slice(0, odd.index)].length + 1;
    return {
      message: `${what} holds ${describeCharacter(odd.char)} as character ${position}; ${rule}.`,
      hint: 'Delete the name and type it again on an ASCII keyboard layout; a look-alike or invisible character makes it a different name, so its checks would not apply.',
    };
  }
  return { message: `${what} does not fit the pattern: ${rule}.`, hint: 'Write the name as on the plant drawings, e.g. PI-201 or TI-210.' };
}

function tooLong(what: string, length: number): { message: string; hint: string } {
  return {
    message: `${what} is ${length} characters long; the limit is ${maxNameLength} (it becomes part of a web address and a file name).`,
    hint: 'Use the short form from the plant drawings and put the description in the text.',
  };
}
