// The registry of every rule, keyed by its permanent id.
import type { Rule } from '../define-rule.ts';
import approvalMissing from './approval-missing.ts';
import authorOnlyApprover from './author-only-approver.ts';
import bodyNotShown from './body-not-shown.ts';
import bodyTooDeep from './body-too-deep.ts';
import bodyTooLarge from './body-too-large.ts';
import badIdFormat from './bad-id-format.ts';
import bypassProcedureUnknown from './bypass-procedure-unknown.ts';
import callCycle from './call-cycle.ts';
import callExpansionProblem from './call-expansion-problem.ts';
import callRetiredProcedure from './call-retired-procedure.ts';
import callRevisionMismatch from './call-revision-mismatch.ts';
import callUnknownProcedure from './call-unknown-procedure.ts';
import requiresCycle from './requires-cycle.ts';
import tripLeftLatched from './trip-left-latched.ts';
import resetWhileTripped from './reset-while-tripped.ts';
import emergencyWaitWithoutTimeLimit from './emergency-wait-without-time-limit.ts';
import correctionCausesHazard from './correction-causes-hazard.ts';
import holdTestBeyondCriterion from './hold-test-beyond-criterion.ts';
import tripSharesAlarmSensor from './trip-shares-alarm-sensor.ts';
import lineUpContradictsRequired from './line-up-contradicts-required.ts';
import ppeMissingForChemical from './ppe-missing-for-chemical.ts';
import highLevelTripMissesFeed from './high-level-trip-misses-feed.ts';
import tripTestIncomplete from './trip-test-incomplete.ts';
import registerHazardNotStated from './register-hazard-not-stated.ts';
import timeLimitBelowExpected from './time-limit-below-expected.ts';
import contingencyGotoUnsafe from './contingency-goto-unsafe.ts';
import endStateDiffers from './end-state-differs.ts';
import requiresNotInForce from './requires-not-in-force.ts';
import requiresUnknownProcedure from './requires-unknown-procedure.ts';
import certificationInFuture from './certification-in-future.ts';
import effectiveInFuture from './effective-in-future.ts';
import cautionForSeriousInjury from './caution-for-serious-injury.ts';
import cautionHoldsAction from './caution-holds-action.ts';
import conditionSyntax from './condition-syntax.ts';
import contradictoryCondition from './contradictory-condition.ts';
import decisionNotAnalysed from './decision-not-analysed.ts';
import duplicateProcedureId from './duplicate-procedure-id.ts';
import duplicateStepId from './duplicate-step-id.ts';
import effectiveBeforeApproval from './effective-before-approval.ts';
import effectiveDateMissing from './effective-date-missing.ts';
import effectiveEditedInPlace from './effective-edited-in-place.ts';
import expectInvalid from './expect-invalid.ts';
import frontMatterNotMapping from './front-matter-not-mapping.ts';
import gotoCrossesParallel from './goto-crosses-parallel.ts';
import gotoUnknownStep from './goto-unknown-step.ts';
import hiddenCharacter from './hidden-character.ts';
import hazardUnknownStep from './hazard-unknown-step.ts';
import invalidValue from './invalid-value.ts';
import limitIncomplete from './limit-incomplete.ts';
import loopWithoutExit from './loop-without-exit.ts';
import modifiesUnknownProcedure from './modifies-unknown-procedure.ts';
import missingFrontMatter from './missing-front-matter.ts';
import missingRequiredKey from './missing-required-key.ts';
import mixedAndOr from './mixed-and-or.ts';
import nameFormat from './name-format.ts';
import noteHoldsAction from './note-holds-action.ts';
import noticeForInjury from './notice-for-injury.ts';
import numberWithoutUnit from './number-without-unit.ts';
import oneActionPerStep from './one-action-per-step.ts';
import overlappingBranches from './overlapping-branches.ts';
import placeholderText from './placeholder-text.ts';
import pressureReferenceUnstated from './pressure-reference-unstated.ts';
import ppeMissing from './ppe-missing.ts';
import repeatCountInvalid from './repeat-count-invalid.ts';
import requiredContentMissing from './required-content-missing.ts';
import registerInvalid from './register-invalid.ts';
import registerDuplicateEntry from './register-duplicate-entry.ts';
import registerUnknownEntry from './register-unknown-entry.ts';
import registerEntryUnused from './register-entry-unused.ts';
import registerConflict from './register-conflict.ts';
import registerEntryInvalid from './register-entry-invalid.ts';
import limitBeyondTrip from './limit-beyond-trip.ts';
import limitBeyondRelief from './limit-beyond-relief.ts';
import limitOutsideRange from './limit-outside-range.ts';
import setpointWithoutLimits from './setpoint-without-limits.ts';
import paramDiffersFromDuty from './param-differs-from-duty.ts';
import paramOutsideLimits from './param-outside-limits.ts';
import interlockInconsistent from './interlock-inconsistent.ts';
import registerLimitIncomplete from './register-limit-incomplete.ts';
import reviewDateMissing from './review-date-missing.ts';
import reviewIntervalTooLong from './review-interval-too-long.ts';
import temporaryWithoutEnd from './temporary-without-end.ts';
import temporaryExpired from './temporary-expired.ts';
import reviewOverdue from './review-overdue.ts';
import revisionDecreased from './revision-decreased.ts';
import revisionNotBumped from './revision-not-bumped.ts';
import safetyMessageIncomplete from './safety-message-incomplete.ts';
import sentenceTooLong from './sentence-too-long.ts';
import sequenceDeadlock from './sequence-deadlock.ts';
import sequenceTooLarge from './sequence-too-large.ts';
import setpointAtTrip from './setpoint-at-trip.ts';
import waitBeyondTrip from './wait-beyond-trip.ts';
import setpointBlocksTransition from './setpoint-blocks-transition.ts';
import setpointOutsideLimits from './setpoint-outside-limits.ts';
import statusLifecycle from './status-lifecycle.ts';
import stepActivatedTwice from './step-activated-twice.ts';
import stepStartsWithVerb from './step-starts-with-verb.ts';
import stepWithoutTransition from './step-without-transition.ts';
import stepsLeftActive from './steps-left-active.ts';
import thresholdOutsideRange from './threshold-outside-range.ts';
import uncoveredValues from './uncovered-values.ts';
import undeclaredName from './undeclared-name.ts';
import unitMismatch from './unit-mismatch.ts';
import unreachableStep from './unreachable-step.ts';
import unreadableFile from './unreadable-file.ts';
import unknownKey from './unknown-key.ts';
import unknownUnit from './unknown-unit.ts';
import vagueTerm from './vague-term.ts';
import valueNotAllowed from './value-not-allowed.ts';
import waiverUnknownRule from './waiver-unknown-rule.ts';
import waiverWithoutReason from './waiver-without-reason.ts';
import yamlSyntax from './yaml-syntax.ts';
import contingencyMissing from './contingency-missing.ts';
import hazardCanOccur from './hazard-can-occur.ts';
import hazardReliesOnOldReading from './hazard-relies-on-old-reading.ts';
import independentCheckByPerformer from './independent-check-by-performer.ts';
import latchedTripHoldsOutput from './latched-trip-holds-output.ts';
import retryWithoutLimit from './retry-without-limit.ts';
import stateNotAnalysed from './state-not-analysed.ts';
import stateReferenceUnknown from './state-reference-unknown.ts';
import stepNeedUnmet from './step-need-unmet.ts';

export const rules = {
  'contingency-missing': contingencyMissing,
  'hazard-can-occur': hazardCanOccur,
  'hazard-relies-on-old-reading': hazardReliesOnOldReading,
  'independent-check-by-performer': independentCheckByPerformer,
  'latched-trip-holds-output': latchedTripHoldsOutput,
  'retry-without-limit': retryWithoutLimit,
  'state-not-analysed': stateNotAnalysed,
  'state-reference-unknown': stateReferenceUnknown,
  'step-need-unmet': stepNeedUnmet,
  'approval-missing': approvalMissing,
  'author-only-approver': authorOnlyApprover,
  'body-not-shown': bodyNotShown,
  'body-too-deep': bodyTooDeep,
  'bad-id-format': badIdFormat,
  'bypass-procedure-unknown': bypassProcedureUnknown,
  'body-too-large': bodyTooLarge,
  'call-cycle': callCycle,
  'call-expansion-problem': callExpansionProblem,
  'call-retired-procedure': callRetiredProcedure,
  'call-revision-mismatch': callRevisionMismatch,
  'call-unknown-procedure': callUnknownProcedure,
  'requires-unknown-procedure': requiresUnknownProcedure,
  'requires-not-in-force': requiresNotInForce,
  'requires-cycle': requiresCycle,
  'trip-left-latched': tripLeftLatched,
  'reset-while-tripped': resetWhileTripped,
  'emergency-wait-without-time-limit': emergencyWaitWithoutTimeLimit,
  'correction-causes-hazard': correctionCausesHazard,
  'hold-test-beyond-criterion': holdTestBeyondCriterion,
  'trip-shares-alarm-sensor': tripSharesAlarmSensor,
  'line-up-contradicts-required': lineUpContradictsRequired,
  'ppe-missing-for-chemical': ppeMissingForChemical,
  'high-level-trip-misses-feed': highLevelTripMissesFeed,
  'trip-test-incomplete': tripTestIncomplete,
  'register-hazard-not-stated': registerHazardNotStated,
  'time-limit-below-expected': timeLimitBelowExpected,
  'contingency-goto-unsafe': contingencyGotoUnsafe,
  'end-state-differs': endStateDiffers,
  'certification-in-future': certificationInFuture,
  'effective-in-future': effectiveInFuture,
  'caution-for-serious-injury': cautionForSeriousInjury,
  'caution-holds-action': cautionHoldsAction,
  'condition-syntax': conditionSyntax,
  'contradictory-condition': contradictoryCondition,
  'decision-not-analysed': decisionNotAnalysed,
  'duplicate-procedure-id': duplicateProcedureId,
  'duplicate-step-id': duplicateStepId,
  'effective-before-approval': effectiveBeforeApproval,
  'effective-date-missing': effectiveDateMissing,
  'effective-edited-in-place': effectiveEditedInPlace,
  'expect-invalid': expectInvalid,
  'front-matter-not-mapping': frontMatterNotMapping,
  'goto-crosses-parallel': gotoCrossesParallel,
  'goto-unknown-step': gotoUnknownStep,
  'hazard-unknown-step': hazardUnknownStep,
  'hidden-character': hiddenCharacter,
  'invalid-value': invalidValue,
  'limit-incomplete': limitIncomplete,
  'loop-without-exit': loopWithoutExit,
  'modifies-unknown-procedure': modifiesUnknownProcedure,
  'missing-front-matter': missingFrontMatter,
  'missing-required-key': missingRequiredKey,
  'mixed-and-or': mixedAndOr,
  'name-format': nameFormat,
  'note-holds-action': noteHoldsAction,
  'notice-for-injury': noticeForInjury,
  'number-without-unit': numberWithoutUnit,
  'one-action-per-step': oneActionPerStep,
  'overlapping-branches': overlappingBranches,
  'placeholder-text': placeholderText,
  'pressure-reference-unstated': pressureReferenceUnstated,
  'ppe-missing': ppeMissing,
  'repeat-count-invalid': repeatCountInvalid,
  'required-content-missing': requiredContentMissing,
  'register-invalid': registerInvalid,
  'register-duplicate-entry': registerDuplicateEntry,
  'register-unknown-entry': registerUnknownEntry,
  'register-entry-unused': registerEntryUnused,
  'register-conflict': registerConflict,
  'register-entry-invalid': registerEntryInvalid,
  'limit-beyond-trip': limitBeyondTrip,
  'limit-beyond-relief': limitBeyondRelief,
  'limit-outside-range': limitOutsideRange,
  'setpoint-without-limits': setpointWithoutLimits,
  'param-differs-from-duty': paramDiffersFromDuty,
  'param-outside-limits': paramOutsideLimits,
  'interlock-inconsistent': interlockInconsistent,
  'register-limit-incomplete': registerLimitIncomplete,
  'review-date-missing': reviewDateMissing,
  'review-interval-too-long': reviewIntervalTooLong,
  'temporary-without-end': temporaryWithoutEnd,
  'temporary-expired': temporaryExpired,
  'review-overdue': reviewOverdue,
  'revision-decreased': revisionDecreased,
  'revision-not-bumped': revisionNotBumped,
  'safety-message-incomplete': safetyMessageIncomplete,
  'sentence-too-long': sentenceTooLong,
  'sequence-deadlock': sequenceDeadlock,
  'sequence-too-large': sequenceTooLarge,
  'setpoint-at-trip': setpointAtTrip,
  'wait-beyond-trip': waitBeyondTrip,
  'setpoint-blocks-transition': setpointBlocksTransition,
  'setpoint-outside-limits': setpointOutsideLimits,
  'status-lifecycle': statusLifecycle,
  'step-activated-twice': stepActivatedTwice,
  'step-starts-with-verb': stepStartsWithVerb,
  'step-without-transition': stepWithoutTransition,
  'steps-left-active': stepsLeftActive,
  'threshold-outside-range': thresholdOutsideRange,
  'uncovered-values': uncoveredValues,
  'undeclared-name': undeclaredName,
  'unit-mismatch': unitMismatch,
  'unreachable-step': unreachableStep,
  'unreadable-file': unreadableFile,
  'unknown-key': unknownKey,
  'unknown-unit': unknownUnit,
  'vague-term': vagueTerm,
  'value-not-allowed': valueNotAllowed,
  'waiver-unknown-rule': waiverUnknownRule,
  'waiver-without-reason': waiverWithoutReason,
  'yaml-syntax': yamlSyntax,
} satisfies Record<string, Rule>;

export type RuleId = keyof typeof rules;

export const allRules: Rule[] = Object.values(rules);
