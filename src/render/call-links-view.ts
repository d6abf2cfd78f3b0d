// Links between shared operations and the procedures that call them, both ways, for the procedure pages.
import { callSitesOf, linkCalls, type CallSite } from '../analysis/inline-calls.ts';
import type { Procedure } from '../model/procedure.ts';
import { numberSteps } from './step-numbers.ts';

export interface CallLink {
  /** The step that calls (in the caller). */
  stepId: string;
  stepNumber?: string;
  procedureId: string;
  title?: string;
  status?: string;
  revision?: number;
  /** The pinned revision, when the call names one. */
  pinned?: number;
  /** Page of the other procedure; undefined when it is not in the manual. */
  url?: string;
}

export interface CallLinksView {
  /** Procedures this one calls, by call step. */
  calls: CallLink[];
  /** Steps of other procedures that call this one. */
  calledBy: CallLink[];
}

/** Procedures by id and the call sites that call each one: worked out once for a whole manual. */
export interface CallIndex {
  byId: Map<string, Procedure>;
  callers: Map<string, CallSite[]>;
}

export function indexCalls(all: Procedure[]): CallIndex {
  return { byId: new Map(all.map((p) => [p.id, p])), callers: linkCalls(all).callers };
}

/** The call links of one procedure; give an index (indexCalls) when making many pages of one manual. */
export function buildCallLinksView(procedure: Procedure, all: Procedure[] | CallIndex, urlOf: (id: string) => string | undefined): CallLinksView {
  const { byId, callers } = Array.isArray(all) ? indexCalls(all) : all;
  const numbers = numberSteps(procedure.steps);
  const calls = callSitesOf(procedure).map((site): CallLink => {
    const callee = byId.get(site.callee);
    return {
      stepId: site.step.id, stepNumber: numbers.ofStep.get(site.step.id), procedureId: site.callee,
      title: callee?.title, status: callee ? String(callee.status) : undefined, revision: callee?.revision, pinned: site.revision,
      url: callee ? urlOf(site.callee) : undefined,
    };
  });
  const calledBy = (callers.get(procedure.id) ?? []).map((site): CallLink => {
    const caller = byId.get(site.caller);
    return {
      stepId: site.step.id, stepNumber: caller ? numberSteps(caller.steps).ofStep.get(site.step.id) : undefined,
      procedureId: site.caller, title: caller?.title, status: caller ? String(caller.status) : undefined, revision: caller?.revision,
      pinned: site.revision, url: urlOf(site.caller),
    };
  });
  return { calls, calledBy };
}
