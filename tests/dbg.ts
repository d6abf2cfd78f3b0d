import { readFileSync } from 'node:fs';
import { readProcedure } from '../src/check/run-checks.ts';
import { analyseState } from '../src/analysis/state/analyse-state.ts';
import { stateInputOf } from '../src/analysis/state/state-input.ts';
const f = process.argv[2];
const { procedure, facts } = readProcedure(f, readFileSync(f, 'utf8'));
const a = analyseState(stateInputOf(procedure!, facts!.graph), [], 3000);
for (const [place, views] of a.views) console.log(place, views.length, views.slice(0, 3).map((v) => a.space.describe(v.box)).join(' || '));
console.log(a.gaps);
