/**
 * The revert rule (our decision, see shared/README.md). Going back to a setup the rider has
 * already ridden may happen in ONE step, ignoring the clinic's per-step and window caps and the
 * one-group rule, because the body has adapted to it before. It needs all of these:
 * - the target matches a setup in the history (every value within 0.05 mm or degree);
 * - the rider rode it for at least the adaptation period: as many days and as many rides as a
 *   normal step asks for;
 * - they left it no more than `revertRecencyDays` (default 90) before the plan's start;
 * - no refusal applies: an urgent or unreviewed red flag, severe pain or a physio hold refuse a
 *   revert exactly as they refuse any change (the advice then is to stop and see a clinician);
 * - the physio's limits hold: no moving parameter is excluded, and every move is within the
 *   physio's own step cap and, with a cap factor below 1, within the clinic cap times that factor.
 * A revert that fails only the physio's caps is planned like any change, in capped steps, with a
 * note saying why; one that moves an excluded parameter stops at the exclusion, as any plan does.
 */
import { daysBetween } from '../setup/dates';
import { SETUP_PARAMETERS } from '../setup/parameters';
import type { Setup } from '../setup/schemas';
import { EPS, SAME_SETUP_TOLERANCE } from './constants';
import type { EffectiveLimits } from './limits';
import type { PlanInputParsed, PlanReason, RiddenSetup } from './schemas';

/** True when every parameter agrees within SAME_SETUP_TOLERANCE. */
export function sameSetup(a: Setup, b: Setup): boolean {
  return SETUP_PARAMETERS.every((p) => Math.abs(a[p] - b[p]) <= SAME_SETUP_TOLERANCE);
}

/** The history entry the target is a recent, fully ridden copy of, or null (limits other than adaptation and recency aside). */
export function knownSetupSource(input: PlanInputParsed, limits: EffectiveLimits): RiddenSetup | null {
  if (sameSetup(input.baseline, input.target)) return null;
  return (
    input.history.find((h) => {
      if (!sameSetup(h.setup, input.target)) return false;
      const riddenDays = daysBetween(h.from, h.to);
      const sinceLeft = daysBetween(h.to, input.startDate);
      return (
        riddenDays >= limits.adaptationDays &&
        h.rides >= limits.adaptationRides &&
        sinceLeft >= 0 &&
        sinceLeft <= limits.revertRecencyDays
      );
    }) ?? null
  );
}

/** Why the physio's limits keep a revert to a known setup from going in one step, or null. */
export function physioRevertBlock(input: PlanInputParsed, limits: EffectiveLimits): PlanReason | null {
  const moving = SETUP_PARAMETERS.filter((p) => Math.abs(input.target[p] - input.baseline[p]) > EPS);
  const excluded = moving.filter((p) => limits.excluded.has(p));
  if (excluded.length > 0) {
    return { code: 'revert-excluded-by-physio', message: `The earlier setup moves what the physiotherapist excluded (${excluded.join(', ')}), so it cannot be restored in one step.`, parameters: excluded };
  }
  const over = moving.filter((p) => Math.abs(input.target[p] - input.baseline[p]) > limits.revertCaps[p] + EPS);
  if (over.length > 0) {
    return { code: 'revert-split-by-physio', message: `Going back moves more than the physiotherapist's limits allow in one step (${over.join(', ')}), so it is made in capped steps.`, parameters: over };
  }
  return null;
}

/** The history entry that allows a one-step revert to the target under every rule above, or null. */
export function oneStepRevertSource(input: PlanInputParsed, limits: EffectiveLimits): RiddenSetup | null {
  if (limits.refusal || physioRevertBlock(input, limits)) return null;
  return knownSetupSource(input, limits);
}
