// The writing rules' work ahead: a procedure's phrases go to the English model's thread before its rules run, and a
// rule that reads the prose of a file whose phrases the thread has not tagged yet can be left for later, while the
// other rules check that file and the next ones. The rules' findings are the same either way.
import { proseReady, tagProseLater } from '../analysis/prose/tag-ahead.ts';
import type { WorkAhead } from './define-rule.ts';

export const proseTaggedAhead: WorkAhead = {
  prepare(context) {
    if (context.procedure) tagProseLater(context.procedure);
  },
  ready(context) {
    return !context.procedure || proseReady(context.procedure);
  },
};
