// The fingerprint a published procedure page carries of the source text it was built from.
import { createHash } from 'node:crypto';
import { relative, resolve } from 'node:path';

/** Names of the <meta> elements on every procedure page. */
export const integrityMeta = {
  digest: 'stepwright-source-sha256',
  source: 'stepwright-source',
} as const;

/** SHA-256 (hex) of a procedure's source text as UTF-8: the text the checker read, without a byte-order mark. */
export function sourceDigest(text: string): string {
  return createHash('sha256').update(text.startsWith('\uFEFF') ? text.slice(1) : text, 'utf8').digest('hex');
}

/** The source's path inside the procedures folder, with forward slashes: the same on every machine. */
export function sourceKey(file: string, root: string): string {
  const f = file.split('\\').join('/').replace(/^\.\//, '');
  const r = root.split('\\').join('/').replace(/^\.\//, '').replace(/\/+$/, '');
  return r && f.startsWith(`${r}/`) ? f.slice(r.length + 1) : f;
}

/**
 * What else a procedure page was built from besides its source: every file of the plant register (its folder, so
 * that a file added later is seen too) and the configuration, each with its SHA-256. Paths are relative to the
 * procedures folder, as the page's source is, with forward slashes, so verify finds them from any working folder.
 * `null` where the build had none.
 */
export interface BuildInputs {
  register: { folder: string; files: Record<string, string> } | null;
  config: { file: string; sha256: string } | null;
}

/** Name of the <meta> element that carries the build inputs (as JSON). */
export const inputsMeta = 'stepwright-built-from';

const slashes = (path: string) => path.split('\\').join('/').replace(/^\.\//, '');

export function buildInputs(
  register: { folder: string; sources: ReadonlyArray<{ file: string; source: { text: string } }> } | undefined,
  config: { file: string; text: string } | undefined,
  /** Where the paths are made relative to: the procedures folder (as the command line names it, or absolute). */
  root = '.',
): BuildInputs {
  const from = (file: string) => slashes(relative(resolve(root), resolve(file)) || '.');
  return {
    register: register
      ? { folder: from(register.folder), files: Object.fromEntries(register.sources.map((s) => [from(s.file), sourceDigest(s.source.text)]).sort(([a], [b]) => a.localeCompare(b))) }
      : null,
    config: config ? { file: from(config.file), sha256: sourceDigest(config.text) } : null,
  };
}

/** The record read back from a page; undefined when it is absent or not readable. */
export function parseBuildInputs(text: string | undefined): BuildInputs | undefined {
  if (!text) return undefined;
  try {
    const data = JSON.parse(text) as Partial<BuildInputs>;
    const register = data.register === null ? null : data.register && typeof data.register.folder === 'string' && typeof data.register.files === 'object' && data.register.files ? data.register : undefined;
    const config = data.config === null ? null : data.config && typeof data.config.file === 'string' && typeof data.config.sha256 === 'string' ? data.config : undefined;
    if (register === undefined || config === undefined) return undefined;
    return { register, config };
  } catch {
    return undefined;
  }
}
