import { z } from 'zod';
import { BODY_REGIONS } from './regions';

export const PAIN_KINDS = ['ache', 'sharp', 'numb', 'tingling', 'burning'] as const;
export const PAIN_TIMINGS = ['during-ride', 'after-ride', 'at-rest', 'at-night'] as const;
export const REFERRAL_LEVELS = ['none', 'physio-routine', 'physio-soon', 'urgent'] as const;
export type ReferralLevel = (typeof REFERRAL_LEVELS)[number];

export const bodyRegionSchema = z.enum(BODY_REGIONS);

/** 0–10 numeric rating scale, whole numbers (Farrar et al. 2001, Pain 94:149–158 [V]). */
export const painScoreSchema = z.number().int('Pain is a whole number from 0 to 10.').min(0).max(10);

/** One symptom as the rider reports it on the body map. */
export const symptomSchema = z.strictObject({
  region: bodyRegionSchema,
  pain: painScoreSchema,
  kind: z.enum(PAIN_KINDS),
  timing: z.array(z.enum(PAIN_TIMINGS)).min(1, 'Say when it hurts.'),
  /** How long it has been going on, days. */
  durationDays: z.number().int().min(0).max(36_500),
  numbness: z.boolean().default(false),
  swelling: z.boolean().default(false),
  /** Did a crash or fall cause it? */
  afterCrash: z.boolean().default(false),
});
export type Symptom = z.infer<typeof symptomSchema>;
export type SymptomInput = z.input<typeof symptomSchema>;
