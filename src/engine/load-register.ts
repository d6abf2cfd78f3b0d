// Finds and reads the plant register: the folder named by `register:` in stepwright.config.yaml (relative to
// that file), else `register/` next to the configuration or in the working folder. No folder, no register.
import { existsSync, readdirSync, readFileSync, statSync } from 'node:fs';
import { dirname, join, relative, resolve } from 'node:path';
import { isInside } from './project.ts';
import { readYamlSource } from '../parse/read-yaml-source.ts';
import { buildRegister, type PlantRegister, type RegisterSource } from '../model/register.ts';

export const defaultRegisterFolder = 'register';

export interface RegisterLocation {
  /** Absolute path of the folder. */
  absolute: string;
  /** True when the configuration named it (then a missing folder is an error, not "no register"). */
  named: boolean;
}

/**
 * Where the register is, or undefined when the plant has none: `register:` in the configuration, else
 * `register/` next to the configuration, else `register/` in the working folder — the last only when the
 * procedures (`procedures`, when given) sit inside that folder, so a register never applies to another
 * plant's procedures checked from here.
 */
export function findRegisterFolder(cwd: string, configPath: string | undefined, named: string | undefined, procedures?: string): RegisterLocation | undefined {
  const base = configPath ? dirname(resolve(cwd, configPath)) : cwd;
  if (named) return { absolute: resolve(base, named), named: true };
  const candidates = configPath ? [join(base, defaultRegisterFolder)] : [];
  if (procedures === undefined || isInside(resolve(cwd, procedures), cwd)) candidates.push(join(cwd, defaultRegisterFolder));
  for (const candidate of candidates) {
    if (isFolder(candidate)) return { absolute: candidate, named: false };
  }
  return undefined;
}


/** Reads every *.yaml / *.yml file under the folder (sorted, recursively) into the register model. */
export function readRegisterFolder(location: RegisterLocation, cwd: string): PlantRegister {
  const shown = (absolute: string) => relative(cwd, absolute).replaceAll('\\', '/') || '.';
  const folder = shown(location.absolute);
  if (!isFolder(location.absolute)) {
    const register = buildRegister(folder, []);
    register.diagnostics.push({
      file: folder, line: 1, column: 1, endLine: 1, endColumn: 1, severity: 'error', rule: 'register-invalid',
      message: `The register folder '${folder}' named in the configuration does not exist, so nothing was checked against the register.`,
      hint: "Correct 'register:' in stepwright.config.yaml (a folder relative to that file), or remove the key.",
    });
    return register;
  }
  const sources: RegisterSource[] = [];
  const problems: Array<{ file: string; message: string }> = [];
  const files = registerFiles(location.absolute, (dir, error) => problems.push({ file: shown(dir), message: `the folder could not be read (${(error as NodeJS.ErrnoException).code ?? (error as Error).message})` }));
  for (const full of files) {
    const file = shown(full);
    try {
      const text = new TextDecoder('utf-8', { fatal: true }).decode(readFileSync(full));
      sources.push({ file, source: readYamlSource(file, text) });
    } catch (error) {
      problems.push({ file, message: (error as Error).name === 'TypeError' ? 'it is not valid UTF-8 text' : (error as Error).message });
    }
  }
  const register = buildRegister(folder, sources);
  for (const p of problems) {
    register.diagnostics.push({
      file: p.file, line: 1, column: 1, endLine: 1, endColumn: 1, severity: 'error', rule: 'register-invalid',
      message: `The register file could not be read: ${p.message}. Its entries were not loaded.`,
      hint: 'Save the file as UTF-8 text and make sure it can be read.',
    });
  }
  return register;
}

/**
 * The register's files, as every command reads them: *.yaml and *.yml under the folder, sorted, hidden names left
 * out. A folder that cannot be listed is told to `unreadable` and passed over.
 */
export function registerFiles(folder: string, unreadable: (dir: string, error: unknown) => void = () => undefined): string[] {
  const out: string[] = [];
  const walk = (dir: string) => {
    let names: string[];
    try {
      names = readdirSync(dir).sort();
    } catch (error) {
      unreadable(dir, error);
      return;
    }
    for (const name of names) {
      if (name.startsWith('.')) continue;
      const full = join(dir, name);
      if (isFolder(full)) walk(full);
      else if (/\.ya?ml$/i.test(name)) out.push(full);
    }
  };
  walk(folder);
  return out;
}

/** The register for a command: found from the configuration, read, or undefined when the plant has none. */
export function loadRegister(cwd: string, configPath: string | undefined, named: string | undefined, procedures?: string): PlantRegister | undefined {
  const location = findRegisterFolder(cwd, configPath, named, procedures);
  return location ? readRegisterFolder(location, cwd) : undefined;
}

function isFolder(path: string): boolean {
  try {
    return existsSync(path) && statSync(path).isDirectory();
  } catch {
    return false;
  }
}
