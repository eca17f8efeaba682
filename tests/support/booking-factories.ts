import { availabilitySchema, type AvailabilityInput } from '@shared/booking';
import { FitterProfile } from '@server/models';
import type { SaddlestepApp } from '@server/app';
import { questionsToAsk, currentConsent } from '@shared/rider';
import { buildUser, signedInAs } from './factories';

/** Every day 06:00–22:00 in the fitter's zone, one-hour sessions, no buffer or notice. */
export const OPEN_WEEK: AvailabilityInput = {
  windows: [1, 2, 3, 4, 5, 6, 7].map((weekday) => ({ weekday, start: '06:00', end: '22:00' })),
  exceptions: [],
  slotMinutes: 60,
  bufferMinutes: 0,
  minNoticeHours: 0,
  horizonDays: 120,
};

/** A published fitter with a profile and the given week. */
export async function buildFitter(options: { timeZone?: string; availability?: AvailabilityInput; feeMinor?: number; currency?: string } = {}) {
  const fitter = await buildUser({ role: 'fitter', timeZone: options.timeZone ?? 'UTC', displayName: 'Fay Fitter' });
  const profile = await FitterProfile.create({
    userId: fitter.id,
    bio: 'Road and gravel fits.',
    specialties: ['knee pain'],
    languages: ['English'],
    feeMinor: options.feeMinor ?? 9000,
    currency: options.currency ?? 'EUR',
    published: true,
    availability: availabilitySchema.parse(options.availability ?? OPEN_WEEK),
  });
  return { fitter, profile };
}

/** An ISO date `days` from now, in UTC. */
export function isoDateIn(days: number): string {
  return new Date(Date.now() + days * 86_400_000).toISOString().slice(0, 10);
}

/** Answers for a submitted intake: one sore knee, no red flags, consent given (the current text). */
export function calmIntake() {
  return {
    symptoms: [{ region: 'knee-front-left', pain: 3, kind: 'ache', timing: ['during-ride'], durationDays: 21 }],
    redFlagAnswers: Object.fromEntries(questionsToAsk({}, []).map((id) => [id, false])),
    goals: ['ride-without-pain'],
    consent: { kind: 'store-health-data', version: currentConsent('store-health-data')!.version, agreed: true },
  };
}

/**
 * A signed-in rider who has passed the intake gate (a submitted intake with consent and no urgent
 * red flag), so booking tests can focus on booking.
 */
export async function riderReadyToBook(app: SaddlestepApp['app']) {
  const rider = await signedInAs(app, 'rider');
  const res = await rider.post('/api/rider/intake/submit', calmIntake());
  if (res.status !== 200 && res.status !== 201) throw new Error(`intake submit failed: ${res.status} ${JSON.stringify(res.body)}`);
  return rider;
}
