import { REFERRAL_STATUS_LABELS } from '@shared/care';
import type { CheckIn, Referral } from '../models';

export function presentCheckIn(c: CheckIn) {
  return {
    id: c.id,
    planId: c.planId,
    stepIndex: c.stepIndex,
    createdAt: c.createdAt.toISOString(),
    rides: c.rides,
    minutesRidden: c.minutesRidden,
    comfort: c.comfort,
    pains: c.pains,
    numbness: c.numbness,
    note: c.note,
    // The safety answers belong with the check-in: a physio reading "urgent warning signs" must see which.
    redFlagAnswers: c.redFlagAnswers,
    analysis: c.analysis,
    reviewedAt: c.reviewedAt?.toISOString() ?? null,
  };
}

export function presentReferral(r: Referral, names: Map<number, string>, consent: { given: boolean; withdrawn: boolean }) {
  return {
    id: r.id,
    consultationId: r.consultationId,
    riderId: r.riderId,
    riderName: names.get(r.riderId) ?? '',
    fitterId: r.fitterId,
    physio: r.physioId ? { id: r.physioId, displayName: names.get(r.physioId) ?? '' } : null,
    origin: r.origin,
    urgency: r.urgency,
    status: r.status,
    statusLabel: REFERRAL_STATUS_LABELS[r.status],
    reason: r.reason,
    findings: r.findings,
    attachmentIds: r.attachmentIds,
    decision: r.decision,
    responseNote: r.responseNote,
    limits: r.limits,
    holdReason: r.holdReason,
    declineNote: r.declineNote,
    createdAt: r.createdAt.toISOString(),
    sentAt: r.sentAt?.toISOString() ?? null,
    acceptedAt: r.acceptedAt?.toISOString() ?? null,
    closedAt: r.closedAt?.toISOString() ?? null,
    escalated: r.escalatedAt !== null,
    consent,
  };
}

/**
 * A referral as the physio who declined it sees it: who, when and their own note, but not the
 * fitter's reason, findings or attachments. Declining ends their part in the rider's care, so
 * they keep no health details (the rider agreed to share with a physio who takes the case).
 */
export function withoutClinicalText<T extends ReturnType<typeof presentReferral>>(referral: T): T {
  return { ...referral, reason: '', findings: '', attachmentIds: [] };
}
