// Builds a throw-away git repository with a procedure's life story, with fixed authors and dates so commit ids repeat.
import { execFileSync } from 'node:child_process';
import { mkdirSync, mkdtempSync, rmSync, writeFileSync } from 'node:fs';
import { tmpdir } from 'node:os';
import { dirname, join } from 'node:path';

export interface ProcedureOptions {
  revision: number;
  status: string;
  effective?: string;
  change?: string;
  approvals?: Array<{ role: string; name: string; date: string }>;
  high?: string;
  trip?: string;
  /** YAML lines of the steps list, already indented by two spaces. */
  steps: string[];
  hazards?: string[];
}

export const stepsV1 = [
  '  - step: check-inert',
  '    do: Check the kettle oxygen content on AI-210',
  '    until: AI-210 <= 2 percent',
  '  - step: heat-up',
  '    do: Heat the kettle contents to 210 degC with hot oil',
  '    set: { TI-210: 210 degC }',
  '    until: TI-210 >= 205 degC',
  '  - step: cook',
  '    do: Hold the kettle at 225 degC under reflux',
  '    set: { TI-210: 225 degC }',
  '    until: elapsed >= 60 min',
  '  - step: sample',
  '    do: Draw a sample from SP-210 for the lab',
  '    confirm: Sample is handed to the lab',
  '  - step: cool',
  '    do: Cool the kettle to 150 degC',
  '    set: { TI-210: 150 degC }',
  '    until: TI-210 <= 155 degC',
];

/** Revision 2: adds a purge step, edits the cook step, moves the sample step before it, renames the cool step's id. */
export const stepsV2 = [
  '  - step: check-inert',
  '    do: Check the kettle oxygen content on AI-210',
  '    until: AI-210 <= 2 percent',
  '  - step: purge',
  '    do: Purge the vapour space with nitrogen for 10 minutes',
  '    until: elapsed >= 10 min',
  '  - step: heat-up',
  '    do: Heat the kettle contents to 210 degC with hot oil',
  '    set: { TI-210: 210 degC }',
  '    until: TI-210 >= 205 degC',
  '  - step: sample',
  '    do: Draw a sample from SP-210 for the lab',
  '    confirm: Sample is handed to the lab',
  '  - step: cook',
  '    do: Hold the kettle at 230 degC under xylene reflux',
  '    set: { TI-210: 230 degC }',
  '    until: elapsed >= 60 min and TI-210 >= 225 degC',
  '  - step: cool-down',
  '    do: Cool the kettle to 150 degC',
  '    set: { TI-210: 150 degC }',
  '    until: TI-210 <= 155 degC',
];

export const hazardsV1 = [
  '  - level: warning',
  '    hazard: Resin at up to 245 degC in K-210 and at sample point SP-210',
  '    consequence: Severe burns',
  '    avoid: Wear a face shield and heat-resistant gauntlets at SP-210',
  '    at: [sample]',
  '  - level: caution',
  '    hazard: Hot kettle shell',
  '    consequence: Burns to hands',
  '    avoid: Do not touch the kettle shell while it is hot',
  '    at: [cook]',
];

export function procedureText(o: ProcedureOptions): string {
  const approvals = o.approvals?.length
    ? ['approvals:', ...o.approvals.map((a) => `  - { role: ${a.role}, name: ${a.name}, date: ${a.date}, meaning: Approved for use }`)]
    : [];
  return [
    '---',
    'id: U2-TEST-001',
    'title: Test batch on kettle K-210',
    'kind: batch',
    `revision: ${o.revision}`,
    `status: ${o.status}`,
    ...(o.effective ? [`effective: ${o.effective}`] : []),
    'review-by: 2027-01-15',
    'owner: Unit 2 Operations',
    'author: Ada Ferrand',
    ...(o.change ? [`change: ${o.change}`] : []),
    ...approvals,
    'equipment: [K-210]',
    'ppe: [Face shield]',
    'signals:',
    '  TI-210: { text: Kettle temperature, unit: degC, range: [0, 300] }',
    '  AI-210: { text: Kettle oxygen content, unit: percent, range: [0, 25] }',
    'limits:',
    `  TI-210: { low: 15 degC, high: ${o.high ?? '245 degC'}, consequence: Resin degrades, correction: Cut heating }`,
    'interlocks:',
    '  - tag: TSHH-210',
    `    trips-when: ${o.trip ?? 'TI-210 >= 255 degC'}`,
    '    action: Closes hot-oil valve XV-2101',
    'hazards:',
    ...(o.hazards ?? hazardsV1),
    'steps:',
    ...o.steps,
    '---',
    '',
    '## Purpose',
    '',
    'Makes one test batch in K-210. Site rules, training and local codes prevail.',
    '',
  ].join('\n');
}

export interface TempRepo {
  dir: string;
  git(args: string[], env?: Record<string, string>): string;
  write(path: string, text: string): void;
  commit(message: string, author: { name: string; email: string }, date: string): string;
  remove(): void;
}

export function createTempRepo(): TempRepo {
  const dir = mkdtempSync(join(tmpdir(), 'stepwright-history-'));
  const git = (args: string[], env: Record<string, string> = {}) =>
    execFileSync('git', args, { cwd: dir, encoding: 'utf8', env: { ...process.env, GIT_CONFIG_NOSYSTEM: '1', HOME: dir, ...env } });
  git(['init', '-q', '-b', 'main']);
  git(['config', 'user.name', 'Test Runner']);
  git(['config', 'user.email', 'runner@alder-reach.example']);
  git(['config', 'commit.gpgsign', 'false']);
  return {
    dir,
    git,
    write(path, text) {
      mkdirSync(dirname(join(dir, path)), { recursive: true });
      writeFileSync(join(dir, path), text);
    },
    commit(message, author, date) {
      git(['add', '-A']);
      const stamp = `${date}T09:00:00+00:00`;
      git(['commit', '-q', '-m', message], {
        GIT_AUTHOR_NAME: author.name, GIT_AUTHOR_EMAIL: author.email, GIT_AUTHOR_DATE: stamp,
        GIT_COMMITTER_NAME: author.name, GIT_COMMITTER_EMAIL: author.email, GIT_COMMITTER_DATE: stamp,
      });
      return git(['rev-parse', 'HEAD']).trim();
    },
    remove() {
      rmSync(dir, { recursive: true, force: true });
    },
  };
}

export const ada = { name: 'Ada Ferrand', email: 'ada.ferrand@alder-reach.example' };
export const bram = { name: 'Bram Okonjo', email: 'bram.okonjo@alder-reach.example' };

/**
 * The story: rev 1 drafted and made effective; rev 2 drafted with added, edited and moved steps; the file renamed
 * into a sub-folder; rev 2 made effective; then a safety change (limit and trip raised) committed without a bump.
 */
export function buildStory(repo: TempRepo): Record<'draft1' | 'effective1' | 'draft2' | 'renamed' | 'effective2' | 'unbumped', string> {
  const signatures1 = [{ role: 'Process engineer', name: 'Ada Ferrand', date: '2026-01-15' }, { role: 'Operations superintendent', name: 'Bram Okonjo', date: '2026-01-18' }];
  const signatures2 = [{ role: 'Process engineer', name: 'Ada Ferrand', date: '2026-02-15' }, { role: 'Operations superintendent', name: 'Bram Okonjo', date: '2026-02-18' }];
  const v1 = { revision: 1, steps: stepsV1, change: 'First issue.' };
  const v2 = { revision: 2, steps: stepsV2, hazards: hazardsV1.slice(0, 5), change: 'Nitrogen purge added; cook raised to 230 degC (MOC-2026-011).' };
  repo.write('procedures/u2-test-001.md', procedureText({ ...v1, status: 'draft' }));
  const draft1 = repo.commit('Draft U2-TEST-001 rev 1', ada, '2026-01-10');
  repo.write('procedures/u2-test-001.md', procedureText({ ...v1, status: 'effective', effective: '2026-01-20', approvals: signatures1 }));
  const effective1 = repo.commit('U2-TEST-001 rev 1 effective', bram, '2026-01-20');
  repo.write('procedures/u2-test-001.md', procedureText({ ...v2, status: 'draft' }));
  const draft2 = repo.commit('Draft U2-TEST-001 rev 2', ada, '2026-02-05');
  mkdirSync(join(repo.dir, 'procedures/k-210'), { recursive: true });
  repo.git(['mv', 'procedures/u2-test-001.md', 'procedures/k-210/u2-test-001.md']);
  const renamed = repo.commit('Move K-210 procedures into their own folder', ada, '2026-02-10');
  repo.write('procedures/k-210/u2-test-001.md', procedureText({ ...v2, status: 'effective', effective: '2026-02-20', approvals: signatures2 }));
  const effective2 = repo.commit('U2-TEST-001 rev 2 effective', bram, '2026-02-20');
  repo.write('procedures/k-210/u2-test-001.md', procedureText({
    ...v2, status: 'effective', effective: '2026-02-20', approvals: signatures2, high: '250 degC', trip: 'TI-210 >= 260 degC',
  }));
  const unbumped = repo.commit('Raise the K-210 high limit', ada, '2026-03-01');
  return { draft1, effective1, draft2, renamed, effective2, unbumped };
}
