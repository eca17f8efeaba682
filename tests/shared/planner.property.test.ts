/** Property-based checks of the step planner: whatever the input, the plan keeps every rule. */
import { describe, expect, it } from 'vitest';
import fc from 'fast-check';
import { buildPlan, EPS, validatePlan, type Plan, type PlanInput } from '@shared/fit/planner';
import { addDays, couplingCompensation, daysBetween, groupOf, PARAMETER_GROUPS, PARAMETER_INFO, SETUP_PARAMETERS, type Setup, type SetupParameter } from '@shared/fit/setup';
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
        stepCaps: fc.record({ saddleHeight: fc.double({ min: 0.5, max: 6, noNaN: true }), cleatForeAft: fc.double({ min: 0.5, max: 3, noNaN: true }) }, { requiredKeys: [] }),
        capFactor: fc.double({ min: 0.2, max: 1, noNaN: true }),
        minAdaptationDays: fc.option(fc.integer({ min: 0, max: 30 }), { nil: undefined }),
        clearedRedFlags: fc.boolean(),
      }),
      { nil: undefined },
    ),
  }),
));

const RUNS = { numRuns: Number(globalThis.process?.env.FC_RUNS ?? 250) };

function check(name: string, prop: (plan: Plan, input: PlanInput) => void) {
  it(name, () => {
    fc.assert(fc.property(inputArb, (input) => prop(buildPlan(input), input)), RUNS);
  }, 60_000);
}

describe('the step planner, for any input', () => {
  check('passes its own validator (validatePlan finds no violation)', (plan, input) => {
    expect(validatePlan(plan, input)).toEqual([]);
  });

  check('never exceeds a per-step cap', (plan) => {
    for (const s of plan.steps.filter((x) => x.kind === 'change')) {
      for (const c of s.changes) expect(Math.abs(c.delta)).toBeLessThanOrEqual(plan.limits.stepCaps[c.parameter] + EPS);
    }
  });

  check('keeps every cumulative window', (plan) => {
    for (const end of plan.steps) {
      for (const p of SETUP_PARAMETERS) {
        const total = plan.steps
          .filter((s) => s.kind === 'change' && daysBetween(s.earliestDate, end.earliestDate) >= 0 && daysBetween(s.earliestDate, end.earliestDate) < plan.limits.windowDays)
          .reduce((sum, s) => sum + Math.abs(s.changes.find((c) => c.parameter === p)?.delta ?? 0), 0);
        expect(total).toBeLessThanOrEqual(plan.limits.windowCaps[p] + EPS);
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

  check('spaces steps by the adaptation period, in days and rides, with the check-in after it', (plan, input) => {
    plan.steps.forEach((s, i) => {
      expect(s.minRides).toBeGreaterThanOrEqual(plan.limits.adaptationRides);
      expect(daysBetween(s.earliestDate, s.checkInDue)).toBeGreaterThanOrEqual(plan.limits.adaptationDays);
      const before = plan.steps[i - 1];
      if (before) expect(daysBetween(before.earliestDate, s.earliestDate)).toBeGreaterThanOrEqual(plan.limits.adaptationDays);
      else expect(daysBetween(input.startDate, s.earliestDate)).toBeGreaterThanOrEqual(0);
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

  check('lets physio limits win: excluded parameters never move, caps never above the physio’s, holds refuse', (plan, input) => {
    const physio = input.physio;
    if (!physio) return;
    if (physio.hold) expect(plan.status).toBe('refused');
    const excluded = new Set<SetupParameter>(physio.excludedParameters ?? []);
    for (const s of plan.steps) {
      for (const c of s.changes) {
        expect(excluded.has(c.parameter)).toBe(false);
        const cap = physio.stepCaps?.[c.parameter];
        if (cap !== undefined) expect(Math.abs(c.delta)).toBeLessThanOrEqual(cap + EPS);
      }
    }
  });

  check('refuses on an urgent or unreviewed red flag or severe pain, reverts included, and never returns NaN', (plan, input) => {
    if (input.redFlagLevel === 'urgent') expect(plan.status).toBe('refused');
    if (input.redFlagLevel !== undefined && input.redFlagLevel !== 'none' && !input.physio?.clearedRedFlags) expect(plan.steps).toEqual([]);
    if (input.currentPain >= 7) expect(plan.steps).toEqual([]);
    expect(JSON.stringify(plan)).not.toMatch(/NaN|null,"to"/);
    for (const s of plan.steps) for (const p of SETUP_PARAMETERS) expect(Number.isFinite(s.setupAfter[p])).toBe(true);
  });
});
