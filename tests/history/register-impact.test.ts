// Change impact through the plant register: one changed trip in the demo register reaches every demo procedure
// that uses it, in `stepwright review`, with the ones whose revision did not move called out.
import { cpSync, readdirSync, readFileSync, writeFileSync } from 'node:fs';
import { join } from 'node:path';
import { afterAll, beforeAll, describe, expect, it } from 'vitest';
import { runCli } from '../cli/run-cli.ts';
import { createTempRepo, type TempRepo } from './temp-repo.ts';
import { findProcedureFiles } from '../../src/cli/read-procedure-files.ts';

const root = join(import.meta.dirname, '..', '..');
let repo: TempRepo;
let base: string;

/** Demo procedures whose front-matter names the tag anywhere (uses, equipment, a condition): an independent list. */
function demoFilesNaming(tag: string): string[] {
  return findProcedureFiles(['procedures'], root)
    .filter((f) => !f.missing && readFileSync(f.absolute, 'utf8').split('\n---')[0].includes(tag))
    .map((f) => /^id: (\S+)/m.exec(readFileSync(f.absolute, 'utf8'))![1])
    .sort();
}

beforeAll(() => {
  repo = createTempRepo();
  cpSync(join(root, 'procedures'), join(repo.dir, 'procedures'), { recursive: true });
  cpSync(join(root, 'register'), join(repo.dir, 'register'), { recursive: true });
  base = repo.commit('Demo manual and its register', { name: 'Ada Ferrand', email: 'ada@alder-reach.example' }, '2026-11-30');
});
afterAll(() => repo.remove());

describe('register change impact in review', () => {
  it('lists every demo procedure that uses a changed trip, flagging the unchanged revisions', async () => {
    const file = join(repo.dir, 'register', 'k-210.yaml');
    const before = readFileSync(file, 'utf8');
    expect(before).toContain('trips-when: TI-210 >= 255 degC');
    writeFileSync(file, before.replace('trips-when: TI-210 >= 255 degC', 'trips-when: TI-210 >= 265 degC'));
    const r = await runCli(['review', '--base', base], repo.dir).finally(() => writeFileSync(file, before));
    expect(r.stderr).toBe('');
    const section = (r.stdout.split('### Plant register changes')[1]?.split('\n### ')[0] ?? '').replaceAll('\\', '');
    expect(section).toContain('TSHH-210 (safety-functions)');
    expect(section).toContain('trips-when: TI-210 >= 255 degC → TI-210 >= 265 degC');
    const row = section.split('\n').find((l) => l.startsWith('| TSHH-210'))!;
    const expected = demoFilesNaming('TSHH-210');
    expect(expected.length).toBeGreaterThanOrEqual(3);
    for (const id of expected) expect(row).toContain(`**${id}** (revision not changed)`);
    expect(row.match(/\*\*U2-/g)?.length).toBe(expected.length);
    // Nothing else changed in the register.
    expect(section.split('\n').filter((l) => /^\| [A-Za-z]/.test(l) && !l.startsWith('| Register entry'))).toHaveLength(1);
  });

  it('does not flag a procedure that was revised with the register change', async () => {
    const file = join(repo.dir, 'register', 'k-210.yaml');
    const batch = join(repo.dir, 'procedures', 'k-210-resin', 'u2-k210-batch-001.md');
    const before = readFileSync(file, 'utf8');
    const batchBefore = readFileSync(batch, 'utf8');
    const revision = Number(/^revision: (\d+)$/m.exec(batchBefore)![1]);
    writeFileSync(file, before.replace('trips-when: TI-210 >= 255 degC', 'trips-when: TI-210 >= 265 degC'));
    writeFileSync(batch, batchBefore.replace(/^revision: \d+$/m, `revision: ${revision + 1}`));
    const r = await runCli(['review', '--base', base], repo.dir).finally(() => {
      writeFileSync(file, before);
      writeFileSync(batch, batchBefore);
    });
    const row = r.stdout.split('\n').find((l) => l.startsWith('| TSHH-210'))!.replaceAll('\\', '');
    expect(row).toContain('U2-K210-BATCH-001');
    expect(row).not.toContain('**U2-K210-BATCH-001**');
    for (const id of demoFilesNaming('TSHH-210').filter((x) => x !== 'U2-K210-BATCH-001')) expect(row).toContain(`**${id}** (revision not changed)`);
  });

  it('a change to the shutdown function reaches the procedures through the trips that start it', async () => {
    const file = join(repo.dir, 'register', 'k-210.yaml');
    const before = readFileSync(file, 'utf8');
    writeFileSync(file, before.replace('opens: [XV-2105, XV-2109, XV-2103]', 'opens: [XV-2105, XV-2103]'));
    const r = await runCli(['review', '--base', base], repo.dir).finally(() => writeFileSync(file, before));
    const row = r.stdout.split('\n').find((l) => l.startsWith('| ESD-210'))!;
    const users = new Set([...demoFilesNaming('TSHH-210'), ...demoFilesNaming('PSHH-210'), ...demoFilesNaming('HS-2190')]);
    for (const id of users) expect(row).toContain(id);
  });

  it('says nothing about the register when it did not change', async () => {
    const r = await runCli(['review', '--base', base], repo.dir);
    expect(r.stdout).not.toContain('Plant register changes');
    expect(readdirSync(join(repo.dir, 'register')).length).toBeGreaterThan(0);
  });
});
