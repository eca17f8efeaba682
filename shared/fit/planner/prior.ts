/**
 * Changes made before the plan, read from `history` (our decision, see shared/README.md). Each
 * ridden setup ended on its `to` date with a change to the next one (the next entry by date, or
 * the baseline after the last), so:
 * - step 1 comes no sooner than the adaptation period after the latest such change, and
 * - the moves of earlier changes count in every window that still holds their date.
 * A re-measurement that found the same setup moves nothing and is not a change.
 */
import { addDays } from '../setup/dates';
import { SETUP_PARAMETERS, type SetupParameter } from '../setup/parameters';
import { SAME_SETUP_TOLERANCE } from './constants';
import type { EffectiveLimits } from './limits';
import type { PlanInputParsed } from './schemas';

export interface PriorChange {
  /** The day the rider changed to the next setup. */
  date: string;
  /** |movement| per parameter that moved, mm or degrees. */
  moves: Partial<Record<SetupParameter, number>>;
}

/** Every change before the plan, oldest first. */
export function priorChanges(input: PlanInputParsed): PriorChange[] {
  const ridden = [...input.history].sort((a, b) => a.to.localeCompare(b.to) || a.from.localeCompare(b.from));
  const out: PriorChange[] = [];
  ridden.forEach((h, i) => {
    const next = ridden[i + 1]?.setup ?? input.baseline;
    const moves: PriorChange['moves'] = {};
    for (const p of SETUP_PARAMETERS) {
      const d = Math.abs(next[p] - h.setup[p]);
      if (d > SAME_SETUP_TOLERANCE) moves[p] = d;
    }
    if (Object.keys(moves).length > 0) out.push({ date: h.to, moves });
  });
  return out;
}

/** The first day step 1 may come: the start date, or the adaptation period after the last change before the plan if later. */
export function firstStepDate(input: PlanInputParsed, limits: EffectiveLimits, prior: PriorChange[]): string {
  const last = prior.at(-1);
  const settled = last ? addDays(last.date, limits.adaptationDays) : input.startDate;
  return settled > input.startDate ? settled : input.startDate;
}

/** Total earlier movement of `p` dated inside the window that ends on `date`. */
export function priorUsedInWindow(prior: PriorChange[], limits: EffectiveLimits, p: SetupParameter, date: string): number {
  const from = addDays(date, -limits.windowDays);
  return prior.filter((c) => c.date > from && c.date <= date).reduce((sum, c) => sum + (c.moves[p] ?? 0), 0);
}
