// `stepwright verify DIST`: checks that every procedure page of a published site was built from the sources as they are.
import { existsSync, readdirSync, readFileSync, statSync } from 'node:fs';
import { join, relative, resolve } from 'node:path';
import { parseArgs } from 'node:util';
import { integrityMeta, inputsMeta, parseBuildInputs, sourceDigest, sourceKey, type BuildInputs } from '../render/source-integrity.ts';
import { defaultOutputFolder, proceduresFolder } from './project.ts';
import { UsageError, type CliIo } from './io.ts';
import { readProcedureFiles, type FileNotRead } from './read-procedure-files.ts';
import { isNotAProcedure } from '../engine/not-a-procedure.ts';
import { describeSite, recoverSite } from './publish-site.ts';
import { checkSiteManifest, manifestFile, publicKeyFile, readPublicKey, signatureFile } from './site-manifest.ts';
import { verifyHelp } from './command-help.ts';
import { registerFiles as registerFilesUnder } from '../engine/load-register.ts';

export { verifyHelp };

export interface PageStamp {
  page: string;
  source: string;
  digest: string;
  /** The register files and configuration the page was built from; absent on a page built before they were recorded. */
  inputs?: BuildInputs;
}

/** A page whose register or configuration is no longer the one it was built from. */
export interface InputMismatch {
  page: string;
  /** Each file, relative to the folder verify runs in, and what became of it. */
  files: Array<{ file: string; what: 'changed' | 'removed' | 'added' }>;
}

export interface VerifyResult {
  matching: PageStamp[];
  changed: Array<PageStamp & { expected: string }>;
  /** Pages whose source is not among the sources. */
  orphaned: PageStamp[];
  /** Sources with no page. */
  unpublished: string[];
}

export async function runVerify(argv: string[], io: CliIo): Promise<number> {
  const { values, positionals } = parseArgs({
    args: argv,
    allowPositionals: true,
    options: { procedures: { type: 'string' }, 'public-key': { type: 'string' }, repair: { type: 'boolean', default: false }, help: { type: 'boolean', short: 'h' } },
    strict: true,
  });
  if (values.help) {
    io.stdout.write(verifyHelp);
    return 0;
  }
  if (positionals.length > 1) throw new UsageError('Give one site folder, e.g. stepwright verify dist');
  // Default: the folder `stepwright build` writes to, dist/ of the project.
  if (!positionals.length) positionals.push(defaultOutputFolder(io));
  const sitePath = resolve(io.cwd, positionals[0]);
  const folder = proceduresFolder(io, values);
  if (!isDirectory(resolve(io.cwd, folder))) throw new UsageError(`No procedures folder at ${folder}.`);
  const keyPath = values['public-key'] ?? (io.env.STEPWRIGHT_PUBLIC_KEY?.trim() || (existsSync(resolve(io.cwd, publicKeyFile)) ? publicKeyFile : undefined));
  let publicKey: ReturnType<typeof readPublicKey> | undefined;
  if (keyPath) {
    try {
      publicKey = readPublicKey(resolve(io.cwd, keyPath));
    } catch (error) {
      throw new UsageError(`The public key ${keyPath} could not be read: ${(error as Error).message}`);
    }
  }
  if (values.repair) {
    const repaired = recoverSite(sitePath);
    if (repaired) io.stdout.write(`Repaired: ${repaired}.\n`);
  }
  const found = describeSite(sitePath);
  if (!found.exists) {
    io.stdout.write(`${found.text}.\n`);
    return 1;
  }
  const site = found.folder;
  if (!isDirectory(site)) throw new UsageError(`No site folder at ${positionals[0]}.`);
  if (found.text.includes('links to')) io.stdout.write(`${found.text}.\n`);

  // The whole site against the build's manifest (and its signature).
  const manifest = checkSiteManifest(site, { publicKey });
  const showFile = (path: string) => relative(io.cwd, join(sitePath, path)) || path;
  let fileProblems = 0;
  if (manifest.missing) {
    fileProblems++;
    io.stdout.write(`${showFile(manifestFile)}: missing; the files of the site cannot be checked (built by an older version, or the manifest was removed).\n`);
  } else if (manifest.unreadable) {
    fileProblems++;
    io.stdout.write(`${showFile(manifestFile)}: not a readable manifest (${manifest.unreadable}).\n`);
  }
  if (manifest.signature === 'invalid') {
    fileProblems++;
    io.stdout.write(`${showFile(manifestFile)}: its signature does not match: the manifest was changed after the build, or signed with another key.\n`);
  } else if (manifest.signature === 'missing') {
    fileProblems++;
    io.stdout.write(`${showFile(manifestFile)}: not signed (${signatureFile} is missing), but a public key was given.\n`);
  }
  for (const path of manifest.changed) io.stdout.write(`${showFile(path)}: changed since the build (its SHA-256 differs from the manifest)\n`);
  for (const path of manifest.added) io.stdout.write(`${showFile(path)}: not in the manifest (added after the build)\n`);
  for (const path of manifest.removed) io.stdout.write(`${showFile(path)}: in the manifest but missing from the site\n`);
  fileProblems += manifest.changed.length + manifest.added.length + manifest.removed.length;
  if (!manifest.missing && !manifest.unreadable) {
    const signature = manifest.signature === 'valid' ? 'signature valid' : manifest.signature === 'not-checked' ? (existsSync(join(site, signatureFile)) ? 'signature not checked (no public key given)' : 'not signed') : 'signature NOT valid';
    io.stdout.write(`Files: ${manifest.matching} match the manifest, ${manifest.changed.length} changed, ${manifest.added.length} added, ${manifest.removed.length} missing; ${signature}.\n`);
  }

  const pages = readStamps(site);
  if (pages.length === 0) {
    io.stderr.write(`stepwright verify: no procedure page in ${positionals[0]} carries a source fingerprint; it is not a Stepwright manual or was built by an older version.\n`);
    return 1;
  }
  const sources = new Map<string, string>();
  const unreadable: string[] = [];
  let skipped = 0;
  const notRead: FileNotRead[] = [];
  for (const input of readProcedureFiles([folder], io.cwd, notRead)) {
    const key = sourceKey(relative(resolve(io.cwd, folder), resolve(io.cwd, input.file)), '');
    // Markdown that is not a procedure (a README, notes) has no page, exactly as check and build skip it.
    if ('text' in input && isNotAProcedure(input.text)) skipped++;
    else if ('text' in input) sources.set(key, sourceDigest(input.text));
    else unreadable.push(key);
  }
  const result = compareStamps(pages, sources);
  const show = (page: string) => relative(io.cwd, join(sitePath, page)) || page;
  for (const c of result.changed) io.stdout.write(`${show(c.page)}: does not match its source ${join(folder, c.source)} (page built from sha256 ${c.digest.slice(0, 12)}…, source is ${c.expected.slice(0, 12)}…)\n`);
  for (const o of result.orphaned) io.stdout.write(`${show(o.page)}: its source ${join(folder, o.source)} is not in ${folder}\n`);
  for (const s of result.unpublished) io.stdout.write(`${join(folder, s)}: has no page in ${positionals[0]}${unreadable.includes(s) ? ' (the file could not be read)' : ''}\n`);
  // The register files and the configuration each page was drawn with: a page shows the register's trips and limits.
  const inputs = compareInputs(pages, resolve(io.cwd, folder), io.cwd);
  const words = { changed: 'has changed since the build', removed: 'is gone since the build', added: 'was added to the register since the build' };
  for (const m of inputs.mismatched) {
    io.stdout.write(`${show(m.page)}: built from a register or configuration that no longer matches: ${m.files.map((f) => `${f.file} ${words[f.what]}`).join('; ')}. The page may show old trips, limits or signals; rebuild the manual (stepwright build).\n`);
  }
  if (inputs.unrecorded.length) {
    const n = inputs.unrecorded.length;
    io.stdout.write(`${n} procedure page${n === 1 ? '' : 's'} (e.g. ${show(inputs.unrecorded[0].page)}) ${n === 1 ? 'does' : 'do'} not record the register files and configuration ${n === 1 ? 'it was' : 'they were'} built from (built by an older version): not checked against the register. Rebuild the manual to check ${n === 1 ? 'it' : 'them'}.\n`);
  }
  const problems = result.changed.length + result.orphaned.length + result.unpublished.length + inputs.mismatched.length + inputs.unrecorded.length;
  // Markdown the folder search passes over (node_modules, a .markdown name) is named, exactly as check and build name it.
  for (const n of notRead) io.stdout.write(`${n.file}: not read (${n.reason}); it is not compared with the site.\n`);
  if (skipped) io.stdout.write(`${skipped} markdown file${skipped === 1 ? '' : 's'} in ${folder} ${skipped === 1 ? 'is' : 'are'} not a procedure and need${skipped === 1 ? 's' : ''} no page.\n`);
  const sourceProblems = result.changed.length + result.orphaned.length + result.unpublished.length;
  const registerNote = inputs.mismatched.length || inputs.unrecorded.length
    ? `; against the register and configuration: ${inputs.mismatched.length} out of date, ${inputs.unrecorded.length} not checked`
    : '';
  io.stdout.write(problems === 0
    ? `All ${result.matching.length} procedure pages match their sources.\n`
    : sourceProblems === 0
      ? `All ${result.matching.length} procedure pages match their procedure sources${registerNote}.\n`
      : `${sourceProblems} mismatch${sourceProblems === 1 ? '' : 'es'}: ${result.changed.length} changed, ${result.orphaned.length} without source, ${result.unpublished.length} without page; ${result.matching.length} pages match${registerNote}.\n`);
  return problems === 0 && fileProblems === 0 ? 0 : 1;
}

/** Pages against sources (path inside the procedures folder → digest). */
export function compareStamps(pages: PageStamp[], sources: Map<string, string>): VerifyResult {
  const result: VerifyResult = { matching: [], changed: [], orphaned: [], unpublished: [] };
  const published = new Set<string>();
  for (const page of pages) {
    const expected = sources.get(page.source);
    published.add(page.source);
    if (expected === undefined) result.orphaned.push(page);
    else if (expected !== page.digest) result.changed.push({ ...page, expected });
    else result.matching.push(page);
  }
  for (const source of [...sources.keys()].sort()) if (!published.has(source)) result.unpublished.push(source);
  return result;
}

/**
 * Each page's recorded register files and configuration against the files as they are now: a file changed or gone,
 * and a register file added to the register folder. The record's paths are relative to the procedures folder
 * (`root`); the files are named relative to `cwd`.
 */
export function compareInputs(pages: PageStamp[], root: string, cwd: string): { mismatched: InputMismatch[]; unrecorded: PageStamp[] } {
  const shown = (file: string) => relative(cwd, resolve(root, file)).split('\\').join('/') || file;
  const digests = new Map<string, string | null>();
  const digestOf = (file: string): string | null => {
    if (!digests.has(file)) {
      let digest: string | null = null;
      try {
        digest = sourceDigest(readFileSync(resolve(root, file), 'utf8'));
      } catch {
        digest = null;
      }
      digests.set(file, digest);
    }
    return digests.get(file)!;
  };
  const listings = new Map<string, string[]>();
  const registerFiles = (folder: string): string[] => {
    if (!listings.has(folder)) listings.set(folder, registerFilesUnder(resolve(root, folder)).map((f) => relative(root, f).split('\\').join('/')));
    return listings.get(folder)!;
  };
  const mismatched: InputMismatch[] = [];
  const unrecorded: PageStamp[] = [];
  for (const page of pages) {
    if (!page.inputs) {
      unrecorded.push(page);
      continue;
    }
    const files: InputMismatch['files'] = [];
    const { register, config } = page.inputs;
    if (register) {
      for (const [file, digest] of Object.entries(register.files)) {
        const now = digestOf(file);
        if (now === null) files.push({ file: shown(file), what: 'removed' });
        else if (now !== digest) files.push({ file: shown(file), what: 'changed' });
      }
      for (const file of registerFiles(register.folder)) if (!(file in register.files)) files.push({ file: shown(file), what: 'added' });
    }
    if (config) {
      const now = digestOf(config.file);
      if (now === null) files.push({ file: shown(config.file), what: 'removed' });
      else if (now !== config.sha256) files.push({ file: shown(config.file), what: 'changed' });
    }
    if (files.length) mismatched.push({ page: page.page, files });
  }
  return { mismatched, unrecorded };
}


/** Every HTML page under the site folder that carries the fingerprint meta elements. */
export function readStamps(site: string): PageStamp[] {
  const out: PageStamp[] = [];
  const walk = (dir: string) => {
    for (const name of readdirSync(dir).sort()) {
      const full = join(dir, name);
      if (isDirectory(full)) walk(full);
      else if (name.endsWith('.html')) {
        const html = readFileSync(full, 'utf8');
        const digest = metaContent(html, integrityMeta.digest);
        const source = metaContent(html, integrityMeta.source);
        const inputs = parseBuildInputs(metaContent(html, inputsMeta));
        if (digest && source) out.push({ page: relative(site, full).split('\\').join('/'), source, digest, ...(inputs ? { inputs } : {}) });
      }
    }
  };
  walk(site);
  return out;
}

function metaContent(html: string, name: string): string | undefined {
  const head = html.slice(0, html.indexOf('</head>') === -1 ? html.length : html.indexOf('</head>'));
  for (const m of head.matchAll(/<meta\b[^>]*>/gi)) {
    const attrs = new Map([...m[0].matchAll(/([a-z-]+)\s*=\s*(?:"([^"]*)"|'([^']*)'|([^\s"'>]+))/gi)].map((a) => [a[1].toLowerCase(), a[2] ?? a[3] ?? a[4]]));
    if (attrs.get('name') === name) return decodeEntities(attrs.get('content') ?? '');
  }
  return undefined;
}

function decodeEntities(text: string): string {
  return text.replace(/&(#x[0-9a-f]+|#\d+|amp|lt|gt|quot|apos);/gi, (all, e: string) => {
    const k = e.toLowerCase();
    if (k === 'amp') return '&';
    if (k === 'lt') return '<';
    if (k === 'gt') return '>';
    if (k === 'quot') return '"';
    if (k === 'apos') return "'";
    const code = k.startsWith('#x') ? parseInt(k.slice(2), 16) : parseInt(k.slice(1), 10);
    return Number.isFinite(code) ? String.fromCodePoint(code) : all;
  });
}

function isDirectory(path: string): boolean {
  try {
    return statSync(path).isDirectory();
  } catch {
    return false;
  }
}
