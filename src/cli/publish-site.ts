// Publishes a finished site at the output path so that the path holds a complete site at every instant.
// Each build lives in its own folder under `<out>.versions/`; the output path is a symbolic link to one of
// them, replaced by renaming a new link over it (a single atomic system call). A kill at any moment leaves
// either the old link or the new one; `recoverSite` repairs the one case a kill can leave behind (an output
// folder from before links were used, moved aside but not yet replaced).
import { existsSync, lstatSync, mkdirSync, readdirSync, readlinkSync, renameSync, rmSync, symlinkSync } from 'node:fs';
import { basename, dirname, join, resolve } from 'node:path';
import { Worker } from 'node:worker_threads';

/** How many published versions are kept: the one in use and the one before it (a reader may still be on it). */
const keptVersions = 2;

/**
 * How long a version is kept at least once a newer one replaced it. A reader that looked up the output path just
 * before a publication may still be on its way into the version it found when the next ones are published (two
 * publications a few milliseconds apart on a loaded machine were seen to overtake one file lookup); ten seconds is
 * far beyond any lookup.
 */
export const replacedVersionKeptMs = 10_000;

export function versionsFolder(outDir: string): string {
  return `${outDir}.versions`;
}

/** Version folders are named so that their names sort in publishing order (never two with one name). */
function versionName(versions: string): string {
  let ms = Math.max(Date.now(), newestTime(versions) + 1);
  const name = (t: number) => `site-${String(t).padStart(15, '0')}-${process.pid}`;
  while (existsSync(join(versions, name(ms)))) ms++;
  return name(ms);
}

function newestTime(versions: string): number {
  let newest = 0;
  try {
    for (const n of readdirSync(versions)) {
      const m = /^site-(\d{15})-\d+$/.exec(n);
      if (m) newest = Math.max(newest, Number(m[1]));
    }
  } catch {
    // No versions yet.
  }
  return newest;
}

function completeVersions(outDir: string): string[] {
  try {
    return readdirSync(versionsFolder(outDir)).filter((n) => /^site-\d{15}-\d+$/.test(n)).sort();
  } catch {
    return [];
  }
}

function kindOf(path: string): 'missing' | 'link' | 'folder' | 'other' {
  try {
    const s = lstatSync(path);
    return s.isSymbolicLink() ? 'link' : s.isDirectory() ? 'folder' : 'other';
  } catch {
    return 'missing';
  }
}

/** Points `outDir` at a version by renaming a fresh link over it (atomic when `outDir` is a link or absent). */
function pointAt(outDir: string, version: string): void {
  const link = `${outDir}.link-${process.pid}`;
  rmSync(link, { force: true });
  symlinkSync(join(basename(versionsFolder(outDir)), version), link, 'dir');
  renameSync(link, outDir);
}

/**
 * Moves a complete staged site into place. Returns the version folder it now lives in. Falls back to two
 * renames where links cannot be made (the old site then stays in `<out>.old-<pid>` until the second rename).
 */
export function publishSite(staged: string, outDir: string, now = Date.now()): string {
  const versions = versionsFolder(outDir);
  mkdirSync(versions, { recursive: true });
  const name = versionName(versions);
  const target = join(versions, name);
  renameSync(staged, target);
  const current = kindOf(outDir);
  if (current === 'folder') {
    // A site published before links were used: keep it as a version, then link. A kill between the two
    // renames leaves no output path for an instant; recoverSite links the newest version at the next start.
    renameSync(outDir, join(versions, `site-${'0'.repeat(15)}-${process.pid}`));
  } else if (current === 'other') {
    throw new Error(`${outDir} exists and is neither a folder nor a link; it was left alone`);
  }
  try {
    pointAt(outDir, name);
  } catch (error) {
    const code = (error as NodeJS.ErrnoException).code;
    if (code !== 'EPERM' && code !== 'EACCES' && code !== 'ENOSYS') throw error;
    // No symbolic links here (some Windows set-ups): publish the folder itself.
    renameSync(target, outDir);
    return outDir;
  }
  pruneVersions(outDir, now);
  return target;
}

/**
 * Removes versions older than the kept ones once the version after each was published `replacedVersionKeptMs` ago
 * (by `now`), never the one the output path points at.
 */
function pruneVersions(outDir: string, now: number): void {
  for (const name of replacedVersions(outDir, now, keptVersions)) rmSync(join(versionsFolder(outDir), name), { recursive: true, force: true });
}

/**
 * The versions older than the newest `keep` whose next version was published `replacedVersionKeptMs` ago or more (by
 * `now`), never the one the output path points at.
 */
function replacedVersions(outDir: string, now: number, keep: number): string[] {
  const inUse = linkedVersion(outDir);
  const all = completeVersions(outDir);
  const replaced: string[] = [];
  for (let i = 0; i < all.length - keep; i++) {
    if (all[i] !== inUse && now - versionTime(all[i + 1]) >= replacedVersionKeptMs) replaced.push(all[i]);
  }
  return replaced;
}

/**
 * Starts removing the versions a publication now would remove (each replaced `replacedVersionKeptMs` ago or more,
 * never the one the output path points at, never the newest), on a thread of its own: a build does it while it
 * writes its last files instead of after publishing (removing a large manual's version takes seconds of file system
 * calls). Removing a version's names changes the change time of the files it shares with newer versions (page
 * reuse links them): a build must not do it while it checks the pages it takes over (cli/page-reuse.ts). Each
 * is first renamed out of the versions' names, in one step, so that nothing takes it for a version meanwhile; what a
 * kill leaves of one is removed by the next build that starts this. Resolves when done; never rejects.
 */
export function startRetiring(outDir: string, now = Date.now()): Promise<void> {
  const versions = versionsFolder(outDir);
  const retired: string[] = [];
  // Before publishing, the newest version is the one a publication would keep besides its own.
  for (const name of replacedVersions(outDir, now, keptVersions - 1)) {
    const to = join(versions, `retired-${process.pid}-${name}`);
    try {
      renameSync(join(versions, name), to);
      retired.push(to);
    } catch {
      // Another build took it first; publishing removes what is left.
    }
  }
  let names: string[] = [];
  try {
    names = readdirSync(versions);
  } catch {
    // No versions yet.
  }
  for (const name of names) {
    const pid = Number(/^retired-(\d+)-/.exec(name)?.[1]);
    if (pid && pid !== process.pid && !isAlive(pid)) retired.push(join(versions, name));
  }
  if (!retired.length) return Promise.resolve();
  return new Promise((done) => {
    let worker: Worker;
    try {
      worker = new Worker(`const { rmSync } = require('node:fs');
for (const folder of require('node:worker_threads').workerData) rmSync(folder, { recursive: true, force: true });`, { eval: true, workerData: retired });
    } catch {
      // No thread: removed here, as publishing did before.
      for (const folder of retired) rmSync(folder, { recursive: true, force: true });
      done();
      return;
    }
    // A folder the thread could not remove stays under a name no one reads; the next build tries again.
    worker.on('error', () => undefined);
    worker.on('exit', () => done());
  });
}

/** Whether a process with this id runs (one that is not ours to signal runs too). */
export function isAlive(pid: number): boolean {
  try {
    process.kill(pid, 0);
    return true;
  } catch (error) {
    return (error as NodeJS.ErrnoException).code === 'EPERM';
  }
}

/** When a version was published, from its name (milliseconds; 0 for a folder taken over from before links). */
function versionTime(name: string): number {
  return Number(/^site-(\d{15})-\d+$/.exec(name)?.[1] ?? 0);
}

/** The version folder name the output path links to, if it is such a link. */
export function linkedVersion(outDir: string): string | undefined {
  if (kindOf(outDir) !== 'link') return undefined;
  try {
    return basename(readlinkSync(outDir));
  } catch {
    return undefined;
  }
}

/**
 * At start-up: when a kill left no output path but complete versions exist, links the newest one. Returns
 * what was done, in words, or undefined when nothing needed doing.
 */
export function recoverSite(outDir: string): string | undefined {
  const state = kindOf(outDir);
  if (state === 'link' && !existsSync(outDir)) {
    // A link to a version that is gone: point it at the newest that is there.
    const newest = completeVersions(outDir).at(-1);
    if (!newest) return undefined;
    pointAt(outDir, newest);
    return `the output link pointed at a missing version; it now points at ${newest}`;
  }
  if (state !== 'missing') return undefined;
  const newest = completeVersions(outDir).at(-1);
  if (!newest) return undefined;
  pointAt(outDir, newest);
  return `no site was at the output path (a build was stopped while publishing); the newest complete version ${newest} was put back`;
}

/** What is at the output path, in words, for `verify`. */
export function describeSite(outDir: string): { exists: boolean; text: string; folder: string } {
  const state = kindOf(outDir);
  const versions = completeVersions(outDir);
  if (state === 'link') {
    const real = resolve(dirname(outDir), readlinkSync(outDir));
    if (!existsSync(real)) return { exists: false, folder: real, text: `${outDir} links to ${real}, which is missing${versions.length ? `; ${versions.length} complete version(s) are in ${versionsFolder(outDir)} (the next build, or 'stepwright verify --repair', puts the newest back)` : ''}` };
    return { exists: true, folder: real, text: `${basename(outDir)} links to the published version ${basename(real)}` };
  }
  if (state === 'folder') return { exists: true, folder: outDir, text: `${basename(outDir)} is a site folder` };
  if (versions.length) return { exists: false, folder: outDir, text: `no site at ${outDir}, but ${versions.length} complete version(s) are in ${versionsFolder(outDir)}: a build was stopped while publishing (the next build, or 'stepwright verify --repair', puts the newest back)` };
  return { exists: false, folder: outDir, text: `no site at ${outDir}` };
}
