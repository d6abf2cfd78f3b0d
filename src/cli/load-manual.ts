// Reads and checks the procedures folder for a site build: the same reading as `stepwright check`,
// plus the build date (never the wall clock, so a build is reproducible byte for byte).
import { execFileSync } from 'node:child_process';
import { existsSync } from 'node:fs';
import { resolve } from 'node:path';
import { proceduresFolder } from './project.ts';
import { checkSources, type CheckResult, type SourceInput } from '../check/run-checks.ts';
import { buildManualView, type ManualView } from '../render/manual.ts';
import { formatHuman, summarize } from './format-diagnostics.ts';
import { loadConfig } from './load-config.ts';
import { loadRegister } from './load-register.ts';
import { commandCache } from './command-cache.ts';
import { readProcedureFiles } from './read-procedure-files.ts';
import { procedureStamp, tolerantManualView } from './dev-manual.ts';

export interface LoadedManual {
  root: string;
  today: string;
  /** Where the build date came from, shown in the site footer. */
  todaySource: 'STEPWRIGHT_TODAY' | 'last commit' | 'procedure dates';
  inputs: SourceInput[];
  result: CheckResult;
  errors: number;
  /** Present when the check found no errors. */
  view?: ManualView;
}

export interface LoadOptions {
  cwd: string;
  env: Record<string, string | undefined>;
}

/** The procedures folder of a build (`stepwright build` hands its choice to the pages in $STEPWRIGHT_PROCEDURES). */
function manualFolder(options: LoadOptions): string {
  return proceduresFolder(options, { config: options.env.STEPWRIGHT_CONFIG });
}

/** The build date: STEPWRIGHT_TODAY, else the last commit's date, else the newest effective or approval date. */
export function buildDate(options: LoadOptions, inputs: SourceInput[]): { today: string; source: LoadedManual['todaySource'] } {
  const fixed = options.env.STEPWRIGHT_TODAY;
  if (fixed && /^\d{4}-\d{2}-\d{2}$/.test(fixed)) {
    // `stepwright build` hands its own date to the pages and says where it came from.
    const told = options.env.STEPWRIGHT_TODAY_SOURCE;
    const source = told === 'last commit' || told === 'procedure dates' ? told : 'STEPWRIGHT_TODAY';
    return { today: fixed, source };
  }
  try {
    // The repository that holds the procedures, not the one the command was started in.
    const folder = resolve(options.cwd, manualFolder(options));
    const out = execFileSync('git', ['log', '-1', '--format=%cs'], { cwd: existsSync(folder) ? folder : options.cwd, encoding: 'utf8', stdio: ['ignore', 'pipe', 'ignore'] }).trim();
    if (/^\d{4}-\d{2}-\d{2}$/.test(out)) return { today: out, source: 'last commit' };
  } catch {
    // Not a git checkout: fall back to the content itself.
  }
  // Dates that have happened (effective and approval dates), never planned ones such as review-by.
  const dates = inputs.flatMap((i) => ('text' in i ? [...i.text.matchAll(/(?<![\w-])(?:effective|date):\s*(\d{4}-\d{2}-\d{2})\b/g)].map((m) => m[1]) : []));
  return { today: dates.sort().at(-1) ?? '1970-01-01', source: 'procedure dates' };
}

export function loadManual(options: LoadOptions): LoadedManual {
  const root = manualFolder(options);
  const inputs = readProcedureFiles([root], options.cwd);
  const { today, source } = buildDate(options, inputs);
  // The site judges procedures by the same stepwright.config.yaml as `stepwright check`.
  const configured = loadConfig(options, options.env.STEPWRIGHT_CONFIG || undefined);
  const register = loadRegister(options.cwd, configured.file?.file, configured.config.register);
  const result = checkSources(inputs, {
    today, severity: configured.policy, register, certificationIntervalMonths: configured.config.certificationIntervalMonths,
    cache: commandCache(options, configured.file?.text),
  });
  const errors = result.diagnostics.filter((d) => d.severity === 'error').length;
  const view = errors === 0 ? buildManualView({ files: result.files, root, today }) : undefined;
  return { root, today, todaySource: source, inputs, result, errors, view };
}

/** Check output exactly as `stepwright check` prints it, for a failed build. */
export function formatCheckFailure(loaded: LoadedManual, colour: boolean): string {
  const texts = new Map(loaded.inputs.flatMap((i) => ('text' in i ? [[i.file, i.text] as const] : [])));
  for (const r of loaded.result.register?.register.sources ?? []) texts.set(r.file, r.source.text);
  return formatHuman(loaded.result.diagnostics, texts, colour) + summarize(loaded.result.diagnostics, loaded.inputs.length);
}

let cached: { key: string; loaded: LoadedManual } | undefined;

/** The manual for the site's pages: read once per build; a build with check errors stops with check's report. */
export function siteManual(): { loaded: LoadedManual; view: ManualView } {
  // The dev server (live preview) re-reads on every save and shows check errors on the pages instead of failing.
  const dev = (import.meta as { env?: { DEV?: boolean } }).env?.DEV === true;
  const stamp = dev ? procedureStamp(manualFolder({ cwd: process.cwd(), env: process.env }), process.cwd()) : '';
  const key = `${process.cwd()}\u0000${process.env.STEPWRIGHT_PROCEDURES ?? ''}\u0000${process.env.STEPWRIGHT_CONFIG ?? ''}\u0000${process.env.STEPWRIGHT_TODAY ?? ''}\u0000${stamp}`;
  if (!cached || cached.key !== key) cached = { key, loaded: loadManual({ cwd: process.cwd(), env: process.env }) };
  const { loaded } = cached;
  if (!loaded.view && dev) loaded.view = tolerantManualView({ files: loaded.result.files, root: loaded.root, today: loaded.today });
  if (!loaded.view) throw new Error(`The procedures have check errors; the manual was not built.\n\n${formatCheckFailure(loaded, false)}`);
  return { loaded, view: loaded.view };
}
