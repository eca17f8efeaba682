import { z } from 'zod';
import { physioLimitsSchema, planSchema, planViolationSchema, policySchema, riddenSetupSchema, type Plan, type PlanViolation } from '@shared/fit/planner';
import { isoDateSchema, setupSchema, type Setup } from '@shared/fit/setup';
import { REFERRAL_LEVELS } from '@shared/fit/triage';
import { http, type ApiError } from './http';

export const STORED_PLAN_STATUSES = ['active', 'on_hold', 'superseded', 'completed'] as const;
export const STEP_STATES = ['locked', 'current', 'applied'] as const;

const stepProgressSchema = z.object({
  index: z.number().int(),
  state: z.enum(STEP_STATES),
  appliedOn: z.string().nullable(),
  checkInDue: z.string().nullable(),
  /** A check-in was logged for this step; `overdue` once its check-in date has passed without one. */
  checkedIn: z.boolean().optional(),
  overdue: z.boolean().optional(),
  snapshotId: z.number().nullable(),
  /** The server moves these later when an earlier step was applied late; the plan's own dates are the first guess. */
  earliestDate: z.string().optional(),
  minRides: z.number().optional(),
});
export type StepProgress = z.infer<typeof stepProgressSchema>;

export const storedPlanSchema = z.object({
  id: z.number(),
  consultationId: z.number(),
  bikeId: z.number(),
  kind: z.enum(['forward', 'revert']).optional(),
  status: z.enum(STORED_PLAN_STATUSES),
  createdAt: z.string(),
  fitter: z.object({ id: z.number(), displayName: z.string() }).nullable(),
  plan: planSchema,
  steps: z.array(stepProgressSchema),
  holdReason: z.string().nullable(),
});
export type StoredPlan = z.infer<typeof storedPlanSchema>;
const planEnvelope = z.object({ plan: storedPlanSchema });

/** What the planner needs, built by the server from the case: baseline, clinic policy, pain, flags, physio limits. */
const planInputsSchema = z.object({
  bikeId: z.number(),
  baseline: setupSchema,
  policy: policySchema,
  currentPain: z.number().int().min(0).max(10),
  redFlagLevel: z.enum(REFERRAL_LEVELS),
  physio: physioLimitsSchema.nullable(),
  history: z.array(riddenSetupSchema),
  startDate: isoDateSchema,
  seatTubeAngle: z.number().optional(),
});
export type PlanInputs = z.infer<typeof planInputsSchema>;

/** The planner's objections when the server re-checks a plan (422 `plan_over_limits`). */
export function violationsOf(error: ApiError): PlanViolation[] {
  const parsed = z.array(planViolationSchema).safeParse(error.details.violations);
  return parsed.success ? parsed.data : [];
}

export const plansApi = {
  inputs: (consultationId: number, bikeId: number) => http.get(`/api/consultations/${consultationId}/plan-inputs?bikeId=${bikeId}`, planInputsSchema),
  async send(consultationId: number, input: { bikeId: number; target: Setup; startDate: string; plan: Plan }): Promise<StoredPlan> {
    return (await http.post(`/api/consultations/${consultationId}/plans`, input, planEnvelope)).plan;
  },
  async show(planId: number): Promise<StoredPlan> {
    return (await http.get(`/api/plans/${planId}`, planEnvelope)).plan;
  },
  /** Every plan of a consultation, newest first (the room's check-ins tab reads the live one's hold). */
  async forConsultation(consultationId: number): Promise<StoredPlan[]> {
    return (await http.get(`/api/consultations/${consultationId}/plans`, z.object({ plans: z.array(storedPlanSchema) }))).plans;
  },
  async current(): Promise<StoredPlan | null> {
    return (await http.get('/api/rider/plans/current', z.object({ plan: storedPlanSchema.nullable() }))).plan;
  },
  async apply(planId: number, index: number, appliedOn: string): Promise<StoredPlan> {
    return (await http.post(`/api/plans/${planId}/steps/${index}/apply`, { appliedOn }, planEnvelope)).plan;
  },
  /** Go back to an earlier setup of the bike: the server makes a revert plan. */
  async revert(bikeId: number, snapshotId: number): Promise<StoredPlan> {
    return (await http.post(`/api/rider/bikes/${bikeId}/revert`, { snapshotId }, planEnvelope)).plan;
  },
};
