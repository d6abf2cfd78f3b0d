// Finds and reads stepwright.config.yaml for a command: from --config, or the nearest one from the working
// folder up to the top of its git repository.
import { existsSync, readFileSync } from 'node:fs';
import { dirname, isAbsolute, relative, resolve, sep } from 'node:path';
import type { Diagnostic } from '../parse/diagnostic.ts';
import { configFileName, emptyConfig, parseConfig, severityPolicy, type StepwrightConfig } from '../check/config.ts';
import type { SeverityPolicy } from '../check/run-checks.ts';
import { rules } from '../check/rules/index.ts';
import { UsageError } from './usage-error.ts';
import { findConfigFile } from './project.ts';
import { stdinName } from './find-procedure-files.ts';

export interface CommandConfig {
  config: StepwrightConfig;
  policy: SeverityPolicy;
  diagnostics: Diagnostic[];
  /** The config file as shown in diagnostics, with its text (for code frames); absent when there is none. */
  file?: { file: string; text: string };
}

export function loadConfig(io: { cwd: string }, explicit?: string): CommandConfig {
  const path = explicit ? resolve(io.cwd, explicit) : findConfigFile(io.cwd);
  if (!path || !existsSync(path)) {
    if (explicit) throw new UsageError(`The configuration file '${explicit}' does not exist.`);
    return { config: emptyConfig, policy: severityPolicy(emptyConfig), diagnostics: [] };
  }
  const file = relative(io.cwd, path) || configFileName;
  let text: string;
  try {
    text = readFileSync(path, 'utf8');
  } catch (error) {
    throw new UsageError(`The configuration file '${file}' could not be read: ${(error as Error).message}`);
  }
  const { config, diagnostics } = parseConfig(file, text, Object.keys(rules));
  return { config, policy: severityPolicy(config, fromConfigFolder(dirname(path), io.cwd)), diagnostics, file: { file, text } };
}

/**
 * Names a file (as the check names it: relative to the working folder, or absolute) relative to the folder that
 * holds the configuration file, with '/', which is how the `files` of an override are written. A procedure read
 * from standard input has no place and keeps its name.
 */
export function fromConfigFolder(configFolder: string, cwd: string): (file: string) => string {
  return (file) => {
    if (file === stdinName) return file;
    const absolute = isAbsolute(file) ? file : resolve(cwd, file);
    return relative(configFolder, absolute).split(sep).join('/') || '.';
  };
}
