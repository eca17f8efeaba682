/** The limits a plan must respect, from the clinic policy, current pain, red flags and physio limits. */
import { requireRange } from '../errors';
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
  /**
   * The physio's limits on a one-step revert, per parameter (Infinity where they set none): their
   * own step cap, and with a cap factor below 1 the clinic cap times that factor; 0 when excluded.
   * Pain does not enter: a revert that passes the refusal rules goes back to a setup the body knows.
   */
  revertCaps: Caps;
  /** Why no step at all may be planned (forward or revert), or null. */
  refusal: PlanReason | null;
}

/**
 * Caps multiplier for the rider's current pain: 1 below 4/10, 0.5 for 4–6 (moderate), 0 from
 * 7 (severe: the plan stops; see constants.ts).
 */
export function painCapFactor(pain: number): number {
  requireRange('pain', pain, 0, 10);
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
  const physioFactor = physio?.capFactor ?? 1;
  const stepCaps = {} as Caps;
  const windowCaps = {} as Caps;
  const revertCaps = {} as Caps;
  for (const p of SETUP_PARAMETERS) {
    const physioCap = physio?.stepCaps[p] ?? Infinity;
    stepCaps[p] = excluded.has(p) ? 0 : Math.min(policy.stepCaps[p], physioCap) * factor;
    windowCaps[p] = excluded.has(p) ? 0 : policy.windowCaps[p] * factor;
    // A finite product only: Infinity × a factor below 1 would never limit anything.
    revertCaps[p] = excluded.has(p) ? 0 : physioFactor < 1 ? Math.min(policy.stepCaps[p], physioCap) * physioFactor : physioCap;
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
    revertCaps,
    refusal: refusalFor(input),
  };
}

/**
 * Why no step may be planned, or null. The same rules hold for a revert to a known setup (our
 * decision, see shared/README.md): with an urgent or unreviewed red flag, severe pain or a physio
 * hold, the safe advice is to stop and see a clinician, not to change the bike in any direction.
 */
function refusalFor(input: PlanInputParsed): PlanReason | null {
  const physio = input.physio;
  if (input.redFlagLevel === 'urgent') {
    return {
      code: 'urgent-red-flag',
      message: 'A warning sign needs urgent medical care: stop riding and seek care today. No changes are planned, not even a return to an earlier setup.',
      parameters: [],
    };
  }
  if (physio?.hold) return { code: 'physio-hold', message: 'The plan is on hold (after a warning sign or by the physiotherapist) until a physiotherapist clears it.', parameters: [] };
  if (input.redFlagLevel !== 'none' && !physio?.clearedRedFlags) {
    return {
      code: 'red-flag',
      message: 'A warning sign needs a physiotherapist first. No changes are planned, not even a return to an earlier setup, until they have reviewed it.',
      parameters: [],
    };
  }
  if (input.currentPain >= SEVERE_PAIN) {
    return {
      code: 'severe-pain',
      message: `Pain of ${input.currentPain}/10 is severe (7/10 or more): stop riding and see a physiotherapist before any change to the bike, even going back to an earlier setup.`,
      parameters: [],
    };
  }
  return null;
}
