import { z } from 'zod';
import { BODY_REGIONS } from '../fit/triage/regions';
import { redFlagAnswersSchema } from '../fit/triage/red-flags';

export const CHECK_IN_NOTE_MAX = 2000;

/**
 * POST /api/plans/:planId/steps/:index/check-ins — the rider's quick form after rides on a step.
 * Pain per body region on the same 0–10 scale and body map as the intake; comfort 0–10 where 10
 * is fully comfortable. The urgent red-flag questions are asked again every time.
 */
export const checkInFormSchema = z.strictObject({
  rides: z.number({ error: 'Say how many rides.' }).int('Rides are a whole number.').min(0, 'Rides cannot be negative.').max(200, 'At most 200 rides per check-in.'),
  minutesRidden: z.number({ error: 'Say how long you rode in total.' }).int().min(0, 'Time cannot be negative.').max(20_000, 'That is more riding than a step allows.'),
  comfort: z.number({ error: 'Rate your comfort from 0 to 10.' }).int().min(0, 'Comfort is from 0 to 10.').max(10, 'Comfort is from 0 to 10.'),
  pains: z
    .array(
      z.strictObject({
        region: z.enum(BODY_REGIONS, { error: 'Choose a body area from the map.' }),
        pain: z.number({ error: 'Set the pain from 0 to 10.' }).int('Pain is a whole number from 0 to 10.').min(0, 'Pain is from 0 to 10.').max(10, 'Pain is from 0 to 10.'),
      }),
      { error: 'Send pain as a list of body areas.' },
    )
    .max(30, 'Too many body areas.')
    .refine((list) => new Set(list.map((p) => p.region)).size === list.length, 'Each body area can be marked only once.'),
  numbness: z.boolean({ error: 'Say whether you had numbness.' }),
  note: z
    .string()
    .trim()
    .max(CHECK_IN_NOTE_MAX, `Keep the note under ${CHECK_IN_NOTE_MAX} characters.`)
    .refine((t) => !/[<>]/.test(t), 'The note cannot contain < or >.')
    .refine((t) => !/[^\P{Cc}\t\n\r]/u.test(t), 'The note cannot contain control characters.')
    .default(''),
  redFlagAnswers: redFlagAnswersSchema.default({}),
});
export type CheckInFormInput = z.input<typeof checkInFormSchema>;
export type CheckInForm = z.output<typeof checkInFormSchema>;
