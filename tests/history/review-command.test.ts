// `stepwright review` and the history side of `stepwright check`, end to end on a repository built in the test.
import { execFileSync } from 'node:child_process';
import { mkdtempSync, readFileSync, rmSync, writeFileSync } from 'node:fs';
import { tmpdir } from 'node:os';
import { join } from 'node:path';
import { afterAll, beforeAll, describe, expect, it } from 'vitest';
import { runCli } from '../cli/run-cli.ts';
import { buildStory, createTempRepo, procedureText, stepsV2, type TempRepo } from './temp-repo.ts';

let repo: TempRepo;
let commits: ReturnType<typeof buildStory>;
const file = 'procedures/k-210/u2-test-001.md';

beforeAll(() => {
  repo = createTempRepo();
  commits = buildStory(repo);
});
afterAll(() => repo.remove());

/** Mermaid's own parser, in Node: it needs a DOM window to load (see the toolchain notes). */
async function mermaidParse(text: string): Promise<unknown> {
  const { JSDOM } = (await import('jsdom' as string)) as { JSDOM: new (html: string) => { window: unknown } };
  (globalThis as { window?: unknown }).window ??= new JSDOM('').window;
  const mermaid = (await import('mermaid')).default;
  return mermaid.parse(text);
}

function mermaidBlocks(markdown: string): string[] {
  return [...markdown.matchAll(/```mermaid\n([\s\S]*?)```/g)].map((m) => m[1]);
}

describe('stepwright review', () => {
  it('summarises revision 1 → 2 for a reviewer (snapshot)', async () => {
    const r = await runCli(['review', '--base', commits.effective1], repo.dir);
    expect(r.stderr).toBe('');
    expect(r.code).toBe(0);
    expect(r.stdout).toMatchSnapshot();
  });

  it('calls out a safety change made without a revision bump, and fails', async () => {
    const r = await runCli(['review', '--base', commits.effective2], repo.dir);
    expect(r.code).toBe(1);
    expect(r.stdout).toContain('**Limit TI-210** changed: high: 245 degC → **250 degC**');
    expect(r.stdout).toContain('**Interlock TSHH-210** changed');
    expect(r.stdout).toMatch(/\| Process safety lead \| operating limits changed; interlocks changed \| ❌ not yet signed \|/);
    expect(r.stdout).toMatch(/❌ line 5: `effective-edited-in-place`/);
    expect(r.stdout).toContain('No step added, removed, moved or changed.');
  });

  it('prints the review as JSON with --format json', async () => {
    const r = await runCli(['review', '--base', commits.effective2, '--format', 'json'], repo.dir);
    expect(r.code).toBe(1);
    const review = JSON.parse(r.stdout);
    expect(review.baseCommit).toMatch(/^[0-9a-f]{40}$/);
    expect(review.files).toHaveLength(1);
    expect(review.files[0]).toMatchObject({ path: file, change: 'modified', before: { revision: 2, status: 'effective' }, after: { revision: 2, status: 'effective' } });
    expect(review.files[0].signOffs.map((s: { role: string }) => s.role)).toContain('Process safety lead');
    expect(review.files[0].diagnostics.map((d: { rule: string }) => d.rule)).toContain('effective-edited-in-place');
    expect(review.errors).toBeGreaterThan(0);
  });

  it('prints workflow annotations with --format github and writes the summary to --output', async () => {
    const r = await runCli(['review', '--base', commits.effective2, '--format', 'github', '--output', 'review.md'], repo.dir);
    expect(r.code).toBe(1);
    expect(r.stdout).toMatch(new RegExp(`^::error file=${file.replace(/[./]/g, '\\$&')},line=5,endLine=5,col=11,endColumn=12,title=effective-edited-in-place::Revision 2 is effective`, 'm'));
    expect(r.stdout).toContain('%0AMake the change a new revision');
    const summary = readFileSync(join(repo.dir, 'review.md'), 'utf8');
    expect(summary).toMatch(/^## Stepwright review against /);
    // Written again over its own summary; never over a file of the user's.
    writeFileSync(join(repo.dir, 'review.md'), `${summary}\nAn older summary.\n`);
    expect((await runCli(['review', '--base', commits.effective2, '--output', 'review.md'], repo.dir)).code).toBe(1);
    expect(readFileSync(join(repo.dir, 'review.md'), 'utf8')).toBe(summary);
    writeFileSync(join(repo.dir, 'review.md'), '# Notes for the review meeting\n');
    const refused = await runCli(['review', '--base', commits.effective2, '--output', 'review.md'], repo.dir);
    expect(refused.code).toBe(2);
    expect(refused.stderr).toContain("'review.md' already exists and is not a review summary written by 'stepwright review'; it was left as it is.");
    expect(readFileSync(join(repo.dir, 'review.md'), 'utf8')).toBe('# Notes for the review meeting\n');
    rmSync(join(repo.dir, 'review.md'));
  });

  it('writes mermaid that mermaid itself parses, with the changed steps marked', async () => {
    const r = await runCli(['review', '--base', commits.draft1], repo.dir);
    const [chart] = mermaidBlocks(r.stdout);
    expect(chart).toMatch(/purge \[added\]/);
    expect(chart).toMatch(/class \S*s\d+\S* added/);
    await expect(mermaidParse(chart)).resolves.toBeTruthy();
    // The parser is a real check: a broken chart is rejected.
    await expect(mermaidParse(chart.replace('-->', '--> -->'))).rejects.toThrow();
  }, 120_000);

  it('uses the review policy from stepwright.config.yaml, and rejects a bad one', async () => {
    const config = join(repo.dir, 'stepwright.config.yaml');
    try {
      writeFileSync(config, 'review-policy:\n  - when: [limits]\n    require: [Unit manager]\n    because: Unit rule 7\n');
      const r = await runCli(['review', '--base', commits.effective2], repo.dir);
      expect(r.stdout).toContain('Under the review policy in stepwright.config.yaml:');
      expect(r.stdout).toContain('| Unit manager | operating limits changed | ❌ not yet signed |');
      expect(r.stdout).not.toContain('Process safety lead');
      writeFileSync(config, 'review-policy:\n  - when: [limitz]\n    require: [Unit manager]\n');
      const bad = await runCli(['review', '--base', commits.effective2], repo.dir);
      expect(bad.code).toBe(2);
      expect(bad.stderr).toMatch(/review-policy\[0\]\.when\[0\]/);
      expect(bad.stderr).not.toMatch(/\n\s+at /);
    } finally {
      rmSync(config, { force: true });
    }
  });

  it('checks through the same run as check: the configuration\'s rule settings apply, and its errors fail the review', async () => {
    const config = join(repo.dir, 'stepwright.config.yaml');
    try {
      const plain = await runCli(['review', '--base', commits.effective2, '--format', 'json'], repo.dir);
      const rulesOf = (out: string) => (JSON.parse(out).files as Array<{ diagnostics: Array<{ rule: string }> }>).flatMap((f) => f.diagnostics.map((d) => d.rule));
      expect(rulesOf(plain.stdout)).toContain('effective-edited-in-place');
      writeFileSync(config, 'rules:\n  effective-edited-in-place: off\n');
      const off = await runCli(['review', '--base', commits.effective2, '--format', 'json'], repo.dir);
      expect(rulesOf(off.stdout)).not.toContain('effective-edited-in-place');
      // `stepwright check` fails on this configuration; so does the review, and it says why.
      writeFileSync(config, 'rules:\n  no-such-rule: off\n');
      const check = await runCli(['check', 'procedures'], repo.dir);
      expect(check.code).toBe(1);
      const bad = await runCli(['review', '--base', commits.effective1], repo.dir);
      expect(bad.code).toBe(1);
      expect(bad.stdout).toMatch(/The configuration stepwright\.config\.yaml has 1 error[\s\S]*'no-such-rule' is not a Stepwright rule/);
    } finally {
      rmSync(config, { force: true });
    }
  });

  it('includes new files not yet committed, and deleted ones with advice to retire instead', async () => {
    const added = join(repo.dir, 'procedures/u2-test-002.md');
    const committed = readFileSync(join(repo.dir, file), 'utf8');
    try {
      writeFileSync(added, procedureText({ revision: 0, status: 'draft', steps: stepsV2 }).replace('U2-TEST-001', 'U2-TEST-002'));
      rmSync(join(repo.dir, file));
      const r = await runCli(['review', '--base', 'HEAD'], repo.dir);
      expect(r.stdout).toContain('| U2-TEST-001 | deleted | 2 → — | effective → — |');
      expect(r.stdout).toContain('| U2-TEST-002 | added | — → 0 | — → draft |');
      expect(r.stdout).toMatch(/kept with status `retired`/);
      expect(r.stdout).toContain('New procedure with 2 hazard messages, 1 operating limit and 1 interlock.');
    } finally {
      rmSync(added, { force: true });
      writeFileSync(join(repo.dir, file), committed);
    }
  });

  it('reports a procedure broken by the change through its check results, without a stack trace', async () => {
    const committed = readFileSync(join(repo.dir, file), 'utf8');
    try {
      writeFileSync(join(repo.dir, file), committed.replace('steps:\n', 'steps: [\n'));
      const r = await runCli(['review', '--base', 'HEAD'], repo.dir);
      expect(r.code).toBe(1);
      expect(r.stdout).toContain('cannot be read as a procedure now');
      expect(r.stdout).toMatch(/❌ line \d+: `yaml-syntax`/);
      expect(r.stdout).not.toContain('#### Step changes');
      expect(r.stderr).toBe('');
    } finally {
      writeFileSync(join(repo.dir, file), committed);
    }
  });

  it('explains what is missing when the base is not in a shallow clone', async () => {
    const dir = mkdtempSync(join(tmpdir(), 'stepwright-shallow-'));
    try {
      execFileSync('git', ['clone', '-q', '--depth', '1', `file://${repo.dir}`, dir]);
      const r = await runCli(['review', '--base', commits.draft1], dir);
      expect(r.code).toBe(2);
      expect(r.stderr).toMatch(/not in this clone/);
      expect(r.stderr).toContain('fetch-depth: 0');
    } finally {
      rmSync(dir, { recursive: true, force: true });
    }
  });

  it('compares with the base tip and says so when a shallow clone lacks the merge base', async () => {
    const dir = mkdtempSync(join(tmpdir(), 'stepwright-shallow-'));
    try {
      repo.git(['branch', '-f', 'release', commits.effective1]);
      execFileSync('git', ['clone', '-q', '--depth', '1', '--no-single-branch', `file://${repo.dir}`, dir]);
      const r = await runCli(['review', '--base', 'origin/release'], dir);
      expect(r.stderr).toBe('');
      expect(r.stdout).toMatch(/> This is a shallow clone and the merge base of 'origin\/release' and HEAD is not in it/);
      expect(r.stdout).toContain('fetch-depth: 0');
      expect(r.stdout).toContain('| U2-TEST-001 | renamed | 1 → 2 |');
    } finally {
      repo.git(['branch', '-D', 'release']);
      rmSync(dir, { recursive: true, force: true });
    }
  });

  it('needs --base and a git repository', async () => {
    expect((await runCli(['review'], repo.dir)).code).toBe(2);
    const outside = mkdtempSync(join(tmpdir(), 'stepwright-nogit-'));
    try {
      const r = await runCli(['review', '--base', 'main'], outside);
      expect(r.code).toBe(2);
      expect(r.stderr).toMatch(/not inside a git repository/);
    } finally {
      rmSync(outside, { recursive: true, force: true });
    }
  });
});

describe('stepwright check with history', () => {
  it('judges uncommitted work against the last commit, and a branch against --base', async () => {
    const clean = await runCli(['check', '--format', 'json', 'procedures'], repo.dir);
    const rulesOf = (out: string) => (JSON.parse(out) as Array<{ rule: string }>).map((d) => d.rule);
    expect(rulesOf(clean.stdout)).not.toContain('effective-edited-in-place');

    const againstBase = await runCli(['check', '--format', 'json', '--base', commits.effective2, 'procedures'], repo.dir);
    expect(rulesOf(againstBase.stdout)).toContain('effective-edited-in-place');
    expect(againstBase.code).toBe(1);

    const committed = readFileSync(join(repo.dir, file), 'utf8');
    try {
      writeFileSync(join(repo.dir, file), procedureText({ revision: 1, status: 'draft', steps: stepsV2 }));
      const lower = await runCli(['check', '--format', 'json', 'procedures'], repo.dir);
      expect(rulesOf(lower.stdout)).toContain('revision-decreased');
      writeFileSync(join(repo.dir, file), procedureText({ revision: 2, status: 'draft', steps: stepsV2.slice(3) }));
      const backwards = await runCli(['check', '--format', 'json', 'procedures'], repo.dir);
      expect(rulesOf(backwards.stdout)).toEqual(expect.arrayContaining(['status-lifecycle', 'effective-edited-in-place']));
      const off = await runCli(['check', '--format', 'json', '--no-history', 'procedures'], repo.dir);
      expect(rulesOf(off.stdout)).not.toContain('revision-decreased');
    } finally {
      writeFileSync(join(repo.dir, file), committed);
    }
  });

  it('prints annotations with --format github', async () => {
    const r = await runCli(['check', '--format', 'github', '--base', commits.effective2, 'procedures'], repo.dir);
    expect(r.stdout.trim().split('\n').every((l) => /^::(error|warning|notice) file=[^,]+,line=\d+,endLine=\d+,col=\d+(,endColumn=\d+)?,title=[a-z0-9-]+::/.test(l))).toBe(true);
  });

  it('checks without history in a repository that has no commits yet', async () => {
    const fresh = createTempRepo();
    try {
      fresh.write('procedures/p.md', procedureText({ revision: 1, status: 'draft', steps: stepsV2 }));
      const r = await runCli(['check', '--format', 'json', 'procedures'], fresh.dir);
      expect(r.stderr).toBe('');
      expect(r.code).toBe(0);
    } finally {
      fresh.remove();
    }
  });

  it('stops with a message when the base does not exist', async () => {
    const r = await runCli(['check', '--base', 'no-such-branch', 'procedures'], repo.dir);
    expect(r.code).toBe(2);
    expect(r.stderr).toMatch(/The base 'no-such-branch' is not in this clone/);
  });
});
