import { z } from 'zod';
import type { CheckInFormInput } from '@shared/care';
import { checkInAnalysisSchema, CHECK_IN_DECISIONS } from '@shared/fit/checkin';
import { bodyRegionSchema, redFlagAnswersSchema } from '@shared/fit/triage';
import { http } from './http';
import { storedPlanSchema } from './plans';

const painSchema = z.object({ region: bodyRegionSchema, pain: z.number() });

/** One stored check-in as rider, fitter and a consented physio see it. */
export const checkInViewSchema = z.object({
  id: z.number(),
  planId: z.number(),
  stepIndex: z.number(),
  createdAt: z.string(),
  rides: z.number(),
  minutesRidden: z.number(),
  comfort: z.number(),
  pains: z.array(painSchema),
  numbness: z.boolean(),
  note: z.string(),
  /** The urgent safety questions asked at every check-in, as answered. */
  redFlagAnswers: redFlagAnswersSchema.optional(),
  // Lists may leave the analysis out; the submit answer always has it.
  analysis: checkInAnalysisSchema.nullable().optional(),
  /** When the fitter marked a check-in that asked for review as looked at. */
  reviewedAt: z.string().nullable().optional(),
});
export type CheckInView = z.infer<typeof checkInViewSchema>;

/** What happens next, in words the server chose, with the facts the result card shows. */
const outcomeSchema = z.object({
  decision: z.enum(CHECK_IN_DECISIONS),
  message: z.string(),
  nextStepUnlocksOn: z.string().nullable(),
  ridesStillNeeded: z.number(),
  referralId: z.number().nullable(),
  planOnHold: z.boolean(),
  urgentAdvice: z.string().nullable(),
});
export type CheckInOutcome = z.infer<typeof outcomeSchema>;

const submitAnswerSchema = z.object({
  checkIn: checkInViewSchema.extend({ analysis: checkInAnalysisSchema }),
  plan: storedPlanSchema,
  outcome: outcomeSchema,
});
export type CheckInAnswer = z.infer<typeof submitAnswerSchema>;

/** The comfort and pain trend with the steps applied on the way (the chart and its table). */
export const checkInTrendSchema = z.object({
  baseline: z.object({ date: z.string(), comfort: z.number().nullable(), pains: z.array(painSchema) }).nullable(),
  checkIns: z.array(checkInViewSchema),
  steps: z.array(z.object({ planId: z.number(), index: z.number(), appliedOn: z.string(), summary: z.string() })),
});
export type CheckInTrend = z.infer<typeof checkInTrendSchema>;

export const checkInsApi = {
  submit: (planId: number, stepIndex: number, input: CheckInFormInput) => http.post(`/api/plans/${planId}/steps/${stepIndex}/check-ins`, input, submitAnswerSchema),
  /** Take the last applied step back (the analysis suggested it). */
  async revertStep(planId: number, stepIndex: number) {
    return (await http.post(`/api/plans/${planId}/steps/${stepIndex}/revert`, {}, z.object({ plan: storedPlanSchema }))).plan;
  },
  /** The fitter has looked at a check-in that asked for review; the rider's next step may then go ahead. */
  review: async (checkInId: number) => (await http.post(`/api/check-ins/${checkInId}/review`, {}, z.object({ checkIn: checkInViewSchema }))).checkIn,
  mine: () => http.get('/api/rider/check-ins', checkInTrendSchema),
  forConsultation: (consultationId: number) => http.get(`/api/consultations/${consultationId}/check-ins`, checkInTrendSchema),
};
