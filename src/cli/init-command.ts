// `stepwright init`: sets up a plant repository for Stepwright. Writes only files that are not there yet and
// says what it skipped; the one exception is .gitignore, to which it appends the entries it lacks.
import { appendFileSync, cpSync, existsSync, mkdirSync, readdirSync, readFileSync, statSync, writeFileSync } from 'node:fs';
import { dirname, join, relative, sep } from 'node:path';
import { parseArgs } from 'node:util';
import { configFileName } from '../check/config.ts';
import { exampleRegisterText } from './example-register.ts';
import { UsageError, type CliIo } from './io.ts';
import { packagedDemo, packagedDemoRegister, packagedSchema, packageRoot } from './package-files.ts';
import { defaultProceduresFolder, projectRoot } from './project.ts';
import { initHelp } from './command-help.ts';
import { isMarkdownName } from '../engine/markdown-name.ts';

export { initHelp };

/** The example procedure written by a plain init (a complete, approved procedure from the demo manual). */
const exampleProcedure = join('unloading', 'u2-unl-xyl-001.md');
// The built manual's path is a link to its current version, and git matches a pattern ending in '/' only to a
// folder: 'dist', not 'dist/', keeps it out of the repository.
const ignoreEntries = ['node_modules/', 'dist', 'dist.versions/', '.stepwright/'];

export async function runInit(argv: string[], io: CliIo): Promise<number> {
  const { values, positionals } = parseArgs({
    args: argv,
    allowPositionals: true,
    options: { procedures: { type: 'string' }, demo: { type: 'boolean', default: false }, help: { type: 'boolean', short: 'h' } },
    strict: true,
  });
  if (values.help) {
    io.stdout.write(initHelp);
    return 0;
  }
  if (positionals.length) throw new UsageError(`Unexpected argument '${positionals[0]}'.`);
  const folder = (values.procedures?.trim() || defaultProceduresFolder).replace(/[\\/]+$/, '');
  if (!folder || folder.startsWith('..') || folder.startsWith('/')) throw new UsageError('Give the procedures folder inside this repository, e.g. --procedures procedures.');
  const root = io.cwd;
  const written: string[] = [];
  const skipped: string[] = [];
  const show = (path: string) => relative(root, path).split(sep).join('/');
  const writeNew = (path: string, text: string) => {
    if (existsSync(path)) {
      skipped.push(show(path));
      return;
    }
    mkdirSync(dirname(path), { recursive: true });
    writeFileSync(path, text, { flag: 'wx' });
    written.push(show(path));
  };

  writeNew(join(root, configFileName), configText(folder));

  const procedures = join(root, folder);
  if (values.demo) {
    copyTree(packagedDemo, procedures, written, skipped, show);
    // The demo procedures read their plant data from the demo register, found next to the configuration.
    if (existsSync(packagedDemoRegister)) copyTree(packagedDemoRegister, join(root, 'register'), written, skipped, show);
  } else if (existsSync(procedures) && readdirSync(procedures).some((n) => isMarkdownName(n) || statSync(join(procedures, n)).isDirectory())) {
    skipped.push(`${show(procedures)}/ (already holds procedures; no example added)`);
  } else {
    const example = readFileSync(join(packagedDemo, exampleProcedure), 'utf8');
    writeNew(join(procedures, 'example', 'u2-unl-xyl-001.md'), example);
    // The register entries the example uses, so that it checks clean; a register already there is left alone.
    const register = existsSync(packagedDemoRegister) ? exampleRegisterText(example, packagedDemoRegister) : null;
    if (register && existsSync(join(root, 'register'))) skipped.push(`register/ (already there; the example uses ${register.names.join(', ')} from it)`);
    else if (register) writeNew(join(root, 'register', 'plant.yaml'), register.text);
  }

  const gitignore = join(root, '.gitignore');
  const present = existsSync(gitignore) ? readFileSync(gitignore, 'utf8') : '';
  const lines = new Set(present.split(/\r?\n/).map((l) => l.trim()));
  const missing = ignoreEntries.filter((e) => !lines.has(e) && !lines.has(`/${e}`) && !(e.endsWith('/') && lines.has(e.slice(0, -1))));
  if (missing.length) {
    appendFileSync(gitignore, `${present && !present.endsWith('\n') ? '\n' : ''}${present ? '\n' : ''}# Stepwright: the built manual and its caches\n${missing.join('\n')}\n`);
    written.push(`.gitignore (${present ? 'added' : 'new:'} ${missing.join(' ')})`);
  } else skipped.push('.gitignore (has the entries)');

  writeNew(join(root, '.vscode', 'settings.json'), editorSettings(root, folder));
  writeNew(join(root, '.github', 'workflows', 'procedures.yml'), readFileSync(join(packageRoot, 'examples', 'github-workflow.yml'), 'utf8')
    .replace(/^# Stepwright on GitHub Actions: copy to[^\n]*\n/, '# Stepwright on GitHub Actions (written by stepwright init).\n')
    .replaceAll("'procedures/**'", `'${folder}/**'`));

  io.stdout.write(written.length ? `Wrote:\n${written.map((w) => `  ${w}`).join('\n')}\n` : 'Nothing to write.\n');
  if (skipped.length) io.stdout.write(`Left as they are (already there):\n${skipped.map((s) => `  ${s}`).join('\n')}\n`);
  io.stdout.write(`Next: npx stepwright check, npx stepwright dev (live preview), npx stepwright build (the manual, into dist/).
Commit the new files; the workflow runs on your next push.
`);
  return 0;
}

function configText(folder: string): string {
  return `# Stepwright settings for this repository (see the stepwright docs/format.md and docs/review.md).
# The folder that holds the procedures, relative to this file.
procedures: ${folder}
# The path the manual is served under, when not the site's root (e.g. an intranet folder):
#   base: /manual/
# Rule severities: error, warning, info or off. Example:
#   rules:
#     placeholder-text: error
rules: {}
`;
}

/** VS Code: the front-matter schema for the procedure files (the YAML extension reads it for .yaml drafts). */
function editorSettings(root: string, folder: string): string {
  const inProject = relative(projectRoot(root), packagedSchema);
  const schema = inProject.startsWith('..') ? 'node_modules/stepwright/schema/procedure.schema.json' : relative(root, packagedSchema).split(sep).join('/');
  return `${JSON.stringify({ 'yaml.schemas': { [`./${schema}`]: [`${folder}/**/*.md`, `${folder}/**/*.yaml`, `${folder}/**/*.yml`] } }, null, 2)}\n`;
}

function copyTree(from: string, to: string, written: string[], skipped: string[], show: (p: string) => string): void {
  for (const name of readdirSync(from).sort()) {
    const source = join(from, name);
    const target = join(to, name);
    if (statSync(source).isDirectory()) {
      copyTree(source, target, written, skipped, show);
      continue;
    }
    if (existsSync(target)) {
      skipped.push(show(target));
      continue;
    }
    mkdirSync(to, { recursive: true });
    cpSync(source, target, { errorOnExist: true, force: false });
    written.push(show(target));
  }
}
