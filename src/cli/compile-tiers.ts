// How V8 compiles a check's code. Besides its interpreter and baseline compiler, V8 recompiles functions that get
// hot with two optimising compilers (Maglev, then TurboFan). A check of a few dozen files is over before that
// work pays for itself: on the 2-core machine, the cold check of the 13 demo procedures took 0.91 s with both
// off against 1.06 s with them on (median of 8, interleaved), 104 files 1.74 s against 1.93 s; from about 200
// files on they pay (208 files: 2.49 s on, 2.80 s off; 1,001 files: 60 % slower with them off). So a check
// starts with them off and turns them back on as soon as it finds that many files. V8 reads these two settings
// whenever it decides to optimise, so changing them while the process runs takes effect at once.
import { setFlagsFromString } from 'node:v8';

/** From this many files on, a check is long enough for the optimising compilers to pay. */
export const optimisedFrom = 150;

const compilers = ['maglev', 'turbofan'];

/** A compiler the user turned on or off on node's command line is left as they chose. */
function chosenByUser(name: string): boolean {
  return process.execArgv.some((arg) => arg === `--${name}` || arg === `--no-${name}`);
}

function set(on: boolean): void {
  for (const name of compilers) if (!chosenByUser(name)) setFlagsFromString(`--${on ? '' : 'no-'}${name}`);
}

/**
 * Runs a check with the optimising compilers off until `sized` learns it is large; they are on again when it
 * ends (a test runner, or a later command in the same process, runs at full speed).
 */
export async function withCompilersForSize<T>(work: (sized: (files: number) => void) => Promise<T>): Promise<T> {
  set(false);
  try {
    return await work((files) => {
      if (files >= optimisedFrom) set(true);
    });
  } finally {
    set(true);
  }
}
