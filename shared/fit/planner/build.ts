/** The step planner: caps each change and schedules the follow-ups. */
import { parseInput } from '../errors';
import { CRANK_SIZE_STEP_MM } from '../saddle-height/constants';
import { couplingCompensation, saddleOffsetFromReference } from '../setup/coupling';
import { addDays } from '../setup/dates';
import { GROUP_LABELS, GROUP_PARAMETERS, SETUP_PARAMETERS, type ParameterGroup, type SetupParameter } from '../setup/parameters';
import { setupSchema, type Setup } from '../setup/schemas';
import { DEFAULT_GROUP_ORDER, EPS, MAX_STEPS } from './constants';
import { stepInstructions } from './instructions';
import { effectiveLimits, type EffectiveLimits } from './limits';
import { firstStepDate, priorChanges, priorUsedInWindow, type PriorChange } from './prior';
import { knownSetupSource, physioRevertBlock } from './revert';
import { planInputSchema, type Plan, type PlanChange, type PlanInput, type PlanInputParsed, type PlanReason, type PlanStep } from './schemas';

type Moves = Partial<Record<SetupParameter, number>>;

const clamp = (r: number, cap: number) => Math.sign(r) * Math.min(Math.abs(r), Math.max(0, cap));

interface Ctx {
  input: PlanInputParsed;
  limits: EffectiveLimits;
  goal: Setup;
  steps: PlanStep[];
  /** Changes before the plan (prior.ts): they delay step 1 and count in the windows. */
  prior: PriorChange[];
}

/** Total |movement| of a parameter in steps and earlier changes dated inside the window that ends on `date`. */
function usedInWindow(ctx: Ctx, p: SetupParameter, date: string): number {
  const from = addDays(date, -ctx.limits.windowDays);
  let sum = priorUsedInWindow(ctx.prior, ctx.limits, p, date);
  for (const s of ctx.steps) {
    if (s.earliestDate > from && s.earliestDate <= date) sum += Math.abs(s.changes.find((c) => c.parameter === p)?.delta ?? 0);
  }
  return sum;
}

/** The saddle-height move the saddle group itself still owes, net of compensation still to come. */
function saddleOwnRemaining(ctx: Ctx, current: Setup): number {
  return ctx.goal.saddleHeight - current.saddleHeight - couplingCompensation(ctx.input.baseline, current, ctx.goal);
}

/** The moves one step of `group` makes from `current` with these per-parameter budgets. */
function groupMoves(ctx: Ctx, group: ParameterGroup, current: Setup, budget: (p: SetupParameter) => number): Moves {
  const r = (p: SetupParameter) => ctx.goal[p] - current[p];
  const moves: Moves = {};
  if (group === 'saddleHeight') {
    moves.saddleHeight = clamp(saddleOwnRemaining(ctx, current), budget('saddleHeight'));
  } else if (group === 'cranks') {
    // The saddle compensation equals the crank change, so it must fit the saddle budget too; cranks come in 2.5 mm sizes.
    const cap = Math.min(budget('crankLength'), budget('saddleHeight'));
    const rem = r('crankLength');
    moves.crankLength = Math.abs(rem) <= cap + EPS ? rem : Math.sign(rem) * Math.floor((cap + EPS) / CRANK_SIZE_STEP_MM) * CRANK_SIZE_STEP_MM;
  } else if (group === 'cleats') {
    // Stack and cleat fore-aft share the saddle budget: each compensation is at most its own move.
    const saddle = budget('saddleHeight');
    moves.cleatRotation = clamp(r('cleatRotation'), budget('cleatRotation'));
    moves.stack = clamp(r('stack'), Math.min(budget('stack'), saddle));
    moves.cleatForeAft = clamp(r('cleatForeAft'), Math.min(budget('cleatForeAft'), saddle - Math.abs(moves.stack)));
  } else {
    for (const p of GROUP_PARAMETERS[group]) moves[p] = clamp(r(p), budget(p));
  }
  return moves;
}

function apply(ctx: Ctx, current: Setup, moves: Moves): Setup {
  const next = { ...current };
  for (const [p, m] of Object.entries(moves) as [SetupParameter, number][]) next[p] = current[p] + m;
  next.saddleHeight = current.saddleHeight + (moves.saddleHeight ?? 0) + couplingCompensation(ctx.input.baseline, current, next);
  // Snap the values this step moved that reached their goal, so a finished plan ends exactly at the target.
  for (const p of [...Object.keys(moves), 'saddleHeight'] as SetupParameter[]) {
    if (next[p] !== current[p] && Math.abs(next[p] - ctx.goal[p]) < EPS) next[p] = ctx.goal[p];
  }
  return next;
}

const isEmpty = (current: Setup, next: Setup) => SETUP_PARAMETERS.every((p) => Math.abs(next[p] - current[p]) < EPS);
const sameMoves = (a: Setup, b: Setup) => SETUP_PARAMETERS.every((p) => Math.abs(a[p] - b[p]) < EPS);

function groupDone(ctx: Ctx, group: ParameterGroup, current: Setup): boolean {
  if (group === 'saddleHeight') return Math.abs(saddleOwnRemaining(ctx, current)) < EPS;
  return GROUP_PARAMETERS[group].every((p) => Math.abs(ctx.goal[p] - current[p]) < EPS);
}

function makeStep(ctx: Ctx, group: ParameterGroup, before: Setup, after: Setup, date: string): PlanStep {
  const changes: PlanChange[] = SETUP_PARAMETERS.filter((p) => after[p] !== before[p]).map((p) => ({
    parameter: p,
    from: before[p],
    to: after[p],
    delta: after[p] - before[p],
    coupledTo: p === 'saddleHeight' && group !== 'saddleHeight' ? group : null,
  }));
  return {
    index: ctx.steps.length + 1,
    kind: 'change',
    group,
    changes,
    setupAfter: after,
    earliestDate: date,
    minRides: ctx.limits.adaptationRides,
    checkInDue: addDays(date, ctx.limits.adaptationDays),
    instructions: stepInstructions(changes, before, after, ctx.input.seatTubeAngle),
  };
}

/** Works `group` to its goal; returns the new setup, or a reason when the group cannot finish. */
function planGroup(ctx: Ctx, group: ParameterGroup, start: Setup): { current: Setup; stop: PlanReason | null } {
  let current = start;
  while (!groupDone(ctx, group, current)) {
    if (ctx.steps.length >= MAX_STEPS) {
      return { current, stop: { code: 'step-limit', message: `The plan stops after ${MAX_STEPS} steps; review the target with the rider.`, parameters: [...GROUP_PARAMETERS[group]] } };
    }
    const capOnly = apply(ctx, current, groupMoves(ctx, group, current, (p) => ctx.limits.stepCaps[p]));
    if (isEmpty(current, capOnly)) {
      return { current, stop: blockedReason(ctx, group) };
    }
    const last = ctx.steps[ctx.steps.length - 1];
    const first = last ? addDays(last.earliestDate, ctx.limits.adaptationDays) : firstStepDate(ctx.input, ctx.limits, ctx.prior);
    // Wait, if need be, until older steps and earlier changes leave the window and a full step fits.
    const dates = [...ctx.prior.map((c) => c.date), ...ctx.steps.map((s) => s.earliestDate)];
    const candidates = [first, ...dates.map((d) => addDays(d, ctx.limits.windowDays)).filter((d) => d > first).sort()];
    let chosen: { date: string; next: Setup } | null = null;
    for (const date of candidates) {
      // Never below 0: earlier changes can overfill a window, and a negative crank budget would floor to a move.
      const budget = (p: SetupParameter) => Math.max(0, Math.min(ctx.limits.stepCaps[p], ctx.limits.windowCaps[p] - usedInWindow(ctx, p, date)));
      const next = apply(ctx, current, groupMoves(ctx, group, current, budget));
      if (!isEmpty(current, next)) chosen = { date, next };
      if (sameMoves(next, capOnly)) break;
    }
    /* v8 ignore next 3 -- the last candidate has an empty window, so a step always fits there */
    if (!chosen) return { current, stop: blockedReason(ctx, group) };
    if (!setupSchema.safeParse(chosen.next).success) {
      return { current, stop: { code: 'out-of-range', message: `The next ${GROUP_LABELS[group]} step would take the setup outside plausible values; check the target.`, parameters: [...GROUP_PARAMETERS[group], 'saddleHeight'] } };
    }
    ctx.steps.push(makeStep(ctx, group, current, chosen.next, chosen.date));
    current = chosen.next;
  }
  return { current, stop: null };
}

function blockedReason(ctx: Ctx, group: ParameterGroup): PlanReason {
  if (group === 'cranks') {
    return {
      code: 'crank-step-too-small',
      message: `Crank length moves in whole ${CRANK_SIZE_STEP_MM} mm sizes together with the same saddle-height change; the current caps (crank ${round1(ctx.limits.stepCaps.crankLength)} mm, saddle height ${round1(ctx.limits.stepCaps.saddleHeight)} mm) do not allow one. It waits until pain has settled or the caps allow it.`,
      parameters: ['crankLength'],
    };
  }
  return {
    code: 'cap-is-zero',
    message: `The ${GROUP_LABELS[group]} cannot move under the current limits.`,
    parameters: [...GROUP_PARAMETERS[group]],
  };
}

const round1 = (v: number) => Math.round(v * 10) / 10;

/** Saddle goal: the target saddle height less any compensation that will not happen (a blocked or excluded coupled change). */
function setSaddleGoal(ctx: Ctx, reasons: PlanReason[]): void {
  const { baseline, target } = ctx.input;
  if (ctx.limits.excluded.has('saddleHeight')) return;
  const missing = saddleOffsetFromReference(baseline, target) - saddleOffsetFromReference(baseline, ctx.goal);
  const wanted = target.saddleHeight - missing;
  const goal = Math.min(1100, Math.max(300, wanted));
  if (Math.abs(goal - target.saddleHeight) > EPS && !reasons.some((r) => r.code === 'saddle-follows-coupled')) {
    reasons.push({
      code: 'saddle-follows-coupled',
      message: 'Saddle height stops short of the target because a crank, stack or cleat change it was meant to balance is not made.',
      parameters: ['saddleHeight'],
    });
  }
  ctx.goal = { ...ctx.goal, saddleHeight: goal };
}

/** Goal setup: the target, less anything the physio excluded (and coupled changes that would move an excluded saddle). */
function initialGoal(ctx: Ctx, reasons: PlanReason[]): void {
  const { baseline, target } = ctx.input;
  const goal = { ...target };
  const excluded = SETUP_PARAMETERS.filter((p) => ctx.limits.excluded.has(p) && target[p] !== baseline[p]);
  for (const p of excluded) goal[p] = baseline[p];
  if (excluded.length > 0) {
    reasons.push({ code: 'excluded-by-physio', message: `Excluded by the physiotherapist, so left as they are: ${excluded.join(', ')}.`, parameters: excluded });
  }
  if (ctx.limits.excluded.has('saddleHeight')) {
    const coupled = (['crankLength', 'stack', 'cleatForeAft'] as const).filter((p) => goal[p] !== baseline[p]);
    for (const p of coupled) goal[p] = baseline[p];
    if (coupled.length > 0) {
      reasons.push({ code: 'coupled-to-excluded-saddle', message: `Saddle height is excluded, so these changes, which carry a saddle-height change, wait too: ${coupled.join(', ')}.`, parameters: coupled });
    }
  }
  ctx.goal = goal;
  setSaddleGoal(ctx, reasons);
}

function refusedPlan(input: PlanInputParsed, limits: EffectiveLimits, reason: PlanReason): Plan {
  return { status: 'refused', baseline: input.baseline, target: input.target, finalSetup: input.baseline, steps: [], reasons: [reason], limits: publicLimits(limits) };
}

function publicLimits(l: EffectiveLimits): Plan['limits'] {
  return { stepCaps: l.stepCaps, windowCaps: l.windowCaps, windowDays: l.windowDays, adaptationDays: l.adaptationDays, adaptationRides: l.adaptationRides, painFactor: l.painFactor };
}

/** The one-step revert to a recently and fully ridden setup (see revert.ts). */
function revertPlan(input: PlanInputParsed, limits: EffectiveLimits): Plan {
  const changes: PlanChange[] = SETUP_PARAMETERS.filter((p) => input.target[p] !== input.baseline[p]).map((p) => ({
    parameter: p, from: input.baseline[p], to: input.target[p], delta: input.target[p] - input.baseline[p], coupledTo: null,
  }));
  const step: PlanStep = {
    index: 1,
    kind: 'revert',
    group: null,
    changes,
    setupAfter: input.target,
    earliestDate: input.startDate,
    minRides: limits.adaptationRides,
    checkInDue: addDays(input.startDate, limits.adaptationDays),
    instructions: [
      'Go back to the earlier setup you rode before, all in one go: your body already knows it.',
      ...stepInstructions(changes, input.baseline, input.target, input.seatTubeAngle).slice(1),
    ],
  };
  return {
    status: 'reaches-target', baseline: input.baseline, target: input.target, finalSetup: input.target, steps: [step],
    reasons: [{ code: 'revert-known-setup', message: 'A recent, fully ridden setup: the revert is made in one step.', parameters: [] }],
    limits: publicLimits(limits),
  };
}

/** Builds a plan from parsed input. */
export function buildPlanFrom(input: PlanInputParsed): Plan {
  const limits = effectiveLimits(input);
  // Refusals come first: they hold for a revert to a known setup too (see revert.ts).
  if (limits.refusal) return refusedPlan(input, limits, limits.refusal);
  // A note kept even when the target is reached: why a known setup is not restored in one step.
  const notes: PlanReason[] = [];
  if (knownSetupSource(input, limits)) {
    const block = physioRevertBlock(input, limits);
    if (!block) return revertPlan(input, limits);
    notes.push(block);
  }
  const reasons: PlanReason[] = [...notes];
  const ctx: Ctx = { input, limits, goal: input.target, steps: [], prior: priorChanges(input) };
  initialGoal(ctx, reasons);
  const order = [...new Set([...(input.groupOrder ?? []), ...DEFAULT_GROUP_ORDER])];
  let current = input.baseline;
  // Several passes: a blocked coupled group changes the saddle goal, which the saddle group then follows.
  for (let pass = 0; pass < 3; pass++) {
    for (const group of order) {
      const result = planGroup(ctx, group, current);
      current = result.current;
      if (result.stop) {
        if (!reasons.some((r) => r.code === result.stop?.code && r.message === result.stop.message)) reasons.push(result.stop);
        for (const p of GROUP_PARAMETERS[group]) ctx.goal = { ...ctx.goal, [p]: current[p] };
        if (group !== 'saddleHeight') setSaddleGoal(ctx, reasons);
        if (result.stop.code === 'step-limit') break;
      }
    }
    if (order.every((g) => groupDone(ctx, g, current)) || reasons.some((r) => r.code === 'step-limit')) break;
  }
  // "Exactly" means within EPS (1e-6 mm or degree), far below anything a rider can set.
  const reaches = SETUP_PARAMETERS.every((p) => Math.abs(current[p] - input.target[p]) <= EPS);
  return {
    status: reaches ? 'reaches-target' : 'stopped-at-bound',
    baseline: input.baseline,
    target: input.target,
    finalSetup: current,
    steps: ctx.steps,
    reasons: reaches ? notes : reasons,
    limits: publicLimits(limits),
  };
}

/**
 * Plans the steps from `baseline` to `target` under the clinic policy (clamped to the hard
 * bounds), the rider's pain, red flags and physio limits. Refuses (no steps, with the reason) on
 * an urgent or unreviewed red flag, severe pain or a physio hold. Otherwise every step changes
 * one parameter group (a crank or cleat change carries its saddle compensation), stays within
 * the per-step and window caps, and is spaced by the adaptation period. The plan ends exactly at
 * the target, or stops at a stated bound with the reasons. A target that is a recent, fully
 * ridden setup in `history` is reached in one revert step when no refusal applies and the move
 * keeps within the physio's limits (see revert.ts).
 */
export function buildPlan(input: PlanInput): Plan {
  return buildPlanFrom(parseInput(planInputSchema, input, 'plan'));
}
