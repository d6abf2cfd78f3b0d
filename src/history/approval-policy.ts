// Which sign-offs a change needs: a policy maps kinds of change (limits, interlocks, steps …) to approver roles.
import { z } from 'zod';
import type { Approval } from '../model/procedure.ts';
import type { Redline } from './redline.ts';

export const changeCategories = [
  'content', 'steps', 'setpoints', 'transitions', 'safety-transitions', 'limits', 'interlocks', 'hazards',
  'removed-hazards', 'ppe', 'signals', 'equipment', 'identity', 'narrative',
] as const;
export type ChangeCategory = (typeof changeCategories)[number];

export const categoryWords: Record<ChangeCategory, string> = {
  content: 'content changed',
  steps: 'steps changed',
  setpoints: 'setpoints changed',
  transitions: 'transitions changed',
  'safety-transitions': 'transitions on signals with limits or interlocks changed',
  limits: 'operating limits changed',
  interlocks: 'interlocks changed',
  hazards: 'hazard messages changed',
  'removed-hazards': 'hazard messages removed',
  ppe: 'protective equipment changed',
  signals: 'signals changed',
  equipment: 'equipment list changed',
  identity: 'title, id or kind changed',
  narrative: 'narrative text changed',
};

export const policyEntrySchema = z.strictObject({
  when: z.array(z.enum(changeCategories)).min(1).describe('Kinds of change that trigger this entry.'),
  require: z.array(z.string().trim().min(1)).min(1).describe('Approver roles, as written in `approvals[].role`.'),
  because: z.string().optional().describe('Why these roles must sign, shown in the review.'),
});
export const reviewPolicySchema = z.array(policyEntrySchema).min(1);
export type PolicyEntry = z.infer<typeof policyEntrySchema>;

/** The default policy, documented in docs/review.md; a `review-policy` list in stepwright.config.yaml replaces it. */
export const defaultReviewPolicy: PolicyEntry[] = [
  { when: ['content'], require: ['Process engineer', 'Operations superintendent'], because: 'every change of content is checked for technical accuracy and approved for use' },
  { when: ['steps'], require: ['Shift supervisor'], because: 'changed steps must be workable by the crews who follow them' },
  {
    when: ['limits', 'interlocks', 'setpoints', 'safety-transitions', 'signals'],
    require: ['Process safety lead'],
    because: 'operating limits, safety systems and the values that approach them are process safety information (management of change)',
  },
  { when: ['hazards', 'removed-hazards', 'ppe'], require: ['Safety representative'], because: 'hazard messages and protective equipment protect the people doing the work' },
];

/** The kinds of change a redline contains. */
export function categoriesOf(r: Redline): Set<ChangeCategory> {
  const found = new Set<ChangeCategory>();
  if (r.areas.length) found.add('content');
  if (r.steps.some((s) => s.kinds.length)) found.add('steps');
  for (const item of r.items) {
    if (item.area === 'setpoints') found.add('setpoints');
    if (item.area === 'transitions' || item.area === 'decisions') {
      found.add('transitions');
      if (item.safety) found.add('safety-transitions');
    }
    if (item.area === 'limits') found.add('limits');
    if (item.area === 'interlocks') found.add('interlocks');
    if (item.area === 'hazards') {
      found.add('hazards');
      if (item.kind === 'removed' || item.fields.some((f) => f.field === 'at' && f.before && !f.after)) found.add('removed-hazards');
    }
    if (item.area === 'ppe') found.add('ppe');
    if (item.area === 'signals' && item.safety) found.add('signals');
    if (item.area === 'equipment') found.add('equipment');
    if (item.area === 'identity') found.add('identity');
    if (item.area === 'body') found.add('narrative');
  }
  return found;
}

export interface RequiredSignOff {
  role: string;
  /** The categories that call for this role, in words. */
  reasons: string[];
  /** A signature of this role that is new in this revision (not carried over from the previous one). */
  signedBy?: Approval;
}

export function requiredSignOffs(r: Redline, policy: PolicyEntry[]): RequiredSignOff[] {
  const categories = categoriesOf(r);
  const byRole = new Map<string, RequiredSignOff>();
  for (const entry of policy) {
    const hits = entry.when.filter((c) => categories.has(c));
    if (!hits.length) continue;
    for (const role of entry.require) {
      const key = role.toLowerCase();
      const found = byRole.get(key) ?? { role, reasons: [] };
      for (const h of hits) if (!found.reasons.includes(categoryWords[h])) found.reasons.push(categoryWords[h]);
      byRole.set(key, found);
    }
  }
  const old = new Set(r.before.approvals.map((a) => `${a.role}|${a.name}|${a.date}`.toLowerCase()));
  for (const need of byRole.values()) {
    const signed = r.after.approvals.find((a) => a.role.toLowerCase() === need.role.toLowerCase() && !old.has(`${a.role}|${a.name}|${a.date}`.toLowerCase()));
    if (signed) need.signedBy = signed;
  }
  return [...byRole.values()];
}

/** Reads a `review-policy` value from the configuration; problems come back as lines for the user. */
export function parseReviewPolicy(value: unknown): { policy: PolicyEntry[] } | { problems: string[] } {
  const result = reviewPolicySchema.safeParse(value);
  if (result.success) return { policy: result.data };
  return {
    problems: result.error.issues.map((i) => {
      const where = ['review-policy', ...i.path].map((k, n) => (typeof k === 'number' ? `[${k}]` : n ? `.${String(k)}` : String(k))).join('');
      return `${where}: ${i.message}`;
    }),
  };
}
