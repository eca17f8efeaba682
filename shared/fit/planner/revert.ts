/**
 * The revert rule (our decision, see shared/README.md). Going back to a setup the rider has
 * already ridden may happen in ONE step, ignoring per-step and window caps, because the body has
 * adapted to it before — but only when all of these hold:
 * - the target matches a setup in the history (every value within 0.05 mm or degree);
 * - the rider rode it for at least the adaptation period: as many days and as many rides as a
 *   normal step asks for;
 * - they left it no more than `revertRecencyDays` (default 90) before the plan's start;
 * - no parameter that would move is excluded by the physio, and the plan is not on hold and has
 *   no urgent red flag.
 * Pain and non-urgent red flags do not block such a revert: going back to a known setup is the
 * careful move. Any other revert is planned like a normal change, with all the caps.
 */
import { daysBetween } from '../setup/dates';
import { SETUP_PARAMETERS } from '../setup/parameters';
import type { Setup } from '../setup/schemas';
import { SAME_SETUP_TOLERANCE } from './constants';
import type { EffectiveLimits } from './limits';
import type { PlanInputParsed, RiddenSetup } from './schemas';

/** True when every parameter agrees within SAME_SETUP_TOLERANCE. */
export function sameSetup(a: Setup, b: Setup): boolean {
  return SETUP_PARAMETERS.every((p) => Math.abs(a[p] - b[p]) <= SAME_SETUP_TOLERANCE);
}

/** The history entry that allows a one-step revert to the target, or null. */
export function oneStepRevertSource(input: PlanInputParsed, limits: EffectiveLimits): RiddenSetup | null {
  if (limits.revertRefusal) return null;
  if (sameSetup(input.baseline, input.target)) return null;
  const moving = SETUP_PARAMETERS.filter((p) => input.baseline[p] !== input.target[p]);
  if (moving.some((p) => limits.excluded.has(p))) return null;
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
