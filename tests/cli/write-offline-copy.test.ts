import { mkdtemp, mkdir, readFile, writeFile } from 'node:fs/promises';
import { tmpdir } from 'node:os';
import { join } from 'node:path';
import { describe, expect, it } from 'vitest';
import { writeOfflineCopy } from '../../src/cli/write-offline-copy.ts';

describe('writeOfflineCopy', () => {
  it('writes sw.js and offline-manifest.json for a built site, stable across rebuilds', async () => {
    const dir = await mkdtemp(join(tmpdir(), 'stepwright-offline-'));
    await mkdir(join(dir, 'procedures', 'p-1'), { recursive: true });
    await writeFile(join(dir, 'index.html'), '<h1>Manual</h1>');
    await writeFile(join(dir, 'procedures', 'p-1', 'index.html'), '<h1>P-1</h1>');
    const first = await writeOfflineCopy(dir, { now: new Date('2026-12-01T10:00:00Z') });
    const worker = await readFile(join(dir, 'sw.js'), 'utf8');
    expect(first.files).toEqual(['/', '/procedures/p-1/']);
    expect(worker).toContain(`"version":"${first.version}"`);
    expect(worker).toContain("addEventListener('fetch'");
    expect(JSON.parse(await readFile(join(dir, 'offline-manifest.json'), 'utf8'))).toMatchObject({ version: first.version, builtAt: '2026-12-01T10:00:00.000Z' });
    // A second run over its own output must not count sw.js or the manifest into the version.
    const second = await writeOfflineCopy(dir, { now: new Date('2026-12-02T10:00:00Z') });
    expect(second.version).toBe(first.version);
    expect(await readFile(join(dir, 'sw.js'), 'utf8')).toBe(worker);
  });
});
