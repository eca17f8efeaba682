/**
 * The step planner: caps, schedules, reverts and plan validation. See shared/README.md.
 * Only the public API: buildPlan always parses its input (buildPlanFrom, which skips that, the
 * effective-limit and revert helpers and the instruction writer stay inside the area).
 */
export { buildPlan } from './build';
export {
  DEFAULT_ADAPTATION_DAYS,
  DEFAULT_ADAPTATION_RIDES,
  DEFAULT_GROUP_ORDER,
  DEFAULT_REVERT_RECENCY_DAYS,
  DEFAULT_STEP_CAPS,
  DEFAULT_WINDOW_CAPS,
  DEFAULT_WINDOW_DAYS,
  GROUPS_PER_STEP,
  HARD_ADAPTATION_DAYS_BOUNDS,
  HARD_ADAPTATION_RIDES_BOUNDS,
  HARD_REVERT_RECENCY_BOUNDS,
  HARD_STEP_CAP_BOUNDS,
  HARD_WINDOW_CAP_BOUNDS,
  HARD_WINDOW_DAYS_BOUNDS,
  MAX_STEPS,
  MODERATE_PAIN,
  MODERATE_PAIN_CAP_FACTOR,
  type Caps,
} from './constants';
export { painCapFactor } from './limits';
export { checkPolicy, clampPolicy, defaultPolicy, policyIssueSchema, type PolicyIssue } from './policy';
export {
  capsSchema,
  physioLimitsSchema,
  PLAN_STATUSES,
  planChangeSchema,
  planInputSchema,
  planReasonSchema,
  planSchema,
  planStepSchema,
  planViolationSchema,
  policySchema,
  riddenSetupSchema,
  type PhysioLimits,
  type Plan,
  type PlanChange,
  type PlanInput,
  type PlanInputParsed,
  type PlanReason,
  type PlanStep,
  type PlanViolation,
  type Policy,
  type PolicyInput,
  type RiddenSetup,
} from './schemas';
export { validatePlan } from './validate';
export { stepBeyondPhysioLimits } from './physio-check';
