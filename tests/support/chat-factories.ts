import { Consultation } from '@server/models';
import { randomUUID } from 'node:crypto';
import type { SaddlestepApp } from '@server/app';
import { signedInAs } from './factories';
import { cookieOf, openSocket } from './sockets';

/** A paid consultation between a new rider and a new fitter, plus their signed-in clients. */
export async function bookedPair(app: SaddlestepApp['app'], status: Consultation['status'] = 'booked') {
  const rider = await signedInAs(app, 'rider');
  const fitter = await signedInAs(app, 'fitter');
  const startsAt = new Date(Date.now() + 3 * 86_400_000);
  const consultation = await Consultation.create({
    riderId: rider.user.id,
    fitterId: fitter.user.id,
    intakeId: null,
    status,
    startsAt,
    endsAt: new Date(startsAt.getTime() + 3_600_000),
    holdExpiresAt: null,
    feeMinor: 9000,
    currency: 'EUR',
    calendarUid: `${randomUUID()}@test`,
    cancelledById: null,
    cancelReason: null,
  });
  return { rider, fitter, consultation };
}

/** Move a booking to start in a few minutes, inside the window in which a fitter may start it. */
export async function startingSoon(consultation: Consultation, minutes = 5): Promise<void> {
  const startsAt = new Date(Date.now() + minutes * 60_000);
  await consultation.update({ startsAt, endsAt: new Date(startsAt.getTime() + 3_600_000) });
}

export async function socketFor(baseUrl: string, client: Parameters<typeof cookieOf>[0]) {
  const { socket, error } = await openSocket(baseUrl, await cookieOf(client));
  if (error) throw error;
  return socket;
}
