// `stepwright review --base <ref>`: a Markdown summary of the procedure changes since a base, for a pull request.
import { readFileSync } from 'node:fs';
import { writeOutputFile } from './output-file.ts';
import { join, relative, resolve, sep } from 'node:path';
import { parseArgs } from 'node:util';
import { runCheckRun, type CheckRun } from '../engine/check-run.ts';
import { readProcedure } from '../read/read-procedure.ts';
import { buildProcedure } from '../model/build-procedure.ts';
import type { Procedure } from '../model/procedure.ts';
import { defaultReviewPolicy, parseReviewPolicy, requiredSignOffs, type PolicyEntry } from '../history/approval-policy.ts';
import { GitError, showFiles } from '../history/git.ts';
import { changedPaths, describeBase, resolveCommit, type ChangedPath } from '../history/previous-version.ts';
import { redline } from '../history/redline.ts';
import { deletedProcedureError, inForceAtBase } from '../history/deleted-procedures.ts';
import { renderReviewMarkdown, reviewHeading, type ReviewedFile } from '../history/review-summary.ts';
import { formatGithub } from './format-github.ts';
import { UsageError, type CliIo } from './io.ts';
import { openRepository, repoPath, type Repository } from './repository.ts';
import { proceduresFolder } from './project.ts';
import { findRegisterFolder } from './load-register.ts';
import { registerImpact } from '../history/register-impact.ts';
import { registerAt } from '../history/register-history.ts';
import { registerPlace } from '../engine/register-place.ts';
import { isMarkdownName } from '../engine/markdown-name.ts';
import { reviewHelp } from './command-help.ts';

export { reviewHelp };

export async function runReview(argv: string[], io: CliIo): Promise<number> {
  const { values, positionals } = parseArgs({
    args: argv,
    allowPositionals: true,
    options: {
      base: { type: 'string' }, format: { type: 'string', default: 'markdown' }, output: { type: 'string' }, help: { type: 'boolean', short: 'h' },
      procedures: { type: 'string' }, config: { type: 'string' },
    },
    strict: true,
  });
  if (values.help) {
    io.stdout.write(reviewHelp);
    return 0;
  }
  if (!values.base) throw new UsageError("Missing '--base <ref>', e.g. '--base origin/main'.");
  if (values.format !== 'markdown' && values.format !== 'github' && values.format !== 'json') throw new UsageError(`Unknown format '${values.format}'; use markdown, json or github.`);

  const paths = positionals.length ? [...positionals, ...(values.procedures ? [values.procedures] : [])] : [proceduresFolder(io, values)];
  // The repository that holds the procedures, wherever the command was started.
  const repo = openRepository(io, paths[0]);
  if (!repo) {
    io.stderr.write(`stepwright review: ${paths[0]} is not inside a git repository; review compares against a git base.\n`);
    return 2;
  }

  try {
    const report = await buildReview(repo, io, values.base, { paths: positionals, procedures: values.procedures, config: values.config }, paths);
    if ('problems' in report) {
      io.stderr.write(`stepwright review: ${report.file} has a bad 'review-policy':\n${report.problems.map((p) => `  ${p}`).join('\n')}\n`);
      return 2;
    }
    const markdown = renderReviewMarkdown(report.input);
    if (values.output) {
      // An earlier summary starts as this one does.
      writeOutputFile(resolve(io.cwd, values.output), markdown, io.cwd, {
        what: "a review summary written by 'stepwright review'",
        isOwn: (existing) => existing.startsWith(reviewHeading),
      });
    }
    if (values.format === 'github') io.stdout.write(formatGithub(report.diagnostics, (file) => repoPath(repo, file)));
    else if (values.format === 'json') io.stdout.write(reviewJson(report.input, report.diagnostics));
    else io.stdout.write(markdown);
    return report.diagnostics.some((d) => d.severity === 'error') ? 1 : 0;
  } catch (error) {
    if (!(error instanceof GitError)) throw error;
    io.stderr.write(`stepwright review: ${error.message}\n`);
    return 2;
  }
}

/** What the user named: the same request as `stepwright check` gets. */
interface ReviewRequest {
  paths: string[];
  procedures?: string;
  config?: string;
}

async function buildReview(repo: Repository, io: CliIo, base: string, request: ReviewRequest, paths: string[]) {
  const notices: string[] = [];
  const baseTip = await resolveCommit(repo.git, base);
  let baseCommit = baseTip;
  try {
    baseCommit = (await repo.git(['merge-base', baseTip, 'HEAD'])).trim();
  } catch {
    notices.push(repo.shallow
      ? `This is a shallow clone and the merge base of '${base}' and HEAD is not in it, so the change is compared with the tip of '${base}' and may include changes made there since. Fetch the full history ('git fetch --unshallow'; in GitHub Actions: actions/checkout with 'fetch-depth: 0').`
      : `'${base}' and HEAD share no history; the change is compared with the tip of '${base}'.`);
  }

  const pathspecs = paths.map((p) => repoPath(repo, resolve(io.cwd, p)));
  const tracked = changedPaths(await repo.git(['diff', '--name-status', '-M', '-z', baseCommit, '--', ...pathspecs]));
  const untracked = (await repo.git(['ls-files', '--others', '--exclude-standard', '-z', '--', ...pathspecs]))
    .split('\0').filter(Boolean).map((path): ChangedPath => ({ status: 'A', path }));
  const changes = [...tracked, ...untracked].filter((c) => isMarkdownName(c.path)).sort((a, b) => a.path.localeCompare(b.path));

  const oldTexts = new Map<string, string>();
  const existing = changes.filter((c) => c.status !== 'A');
  const shown = await showFiles(repo.git, existing.map((c) => `${baseCommit}:${c.oldPath ?? c.path}`));
  for (const c of existing) {
    const text = shown.get(`${baseCommit}:${c.oldPath ?? c.path}`);
    if (text !== undefined) oldTexts.set(c.path, text);
  }

  // The same check run as `stepwright check` (configuration, register, waivers, cache), with the history
  // rules judging each file against the base instead of the last commit.
  const run = await runCheckRun({
    cwd: io.cwd, env: io.env, now: io.now, paths: request.paths, procedures: request.procedures, config: request.config, date: 'clock',
    history: {
      repo,
      previous: (file) => {
        const text = oldTexts.get(repoPath(repo, resolve(io.cwd, file)));
        return text === undefined ? undefined : { text, commit: describeBase(base, baseCommit) };
      },
    },
  });
  // The review policy comes from the configuration the check run has read (one read, one parse).
  const policy = reviewPolicyOf(run);
  if ('problems' in policy) return policy;
  const { inputs, result, register } = run;
  // The register at the base: a changed entry reaches every procedure that uses it.
  const location = findRegisterFolder(io.cwd, run.config.file?.file, run.config.config.register, paths[0]);
  const baseRegister = location ? await registerAt(registerPlace(repo, location.absolute, io.cwd), baseCommit) : undefined;
  const inputByPath = new Map(inputs.map((i) => [repoPath(repo, resolve(io.cwd, i.file)), i]));
  const configErrors = run.config.diagnostics.filter((d) => d.severity === 'error');
  if (configErrors.length) {
    notices.push(`The configuration ${run.config.file?.file ?? ''} has ${configErrors.length} error${configErrors.length === 1 ? '' : 's'}, so its rule settings were not applied: ${configErrors.map((d) => `line ${d.line}: ${d.message}`).join(' ')} Run 'stepwright check' for details.`);
  }
  const diagnosticsOf = new Map(result.files.map((f) => [repoPath(repo, resolve(io.cwd, f.file)), f.diagnostics]));

  // A procedure approved or in force at the base and deleted (not moved: no file holds its id now) is an error, as
  // in `check --base`.
  const idsNow = new Set(result.files.flatMap((f) => (f.procedure?.id ? [f.procedure.id] : [])));
  const deletedErrors = (before: Procedure, path: string) => before.id && inForceAtBase.has(String(before.status)) && !idsNow.has(before.id)
    ? [deletedProcedureError({ path, id: before.id, status: String(before.status), revision: before.revision === undefined ? undefined : String(before.revision) }, base, relative(io.cwd, resolve(repo.root, path)).split(sep).join('/'))]
    : [];
  const files: ReviewedFile[] = [];
  for (const c of changes) {
    const input = inputByPath.get(c.path);
    const newText = c.status === 'D' ? undefined : input && 'text' in input ? input.text : readIfThere(join(repo.root, c.path));
    const oldText = oldTexts.get(c.path);
    const before = oldText === undefined ? undefined : procedureIn(c.oldPath ?? c.path, oldText);
    const after = newText === undefined ? undefined : procedureIn(c.path, newText);
    if (!before && !after) continue;
    if (newText !== undefined && !after) {
      // The file is there but cannot be read as a procedure now: the check results say why; no redline is possible.
      files.push({ path: c.path, ...(c.oldPath ? { oldPath: c.oldPath } : {}), change: 'modified', ...(before ? { before } : {}), signOffs: [], diagnostics: diagnosticsOf.get(c.path) ?? [] });
      continue;
    }
    const lines = redline(before ?? emptyProcedure(c.path), after ?? emptyProcedure(c.path));
    files.push({
      path: c.path,
      ...(c.oldPath ? { oldPath: c.oldPath } : {}),
      change: c.status === 'D' ? 'deleted' : !before ? 'added' : c.oldPath ? 'renamed' : 'modified',
      ...(before ? { before } : {}),
      ...(after ? { after } : {}),
      redline: lines,
      signOffs: requiredSignOffs(lines, policy.policy),
      diagnostics: c.status === 'D' && before ? deletedErrors(before, c.path) : diagnosticsOf.get(c.path) ?? [],
    });
  }
  const registerChanges = register || baseRegister
    ? registerImpact(
      baseRegister, register,
      result.files.flatMap((f) => {
        if (!f.procedure) return [];
        const old = oldTexts.get(repoPath(repo, resolve(io.cwd, f.file)));
        const atBase = old === undefined ? undefined : readProcedure(f.file, old, baseRegister).procedure ?? undefined;
        return [{ now: f.procedure, ...(atBase ? { atBase } : {}) }];
      }),
      (p) => {
        const old = oldTexts.get(repoPath(repo, resolve(io.cwd, p.file)));
        if (old === undefined) return changes.some((c) => c.status === 'A' && c.path === repoPath(repo, resolve(io.cwd, p.file)));
        return readProcedure(p.file, old).procedure?.revision !== p.revision;
      },
    )
    : [];
  // Errors anywhere else stop the build as well: a caller of a deleted procedure, a register entry at odds with a
  // changed trip. They are listed apart, since the change may or may not have caused them.
  const reviewed = new Set(files.map((f) => f.path));
  const configFile = run.config.file?.file;
  const otherErrors = run.diagnostics.filter((d) => d.severity === 'error' && d.file !== configFile && !reviewed.has(repoPath(repo, resolve(io.cwd, d.file))));
  return {
    input: { base, baseCommit, files, policySource: policy.source, notices, registerChanges, otherErrors },
    diagnostics: [...configErrors, ...files.flatMap((f) => f.diagnostics), ...otherErrors],
  };
}

/** A procedure file is one whose front-matter reads as a procedure; other markdown (READMEs) is skipped. */
function procedureIn(path: string, text: string): Procedure | undefined {
  const p = readProcedure(path, text).procedure;
  return p && (p.id || p.steps.length) ? p : undefined;
}

function emptyProcedure(path: string): Procedure {
  return buildProcedure(path, {}, { type: 'root', children: [] }, '');
}

function readIfThere(file: string): string | undefined {
  try {
    return readFileSync(file, 'utf8');
  } catch {
    return undefined;
  }
}

/** The review policy in the configuration the check run read, else the default one. */
function reviewPolicyOf(run: CheckRun): { policy: PolicyEntry[]; source: string } | { problems: string[]; file: string } {
  const file = run.config.file?.file ?? 'stepwright.config.yaml';
  const value = run.config.config.reviewPolicy;
  if (value === undefined) return { policy: defaultReviewPolicy, source: 'default review policy (docs/review.md)' };
  const parsed = parseReviewPolicy(value);
  if ('problems' in parsed) return { file, problems: parsed.problems };
  return { policy: parsed.policy, source: `review policy in ${file}` };
}

/** The review as JSON for tools: the facts of the Markdown summary without the rendered tables and charts. */
function reviewJson(input: { base: string; baseCommit: string; files: ReviewedFile[]; policySource: string; notices: string[]; otherErrors?: unknown[] }, diagnostics: Array<{ severity: string }>): string {
  const side = (p: Procedure | undefined) => (p ? { id: p.id, revision: p.revision, status: p.status } : null);
  return `${JSON.stringify({
    base: input.base,
    baseCommit: input.baseCommit,
    policy: input.policySource,
    notices: input.notices,
    errors: diagnostics.filter((d) => d.severity === 'error').length,
    files: input.files.map((f) => ({
      path: f.path,
      ...(f.oldPath ? { oldPath: f.oldPath } : {}),
      change: f.change,
      before: side(f.before),
      after: side(f.after),
      signOffs: f.signOffs.map((s) => ({ role: s.role, reasons: s.reasons, signed: s.signedBy ? { name: s.signedBy.name, date: s.signedBy.date } : null })),
      diagnostics: f.diagnostics,
    })),
    otherErrors: input.otherErrors ?? [],
  }, null, 2)}\n`;
}
