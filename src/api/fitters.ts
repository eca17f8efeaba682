import { z } from 'zod';
import { CURRENCIES, type AvailabilityInput, type FitterProfileInput } from '@shared/booking';
import { http } from './http';

const fitterCardSchema = z.object({
  id: z.number(),
  displayName: z.string(),
  timeZone: z.string(),
  bio: z.string(),
  specialties: z.array(z.string()),
  languages: z.array(z.string()),
  feeMinor: z.number(),
  currency: z.string(),
  slotMinutes: z.number(),
});
export type FitterCard = z.infer<typeof fitterCardSchema>;

const slotSchema = z.object({ start: z.string(), end: z.string() });
export type SlotView = z.infer<typeof slotSchema>;

const slotsResult = z.object({ fitter: fitterCardSchema, slots: z.array(slotSchema) });

const clock = z.string();
/** The fitter's own settings as the form edits them: times as "HH:MM" strings. */
const settingsSchema = z.object({
  profile: z.object({
    bio: z.string(),
    specialties: z.array(z.string()),
    languages: z.array(z.string()),
    feeMinor: z.number(),
    currency: z.enum(CURRENCIES),
    timeZone: z.string(),
    published: z.boolean(),
  }),
  availability: z.object({
    windows: z.array(z.object({ weekday: z.number(), start: clock, end: clock })),
    exceptions: z.array(
      z.object({
        date: z.string(),
        kind: z.enum(['closed', 'open']),
        start: clock.nullish(),
        end: clock.nullish(),
        note: z.string().nullish(),
      }),
    ),
    slotMinutes: z.number(),
    bufferMinutes: z.number(),
    minNoticeHours: z.number(),
    horizonDays: z.number(),
  }),
});
export type FitterSettings = z.infer<typeof settingsSchema>;

/** What PUT /api/fitter/settings takes: the shared schema's input shape. */
export interface FitterSettingsInput {
  profile: FitterProfileInput;
  availability: AvailabilityInput;
}

const savedSchema = z.object({ saved: z.literal(true), published: z.boolean() });

export const fittersApi = {
  async list(): Promise<FitterCard[]> {
    const { fitters } = await http.get('/api/fitters', z.object({ fitters: z.array(fitterCardSchema) }));
    return fitters;
  },
  /** Slots between two local dates of the fitter's zone, as UTC instants. */
  slots(fitterId: number, from: string, to: string) {
    return http.get(`/api/fitters/${fitterId}/slots?${new URLSearchParams({ from, to })}`, slotsResult);
  },
  ownSettings: () => http.get('/api/fitter/settings', settingsSchema),
  saveSettings: (input: FitterSettingsInput) => http.put('/api/fitter/settings', input, savedSchema),
};
