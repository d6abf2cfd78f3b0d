// `stepwright build --out` publishes only where nothing of the user's can be lost: a new or empty folder, or a manual
// an earlier build published there. A folder of the user's, a link it made, a file, and any folder that is or holds
// the procedures, the register, the configuration, the working folder or the repository are refused before anything
// is read, with a message that names the folder and what it holds, and are left exactly as they were.
import { execFileSync, spawnSync } from 'node:child_process';
import { cpSync, lstatSync, mkdirSync, readdirSync, readFileSync, symlinkSync, writeFileSync } from 'node:fs';
import { join } from 'node:path';
import fc from 'fast-check';
import { describe, expect, it } from 'vitest';
import { foreignLink, outputPlaceProblem } from '../../src/cli/output-place.ts';
import { runCli } from './run-cli.ts';
import { tempFolder } from '../temp-folder.ts';

const repo = join(import.meta.dirname, '..', '..');
const nitrogen = readFileSync(join(repo, 'procedures', 'utilities', 'u2-n2-su-001.md'), 'utf8');

/** A plant repository: procedures, a register, a configuration file, one commit. */
function plant(): string {
  const dir = tempFolder('stepwright-out-');
  mkdirSync(join(dir, 'procedures'));
  writeFileSync(join(dir, 'procedures', 'u2-n2-su-001.md'), nitrogen);
  cpSync(join(repo, 'register'), join(dir, 'register'), { recursive: true });
  mkdirSync(join(dir, 'config'));
  writeFileSync(join(dir, 'config', 'stepwright.config.yaml'), 'procedures: ../procedures\n');
  execFileSync('git', ['init', '-q', '-b', 'main'], { cwd: dir });
  return dir;
}

/** Every file under a folder with its content (links by their target), to show nothing changed. */
function snapshot(dir: string): Record<string, string> {
  const out: Record<string, string> = {};
  for (const name of readdirSync(dir, { recursive: true, withFileTypes: true })) {
    const full = join(name.parentPath, name.name);
    if (full.includes(`${join(dir, '.git')}`)) continue;
    out[full.slice(dir.length)] = name.isSymbolicLink() ? `link` : name.isFile() ? readFileSync(full, 'utf8') : 'folder';
  }
  return out;
}

describe('where a build may publish', () => {
  it.each([
    ['site', /'site' holds files a build did not write \(notes\.txt\)/],
    ['procedures', /'procedures' is the procedures folder/],
    ['procedures/manual', /'procedures\/manual' is inside the procedures folder/],
    ['register', /'register' is the plant register/],
    ['register/manual', /'register\/manual' is inside the plant register/],
    ['config', /'config' holds the configuration file \(config\/stepwright\.config\.yaml\)/],
    ['.', /'\.' is the folder the command runs in/],
    ['..', /'\.\.' holds the folder the command runs in/],
    ['.git', /'\.git' is git's own folder/],
    ['notes.md', /'notes\.md' is a file, not a folder/],
  ])('refuses --out %s before reading anything, and leaves everything as it was', async (out, message) => {
    const dir = plant();
    mkdirSync(join(dir, 'site'));
    writeFileSync(join(dir, 'site', 'notes.txt'), 'Shift notes');
    writeFileSync(join(dir, 'notes.md'), 'Notes');
    const before = snapshot(dir);
    const run = await runCli(['build', '--config', 'config/stepwright.config.yaml', '--out', out], dir);
    expect(run.code).toBe(2);
    expect(run.stderr).toMatch(message);
    expect(run.stderr).toContain('--out');
    expect(run.stdout).toBe('');
    expect(snapshot(dir)).toEqual(before);
  });

  it('refuses the repository from a folder inside it', async () => {
    const dir = plant();
    const run = await runCli(['build', '--out', '..'], join(dir, 'procedures'));
    expect(run.code).toBe(2);
    expect(run.stderr).toMatch(/is the folder the command runs in|holds the folder the command runs in|is the git repository/);
  });

  it('takes a new folder, an empty one, a manual published there, and the link a build made', () => {
    const dir = plant();
    const guarded = [{ path: join(dir, 'procedures'), what: 'the procedures folder', notInside: true }];
    expect(outputPlaceProblem(join(dir, 'dist'), dir, guarded)).toBeUndefined();
    mkdirSync(join(dir, 'empty'));
    expect(outputPlaceProblem(join(dir, 'empty'), dir, guarded)).toBeUndefined();
    mkdirSync(join(dir, 'old'));
    writeFileSync(join(dir, 'old', 'index.html'), '<h1>Manual</h1>');
    writeFileSync(join(dir, 'old', 'stepwright-manifest.json'), '{}');
    expect(outputPlaceProblem(join(dir, 'old'), dir, guarded)).toBeUndefined();
    mkdirSync(join(dir, 'dist.versions', 'site-001796498372183-4242'), { recursive: true });
    symlinkSync(join('dist.versions', 'site-001796498372183-4242'), join(dir, 'dist'));
    expect(outputPlaceProblem(join(dir, 'dist'), dir, guarded)).toBeUndefined();
    expect(foreignLink(join(dir, 'dist'))).toBeUndefined();
    // A link the build did not make (to a web server's folder, say) is replaced by the build's own link; what it
    // points to is left as it was, and the build says so.
    symlinkSync('old', join(dir, 'web'));
    expect(outputPlaceProblem(join(dir, 'web'), dir, guarded)).toBeUndefined();
    expect(foreignLink(join(dir, 'web'))).toBe(join(dir, 'old'));
  });

  it('refuses any output path that is or holds a guarded place, and any inside one that must not hold it (property)', () => {
    const dir = tempFolder('stepwright-out-');
    const segment = fc.constantFrom('a', 'b', 'c');
    const path = fc.array(segment, { minLength: 1, maxLength: 4 }).map((parts) => join(dir, ...parts));
    fc.assert(
      fc.property(path, path, fc.boolean(), (out, guardedPath, notInside) => {
        const problem = outputPlaceProblem(out, dir, [{ path: guardedPath, what: 'the place', notInside }]);
        const holds = guardedPath === out || guardedPath.startsWith(`${out}/`);
        const inside = out.startsWith(`${guardedPath}/`);
        // Nothing exists under the temporary folder: only where it lies decides.
        expect(problem !== undefined).toBe(holds || (notInside && inside));
      }),
      { numRuns: 300 },
    );
  });

  it('publishes into the default folder as before, and again over its own link', async () => {
    const dir = plant();
    execFileSync('git', ['add', '-A'], { cwd: dir });
    execFileSync('git', ['-c', 'user.name=Plant Engineer', '-c', 'user.email=engineer@alder-reach.example', 'commit', '-q', '-m', 'Nitrogen start-up'], { cwd: dir });
    // Whole processes, as a plant runs them.
    const build = () => spawnSync(process.execPath, [join(repo, 'bin', 'stepwright.mjs'), 'build', '--config', 'config/stepwright.config.yaml'], {
      cwd: dir, encoding: 'utf8', env: { ...process.env, NO_COLOR: '1', STEPWRIGHT_TODAY: '2026-12-01' }, timeout: 200_000,
    });
    const first = build();
    expect(first.status, first.stderr).toBe(0);
    // A full clone: the log has no word of a shallow one (tests/cli/shallow-build.test.ts).
    expect(first.stdout).toMatch(/^Built 1 procedures/m);
    expect(first.stdout).not.toContain('shallow clone');
    expect(lstatSync(join(dir, 'dist')).isSymbolicLink()).toBe(true);
    const second = build();
    expect(second.status, second.stderr).toBe(0);
    expect(readFileSync(join(dir, 'dist', 'procedures', 'u2-n2-su-001', 'index.html'), 'utf8')).toContain('U2-N2-SU-001');
  }, 420_000);
});
