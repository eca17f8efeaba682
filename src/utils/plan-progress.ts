import type { StatusKind } from '@/components/StatusBadge.vue';
import type { StepProgress, StoredPlan } from '@/api/plans';
import { formatIsoDate } from './plan';

/** Where a sent step stands, as the fitter follows it. */
export type SentStepState = 'waiting' | 'released' | 'paused' | 'applied' | 'checked-in' | 'reverted' | 'replaced';

export const SENT_STEP_LOOK: Record<SentStepState, { kind: StatusKind; label: string }> = {
  waiting: { kind: 'waiting', label: 'Waiting' },
  released: { kind: 'watch', label: 'Released to the rider' },
  paused: { kind: 'hold', label: 'Paused' },
  applied: { kind: 'steady', label: 'Made' },
  'checked-in': { kind: 'steady', label: 'Made, checked in' },
  reverted: { kind: 'hold', label: 'Made, then reverted' },
  replaced: { kind: 'hold', label: 'Not made: replaced' },
};

export const SENT_PLAN_LOOK: Record<StoredPlan['status'], { kind: StatusKind; label: string }> = {
  active: { kind: 'steady', label: 'Under way' },
  on_hold: { kind: 'hold', label: 'On hold' },
  superseded: { kind: 'waiting', label: 'Replaced by a newer plan' },
  completed: { kind: 'steady', label: 'All steps made' },
};

/**
 * A step's state from its stored progress and its plan's: `locked` waits, `current` is released
 * (or paused while the plan is on hold), `applied` is made (checked in once a check-in is logged).
 * In a replaced plan, steps never made were dropped, and made ones count as reverted when the plan
 * that replaced it was a way back (`revertedLater`).
 */
export function sentStepState(plan: StoredPlan, progress: StepProgress | undefined, revertedLater: boolean): SentStepState {
  const state = progress?.state ?? 'locked';
  if (state === 'applied') {
    if (plan.status === 'superseded' && revertedLater) return 'reverted';
    return progress?.checkedIn ? 'checked-in' : 'applied';
  }
  if (plan.status === 'superseded') return 'replaced';
  if (state === 'current') return plan.status === 'on_hold' ? 'paused' : 'released';
  return 'waiting';
}

/** The dates that matter for a step, in one line: when it may be made, when it was, when its check-in is due. */
export function sentStepDates(earliest: string, progress: StepProgress | undefined): string {
  const parts = [`from ${formatIsoDate(progress?.earliestDate ?? earliest)}`];
  if (progress?.appliedOn) parts.push(`made ${formatIsoDate(progress.appliedOn)}`);
  if (progress?.checkInDue) parts.push(`check-in due ${formatIsoDate(progress.checkInDue)}${progress.overdue ? ' (overdue)' : ''}`);
  return parts.join(' · ');
}

/** True when the next plan for the same bike, after this one, was a way back to an earlier setup. */
export function revertedAfter(plan: StoredPlan, all: readonly StoredPlan[]): boolean {
  const next = all.filter((p) => p.bikeId === plan.bikeId && p.id > plan.id).sort((a, b) => a.id - b.id)[0];
  return next?.kind === 'revert';
}
