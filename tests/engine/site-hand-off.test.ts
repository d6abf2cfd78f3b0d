// The build checks once and hands the run to the pages in the same process: the pages never check again.
import { mkdirSync, writeFileSync } from 'node:fs';
import { join } from 'node:path';
import { afterEach, describe, expect, it } from 'vitest';
import { clearHandOff, handOffManual, loadManual, runIdVariable, siteManual } from '../../src/site-data/manual.ts';
import { procedureText, stepsV1 } from '../history/temp-repo.ts';
import { tempFolder } from '../temp-folder.ts';

describe('hand-off of the check run to the pages', () => {
  afterEach(() => clearHandOff());

  it('gives the pages the very run the build made, without checking again', async () => {
    const dir = tempFolder('stepwright-handoff-');
    mkdirSync(join(dir, 'procedures'));
    writeFileSync(join(dir, 'procedures', 'a.md'), procedureText({ revision: 1, status: 'draft', steps: stepsV1 }));
    const loaded = await loadManual({ cwd: dir, env: { STEPWRIGHT_TODAY: '2026-12-01', STEPWRIGHT_PROCEDURES: 'procedures' }, history: false });
    expect(loaded.view?.procedures.map((p) => p.id)).toEqual(['U2-TEST-001']);
    handOffManual(loaded);
    expect(process.env[runIdVariable]).toMatch(/^\d+-/);
    // The pages run with the process's own working folder (this repository), yet get the build's run.
    const { loaded: seen, view } = await siteManual();
    expect(seen).toBe(loaded);
    expect(view).toBe(loaded.view);
  });

  it('without a hand-off, the pages run the check themselves', async () => {
    expect(process.env[runIdVariable]).toBeUndefined();
    const { loaded } = await siteManual();
    expect(loaded.cwd).toBe(process.cwd());
    expect(loaded.inputs.length).toBeGreaterThan(0);
  }, 120_000);
});
