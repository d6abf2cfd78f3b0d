// The manual takes a procedure's area from its folder under the procedures folder. That folder may be given as a
// relative or an absolute path, or lie outside the working folder: the pages must come out the same.
import { mkdirSync, writeFileSync } from 'node:fs';
import { join } from 'node:path';
import { describe, expect, it } from 'vitest';
import { loadManual } from '../../src/site-data/manual.ts';
import { procedureText, stepsV1 } from '../history/temp-repo.ts';
import { tempFolder } from '../temp-folder.ts';

function plant(): string {
  const dir = tempFolder('stepwright-folder-name-');
  mkdirSync(join(dir, 'procedures', 'reactor-bay'), { recursive: true });
  mkdirSync(join(dir, 'elsewhere'));
  writeFileSync(join(dir, 'procedures', 'reactor-bay', 'a.md'), procedureText({ revision: 1, status: 'draft', steps: stepsV1 }));
  return dir;
}

async function areas(cwd: string, folder: string) {
  const loaded = await loadManual({ cwd, env: { STEPWRIGHT_TODAY: '2026-12-01', STEPWRIGHT_PROCEDURES: folder }, history: false });
  return { root: loaded.root, areas: loaded.view?.procedures.map((p) => [p.areaId, p.area]) };
}

describe('the procedures folder, however it is named', () => {
  it('gives the same areas given relative, absolute, with a trailing slash or from outside', async () => {
    const dir = plant();
    const relative = await areas(dir, 'procedures');
    expect(relative.areas).toEqual([['reactor-bay', expect.any(String)]]);
    expect(await areas(dir, join(dir, 'procedures'))).toEqual(relative);
    expect(await areas(dir, './procedures/')).toEqual(relative);
    // Outside the working folder the files are named by absolute paths, and so is the folder.
    const outside = await areas(join(dir, 'elsewhere'), '../procedures');
    expect(outside.areas).toEqual(relative.areas);
    expect(outside.root).toBe(join(dir, 'procedures'));
  });
});
