import { STATE_LABELS } from '@shared/consultation';
import type { Consultation, Payment, User } from '../models';

/** A consultation as its rider or fitter sees it: times in UTC, names, money in minor units. */
export function presentConsultation(c: Consultation, people: { rider?: User | null; fitter?: User | null }, payment?: Payment | null) {
  return {
    id: c.id,
    status: c.status,
    statusLabel: STATE_LABELS[c.status],
    startsAt: c.startsAt.toISOString(),
    endsAt: c.endsAt.toISOString(),
    holdExpiresAt: c.holdExpiresAt?.toISOString() ?? null,
    feeMinor: c.feeMinor,
    currency: c.currency,
    flaggedForPhysio: c.flaggedForPhysio,
    rider: people.rider ? { id: people.rider.id, displayName: people.rider.displayName, timeZone: people.rider.timeZone } : null,
    fitter: people.fitter ? { id: people.fitter.id, displayName: people.fitter.displayName, timeZone: people.fitter.timeZone } : null,
    payment: payment ? { status: payment.status, amountMinor: payment.amountMinor, refundedMinor: payment.refundedMinor, currency: payment.currency } : null,
  };
}
export type PresentedConsultation = ReturnType<typeof presentConsultation>;
