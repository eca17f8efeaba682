import { z } from 'zod';
import { physioLimitsSchema } from '../fit/planner/schemas';

export const REFERRAL_URGENCIES = ['routine', 'soon', 'urgent'] as const;
export type ReferralUrgency = (typeof REFERRAL_URGENCIES)[number];

/**
 * A referral's life. `proposed` (the system suggests one, the fitter confirms) and
 * `awaiting_consent` (nothing is shared until the rider agrees) come before the physio sees it;
 * then sent → received → accepted or declined → in progress → closed with a response.
 */
export const REFERRAL_STATUSES = ['proposed', 'awaiting_consent', 'sent', 'received', 'accepted', 'declined', 'in_progress', 'closed', 'withdrawn'] as const;
export type ReferralStatus = (typeof REFERRAL_STATUSES)[number];

export const REFERRAL_STATUS_LABELS: Record<ReferralStatus, string> = {
  proposed: 'Suggested',
  awaiting_consent: 'Waiting for the rider’s agreement',
  sent: 'Sent',
  received: 'Opened',
  accepted: 'Accepted',
  declined: 'Declined',
  in_progress: 'In progress',
  closed: 'Answered',
  withdrawn: 'Withdrawn',
};

export const PHYSIO_DECISIONS = ['continue', 'continue_with_limits', 'hold'] as const;
export type PhysioDecision = (typeof PHYSIO_DECISIONS)[number];

const text = (label: string, max: number) =>
  z.string({ error: `Write the ${label}.` }).trim().min(1, `Write the ${label}.`).max(max, `Keep the ${label} under ${max} characters.`).refine((t) => !/[<>]/.test(t), `The ${label} cannot contain < or >.`);

/** POST /api/consultations/:id/referrals — the fitter refers (or confirms a proposal with `referralId`). */
export const createReferralSchema = z.strictObject({
  urgency: z.enum(REFERRAL_URGENCIES, { error: 'Choose routine, soon or urgent.' }),
  reason: text('reason', 1000),
  findings: z.string().trim().max(4000, 'Keep the findings under 4000 characters.').refine((t) => !/[<>]/.test(t), 'The findings cannot contain < or >.').default(''),
  /** Uploads of this rider to share with the physio. */
  attachmentIds: z.array(z.number().int().positive()).max(12, 'Share at most 12 files.').default([]),
  physioId: z.number().int().positive().optional(),
});

/** POST /api/rider/referrals/:id/consent */
export const referralConsentSchema = z.strictObject({
  version: z.string({ error: 'Say which consent version you read.' }).max(20, 'Unknown consent version.'),
  agreed: z.literal(true, { error: 'Please tick the box to agree to share your information with the physiotherapist.' }),
});

export const declineReferralSchema = z.strictObject({ note: text('reason for declining', 1000) });

/** POST /api/physio/referrals/:id/respond — a clinical note and a decision; limits only with `continue_with_limits`. */
export const physioResponseSchema = z
  .strictObject({
    note: text('clinical note', 4000),
    decision: z.enum(PHYSIO_DECISIONS, { error: 'Choose continue, continue with limits, or hold the plan.' }),
    limits: physioLimitsSchema.omit({ hold: true, clearedRedFlags: true, note: true }).optional(),
    holdReason: z
      .string()
      .trim()
      .max(400, 'Keep the hold reason under 400 characters.')
      .refine((t) => !/[<>]/.test(t) && !/[^\P{Cc}\t\n\r]/u.test(t), 'The hold reason cannot contain < or > or control characters.')
      .optional(),
  })
  .refine((r) => r.decision !== 'continue_with_limits' || r.limits !== undefined, { message: 'Set the limits the plan must keep.', path: ['limits'] })
  .refine((r) => r.decision !== 'hold' || (r.holdReason ?? '').length > 0, { message: 'Say why the plan is on hold; the rider and fitter will see it.', path: ['holdReason'] })
  .refine((r) => r.decision === 'continue_with_limits' || r.limits === undefined, { message: 'Limits go with "continue with limits" only.', path: ['limits'] });

export const clearHoldSchema = z.strictObject({ note: text('note', 1000) });
