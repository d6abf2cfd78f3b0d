// The path a plant serves its manual under: "/" or a sub-path such as "/manual/" (`base:` in the
// configuration, `--base` on build, dev and serve). Checked with the configuration, used by the site.

/** The root of the manual: "/" or a sub-path with a slash at both ends, such as "/manual/". */
export type SiteBase = string;

export const rootBase: SiteBase = '/';

/** Characters a base may hold: letters, digits and the unreserved marks of RFC 3986 §2.3, in slash-separated segments. */
const segment = /^[A-Za-z0-9._~-]+$/;

/**
 * A base as the user wrote it ("manual", "/manual", "/plant/manual/") in its one form, "/manual/".
 * Returns a plain-English problem instead when it is not a path on the same site.
 */
export function parseBase(text: string | undefined): { base: SiteBase } | { problem: string } {
  const raw = (text ?? '').trim();
  if (raw === '' || raw === '/') return { base: rootBase };
  if (/^[a-z][a-z0-9+.-]*:/i.test(raw) || raw.startsWith('//')) {
    return { problem: `'${raw}' is an address, not a path. Give the path the manual is served under, such as /manual/.` };
  }
  const parts = raw.split('/').filter((p) => p !== '');
  const bad = parts.find((p) => p === '.' || p === '..' || !segment.test(p));
  if (bad !== undefined) {
    return { problem: `'${raw}' is not a plain path: the part '${bad}' may hold only letters, digits, '-', '_', '.' and '~' (and is not '.' or '..').` };
  }
  return { base: `/${parts.join('/')}/` };
}

/** The base in its one form; throws on a base that `parseBase` refuses (the commands check it first). */
export function normalizeBase(text: string | undefined): SiteBase {
  const parsed = parseBase(text);
  if ('problem' in parsed) throw new Error(parsed.problem);
  return parsed.base;
}
