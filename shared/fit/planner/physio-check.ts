/**
 * A stored plan was built under the limits of its day. When a physio later sets tighter limits,
 * each step still to be made is checked against them before the rider may make it; a step that
 * goes beyond them waits for the fitter to send a new plan within the limits.
 */
import { parseInput } from '../errors';
import { GROUP_PARAMETERS, PARAMETER_INFO } from '../setup/parameters';
import { clampPolicy } from './policy';
import { physioLimitsSchema, planStepSchema, policySchema, type PhysioLimits, type PlanStep, type Policy } from './schemas';

const EPS = 1e-6;

/** Plain-language reasons this step breaks the physio's limits; empty when it keeps them. */
export function stepBeyondPhysioLimits(step: PlanStep, physio: PhysioLimits | undefined, policy: Policy): string[] {
  if (!physio) return [];
  const s = parseInput(planStepSchema, step, 'step');
  const limits = parseInput(physioLimitsSchema, physio, 'physio');
  const clinic = clampPolicy(parseInput(policySchema, policy, 'policy')).policy;
  const excluded = new Set<string>(limits.excludedParameters);
  for (const g of limits.excludedGroups) for (const p of GROUP_PARAMETERS[g]) excluded.add(p);
  const problems: string[] = [];
  for (const change of s.changes) {
    if (Math.abs(change.delta) < EPS) continue;
    if (excluded.has(change.parameter)) {
      problems.push(`The physiotherapist asked for no changes to the ${PARAMETER_INFO[change.parameter].label}.`);
      continue;
    }
    // Saddle compensations travel with their crank or cleat change and are checked with it.
    if (change.coupledTo !== null) continue;
    const cap = Math.min(limits.stepCaps[change.parameter] ?? Infinity, clinic.stepCaps[change.parameter] * limits.capFactor);
    const { label, unit } = PARAMETER_INFO[change.parameter];
    const round = (v: number) => Math.round(v * 100) / 100;
    if (Math.abs(change.delta) > cap + EPS) problems.push(`The ${label} moves ${round(Math.abs(change.delta))} ${unit}, more than the physiotherapist's limit of ${round(cap)} ${unit} per step.`);
  }
  return problems;
}
