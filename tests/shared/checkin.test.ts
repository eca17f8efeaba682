import { describe, expect, it } from 'vitest';
import { analyseCheckIn, compareScores, LOW_COMFORT, MEANINGFUL_CHANGE, type CheckInInput } from '@shared/fit/checkin';
import { FitInputError } from '@shared/fit/errors';

const ci = (date: string, pain: number, extra: Partial<CheckInInput> = {}, comfort?: number): CheckInInput => ({
  date, rides: 5, regions: [{ region: 'knee-front-left', pain, ...(comfort === undefined ? {} : { comfort }) }], ...extra,
});

describe('clinically meaningful change (Salaffi 2004 [V]; Farrar 2001 [M])', () => {
  it('uses 2 points or 30 %', () => {
    expect(MEANINGFUL_CHANGE).toEqual({ points: 2, fraction: 0.3 });
    expect(compareScores(6, 4).category).toBe('much-better');
    expect(compareScores(6, 5).category).toBe('better');
    expect(compareScores(6, 8).category).toBe('much-worse');
    expect(compareScores(6, 7).category).toBe('worse');
    // 3 → 4 is +1 point but +33 % ≥ 30 %: much worse [D] (derived from the 30 % rule, Salaffi 2004 [V]).
    expect(compareScores(3, 4).category).toBe('much-worse');
    expect(compareScores(0, 1)).toMatchObject({ category: 'worse', relative: null });
    expect(compareScores(5, 5).category).toBe('same');
    expect(compareScores(8, 6, false).category).toBe('much-worse'); // comfort falling
    expect(compareScores(6, 8, false).category).toBe('much-better');
  });
});

describe('analyseCheckIn', () => {
  const baseline = ci('2025-03-01', 5, {}, 5);

  it('continues when everything is the same or better', () => {
    const r = analyseCheckIn({ baseline, current: ci('2025-03-15', 3, {}, 7), minRides: 4 });
    expect(r.decision).toBe('continue');
    expect(r.referralLevel).toBe('none');
    expect(r.regions[0]?.painVsBaseline.category).toBe('much-better');
    expect(r.regions[0]?.comfortVsPrevious?.category).toBe('much-better');
  });

  it('holds for review when a little worse, or when too few rides were done', () => {
    expect(analyseCheckIn({ baseline, current: ci('2025-03-15', 6) }).decision).toBe('hold-for-review');
    const r = analyseCheckIn({ baseline, current: ci('2025-03-15', 5, { rides: 2 }), minRides: 4 });
    expect(r.decision).toBe('hold-for-review');
    expect(r.reasons.map((x) => x.code)).toContain('not-enough-rides');
  });

  it('holds when comfort is much worse even though pain is not', () => {
    const r = analyseCheckIn({ baseline, current: ci('2025-03-15', 5, {}, 2) });
    expect(r.decision).toBe('hold-for-review');
    expect(r.reasons.map((x) => x.code)).toEqual(['comfort-much-worse']);
  });

  it('suggests reverting the last step when a region is much worse than at the previous check-in', () => {
    const r = analyseCheckIn({ baseline, previous: [ci('2025-03-15', 3)], current: ci('2025-03-29', 5) });
    expect(r.decision).toBe('suggest-revert');
    expect(r.regions[0]?.painVsPrevious).toMatchObject({ delta: 2, category: 'much-worse' });
    expect(r.regions[0]?.painVsBaseline.category).toBe('same');
  });

  it('holds when much worse than the baseline but not since last time', () => {
    const r = analyseCheckIn({ baseline: ci('2025-03-01', 4), previous: [ci('2025-03-15', 5)], current: ci('2025-03-29', 6) });
    expect(r.decision).toBe('hold-for-review');
    expect(r.reasons.map((x) => x.code)).toEqual(['a-little-worse', 'much-worse-than-baseline']);
  });

  it('refers after two check-ins in a row much worse', () => {
    const r = analyseCheckIn({ baseline: ci('2025-03-01', 1), previous: [ci('2025-03-15', 3)], current: ci('2025-03-29', 5) });
    expect(r.decision).toBe('refer');
    expect(r.referralLevel).toBe('physio-routine');
    expect(r.reasons.map((x) => x.code)).toContain('repeated-worsening');
  });

  it('refers when much worse than baseline at two check-ins in a row, even if slowly', () => {
    const r = analyseCheckIn({ baseline: ci('2025-03-01', 2), previous: [ci('2025-03-08', 2), ci('2025-03-15', 4)], current: ci('2025-03-29', 5) });
    expect(r.decision).toBe('refer');
  });

  it('refers on any red flag, at urgent level for an urgent one', () => {
    const soon = analyseCheckIn({ baseline, current: ci('2025-03-15', 3, { redFlagAnswers: { 'pain-at-rest-or-night': true } }) });
    expect(soon).toMatchObject({ decision: 'refer', referralLevel: 'physio-soon' });
    const urgent = analyseCheckIn({ baseline, current: ci('2025-03-15', 3, { redFlagAnswers: { 'bladder-bowel-change': true } }) });
    expect(urgent).toMatchObject({ decision: 'refer', referralLevel: 'urgent' });
    expect(urgent.reasons[0]?.code).toBe('red-flag:bladder-bowel-change');
  });

  it('refers when a region reaches 7/10 or more (physio referral, TRADE §6 [V])', () => {
    const r = analyseCheckIn({ baseline: ci('2025-03-01', 6), current: ci('2025-03-15', 7) });
    expect(r).toMatchObject({ decision: 'refer', referralLevel: 'physio-soon' });
  });

  it('compares a new region with zero pain', () => {
    const r = analyseCheckIn({ baseline, current: { date: '2025-03-15', regions: [{ region: 'neck', pain: 3 }] } });
    expect(r.regions[0]?.painVsBaseline).toMatchObject({ reference: 0, category: 'much-worse' });
    expect(r.decision).toBe('suggest-revert');
  });

  it('refuses impossible dates and pain scores', () => {
    expect(() => analyseCheckIn({ baseline, current: ci('2025-02-30', 3) })).toThrow(FitInputError);
    expect(() => analyseCheckIn({ baseline, current: ci('2025-03-15', 4.5) })).toThrow(/whole number/);
  });
});

describe('overall comfort and numbness, with or without a painful region', () => {
  const calm = { date: '2025-03-01', regions: [] };

  it('holds for review when comfort is low and nothing hurts (LOW_COMFORT 3/10, our decision)', () => {
    const r = analyseCheckIn({ baseline: calm, current: { date: '2025-03-10', regions: [], comfort: 1 } });
    expect(r.decision).toBe('hold-for-review');
    expect(r.reasons.map((x) => x.code)).toEqual(['low-comfort']);
    expect(analyseCheckIn({ baseline: calm, current: { date: '2025-03-10', regions: [], comfort: LOW_COMFORT + 1 } }).decision).toBe('continue');
  });

  it('holds for review when overall comfort falls by 2 points or 30 % since the last check-in (Salaffi 2004 [V], applied to comfort [D])', () => {
    const previous = [{ date: '2025-03-08', regions: [], comfort: 8 }];
    const r = analyseCheckIn({ baseline: calm, previous, current: { date: '2025-03-15', regions: [], comfort: 6 } });
    expect(r.decision).toBe('hold-for-review');
    expect(r.comfortVsPrevious).toMatchObject({ reference: 8, current: 6, category: 'much-worse' });
    expect(analyseCheckIn({ baseline: calm, previous, current: { date: '2025-03-15', regions: [], comfort: 7 } }).decision).toBe('continue');
  });

  it('holds for review on new numbness with no region marked, not on numbness already reviewed last time (common practice)', () => {
    const r = analyseCheckIn({ baseline: calm, current: { date: '2025-03-10', regions: [], comfort: 8, numbness: true } });
    expect(r.decision).toBe('hold-for-review');
    expect(r.reasons.map((x) => x.code)).toContain('new-numbness');
    const again = analyseCheckIn({ baseline: calm, previous: [{ date: '2025-03-10', regions: [], comfort: 8, numbness: true }], current: { date: '2025-03-17', regions: [], comfort: 8, numbness: true } });
    expect(again.decision).toBe('continue');
  });
});
