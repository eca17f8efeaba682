import { randomUUID } from 'node:crypto';
import sharp from 'sharp';
import { DateTime } from 'luxon';
import { availabilitySchema } from '@shared/booking';
import type { AppContext } from '../context';
import { Consultation, FitterProfile, Upload, User } from '../models';
import { createUpload } from '../services/uploads';
import { DEMO_PHOTO_SVG } from './demo-photo';

/** The demo studio's fitters: invented bios, fees and weeks. */
const DEMO_FITTERS = [
  {
    email: 'tomas@larchmont.example',
    bio: 'Road and gravel fits for riders coming back from knee and back trouble. Former mechanic; careful, small steps.',
    specialties: ['knee pain', 'gravel', 'returning after injury'],
    languages: ['English', 'Portuguese'],
    feeMinor: 9500,
    currency: 'EUR',
  },
  {
    email: 'hanna@larchmont.example',
    bio: 'Time-trial and endurance positions; hand numbness and saddle comfort.',
    specialties: ['time trial', 'hand numbness', 'saddle comfort'],
    languages: ['Swedish', 'English', 'German'],
    feeMinor: 110000,
    currency: 'SEK',
  },
] as const;

const WEEKDAYS_NINE_TO_FIVE = availabilitySchema.parse({
  windows: [1, 2, 3, 4, 5].map((weekday) => ({ weekday, start: '09:00', end: '17:00' })),
  exceptions: [],
  slotMinutes: 60,
  bufferMinutes: 15,
  minNoticeHours: 12,
  horizonDays: 42,
});

/**
 * Fitter profiles, a side-on demo photo for Ben, and a booked session between Ben and Tomás,
 * starting within a quarter of an hour of the first seed, so the session room has something in it.
 * Idempotent like the rest of the seed.
 */
export async function seedDemoFitting(ctx: AppContext): Promise<void> {
  for (const f of DEMO_FITTERS) {
    const user = await User.findOne({ where: { email: f.email } });
    if (!user || (await FitterProfile.findByPk(user.id))) continue;
    await FitterProfile.create({ userId: user.id, bio: f.bio, specialties: [...f.specialties], languages: [...f.languages], feeMinor: f.feeMinor, currency: f.currency, published: true, availability: WEEKDAYS_NINE_TO_FIVE });
  }
  const ben = await User.findOne({ where: { email: 'ben@rider.example' } });
  const tomas = await User.findOne({ where: { email: 'tomas@larchmont.example' } });
  if (!ben || !tomas) return;
  if ((await Upload.count({ where: { riderId: ben.id } })) === 0) {
    const jpeg = await sharp(Buffer.from(DEMO_PHOTO_SVG)).jpeg({ quality: 85 }).toBuffer();
    await createUpload(ctx, ben.id, { buffer: jpeg, size: jpeg.length }, 'side-crank-6', { actorId: null, actorRole: 'seed', ip: null, userAgent: 'demo seed' });
  }
  if ((await Consultation.count({ where: { riderId: ben.id, fitterId: tomas.id } })) === 0) {
    // At the next quarter hour after the first seed, so Tomás can start it at once (sessions open
    // 15 minutes early) and try the room; later it is simply a past session still waiting to start.
    const now = DateTime.now().setZone(tomas.timeZone);
    const day = now.startOf('hour').plus({ minutes: Math.ceil((now.minute + 1) / 15) * 15 });
    await Consultation.create({
      riderId: ben.id,
      fitterId: tomas.id,
      intakeId: null,
      status: 'booked',
      startsAt: day.toJSDate(),
      endsAt: day.plus({ hours: 1 }).toJSDate(),
      holdExpiresAt: null,
      feeMinor: 9500,
      currency: 'EUR',
      calendarUid: `${randomUUID()}@saddlestep`,
      cancelledById: null,
      cancelReason: null,
    });
  }
}
