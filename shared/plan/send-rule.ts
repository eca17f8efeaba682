import { STATE_LABELS, type ConsultationState } from '../consultation/states';

/**
 * When a fitter may send a plan: once the live session has started (`in_session`), or later to
 * replace the plan under way (`plan_active`). Prescribing after the call is normal and there is
 * no separate "session ended" state, so both count. Not while `booked` (the fitter has not seen
 * the rider yet), not while a hold pauses the plans (`on_hold`: a physio clears it first), and not
 * once the consultation is finished, cancelled or missed. The server enforces it; the plan
 * builder shows the same reason beside a disabled Send.
 */
export const PLAN_SENDING_STATES = ['in_session', 'plan_active'] as const satisfies readonly ConsultationState[];

/** Why a plan cannot be sent in this state, in the fitter's words; null when it can. */
export function planSendBlocker(status: ConsultationState): string | null {
  if ((PLAN_SENDING_STATES as readonly ConsultationState[]).includes(status)) return null;
  if (status === 'booked') return 'Start the session (Case tab) before sending a plan: the rider gets a plan only after you have talked it through.';
  if (status === 'on_hold') return 'The plan is paused by a hold. A physiotherapist clears it first; then you can send a new plan within their limits.';
  return `This consultation is ${STATE_LABELS[status].toLowerCase()}, so no plan can be sent from it.`;
}
