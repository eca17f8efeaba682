import { GROUP_LABELS, PARAMETER_INFO, SETUP_PARAMETERS } from '@shared/fit/setup';
import type { PhysioLimits } from '@shared/fit/planner';
import { plural } from './format';

/**
 * A physio's limits as short phrases: "saddle height ≤ 2 mm per step", "cleat rotation
 * excluded", "every cap × 0.5", "at least 10 days and 5 rides between steps".
 */
export function describeLimits(limits: Partial<PhysioLimits> | null | undefined): string[] {
  if (!limits) return [];
  const out: string[] = [];
  for (const p of SETUP_PARAMETERS) {
    const cap = limits.stepCaps?.[p];
    if (cap === undefined || limits.excludedParameters?.includes(p)) continue;
    out.push(`${PARAMETER_INFO[p].label} ≤ ${cap}${PARAMETER_INFO[p].unit === 'deg' ? '°' : ' mm'} per step`);
  }
  for (const p of limits.excludedParameters ?? []) out.push(`${PARAMETER_INFO[p].label} excluded`);
  for (const g of limits.excludedGroups ?? []) out.push(`${GROUP_LABELS[g]} excluded`);
  if (limits.capFactor !== undefined && limits.capFactor < 1) out.push(`every cap × ${limits.capFactor}`);
  const days = limits.minAdaptationDays;
  const rides = limits.minAdaptationRides;
  if (days !== undefined || rides !== undefined) {
    const parts = [days !== undefined ? plural(days, 'day') : null, rides !== undefined ? plural(rides, 'ride') : null].filter(Boolean);
    out.push(`at least ${parts.join(' and ')} between steps`);
  }
  return out;
}
