import { defineConfig } from 'vitest/config';
import SlowFilesFirst from './tests/slow-files-first.ts';

// Test files that replace a module with a mock, or count what a module remembers between calls (the English
// model's tag memo), need a module cache of their own.
const needsOwnModules = ['tests/check/result-cache-reading.test.ts', 'tests/analysis/prose/word-tags.test.ts'];

export default defineConfig({
  test: {
    testTimeout: 30_000,
    // Browser tests wait in their setup for the one shared demo build, which takes minutes on a busy 2-core machine.
    hookTimeout: 900_000,
    pool: 'forks',
    // Temporary folders made with tests/temp-folder.ts go when their test file ends.
    setupFiles: ['tests/remove-temp-folders.ts'],
    // The longest files start first (see tests/slow-files-first.ts).
    sequence: { sequencer: SlowFilesFirst },
    // Two test processes: the browser and build tests wait on child processes much of the time (whole suite
    // 466 s against 522 s with one, both under load from other work on a 2-core machine).
    maxWorkers: 2,
    projects: [
      {
        extends: true,
        // One process imports the engine once for every file: starting a fresh process per file cost about
        // four minutes of the suite's ten on a 2-core machine.
        test: { name: 'shared', include: ['tests/**/*.test.ts'], exclude: needsOwnModules, isolate: false },
      },
      { extends: true, test: { name: 'own-modules', include: needsOwnModules, isolate: true } },
    ],
  },
});
