// Paths in the commands the CLI suggests are quoted so that pasting the command passes each path as one argument.
import { execFileSync } from 'node:child_process';
import { describe, expect, it } from 'vitest';
import { shellWord } from '../../src/model/shell-word.ts';

describe('shellWord', () => {
  it('leaves plain paths alone and quotes the rest', () => {
    expect(shellWord('procedures/k-210/u2-k210-sd-002.md')).toBe('procedures/k-210/u2-k210-sd-002.md');
    expect(shellWord('procedures/new folder')).toBe('"procedures/new folder"');
    expect(shellWord('a;b')).toBe('"a;b"');
    expect(shellWord('')).toBe('""');
    expect(shellWord("it's $HOME")).toBe(`'it'\\''s $HOME'`);
  });

  it.each(['procedures/new folder/u2-new-001.md', "it's $HOME `x` \\ \"q\" !1", 'a;b&c|d>e<f(g)*?[h]#~{i}', 'tab\there'])('gives %j back as one argument in sh', (word) => {
    expect(execFileSync('sh', ['-c', `printf '%s' ${shellWord(word)}`], { encoding: 'utf8' })).toBe(word);
  });
});
