/** Clinic policy against the hard safety bounds: check for the admin screen, clamp for the planner. */
import { z } from 'zod';
import { parseInput } from '../errors';
import { SETUP_PARAMETERS } from '../setup/parameters';
import {
  HARD_ADAPTATION_DAYS_BOUNDS,
  HARD_ADAPTATION_RIDES_BOUNDS,
  HARD_REVERT_RECENCY_BOUNDS,
  HARD_STEP_CAP_BOUNDS,
  HARD_WINDOW_CAP_BOUNDS,
  HARD_WINDOW_DAYS_BOUNDS,
} from './constants';
import { policySchema, type Policy, type PolicyInput } from './schemas';

/** A policy value outside its hard bound, as the admin screen shows it. */
export const policyIssueSchema = z.object({
  /** Dotted path, e.g. `stepCaps.saddleHeight`. */
  field: z.string(),
  value: z.number(),
  min: z.number(),
  max: z.number(),
  message: z.string(),
});
export type PolicyIssue = z.infer<typeof policyIssueSchema>;

/** Every hard bound as a flat list of [field, bounds, getter]. */
function bounded(p: Policy): { field: string; value: number; bounds: readonly [number, number] }[] {
  return [
    ...SETUP_PARAMETERS.map((k) => ({ field: `stepCaps.${k}`, value: p.stepCaps[k], bounds: HARD_STEP_CAP_BOUNDS[k] })),
    ...SETUP_PARAMETERS.map((k) => ({ field: `windowCaps.${k}`, value: p.windowCaps[k], bounds: HARD_WINDOW_CAP_BOUNDS[k] })),
    { field: 'windowDays', value: p.windowDays, bounds: HARD_WINDOW_DAYS_BOUNDS },
    { field: 'adaptationDays', value: p.adaptationDays, bounds: HARD_ADAPTATION_DAYS_BOUNDS },
    { field: 'adaptationRides', value: p.adaptationRides, bounds: HARD_ADAPTATION_RIDES_BOUNDS },
    { field: 'revertRecencyDays', value: p.revertRecencyDays, bounds: HARD_REVERT_RECENCY_BOUNDS },
  ];
}

/** Lists every policy value outside its hard safety bound (empty when the policy is acceptable). Throws FitInputError on malformed input. */
export function checkPolicy(policy: PolicyInput): PolicyIssue[] {
  const p = parseInput(policySchema, policy, 'policy');
  return bounded(p)
    .filter(({ value, bounds }) => value < bounds[0] || value > bounds[1])
    .map(({ field, value, bounds: [min, max] }) => ({
      field,
      value,
      min,
      max,
      message: `${field} must be between ${min} and ${max} (got ${value}).`,
    }));
}

function setPath(target: Record<string, unknown>, path: string, value: number) {
  const [head, tail] = path.split('.') as [string, string | undefined];
  if (tail === undefined) target[head] = value;
  else (target[head] as Record<string, number>)[tail] = value;
}

/** The policy with every value moved inside its hard bound, plus what was changed. */
export function clampPolicy(policy: PolicyInput): { policy: Policy; issues: PolicyIssue[] } {
  const p = parseInput(policySchema, policy, 'policy');
  const out: Policy = { ...p, stepCaps: { ...p.stepCaps }, windowCaps: { ...p.windowCaps } };
  const issues = checkPolicy(p);
  for (const issue of issues) setPath(out as unknown as Record<string, unknown>, issue.field, Math.min(issue.max, Math.max(issue.min, issue.value)));
  return { policy: out, issues };
}

/** The default clinic policy (every value from constants.ts). */
export function defaultPolicy(): Policy {
  return policySchema.parse({});
}
