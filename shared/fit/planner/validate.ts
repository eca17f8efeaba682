/** Re-checks a plan against its inputs: what the server runs before it stores a plan it was sent. */
import { z } from 'zod';
import { parseInput } from '../errors';
import { couplingCompensation } from '../setup/coupling';
import { addDays, daysBetween } from '../setup/dates';
import { COUPLED_GROUPS, groupOf, SETUP_PARAMETERS, type ParameterGroup, type SetupParameter } from '../setup/parameters';
import type { Setup } from '../setup/schemas';
import { EPS, GROUPS_PER_STEP, MAX_STEPS } from './constants';
import { effectiveLimits } from './limits';
import { firstStepDate, priorChanges, priorUsedInWindow } from './prior';
import { oneStepRevertSource, sameSetup } from './revert';
import { planInputSchema, planSchema, type PlanInput, type PlanViolation } from './schemas';

const v = (code: string, message: string, step: number | null = null, parameter: SetupParameter | null = null): PlanViolation => ({
  code, message, step, parameter,
});

const exactlySame = (a: Setup, b: Setup) => SETUP_PARAMETERS.every((p) => Math.abs(a[p] - b[p]) <= EPS);

/**
 * Every rule a plan must keep, checked against the inputs it claims to come from; returns the
 * violations (empty = acceptable). Checks: refusal when one is due; steps chained from the
 * baseline with consistent changes; per-step caps; one group per step with coupled saddle
 * compensation in the same step; physio exclusions; adaptation spacing, rides and check-in dates;
 * cumulative window caps; a one-step revert only when the revert rule allows it; and the end:
 * exactly the target, or stopped with reasons.
 */
export function validatePlan(plan: unknown, inputs: PlanInput): PlanViolation[] {
  const input = parseInput(planInputSchema, inputs, 'inputs');
  const parsed = planSchema.safeParse(plan);
  if (!parsed.success) {
    return [v('malformed', `The plan is not well formed: ${z.prettifyError(parsed.error).split('\n')[0]}`)];
  }
  const p = parsed.data;
  const limits = effectiveLimits(input);
  const out: PlanViolation[] = [];
  if (!exactlySame(p.baseline, input.baseline)) out.push(v('baseline-mismatch', 'The plan does not start from the baseline setup.'));
  if (!exactlySame(p.target, input.target)) out.push(v('target-mismatch', 'The plan is for a different target setup.'));
  const revertAllowed = oneStepRevertSource(input, limits) !== null;
  // The refusal rules hold for reverts too (see revert.ts).
  if (limits.refusal && p.steps.length > 0) {
    out.push(v('must-refuse', `No steps may be planned: ${limits.refusal.message}`));
  }
  if (p.steps.length > MAX_STEPS) out.push(v('too-many-steps', `A plan has at most ${MAX_STEPS} steps.`));

  const prior = priorChanges(input);
  const firstDate = firstStepDate(input, limits, prior);
  let prev = input.baseline;
  let prevDate: string | null = null;
  p.steps.forEach((s, i) => {
    const n = i + 1;
    if (s.index !== n) out.push(v('step-order', `Step ${n} is numbered ${s.index}.`, n));
    for (const param of SETUP_PARAMETERS) {
      const change = s.changes.find((c) => c.parameter === param);
      const delta = s.setupAfter[param] - prev[param];
      if (!change && Math.abs(delta) > EPS) out.push(v('unlisted-change', `${param} changes but the step does not list it.`, n, param));
      if (change && (Math.abs(change.from - prev[param]) > EPS || Math.abs(change.to - s.setupAfter[param]) > EPS || Math.abs(change.delta - delta) > EPS)) {
        out.push(v('inconsistent-change', `The ${param} change does not match the setups before and after.`, n, param));
      }
      if (limits.excluded.has(param) && Math.abs(delta) > EPS) out.push(v('physio-excluded', `${param} is excluded by the physiotherapist.`, n, param));
    }
    if (s.kind === 'revert') {
      if (!revertAllowed || p.steps.length !== 1 || !sameSetup(s.setupAfter, input.target)) {
        out.push(v('revert-not-allowed', 'A one-step revert is allowed only to a setup ridden recently for a full adaptation period, within the physiotherapist\'s limits and when no refusal applies.', n));
      }
      // Checked on their own as well, so the server can name the physio limit a forged revert breaks.
      for (const param of SETUP_PARAMETERS) {
        const delta = Math.abs(s.setupAfter[param] - prev[param]);
        if (!limits.excluded.has(param) && delta > limits.revertCaps[param] + EPS) {
          out.push(v('physio-cap', `${param} moves ${delta.toFixed(2)} in one revert step, over the physiotherapist's limit of ${limits.revertCaps[param].toFixed(2)}.`, n, param));
        }
      }
    } else {
      for (const param of SETUP_PARAMETERS) {
        const delta = Math.abs(s.setupAfter[param] - prev[param]);
        if (delta > limits.stepCaps[param] + EPS) {
          out.push(v('step-cap', `${param} moves ${delta.toFixed(2)}, over its cap of ${limits.stepCaps[param].toFixed(2)}.`, n, param));
        }
      }
      const comp = couplingCompensation(input.baseline, prev, s.setupAfter);
      const own = s.setupAfter.saddleHeight - prev.saddleHeight - comp;
      const groups = new Set<ParameterGroup>();
      for (const param of SETUP_PARAMETERS) {
        if (param !== 'saddleHeight' && Math.abs(s.setupAfter[param] - prev[param]) > EPS) groups.add(groupOf(param));
      }
      const coupled = [...groups].some((g) => COUPLED_GROUPS.includes(g));
      if (coupled && Math.abs(own) > EPS) {
        out.push(v('coupling', `A crank or cleat change must carry its saddle-height compensation of ${comp.toFixed(1)} mm in the same step, and nothing more.`, n, 'saddleHeight'));
      } else if (Math.abs(own) > EPS) groups.add('saddleHeight');
      if (groups.size > GROUPS_PER_STEP) out.push(v('one-group', `Step ${n} changes ${[...groups].join(' and ')}; change one thing at a time.`, n));
    }
    const first = prevDate === null;
    if (first && s.earliestDate < input.startDate) out.push(v('date', `Step 1 is dated before the start date.`, n));
    // A one-step revert undoes a change and need not wait for it (revert.ts); any other step 1 waits for the last change before the plan.
    else if (first && s.kind === 'change' && s.earliestDate < firstDate) {
      out.push(v('adaptation-days', `Step 1 comes sooner than ${limits.adaptationDays} days after the last change before the plan; it may come from ${firstDate}.`, n));
    }
    if (prevDate !== null && daysBetween(prevDate, s.earliestDate) < limits.adaptationDays) {
      out.push(v('adaptation-days', `Step ${n} comes sooner than ${limits.adaptationDays} days after the step before.`, n));
    }
    if (s.minRides < limits.adaptationRides) out.push(v('adaptation-rides', `Step ${n} asks for fewer than ${limits.adaptationRides} rides.`, n));
    if (s.checkInDue < addDays(s.earliestDate, limits.adaptationDays)) out.push(v('check-in', `Step ${n}'s check-in is due before its adaptation period ends.`, n));
    prev = s.setupAfter;
    prevDate = s.earliestDate;
  });

  // Cumulative windows: the worst window ends on a step date.
  const changeSteps = p.steps.filter((s) => s.kind === 'change');
  for (const end of changeSteps) {
    const from = addDays(end.earliestDate, -limits.windowDays);
    for (const param of SETUP_PARAMETERS) {
      const planned = changeSteps
        .filter((s) => s.earliestDate > from && s.earliestDate <= end.earliestDate)
        .reduce((sum, s) => sum + Math.abs(s.changes.find((c) => c.parameter === param)?.delta ?? 0), 0);
      // Earlier changes count, but only a window the plan itself adds to can be the plan's fault.
      const total = planned + priorUsedInWindow(prior, limits, param, end.earliestDate);
      if (planned > EPS && total > limits.windowCaps[param] + EPS) {
        out.push(v('window-cap', `${param} moves ${total.toFixed(2)} in the ${limits.windowDays} days to ${end.earliestDate}, over ${limits.windowCaps[param].toFixed(2)}.`, end.index, param));
      }
    }
  }

  if (!exactlySame(p.finalSetup, prev)) out.push(v('final-setup', 'The final setup is not the setup after the last step.'));
  if (p.status === 'reaches-target' && !exactlySame(prev, input.target)) out.push(v('end', 'The plan says it reaches the target but ends elsewhere.'));
  if (p.status !== 'reaches-target' && p.reasons.length === 0) out.push(v('end', 'A plan that stops short must say why.'));
  if (p.status === 'refused' && p.steps.length > 0) out.push(v('end', 'A refused plan has no steps.'));
  return out;
}
