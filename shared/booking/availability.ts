import { z } from 'zod';
import { timeZoneSchema } from '../auth/schemas';
import { CURRENCIES, feeBelowMinimum } from './money';

/** "HH:MM" on a 24-hour clock, as minutes after midnight. */
export const clockTimeSchema = z
  .string({ error: 'Use a time like 09:30.' })
  .regex(/^([01]\d|2[0-3]):[0-5]\d$|^24:00$/, 'Use a time like 09:30.')
  .transform((value) => {
    const [h, m] = value.split(':').map(Number) as [number, number];
    return h * 60 + m;
  });

export const localDateSchema = z
  .string({ error: 'Use a date like 2027-03-28.' })
  .regex(/^\d{4}-\d{2}-\d{2}$/, 'Use a date like 2027-03-28.')
  .refine((s) => {
    const d = new Date(`${s}T00:00:00Z`);
    return !Number.isNaN(d.getTime()) && d.toISOString().slice(0, 10) === s;
  }, 'That date does not exist.');

const windowShape = z
  .strictObject({
      /** ISO weekday, 1 = Monday … 7 = Sunday. */
      weekday: z.number().int().min(1, 'Choose a weekday.').max(7, 'Choose a weekday.'),
      start: clockTimeSchema,
      end: clockTimeSchema,
    })
    .refine((w) => w.end > w.start, { message: 'A window must end after it starts.', path: ['end'] });

  const exceptionShape = z
    .strictObject({
      date: localDateSchema,
      /** `closed`: no sessions that day (or in the given hours); `open`: extra hours that day. */
      kind: z.enum(['closed', 'open'], { error: 'Choose closed or open.' }),
      start: clockTimeSchema.optional(),
      end: clockTimeSchema.optional(),
      note: z.string().trim().max(120, 'Keep the note under 120 characters.').optional(),
    })
    .refine((e) => (e.start === undefined) === (e.end === undefined), { message: 'Give both a start and an end time, or neither.', path: ['end'] })
    .refine((e) => e.start === undefined || e.end === undefined || e.end > e.start, { message: 'The hours must end after they start.', path: ['end'] })
    .refine((e) => e.kind === 'closed' || e.start !== undefined, { message: 'Extra opening hours need a start and an end.', path: ['start'] });

  /** The fitter's bookable week, in the fitter's own time zone. */
  export const availabilitySchema = z.strictObject({
    windows: z.array(windowShape).max(50, 'At most 50 weekly windows.'),
    exceptions: z.array(exceptionShape).max(200, 'At most 200 dated exceptions.'),
    /** Session length in minutes. */
    slotMinutes: z.number().int().min(15, 'Sessions last at least 15 minutes.').max(240, 'Sessions last at most 4 hours.'),
    /** Free time kept after each session. */
    bufferMinutes: z.number().int().min(0).max(120, 'A buffer can be at most 2 hours.'),
    /** How far ahead a rider must book. */
    minNoticeHours: z.number().int().min(0).max(24 * 14, 'Notice can be at most 14 days.'),
    /** How far ahead slots are offered. */
    horizonDays: z.number().int().min(1).max(366, 'Offer slots at most a year ahead.').default(42),
  });
  export type AvailabilityInput = z.input<typeof availabilitySchema>;
  export type Availability = z.output<typeof availabilitySchema>;
  export type AvailabilityWindow = Availability['windows'][number];
  export type AvailabilityException = Availability['exceptions'][number];

  const shortText = (label: string, max: number) => z.string().trim().min(1, `Enter ${label}.`).max(max, `Keep ${label} under ${max} characters.`);

  /** What a rider sees of a fitter, and what the fitter edits. */
  export const fitterProfileSchema = z
    .strictObject({
    bio: z.string().trim().max(2000, 'Keep the bio under 2000 characters.'),
    specialties: z.array(shortText('each specialty', 60)).max(12, 'At most 12 specialties.'),
    languages: z.array(shortText('each language', 40)).min(1, 'Add at least one language.').max(10, 'At most 10 languages.'),
    /** Fee in minor units of `currency`. */
    feeMinor: z.number().int('The fee is a whole number of minor units.').min(0).max(10_000_000),
    currency: z.enum(CURRENCIES, { error: 'Choose a currency from the list.' }),
    timeZone: timeZoneSchema,
    /** Riders only see published fitters. */
    published: z.boolean(),
  })
  // Stripe refuses charges below a per-currency minimum, so such a fee could never be paid.
  .superRefine((profile, context) => {
    const problem = feeBelowMinimum(profile.feeMinor, profile.currency);
    if (problem) context.addIssue({ code: 'custom', path: ['feeMinor'], message: problem });
  });
export type FitterProfileInput = z.input<typeof fitterProfileSchema>;
