/** The limits a plan must respect, from the clinic policy, current pain, red flags and physio limits. */
import { GROUP_PARAMETERS, SETUP_PARAMETERS, type SetupParameter } from '../setup/parameters';
import { SEVERE_PAIN } from '../triage/red-flags';
import { MODERATE_PAIN, MODERATE_PAIN_CAP_FACTOR, type Caps } from './constants';
import { clampPolicy } from './policy';
import type { PhysioLimits, PlanInputParsed, PlanReason } from './schemas';

export interface EffectiveLimits {
  stepCaps: Caps;
  windowCaps: Caps;
  windowDays: number;
  adaptationDays: number;
  adaptationRides: number;
  revertRecencyDays: number;
  painFactor: number;
  excluded: Set<SetupParameter>;
  /** Why no forward step may be planned, or null. */
  refusal: PlanReason | null;
  /** Why not even a revert may be planned (urgent red flag, physio hold), or null. */
  revertRefusal: PlanReason | null;
}

/**
 * Caps multiplier for the rider's current pain: 1 below 4/10, 0.5 for 4–6 (moderate), 0 from
 * 7 (severe: the plan stops; see constants.ts).
 */
export function painCapFactor(pain: number): number {
  if (pain >= SEVERE_PAIN) return 0;
  return pain >= MODERATE_PAIN ? MODERATE_PAIN_CAP_FACTOR : 1;
}

function excludedBy(physio: PhysioLimits | undefined): Set<SetupParameter> {
  const set = new Set<SetupParameter>(physio?.excludedParameters ?? []);
  for (const g of physio?.excludedGroups ?? []) for (const p of GROUP_PARAMETERS[g]) set.add(p);
  return set;
}

/**
 * Combines clinic policy (clamped to the hard bounds), pain and physio limits. The physio's
 * values only ever tighten: caps take the minimum, adaptation the maximum, and an excluded
 * parameter gets a cap of 0.
 */
export function effectiveLimits(input: PlanInputParsed): EffectiveLimits {
  const policy = clampPolicy(input.policy).policy;
  const physio = input.physio;
  const painFactor = painCapFactor(input.currentPain);
  const factor = painFactor * (physio?.capFactor ?? 1);
  const excluded = excludedBy(physio);
  const stepCaps = {} as Caps;
  const windowCaps = {} as Caps;
  for (const p of SETUP_PARAMETERS) {
    const physioCap = physio?.stepCaps[p] ?? Infinity;
    stepCaps[p] = excluded.has(p) ? 0 : Math.min(policy.stepCaps[p], physioCap) * factor;
    windowCaps[p] = excluded.has(p) ? 0 : policy.windowCaps[p] * factor;
  }
  let refusal: PlanReason | null = null;
  let revertRefusal: PlanReason | null = null;
  if (input.redFlagLevel === 'urgent') {
    revertRefusal = {
      code: 'urgent-red-flag',
      message: 'A warning sign needs urgent medical care: stop riding and seek care today. No changes are planned.',
      parameters: [],
    };
  } else if (physio?.hold) {
    revertRefusal = { code: 'physio-hold', message: 'The physiotherapist has put the plan on hold.', parameters: [] };
  }
  if (revertRefusal) refusal = revertRefusal;
  else if (input.redFlagLevel !== 'none' && !physio?.clearedRedFlags) {
    refusal = {
      code: 'red-flag',
      message: 'A warning sign needs a physiotherapist first. The plan goes on once they have reviewed it.',
      parameters: [],
    };
  } else if (input.currentPain >= SEVERE_PAIN) {
    refusal = {
      code: 'severe-pain',
      message: `Pain of ${input.currentPain}/10 is severe: position changes wait until a physiotherapist has seen you (pain 7/10 or more).`,
      parameters: [],
    };
  }
  return {
    stepCaps,
    windowCaps,
    windowDays: policy.windowDays,
    adaptationDays: Math.max(policy.adaptationDays, physio?.minAdaptationDays ?? 0),
    adaptationRides: Math.max(policy.adaptationRides, physio?.minAdaptationRides ?? 0),
    revertRecencyDays: policy.revertRecencyDays,
    painFactor,
    excluded,
    refusal,
    revertRefusal,
  };
}
