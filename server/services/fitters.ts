import { Op } from 'sequelize';
import { DateTime } from 'luxon';
import { availableSlots, type Availability, type BusyInterval, type FitterProfileInput, fitterProfileSchema, availabilitySchema } from '@shared/booking';
import { SLOT_HOLDING_STATES } from '@shared/consultation';
import { notFound } from '../errors';
import { Consultation, FitterProfile, User } from '../models';
import type { Transaction } from 'sequelize';

/** A fitter with no profile yet starts from these (an empty week, unpublished). */
export function emptyAvailability(): Availability {
  return availabilitySchema.parse({ windows: [], exceptions: [], slotMinutes: 60, bufferMinutes: 15, minNoticeHours: 24 });
}

/** Intervals in which the fitter is taken: live consultations and holds that have not run out. */
export async function busyIntervals(fitterId: number, from: Date, to: Date, now: Date, options: { transaction?: Transaction; excludeId?: number } = {}): Promise<BusyInterval[]> {
  const rows = await Consultation.findAll({
    where: {
      fitterId,
      status: { [Op.in]: [...SLOT_HOLDING_STATES] },
      startsAt: { [Op.lt]: to },
      endsAt: { [Op.gt]: from },
      ...(options.excludeId ? { id: { [Op.ne]: options.excludeId } } : {}),
      [Op.or]: [{ status: { [Op.notIn]: ['requested', 'awaiting_payment'] } }, { holdExpiresAt: { [Op.gt]: now } }],
    },
    attributes: ['startsAt', 'endsAt'],
    transaction: options.transaction,
  });
  return rows.map((r) => ({ start: r.startsAt, end: r.endsAt }));
}

/** Slots a rider may book with this fitter between two local dates of the fitter's zone. */
export async function slotsForFitter(fitter: User, profile: FitterProfile, fromDate: string, toDate: string, now = new Date()) {
  const zone = fitter.timeZone;
  const horizonEnd = DateTime.fromJSDate(now, { zone }).plus({ days: profile.availability.horizonDays }).toISODate()!;
  const lastDate = toDate < horizonEnd ? toDate : horizonEnd;
  const from = DateTime.fromISO(fromDate, { zone }).minus({ days: 1 }).toJSDate();
  const to = DateTime.fromISO(lastDate, { zone }).plus({ days: 2 }).toJSDate();
  const busy = await busyIntervals(fitter.id, from, to, now);
  return availableSlots({ availability: profile.availability, timeZone: zone, busy, now, fromDate, toDate: lastDate });
}

export async function getPublishedFitter(fitterId: number): Promise<{ fitter: User; profile: FitterProfile }> {
  const fitter = await User.findOne({ where: { id: fitterId, role: 'fitter', status: 'active' } });
  const profile = fitter ? await FitterProfile.findByPk(fitter.id) : null;
  if (!fitter || !profile || !profile.published) throw notFound('That fitter');
  return { fitter, profile };
}

export async function listPublishedFitters(): Promise<{ fitter: User; profile: FitterProfile }[]> {
  const profiles = await FitterProfile.findAll({
    where: { published: true },
    include: [{ model: User, as: 'user', where: { status: 'active', role: 'fitter' } }],
    order: [['userId', 'ASC']],
  });
  return profiles.map((profile) => ({ fitter: (profile as FitterProfile & { user: User }).user, profile }));
}

/** Save profile and week together; the time zone lives on the user account. */
export async function saveFitterProfile(fitter: User, input: FitterProfileInput, availability: Availability): Promise<FitterProfile> {
  const profile = fitterProfileSchema.parse(input);
  return FitterProfile.sequelize!.transaction(async (transaction) => {
    if (fitter.timeZone !== profile.timeZone) {
      fitter.timeZone = profile.timeZone;
      await fitter.save({ transaction });
    }
    const [row] = await FitterProfile.upsert(
      { userId: fitter.id, bio: profile.bio, specialties: profile.specialties, languages: profile.languages, feeMinor: profile.feeMinor, currency: profile.currency, published: profile.published, availability },
      { transaction },
    );
    return row;
  });
}
