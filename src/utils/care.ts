import type { ReferralStatus, ReferralUrgency } from '@shared/care';
import { UPLOAD_VIEW_INFO, UPLOAD_VIEWS, type UploadView } from '@shared/rider';
import type { CheckInDecision } from '@shared/fit/checkin';
import type { StatusKind } from '@/components/StatusBadge.vue';
import type { StepProgress, StoredPlan } from '@/api/plans';

export interface StatusLook {
  kind: StatusKind;
  label: string;
}

/** A check-in's decision as a status: icon plus words, never colour alone. */
export const DECISION_LOOK: Record<CheckInDecision, StatusLook> = {
  continue: { kind: 'steady', label: 'Steady: carry on' },
  'hold-for-review': { kind: 'watch', label: 'Watch: your fitter will look' },
  'suggest-revert': { kind: 'watch', label: 'Watch: go back one step' },
  refer: { kind: 'hold', label: 'Hold: a physiotherapist should look' },
};

/** The same decisions as a fitter reads them on Today and in the room. */
export const DECISION_FOR_FITTER: Record<CheckInDecision, string> = {
  continue: 'carrying on',
  'hold-for-review': 'waiting for your review',
  'suggest-revert': 'going back one step suggested',
  refer: 'physiotherapist suggested',
};

const KIND_WORD: Record<StatusKind, string> = { steady: 'Steady', watch: 'Watch', hold: 'Hold', urgent: 'Urgent', waiting: 'Waiting' };

/** "Watch: waiting for your review": the status word, then what it means for the fitter. */
export function fitterDecisionLabel(decision: CheckInDecision): string {
  return `${KIND_WORD[DECISION_LOOK[decision].kind]}: ${DECISION_FOR_FITTER[decision]}`;
}

/** Referral urgency: urgent first, then soon, then routine (the physio inbox legend uses the same). */
export const URGENCY_LOOK: Record<ReferralUrgency, StatusLook> = {
  urgent: { kind: 'urgent', label: 'Urgent' },
  soon: { kind: 'watch', label: 'Soon' },
  routine: { kind: 'steady', label: 'Routine' },
};

export const URGENCY_HELP: Record<ReferralUrgency, string> = {
  urgent: 'Red flags reported: look at this first.',
  soon: 'Should be seen within days.',
  routine: 'Can wait for a regular appointment.',
};

/** Where a referral stands, as a status kind for the badge (the label comes from the server). */
export function referralStatusKind(status: ReferralStatus): StatusKind {
  if (status === 'proposed' || status === 'awaiting_consent' || status === 'sent' || status === 'received') return 'waiting';
  if (status === 'declined' || status === 'withdrawn') return 'hold';
  return 'steady';
}

/** "just now", "12 min ago", "3 h ago", "2 days ago" from an ISO instant. */
export function ageOf(iso: string, now: Date = new Date()): string {
  const minutes = Math.max(0, Math.floor((now.getTime() - new Date(iso).getTime()) / 60_000));
  if (Number.isNaN(minutes)) return '';
  if (minutes < 1) return 'just now';
  if (minutes < 60) return `${minutes} min ago`;
  const hours = Math.floor(minutes / 60);
  if (hours < 48) return `${hours} h ago`;
  return `${Math.floor(hours / 24)} days ago`;
}

/** "1 h 30 min" for minutes ridden. */
export function formatMinutes(total: number): string {
  const h = Math.floor(total / 60);
  const m = total % 60;
  if (h === 0) return `${m} min`;
  return m === 0 ? `${h} h` : `${h} h ${m} min`;
}

/** The step a check-in is about: the latest applied step of the plan, if any. */
export function checkInStep(plan: StoredPlan): StepProgress | null {
  const applied = plan.steps.filter((s) => s.state === 'applied');
  return applied[applied.length - 1] ?? null;
}

export type CheckInState = 'overdue' | 'due' | 'upcoming' | 'done' | 'none';

/**
 * Whether the rider owes a check-in on the current step: overdue (the server says so), due
 * (its date has come), upcoming (a date ahead), done, or none (no step applied yet).
 */
export function checkInState(plan: StoredPlan, today: string): { state: CheckInState; step: StepProgress | null } {
  const step = checkInStep(plan);
  if (!step) return { state: 'none', step: null };
  if (step.checkedIn) return { state: 'done', step };
  if (step.overdue) return { state: 'overdue', step };
  if (step.checkInDue && step.checkInDue <= today) return { state: 'due', step };
  return { state: 'upcoming', step };
}

/** "Side on, crank at 3 o'clock" for an upload's view; a plain word when the view is unknown. */
export function uploadViewLabel(view: string | null, kind: 'photo' | 'clip' = 'photo'): string {
  if (view && (UPLOAD_VIEWS as readonly string[]).includes(view)) return UPLOAD_VIEW_INFO[view as UploadView].label;
  return kind === 'clip' ? 'Clip' : 'Photo';
}
