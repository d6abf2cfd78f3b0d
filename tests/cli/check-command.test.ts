// The check command end to end: human and JSON output, exit codes, and no stack traces on bad input.
import { execFile } from 'node:child_process';
import { promisify } from 'node:util';
import { join } from 'node:path';
import { describe, expect, it } from 'vitest';
import { runCli } from './run-cli.ts';

const fixtures = join(import.meta.dirname, '../fixtures/rules');

describe('stepwright check', () => {
  it('exits 0 on a valid procedure and prints a summary', async () => {
    const r = await runCli(['check', 'step-without-transition/valid-base.md'], fixtures);
    expect({ code: r.code, stdout: r.stdout }).toMatchSnapshot();
  });

  it('exits 1 with file:line:col, rule, code frame and hint on an invalid procedure', async () => {
    const r = await runCli(['check', 'step-without-transition/invalid-no-until.md'], fixtures);
    expect(r.code).toBe(1);
    expect(r.stdout).toMatch(/^step-without-transition\/invalid-no-until\.md:\d+:\d+ error step-without-transition /m);
    expect(r.stdout).toContain('hint:');
    expect({ code: r.code, stdout: r.stdout }).toMatchSnapshot();
  });

  it('prints the JSON shape with --format json', async () => {
    const r = await runCli(['check', '--format', 'json', 'unit-mismatch/invalid-condition.md'], fixtures);
    expect(r.code).toBe(1);
    const parsed = JSON.parse(r.stdout) as Array<Record<string, unknown>>;
    const mismatch = parsed.filter((d) => d.rule === 'unit-mismatch');
    expect(mismatch).toHaveLength(1);
    for (const d of parsed) {
      expect(Object.keys(d).slice(0, 10)).toEqual(['file', 'line', 'column', 'endLine', 'endColumn', 'severity', 'rule', 'message', 'hint', ...(Object.keys(d).length > 9 ? [Object.keys(d)[9]] : [])].slice(0, Object.keys(d).length));
      expect(['error', 'warning', 'info']).toContain(d.severity);
    }
    expect({ code: r.code, json: mismatch }).toMatchSnapshot();
  });

  it('reports an unreadable path as a diagnostic and still checks the other files', async () => {
    const r = await runCli(['check', '--format', 'json', 'no-such-file.md', 'review-overdue/invalid-overdue.md'], fixtures);
    expect(r.code).toBe(1);
    const rules = (JSON.parse(r.stdout) as Array<{ rule: string; file: string }>).map((d) => `${d.file} ${d.rule}`);
    expect(rules).toContain('no-such-file.md unreadable-file');
    expect(rules).toContain('review-overdue/invalid-overdue.md review-overdue');
  });

  it('exits 2 with a usage message, never a stack trace, on a bad option', async () => {
    const r = await runCli(['check', '--formt', 'json']);
    expect(r.code).toBe(2);
    expect(r.stderr).toContain("stepwright check:");
    expect(r.stderr).not.toMatch(/\n\s+at /);
  });

  it('exits 2 on an unknown command and 0 on --help', async () => {
    expect((await runCli(['frobnicate'])).code).toBe(2);
    const help = await runCli(['check', '--help']);
    expect(help.code).toBe(0);
    expect(help.stdout).toContain('Usage: stepwright check');
  });
});

describe('the installed command', () => {
  it('checks the demo manual with exit 0 through npx on the project Node', { timeout: 120_000 }, async () => {
    const run = promisify(execFile);
    const root = join(import.meta.dirname, '../..');
    const { stdout } = await run('npx', ['stepwright', 'check', 'procedures', '--quiet'], { cwd: root, env: { ...process.env, NO_COLOR: '1' } });
    expect(stdout).toMatch(/files? checked: 0 errors/);
  });
});
