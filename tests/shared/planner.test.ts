import { describe, expect, it } from 'vitest';
import { FitInputError } from '@shared/fit/errors';
import {
  buildPlan,
  checkPolicy,
  clampPolicy,
  DEFAULT_STEP_CAPS,
  defaultPolicy,
  HARD_STEP_CAP_BOUNDS,
  MAX_STEPS,
  painCapFactor,
  physioLimitsSchema,
  stepBeyondPhysioLimits,
  validatePlan,
  type Plan,
} from '@shared/fit/planner';
import { daysBetween } from '@shared/fit/setup';
import { BASE, inputs } from './planner-fixtures';

const deltas = (plan: Plan, param: keyof typeof BASE) => plan.steps.map((s) => s.changes.find((c) => c.parameter === param)?.delta ?? 0);

describe('clinic policy and hard bounds', () => {
  it('defaults to the TRADE §4 step sizes [M/CP], all inside the hard bounds', () => {
    expect(checkPolicy({})).toEqual([]);
    expect(defaultPolicy().stepCaps).toEqual(DEFAULT_STEP_CAPS);
    expect(DEFAULT_STEP_CAPS.crankLength).toBe(2.5);
    expect(DEFAULT_STEP_CAPS.cleatForeAft).toBe(2);
  });

  it('reports and clamps values outside the hard bounds', () => {
    const bad = { stepCaps: { ...DEFAULT_STEP_CAPS, saddleHeight: 12, cleatRotation: 0.1 }, adaptationDays: 2 };
    expect(checkPolicy(bad).map((i) => i.field)).toEqual(['stepCaps.saddleHeight', 'stepCaps.cleatRotation', 'adaptationDays']);
    const { policy, issues } = clampPolicy(bad);
    expect(issues).toHaveLength(3);
    expect(policy.stepCaps.saddleHeight).toBe(HARD_STEP_CAP_BOUNDS.saddleHeight[1]);
    expect(policy.stepCaps.cleatRotation).toBe(HARD_STEP_CAP_BOUNDS.cleatRotation[0]);
    expect(policy.adaptationDays).toBe(7);
  });

  it('refuses a malformed policy with a typed error', () => {
    expect(() => checkPolicy({ windowDays: Number.NaN })).toThrow(FitInputError);
  });

  it('plans with a clamped policy even when a stored one is out of bounds', () => {
    const plan = buildPlan(inputs({ policy: { stepCaps: { ...DEFAULT_STEP_CAPS, saddleHeight: 40 } } }));
    expect(Math.max(...deltas(plan, 'saddleHeight'))).toBe(5);
  });
});

describe('buildPlan', () => {
  it('raises the saddle 9 mm in three capped steps, two weeks apart, with plain instructions', () => {
    const plan = buildPlan(inputs());
    expect(plan.status).toBe('reaches-target');
    expect(deltas(plan, 'saddleHeight')).toEqual([3, 3, 3]);
    expect(plan.steps.map((s) => s.earliestDate)).toEqual(['2025-03-01', '2025-03-15', '2025-03-29']);
    expect(plan.steps[0]).toMatchObject({ minRides: 4, checkInDue: '2025-03-15', group: 'saddleHeight', kind: 'change' });
    expect(plan.steps[0]?.instructions[1]).toBe(
      'Raise the saddle 3 mm: measure from the centre of the bottom bracket to the top of the saddle along the seat tube. It should read 743 mm.',
    );
    expect(plan.finalSetup).toEqual(plan.target);
    expect(validatePlan(plan, inputs())).toEqual([]);
  });

  it('tells the rider to slide the saddle on its rails to keep setback when the seat-tube angle is known', () => {
    const plan = buildPlan(inputs({ seatTubeAngle: 73 }));
    expect(plan.steps[0]?.instructions.join(' ')).toMatch(/moves the saddle back by 0.9 mm; slide it forward/);
  });

  it('carries the saddle compensation with each crank step (172.5 → 165 mm: +7.5 mm, TRADE §2 [D])', () => {
    const target = { ...BASE, crankLength: 165, saddleHeight: 747.5 };
    const plan = buildPlan(inputs({ target }));
    expect(plan.status).toBe('reaches-target');
    expect(plan.steps.map((s) => s.group)).toEqual(['cranks', 'cranks', 'cranks']);
    expect(deltas(plan, 'crankLength')).toEqual([-2.5, -2.5, -2.5]);
    expect(deltas(plan, 'saddleHeight')).toEqual([2.5, 2.5, 2.5]);
    expect(plan.steps[0]?.changes.find((c) => c.parameter === 'saddleHeight')?.coupledTo).toBe('cranks');
    expect(plan.steps[0]?.instructions.join(' ')).toMatch(/Fit cranks 2.5 mm shorter: .*Raise the saddle 2.5 mm to keep the same leg reach with the new cranks/);
  });

  it('carries the cleat rule: back 10 mm lowers the saddle 5 mm in all ([V2])', () => {
    const target = { ...BASE, cleatForeAft: -10, saddleHeight: 735 };
    const plan = buildPlan(inputs({ target }));
    expect(plan.status).toBe('reaches-target');
    expect(deltas(plan, 'cleatForeAft').every((d) => Math.abs(d) <= 2)).toBe(true);
    expect(deltas(plan, 'saddleHeight').reduce((a, b) => a + b, 0)).toBeCloseTo(-5, 9);
    expect(plan.steps.every((s) => s.group === 'cleats')).toBe(true);
  });

  it('moves one group per step in the default order: cleats, cranks, saddle height, fore-aft, tilt, bars', () => {
    const target = { ...BASE, cleatRotation: 1, crankLength: 170, saddleSetback: 55, saddleTilt: -1, reach: 510, stemLength: 90, saddleHeight: 742.5 };
    const plan = buildPlan(inputs({ target }));
    expect(plan.steps.map((s) => s.group)).toEqual(['cleats', 'cranks', 'saddleForeAft', 'saddleTilt', 'bars']);
    expect(validatePlan(plan, inputs({ target }))).toEqual([]);
    const custom = buildPlan(inputs({ target, groupOrder: ['bars'] }));
    expect(custom.steps[0]?.group).toBe('bars');
  });

  it('halves the caps at moderate pain and waits on crank changes it cannot make in a whole size', () => {
    expect(painCapFactor(3)).toBe(1);
    expect(painCapFactor(4)).toBe(0.5);
    const plan = buildPlan(inputs({ currentPain: 5 }));
    expect(deltas(plan, 'saddleHeight')).toEqual([1.5, 1.5, 1.5, 1.5, 1.5, 1.5]);
    const cranks = buildPlan(inputs({ currentPain: 5, target: { ...BASE, crankLength: 170, saddleHeight: 745 } }));
    expect(cranks.status).toBe('stopped-at-bound');
    expect(cranks.reasons.map((r) => r.code)).toEqual(['crank-step-too-small', 'saddle-follows-coupled']);
    expect(cranks.finalSetup.crankLength).toBe(172.5);
    expect(cranks.finalSetup.saddleHeight).toBe(742.5);
  });

  it.each([
    ['an urgent red flag', { redFlagLevel: 'urgent' as const }, 'urgent-red-flag'],
    ['a red flag not yet reviewed by a physio', { redFlagLevel: 'physio-routine' as const }, 'red-flag'],
    ['severe pain (7/10: physio referral, TRADE §6 [V])', { currentPain: 7 }, 'severe-pain'],
    ['a physio hold', { physio: { hold: true } }, 'physio-hold'],
  ])('refuses to go on with %s, giving the reason', (_label, over, code) => {
    const plan = buildPlan(inputs(over));
    expect(plan.status).toBe('refused');
    expect(plan.steps).toEqual([]);
    expect(plan.reasons[0]?.code).toBe(code);
    expect(validatePlan(plan, inputs(over))).toEqual([]);
  });

  it('goes on with a physio-level red flag once the physio has cleared it, but never with an urgent one', () => {
    expect(buildPlan(inputs({ redFlagLevel: 'physio-soon', physio: { clearedRedFlags: true } })).status).toBe('reaches-target');
    expect(buildPlan(inputs({ redFlagLevel: 'urgent', physio: { clearedRedFlags: true } })).status).toBe('refused');
  });

  it('lets the physio tighten caps, lengthen adaptation and exclude parameters', () => {
    const physio = { stepCaps: { saddleHeight: 2 }, minAdaptationDays: 21, excludedParameters: ['saddleTilt' as const] };
    const over = { physio, target: { ...BASE, saddleHeight: 744, saddleTilt: -2 } };
    const plan = buildPlan(inputs(over));
    expect(deltas(plan, 'saddleHeight')).toEqual([2, 2]);
    expect(daysBetween(plan.steps[0]?.earliestDate ?? '', plan.steps[1]?.earliestDate ?? '')).toBe(21);
    expect(plan.finalSetup.saddleTilt).toBe(0);
    expect(plan.status).toBe('stopped-at-bound');
    expect(plan.reasons[0]).toMatchObject({ code: 'excluded-by-physio', parameters: ['saddleTilt'] });
    expect(validatePlan(plan, inputs(over))).toEqual([]);
  });

  it('holds crank and cleat changes back when the physio excludes saddle height', () => {
    const over = { physio: { excludedGroups: ['saddleHeight' as const] }, target: { ...BASE, crankLength: 170, saddleHeight: 742.5, cleatRotation: 2 } };
    const plan = buildPlan(inputs(over));
    expect(plan.finalSetup).toMatchObject({ crankLength: 172.5, saddleHeight: 740, cleatRotation: 2 });
    expect(plan.reasons.map((r) => r.code)).toEqual(['excluded-by-physio', 'coupled-to-excluded-saddle']);
  });

  it('stops at a stated bound when every cap is zero', () => {
    const plan = buildPlan(inputs({ physio: { capFactor: 0 } }));
    expect(plan).toMatchObject({ status: 'stopped-at-bound', steps: [] });
    expect(plan.reasons[0]?.code).toBe('cap-is-zero');
  });

  it(`stops after ${MAX_STEPS} steps with the reason`, () => {
    const plan = buildPlan(inputs({ target: { ...BASE, reach: 880 } }));
    expect(plan.steps).toHaveLength(MAX_STEPS);
    expect(plan.reasons[0]?.code).toBe('step-limit');
  });

  it('waits for the window when adaptation is short: no more than 6 mm of saddle height in any 28 days (our rule)', () => {
    const over = { policy: { adaptationDays: 7, stepCaps: { ...DEFAULT_STEP_CAPS, saddleHeight: 5 } }, target: { ...BASE, saddleHeight: 760 } };
    const plan = buildPlan(inputs(over));
    expect(plan.status).toBe('reaches-target');
    expect(validatePlan(plan, inputs(over))).toEqual([]);
    const days = plan.steps.map((s) => daysBetween('2025-03-01', s.earliestDate));
    expect(days[1]).toBeGreaterThanOrEqual(7);
    expect(days.some((d, i) => i > 0 && d - (days[i - 1] ?? 0) > 7)).toBe(true);
  });

  it('refuses malformed input with a typed error', () => {
    expect(() => buildPlan({ ...inputs(), startDate: '2025-13-01' })).toThrow(FitInputError);
    expect(() => buildPlan({ ...inputs(), baseline: { ...BASE, saddleHeight: Number.NaN } })).toThrow(FitInputError);
  });

  it('stops rather than plan a setup outside plausible values', () => {
    const low = { ...BASE, saddleHeight: 301, crankLength: 200 };
    const plan = buildPlan(inputs({ baseline: low, target: { ...low, crankLength: 210 } }));
    expect(plan.reasons.map((r) => r.code)).toContain('out-of-range');
  });
});

describe('validatePlan', () => {
  const over = { target: { ...BASE, crankLength: 170, saddleHeight: 745.5 } };
  const good = () => structuredClone(buildPlan(inputs(over)));
  const codes = (plan: unknown, o = over) => validatePlan(plan, inputs(o)).map((v) => v.code);

  it('accepts the planner’s own plan', () => {
    expect(codes(good())).toEqual([]);
  });

  it('finds a step over its cap, a broken coupling, two groups in one step and a step too soon', () => {
    const p = good();
    const last = p.steps.at(-1);
    const saddleStep = p.steps.find((s) => s.group === 'saddleHeight');
    if (!last || !saddleStep || last !== saddleStep) throw new Error('expected a single saddle step last');
    last.setupAfter.saddleHeight += 2;
    const change = last.changes.find((c) => c.parameter === 'saddleHeight');
    if (change) { change.to += 2; change.delta += 2; }
    p.finalSetup = last.setupAfter;
    expect(codes(p)).toEqual(expect.arrayContaining(['step-cap', 'end']));

    const q = good();
    const crankStep = q.steps[0];
    if (!crankStep) throw new Error('no steps');
    crankStep.changes = crankStep.changes.filter((c) => c.parameter !== 'saddleHeight');
    crankStep.setupAfter.saddleHeight = BASE.saddleHeight;
    expect(codes(q)).toEqual(expect.arrayContaining(['coupling', 'inconsistent-change']));

    const r = good();
    const s2 = r.steps[1];
    if (!s2) throw new Error('no steps');
    s2.earliestDate = '2025-03-05';
    s2.minRides = 1;
    s2.checkInDue = '2025-03-06';
    expect(codes(r)).toEqual(expect.arrayContaining(['adaptation-days', 'adaptation-rides', 'check-in']));
  });

  it('finds a plan that claims the target but stops short, a wrong start, and a plan that should have been refused', () => {
    const p = good();
    p.steps.pop();
    p.finalSetup = p.steps.at(-1)?.setupAfter ?? BASE;
    expect(codes(p)).toContain('end');
    const q = good();
    q.baseline = { ...BASE, reach: 530 };
    expect(codes(q)).toContain('baseline-mismatch');
    expect(codes(good(), { ...over, currentPain: 8 } as typeof over)).toContain('must-refuse');
    expect(codes({ nonsense: true })).toEqual(['malformed']);
  });

  it('finds a revert step the revert rule does not allow, and two groups in one step', () => {
    const target = { ...BASE, saddleHeight: 752, reach: 530 };
    const plan = buildPlan(inputs({ target }));
    const forged: Plan = { ...plan, steps: [{ ...(plan.steps[0] as Plan['steps'][number]), kind: 'revert', setupAfter: target, changes: [
      { parameter: 'saddleHeight', from: 740, to: 752, delta: 12, coupledTo: null },
      { parameter: 'reach', from: 520, to: 530, delta: 10, coupledTo: null },
    ] }], finalSetup: target };
    expect(validatePlan(forged, inputs({ target }))).toEqual([expect.objectContaining({ code: 'revert-not-allowed' })]);
    const twoGroups: Plan = { ...forged, steps: [{ ...(forged.steps[0] as Plan['steps'][number]), kind: 'change' }] };
    expect(validatePlan(twoGroups, inputs({ target })).map((v) => v.code)).toEqual(expect.arrayContaining(['step-cap', 'one-group']));
  });

  it('finds a window overrun, a physio-excluded change and an unlisted change', () => {
    const o = { target: { ...BASE, saddleHeight: 752 } };
    const p = structuredClone(buildPlan(inputs(o)));
    // Squeeze the steps together: adaptation and window both break.
    p.steps.forEach((s, i) => { s.earliestDate = `2025-03-0${1 + i}`; });
    expect(codes(p, o)).toEqual(expect.arrayContaining(['window-cap', 'adaptation-days']));
    expect(codes(buildPlan(inputs(o)), { ...o, physio: { excludedParameters: ['saddleHeight'] } } as typeof o)).toContain('physio-excluded');
    const q = structuredClone(buildPlan(inputs(o)));
    const first = q.steps[0];
    if (!first) throw new Error('no steps');
    first.setupAfter.saddleTilt = 1;
    first.index = 5;
    expect(codes(q, o)).toEqual(expect.arrayContaining(['unlisted-change', 'step-order']));
  });
});

describe('a stored step against limits a physio set later', () => {
  const policy = defaultPolicy();
  const step = buildPlan({ baseline: BASE, target: { ...BASE, saddleHeight: BASE.saddleHeight + 3 }, policy, currentPain: 0, startDate: '2026-01-05' }).steps[0]!;

  it('passes with no limits, or limits the step keeps', () => {
    expect(stepBeyondPhysioLimits(step, undefined, policy)).toEqual([]);
    expect(stepBeyondPhysioLimits(step, physioLimitsSchema.parse({ stepCaps: { saddleHeight: 3 } }), policy)).toEqual([]);
  });

  it('names a tighter cap, a cap factor and an excluded group the step breaks', () => {
    expect(stepBeyondPhysioLimits(step, physioLimitsSchema.parse({ stepCaps: { saddleHeight: 1 } }), policy)).toEqual(['The saddle height moves 3 mm, more than the physiotherapist\'s limit of 1 mm per step.']);
    expect(stepBeyondPhysioLimits(step, physioLimitsSchema.parse({ capFactor: 0.2 }), policy)[0]).toMatch(/saddle height moves 3 mm/);
    expect(stepBeyondPhysioLimits(step, physioLimitsSchema.parse({ excludedParameters: ['saddleHeight'] }), policy)).toEqual(['The physiotherapist asked for no changes to the saddle height.']);
  });
});
