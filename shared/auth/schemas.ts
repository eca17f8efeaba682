import { z } from 'zod';
import { ACCOUNT_STATUSES, ROLES, SELF_REGISTER_ROLES } from './roles';
import { isIanaTimeZone } from './time-zones';

/** Lengths a person can reasonably type; longer values are refused rather than cut. */
export const LIMITS = {
  emailMax: 254, // RFC 5321 path limit
  displayNameMax: 80,
  passwordMin: 10,
  passwordMax: 128, // bcrypt reads only 72 bytes; checked separately below
} as const;

const email = z
  .string({ error: 'Enter your e-mail address.' })
  .trim()
  .min(1, 'Enter your e-mail address.')
  .max(LIMITS.emailMax, `An e-mail address can be at most ${LIMITS.emailMax} characters.`)
  .pipe(z.email({ error: 'Enter a valid e-mail address, like name@example.com.' }))
  .transform((value) => value.toLowerCase());

const password = z
  .string({ error: 'Enter a password.' })
  .min(LIMITS.passwordMin, `Use at least ${LIMITS.passwordMin} characters for your password.`)
  .max(LIMITS.passwordMax, `A password can be at most ${LIMITS.passwordMax} characters.`)
  .refine((value) => new TextEncoder().encode(value).length <= 72, 'A password can be at most 72 bytes long.');

const displayName = z
  .string({ error: 'Enter your name.' })
  .trim()
  .min(1, 'Enter your name.')
  .max(LIMITS.displayNameMax, `A name can be at most ${LIMITS.displayNameMax} characters.`)
  .refine((value) => !/[<>]/.test(value), 'A name cannot contain < or >.')
  // Control characters would corrupt e-mails and logs.
  .refine((value) => !/\p{Cc}/u.test(value), 'A name cannot contain control characters.');

export const timeZoneSchema = z
  .string({ error: 'Choose your time zone.' })
  .max(64, 'Choose a time zone from the list.')
  .refine(isIanaTimeZone, 'Choose a time zone from the list, like Europe/London.');

export const registerSchema = z.strictObject(
  {
    email,
    password,
    displayName,
    role: z.enum(SELF_REGISTER_ROLES, { error: 'Choose rider, bike fitter or physiotherapist.' }),
    timeZone: timeZoneSchema,
  },
  { error: (issue) => (issue.code === 'unrecognized_keys' ? `Unexpected field: ${issue.keys.join(', ')}.` : undefined) },
);
export type RegisterInput = z.infer<typeof registerSchema>;

export const signInSchema = z.strictObject(
  {
    email: z.string({ error: 'Enter your e-mail address.' }).trim().min(1, 'Enter your e-mail address.').max(LIMITS.emailMax, 'That e-mail address is too long.').transform((v) => v.toLowerCase()),
    password: z.string({ error: 'Enter your password.' }).min(1, 'Enter your password.').max(LIMITS.passwordMax, 'That password is too long.'),
  },
  { error: (issue) => (issue.code === 'unrecognized_keys' ? `Unexpected field: ${issue.keys.join(', ')}.` : undefined) },
);
export type SignInInput = z.infer<typeof signInSchema>;

/** What the API returns about the signed-in user (never the hash). */
export const publicUserSchema = z.object({
  id: z.number().int(),
  email: z.string(),
  displayName: z.string(),
  role: z.enum(ROLES),
  status: z.enum(ACCOUNT_STATUSES),
  timeZone: z.string(),
  createdAt: z.string(),
});
export type PublicUser = z.infer<typeof publicUserSchema>;

/** PATCH /api/auth/me — the name others see and the zone every time is shown in. */
export const accountSettingsSchema = z.strictObject(
  { displayName, timeZone: timeZoneSchema },
  { error: (issue) => (issue.code === 'unrecognized_keys' ? `Unexpected field: ${issue.keys.join(', ')}.` : undefined) },
);
export type AccountSettings = z.infer<typeof accountSettingsSchema>;

export const accountDecisionSchema = z.strictObject({
  decision: z.enum(['approve', 'reject'], { error: 'Choose approve or reject.' }),
});
export type AccountDecision = z.infer<typeof accountDecisionSchema>;
