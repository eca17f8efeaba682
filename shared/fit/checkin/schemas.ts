import { z } from 'zod';
import { isoDateSchema } from '../setup/schemas';
import { redFlagAnswersSchema } from '../triage/red-flags';
import { bodyRegionSchema, painScoreSchema, REFERRAL_LEVELS, symptomSchema } from '../triage/schemas';

/** Pain (0–10 NRS) and comfort (0–10, 10 = fully comfortable) for one body region. */
export const checkInRegionSchema = z.strictObject({
  region: bodyRegionSchema,
  pain: painScoreSchema,
  comfort: z.number().int().min(0).max(10).optional(),
});
export type CheckInRegion = z.infer<typeof checkInRegionSchema>;

/** A rider's check-in after rides on the current step (or the baseline record before the plan). */
export const checkInSchema = z.strictObject({
  date: isoDateSchema,
  /** Rides since the step was applied. */
  rides: z.number().int().min(0).max(1000).optional(),
  regions: z.array(checkInRegionSchema).max(60),
  /** Overall comfort on the bike, 0–10 (10 = fully comfortable), whether or not any region hurts. */
  comfort: z.number().int().min(0).max(10).optional(),
  /** Any numbness or tingling on the rides, whether or not a region was marked. */
  numbness: z.boolean().optional(),
  redFlagAnswers: redFlagAnswersSchema.optional(),
  symptoms: z.array(symptomSchema).max(60).optional(),
});
export type CheckIn = z.infer<typeof checkInSchema>;
export type CheckInInput = z.input<typeof checkInSchema>;

export const checkInAnalysisInputSchema = z.strictObject({
  baseline: checkInSchema,
  /** Earlier check-ins on this plan, oldest first, not including `current`. */
  previous: z.array(checkInSchema).max(500).default([]),
  current: checkInSchema,
  /** Rides the current step asks for before the next one. */
  minRides: z.number().int().min(0).max(100).optional(),
  age: z.number().int().min(5).max(120).optional(),
});
export type CheckInAnalysisInput = z.input<typeof checkInAnalysisInputSchema>;

export const CHANGE_CATEGORIES = ['much-better', 'better', 'same', 'worse', 'much-worse'] as const;
export type ChangeCategory = (typeof CHANGE_CATEGORIES)[number];

export const changeSchema = z.object({
  reference: z.number(),
  current: z.number(),
  /** current − reference, points. */
  delta: z.number(),
  /** delta / reference, or null when the reference is 0. */
  relative: z.number().nullable(),
  category: z.enum(CHANGE_CATEGORIES),
});
export type Change = z.infer<typeof changeSchema>;

export const CHECK_IN_DECISIONS = ['continue', 'hold-for-review', 'suggest-revert', 'refer'] as const;
export type CheckInDecision = (typeof CHECK_IN_DECISIONS)[number];

export const checkInAnalysisSchema = z.object({
  decision: z.enum(CHECK_IN_DECISIONS),
  referralLevel: z.enum(REFERRAL_LEVELS),
  reasons: z.array(z.object({ code: z.string(), message: z.string() })),
  regions: z.array(
    z.object({
      region: bodyRegionSchema,
      painVsBaseline: changeSchema,
      painVsPrevious: changeSchema,
      comfortVsBaseline: changeSchema.nullable(),
      comfortVsPrevious: changeSchema.nullable(),
    }),
  ),
  /** Overall comfort against the last check-in that gave one (null on the first). */
  comfortVsPrevious: changeSchema.nullable().optional(),
});
export type CheckInAnalysis = z.infer<typeof checkInAnalysisSchema>;
