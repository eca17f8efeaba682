/** The planner and validatePlan with history: reverts to known setups, and changes made before the plan. */
import { describe, expect, it } from 'vitest';
import { buildPlan, validatePlan, type Plan } from '@shared/fit/planner';
import { BASE, inputs } from './planner-fixtures';

const deltas = (plan: Plan, param: keyof typeof BASE) => plan.steps.map((s) => s.changes.find((c) => c.parameter === param)?.delta ?? 0);

describe('reverts', () => {
  const earlier = { ...BASE, saddleHeight: 752 };
  const history = [{ setup: earlier, from: '2024-12-01', to: '2025-02-01', rides: 20 }];

  it('goes back in one step to a setup ridden for the full adaptation period within 90 days', () => {
    const over = { target: earlier, history };
    const plan = buildPlan(inputs(over));
    expect(plan.steps).toHaveLength(1);
    expect(plan.steps[0]).toMatchObject({ kind: 'revert', setupAfter: earlier });
    expect(plan.steps[0]?.instructions[0]).toMatch(/Go back to the earlier setup/);
    expect(validatePlan(plan, inputs(over))).toEqual([]);
  });

  it('refuses that revert, like any change, with severe pain, an unreviewed or urgent red flag, or a physio hold (our rule)', () => {
    for (const [over, code] of [
      [{ currentPain: 8 }, 'severe-pain'],
      [{ redFlagLevel: 'physio-soon' as const }, 'red-flag'],
      [{ redFlagLevel: 'urgent' as const }, 'urgent-red-flag'],
      [{ physio: { hold: true } }, 'physio-hold'],
    ] as const) {
      const plan = buildPlan(inputs({ target: earlier, history, ...over }));
      expect(plan).toMatchObject({ status: 'refused', steps: [] });
      expect(plan.reasons[0]?.code).toBe(code);
    }
    expect(buildPlan(inputs({ target: earlier, history, currentPain: 8 })).reasons[0]?.message).toMatch(/stop riding and see a physiotherapist/);
  });

  it('still goes back in one step at moderate pain, or with a cleared red flag, within the physio limits', () => {
    expect(buildPlan(inputs({ target: earlier, history, currentPain: 5 })).steps.map((s) => s.kind)).toEqual(['revert']);
    const cleared = { target: earlier, history, redFlagLevel: 'physio-soon' as const, physio: { clearedRedFlags: true, stepCaps: { saddleHeight: 12 } } };
    expect(buildPlan(inputs(cleared)).steps.map((s) => s.kind)).toEqual(['revert']);
  });

  it('splits a revert over the physio caps into capped steps, saying why', () => {
    const over = { target: earlier, history, physio: { stepCaps: { saddleHeight: 2 } } };
    const plan = buildPlan(inputs(over));
    expect(plan.status).toBe('reaches-target');
    expect(deltas(plan, 'saddleHeight')).toEqual([2, 2, 2, 2, 2, 2]);
    expect(plan.reasons.map((r) => r.code)).toEqual(['revert-split-by-physio']);
    expect(validatePlan(plan, inputs(over))).toEqual([]);
    // A cap factor below 1 limits every parameter: 0.5 × the 3 mm clinic cap.
    expect(deltas(buildPlan(inputs({ target: earlier, history, physio: { capFactor: 0.5 } })), 'saddleHeight')[0]).toBe(1.5);
  });

  it('refuses the audit probe (pain 9, unreviewed physio-soon flag, physio caps 1 mm × 0.2) and finds a forged one-step revert', () => {
    const far = { ...BASE, saddleHeight: 770, reach: 560, crankLength: 165 };
    const over = {
      target: far, currentPain: 9, redFlagLevel: 'physio-soon' as const,
      physio: { stepCaps: { saddleHeight: 1 }, capFactor: 0.2 },
      history: [{ setup: far, from: '2024-12-01', to: '2025-02-01', rides: 20 }],
    };
    const plan = buildPlan(inputs(over));
    expect(plan).toMatchObject({ status: 'refused', steps: [] });
    const forged: Plan = {
      ...plan, status: 'reaches-target', finalSetup: far, reasons: [],
      steps: [{
        index: 1, kind: 'revert', group: null, setupAfter: far, earliestDate: '2025-03-01', minRides: 4, checkInDue: '2025-03-15', instructions: [],
        changes: [
          { parameter: 'saddleHeight', from: 740, to: 770, delta: 30, coupledTo: null },
          { parameter: 'reach', from: 520, to: 560, delta: 40, coupledTo: null },
          { parameter: 'crankLength', from: 172.5, to: 165, delta: -7.5, coupledTo: null },
        ],
      }],
    };
    const codes = validatePlan(forged, inputs(over)).map((x) => `${x.code}${x.parameter ? `:${x.parameter}` : ''}`);
    expect(codes).toEqual(expect.arrayContaining(['must-refuse', 'revert-not-allowed', 'physio-cap:saddleHeight', 'physio-cap:reach', 'physio-cap:crankLength']));
    // Without the pain and the flag, the physio caps alone still forbid the one step.
    const calm = { ...over, currentPain: 2, redFlagLevel: 'none' as const };
    expect(validatePlan(forged, inputs(calm)).map((x) => x.code)).not.toContain('must-refuse');
    expect(validatePlan(forged, inputs(calm)).map((x) => x.code)).toContain('physio-cap');
  });

  it.each([
    ['ridden too briefly', [{ setup: earlier, from: '2025-01-25', to: '2025-02-01', rides: 20 }]],
    ['ridden too few times', [{ setup: earlier, from: '2024-12-01', to: '2025-02-01', rides: 2 }]],
    ['left too long ago', [{ setup: earlier, from: '2024-06-01', to: '2024-09-01', rides: 20 }]],
    ['never ridden', []],
  ])('caps a revert to a setup %s like a normal change', (_label, h) => {
    const plan = buildPlan(inputs({ target: earlier, history: h }));
    expect(plan.steps.every((s) => s.kind === 'change')).toBe(true);
    expect(deltas(plan, 'saddleHeight')).toEqual([3, 3, 3, 3]);
  });

  it('stops a revert that would move a physio-excluded parameter at the exclusion', () => {
    const plan = buildPlan(inputs({ target: earlier, history, physio: { excludedParameters: ['saddleHeight'] } }));
    expect(plan.steps).toEqual([]);
    expect(plan.status).toBe('stopped-at-bound');
    expect(plan.reasons.map((r) => r.code)).toEqual(['revert-excluded-by-physio', 'excluded-by-physio']);
  });
});

describe('changes made before the plan (history)', () => {
  const before = { ...BASE, saddleHeight: 737 };

  it('starts step 1 no sooner than the adaptation period after the last change, and validatePlan checks it', () => {
    const over = { history: [{ setup: before, from: '2024-10-01', to: '2025-02-27', rides: 30 }] };
    const plan = buildPlan(inputs(over));
    expect(plan.steps[0]?.earliestDate).toBe('2025-03-13');
    expect(validatePlan(plan, inputs(over))).toEqual([]);
    const early = structuredClone(buildPlan(inputs()));
    expect(validatePlan(early, inputs(over)).map((x) => x.code)).toContain('adaptation-days');
  });

  it('counts earlier changes in the window: 3 mm up two weeks ago leaves 3 mm of the 6 mm per 28 days', () => {
    const over = { policy: { adaptationDays: 7 }, history: [{ setup: before, from: '2024-10-01', to: '2025-02-15', rides: 30 }] };
    const plan = buildPlan(inputs(over));
    // Step 2 waits until the earlier change leaves the window (03-15), step 3 until step 1 does (03-29).
    expect(plan.steps.map((s) => s.earliestDate)).toEqual(['2025-03-01', '2025-03-15', '2025-03-29']);
    expect(validatePlan(plan, inputs(over))).toEqual([]);
    const squeezed = structuredClone(plan);
    const second = squeezed.steps[1];
    if (!second) throw new Error('no second step');
    second.earliestDate = '2025-03-08';
    expect(validatePlan(squeezed, inputs(over)).map((x) => x.code)).toContain('window-cap');
  });

  it('waits with a crank change while earlier changes overfill the window, never moving the other way', () => {
    const over = {
      target: { ...BASE, crankLength: 170, saddleHeight: 742.5 },
      history: [{ setup: { ...BASE, saddleHeight: 715 }, from: '2024-10-01', to: '2025-02-13', rides: 30 }],
    };
    const plan = buildPlan(inputs(over));
    // 25 mm of saddle height two weeks ago fills the 6 mm window until it leaves on 03-13.
    expect(plan.steps[0]).toMatchObject({ group: 'cranks', earliestDate: '2025-03-13' });
    expect(deltas(plan, 'crankLength')).toEqual([-2.5]);
    expect(validatePlan(plan, inputs(over))).toEqual([]);
  });

  it('does not count a re-measurement that found the same setup as a change', () => {
    const plan = buildPlan(inputs({ history: [{ setup: BASE, from: '2024-10-01', to: '2025-02-27', rides: 30 }] }));
    expect(plan.steps[0]?.earliestDate).toBe('2025-03-01');
  });
});
