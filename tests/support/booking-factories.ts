import { availabilitySchema, type AvailabilityInput } from '@shared/booking';
import { FitterProfile } from '@server/models';
import { buildUser } from './factories';

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

/**
 * A signed-in rider who has passed the intake gate (a submitted intake with consent and no urgent
 * red flag), so booking tests can focus on booking.
 */
export async function riderReadyToBook(app: import('@server/app').SaddlestepApp['app']) {
  const { signedInAs } = await import('./factories');
  return signedInAs(app, 'rider');
}
