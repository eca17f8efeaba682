/**
 * The life of a consultation, from the first booking request to the end of its plan. Every change
 * of state goes through `canTransition` (the server's transition service is the only writer), is
 * recorded with who and when, and is announced to the parties.
 */
export const CONSULTATION_STATES = [
  'requested', // a slot is held while the rider checks out
  'awaiting_payment', // the rider is paying; the hold still stands
  'booked', // paid and confirmed
  'in_session', // the live session has started
  'plan_active', // a plan was sent; the rider works through its steps
  'on_hold', // a physio or a red flag paused the plan
  'completed',
  'cancelled',
  'no_show',
  'expired', // the hold ran out before payment
] as const;
export type ConsultationState = (typeof CONSULTATION_STATES)[number];

/** Allowed moves. Anything not listed is refused. */
export const TRANSITIONS: Record<ConsultationState, readonly ConsultationState[]> = {
  requested: ['awaiting_payment', 'booked', 'expired', 'cancelled'],
  awaiting_payment: ['booked', 'requested', 'expired', 'cancelled'],
  booked: ['in_session', 'cancelled', 'no_show', 'booked'], // booked → booked is a reschedule
  in_session: ['plan_active', 'completed', 'on_hold'],
  plan_active: ['on_hold', 'completed'],
  on_hold: ['plan_active', 'completed'],
  completed: [],
  cancelled: [],
  no_show: [],
  expired: [],
};

export function canTransition(from: ConsultationState, to: ConsultationState): boolean {
  return TRANSITIONS[from].includes(to);
}

/** States in which a consultation occupies its slot in the fitter's calendar. */
export const SLOT_HOLDING_STATES: readonly ConsultationState[] = ['requested', 'awaiting_payment', 'booked', 'in_session', 'plan_active', 'on_hold', 'completed', 'no_show'];

/** States in which the assigned fitter may see the rider's health data. */
export const CARE_STATES: readonly ConsultationState[] = ['booked', 'in_session', 'plan_active', 'on_hold', 'completed', 'no_show'];

/** Plain words for each state, shown with an icon, never colour alone. */
export const STATE_LABELS: Record<ConsultationState, string> = {
  requested: 'Slot held',
  awaiting_payment: 'Waiting for payment',
  booked: 'Booked',
  in_session: 'In session',
  plan_active: 'Plan under way',
  on_hold: 'Paused',
  completed: 'Finished',
  cancelled: 'Cancelled',
  no_show: 'Missed',
  expired: 'Hold ran out',
};
