import type { ReferralStatus } from '@shared/care';
import { REFERRAL_STATUS_LABELS } from '@shared/care';
import { conflict } from '../errors';

/** Allowed moves of a referral; anything else is refused. */
const MOVES: Record<ReferralStatus, readonly ReferralStatus[]> = {
  proposed: ['awaiting_consent', 'withdrawn'],
  awaiting_consent: ['sent', 'withdrawn'],
  sent: ['received', 'withdrawn'],
  received: ['accepted', 'declined', 'withdrawn'],
  accepted: ['in_progress', 'closed', 'withdrawn'],
  declined: [],
  in_progress: ['closed', 'withdrawn'],
  closed: [],
  withdrawn: [],
};

export function assertReferralMove(from: ReferralStatus, to: ReferralStatus) {
  if (!MOVES[from].includes(to)) {
    throw conflict(`This referral is ${REFERRAL_STATUS_LABELS[from].toLowerCase()} and cannot become ${REFERRAL_STATUS_LABELS[to].toLowerCase()}.`);
  }
}

/** Statuses in which the assigned physio may open the case (with the rider's consent). */
export const PHYSIO_ACCESS_STATUSES: readonly ReferralStatus[] = ['accepted', 'in_progress', 'closed'];
/** Statuses the physio's inbox shows. */
export const INBOX_STATUSES: readonly ReferralStatus[] = ['sent', 'received', 'accepted', 'in_progress'];
