import { z } from 'zod';
import { cancellationPolicySchema } from '../booking/refund-policy';
import { CURRENCIES, feeBelowMinimum } from '../booking/money';
import { policySchema } from '../fit/planner/schemas';

/**
 * Clinic-wide settings an admin may change. The planner part is checked against the hard safety
 * bounds in shared/fit/planner (checkPolicy) before it is stored; values here are invented demo
 * defaults unless the planner constants say otherwise.
 */
export const clinicSettingsSchema = z.strictObject({
  /** Fee offered to a new fitter profile, in minor units of `currency`. */
  defaultFeeMinor: z.number({ error: 'Enter the default fee.' }).int('Use whole minor units.').min(0, 'A fee cannot be negative.').max(10_000_000, 'That fee is too high.').default(9000),
  currency: z.enum(CURRENCIES, { error: 'Choose a currency from the list.' }).default('EUR'),
  // Defaults are made fresh on every parse so no caller can change another's nested objects.
  cancellation: cancellationPolicySchema.default(() => cancellationPolicySchema.parse({})),
  /** Minutes a slot stays held while the rider pays (common practice for ticketing/booking, 5–15). */
  holdMinutes: z.number({ error: 'Enter the hold time in minutes.' }).int('Use whole minutes.').min(2, 'Hold a slot for at least 2 minutes.').max(30, 'Hold a slot for at most 30 minutes.').default(10),
  planner: policySchema.default(() => policySchema.parse({})),
})
  // Stripe refuses charges below a per-currency minimum; a default fee under it could never be paid.
  .superRefine((settings, context) => {
    const problem = feeBelowMinimum(settings.defaultFeeMinor, settings.currency);
    if (problem) context.addIssue({ code: 'custom', path: ['defaultFeeMinor'], message: problem });
  });
export type ClinicSettings = z.infer<typeof clinicSettingsSchema>;
export type ClinicSettingsInput = z.input<typeof clinicSettingsSchema>;
export const DEFAULT_CLINIC_SETTINGS: ClinicSettings = clinicSettingsSchema.parse({});
