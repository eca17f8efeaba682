/** Property-based checks of the step planner: whatever the input, the plan keeps every rule. */
import { describe, expect, it } from 'vitest';
import fc from 'fast-check';
import {
  buildPlan,
  defaultPolicy,
  HARD_ADAPTATION_DAYS_BOUNDS,
  HARD_ADAPTATION_RIDES_BOUNDS,
  HARD_STEP_CAP_BOUNDS,
  HARD_WINDOW_CAP_BOUNDS,
  HARD_WINDOW_DAYS_BOUNDS,
  validatePlan,
  type Plan,
  type PlanInput,
} from '@shared/fit/planner';
import { addDays, couplingCompensation, daysBetween, GROUP_PARAMETERS, groupOf, PARAMETER_GROUPS, PARAMETER_INFO, SETUP_PARAMETERS, type Setup, type SetupParameter } from '@shared/fit/setup';
import { REFERRAL_LEVELS } from '@shared/fit/triage';

/** A realistic setup, and a target within a realistic distance of it. */
const realistic: Record<SetupParameter, [number, number]> = {
  saddleHeight: [600, 900], saddleSetback: [20, 110], saddleTilt: [-6, 4], reach: [420, 620], drop: [0, 160],
  stemLength: [60, 140], spacerStack: [0, 40], crankLength: [160, 180], stack: [10, 30], cleatForeAft: [-10, 10], cleatRotation: [-6, 6],
};
const spread: Record<SetupParameter, number> = {
  saddleHeight: 25, saddleSetback: 20, saddleTilt: 4, reach: 40, drop: 30, stemLength: 30, spacerStack: 15,
  crankLength: 10, stack: 6, cleatForeAft: 12, cleatRotation: 5,
};

const setupArb = fc.record(Object.fromEntries(SETUP_PARAMETERS.map((p) => [p, fc.double({ min: realistic[p][0], max: realistic[p][1], noNaN: true })])) as Record<SetupParameter, fc.Arbitrary<number>>);

const targetArb = (base: Setup) =>
  fc.record(
    Object.fromEntries(
      SETUP_PARAMETERS.map((p) => {
        const info = PARAMETER_INFO[p];
        const lo = Math.max(info.min, base[p] - spread[p]);
        const hi = Math.min(info.max, base[p] + spread[p]);
        // Often leave a parameter alone, as real targets do.
        return [p, fc.oneof(fc.constant(base[p]), fc.double({ min: lo, max: hi, noNaN: true }))];
      }),
    ) as Record<SetupParameter, fc.Arbitrary<number>>,
  );

const capsArb = fc.record(Object.fromEntries(SETUP_PARAMETERS.map((p) => [p, fc.double({ min: 0, max: 15, noNaN: true })])) as Record<SetupParameter, fc.Arbitrary<number>>);

/** Days after 2024-10-01, as an ISO date. */
const dayArb = (min: number, max: number) => fc.integer({ min, max }).map((d) => addDays('2024-10-01', d));

/**
 * Setups ridden before: often the target itself (so the revert rule is exercised), the baseline
 * (a re-measurement) or another setup, each ridden from `from` to `to`.
 */
const historyArb = (baseline: Setup, target: Setup) =>
  fc.array(
    fc.record({
      setup: fc.oneof(fc.constant(target), fc.constant(baseline), targetArb(baseline)),
      from: dayArb(0, 120),
      days: fc.integer({ min: 0, max: 60 }),
      rides: fc.integer({ min: 0, max: 12 }),
    }).map(({ setup, from, days, rides }) => ({ setup, from, to: addDays(from, days), rides })),
    { maxLength: 4 },
  );

const inputArb: fc.Arbitrary<PlanInput> = setupArb.chain((baseline) => targetArb(baseline).chain((target) =>
  fc.record({
    baseline: fc.constant(baseline),
    target: fc.constant(target),
    history: historyArb(baseline, target),
    currentPain: fc.integer({ min: 0, max: 10 }),
    redFlagLevel: fc.constantFrom(...REFERRAL_LEVELS, 'none', 'none', 'none'),
    startDate: fc.constantFrom('2025-01-01', '2025-02-27', '2024-12-30'),
    seatTubeAngle: fc.option(fc.double({ min: 70, max: 76, noNaN: true }), { nil: undefined }),
    policy: fc.option(
      fc.record({
        stepCaps: capsArb,
        windowCaps: capsArb,
        windowDays: fc.integer({ min: 1, max: 90 }),
        adaptationDays: fc.integer({ min: 0, max: 30 }),
        adaptationRides: fc.integer({ min: 0, max: 10 }),
      }),
      { nil: undefined },
    ),
    physio: fc.option(
      fc.record({
        hold: fc.boolean(),
        excludedParameters: fc.subarray([...SETUP_PARAMETERS], { maxLength: 3 }),
        excludedGroups: fc.subarray([...PARAMETER_GROUPS], { maxLength: 1 }),
        stepCaps: fc.record(Object.fromEntries(SETUP_PARAMETERS.map((p) => [p, fc.double({ min: 0, max: 12, noNaN: true })])) as Record<SetupParameter, fc.Arbitrary<number>>, { requiredKeys: [] }),
        capFactor: fc.double({ min: 0.2, max: 1, noNaN: true }),
        minAdaptationDays: fc.option(fc.integer({ min: 0, max: 30 }), { nil: undefined }),
        minAdaptationRides: fc.option(fc.integer({ min: 0, max: 12 }), { nil: undefined }),
        clearedRedFlags: fc.boolean(),
      }),
      { nil: undefined },
    ),
  }),
));

const RUNS = { numRuns: Number(globalThis.process?.env.FC_RUNS ?? 250) };

/** Floating-point slack: far below anything a rider can set. */
const EPS = 1e-6;

type Caps = Record<SetupParameter, number>;
const perParameter = (f: (p: SetupParameter) => number) => Object.fromEntries(SETUP_PARAMETERS.map((p) => [p, f(p)])) as Caps;
const clamp = (v: number, [lo, hi]: readonly [number, number]) => Math.min(hi, Math.max(lo, v));

/**
 * The limits a plan must keep, worked out here from the rules, not read from the plan: the clinic
 * policy clamped to the hard bounds; pain (4–6/10 halves every cap, 7+ refuses: TRADE §6 [V] and our
 * rule); the physio's caps (minimum), cap factor (multiplies), exclusions (0) and adaptation (maximum).
 */
function expectedLimits(input: PlanInput) {
  const policy = { ...defaultPolicy(), ...input.policy };
  const physio = input.physio;
  const pain = input.currentPain >= 7 ? 0 : input.currentPain >= 4 ? 0.5 : 1;
  const capFactor = physio?.capFactor ?? 1;
  const excluded = new Set<SetupParameter>([...(physio?.excludedParameters ?? []), ...(physio?.excludedGroups ?? []).flatMap((g) => GROUP_PARAMETERS[g])]);
  const clinicStep = perParameter((p) => clamp(policy.stepCaps[p], HARD_STEP_CAP_BOUNDS[p]));
  const physioCap = (p: SetupParameter) => physio?.stepCaps?.[p] ?? Infinity;
  return {
    excluded,
    stepCaps: perParameter((p) => (excluded.has(p) ? 0 : Math.min(clinicStep[p], physioCap(p)) * pain * capFactor)),
    windowCaps: perParameter((p) => (excluded.has(p) ? 0 : clamp(policy.windowCaps[p], HARD_WINDOW_CAP_BOUNDS[p]) * pain * capFactor)),
    // A one-step revert: the physio's own cap, and with a factor below 1 the clinic cap times it.
    revertCaps: perParameter((p) => (excluded.has(p) ? 0 : capFactor < 1 ? Math.min(clinicStep[p], physioCap(p)) * capFactor : physioCap(p))),
    windowDays: clamp(policy.windowDays, HARD_WINDOW_DAYS_BOUNDS),
    adaptationDays: Math.max(clamp(policy.adaptationDays, HARD_ADAPTATION_DAYS_BOUNDS), physio?.minAdaptationDays ?? 0),
    adaptationRides: Math.max(clamp(policy.adaptationRides, HARD_ADAPTATION_RIDES_BOUNDS), physio?.minAdaptationRides ?? 0),
  };
}

/** Changes before the plan: each ridden setup ends on its `to` date with a move to the next one (or to the baseline). */
function earlierChanges(input: PlanInput): { date: string; moves: Partial<Caps> }[] {
  const ridden = [...(input.history ?? [])].sort((a, b) => a.to.localeCompare(b.to) || a.from.localeCompare(b.from));
  return ridden
    .map((h, i) => {
      const next = ridden[i + 1]?.setup ?? input.baseline;
      const moves: Partial<Caps> = {};
      for (const p of SETUP_PARAMETERS) if (Math.abs(next[p] - h.setup[p]) > 0.05) moves[p] = Math.abs(next[p] - h.setup[p]);
      return { date: h.to, moves };
    })
    .filter((c) => Object.keys(c.moves).length > 0);
}

function check(name: string, prop: (plan: Plan, input: PlanInput) => void) {
  it(name, () => {
    fc.assert(fc.property(inputArb, (input) => prop(buildPlan(input), input)), RUNS);
  }, 60_000);
}

describe('the step planner, for any input', () => {
  check('passes its own validator (validatePlan finds no violation)', (plan, input) => {
    expect(validatePlan(plan, input)).toEqual([]);
  });

  check('reports the limits worked out independently from policy, hard bounds, pain and physio', (plan, input) => {
    const want = expectedLimits(input);
    for (const p of SETUP_PARAMETERS) {
      expect(plan.limits.stepCaps[p]).toBeCloseTo(want.stepCaps[p], 9);
      expect(plan.limits.windowCaps[p]).toBeCloseTo(want.windowCaps[p], 9);
    }
    expect(plan.limits).toMatchObject({ windowDays: want.windowDays, adaptationDays: want.adaptationDays, adaptationRides: want.adaptationRides });
  });

  check('never exceeds a per-step cap (a one-step revert: the physio’s caps)', (plan, input) => {
    const want = expectedLimits(input);
    for (const s of plan.steps) {
      const caps = s.kind === 'change' ? want.stepCaps : want.revertCaps;
      for (const c of s.changes) expect(Math.abs(c.delta)).toBeLessThanOrEqual(caps[c.parameter] + EPS);
    }
  });

  check('keeps every cumulative window, counting changes made before the plan', (plan, input) => {
    const want = expectedLimits(input);
    const earlier = earlierChanges(input);
    const inWindow = (date: string, end: string) => daysBetween(date, end) >= 0 && daysBetween(date, end) < want.windowDays;
    const changeSteps = plan.steps.filter((s) => s.kind === 'change');
    for (const end of changeSteps) {
      for (const p of SETUP_PARAMETERS) {
        const planned = changeSteps
          .filter((s) => inWindow(s.earliestDate, end.earliestDate))
          .reduce((sum, s) => sum + Math.abs(s.changes.find((c) => c.parameter === p)?.delta ?? 0), 0);
        const before = earlier.filter((c) => inWindow(c.date, end.earliestDate)).reduce((sum, c) => sum + (c.moves[p] ?? 0), 0);
        if (planned > EPS) expect(planned + before).toBeLessThanOrEqual(want.windowCaps[p] + EPS);
      }
    }
  });

  check('keeps coupled changes together: a crank or cleat step carries exactly its saddle compensation', (plan) => {
    let prev = plan.baseline;
    for (const s of plan.steps) {
      if (s.group === 'cranks' || s.group === 'cleats') {
        const comp = couplingCompensation(plan.baseline, prev, s.setupAfter);
        expect(s.setupAfter.saddleHeight - prev.saddleHeight).toBeCloseTo(comp, 6);
      }
      if (s.kind === 'change') {
        const changedGroups = new Set(s.changes.filter((c) => c.coupledTo === null).map((c) => groupOf(c.parameter)));
        expect(changedGroups.size, JSON.stringify(s.changes)).toBeLessThanOrEqual(1);
        expect(s.group === null || changedGroups.size === 0 || changedGroups.has(s.group)).toBe(true);
      }
      prev = s.setupAfter;
    }
  });

  check('spaces steps by the adaptation period, from the last change before the plan too, with the check-in after it', (plan, input) => {
    const want = expectedLimits(input);
    const last = earlierChanges(input).at(-1);
    plan.steps.forEach((s, i) => {
      expect(s.minRides).toBeGreaterThanOrEqual(want.adaptationRides);
      expect(daysBetween(s.earliestDate, s.checkInDue)).toBeGreaterThanOrEqual(want.adaptationDays);
      const before = plan.steps[i - 1];
      if (before) expect(daysBetween(before.earliestDate, s.earliestDate)).toBeGreaterThanOrEqual(want.adaptationDays);
      else expect(daysBetween(input.startDate, s.earliestDate)).toBeGreaterThanOrEqual(0);
      // A one-step revert undoes a change and need not wait for it (our rule).
      if (!before && last && s.kind === 'change') expect(daysBetween(last.date, s.earliestDate)).toBeGreaterThanOrEqual(want.adaptationDays);
    });
  });

  check('ends exactly at the target, or at a stated bound that names every parameter left short', (plan) => {
    const end = plan.steps.at(-1)?.setupAfter ?? plan.baseline;
    expect(plan.finalSetup).toEqual(end);
    if (plan.status === 'reaches-target') {
      for (const p of SETUP_PARAMETERS) expect(Math.abs(end[p] - plan.target[p])).toBeLessThanOrEqual(EPS);
    } else {
      expect(plan.reasons.length).toBeGreaterThan(0);
      if (plan.status === 'stopped-at-bound') {
        const named = new Set(plan.reasons.flatMap((r) => r.parameters));
        const stepLimit = plan.reasons.some((r) => r.code === 'step-limit');
        for (const p of SETUP_PARAMETERS) if (Math.abs(end[p] - plan.target[p]) > EPS && !stepLimit) expect(named.has(p)).toBe(true);
      }
    }
  });

  check('lets physio limits win: exclusions (parameters and groups), caps, cap factor, adaptation days and rides, holds', (plan, input) => {
    const physio = input.physio;
    if (!physio) return;
    if (physio.hold) expect(plan.status).toBe('refused');
    const excluded = new Set<SetupParameter>([...(physio.excludedParameters ?? []), ...(physio.excludedGroups ?? []).flatMap((g) => GROUP_PARAMETERS[g])]);
    const factor = physio.capFactor ?? 1;
    const policy = { ...defaultPolicy(), ...input.policy };
    for (const s of plan.steps) {
      expect(s.minRides).toBeGreaterThanOrEqual(physio.minAdaptationRides ?? 0);
      expect(daysBetween(s.earliestDate, s.checkInDue)).toBeGreaterThanOrEqual(physio.minAdaptationDays ?? 0);
      for (const c of s.changes) {
        expect(excluded.has(c.parameter)).toBe(false);
        const cap = physio.stepCaps?.[c.parameter];
        if (cap !== undefined) expect(Math.abs(c.delta)).toBeLessThanOrEqual(cap * (s.kind === 'change' ? factor : 1) + EPS);
        // The cap factor shrinks the clinic cap for every step, reverts included.
        if (factor < 1) expect(Math.abs(c.delta)).toBeLessThanOrEqual(clamp(policy.stepCaps[c.parameter], HARD_STEP_CAP_BOUNDS[c.parameter]) * factor + EPS);
      }
    }
    plan.steps.slice(1).forEach((s, i) => {
      expect(daysBetween(plan.steps[i]?.earliestDate ?? s.earliestDate, s.earliestDate)).toBeGreaterThanOrEqual(physio.minAdaptationDays ?? 0);
    });
  });

  check('refuses on an urgent or unreviewed red flag or severe pain, reverts included, and never returns NaN', (plan, input) => {
    if (input.redFlagLevel === 'urgent') expect(plan.status).toBe('refused');
    if (input.redFlagLevel !== undefined && input.redFlagLevel !== 'none' && !input.physio?.clearedRedFlags) expect(plan.steps).toEqual([]);
    if (input.currentPain >= 7) expect(plan.steps).toEqual([]);
    expect(JSON.stringify(plan)).not.toMatch(/NaN|null,"to"/);
    for (const s of plan.steps) for (const p of SETUP_PARAMETERS) expect(Number.isFinite(s.setupAfter[p])).toBe(true);
  });

  it('exercises one-step reverts and plans that wait for an earlier change', () => {
    // A check on the generator, not a property: reverts that pass the refusal rules are rare, so a
    // fixed seed and more runs keep it from failing on an unlucky draw (it failed about 1 run in 6).
    const runs = { numRuns: Math.max(RUNS.numRuns, 2000), seed: 20261202 };
    const seen = { revert: 0, waited: 0 };
    fc.assert(fc.property(inputArb, (input) => {
      const plan = buildPlan(input);
      if (plan.steps[0]?.kind === 'revert') seen.revert++;
      if (plan.steps[0] && plan.steps[0].earliestDate > input.startDate) seen.waited++;
    }), runs);
    expect(seen.revert).toBeGreaterThan(0);
    expect(seen.waited).toBeGreaterThan(0);
  }, 60_000);
});
