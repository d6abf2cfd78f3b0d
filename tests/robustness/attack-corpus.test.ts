// Every case of the attack corpus ends in diagnostics: exit 0 or 1 (never 2), the expected rule on each
// attacking file, no internal failure, and the whole corpus within a minute (a bound, not a benchmark).
import { mkdtempSync, rmSync } from 'node:fs';
import { tmpdir } from 'node:os';
import { join } from 'node:path';
import { afterAll, describe, expect, it } from 'vitest';
import { runCli } from '../cli/run-cli.ts';
import { writeAttackCorpus } from './attack-corpus.ts';

const root = mkdtempSync(join(tmpdir(), 'stepwright-attack-'));
const cases = writeAttackCorpus(root);
afterAll(() => rmSync(root, { recursive: true, force: true }));

describe('attack corpus', () => {
  it('checks every case with a diagnostic for each attacking file', async () => {
    const failures: string[] = [];
    for (const c of cases) {
      const out = await runCli(['check', '--format', 'json', join(root, c.name)], root);
      if (out.code !== 0 && out.code !== 1) {
        failures.push(`${c.name} (${c.what}): exit ${out.code}: ${out.stderr.slice(0, 300)}`);
        continue;
      }
      const found = JSON.parse(out.stdout) as Array<{ file: string; rule: string; message: string }>;
      if (found.some((d) => /internal failure|could not finish/.test(d.message))) failures.push(`${c.name}: a rule failed: ${found.find((d) => /could not finish/.test(d.message))!.message}`);
      for (const e of c.expect) {
        if (!found.some((d) => d.file.endsWith(`${c.name}/${e.file}`) && d.rule === e.rule)) {
          failures.push(`${c.name} (${c.what}): no ${e.rule} for ${e.file}; got ${found.filter((d) => d.file.endsWith(`/${e.file}`)).map((d) => d.rule).join(', ') || 'nothing'}`);
        }
      }
    }
    expect(failures).toEqual([]);
    expect(cases.length).toBeGreaterThanOrEqual(18);
  }, 60_000);
});
