// Every piece of prose in a procedure that writing rules read, with its YAML path and what kind of text it is.
import type { PathKey } from '../../parse/read-source.ts';
import type { Procedure } from '../../model/procedure.ts';
import { valueAt } from '../../model/validate.ts';
import { walkSteps } from '../../model/walk-steps.ts';
import { splitSentences, type Sentence } from './words.ts';
import { RuleMemo } from '../rule-memo.ts';

/**
 * `action`: an instruction (a step's `do`); `check`: an operator check (`confirm`);
 * `note`: information only; `hazard`: a safety message's hazard or consequence; `avoid`: how to avoid a hazard;
 * `limit`: a limit's consequence or correction.
 */
export type ProseRole = 'action' | 'check' | 'note' | 'hazard' | 'avoid' | 'limit';

export interface ProseSite {
  role: ProseRole;
  path: PathKey[];
  text: string;
  /** The step the text belongs to, when it belongs to one. */
  step?: string;
  sentences: Sentence[];
}

const cache = new RuleMemo<Procedure, ProseSite[]>();

/** The prose of a procedure, split once and shared by every writing rule. */
export function proseOf(procedure: Procedure): ProseSite[] {
  let sites = cache.get(procedure);
  if (!sites) cache.set(procedure, (sites = collectProse(procedure)));
  return sites;
}

export function collectProse(procedure: Procedure): ProseSite[] {
  const out: ProseSite[] = [];
  const add = (role: ProseRole, path: PathKey[], text: string | undefined, step?: string) => {
    if (!text || !text.trim()) return;
    out.push({ role, path, text, step, sentences: splitSentences(text) });
  };
  for (const { step } of walkSteps(procedure.steps)) {
    const many = Array.isArray(valueAt(procedure.data, [...step.path, 'do']));
    step.actions.forEach((a, i) => add('action', many ? [...step.path, 'do', i] : [...step.path, 'do'], a, step.id));
    add('check', step.confirm?.path ?? [], step.confirm?.value, step.id);
    add('note', [...step.path, 'note'], step.note, step.id);
  }
  for (const h of procedure.hazards) {
    add('hazard', [...h.path, 'hazard'], h.hazard);
    add('hazard', [...h.path, 'consequence'], h.consequence);
    add('avoid', [...h.path, 'avoid'], h.avoid);
  }
  for (const l of procedure.limits) {
    add('limit', [...l.path, 'consequence'], l.consequence);
    add('limit', [...l.path, 'correction'], l.correction);
  }
  return out;
}
