// The published site's manifest: the SHA-256 of every file, written last by the build and signed with the
// plant's ed25519 key when one is given. `stepwright verify` recomputes every hash, so an edited page, an
// added or removed file, and (with the public key) a forged manifest are all reported.
import { createHash, createPrivateKey, createPublicKey, generateKeyPairSync, sign, verify, type KeyObject } from 'node:crypto';
import { closeSync, lstatSync, openSync, readdirSync, readFileSync, unlinkSync, writeFileSync, writeSync } from 'node:fs';
import { join } from 'node:path';

export const manifestFile = 'stepwright-manifest.json';
export const signatureFile = 'stepwright-manifest.sig';
export const privateKeyFile = 'stepwright-signing-key.pem';
export const publicKeyFile = 'stepwright-signing-key.pub.pem';

export interface SiteManifest {
  format: 1;
  algorithm: 'sha256';
  /** Path inside the site (forward slashes) → hex SHA-256 of its bytes, sorted by path. */
  files: Record<string, string>;
}

/**
 * Every file under the site folder, by path with forward slashes, sorted by code unit (never in the order
 * the file system lists them). Links are not followed; the manifest and its signature are left out.
 */
export function siteFiles(siteDir: string): string[] {
  const out: string[] = [];
  const walk = (dir: string, prefix: string) => {
    for (const name of readdirSync(dir).sort()) {
      const full = join(dir, name);
      const path = prefix ? `${prefix}/${name}` : name;
      const s = lstatSync(full);
      if (s.isDirectory()) walk(full, path);
      else if (!prefix && (name === manifestFile || name === signatureFile)) continue;
      else out.push(path);
    }
  };
  walk(siteDir, '');
  return out.sort(byCodeUnit);
}

export function byCodeUnit(a: string, b: string): number {
  return a < b ? -1 : a > b ? 1 : 0;
}

export function hashFile(path: string): string {
  return createHash('sha256').update(readFileSync(path)).digest('hex');
}

/** `known`: hashes taken earlier in the same build of files left unchanged since (each file is read once). */
export function buildManifest(siteDir: string, known?: ReadonlyMap<string, string>): SiteManifest {
  const files: Record<string, string> = {};
  for (const path of siteFiles(siteDir)) files[path] = known?.get(path) ?? hashFile(join(siteDir, ...path.split('/')));
  return { format: 1, algorithm: 'sha256', files };
}

export function manifestText(manifest: SiteManifest): string {
  return `${JSON.stringify(manifest, null, 1)}\n`;
}

/** Writes the manifest (and its signature, with a private key) into the site folder. */
export function writeSiteManifest(siteDir: string, options: { privateKey?: KeyObject; known?: ReadonlyMap<string, string> } = {}): SiteManifest {
  const manifest = buildManifest(siteDir, options.known);
  const text = manifestText(manifest);
  writeFileSync(join(siteDir, manifestFile), text);
  if (options.privateKey) writeFileSync(join(siteDir, signatureFile), `${sign(null, Buffer.from(text), options.privateKey).toString('base64')}\n`);
  return manifest;
}

export interface ManifestCheck {
  /** No manifest in the site (built by an older version, or removed). */
  missing: boolean;
  /** The manifest could not be read as one. */
  unreadable?: string;
  changed: string[];
  added: string[];
  removed: string[];
  matching: number;
  signature: 'valid' | 'invalid' | 'missing' | 'not-checked';
}

export function checkSiteManifest(siteDir: string, options: { publicKey?: KeyObject } = {}): ManifestCheck {
  const result: ManifestCheck = { missing: false, changed: [], added: [], removed: [], matching: 0, signature: 'not-checked' };
  let text: string;
  try {
    text = readFileSync(join(siteDir, manifestFile), 'utf8');
  } catch {
    result.missing = true;
    if (options.publicKey) result.signature = 'missing';
    return result;
  }
  if (options.publicKey) {
    let signature: Buffer | undefined;
    try {
      signature = Buffer.from(readFileSync(join(siteDir, signatureFile), 'utf8').trim(), 'base64');
    } catch {
      signature = undefined;
    }
    result.signature = !signature ? 'missing' : safeVerify(text, signature, options.publicKey) ? 'valid' : 'invalid';
  }
  let manifest: SiteManifest;
  try {
    manifest = JSON.parse(text) as SiteManifest;
    if (manifest.format !== 1 || manifest.algorithm !== 'sha256' || typeof manifest.files !== 'object' || manifest.files === null) throw new Error('not a Stepwright site manifest');
  } catch (error) {
    result.unreadable = (error as Error).message;
    return result;
  }
  const listed = new Map(Object.entries(manifest.files));
  for (const path of siteFiles(siteDir)) {
    const expected = listed.get(path);
    if (expected === undefined) {
      result.added.push(path);
      continue;
    }
    listed.delete(path);
    if (hashFile(join(siteDir, ...path.split('/'))) === expected) result.matching++;
    else result.changed.push(path);
  }
  result.removed = [...listed.keys()].sort(byCodeUnit);
  return result;
}

function safeVerify(text: string, signature: Buffer, key: KeyObject): boolean {
  try {
    return verify(null, Buffer.from(text), key, signature);
  } catch {
    return false;
  }
}

export function readPrivateKey(path: string): KeyObject {
  const key = createPrivateKey(readFileSync(path));
  if (key.asymmetricKeyType !== 'ed25519') throw new Error(`${path} is not an ed25519 private key`);
  return key;
}

export function readPublicKey(path: string): KeyObject {
  const key = createPublicKey(readFileSync(path));
  if (key.asymmetricKeyType !== 'ed25519') throw new Error(`${path} is not an ed25519 public key`);
  return key;
}

/** Writes a new ed25519 key pair; never overwrites a file (fails with EEXIST instead, leaving both as they were). */
export function writeKeyPair(privatePath: string, publicPath: string): void {
  const { privateKey, publicKey } = generateKeyPairSync('ed25519');
  const privatePem = privateKey.export({ type: 'pkcs8', format: 'pem' }) as string;
  const publicPem = publicKey.export({ type: 'spki', format: 'pem' }) as string;
  // Both files are created exclusively ('wx'): an existing key is never replaced.
  const fdPrivate = openSync(privatePath, 'wx', 0o600);
  let fdPublic: number;
  try {
    fdPublic = openSync(publicPath, 'wx', 0o644);
  } catch (error) {
    closeSync(fdPrivate);
    unlinkSync(privatePath); // created a moment ago by this call, still empty
    throw error;
  }
  try {
    writeSync(fdPrivate, privatePem);
    writeSync(fdPublic, publicPem);
  } finally {
    closeSync(fdPrivate);
    closeSync(fdPublic);
  }
}
