// The order in which the test runner starts the test files: the files that take longest first, so that the two
// test processes finish together instead of one of them starting a two-minute browser file near the end. On a
// fresh machine the runner has no record of durations and would start the largest files first. Measured on the
// 2-core machine (whole suite from a fresh clone, seconds per file, not counting setup): packed-install 79 (after
// about 25 s of packing and installing), floor-tablet 48 (the first to need the shared demo build, so it builds it
// for the other browser files), offline-update 40 (after building its two manuals), operator-pages 38, injection 30,
// register-pages 27, manual-site 27, floor-offline 25, build-safety 17, floor-print 7. The rest keep the runner's order.
import { BaseSequencer, type TestSpecification } from 'vitest/node';

export const slowFiles = [
  'tests/e2e/floor-tablet.test.ts',
  // Packs and installs on its own while the first file builds the demo site: the other browser files would wait.
  'tests/package/packed-install.test.ts',
  'tests/e2e/operator-pages.test.ts',
  'tests/robustness/injection.test.ts',
  'tests/e2e/register-pages.test.ts',
  'tests/e2e/offline-update.test.ts',
  'tests/e2e/manual-site.test.ts',
  'tests/robustness/build-safety.test.ts',
  'tests/e2e/floor-offline.test.ts',
  'tests/e2e/floor-print.test.ts',
];

export default class SlowFilesFirst extends BaseSequencer {
  override async sort(files: TestSpecification[]): Promise<TestSpecification[]> {
    const sorted = await super.sort(files);
    const rank = (spec: TestSpecification) => {
      const at = slowFiles.findIndex((f) => spec.moduleId.replaceAll('\\', '/').endsWith(f));
      return at < 0 ? slowFiles.length : at;
    };
    // A stable sort: files not named keep the order the runner chose.
    return sorted.map((spec, i) => ({ spec, i })).sort((a, b) => rank(a.spec) - rank(b.spec) || a.i - b.i).map(({ spec }) => spec);
  }
}
