// `stepwright new KIND ID`: writes a new procedure with the sections its kind needs; never overwrites a file.
import { existsSync, mkdirSync, writeFileSync } from 'node:fs';
import { dirname, isAbsolute, join, relative, resolve, sep } from 'node:path';
import { parseArgs } from 'node:util';
import { checkSources } from '../check/run-checks.ts';
import { kinds, procedureIdPattern } from '../model/schema.ts';
import type { Kind } from '../model/procedure.ts';
import { scaffoldProcedure } from '../render/procedure-scaffold.ts';
import { todayOf, UsageError, type CliIo } from './io.ts';
import { schemaReference } from './package-files.ts';
import { isInside, projectRoot, proceduresFolder } from './project.ts';
import { readProcedureFiles, unreadFolderOf } from './read-procedure-files.ts';
import { newHelp } from './command-help.ts';
import { shellWord } from '../model/shell-word.ts';

export { newHelp };

export async function runNew(argv: string[], io: CliIo): Promise<number> {
  const { values, positionals } = parseArgs({
    args: argv,
    allowPositionals: true,
    options: { title: { type: 'string' }, dir: { type: 'string' }, procedures: { type: 'string' }, help: { type: 'boolean', short: 'h' } },
    strict: true,
  });
  if (values.help) {
    io.stdout.write(newHelp);
    return 0;
  }
  const [kind, id, ...extra] = positionals;
  if (!kind || !id) throw new UsageError('Give the kind and the id, e.g. stepwright new shutdown U2-K210-SD-002.');
  if (extra.length) throw new UsageError(`Unexpected argument '${extra[0]}'; quote a title with spaces: --title "…".`);
  if (!(kinds as readonly string[]).includes(kind)) throw new UsageError(`Unknown kind '${kind}'; use one of ${kinds.join(', ')}.`);
  if (!procedureIdPattern.test(id)) throw new UsageError(`'${id}' is not a procedure id: use upper-case letters, digits and hyphens, e.g. U2-K210-SD-002.`);
  if (values.title !== undefined && values.title.trim() === '') throw new UsageError('The title must not be empty.');

  const procedures = proceduresFolder(io, { procedures: values.procedures });
  const dir = values.dir ?? procedures;
  const folder = resolve(io.cwd, dir);
  const target = join(folder, `${id.toLowerCase()}.md`);
  const shown = relative(io.cwd, target) || target;
  // A procedure outside the procedures folder is never checked with the manual, built into it or reviewed: refuse,
  // rather than write a file that silently never reaches the operators.
  const proceduresPath = resolve(io.cwd, procedures);
  if (!isInside(folder, proceduresPath)) {
    const named = relative(io.cwd, proceduresPath) || '.';
    const given = relative(io.cwd, folder);
    io.stderr.write(`stepwright new: ${given.startsWith('..') || isAbsolute(given) ? folder : given || '.'} is outside the procedures folder ${named}/, so a procedure written there would not be checked with the manual, built into it or reviewed; nothing was written.
Give a folder inside it, e.g. --dir ${shellWord(join(named, 'new-area').split(sep).join('/'))}, or, if the manual's procedures are elsewhere, name that folder with --procedures (or 'procedures:' in stepwright.config.yaml).
`);
    return 1;
  }
  // Nor into a folder the search passes over (node_modules, dist): the check would only name the file as not read.
  const unread = unreadFolderOf(folder, proceduresPath);
  if (unread) {
    const named = relative(io.cwd, proceduresPath) || '.';
    io.stderr.write(`stepwright new: ${shown} would lie in ${named}/${unread.folder}/, ${unread.why}, which check, build and verify do not read; nothing was written.
Give another folder inside ${named}/, e.g. --dir ${shellWord(join(named, 'new-area').split(sep).join('/'))}.
`);
    return 1;
  }
  if (existsSync(target)) {
    io.stderr.write(`stepwright new: ${shown} already exists; nothing was written.\nOpen it to edit, or choose another id.\n`);
    return 1;
  }
  const inUse = idInUse(id, [dir, ...(existsSync(resolve(io.cwd, procedures)) ? [procedures] : [])], io.cwd);
  if (inUse) {
    io.stderr.write(`stepwright new: id ${id} is already used by ${inUse}; nothing was written.\nA new revision goes into that file; a new procedure needs its own id.\n`);
    return 1;
  }

  // The editor hint names the project's own copy of the schema when it keeps one, else the one that ships
  // with this stepwright (in the project's node_modules).
  const ownSchema = resolve(io.cwd, 'schema', 'procedure.schema.json');
  const schemaPath = existsSync(ownSchema) ? relative(folder, ownSchema).split('\\').join('/') : schemaReference(folder, projectRoot(io.cwd));
  const text = scaffoldProcedure({ kind: kind as Kind, id, title: values.title, schemaPath });
  mkdirSync(dirname(target), { recursive: true });
  try {
    // 'wx' fails if the file appeared meanwhile: never overwrite.
    writeFileSync(target, text, { flag: 'wx' });
  } catch (error) {
    io.stderr.write(`stepwright new: could not write ${shown}: ${(error as Error).message}\n`);
    return 1;
  }
  const checked = checkSources([{ file: shown, text }], { today: todayOf(io) });
  const todos = checked.diagnostics.filter((d) => d.rule === 'placeholder-text').length;
  const others = checked.diagnostics.length - todos;
  io.stdout.write(`Created ${shown} (${kind}, draft, revision 0).
${todos} placeholders marked TODO are waiting to be filled in${others ? `; ${others} other findings` : ''}.
Next: fill them in, then check it and preview it:
  npx stepwright check ${shellWord(shown.split(sep).join('/'))}
  npx stepwright dev
`);
  return 0;
}

function idInUse(id: string, paths: string[], cwd: string): string | undefined {
  const existing = [...new Set(paths)].filter((p) => existsSync(resolve(cwd, p)));
  if (!existing.length) return undefined;
  for (const input of readProcedureFiles(existing, cwd)) {
    if (!('text' in input)) continue;
    const match = /^id:\s*["']?([A-Z0-9][A-Z0-9-]*)["']?\s*$/m.exec(input.text.slice(0, 4000));
    if (match?.[1] === id) return input.file;
  }
  return undefined;
}

