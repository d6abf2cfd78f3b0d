// The registry of every rule, keyed by its permanent id.
import type { Rule } from '../define-rule.ts';
import approvalMissing from './approval-missing.ts';
import authorOnlyApprover from './author-only-approver.ts';
import bodyTooDeep from './body-too-deep.ts';
import badIdFormat from './bad-id-format.ts';
import callCycle from './call-cycle.ts';
import callRetiredProcedure from './call-retired-procedure.ts';
import callRevisionMismatch from './call-revision-mismatch.ts';
import callUnknownProcedure from './call-unknown-procedure.ts';
import conditionSyntax from './condition-syntax.ts';
import duplicateProcedureId from './duplicate-procedure-id.ts';
import duplicateStepId from './duplicate-step-id.ts';
import effectiveBeforeApproval from './effective-before-approval.ts';
import effectiveDateMissing from './effective-date-missing.ts';
import effectiveEditedInPlace from './effective-edited-in-place.ts';
import gotoCrossesParallel from './goto-crosses-parallel.ts';
import gotoUnknownStep from './goto-unknown-step.ts';
import hazardUnknownStep from './hazard-unknown-step.ts';
import invalidValue from './invalid-value.ts';
import missingFrontMatter from './missing-front-matter.ts';
import missingRequiredKey from './missing-required-key.ts';
import placeholderText from './placeholder-text.ts';
import reviewOverdue from './review-overdue.ts';
import revisionDecreased from './revision-decreased.ts';
import revisionNotBumped from './revision-not-bumped.ts';
import setpointAtTrip from './setpoint-at-trip.ts';
import setpointOutsideLimits from './setpoint-outside-limits.ts';
import statusLifecycle from './status-lifecycle.ts';
import stepWithoutTransition from './step-without-transition.ts';
import thresholdOutsideRange from './threshold-outside-range.ts';
import undeclaredName from './undeclared-name.ts';
import unitMismatch from './unit-mismatch.ts';
import unreadableFile from './unreadable-file.ts';
import unknownKey from './unknown-key.ts';
import unknownUnit from './unknown-unit.ts';
import valueNotAllowed from './value-not-allowed.ts';
import yamlSyntax from './yaml-syntax.ts';

export const rules = {
  'approval-missing': approvalMissing,
  'author-only-approver': authorOnlyApprover,
  'body-too-deep': bodyTooDeep,
  'bad-id-format': badIdFormat,
  'call-cycle': callCycle,
  'call-retired-procedure': callRetiredProcedure,
  'call-revision-mismatch': callRevisionMismatch,
  'call-unknown-procedure': callUnknownProcedure,
  'condition-syntax': conditionSyntax,
  'duplicate-procedure-id': duplicateProcedureId,
  'duplicate-step-id': duplicateStepId,
  'effective-before-approval': effectiveBeforeApproval,
  'effective-date-missing': effectiveDateMissing,
  'effective-edited-in-place': effectiveEditedInPlace,
  'goto-crosses-parallel': gotoCrossesParallel,
  'goto-unknown-step': gotoUnknownStep,
  'hazard-unknown-step': hazardUnknownStep,
  'invalid-value': invalidValue,
  'missing-front-matter': missingFrontMatter,
  'missing-required-key': missingRequiredKey,
  'placeholder-text': placeholderText,
  'review-overdue': reviewOverdue,
  'revision-decreased': revisionDecreased,
  'revision-not-bumped': revisionNotBumped,
  'setpoint-at-trip': setpointAtTrip,
  'setpoint-outside-limits': setpointOutsideLimits,
  'status-lifecycle': statusLifecycle,
  'step-without-transition': stepWithoutTransition,
  'threshold-outside-range': thresholdOutsideRange,
  'undeclared-name': undeclaredName,
  'unit-mismatch': unitMismatch,
  'unreadable-file': unreadableFile,
  'unknown-key': unknownKey,
  'unknown-unit': unknownUnit,
  'value-not-allowed': valueNotAllowed,
  'yaml-syntax': yamlSyntax,
} satisfies Record<string, Rule>;

export type RuleId = keyof typeof rules;

export const allRules: Rule[] = Object.values(rules);
