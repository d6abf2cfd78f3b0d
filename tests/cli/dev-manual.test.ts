// Live preview support: a saved file changes the stamp; a manual with check errors still gets its pages.
import { mkdirSync, writeFileSync, utimesSync } from 'node:fs';
import { join } from 'node:path';
import { describe, expect, it } from 'vitest';
import { procedureStamp, tolerantManualView } from '../../src/site-data/dev-manual.ts';
import { checkSources } from '../../src/check/run-checks.ts';
import { scaffoldProcedure } from '../../src/render/procedure-scaffold.ts';
import { tempFolder } from '../temp-folder.ts';

describe('procedureStamp', () => {
  it('changes when a procedure is saved, added or removed', () => {
    const dir = tempFolder('sw-dev-');
    mkdirSync(join(dir, 'procedures'));
    const file = join(dir, 'procedures', 'a.md');
    writeFileSync(file, 'one');
    const first = procedureStamp('procedures', dir);
    expect(procedureStamp('procedures', dir)).toBe(first);
    writeFileSync(file, 'one, edited');
    utimesSync(file, new Date(), new Date(Date.now() + 5000));
    const second = procedureStamp('procedures', dir);
    expect(second).not.toBe(first);
    writeFileSync(join(dir, 'procedures', 'b.md'), 'two');
    expect(procedureStamp('procedures', dir)).not.toBe(second);
  });
});

describe('tolerantManualView', () => {
  it('builds pages for procedures that have check errors', () => {
    const broken = scaffoldProcedure({ kind: 'normal', id: 'U2-DEV-002' }).replace('until: TODO-TI >= 150 degC', 'until: TODO-TI >= 150 kg');
    const result = checkSources([
      { file: 'procedures/a.md', text: broken },
      { file: 'procedures/b.md', text: '---\nid: [broken\n---\n' },
    ], { today: '2026-12-01' });
    expect(result.diagnostics.some((d) => d.severity === 'error' && d.file === 'procedures/a.md')).toBe(true);
    const view = tolerantManualView({ files: result.files, root: 'procedures', today: '2026-12-01' });
    expect(view.procedures.map((p) => p.id)).toEqual(['U2-DEV-002']);
  });
});
