// `check --format sarif`: one SARIF 2.1.0 log with the properties the standard requires.
import { mkdirSync, writeFileSync } from 'node:fs';
import { join } from 'node:path';
import { describe, expect, it } from 'vitest';
import { runCli } from './run-cli.ts';
import { tempFolder } from '../temp-folder.ts';

describe('stepwright check --format sarif', () => {
  it('writes a SARIF 2.1.0 log with every required property', async () => {
    const dir = tempFolder('stepwright-sarif-');
    mkdirSync(join(dir, 'procedures'));
    writeFileSync(join(dir, 'procedures', 'bad.md'), '---\nid: U2-BAD-001\ntitle: Broken\nkind: batch\nrevision: 1\nstatus: draft\nsteps:\n  - step: one\n    do: Open the valve\n---\n');
    const r = await runCli(['check', '--format', 'sarif', 'procedures'], dir);
    expect(r.code).toBe(1);
    const log = JSON.parse(r.stdout);
    // Source: OASIS SARIF 2.1.0, §3.13.2 version ("2.1.0") and §3.13.4 runs are required on sarifLog.
    expect(log.version).toBe('2.1.0');
    expect(Array.isArray(log.runs)).toBe(true);
    expect(log.runs).toHaveLength(1);
    const [run] = log.runs;
    // Source: OASIS SARIF 2.1.0, §3.14.6 run.tool is required; §3.19.8 tool.driver is required; §3.19.2 driver.name is required.
    expect(run.tool.driver.name).toBe('stepwright');
    expect(typeof run.tool.driver.version).toBe('string');
    expect(run.results.length).toBeGreaterThan(0);
    const ruleIds = run.tool.driver.rules.map((x: { id: string }) => x.id);
    for (const result of run.results) {
      // Source: OASIS SARIF 2.1.0, §3.27.11 result.message is required, with text (§3.11.8).
      expect(typeof result.message.text).toBe('string');
      // Source: OASIS SARIF 2.1.0, §3.27.10 level is one of none, note, warning, error.
      expect(['none', 'note', 'warning', 'error']).toContain(result.level);
      // Source: OASIS SARIF 2.1.0, §3.27.5/§3.27.6 ruleId and ruleIndex point at the driver's rule of that id.
      expect(ruleIds[result.ruleIndex]).toBe(result.ruleId);
      const { physicalLocation } = result.locations[0];
      expect(physicalLocation.artifactLocation.uri).toBe('procedures/bad.md');
      // Source: OASIS SARIF 2.1.0, §3.30.5 startLine and §3.30.6 startColumn are 1-based.
      expect(physicalLocation.region.startLine).toBeGreaterThanOrEqual(1);
      expect(physicalLocation.region.startColumn).toBeGreaterThanOrEqual(1);
    }
    expect(run.results.map((x: { ruleId: string }) => x.ruleId)).toContain('step-without-transition');
  });
});
