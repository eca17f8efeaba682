import type { BookingReadiness } from '@shared/rider';
import { AppError } from '../errors';
import { activeConsent } from './consents';
import { latestSubmitted } from './intakes';

const REASONS = {
  'no-intake': 'Please finish "Tell us what hurts" before booking, so your fitter knows what is going on and we can check it is safe to ride.',
  'no-consent': 'Booking needs your agreement to store your health information. Please go through "Tell us what hurts" again and tick the consent box.',
  urgent: 'Your answers suggest you should stop riding and get urgent medical care today. Booking is paused: once a clinician has seen you, update your answers in "Tell us what hurts" and you can book.',
} as const;

/**
 * Whether a rider may book now, and why not. Reads the latest submitted intake (the server's own
 * triage), and the rider's current consent to store health data. Never throws for a known state.
 */
export async function bookingReadiness(riderId: number): Promise<BookingReadiness> {
  const intake = await latestSubmitted(riderId);
  if (!intake || !intake.triageLevel) return { ready: false, code: 'no-intake', reason: REASONS['no-intake'], level: null, flaggedForPhysio: false };
  const level = intake.triageLevel;
  const flaggedForPhysio = level === 'physio-routine' || level === 'physio-soon';
  if (level === 'urgent') return { ready: false, code: 'urgent', reason: REASONS.urgent, level, intakeId: intake.id, flaggedForPhysio: false };
  if (!(await activeConsent(riderId, 'store-health-data'))) {
    return { ready: false, code: 'no-consent', reason: REASONS['no-consent'], level, intakeId: intake.id, flaggedForPhysio };
  }
  return { ready: true, code: 'ready', level, intakeId: intake.id, flaggedForPhysio };
}

/**
 * Called by the booking code before it holds a slot. Throws 403 when the latest intake is at the
 * urgent level (stop riding, seek care), 409 when there is no submitted intake with consent;
 * otherwise returns the intake to attach and whether the case is flagged for a physio.
 */
export async function assertRiderMayBook(riderId: number): Promise<{ intakeId: number; flaggedForPhysio: boolean }> {
  const readiness = await bookingReadiness(riderId);
  if (readiness.code === 'urgent') throw new AppError(403, 'urgent_care_first', REASONS.urgent);
  if (!readiness.ready || readiness.intakeId === undefined) {
    throw new AppError(409, readiness.code === 'no-consent' ? 'consent_required' : 'intake_required', readiness.reason ?? REASONS['no-intake']);
  }
  return { intakeId: readiness.intakeId, flaggedForPhysio: readiness.flaggedForPhysio };
}
