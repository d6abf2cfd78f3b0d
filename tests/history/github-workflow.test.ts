// The example workflow only calls commands and options Stepwright really has, and fetches the history it needs.
import { readFileSync } from 'node:fs';
import { join } from 'node:path';
import { describe, expect, it } from 'vitest';
import { parse } from 'yaml';
import { resultCacheFolder } from '../../src/engine/cache-folder.ts';
import { runCli } from '../cli/run-cli.ts';

const workflow = parse(readFileSync(join(import.meta.dirname, '../../examples/github-workflow.yml'), 'utf8')) as {
  on: Record<string, unknown>;
  jobs: Record<string, { steps: Array<{ run?: string; uses?: string; with?: Record<string, unknown> }> }>;
};

const invocations = Object.values(workflow.jobs).flatMap((job) => job.steps.flatMap((s) => (s.run ?? '').split('\n')))
  .filter((line) => line.includes('npx stepwright'))
  .map((line) => line.slice(line.indexOf('npx stepwright') + 'npx stepwright'.length).trim().split(/\s+/));

describe('examples/github-workflow.yml', () => {
  it('checks every push, runs check and review on pull requests and builds on main and every night', () => {
    expect(Object.keys(workflow.on)).toEqual(['pull_request', 'push', 'schedule']);
    expect(workflow.on.push).toBeNull();
    // Once a day (a cron line whose day, month and weekday fields are all '*').
    expect(workflow.on.schedule).toEqual([{ cron: expect.stringMatching(/^\d+ \d+ \* \* \*$/) }]);
    expect(invocations.map((args) => args[0])).toEqual(['check', 'check', 'review', 'build']);
    const publish = (workflow.jobs.publish as unknown as { if: string }).if;
    expect(publish).toContain("refs/heads/main");
    expect(publish).toContain("github.event_name == 'schedule'");
    // The nightly run has no check job before it: the publication must not wait for one that is skipped.
    expect(publish).toMatch(/!cancelled\(\) && !failure\(\)/);
  });

  it('dates every command of a run by the day it runs, so check, review and build judge dates alike', () => {
    for (const [name, job] of Object.entries(workflow.jobs)) {
      const dating = job.steps.findIndex((s) => /STEPWRIGHT_TODAY=\$\(date -u \+%F\)" >> "\$GITHUB_ENV"/.test(s.run ?? ''));
      const first = job.steps.findIndex((s) => (s.run ?? '').includes('npx stepwright'));
      expect(dating, name).toBeGreaterThanOrEqual(0);
      expect(dating, name).toBeLessThan(first);
    }
  });

  it.each(invocations.map((args) => [args.join(' ')]))('stepwright %s uses options the command documents', async (line) => {
    const [command, ...args] = line.split(' ');
    const help = await runCli([command, '--help']);
    expect(help.code).toBe(0);
    for (const option of args.filter((a) => a.startsWith('--'))) expect(help.stdout).toContain(option);
    const format = args[args.indexOf('--format') + 1];
    if (args.includes('--format')) expect(help.stdout).toContain(format);
  });

  it('checks out the full history wherever revisions are read', () => {
    for (const job of Object.values(workflow.jobs)) {
      const checkout = job.steps.find((s) => s.uses?.startsWith('actions/checkout'));
      expect(checkout?.with?.['fetch-depth']).toBe(0);
    }
  });

  it('keeps the folder the check keeps its results in between runs, afresh for every new package lock', () => {
    const folder = resultCacheFolder({ cwd: '', env: {} });
    for (const job of Object.values(workflow.jobs)) {
      const cache = job.steps.find((s) => s.uses?.startsWith('actions/cache'));
      expect(cache?.with?.path).toBe(folder);
      expect(String(cache?.with?.key)).toContain("hashFiles('package-lock.json')");
      // Restored after the packages are installed and before the first command that checks.
      const at = (find: (s: { run?: string; uses?: string }) => boolean) => job.steps.findIndex(find);
      expect(at((s) => s.run === 'npm ci')).toBeLessThan(at((s) => s === cache));
      expect(at((s) => s === cache)).toBeLessThan(at((s) => (s.run ?? '').includes('npx stepwright')));
    }
  });
});
