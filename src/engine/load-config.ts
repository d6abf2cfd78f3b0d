// Finds and reads stepwright.config.yaml for a command: from --config, or the nearest one from the working
// folder up to the top of its git repository.
import { existsSync, readFileSync } from 'node:fs';
import { relative, resolve } from 'node:path';
import type { Diagnostic } from '../parse/diagnostic.ts';
import { configFileName, emptyConfig, parseConfig, severityPolicy, type StepwrightConfig } from '../check/config.ts';
import type { SeverityPolicy } from '../check/run-checks.ts';
import { rules } from '../check/rules/index.ts';
import { UsageError } from './usage-error.ts';
import { findConfigFile } from './project.ts';

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
  return { config, policy: severityPolicy(config), diagnostics, file: { file, text } };
}
