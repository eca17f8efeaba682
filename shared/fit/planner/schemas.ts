import { z } from 'zod';
import { PARAMETER_GROUPS, SETUP_PARAMETERS, type SetupParameter } from '../setup/parameters';
import { isoDateSchema, setupParameterSchema, setupSchema } from '../setup/schemas';
import { painScoreSchema, REFERRAL_LEVELS } from '../triage/schemas';
import {
  DEFAULT_ADAPTATION_DAYS,
  DEFAULT_ADAPTATION_RIDES,
  DEFAULT_REVERT_RECENCY_DAYS,
  DEFAULT_STEP_CAPS,
  DEFAULT_WINDOW_CAPS,
  DEFAULT_WINDOW_DAYS,
} from './constants';

const capValue = z.number().min(0).max(1000);
const capsShape = Object.fromEntries(SETUP_PARAMETERS.map((p) => [p, capValue])) as Record<SetupParameter, typeof capValue>;

/** A full set of caps, one per parameter (mm or degrees). */
export const capsSchema = z.strictObject(capsShape);

/** Clinic policy. Stored by the admin screen; always clamped to the hard bounds before use. */
export const policySchema = z.strictObject({
  stepCaps: capsSchema.default(DEFAULT_STEP_CAPS),
  windowCaps: capsSchema.default(DEFAULT_WINDOW_CAPS),
  windowDays: z.number().int().min(1).max(365).default(DEFAULT_WINDOW_DAYS),
  adaptationDays: z.number().int().min(0).max(365).default(DEFAULT_ADAPTATION_DAYS),
  adaptationRides: z.number().int().min(0).max(100).default(DEFAULT_ADAPTATION_RIDES),
  revertRecencyDays: z.number().int().min(0).max(3650).default(DEFAULT_REVERT_RECENCY_DAYS),
});
export type Policy = z.infer<typeof policySchema>;
export type PolicyInput = z.input<typeof policySchema>;

/** What a physio may set. Every field can only make the plan more careful. */
export const physioLimitsSchema = z.strictObject({
  /** Put the plan on hold: no forward steps at all. */
  hold: z.boolean().default(false),
  excludedParameters: z.array(setupParameterSchema).max(20).default([]),
  excludedGroups: z.array(z.enum(PARAMETER_GROUPS)).max(10).default([]),
  /** Tighter per-step caps; a value above the clinic's is ignored. */
  stepCaps: capsSchema.partial().default({}),
  /** Multiplies every cap, 0–1. */
  capFactor: z.number().min(0).max(1).default(1),
  minAdaptationDays: z.number().int().min(0).max(365).optional(),
  minAdaptationRides: z.number().int().min(0).max(100).optional(),
  /** The physio has reviewed the non-urgent red flags and lets the plan go on. Urgent flags are never cleared here. */
  clearedRedFlags: z.boolean().default(false),
  note: z.string().max(2000).optional(),
});
export type PhysioLimits = z.infer<typeof physioLimitsSchema>;

/** A setup the rider rode, with when and how much (for reverts). */
export const riddenSetupSchema = z.strictObject({
  setup: setupSchema,
  from: isoDateSchema,
  to: isoDateSchema,
  rides: z.number().int().min(0).max(10_000),
});
export type RiddenSetup = z.infer<typeof riddenSetupSchema>;

export const planInputSchema = z.strictObject({
  /** The setup the rider has now; the plan starts here. */
  baseline: setupSchema,
  target: setupSchema,
  policy: policySchema.default(policySchema.parse({})),
  /** Worst current pain, 0–10. */
  currentPain: painScoreSchema,
  /** From the red-flag screen. */
  redFlagLevel: z.enum(REFERRAL_LEVELS).default('none'),
  physio: physioLimitsSchema.optional(),
  /** First possible day for step 1. */
  startDate: isoDateSchema,
  /** Used for the seat-post note in the instructions. */
  seatTubeAngle: z.number().min(60).max(90).optional(),
  /** Setups ridden before, for the revert rule. */
  history: z.array(riddenSetupSchema).max(500).default([]),
  /** Order to work through the groups (defaults to DEFAULT_GROUP_ORDER). */
  groupOrder: z.array(z.enum(PARAMETER_GROUPS)).max(6).optional(),
});
export type PlanInput = z.input<typeof planInputSchema>;
export type PlanInputParsed = z.output<typeof planInputSchema>;

export const planChangeSchema = z.object({
  parameter: setupParameterSchema,
  from: z.number(),
  to: z.number(),
  delta: z.number(),
  /** Set when this is a saddle-height compensation carried by a crank or cleat change. */
  coupledTo: z.enum(PARAMETER_GROUPS).nullable(),
});
export type PlanChange = z.infer<typeof planChangeSchema>;

export const planStepSchema = z.object({
  index: z.number().int().min(1),
  kind: z.enum(['change', 'revert']),
  group: z.enum(PARAMETER_GROUPS).nullable(),
  changes: z.array(planChangeSchema),
  setupAfter: setupSchema,
  earliestDate: isoDateSchema,
  minRides: z.number().int().min(0),
  checkInDue: isoDateSchema,
  instructions: z.array(z.string()),
});
export type PlanStep = z.infer<typeof planStepSchema>;

export const PLAN_STATUSES = ['reaches-target', 'stopped-at-bound', 'refused'] as const;

export const planReasonSchema = z.object({
  code: z.string(),
  message: z.string(),
  parameters: z.array(setupParameterSchema).default([]),
});
export type PlanReason = z.infer<typeof planReasonSchema>;

export const planSchema = z.object({
  status: z.enum(PLAN_STATUSES),
  baseline: setupSchema,
  target: setupSchema,
  finalSetup: setupSchema,
  steps: z.array(planStepSchema),
  reasons: z.array(planReasonSchema),
  /** The caps and spacing actually used, after policy clamping, pain and physio limits. */
  limits: z.object({
    stepCaps: capsSchema,
    windowCaps: capsSchema,
    windowDays: z.number(),
    adaptationDays: z.number(),
    adaptationRides: z.number(),
    painFactor: z.number(),
  }),
});
export type Plan = z.infer<typeof planSchema>;

export const planViolationSchema = z.object({
  code: z.string(),
  message: z.string(),
  step: z.number().int().nullable(),
  parameter: setupParameterSchema.nullable(),
});
export type PlanViolation = z.infer<typeof planViolationSchema>;
