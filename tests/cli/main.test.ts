// Command-line conventions: --version from package.json, help <command>, and "did you mean" for a typo.
import { readFileSync } from 'node:fs';
import fc from 'fast-check';
import { describe, expect, it } from 'vitest';
import { commands, main, suggestCommand } from '../../src/cli/main.ts';

async function run(argv: string[]) {
  let stdout = '';
  let stderr = '';
  const code = await main(argv, { stdout: { write: (t: string) => (stdout += t) }, stderr: { write: (t: string) => (stderr += t) }, cwd: process.cwd(), env: {} });
  return { code, stdout, stderr };
}

const names = Object.keys(commands);

describe('stepwright --version and help', () => {
  it('prints the version written in package.json', async () => {
    const { version } = JSON.parse(readFileSync(new URL('../../package.json', import.meta.url), 'utf8')) as { version: string };
    expect(await run(['--version'])).toEqual({ code: 0, stdout: `stepwright ${version}\n`, stderr: '' });
  });

  it("'help <command>' prints that command's own help", async () => {
    for (const name of ['check', 'serve', 'review']) {
      const viaHelp = await run(['help', name]);
      expect(viaHelp.code).toBe(0);
      expect(viaHelp.stdout).toMatch(new RegExp(`^Usage: stepwright ${name}`));
    }
  });

  it("every command has help of its own, and 'help <command>' prints what the command prints for --help next to another option", async () => {
    for (const name of names) {
      const viaHelp = await run(['help', name]);
      expect(viaHelp.code).toBe(0);
      expect(viaHelp.stdout).toMatch(new RegExp(`^Usage: stepwright ${name}\\b`));
      // '--help' with another option goes through the command's own option parsing, which loads the command.
      const runner = await commands[name].load();
      let own = '';
      const code = await runner(['--help', '--help'], { stdout: { write: (t: string) => (own += t) }, stderr: { write: () => true }, cwd: process.cwd(), env: {} });
      expect({ code, own }).toEqual({ code: 0, own: viaHelp.stdout });
    }
  });

  it("'help' with an unknown command exits 2 and suggests the nearest", async () => {
    const r = await run(['help', 'chek']);
    expect(r.code).toBe(2);
    expect(r.stderr).toContain("Did you mean 'check'?");
  });
});

describe('did you mean', () => {
  it('a mistyped command gets the nearest name', async () => {
    const r = await run(['revew']);
    expect(r.code).toBe(2);
    expect(r.stderr).toMatch(/^stepwright: unknown command 'revew'\. Did you mean 'review'\?/);
  });

  it('a name far from every command gets no guess', async () => {
    const r = await run(['xyzzyplugh']);
    expect(r.code).toBe(2);
    expect(r.stderr).not.toContain('Did you mean');
  });

  it('one letter dropped from any command name suggests that command (property)', () => {
    fc.assert(fc.property(fc.constantFrom(...names.filter((n) => n.length >= 5)), fc.nat(), (name, at) => {
      const i = at % name.length;
      const typo = name.slice(0, i) + name.slice(i + 1);
      if (names.includes(typo)) return;
      expect(suggestCommand(typo)).toBe(name);
    }));
  });

  it('never suggests anything that is not a command (property)', () => {
    fc.assert(fc.property(fc.string({ maxLength: 12 }), (typed) => {
      const guess = suggestCommand(typed);
      if (guess !== undefined) expect(names).toContain(guess);
    }));
  });
});
