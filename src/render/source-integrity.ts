// The fingerprint a published procedure page carries of the source text it was built from.
import { createHash } from 'node:crypto';

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
