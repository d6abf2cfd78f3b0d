// The user's project as a command sees it: which configuration file applies and which folder holds the
// procedures. Every command takes the procedures folder from here, so the default is decided in one place.
import { existsSync, readFileSync, statSync } from 'node:fs';
import { dirname, isAbsolute, join, relative, resolve } from 'node:path';
import { parseDocument } from 'yaml';
import { configFileName } from '../check/config.ts';
import { parseBase, type SiteBase } from '../model/site-base.ts';
import { UsageError } from './usage-error.ts';

/** The folder name used when nothing else says where the procedures are. */
export const defaultProceduresFolder = 'procedures';

/**
 * The configuration file for a command started in `cwd`: stepwright.config.yaml in the working folder or the
 * nearest folder above it, up to the top of the git repository (a folder holding `.git`) — never beyond it.
 */
export function findConfigFile(cwd: string): string | undefined {
  let here = resolve(cwd);
  for (;;) {
    const candidate = join(here, configFileName);
    if (statSync(candidate, { throwIfNoEntry: false })?.isFile()) return candidate;
    if (existsSync(join(here, '.git'))) return undefined;
    const parent = dirname(here);
    if (parent === here) return undefined;
    here = parent;
  }
}

/** The top of the git repository around `cwd` (the nearest folder holding `.git`), else `cwd` itself. */
export function projectRoot(cwd: string): string {
  let here = resolve(cwd);
  for (;;) {
    if (existsSync(join(here, '.git'))) return here;
    const parent = dirname(here);
    if (parent === here) return resolve(cwd);
    here = parent;
  }
}

/** A top-level value of a configuration file, read leniently (the check reports a bad file). */
function configuredValue(configFile: string, key: string): unknown {
  try {
    return (parseDocument(readFileSync(configFile, 'utf8')).toJS() as Record<string, unknown> | null)?.[key];
  } catch {
    return undefined;
  }
}

/** `procedures:` in a configuration file, as a path relative to the working folder (read leniently: the check reports a bad file). */
function configuredFolder(configFile: string, cwd: string): string | undefined {
  try {
    const value = configuredValue(configFile, 'procedures');
    if (typeof value !== 'string' || !value.trim()) return undefined;
    return relative(cwd, resolve(dirname(configFile), value.trim())) || '.';
  } catch {
    return undefined;
  }
}

/**
 * The procedures folder for a command, as the user names it (relative to the working folder when possible):
 * the --procedures option, else $STEPWRIGHT_PROCEDURES, else `procedures:` in the configuration file
 * (relative to that file), else the default folder (see defaultFolder), so that a command finds the same
 * folder from any folder of the repository.
 */
export function proceduresFolder(io: { cwd: string; env: Record<string, string | undefined> }, options: { procedures?: string; config?: string } = {}): string {
  if (options.procedures?.trim()) return options.procedures.trim();
  const fromEnv = io.env.STEPWRIGHT_PROCEDURES?.trim();
  if (fromEnv) return fromEnv;
  const configFile = options.config ? resolve(io.cwd, options.config) : findConfigFile(io.cwd);
  return (configFile && configuredFolder(configFile, io.cwd)) || defaultFolder(io.cwd, configFile);
}

/**
 * The procedures folder when nothing names one: the nearest `procedures/` folder from the working folder up to the
 * folder of the configuration file, or without one the top of the repository (so the same `procedures/` is found
 * from inside it and from any folder beside it); when there is none yet, `procedures/` in that top folder.
 */
function defaultFolder(cwd: string, configFile: string | undefined): string {
  const start = resolve(cwd);
  const top = configFile ? dirname(configFile) : projectRoot(start);
  const inside = isInside(start, top);
  for (let here = start; inside; here = dirname(here)) {
    const candidate = join(here, defaultProceduresFolder);
    if (statSync(candidate, { throwIfNoEntry: false })?.isDirectory()) return relative(cwd, candidate) || '.';
    if (here === top || dirname(here) === here) break;
  }
  return relative(cwd, join(top, defaultProceduresFolder)) || '.';
}

/** The folder name the built manual goes in when nothing else says where. */
export const defaultOutputName = 'dist';

/**
 * The project's own folder: the folder of the nearest configuration file (see findConfigFile), else the top of the
 * repository (else the working folder). A configuration named with --config does not move it: such a file often sits
 * in a folder of its own (config/), and the site stays where a build without it puts it. Defaults that name a place
 * of the project are taken from here, so that a command finds the same place from any folder of the repository.
 */
export function projectFolder(io: { cwd: string }, options: { config?: string } = {}): string {
  const configFile = options.config ? undefined : findConfigFile(io.cwd);
  return configFile ? dirname(configFile) : projectRoot(io.cwd);
}

/**
 * The folder `build` writes the manual to and `serve` and `verify` read it from when none is given: `dist/` in the
 * project's folder (see projectFolder), relative to the working folder. An --out or --dir given stays as written.
 */
export function defaultOutputFolder(io: { cwd: string }, options: { config?: string } = {}): string {
  return relative(io.cwd, join(projectFolder(io, options), defaultOutputName)) || '.';
}

/**
 * The path the manual is served under, as written: the --base option, else `base:` in the configuration file,
 * else "" (the site's root). The commands parse it with model/site-base.ts and refuse a bad one.
 */
export function siteBaseSetting(io: { cwd: string }, options: { base?: string; config?: string } = {}): string {
  if (options.base !== undefined) return options.base;
  const configFile = options.config ? resolve(io.cwd, options.config) : findConfigFile(io.cwd);
  const value = configFile ? configuredValue(configFile, 'base') : undefined;
  return typeof value === 'string' ? value : '';
}

/** The path the manual is served under, in its one form ("/" or e.g. "/manual/"); a bad one is a usage error. */
export function siteBase(io: { cwd: string }, options: { base?: string; config?: string } = {}): SiteBase {
  const parsed = parseBase(siteBaseSetting(io, options));
  if ('problem' in parsed) {
    throw new UsageError(options.base !== undefined ? `--base: ${parsed.problem}` : `'base' in the configuration file: ${parsed.problem}`);
  }
  return parsed.base;
}

/** True when `path` is `folder` or lies inside it (both absolute). */
export function isInside(path: string, folder: string): boolean {
  const rel = relative(folder, path);
  return rel === '' || (!rel.startsWith('..') && !isAbsolute(rel));
}
