// YAML merge keys are not resolved: front-matter is read as YAML 1.2, where '<<' is an ordinary key, by the quick
// reader and by the full one alike; the checker finds each '<<' to say so.
import { describe, expect, it } from 'vitest';
import { mergeKeyPaths } from '../../src/parse/merge-keys.ts';
import { readSource } from '../../src/parse/read-source.ts';

const file = (yaml: string) => `---\n${yaml}---\n## Purpose\nText.\n`;

describe('merge keys', () => {
  it('are read as a plain key, with nothing merged, with or without an anchor', () => {
    // Without an anchor or alias the quick reader reads the front-matter; with one, the full reader does.
    const plain = readSource('a.md', file('steps:\n  - step: a\n    <<: { confirm: done }\n')).data;
    expect(plain).toEqual({ steps: [{ step: 'a', '<<': { confirm: 'done' } }] });
    const aliased = readSource('b.md', file('steps:\n  - &first\n    step: a\n    confirm: done\n  - <<: *first\n    step: b\n')).data;
    expect(aliased).toEqual({ steps: [{ step: 'a', confirm: 'done' }, { '<<': { step: 'a', confirm: 'done' }, step: 'b' }] });
  });

  it('are found wherever they are written, each once', () => {
    const shared = { confirm: 'done' };
    const data = { signals: { 'TI-1': { '<<': { unit: 'degC' }, text: 'x' } }, steps: [{ '<<': shared, step: 'a' }, { '<<': shared, step: 'b' }] };
    expect(mergeKeyPaths(data)).toEqual([['signals', 'TI-1', '<<'], ['steps', 0, '<<'], ['steps', 1, '<<']]);
    expect(mergeKeyPaths(null)).toEqual([]);
    expect(mergeKeyPaths({ steps: [{ step: 'a', do: 'Open <<XV-1>>' }] })).toEqual([]);
  });
});
